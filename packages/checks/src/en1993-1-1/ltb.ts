import { chi, type BucklingCurve, ALPHA } from './buckling-curves.js';
import type { FlangeSide } from '../section.js';
import type { CheckContext, CheckResult, CheckValue, Effects, Station } from '../types.js';
import { notApplicable, verdict } from '../result.js';
import { bracket, envelopeOf, firstAbove, type SignBending } from './bending.js';
import { perSide } from '../context.js';
import { negligibleMoment } from '../tolerances.js';
import { MCR_FIRST_TERMS, mcrConverged, mcrOneTerm, mcrRitz, mcrUniform, type RitzSegment } from './mcr-ritz.js';

/** The screen keeps the one-term Mcr of a segment whose utilisation with it is below this (a lower bound either way; more terms only where they may decide). */
const SCREEN_ONE_TERM_BELOW = 0.8;

/**
 * Lateral-torsional buckling of a welded (mono-)symmetric I-beam, EN 1993-1-1:2005 6.3.2.
 * Units: mm, mm⁴, mm⁶, MPa, N·mm.
 */

export interface McrInput {
  E: number;
  G: number;
  /** second moment about the weak axis, mm⁴ */
  Iz: number;
  /** St Venant torsion constant, mm⁴ */
  It: number;
  /** warping constant, mm⁶ */
  Iw: number;
  /** length between lateral restraints, mm */
  L: number;
  C1: number;
  C2?: number;
  C3?: number;
  /** load point above the shear centre, mm, positive when destabilising */
  zg?: number;
  /** mono-symmetry parameter, mm, positive when the larger flange is in compression */
  zj?: number;
  k?: number;
  kw?: number;
}

/**
 * Elastic critical moment by the three-factor formula (ENV 1993-1-1 Annex F eq. F.2; Access Steel
 * NCCI SN003 eq. (1) for zj = 0):
 * Mcr = C1 π²EIz/(kL)² {√[(k/kw)² Iw/Iz + (kL)² G It/(π² E Iz) + (C2 zg − C3 zj)²] − (C2 zg − C3 zj)}.
 */
export function mcr(p: McrInput): number {
  return mcrOf(p.E, p.G, p.Iz, p.It, p.Iw, p.L, p.C1, p.C2 ?? 0, p.C3 ?? 0, p.zg ?? 0, p.zj ?? 0, p.k ?? 1, p.kw ?? 1);
}

/** mcr from plain numbers (no input object: for callers that evaluate it very often). */
export function mcrOf(E: number, G: number, Iz: number, It: number, Iw: number, L: number, C1: number, C2: number, C3: number, zg: number, zj: number, k = 1, kw = 1): number {
  const kL = k * L;
  const a = C2 * zg - C3 * zj;
  const base = (C1 * Math.PI ** 2 * E * Iz) / (kL * kL);
  const root = Math.sqrt((k / kw) ** 2 * (Iw / Iz) + (kL * kL * G * It) / (Math.PI ** 2 * E * Iz) + a * a);
  return base * (root - a);
}

/** EN 1993-1-1 6.3.2.2(1) eq. 6.56 (general case): χLT from the column curves, λ̄LT,0 = 0.2 plateau. */
export function chiLTGeneral(lambdaLT: number, curve: BucklingCurve): { chiLT: number; phiLT: number } {
  const r = chi(lambdaLT, curve);
  return { chiLT: r.chi, phiLT: r.phi };
}

/**
 * EN 1993-1-1 6.3.2.3(1) eq. 6.57: ΦLT = 0.5[1 + αLT(λ̄LT − λ̄LT,0) + β λ̄LT²],
 * χLT = 1/(ΦLT + √(ΦLT² − β λ̄LT²)) ≤ 1 and ≤ 1/λ̄LT². Recommended λ̄LT,0 = 0.4, β = 0.75 (NA choices).
 * 6.3.2.3(2) eq. 6.58: with kc (Table 6.6), f = 1 − 0.5(1 − kc)[1 − 2(λ̄LT − 0.8)²] ≤ 1,
 * χLT,mod = χLT/f ≤ 1 (and ≤ 1/λ̄LT²).
 */
export function chiLT(p: { lambdaLT: number; alphaLT: number; lambdaLT0?: number; beta?: number; kc?: number }): { chiLT: number; phiLT: number; f: number } {
  const l0 = p.lambdaLT0 ?? 0.4;
  const beta = p.beta ?? 0.75;
  const l = p.lambdaLT;
  const phiLT = 0.5 * (1 + p.alphaLT * (l - l0) + beta * l * l);
  let c = 1 / (phiLT + Math.sqrt(phiLT * phiLT - beta * l * l));
  const cap = l > 0 ? Math.min(1, 1 / (l * l)) : 1;
  c = Math.min(c, cap);
  let f = 1;
  if (p.kc !== undefined) {
    f = Math.min(1, 1 - 0.5 * (1 - p.kc) * (1 - 2 * (l - 0.8) ** 2));
    c = Math.min(c / f, cap);
  }
  return { chiLT: c, phiLT, f };
}

/**
 * C1 for a linear moment diagram with end-moment ratio ψ (−1 ≤ ψ ≤ 1), k = 1, from the Access Steel
 * NCCI SN003 end-moment table (values transcribed from memory: 1.00, 1.14, 1.31, 1.52, 1.77, 2.05,
 * 2.33, 2.57, 2.55 at ψ = 1, 0.75, …, −1), linearly interpolated between the tabulated ψ.
 */
const C1_END: readonly number[] = [2.55, 2.57, 2.33, 2.05, 1.77, 1.52, 1.31, 1.14, 1.0]; // ψ = −1 … +1 step 0.25
/** C3 for end moments, k = 1, ENV 1993-1-1 Table F.1.1 (from memory), same ψ grid. */
const C3_END: readonly number[] = [0.0, 0.366, 0.676, 0.855, 0.939, 0.977, 0.992, 0.998, 1.0];

function interpPsi(table: readonly number[], psi: number): number {
  const p = Math.max(-1, Math.min(1, psi));
  const u = (p + 1) / 0.25;
  const i = Math.min(7, Math.floor(u));
  const t = u - i;
  return table[i]! + t * (table[i + 1]! - table[i]!);
}

export function c1EndMoments(psi: number): number {
  return interpPsi(C1_END, psi);
}
export function c3EndMoments(psi: number): number {
  return interpPsi(C3_END, psi);
}

/** EN 1993-1-1 Table 6.6 correction factor kc for a linear diagram: 1/(1.33 − 0.33ψ). */
export function kcEndMoments(psi: number): number {
  return 1 / (1.33 - 0.33 * Math.max(-1, Math.min(1, psi)));
}

export type MomentShape = 'end-moments' | 'udl-simply-supported' | 'point-load-simply-supported' | 'transverse-with-end-moments';

export interface MomentFactors {
  shape: MomentShape;
  psi: number;
  C1: number;
  C2: number;
  C3: number;
  kc: number;
}

/**
 * Moment factors for a segment from its moment diagram (stations, N·mm):
 * - linear diagram (no point further than 1 % of max|M| from the chord): end moments, ψ = Mend,small/Mend,large,
 *   C1 SN003 table, C2 = 0, C3 ENV Table F.1.1, kc Table 6.6.
 * - end moments ≤ 5 % of max|M| and the diagram within 3 % of max|M| of a parabola: uniform load
 *   C1 = 1.127, C2 = 0.454 (SN003, as used by the SBE example), C3 = 0.525 (ENV Table F.1.2, from
 *   memory), kc = 0.94 (Table 6.6, from memory); of a central triangle: central point load
 *   C1 = 1.348, C2 = 0.630, C3 = 1.730 (SN003 / ENV, from memory), kc = 0.86 (from memory).
 * - any other diagram (transverse load with end moments, several point loads, …): C1 = 1.0
 *   (conservative: uniform moment), C2 = 0.630 (the larger simply-supported C2), C3 = 1.0, kc = 1.0
 *   — a conservative choice, common practice, no source.
 */
export function momentFactors(pts: readonly { x: number; M: number }[]): MomentFactors {
  return momentFactorsOf(
    pts.map((p) => p.x),
    pts.map((p) => p.M),
    pts.length,
  );
}

const UDL_FACTORS: MomentFactors = Object.freeze({ shape: 'udl-simply-supported', psi: 0, C1: 1.127, C2: 0.454, C3: 0.525, kc: 0.94 });
const POINT_FACTORS: MomentFactors = Object.freeze({ shape: 'point-load-simply-supported', psi: 0, C1: 1.348, C2: 0.63, C3: 1.73, kc: 0.86 });
const OTHER_FACTORS: MomentFactors = Object.freeze({ shape: 'transverse-with-end-moments', psi: 0, C1: 1.0, C2: 0.63, C3: 1.0, kc: 1.0 });
const ZERO_FACTORS: MomentFactors = Object.freeze({ shape: 'end-moments', psi: 1, C1: 1, C2: 0, C3: 1, kc: 1 });
const udlShape = (xi: number): number => 4 * xi * (1 - xi);
const pointShape = (xi: number): number => 1 - Math.abs(2 * xi - 1);

/** momentFactors of the first n points (xs ascending, moments Ms), without point objects. */
function momentFactorsOf(xs: ArrayLike<number>, Ms: ArrayLike<number>, n: number): MomentFactors {
  const M0 = Ms[0]!;
  const M1 = Ms[n - 1]!;
  const x0 = xs[0]!;
  const x1 = xs[n - 1]!;
  let Mmax = -Infinity;
  for (let i = 0; i < n; i++) Mmax = Math.max(Mmax, Math.abs(Ms[i]!));
  if (Mmax === 0) return ZERO_FACTORS;
  let dev = 0;
  for (let i = 0; i < n; i++) {
    const lin = x1 > x0 ? M0 + ((M1 - M0) * (xs[i]! - x0)) / (x1 - x0) : M0;
    dev = Math.max(dev, Math.abs(Ms[i]! - lin));
  }
  if (dev <= 0.01 * Mmax) {
    const big = Math.abs(M0) >= Math.abs(M1) ? M0 : M1;
    const small = big === M0 ? M1 : M0;
    const psi = big === 0 ? 1 : small / big;
    return { shape: 'end-moments', psi, C1: c1EndMoments(psi), C2: 0, C3: c3EndMoments(psi), kc: kcEndMoments(psi) };
  }
  if (Math.abs(M0) <= 0.05 * Mmax && Math.abs(M1) <= 0.05 * Mmax && x1 > x0) {
    // the tabulated shapes only when the diagram is that shape (within 3 % of Mmax at every station)
    const fits = (shape: (xi: number) => number): boolean => {
      for (let i = 0; i < n; i++) if (!(Math.abs(Math.abs(Ms[i]!) / Mmax - shape((xs[i]! - x0) / (x1 - x0))) <= 0.03)) return false;
      return true;
    };
    if (fits(udlShape)) return UDL_FACTORS;
    if (fits(pointShape)) return POINT_FACTORS;
  }
  return OTHER_FACTORS;
}

/**
 * Wagner (mono-symmetry) parameter zj = zs − ∫(y² + z²) z dA / (2 Iy) of a plate stack (exact for
 * rectangles), z from the centroid, positive towards the compression flange (ENV 1993-1-1 F.1.4
 * definition). Positive when the larger flange is in compression.
 */
export function wagnerZj(ctx: { s: CheckContext['s']; g: Pick<CheckContext['g'], 'zElastic' | 'h' | 'Iy' | 'zShear'> }, side: FlangeSide): number {
  const { s, g } = ctx;
  const sgn = side === 'top' ? 1 : -1;
  const zc = g.zElastic;
  const plates = [
    { z0: 0, z1: s.bot.t, b: s.bot.b },
    { z0: s.bot.t, z1: s.bot.t + s.hw, b: s.tw },
    { z0: s.bot.t + s.hw, z1: g.h, b: s.top.b },
  ];
  let integral = 0;
  for (const p of plates) {
    const a = sgn * (p.z0 - zc);
    const b = sgn * (p.z1 - zc);
    const lo = Math.min(a, b);
    const hi = Math.max(a, b);
    const t = hi - lo;
    const zm = (lo + hi) / 2;
    integral += ((p.b * p.b * p.b) / 12) * t * zm + (p.b * (hi * hi * hi * hi - lo * lo * lo * lo)) / 4;
  }
  const zs = sgn * (g.zShear - zc);
  return zs - integral / (2 * g.Iy);
}

/** Load height above the shear centre (mm), positive destabilising, for downward (gravity) loads. */
export function loadHeightZg(ctx: { o: Pick<CheckContext['o'], 'loadHeight'>; g: Pick<CheckContext['g'], 'h' | 'zShear'> }): number {
  return zgOf(ctx.o.loadHeight, ctx.g.h, ctx.g.zShear);
}

/** loadHeightZg on plain numbers: zg (mm) of the load height for a section of depth h with its shear centre at zShear above the underside. */
export function zgOf(loadHeight: CheckContext['o']['loadHeight'], h: number, zShear: number): number {
  if (loadHeight === 'top-flange') return h - zShear;
  if (loadHeight === 'bottom-flange') return -zShear;
  return 0;
}

/** EN 1993-1-1 Table 6.4 (general case) and Table 6.5 (rolled or equivalent welded), welded I: h/b ≤ 2 → c, > 2 → d. */
export function ltbCurveWelded(h: number, b: number): BucklingCurve {
  return h / b <= 2 ? 'c' : 'd';
}

/** Signed envelopes: per x the largest sagging (≥ 0) or the largest hogging (≤ 0) moment of any combination. */
export const pickSag = (st: Station): number => Math.max(0, st.MEd);
export const pickHog = (st: Station): number => Math.min(0, st.MEd);

/**
 * The signed moment envelopes lateral-torsional buckling reads: per distinct x (ascending) the
 * largest sagging moment (≥ 0) and the largest hogging moment (≤ 0) of any station there, N·mm.
 * From stations it is envelopeOf(·, pickSag / pickHog); a load model may build it directly.
 */
export interface MomentEnvelope {
  xs: Float64Array;
  sag: Float64Array;
  hog: Float64Array;
}

export function momentEnvelopeOf(stations: readonly Station[]): MomentEnvelope {
  const s = envelopeOf(stations, pickSag);
  const h = envelopeOf(stations, pickHog);
  return { xs: s.xs, sag: s.gov, hog: h.gov };
}

/** The envelope value at x, linear between the neighbouring distinct x (as envelopeAt). */
function valueAt(xs: Float64Array, v: Float64Array, x: number): number {
  const [lo, hi, t] = bracket(xs, x);
  return t === 0 ? v[lo]! : v[lo]! + t * (v[hi]! - v[lo]!);
}

/** Scratch arrays of the segment points (grown as needed; the LTB computation is not re-entrant). */
let PX = new Float64Array(64);
let PM = new Float64Array(64);
/** the points' x from the segment's start */
let RX = new Float64Array(64);
const FORK = Object.freeze({ k: 1, kw: 1 });

/**
 * Points of a segment closer together than this fraction of its length are one point (a station
 * at 1e-300 mm from a support made the Mcr diagram's slope ΔM/Δx overflow to Infinity, and Mcr
 * and the utilisation not numbers). Far below any drawing's resolution (1e-9 of the segment), and
 * ΔM/Δx then stays finite for any moment within the input limits.
 */
const SAME_POINT = 1e-9;

/** the larger in magnitude of two moments of one sign; a moment that is not a number wins */
const fuller = (a: number, b: number): number => (Number.isNaN(a) || Math.abs(a) >= Math.abs(b) ? a : b);

/**
 * The points of a segment into PX, PM: its ends (interpolated) and every station strictly inside,
 * in x order. Returns their number. A station closer than SAME_POINT·(x1 − x0) to the point before
 * it (or to the segment's end) is merged into it, keeping the larger |M| (a fuller diagram: lower
 * Mcr and the same largest MEd, so never less safe).
 */
function segmentPoints(env: MomentEnvelope, v: Float64Array, x0: number, x1: number): number {
  const xs = env.xs;
  if (PX.length < xs.length + 2) {
    PX = new Float64Array(xs.length + 2);
    PM = new Float64Array(xs.length + 2);
  }
  const tol = SAME_POINT * (x1 - x0);
  let n = 0;
  PX[n] = x0;
  PM[n++] = valueAt(xs, v, x0);
  // xs ascending: from the first station beyond x0, stop at x1
  for (let i = firstAbove(xs, x0); i < xs.length && xs[i]! < x1; i++) {
    if (xs[i]! - PX[n - 1]! <= tol) {
      PM[n - 1] = fuller(PM[n - 1]!, v[i]!);
      continue;
    }
    PX[n] = xs[i]!;
    PM[n++] = v[i]!;
  }
  if (x1 !== x0) {
    const end = valueAt(xs, v, x1);
    if (n > 1 && x1 - PX[n - 1]! <= tol) {
      // the last inner station becomes the end itself (the Mcr series needs the end at x1)
      PX[n - 1] = x1;
      PM[n - 1] = fuller(end, PM[n - 1]!);
    } else {
      PX[n] = x1;
      PM[n++] = end;
    }
  }
  return n;
}

/**
 * 'lateral-torsional-buckling', EN 1993-1-1 6.3.2, for each sign of moment separately: sagging puts
 * the top flange in compression, hogging the bottom flange, and each flange has its own lateral
 * restraint (options.restraint for the top flange, options.restraintBottom for the bottom one; a
 * continuously restrained compression flange needs no check for that sign). The girder is split
 * at that flange's restraints and at the supports (lateral and torsional restraints, fork
 * conditions, k = kw = 1). In each segment the signed envelope of that sign (the most extreme
 * moment of that sign of any combination at each station — fuller than any one diagram, so its
 * C1 is lower: conservative) gives C1, C2, C3; Wy fy = Mpl (Class 1–2), Mel (3), Meff (4) at each
 * plate's own fy; χLT by 6.3.2.2 (λ̄LT,0 = 0.2) or 6.3.2.3 (λ̄LT,0 = 0.4, β = 0.75, recommended
 * values), Mb,Rd = χLT Wy fy / γM1. No reduction when λ̄LT ≤ λ̄LT,0 or MEd/Mcr ≤ λ̄LT,0² (6.3.2.2(4)).
 * The imperfection curve uses h over the narrower flange width (conservative for mono-symmetric I).
 * Load height: gravity loads, top-flange loading destabilising whatever the sign (conservative).
 */
export function ltbCheck(ctx: CheckContext, e: Effects, per: ReadonlyMap<FlangeSide, SignBending>, bendingFor: (side: FlangeSide) => SignBending): CheckResult {
  const clause = 'EN 1993-1-1 6.3.2';
  if (e.stations.length === 0) return notApplicable('lateral-torsional-buckling', clause, 'no design moments given');
  const skipped: string[] = [];
  const best = ltbCore(ctx, momentEnvelopeOf(e.stations), (side) => per.get(side) ?? bendingFor(side), true, skipped);
  if (!best) {
    return notApplicable('lateral-torsional-buckling', clause, skipped.length ? `compression flange restrained continuously (${skipped.join('; ')})` : 'no design moments given');
  }
  return verdict('lateral-torsional-buckling', clause, best.u, best.at, best.values!);
}

/**
 * A lower bound on the utilisation 'lateral-torsional-buckling' gives a section under a moment
 * envelope — the computation of ltbCheck, without the report values (0 when the check does not
 * apply), with Mcr from the first Ritz basis alone (MCR_FIRST_TERMS terms; the check converges it
 * from there, and a nested basis with fewer terms never gives a lower Mcr): a search that builds
 * the envelope straight from its load model rejects candidates with it before any other check is
 * run. With `exact` (and always with the modification factor f, which is not monotone in Mcr) the
 * check's own converged Mcr: then equal to ltbCheck's utilisation whenever the envelope equals
 * momentEnvelopeOf(stations).
 * With `stopAbove`, it returns as soon as one segment's utilisation exceeds it (a value above it,
 * not necessarily the largest): enough to know the check fails.
 */
export function ltbUtilisation(ctx: CheckContext, env: MomentEnvelope, bendingFor: (side: FlangeSide) => SignBending, stopAbove = Infinity, exact = false): number {
  if (env.xs.length === 0) return 0;
  return ltbCore(ctx, env, bendingFor, false, null, stopAbove, exact)?.u ?? 0;
}

function ltbCore(
  ctx: CheckContext,
  env: MomentEnvelope,
  bendingFor: (side: FlangeSide) => SignBending,
  detail: boolean,
  skipped: string[] | null,
  stopAbove = Infinity,
  exact = detail,
): { u: number; at: number; values: Record<string, CheckValue> | null } | null {
  // the utilisation only: segments may be taken in any order (see below)
  const reorder = !detail;
  const { o, g, s } = ctx;
  const rolled = o.ltbMethod === 'rolled-equivalent';
  const lambda0 = rolled ? 0.4 : 0.2;
  const curve = ltbCurveWelded(g.h, Math.min(s.top.b, s.bot.b));
  const zg = loadHeightZg(ctx);
  const ends = o.ltbEnds ?? FORK;
  /** χLT at λ̄LT without the modification f (1 where the reduction is ignored): the screen's */
  const chiOf = (lambdaLT: number, MEdOverMcr: number): number => {
    if (lambdaLT <= lambda0 || MEdOverMcr <= lambda0 * lambda0) return 1;
    return rolled ? chiLT({ lambdaLT, alphaLT: ALPHA[curve], lambdaLT0: 0.4, beta: 0.75 }).chiLT : chiLTGeneral(lambdaLT, curve).chiLT;
  };
  // the largest |MEd| of any station: the largest sagging or hogging value of the envelope
  let tiny = 0;
  let maxSag = 0;
  let minHog = 0;
  for (let i = 0; i < env.xs.length; i++) {
    if (env.sag[i]! > maxSag) maxSag = env.sag[i]!;
    if (env.hog[i]! < minHog) minHog = env.hog[i]!;
  }
  tiny = negligibleMoment(Math.max(maxSag, -minHog));
  let best: { u: number; at: number; values: Record<string, CheckValue> | null } | null = null;
  const todo: { side: FlangeSide; x0: number; x1: number; MEd: number }[] = [];
  for (const side of ['top', 'bot'] as const) {
    const line = side === 'top' ? o.restraint : o.restraintBottom;
    const sign = side === 'top' ? 'sagging' : 'hogging';
    const has = side === 'top' ? maxSag > tiny : minHog < -tiny;
    if (!has) continue;
    if (line.kind === 'continuous') {
      skipped?.push(`${sign}: the ${side === 'top' ? 'top' : 'bottom'} flange is restrained continuously`);
      continue;
    }
    const cuts = cutsOf(o, side);
    for (let i = 0; i + 1 < cuts.length; i++) todo.push({ side, x0: cuts[i]!, x1: cuts[i + 1]!, MEd: 0 });
  }
  if (reorder) {
    // the utilisation only: the most loaded segments first, so that a failure is found soonest
    // (the largest of the segments' utilisations does not depend on the order)
    for (const t of todo) {
      const n = segmentPoints(env, t.side === 'top' ? env.sag : env.hog, t.x0, t.x1);
      for (let k = 0; k < n; k++) t.MEd = Math.max(t.MEd, Math.abs(PM[k]!));
    }
    todo.sort((a, b) => b.MEd - a.MEd);
  }
  for (const t of todo) {
    const { side, x0, x1 } = t;
    const sign = side === 'top' ? 'sagging' : 'hogging';
    const v = side === 'top' ? env.sag : env.hog;
    const n = segmentPoints(env, v, x0, x1);
    // the largest |M| of the segment; a moment that is not a number governs (and fails the check)
    let gov = 0;
    for (let k = 1; k < n; k++) if (Number.isNaN(PM[k]!) || Math.abs(PM[k]!) > Math.abs(PM[gov]!)) gov = k;
    const MEd = Math.abs(PM[gov]!);
    const govX = PX[gov]!;
    if (MEd <= tiny) continue;
    const b = bendingFor(side);
    const zj = zjCached(ctx, side);
    const L = x1 - x0;
    if (RX.length < n) RX = new Float64Array(PX.length);
    for (let k = 0; k < n; k++) RX[k] = PX[k]! - x0;
    const seg: RitzSegment = { E: o.E, G: o.G, L, xs: RX, Ms: PM, n, pieces: [{ x0: 0, x1: L, Iz: g.Iz, It: g.It, Iw: g.Iw, zj, zg }], k: ends.k, kw: ends.kw };
    // the verdict: Mcr converged in the number of terms; the screen (utilisation only, no f):
    // the first basis alone, whose Mcr is at least the converged one (nested bases)
    const Mk0 = b.McRd * o.factors.gammaM0;
    let ritz: { Mcr: number; terms: number; change: number; converged: boolean };
    if (exact || o.ltbModification) ritz = mcrConverged(seg);
    else {
      // the screen: one sine term first (closed form, never a lower Mcr than more terms); where
      // that alone shows the segment failing, or well within its resistance, no more terms
      const M1 = mcrOneTerm(seg);
      const u1 = MEd / ((chiOf(Math.sqrt(Mk0 / M1), MEd / M1) * Mk0) / o.factors.gammaM1);
      ritz =
        u1 > stopAbove || u1 < SCREEN_ONE_TERM_BELOW
          ? { Mcr: M1, terms: 1, change: Number.NaN, converged: false }
          : { ...mcrRitz(seg, MCR_FIRST_TERMS), change: Number.NaN, converged: false };
    }
    const Mcr = ritz.Mcr;
    const McrUniform = mcrUniform(o.E, o.G, g.Iz, g.It, g.Iw, L, zj, ends.k, ends.kw);
    // 6.3.2.3(2): kc = 1/√C1 with C1 = Mcr/Mcr,uniform (common practice, no source), at most 1
    const C1 = Mcr / McrUniform;
    const kc = Math.min(1, 1 / Math.sqrt(C1));
    const Mk = b.McRd * o.factors.gammaM0;
    const lambdaLT = Math.sqrt(Mk / Mcr);
    let chiV = 1;
    let phiLT = Number.NaN;
    let f = 1;
    const ignore = lambdaLT <= lambda0 || MEd / Mcr <= lambda0 * lambda0;
    if (!ignore) {
      if (rolled) {
        const r = chiLT({ lambdaLT, alphaLT: ALPHA[curve], lambdaLT0: 0.4, beta: 0.75, ...(o.ltbModification ? { kc } : {}) });
        chiV = r.chiLT;
        phiLT = r.phiLT;
        f = r.f;
      } else {
        const r = chiLTGeneral(lambdaLT, curve);
        chiV = r.chiLT;
        phiLT = r.phiLT;
      }
    }
    const MbRd = (chiV * Mk) / o.factors.gammaM1;
    const u = MEd / MbRd;
    // a utilisation that is not a number fails, wherever its segment comes (and nothing can undo it)
    if (!best || u > best.u || Number.isNaN(u)) {
      const mf = detail ? momentFactorsOf(PX, PM, n) : null;
      best = {
        u,
        at: govX,
        values: !mf
          ? null
          : {
              x0,
              x1,
              Lseg: x1 - x0,
              zg,
              zj,
              k: ends.k,
              kw: ends.kw,
              Mcr,
              McrMethod: 'Rayleigh-Ritz, sine series for lateral displacement and twist, actual moment diagram and load height',
              McrTerms: ritz.terms,
              McrChange: ritz.change,
              McrConverged: ritz.converged,
              McrUniform,
              C1,
              kc: o.ltbModification ? kc : 1,
              momentShape: mf.shape,
              McrThreeFactor: mcr({ E: o.E, G: o.G, Iz: g.Iz, It: g.It, Iw: g.Iw, L, C1: mf.C1, C2: mf.C2, C3: mf.C3, zg, zj, k: ends.k, kw: ends.kw }),
              C1Table: mf.C1,
              C2Table: mf.C2,
              C3Table: mf.C3,
              lambdaLT,
              lambdaLT0: lambda0,
              curve,
              phiLT,
              f,
              chiLT: chiV,
              MbRd,
              MEd,
              sign,
              method: rolled ? '6.3.2.3 rolled or equivalent welded' : '6.3.2.2 general case',
              reductionIgnored: ignore,
            },
      };
    }
    if (Number.isNaN(u) || best.u > stopAbove) return best;
  }
  return best;
}

/** The cuts of one flange's lateral restraints and the supports, ascending (once per options object). */
const CUTS = new WeakMap<CheckContext['o'], { top?: number[]; bot?: number[] }>();
function cutsOf(o: CheckContext['o'], side: FlangeSide): number[] {
  let c = CUTS.get(o);
  if (!c) CUTS.set(o, (c = {}));
  let hit = c[side];
  if (!hit) {
    const line = side === 'top' ? o.restraint : o.restraintBottom;
    const sup = o.supports;
    const xStart = sup[0]!;
    const xEnd = sup[sup.length - 1]!;
    hit = [...new Set([...sup, ...(line.kind === 'continuous' ? [] : line.at.filter((x) => x > xStart && x < xEnd))])].sort((a, b) => a - b);
    c[side] = hit;
  }
  return hit;
}

/** zj depends on the section and the compression side only. */
const zjCached = perSide((ctx, side) => wagnerZj(ctx, side));
