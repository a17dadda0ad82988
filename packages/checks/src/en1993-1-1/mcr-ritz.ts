/**
 * Elastic critical moment Mcr of one segment of a welded I-beam between lateral restraints, for
 * the segment's actual moment diagram, by the Rayleigh–Ritz energy method (EN 1993-1-1 6.3.2.2(2)
 * asks for Mcr "based on gross cross-sectional properties and taking into account the loading
 * conditions, the real moment distribution and the lateral restraints"; the energy formulation is
 * that of Timoshenko & Gere, "Theory of Elastic Stability", 2nd ed., McGraw-Hill 1961, ch. 6, and
 * Trahair, "Flexural-Torsional Buckling of Structures", E & FN Spon 1993, ch. 3 and 5).
 * Units: mm, mm⁴, mm⁶, MPa, N, N·mm.
 *
 * Lateral displacement u and twist φ are sine series over the segment (fork ends: u = u'' = φ =
 * φ'' = 0 at both ends): u = Σ aᵢ sin(iπx/L), φ = Σ bᵢ sin(iπx/L), i = 1 … N. The second variation
 * of the total potential at a load factor λ on the moment diagram m(x) is
 *   ∫ [E Iz/k² u''² + E Iw/kw² φ''² + G It φ'²] dx                                  (stiffness)
 *   + λ { 2 ∫ m u'' φ dx + ∫ m 2zj φ'² dx − Σ Pₛ zg φ(xₛ)² }                          (load)
 * with m ≥ 0 the moment of the sign that compresses the flange zj refers to (zj > 0 when the
 * larger flange is in compression: it stiffens), and Pₛ the transverse loads (downward positive)
 * that the diagram's kinks carry, acting zg above the shear centre (zg > 0 destabilising). Only
 * the load terms that destabilise (Pₛ·zg > 0) are kept: the envelope of several combinations can
 * show kinks that are not loads, and leaving out a stabilising term can only lower Mcr. k and kw
 * enter as effective-length factors on the lateral bending and warping stiffnesses (the common
 * extension of the fork-end solution; exact for uniform moment).
 *
 * The diagram is piecewise linear between its points, so every integral is taken in closed form
 * (no quadrature): with Fₖ = ∫ m cos(kπx/L) dx, ∫ m sinᵢ sinⱼ = (F|i−j| − Fi+j)/2 and
 * ∫ m cosᵢ cosⱼ = (F|i−j| + Fi+j)/2. Sections may vary along the segment (`pieces`, each with its
 * own properties over a sub-length): the stiffness integrals are then taken piece by piece.
 *
 * The critical load factor is the least λ > 0 at which the quadratic form stops being positive
 * definite: 1/λcr is the largest eigenvalue μ of A = L⁻¹(−G)L⁻ᵀ (K = LLᵀ). A's u–u block is zero,
 * so by the Haynsworth inertia theorem the number of its eigenvalues above μ > 0 is the number of
 * positive eigenvalues of S(μ) = BᵀB/μ + E − μI (N × N); μ is found by bisection on whether −S(μ)
 * has a Cholesky factor, and λcr = 1/μ taken at the bracket's upper end (never above the Ritz
 * value of that basis). A Ritz value approaches the true Mcr from above (a subspace can only stiffen
 * the beam): `mcrConverged` doubles the number of terms until Mcr changes by less than 0.5 %.
 */

/** A length of the segment with constant section properties (x from the segment's left end, mm). */
export interface RitzPiece {
  x0: number;
  x1: number;
  /** mm⁴ */
  Iz: number;
  /** mm⁴ */
  It: number;
  /** mm⁶ */
  Iw: number;
  /** Wagner parameter for this segment's compression flange, mm (> 0: the larger flange in compression) */
  zj: number;
  /** load point above the shear centre, mm (> 0 destabilising for gravity loads) */
  zg: number;
}

/** One segment between lateral restraints: its moment diagram and its section(s). */
export interface RitzSegment {
  E: number;
  G: number;
  /** segment length, mm */
  L: number;
  /** the diagram's points: xs from the segment's left end (0 … L, ascending), Ms signed (sagging positive), N·mm; the first n are read */
  xs: ArrayLike<number>;
  Ms: ArrayLike<number>;
  n: number;
  /** sub-lengths covering 0 … L (one for a prismatic segment) */
  pieces: readonly RitzPiece[];
  /** effective length factors (1: fork ends) */
  k: number;
  kw: number;
}

export interface RitzResult {
  /** N·mm */
  Mcr: number;
  /** the largest |M| of the diagram, N·mm (Mcr = λcr·Mmax) */
  Mmax: number;
  /** terms of each series */
  terms: number;
}

export interface ConvergedMcr extends RitzResult {
  /** relative change of Mcr from half as many terms */
  change: number;
  converged: boolean;
}

/** Convergence tolerance: the relative change when the number of terms is doubled. */
export const MCR_TOLERANCE = 0.005;
/** Terms of the first basis (the nested bases of the search's bounds have at most this many). */
export const MCR_FIRST_TERMS = 4;
/** Most terms tried; beyond, the last change is taken off Mcr once more (see mcrConverged). */
export const MCR_MAX_TERMS = 64;

// scratch arrays, grown as needed (the computation is not re-entrant)
let FM = new Float64Array(0); // Fk of m
let FW = new Float64Array(0); // Fk of 2 zj m
let SIN = new Float64Array(0);
let COS = new Float64Array(0);

function grow(n: number): void {
  if (FM.length >= n) return;
  FM = new Float64Array(n);
  FW = new Float64Array(n);
  SIN = new Float64Array(n);
  COS = new Float64Array(n);
}

/** SIN[k] = sin(kθ), COS[k] = cos(kθ), k = 0 … kMax (by the angle-addition recurrence). */
function harmonics(theta: number, kMax: number): void {
  const s1 = Math.sin(theta);
  const c1 = Math.cos(theta);
  SIN[0] = 0;
  COS[0] = 1;
  for (let k = 1; k <= kMax; k++) {
    SIN[k] = SIN[k - 1]! * c1 + COS[k - 1]! * s1;
    COS[k] = COS[k - 1]! * c1 - SIN[k - 1]! * s1;
  }
}

let SA = new Float64Array(0);
let SB = new Float64Array(0);
let SM = new Float64Array(0);

/**
 * out[k] += w·∫ₐᵇ f(x) cos(kπx/L) dx, k = 0 … kMax, for f linear from fa at a to fb at b:
 * (fb sin ωb − fa sin ωa)/ω + f'(cos ωb − cos ωa)/ω², the cosine difference as
 * −2 sin(ω(a+b)/2) sin(ω(b−a)/2) (no cancellation on short intervals).
 */
function addCosMoments(out: Float64Array, a: number, b: number, fa: number, fb: number, L: number, kMax: number, w: number): void {
  const h = b - a;
  if (!(h > 0)) return;
  if (SA.length < kMax + 1) {
    SA = new Float64Array(kMax + 1);
    SB = new Float64Array(kMax + 1);
    SM = new Float64Array(kMax + 1);
  }
  const slope = (fb - fa) / h;
  out[0] = out[0]! + w * 0.5 * (fa + fb) * h;
  const t = Math.PI / L;
  harmonics(t * a, kMax);
  SA.set(SIN.subarray(0, kMax + 1));
  harmonics(t * b, kMax);
  SB.set(SIN.subarray(0, kMax + 1));
  harmonics((t * (a + b)) / 2, kMax);
  SM.set(SIN.subarray(0, kMax + 1));
  harmonics((t * h) / 2, kMax);
  for (let k = 1; k <= kMax; k++) {
    const om = k * t;
    const v = (fb * SB[k]! - fa * SA[k]!) / om + (slope * -2 * SM[k]! * SIN[k]!) / (om * om);
    out[k] = out[k]! + w * v;
  }
}

/**
 * Fₖ = ∫₀ᴸ m cos(kπx/L) dx, k = 0 … kMax, of a diagram m piecewise linear through (xs, ms) with
 * xs[0] = 0 and xs[n−1] = L: integrating by parts twice, Fₖ = [σ_last (−1)ᵏ − σ_first + Σ Kₛ cos(kπxₛ/L)]/ωₖ²
 * for k ≥ 1 (σ the slopes, Kₛ = σₛ₋₁ − σₛ the kinks at the inner points), F₀ the trapezoid rule.
 */
function cosMomentsOfDiagram(out: Float64Array, xs: ArrayLike<number>, ms: ArrayLike<number>, n: number, L: number, kMax: number): void {
  let F0 = 0;
  for (let s = 0; s + 1 < n; s++) F0 += 0.5 * (ms[s]! + ms[s + 1]!) * (xs[s + 1]! - xs[s]!);
  out[0] = F0;
  const first = (ms[1]! - ms[0]!) / (xs[1]! - xs[0]!);
  const last = (ms[n - 1]! - ms[n - 2]!) / (xs[n - 1]! - xs[n - 2]!);
  for (let k = 1; k <= kMax; k++) out[k] = (k & 1 ? -last : last) - first;
  let prev = first;
  for (let s = 1; s + 1 < n; s++) {
    const next = (ms[s + 1]! - ms[s]!) / (xs[s + 1]! - xs[s]!);
    const K = prev - next;
    prev = next;
    if (K === 0) continue;
    harmonics((Math.PI * xs[s]!) / L, kMax);
    for (let k = 1; k <= kMax; k++) out[k] = out[k]! + K * COS[k]!;
  }
  const t = Math.PI / L;
  for (let k = 1; k <= kMax; k++) out[k] = out[k]! / (k * t * k * t);
}

let MS = new Float64Array(0);

/** The piece holding x (the last whose x0 ≤ x). */
function pieceAt(pieces: readonly RitzPiece[], x: number): RitzPiece {
  let p = pieces[0]!;
  for (const q of pieces) if (q.x0 <= x) p = q;
  return p;
}

/**
 * The matrices of a segment for N terms, in the scaled form the eigenvalue needs: B (N × N,
 * row-major, u rows by φ columns) and E (N × N) of A = L⁻¹(−G)L⁻ᵀ, and Mmax.
 */
function assemble(seg: RitzSegment, N: number): { B: Float64Array; Em: Float64Array; Mmax: number } {
  const { xs, Ms, n, L, pieces, E, G } = seg;
  const kMax = 2 * N;
  grow(kMax + 1);
  // the sign of the largest |M| is the segment's sign: m = σ M ≥ 0
  let gov = 0;
  for (let s = 1; s < n; s++) if (Math.abs(Ms[s]!) > Math.abs(Ms[gov]!)) gov = s;
  const sigma = Ms[gov]! < 0 ? -1 : 1;
  const Mmax = Math.abs(Ms[gov]!);
  const prismatic = pieces.length === 1;
  if (prismatic && n >= 2 && xs[0] === 0 && xs[n - 1] === L && Mmax > 0) return assemblePrismatic(seg, N, sigma, Mmax);
  FM.fill(0, 0, kMax + 1);
  FW.fill(0, 0, kMax + 1);
  if (prismatic && n >= 2 && xs[0] === 0 && xs[n - 1] === L) {
    if (MS.length < n) MS = new Float64Array(n);
    for (let s = 0; s < n; s++) MS[s] = sigma * Ms[s]!;
    cosMomentsOfDiagram(FM, xs, MS, n, L, kMax);
    const w = 2 * pieces[0]!.zj;
    for (let k = 0; k <= kMax; k++) FW[k] = w * FM[k]!;
  } else {
    // intervals of the diagram, cut again at the pieces' ends (m linear on each, props constant)
    const cuts: number[] = [];
    for (const p of pieces) if (p.x0 > 0 && p.x0 < L) cuts.push(p.x0);
    const mAt = (s: number, x: number): number => sigma * (Ms[s]! + ((Ms[s + 1]! - Ms[s]!) * (x - xs[s]!)) / (xs[s + 1]! - xs[s]!));
    for (let s = 0; s + 1 < n; s++) {
      const a = xs[s]!;
      const b = xs[s + 1]!;
      if (!(b > a)) continue;
      const inner = cuts.filter((c) => c > a && c < b);
      const pts = [a, ...inner, b];
      for (let q = 0; q + 1 < pts.length; q++) {
        const xa = pts[q]!;
        const xb = pts[q + 1]!;
        const fa = q === 0 ? sigma * Ms[s]! : mAt(s, xa);
        const fb = q + 2 === pts.length ? sigma * Ms[s + 1]! : mAt(s, xb);
        addCosMoments(FM, xa, xb, fa, fb, L, kMax, 1);
        const zj = prismatic ? pieces[0]!.zj : pieceAt(pieces, (xa + xb) / 2).zj;
        addCosMoments(FW, xa, xb, fa, fb, L, kMax, 2 * zj);
      }
    }
  }
  const p = (i: number): number => (i * Math.PI) / L;
  // stiffness: K = blockdiag(Kuu, Kφφ)
  const Kuu = new Float64Array(N * N);
  const Kpp = new Float64Array(N * N);
  const ek = E / (seg.k * seg.k);
  const ekw = E / (seg.kw * seg.kw);
  if (pieces.length === 1) {
    const q = pieces[0]!;
    for (let i = 1; i <= N; i++) {
      const pi = p(i);
      const p2 = pi * pi;
      Kuu[(i - 1) * (N + 1)] = (ek * q.Iz * p2 * p2 * L) / 2;
      Kpp[(i - 1) * (N + 1)] = ((q.It * G * p2 + ekw * q.Iw * p2 * p2) * L) / 2;
    }
  } else {
    const S = new Float64Array(kMax + 1);
    for (const q of pieces) {
      S.fill(0);
      addCosMoments(S, Math.max(0, q.x0), Math.min(L, q.x1), 1, 1, L, kMax, 1);
      for (let i = 1; i <= N; i++) {
        for (let j = 1; j <= N; j++) {
          const ss = (S[Math.abs(i - j)]! - S[i + j]!) / 2;
          const cc = (S[Math.abs(i - j)]! + S[i + j]!) / 2;
          const pp2 = p(i) * p(i) * p(j) * p(j);
          Kuu[(i - 1) * N + (j - 1)] = Kuu[(i - 1) * N + (j - 1)]! + ek * q.Iz * pp2 * ss;
          Kpp[(i - 1) * N + (j - 1)] = Kpp[(i - 1) * N + (j - 1)]! + q.It * G * p(i) * p(j) * cc + ekw * q.Iw * pp2 * ss;
        }
      }
    }
  }
  // load: C (u_i, φ_j), H = W − Q (φ, φ); then −C and −H
  const negC = new Float64Array(N * N);
  const negH = new Float64Array(N * N);
  for (let i = 1; i <= N; i++) {
    for (let j = 1; j <= N; j++) {
      const d = Math.abs(i - j);
      negC[(i - 1) * N + (j - 1)] = (p(i) * p(i) * (FM[d]! - FM[i + j]!)) / 2;
      negH[(i - 1) * N + (j - 1)] = (-p(i) * p(j) * (FW[d]! + FW[i + j]!)) / 2;
    }
  }
  // destabilising transverse loads at the diagram's kinks: P = M'(x−) − M'(x+) (downward positive)
  for (let s = 1; s + 1 < n; s++) {
    const dl = xs[s]! - xs[s - 1]!;
    const dr = xs[s + 1]! - xs[s]!;
    if (!(dl > 0 && dr > 0)) continue;
    const P = (Ms[s]! - Ms[s - 1]!) / dl - (Ms[s + 1]! - Ms[s]!) / dr;
    const zg = pieces.length === 1 ? pieces[0]!.zg : pieceAt(pieces, xs[s]!).zg;
    const Pz = P * zg;
    if (!(Pz > 0)) continue;
    harmonics((Math.PI * xs[s]!) / L, N);
    for (let i = 1; i <= N; i++) for (let j = 1; j <= N; j++) negH[(i - 1) * N + (j - 1)] = negH[(i - 1) * N + (j - 1)]! + Pz * SIN[i]! * SIN[j]!;
  }
  // scale: B = Lu⁻¹(−C)Lφ⁻ᵀ, E = Lφ⁻¹(−H)Lφ⁻ᵀ (diagonal K: divide by √(Kᵢᵢ Kⱼⱼ))
  if (prismatic) {
    for (let i = 0; i < N; i++) {
      const du = Math.sqrt(Kuu[i * (N + 1)]!);
      const dpi = Math.sqrt(Kpp[i * (N + 1)]!);
      for (let j = 0; j < N; j++) {
        const dpj = Math.sqrt(Kpp[j * (N + 1)]!);
        negC[i * N + j] = negC[i * N + j]! / (du * dpj);
        negH[i * N + j] = negH[i * N + j]! / (dpi * dpj);
      }
    }
    return { B: negC, Em: negH, Mmax };
  }
  const Lu = cholesky(Kuu, N);
  const Lp = cholesky(Kpp, N);
  if (!Lu || !Lp) return { B: new Float64Array(N * N).fill(Number.NaN), Em: new Float64Array(N * N).fill(Number.NaN), Mmax };
  const B = congruence(Lu, negC, Lp, N);
  const Em = congruence(Lp, negH, Lp, N);
  return { B, Em, Mmax };
}

let DU = new Float64Array(0);
let DP = new Float64Array(0);
let PB = new Float64Array(0);
let PE = new Float64Array(0);

/**
 * assemble for a prismatic segment whose diagram starts at 0 and ends at L: K is diagonal, so
 * B and E are −C and −H divided by √(Kᵢᵢ Kⱼⱼ); into scratch arrays (valid until the next call).
 */
function assemblePrismatic(seg: RitzSegment, N: number, sigma: number, Mmax: number): { B: Float64Array; Em: Float64Array; Mmax: number } {
  const { xs, Ms, n, L, E, G } = seg;
  const q = seg.pieces[0]!;
  const kMax = 2 * N;
  grow(kMax + 1);
  if (DU.length < N) {
    DU = new Float64Array(N);
    DP = new Float64Array(N);
  }
  if (PB.length < N * N) {
    PB = new Float64Array(N * N);
    PE = new Float64Array(N * N);
  }
  const t = Math.PI / L;
  // one pass over the inner points: Fₖ of m (cosMomentsOfDiagram, integrated by parts: the kinks
  // Kₛ of m = σM) and Rₖ = Σ Pₛzg cos(kπxₛ/L) of the destabilising loads Pₛ = M'(x−) − M'(x+),
  // so that Σ Pₛzg sinᵢ sinⱼ = (R|i−j| − Ri+j)/2
  const zg = q.zg;
  let F0 = 0;
  for (let s = 0; s + 1 < n; s++) F0 += 0.5 * sigma * (Ms[s]! + Ms[s + 1]!) * (xs[s + 1]! - xs[s]!);
  const first = (Ms[1]! - Ms[0]!) / (xs[1]! - xs[0]!);
  const last = (Ms[n - 1]! - Ms[n - 2]!) / (xs[n - 1]! - xs[n - 2]!);
  FM[0] = F0;
  FW[0] = 0;
  for (let k = 1; k <= kMax; k++) {
    FM[k] = sigma * ((k & 1 ? -last : last) - first);
    FW[k] = 0; // R here
  }
  let prev = first;
  for (let s = 1; s + 1 < n; s++) {
    const next = (Ms[s + 1]! - Ms[s]!) / (xs[s + 1]! - xs[s]!);
    const P = prev - next;
    prev = next;
    if (P === 0) continue;
    harmonics(t * xs[s]!, kMax);
    const K = sigma * P;
    for (let k = 1; k <= kMax; k++) FM[k] = FM[k]! + K * COS[k]!;
    const Pz = P * zg;
    if (Pz > 0) for (let k = 0; k <= kMax; k++) FW[k] = FW[k]! + Pz * COS[k]!;
  }
  for (let k = 1; k <= kMax; k++) FM[k] = FM[k]! / (k * t * k * t);
  const ek = (E * q.Iz) / (seg.k * seg.k);
  const ekw = (E * q.Iw) / (seg.kw * seg.kw);
  const git = G * q.It;
  for (let i = 0; i < N; i++) {
    const pi = (i + 1) * t;
    const p2 = pi * pi;
    DU[i] = Math.sqrt((ek * p2 * p2 * L) / 2);
    DP[i] = Math.sqrt(((git * p2 + ekw * p2 * p2) * L) / 2);
  }
  const w2 = 2 * q.zj;
  for (let i = 1; i <= N; i++) {
    const pi = i * t;
    for (let j = 1; j <= N; j++) {
      const d = i > j ? i - j : j - i;
      const pj = j * t;
      const r = (i - 1) * N + (j - 1);
      PB[r] = (pi * pi * (FM[d]! - FM[i + j]!)) / 2 / (DU[i - 1]! * DP[j - 1]!);
      PE[r] = ((-pi * pj * w2 * (FM[d]! + FM[i + j]!)) / 2 + (FW[d]! - FW[i + j]!) / 2) / (DP[i - 1]! * DP[j - 1]!);
    }
  }
  return { B: PB, Em: PE, Mmax };
}

/**
 * In-place Cholesky factorisation of a symmetric N × N matrix (row-major): its lower triangle
 * becomes L (the upper is left as it was); false when the matrix is not positive definite.
 */
function choleskyInPlace(A: Float64Array, N: number): boolean {
  for (let i = 0; i < N; i++) {
    for (let j = 0; j <= i; j++) {
      let s = A[i * N + j]!;
      for (let k = 0; k < j; k++) s -= A[i * N + k]! * A[j * N + k]!;
      if (i === j) {
        if (!(s > 0)) return false;
        A[i * N + i] = Math.sqrt(s);
      } else A[i * N + j] = s / A[j * N + j]!;
    }
  }
  return true;
}

/** Lower-triangular Cholesky factor of a symmetric N × N matrix (row-major), or null when not positive definite. */
function cholesky(M: Float64Array, N: number): Float64Array | null {
  const Lm = Float64Array.from(M);
  if (!choleskyInPlace(Lm, N)) return null;
  for (let i = 0; i < N; i++) for (let j = i + 1; j < N; j++) Lm[i * N + j] = 0;
  return Lm;
}

/** X = L1⁻¹ M L2⁻ᵀ for lower-triangular L1, L2 (forward substitutions). */
function congruence(L1: Float64Array, M: Float64Array, L2: Float64Array, N: number): Float64Array {
  // Y = L1⁻¹ M (column by column)
  const Y = new Float64Array(N * N);
  for (let c = 0; c < N; c++) {
    for (let i = 0; i < N; i++) {
      let s = M[i * N + c]!;
      for (let k = 0; k < i; k++) s -= L1[i * N + k]! * Y[k * N + c]!;
      Y[i * N + c] = s / L1[i * N + i]!;
    }
  }
  // X = Y L2⁻ᵀ, i.e. Xᵀ = L2⁻¹ Yᵀ (row by row of Y)
  const X = new Float64Array(N * N);
  for (let r = 0; r < N; r++) {
    for (let j = 0; j < N; j++) {
      let s = Y[r * N + j]!;
      for (let k = 0; k < j; k++) s -= L2[j * N + k]! * X[r * N + k]!;
      X[r * N + j] = s / L2[j * N + j]!;
    }
  }
  return X;
}

/** Whether −S(μ) = μI − E − BᵀB/μ is positive definite (then no eigenvalue of A exceeds μ). */
function above(BtB: Float64Array, Em: Float64Array, N: number, mu: number, work: Float64Array): boolean {
  for (let i = 0; i < N * N; i++) work[i] = -Em[i]! - BtB[i]! / mu;
  for (let i = 0; i < N; i++) work[i * N + i] = work[i * N + i]! + mu;
  return choleskyInPlace(work, N);
}

let BTB = new Float64Array(0);
let WORK = new Float64Array(0);

/**
 * The largest eigenvalue of [[0, B], [Bᵀ, E]] from above (the upper end of a bracket of relative
 * width ≤ 1e-8), given a value known not to exceed it (`floor`, e.g. that of a nested basis).
 */
function largestEigen(B: Float64Array, Em: Float64Array, N: number, floor = 0): number {
  if (BTB.length < N * N) {
    BTB = new Float64Array(N * N);
    WORK = new Float64Array(N * N);
  }
  const BtB = BTB;
  for (let i = 0; i < N; i++) {
    for (let j = 0; j < N; j++) {
      let s = 0;
      for (let k = 0; k < N; k++) s += B[k * N + i]! * B[k * N + j]!;
      BtB[i * N + j] = s;
    }
  }
  // a lower bound: the largest eigenvalue of any 2 × 2 principal submatrix (u_i, φ_j) (interlacing)
  let lo = 0;
  for (let i = 0; i < N; i++) {
    for (let j = 0; j < N; j++) {
      const b = B[i * N + j]!;
      const e = Em[j * N + j]!;
      lo = Math.max(lo, (e + Math.sqrt(e * e + 4 * b * b)) / 2);
    }
  }
  // an upper bound: Gershgorin
  let hi = 0;
  for (let i = 0; i < N; i++) {
    let ru = 0;
    let rp = 0;
    for (let j = 0; j < N; j++) {
      ru += Math.abs(B[i * N + j]!);
      rp += Math.abs(B[j * N + i]!) + Math.abs(Em[i * N + j]!);
    }
    hi = Math.max(hi, ru, rp);
  }
  if (floor > lo) lo = floor;
  if (!(lo > 0) || !(hi > 0)) return Number.NaN;
  const work = WORK;
  // Gershgorin's bound (or the floor) to round-off: moved up until −S(hi) is positive definite
  if (hi < lo) hi = lo;
  for (let it = 0; it < 60 && !above(BtB, Em, N, hi, work); it++) hi = hi * (1 + 1e-9 * 2 ** it);
  if (!above(BtB, Em, N, hi, work)) return Number.NaN;
  // a nested basis's value is usually within a few per cent: try a tight bracket first
  for (let f = 1.002; f < 4 && lo * f < hi; f *= f) {
    if (above(BtB, Em, N, lo * f, work)) {
      hi = lo * f;
      break;
    }
    lo = lo * f;
  }
  for (let it = 0; it < 200 && hi - lo > 1e-7 * hi; it++) {
    const mid = 0.5 * (lo + hi);
    if (above(BtB, Em, N, mid, work)) hi = mid;
    else lo = mid;
  }
  return hi;
}

/** Mcr of a segment with N terms of each series (a Ritz value: at least the true Mcr, at most the value with fewer terms of the same series). */
export function mcrRitz(seg: RitzSegment, N: number, McrFewer = Infinity): RitzResult {
  const { B, Em, Mmax } = assemble(seg, N);
  if (!(Mmax > 0)) return { Mcr: Infinity, Mmax, terms: N };
  // Mcr of a nested basis with fewer terms is at least this one's: 1/μ ≤ that
  const mu = largestEigen(B, Em, N, McrFewer < Infinity ? (Mmax / McrFewer) * (1 - 1e-9) : 0);
  return { Mcr: Mmax / mu, Mmax, terms: N };
}

/**
 * Mcr converged in the number of terms: N = 4, 8, 16, … until Mcr changes by less than 0.5 % from
 * the previous N (the value with more terms is used: lower, nearer the true value). Should 64 terms
 * not converge, the last change is taken off once more (the error at least halves per doubling in
 * every case tested) and `converged` is false.
 */
export function mcrConverged(seg: RitzSegment, tol = MCR_TOLERANCE): ConvergedMcr {
  let prev = mcrRitz(seg, MCR_FIRST_TERMS);
  if (!Number.isFinite(prev.Mcr)) return { ...prev, change: 0, converged: true };
  for (let N = 2 * MCR_FIRST_TERMS; N <= MCR_MAX_TERMS; N *= 2) {
    const next = mcrRitz(seg, N, prev.Mcr);
    const change = (prev.Mcr - next.Mcr) / next.Mcr;
    if (!(Math.abs(change) >= tol)) return { ...next, change, converged: Number.isFinite(change) };
    prev = next;
    if (N === MCR_MAX_TERMS) return { ...next, Mcr: next.Mcr * (1 - Math.abs(change)), change, converged: false };
  }
  return { ...prev, change: Number.NaN, converged: false };
}

/**
 * Mcr of a prismatic segment under uniform moment (closed form, Timoshenko & Gere 6.2 with the
 * Wagner term; ENV 1993-1-1 Annex F eq. F.2 with C1 = C3 = 1, C2·zg irrelevant):
 * π²E Iz/(kL)² [zj + √(zj² + (k/kw)² Iw/Iz + (kL)² G It/(π² E Iz))].
 */
export function mcrUniform(E: number, G: number, Iz: number, It: number, Iw: number, L: number, zj: number, k = 1, kw = 1): number {
  const kL = k * L;
  const base = (Math.PI * Math.PI * E * Iz) / (kL * kL);
  return base * (zj + Math.sqrt(zj * zj + ((k / kw) * (k / kw) * Iw) / Iz + (kL * kL * G * It) / (Math.PI * Math.PI * E * Iz)));
}

/**
 * A trial subspace for upper bounds on the Ritz Mcr over a band of diagrams (the search's set
 * bounds): u = a·U(x), φ = b·Φ(x) with fixed shapes U = Σ aᵢ sinᵢ, Φ = Σ bᵢ sinᵢ (i ≤ `terms`,
 * so a subspace of every basis mcrConverged uses). With two free amplitudes the critical load
 * factor is closed form,
 *   λ = [ku h + √(ku² h² + 4 c² ku kφ)] / (2c²),
 * ku = E Iz/k²·Σaᵢ²pᵢ⁴L/2, kφ = G It·Σbᵢ²pᵢ²L/2 + E Iw/kw²·Σbᵢ²pᵢ⁴L/2, c = ∫ m U'' Φ dx and
 * h = 2zj ∫ m Φ'² dx − Σ Pₛ zg Φ(xₛ)², and λ is at least the Ritz λ of any basis holding the shapes
 * (a subspace can only stiffen). λ falls as c² grows and rises with h, and c and ∫ m Φ'² are linear
 * in the diagram's point values: `gc`, `gw` are their weights (c = Σ gcₛ mₛ), so a band of diagrams
 * bounds them at once; leaving out the load-height term (never negative: only destabilising
 * loads are kept) can only raise λ. The shapes are those of the band's middle diagram for a
 * beam stiff in warping only (then the mode does not depend on the section): any shapes give a
 * bound, good ones a tight one.
 */
export interface RitzTrial {
  /** Σ aᵢ² pᵢ⁴ L/2 (× E Iz/k² = ku) */
  au: number;
  /** Σ bᵢ² pᵢ² L/2 (× G It) */
  bt: number;
  /** Σ bᵢ² pᵢ⁴ L/2 (× E Iw/kw²) */
  bw: number;
  /** weights per diagram point of c = ∫ m U''Φ dx */
  gc: Float64Array;
  /** weights per diagram point of w = ∫ m Φ'² dx */
  gw: Float64Array;
}

/** The trial shapes and weights for diagrams through points xs (0 … L, ascending) near `mid` (magnitudes ≥ 0). */
export function ritzTrial(xs: ArrayLike<number>, mid: ArrayLike<number>, n: number, L: number, terms = MCR_FIRST_TERMS): RitzTrial {
  const N = terms;
  const kMax = 2 * N;
  const t = Math.PI / L;
  const F = new Float64Array(kMax + 1);
  grow(kMax + 1);
  cosMomentsOfDiagram(F, xs, mid, n, L, kMax);
  // B0 = D⁻½(−C)D⁻½ with D = diag(pᵢ⁴): the coupling of a beam stiff in warping only
  const B0 = new Float64Array(N * N);
  for (let i = 1; i <= N; i++) for (let j = 1; j <= N; j++) B0[(i - 1) * N + (j - 1)] = (F[Math.abs(i - j)]! - F[i + j]!) / 2 / (j * t * j * t);
  // its top right singular vector by power iteration on B0ᵀB0
  let v = new Float64Array(N);
  v[0] = 1;
  for (let it = 0; it < 100; it++) {
    const u = new Float64Array(N);
    for (let i = 0; i < N; i++) for (let j = 0; j < N; j++) u[i] = u[i]! + B0[i * N + j]! * v[j]!;
    const w = new Float64Array(N);
    for (let j = 0; j < N; j++) for (let i = 0; i < N; i++) w[j] = w[j]! + B0[i * N + j]! * u[i]!;
    let norm = 0;
    for (let j = 0; j < N; j++) norm += w[j]! * w[j]!;
    norm = Math.sqrt(norm);
    if (!(norm > 0)) break;
    for (let j = 0; j < N; j++) w[j] = w[j]! / norm;
    v = w;
  }
  const uS = new Float64Array(N);
  for (let i = 0; i < N; i++) for (let j = 0; j < N; j++) uS[i] = uS[i]! + B0[i * N + j]! * v[j]!;
  let uNorm = 0;
  for (let i = 0; i < N; i++) uNorm += uS[i]! * uS[i]!;
  const a = new Float64Array(N);
  const b = new Float64Array(N);
  for (let i = 0; i < N; i++) {
    const p2 = (i + 1) * t * (i + 1) * t;
    a[i] = uNorm > 0 ? uS[i]! / Math.sqrt(uNorm) / p2 : i === 0 ? 1 : 0;
    b[i] = uNorm > 0 ? v[i]! / p2 : i === 0 ? 1 : 0;
  }
  // c = Σ κₖ Fₖ and w = Σ ωₖ Fₖ (C_ij = −pᵢ²(F|i−j| − Fi+j)/2, W₀_ij = pᵢpⱼ(F|i−j| + Fi+j)/2)
  const kappa = new Float64Array(kMax + 1);
  const omega = new Float64Array(kMax + 1);
  let au = 0;
  let bt = 0;
  let bw = 0;
  for (let i = 1; i <= N; i++) {
    const pi = i * t;
    au += (a[i - 1]! * a[i - 1]! * pi * pi * pi * pi * L) / 2;
    bt += (b[i - 1]! * b[i - 1]! * pi * pi * L) / 2;
    bw += (b[i - 1]! * b[i - 1]! * pi * pi * pi * pi * L) / 2;
    for (let j = 1; j <= N; j++) {
      const pj = j * t;
      const d = Math.abs(i - j);
      const cc = (-a[i - 1]! * b[j - 1]! * pi * pi) / 2;
      kappa[d] = kappa[d]! + cc;
      kappa[i + j] = kappa[i + j]! - cc;
      const ww = (b[i - 1]! * b[j - 1]! * pi * pj) / 2;
      omega[d] = omega[d]! + ww;
      omega[i + j] = omega[i + j]! + ww;
    }
  }
  // ∂Fₖ/∂mₛ: F₀ by the trapezoid rule; Fₖ = Σₜ (mₜ₊₁ − mₜ)/dₜ·(cos ωxₜ₊₁ − cos ωxₜ)/ω²
  const gc = new Float64Array(n);
  const gw = new Float64Array(n);
  const cosAt = new Float64Array(n * (kMax + 1));
  for (let s = 0; s < n; s++) {
    harmonics(t * xs[s]!, kMax);
    for (let k = 0; k <= kMax; k++) cosAt[s * (kMax + 1) + k] = COS[k]!;
  }
  for (let s = 0; s < n; s++) {
    const dl = s > 0 ? xs[s]! - xs[s - 1]! : 0;
    const dr = s + 1 < n ? xs[s + 1]! - xs[s]! : 0;
    let c = (kappa[0]! * (dl + dr)) / 2;
    let w = (omega[0]! * (dl + dr)) / 2;
    for (let k = 1; k <= kMax; k++) {
      let dF = 0;
      if (s > 0 && dl > 0) dF += (cosAt[s * (kMax + 1) + k]! - cosAt[(s - 1) * (kMax + 1) + k]!) / dl;
      if (s + 1 < n && dr > 0) dF -= (cosAt[(s + 1) * (kMax + 1) + k]! - cosAt[s * (kMax + 1) + k]!) / dr;
      dF /= k * t * k * t;
      c += kappa[k]! * dF;
      w += omega[k]! * dF;
    }
    gc[s] = c;
    gw[s] = w;
  }
  return { au, bt, bw, gc, gw };
}

/**
 * The trial's upper bound on Mcr (N·mm) for a section (E Iz/k² ku-factor, …) given the least c²
 * and the largest 2zj·w over the band, and the band's largest Mmax: Mmax·λ (Infinity when c² = 0).
 */
export function ritzTrialMcr(E: number, G: number, Iz: number, It: number, Iw: number, k: number, kw: number, au: number, bt: number, bw: number, c2: number, h: number, Mmax: number): number {
  if (!(c2 > 0)) return Infinity;
  const ku = ((E * Iz) / (k * k)) * au;
  const kp = G * It * bt + ((E * Iw) / (kw * kw)) * bw;
  return (Mmax * (ku * h + Math.sqrt(ku * ku * h * h + 4 * c2 * ku * kp))) / (2 * c2);
}

/**
 * mcrRitz(seg, 1) in closed form for a prismatic segment whose points run from 0 to L: one half
 * sine for u and φ, det[[ku, λc], [λc, kφ + λh]] = 0, λ = [ku h + √(ku²h² + 4c²ku kφ)]/(2c²). At
 * least the Mcr of any basis holding that sine (a cheap first screen; Infinity when c = 0).
 */
export function mcrOneTerm(seg: RitzSegment): number {
  const { xs, Ms, n, L, E, G } = seg;
  const q = seg.pieces[0]!;
  let gov = 0;
  for (let s = 1; s < n; s++) if (Math.abs(Ms[s]!) > Math.abs(Ms[gov]!)) gov = s;
  const sigma = Ms[gov]! < 0 ? -1 : 1;
  const Mmax = Math.abs(Ms[gov]!);
  if (!(Mmax > 0) || seg.pieces.length !== 1 || n < 2 || xs[0] !== 0 || xs[n - 1] !== L) return Number.NaN;
  const t = Math.PI / L;
  // F0, F2 of m = σM (integrated by parts as cosMomentsOfDiagram) and Q11 of the destabilising loads
  let F0 = 0;
  for (let s = 0; s + 1 < n; s++) F0 += 0.5 * sigma * (Ms[s]! + Ms[s + 1]!) * (xs[s + 1]! - xs[s]!);
  const first = (Ms[1]! - Ms[0]!) / (xs[1]! - xs[0]!);
  const last = (Ms[n - 1]! - Ms[n - 2]!) / (xs[n - 1]! - xs[n - 2]!);
  let F2 = sigma * (last - first);
  let Q = 0;
  let prev = first;
  for (let s = 1; s + 1 < n; s++) {
    const next = (Ms[s + 1]! - Ms[s]!) / (xs[s + 1]! - xs[s]!);
    const P = prev - next;
    prev = next;
    if (P === 0) continue;
    const th = t * xs[s]!;
    F2 += sigma * P * Math.cos(2 * th);
    const Pz = P * q.zg;
    if (Pz > 0) {
      const sn = Math.sin(th);
      Q += Pz * sn * sn;
    }
  }
  F2 /= 4 * t * t;
  const c = (-t * t * (F0 - F2)) / 2;
  const h = (2 * q.zj * t * t * (F0 + F2)) / 2 - Q;
  const p4 = t * t * t * t;
  const ku = ((E * q.Iz) / (seg.k * seg.k)) * p4 * (L / 2);
  const kp = (G * q.It * t * t + ((E * q.Iw) / (seg.kw * seg.kw)) * p4) * (L / 2);
  const c2 = c * c;
  if (!(c2 > 0)) return Infinity;
  return (Mmax * (ku * h + Math.sqrt(ku * ku * h * h + 4 * c2 * ku * kp))) / (2 * c2);
}
