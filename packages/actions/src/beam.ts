import { DomainError } from '@platesmith/catalogue';

/**
 * Linear-elastic analysis of a straight beam on pinned supports: one span, or n continuous
 * spans of uniform EI (simply supported ends, pinned intermediate supports, no settlement).
 * Stiffness method with one rotation per support (slope-deflection), solved as a tridiagonal
 * system; inside each span the simple-beam closed forms plus the linear end-moment line.
 *
 * Conventions (used everywhere in this package):
 * - x in mm from the left end; loads positive downward (N for point loads, N/mm for UDLs).
 * - M (N·mm) positive sagging (top flange in compression).
 * - V (N) positive upward on the left face of the part to the right of the cut, i.e. the sum of
 *   the upward forces left of the section; then dM/dx = V. At a point load or support V jumps:
 *   side −1 is the limit from the left, +1 the limit from the right.
 * - Deflection δ positive downward. `EIdelta` = E·I·δ_bending (N·mm³), from E·I·δ'' = −M.
 * - `GAvDeltaShear` = G·Av·δ_shear (N·mm) = M(x) − (linear interpolation of the span's support
 *   moments) = the simple-span moment of the span's own loads. Approximation: the support moments
 *   come from the bending-only (shear-rigid) analysis; shear flexibility would shift them a little.
 * - Reactions R (N) positive upward.
 */

export type Side = -1 | 0 | 1;

export interface PointLoad {
  type: 'point';
  /** N, downward positive */
  P: number;
  /** mm from the left end */
  at: number;
}

export interface DistributedLoad {
  type: 'udl';
  /** N/mm (= kN/m), downward positive */
  w: number;
  /** mm from the left end */
  from: number;
  /** mm from the left end */
  to: number;
}

export type BeamLoad = PointLoad | DistributedLoad;

/** One span's own loads in local coordinates (a, c, d in mm from the span's left support). */
export interface SpanLoads {
  /** point loads: P (N), a (mm) */
  P: number[];
  a: number[];
  /** distributed loads: w (N/mm) from c to d (mm) */
  w: number[];
  c: number[];
  d: number[];
  /** simple-beam left reaction (N) and total load (N) */
  RA: number;
  W: number;
  /** integration constant of E·I·δ for the simple span (N·mm²) */
  C1: number;
}

export function emptySpanLoads(): SpanLoads {
  return { P: [], a: [], w: [], c: [], d: [], RA: 0, W: 0, C1: 0 };
}

/** Close a span's load list: simple-beam reaction and deflection constant. */
export function finishSpanLoads(s: SpanLoads, L: number): SpanLoads {
  let RA = 0;
  let W = 0;
  let k = 0; // Σ of the load terms of E·I·δ evaluated at x = L
  for (let i = 0; i < s.P.length; i++) {
    const P = s.P[i]!;
    const a = s.a[i]!;
    RA += (P * (L - a)) / L;
    W += P;
    k += (P * (L - a) ** 3) / 6;
  }
  for (let i = 0; i < s.w.length; i++) {
    const w = s.w[i]!;
    const c = s.c[i]!;
    const d = s.d[i]!;
    const Wi = w * (d - c);
    RA += (Wi * (L - (c + d) / 2)) / L;
    W += Wi;
    k += (w / 24) * ((L - c) ** 4 - (L - d) ** 4);
  }
  s.RA = RA;
  s.W = W;
  s.C1 = ((RA * L ** 3) / 6 - k) / L;
  return s;
}

/** Simple-span bending moment (N·mm) of the span's own loads at local x. */
export function simpleM(s: SpanLoads, x: number): number {
  let M = s.RA * x;
  for (let i = 0; i < s.P.length; i++) {
    const a = s.a[i]!;
    if (a < x) M -= s.P[i]! * (x - a);
  }
  for (let i = 0; i < s.w.length; i++) {
    const c = s.c[i]!;
    if (x <= c) continue;
    const d = s.d[i]!;
    const w = s.w[i]!;
    M -= (w / 2) * ((x - c) ** 2 - (x > d ? (x - d) ** 2 : 0));
  }
  return M;
}

/** Simple-span shear (N) at local x; side −1 excludes a point load exactly at x, +1 (or 0) includes it. */
export function simpleV(s: SpanLoads, x: number, side: Side): number {
  let V = s.RA;
  for (let i = 0; i < s.P.length; i++) {
    const a = s.a[i]!;
    if (side < 0 ? a < x : a <= x) V -= s.P[i]!;
  }
  for (let i = 0; i < s.w.length; i++) {
    const c = s.c[i]!;
    if (x <= c) continue;
    const d = s.d[i]!;
    V -= s.w[i]! * ((x - c) - (x > d ? x - d : 0));
  }
  return V;
}

/** Simple-span E·I·δ (N·mm³, downward positive) at local x. */
export function simpleEIdelta(s: SpanLoads, x: number): number {
  let v = s.C1 * x - (s.RA * x ** 3) / 6;
  for (let i = 0; i < s.P.length; i++) {
    const a = s.a[i]!;
    if (a < x) v += (s.P[i]! * (x - a) ** 3) / 6;
  }
  for (let i = 0; i < s.w.length; i++) {
    const c = s.c[i]!;
    if (x <= c) continue;
    const d = s.d[i]!;
    v += (s.w[i]! / 24) * ((x - c) ** 4 - (x > d ? (x - d) ** 4 : 0));
  }
  return v;
}

/**
 * Fixed-end moments of one span (clockwise positive on the member end, slope-deflection sign
 * convention), N·mm: point load FA = −P·a·b²/L², FB = +P·a²·b/L²; UDL by integration of the same.
 */
function fixedEndMoments(s: SpanLoads, L: number): [number, number] {
  let FA = 0;
  let FB = 0;
  const L2 = L * L;
  for (let i = 0; i < s.P.length; i++) {
    const P = s.P[i]!;
    const a = s.a[i]!;
    const b = L - a;
    FA -= (P * a * b * b) / L2;
    FB += (P * a * a * b) / L2;
  }
  const F1 = (u: number): number => (L2 * u * u) / 2 - (2 * L * u ** 3) / 3 + u ** 4 / 4;
  const F2 = (u: number): number => (L * u ** 3) / 3 - u ** 4 / 4;
  for (let i = 0; i < s.w.length; i++) {
    const w = s.w[i]!;
    const c = s.c[i]!;
    const d = s.d[i]!;
    FA -= (w / L2) * (F1(d) - F1(c));
    FB += (w / L2) * (F2(d) - F2(c));
  }
  return [FA, FB];
}

/**
 * Support bending moments (N·mm, sagging positive; 0 at the two ends) of a continuous beam
 * with uniform EI, pinned supports, loaded by `spanLoads` (one entry per span).
 */
export function supportMoments(spans: readonly number[], spanLoads: readonly SpanLoads[]): Float64Array {
  const n = spans.length;
  const N = n + 1;
  const diag = new Float64Array(N);
  const off = new Float64Array(n);
  const rhs = new Float64Array(N);
  const FA = new Float64Array(n);
  const FB = new Float64Array(n);
  for (let s = 0; s < n; s++) {
    const k = 1 / spans[s]!; // EI = 1: moments do not depend on a uniform EI
    diag[s]! += 4 * k;
    diag[s + 1]! += 4 * k;
    off[s] = 2 * k;
    const [a, b] = fixedEndMoments(spanLoads[s]!, spans[s]!);
    FA[s] = a;
    FB[s] = b;
    rhs[s]! -= a;
    rhs[s + 1]! -= b;
  }
  // Thomas algorithm (symmetric, diagonally dominant)
  const cp = new Float64Array(N);
  const dp = new Float64Array(N);
  cp[0] = n > 0 ? off[0]! / diag[0]! : 0;
  dp[0] = rhs[0]! / diag[0]!;
  for (let i = 1; i < N; i++) {
    const m = diag[i]! - off[i - 1]! * cp[i - 1]!;
    cp[i] = i < n ? off[i]! / m : 0;
    dp[i] = (rhs[i]! - off[i - 1]! * dp[i - 1]!) / m;
  }
  const theta = new Float64Array(N);
  theta[N - 1] = dp[N - 1]!;
  for (let i = N - 2; i >= 0; i--) theta[i] = dp[i]! - cp[i]! * theta[i + 1]!;
  const Ms = new Float64Array(N);
  for (let s = 0; s < n; s++) {
    const k = 1 / spans[s]!;
    const MAB = 2 * k * (2 * theta[s]! + theta[s + 1]!) + FA[s]!;
    if (s > 0) Ms[s] = MAB; // sagging moment at the left end of span s = M_AB
  }
  Ms[0] = 0;
  Ms[n] = 0;
  return Ms;
}

/** Split global loads into per-span local load lists (loads must lie within the beam). */
export function distribute(spans: readonly number[], loads: readonly BeamLoad[]): SpanLoads[] {
  const n = spans.length;
  const x0 = supportsOf(spans);
  const out: SpanLoads[] = [];
  for (let s = 0; s < n; s++) out.push(emptySpanLoads());
  for (const ld of loads) {
    if (ld.type === 'point') {
      const s = spanIndexOf(x0, ld.at);
      out[s]!.P.push(ld.P);
      out[s]!.a.push(ld.at === x0[s + 1]! ? spans[s]! : ld.at - x0[s]!);
    } else {
      for (let s = 0; s < n; s++) {
        const c = Math.max(ld.from, x0[s]!);
        const d = Math.min(ld.to, x0[s + 1]!);
        if (d > c) {
          out[s]!.w.push(ld.w);
          out[s]!.c.push(c - x0[s]!);
          out[s]!.d.push(d === x0[s + 1]! ? spans[s]! : d - x0[s]!);
        }
      }
    }
  }
  for (let s = 0; s < n; s++) finishSpanLoads(out[s]!, spans[s]!);
  return out;
}

/** Support positions (mm) from span lengths. */
export function supportsOf(spans: readonly number[]): number[] {
  const x0 = [0];
  for (const L of spans) x0.push(x0[x0.length - 1]! + L);
  return x0;
}

/** Index of the span containing x (the left one at an interior support). */
export function spanIndexOf(x0: readonly number[], x: number): number {
  const n = x0.length - 1;
  for (let s = 0; s < n - 1; s++) if (x <= x0[s + 1]!) return s;
  return n - 1;
}

/** A solved load case: per-span own loads and the support moments. Plain data (structured-clone safe). */
export interface SolvedCase {
  spanLoads: SpanLoads[];
  /** sagging-positive support moments, N·mm, one per support */
  Msup: Float64Array;
}

export function solveCase(spans: readonly number[], spanLoads: SpanLoads[]): SolvedCase {
  return { spanLoads, Msup: supportMoments(spans, spanLoads) };
}

/** Values of a solved case at local x in span s. */
export function caseM(c: SolvedCase, spans: readonly number[], s: number, x: number): number {
  const L = spans[s]!;
  const xi = x / L;
  return simpleM(c.spanLoads[s]!, x) + c.Msup[s]! * (1 - xi) + c.Msup[s + 1]! * xi;
}

export function caseV(c: SolvedCase, spans: readonly number[], s: number, x: number, side: Side): number {
  const L = spans[s]!;
  return simpleV(c.spanLoads[s]!, x, side) + (c.Msup[s + 1]! - c.Msup[s]!) / L;
}

export function caseEIdelta(c: SolvedCase, spans: readonly number[], s: number, x: number): number {
  const L = spans[s]!;
  const xi = x / L;
  const ML = c.Msup[s]!;
  const MR = c.Msup[s + 1]!;
  return simpleEIdelta(c.spanLoads[s]!, x) + (L * L * xi * (1 - xi) * (ML * (2 - xi) + MR * (1 + xi))) / 6;
}

export function caseShear(c: SolvedCase, s: number, x: number): number {
  return simpleM(c.spanLoads[s]!, x);
}

/** Support reactions (N, upward positive) of a solved case. */
export function caseReactions(c: SolvedCase, spans: readonly number[]): Float64Array {
  const n = spans.length;
  const R = new Float64Array(n + 1);
  for (let s = 0; s < n; s++) {
    const L = spans[s]!;
    const sl = c.spanLoads[s]!;
    const dV = (c.Msup[s + 1]! - c.Msup[s]!) / L;
    R[s]! += sl.RA + dV;
    R[s + 1]! += sl.W - sl.RA - dV;
  }
  return R;
}

/** Locate a global x (with side) as (span index, local x). */
export function locate(spans: readonly number[], x0: readonly number[], x: number, side: Side): [number, number] {
  const n = spans.length;
  for (let j = 1; j < n; j++) {
    if (x === x0[j]) return side < 0 ? [j - 1, spans[j - 1]!] : [j, 0];
  }
  if (x >= x0[n]!) return [n - 1, spans[n - 1]!];
  const s = spanIndexOf(x0, x);
  return [s, x - x0[s]!];
}

export interface BeamSolution {
  spans: number[];
  /** support positions, mm */
  supports: number[];
  /** sagging-positive bending moment at each support, N·mm (0 at the ends) */
  supportMoments: number[];
  /** support reactions, N, upward positive */
  reactions: number[];
  /** bending moment M(x), N·mm; side −1/+1 only matters at a point load (M is continuous) */
  M(x: number): number;
  /** shear V(x), N; side −1 = limit from the left, +1 = from the right (default: right, left at the end) */
  V(x: number, side?: Side): number;
  /** E·I·δ(x), N·mm³, bending deflection, downward positive */
  EIdelta(x: number): number;
  /** G·Av·δ_shear(x), N·mm, shear deflection, downward positive (see module note) */
  GAvDeltaShear(x: number): number;
}

/**
 * Unfactored analysis of one load case. `spans` in mm (each > 0), loads as {type:'point', P, at}
 * (N, mm) or {type:'udl', w, from, to} (N/mm, mm), downward positive, within the beam.
 * Throws DomainError on impossible input.
 */
export function continuousBeam(spans: readonly number[], loads: readonly BeamLoad[]): BeamSolution {
  if (!Array.isArray(spans) || spans.length === 0) {
    throw new DomainError('BAD_SPANS', 'spans must be a non-empty list of lengths (mm)', 'give span lengths in mm, e.g. [24000]', 'spans');
  }
  spans.forEach((L, i) => {
    if (!Number.isFinite(L) || L <= 0) {
      throw new DomainError('SPAN_NOT_POSITIVE', `spans[${i}] must be a positive number of mm, got ${L}`, 'give span lengths in mm', `spans[${i}]`, { value: L });
    }
  });
  const sp = [...spans];
  const x0 = supportsOf(sp);
  const Ltot = x0[x0.length - 1]!;
  loads.forEach((ld, i) => {
    if (ld.type === 'point') {
      if (!Number.isFinite(ld.P)) throw new DomainError('NOT_FINITE', `loads[${i}].P must be a finite number (N)`, 'give the load in N', `loads[${i}].P`);
      if (!Number.isFinite(ld.at) || ld.at < 0 || ld.at > Ltot) {
        throw new DomainError('POINT_OUTSIDE_BEAM', `loads[${i}].at = ${ld.at} mm is outside the beam (0 to ${Ltot} mm)`, 'positions are in mm from the left end', `loads[${i}].at`, { at: ld.at, length: Ltot });
      }
    } else {
      if (!Number.isFinite(ld.w)) throw new DomainError('NOT_FINITE', `loads[${i}].w must be a finite number (N/mm)`, 'give the load in N/mm', `loads[${i}].w`);
      if (!Number.isFinite(ld.from) || !Number.isFinite(ld.to) || ld.from < 0 || ld.to > Ltot || ld.from >= ld.to) {
        throw new DomainError('BAD_RANGE', `loads[${i}] must have 0 <= from < to <= ${Ltot} mm`, 'positions are in mm from the left end', `loads[${i}].from`, { from: ld.from, to: ld.to });
      }
    }
  });
  const c = solveCase(sp, distribute(sp, loads));
  const R = caseReactions(c, sp);
  return {
    spans: sp,
    supports: x0,
    supportMoments: [...c.Msup],
    reactions: [...R],
    M: (x) => {
      const [s, xl] = locate(sp, x0, x, 1);
      return caseM(c, sp, s, xl);
    },
    V: (x, side = x >= Ltot ? -1 : 1) => {
      const [s, xl] = locate(sp, x0, x, side);
      return caseV(c, sp, s, xl, side);
    },
    EIdelta: (x) => {
      const [s, xl] = locate(sp, x0, x, 1);
      return caseEIdelta(c, sp, s, xl);
    },
    GAvDeltaShear: (x) => {
      const [s, xl] = locate(sp, x0, x, 1);
      return caseShear(c, s, xl);
    },
  };
}
