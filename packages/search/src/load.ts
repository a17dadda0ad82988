import type { Effects, MomentEnvelope } from '@platesmith/checks';
import { momentEnvelopeOf, negligibleMoment, SAME_POSITION_MM, spanAt } from '@platesmith/checks';
import { designEffects, type Analysis } from '@platesmith/actions';

/**
 * What the search needs of the actions: design effects for a candidate's own self-weight g
 * (N/mm, characteristic permanent UDL), and rigorous lower bounds on the demand over a range of
 * self-weights so that bounds can prune before a candidate's own effects are computed.
 */
export interface LoadModel {
  effects(g: number): Effects;
  /**
   * For every g in [gLo, gHi]: max sagging MEd ≥ Msag, max hogging −MEd ≥ Mhog, max |VEd| ≥ V
   * (N·mm, N). sagAlways/hogAlways: some station has MEd > 0 (< 0) for every g in the range.
   */
  demandLowerBound(gLo: number, gHi: number): DemandBound;
  /** lower bounds of the SLS deflection terms for g in [gLo, gHi] (empty when there is no SLS demand) */
  deflectionFloor(gLo: number, gHi: number): DeflectionFloor[];
  /** the downward SLS deflection terms as bend = bA + g·bB, shear = sA + g·sB per point, with limits (mm) */
  deflectionAffine?: DeflectionAffine;
  /**
   * For each x: a lower bound, for every g in [gLo, gHi], on the largest sagging MEd among the
   * stations at exactly that x (0 when none is guaranteed, or no station stands there).
   */
  sagFloorAt?(xs: readonly number[], gLo: number, gHi: number): number[];
  /**
   * The signed moment envelopes of effects(g) (momentEnvelopeOf(effects(g).stations), bit for bit),
   * built without the station objects: what lateral-torsional buckling reads.
   */
  momentEnvelope?(g: number): MomentEnvelope;
  /**
   * Bounds of the LTB moment envelopes for every self-weight g in [gLo, gHi]: per distinct x of
   * momentEnvelope, the sagging moment lies in [sagLo, sagHi] and the hogging magnitude in
   * [hogLo, hogHi] (N·mm, all ≥ 0).
   */
  momentEnvelopeRange?(gLo: number, gHi: number): MomentRange;
  /** for every g in [gLo, gHi], max |R| over the support reactions of effects(g) is at least this */
  reactionFloor?(gLo: number, gHi: number): number;
  /** effects(g) is the same for every g (the user's own effects: no self-weight added) */
  selfWeightFree?: boolean;
}

export interface MomentRange {
  xs: Float64Array;
  sagLo: Float64Array;
  sagHi: Float64Array;
  hogLo: Float64Array;
  hogHi: Float64Array;
}

export interface DeflectionAffine {
  bA: Float64Array;
  bB: Float64Array;
  sA: Float64Array;
  sB: Float64Array;
  limit: Float64Array;
}

export function analysisDeflectionAffine(a: Analysis): DeflectionAffine {
  const n = a.sls.reduce((k, d) => k + d.x.length, 0);
  const out = { bA: new Float64Array(n), bB: new Float64Array(n), sA: new Float64Array(n), sB: new Float64Array(n), limit: new Float64Array(n) };
  let k = 0;
  for (const d of a.sls) {
    for (let i = 0; i < d.x.length; i++, k++) {
      const o = i * 4;
      out.bA[k] = d.down[o]!;
      out.sA[k] = d.down[o + 1]!;
      out.bB[k] = d.down[o + 2]!;
      out.sB[k] = d.down[o + 3]!;
      out.limit[k] = spanAt(a.supports, d.x[i]!).L / d.ratio;
    }
  }
  return out;
}

export interface DemandBound {
  Msag: number;
  Mhog: number;
  V: number;
  sagAlways: boolean;
  hogAlways: boolean;
}

/** Effects that do not depend on the candidate (an envelope from the user's own analysis). */
export function fixedLoadModel(e: Effects): LoadModel {
  let Msag = 0;
  let Mhog = 0;
  let V = 0;
  for (const s of e.stations) {
    Msag = Math.max(Msag, s.MEd);
    Mhog = Math.max(Mhog, -s.MEd);
    V = Math.max(V, Math.abs(s.VEd));
  }
  const bound = signed(Msag, Mhog, V, Msag > 0, Mhog > 0, Math.max(Msag, Mhog));
  const env = momentEnvelopeOf(e.stations);
  return { effects: () => e, demandLowerBound: () => bound, deflectionFloor: () => [], momentEnvelope: () => env, selfWeightFree: true };
}

/**
 * A load model linear in g per combination: at station i of combination c,
 * MEd = M[c][i] + g·Mg[c][i], VEd = V[c][i] + g·Vg[c][i]. The lower bounds use the fact that an
 * affine function's extremes over an interval are at its ends.
 */
export interface AffineDemand {
  M: Float64Array[];
  Mg: Float64Array[];
  V: Float64Array[];
  Vg: Float64Array[];
}

/** Accumulates the demand lower bounds over affine entries M0 + g·Mg, V0 + g·Vg, g in [gLo, gHi]. */
class DemandFloor {
  Msag = 0;
  Mhog = 0;
  V = 0;
  sag = false;
  hog = false;
  mAbs = 0;
  constructor(
    private readonly gLo: number,
    private readonly gHi: number,
  ) {}
  /** an affine function's extremes over an interval are at its ends */
  add(M0: number, Mg: number, V0: number, Vg: number): void {
    const m0 = M0 + this.gLo * Mg;
    const m1 = M0 + this.gHi * Mg;
    const mMin = Math.min(m0, m1);
    const mMax = Math.max(m0, m1);
    this.mAbs = Math.max(this.mAbs, Math.abs(m0), Math.abs(m1));
    if (mMin > 0) {
      this.sag = true;
      this.Msag = Math.max(this.Msag, mMin);
    }
    if (mMax < 0) {
      this.hog = true;
      this.Mhog = Math.max(this.Mhog, -mMax);
    }
    const v0 = V0 + this.gLo * Vg;
    const v1 = V0 + this.gHi * Vg;
    // |affine| over an interval: zero if it changes sign, else the smaller end
    this.V = Math.max(this.V, v0 * v1 <= 0 ? 0 : Math.min(Math.abs(v0), Math.abs(v1)));
  }
  bound(): DemandBound {
    return signed(this.Msag, this.Mhog, this.V, this.sag, this.hog, this.mAbs);
  }
}

export function affineDemandBound(d: AffineDemand, gLo: number, gHi: number): DemandBound {
  const f = new DemandFloor(gLo, gHi);
  for (let c = 0; c < d.M.length; c++) {
    const M = d.M[c]!;
    const Mg = d.Mg[c]!;
    const V = d.V[c]!;
    const Vg = d.Vg[c]!;
    for (let i = 0; i < M.length; i++) f.add(M[i]!, Mg[i]!, V[i]!, Vg[i]!);
  }
  return f.bound();
}

/** Lower bounds straight from an analysis' stored A + g·B form (no per-call allocation of effects). */
export function analysisDemandBound(a: Analysis, gLo: number, gHi: number): DemandBound {
  const nK = a.stationX.length;
  const f = new DemandFloor(gLo, gHi);
  for (let c = 0; c < a.combinations.length; c++) {
    const gG = a.gammaG[c]!;
    for (let k = 0; k < nK; k++) {
      for (let t = 0; t < 4; t++) {
        const base = (c * nK + k) * 8 + 2 * t;
        f.add(a.A[base]!, gG * a.Mg[k]!, a.A[base + 1]!, gG * a.Vg[k]!);
      }
    }
  }
  return f.bound();
}

/** The load model of a beam or envelope analysis from @platesmith/actions. */
export function analysisLoadModel(a: Analysis): LoadModel {
  return {
    effects: (g) => designEffects(a, g),
    demandLowerBound: (gLo, gHi) => analysisDemandBound(a, gLo, gHi),
    deflectionFloor: (gLo, gHi) => analysisDeflectionFloor(a, gLo, gHi),
    deflectionAffine: analysisDeflectionAffine(a),
    sagFloorAt: (xs, gLo, gHi) => xs.map((x) => analysisSagFloorAt(a, x, gLo, gHi)),
    momentEnvelope: momentEnvelopeFor(a),
    reactionFloor: (gLo, gHi) => analysisReactionFloor(a, gLo, gHi),
    ...rangeOf(a),
  };
}

/**
 * A lower bound, for every g in [gLo, gHi], on max |R| over the supports of
 * designEffects(a, g).reactions (designReaction). Per support R(g) is the largest of terms
 * RA + γ·(g·Rg), each affine in g, so R(g) is at least each term's smaller end value; and −R(g) is
 * the least of the negated terms, whose least over the range is at an end. |R| is at least both
 * (rounding is monotone, so the computed terms obey the same order).
 */
export function analysisReactionFloor(a: Analysis, gLo: number, gHi: number): number {
  const nR = a.reactionX.length;
  const nC = a.gammaG.length;
  let out = 0;
  for (let r = 0; r < nR; r++) {
    const lo = gLo * a.Rg[r]!;
    const hi = gHi * a.Rg[r]!;
    let up = -Infinity;
    let R0 = -Infinity;
    let R1 = -Infinity;
    for (let c = 0; c < nC; c++) {
      const v0 = a.RA[c * nR + r]! + a.gammaG[c]! * lo;
      const v1 = a.RA[c * nR + r]! + a.gammaG[c]! * hi;
      up = Math.max(up, Math.min(v0, v1));
      R0 = Math.max(R0, v0);
      R1 = Math.max(R1, v1);
    }
    out = Math.max(out, up, -Math.max(R0, R1));
  }
  return out;
}

/**
 * analysisMomentEnvelope(a, ·) with the combinations folded per factor on g: for one γG the
 * largest M of any combination at a station is the one with the largest A (rounding is monotone),
 * so per station and distinct γG one A is kept for sagging and one for hogging, and the moment
 * designEffects keeps beside the largest |V| is dropped when it lies between the station's least
 * and largest M in its own combination (then it can never be the extreme). Same values, bit for
 * bit; falls back to analysisMomentEnvelope when the analysis does not have that form.
 */
export function momentEnvelopeFor(a: Analysis): (g: number) => MomentEnvelope {
  return foldedEnvelope(a)?.at ?? ((g) => analysisMomentEnvelope(a, g));
}

function rangeOf(a: Analysis): { momentEnvelopeRange?: (gLo: number, gHi: number) => MomentRange } {
  const f = foldedEnvelope(a);
  return f ? { momentEnvelopeRange: f.range } : {};
}

/**
 * The folded form behind momentEnvelopeFor, and the envelope bounds over a range of g: each folded
 * term hiA + γ·g·Mg is affine in g, so over [gLo, gHi] it lies between its values at the ends; the
 * envelope (the largest term, or 0) lies between the largest lower end and the largest upper end.
 */
function foldedEnvelope(a: Analysis): { at: (g: number) => MomentEnvelope; range: (gLo: number, gHi: number) => MomentRange } | null {
  const nK = a.stationX.length;
  const nC = a.gammaG.length;
  const X = a.stationX;
  const A = a.A;
  let ok = nC > 0;
  for (let k = 1; k < nK && ok; k++) if (X[k]! < X[k - 1]!) ok = false;
  for (let c = 0; c < nC && ok; c++) {
    for (let k = 0; k < nK; k++) {
      const b = (c * nK + k) * 8;
      const hi = A[b]!;
      const lo = A[b + 2]!;
      if (!(A[b + 4]! <= hi && A[b + 4]! >= lo && A[b + 6]! <= hi && A[b + 6]! >= lo)) {
        ok = false;
        break;
      }
    }
  }
  if (!ok) return null;
  const gammas = [...new Set(a.gammaG)];
  const nG = gammas.length;
  const G = Float64Array.from(gammas);
  const hiA = new Float64Array(nK * nG).fill(-Infinity);
  const loA = new Float64Array(nK * nG).fill(Infinity);
  for (let c = 0; c < nC; c++) {
    const j = gammas.indexOf(a.gammaG[c]!);
    for (let k = 0; k < nK; k++) {
      const b = (c * nK + k) * 8;
      hiA[k * nG + j] = Math.max(hiA[k * nG + j]!, A[b]!);
      loA[k * nG + j] = Math.min(loA[k * nG + j]!, A[b + 2]!);
    }
  }
  // distinct x, and the distinct-x index of each station
  const slot = new Int32Array(nK);
  const xsAll: number[] = [];
  for (let k = 0; k < nK; k++) {
    if (xsAll.length === 0 || xsAll[xsAll.length - 1] !== X[k]) xsAll.push(X[k]!);
    slot[k] = xsAll.length - 1;
  }
  const xs = Float64Array.from(xsAll);
  const nX = xs.length;
  const Mg = a.Mg;
  const range = (gLo: number, gHi: number): MomentRange => {
    const sagLo = new Float64Array(nX);
    const sagHi = new Float64Array(nX);
    const hogLo = new Float64Array(nX);
    const hogHi = new Float64Array(nX);
    for (let k = 0; k < nK; k++) {
      let s0 = 0;
      let s1 = 0;
      let h0 = 0;
      let h1 = 0;
      for (let j = 0; j < nG; j++) {
        const gg = G[j]!;
        const pa = hiA[k * nG + j]! + gg * (gLo * Mg[k]!);
        const pb = hiA[k * nG + j]! + gg * (gHi * Mg[k]!);
        s0 = Math.max(s0, Math.min(pa, pb));
        s1 = Math.max(s1, pa, pb);
        const qa = loA[k * nG + j]! + gg * (gLo * Mg[k]!);
        const qb = loA[k * nG + j]! + gg * (gHi * Mg[k]!);
        h0 = Math.max(h0, -Math.max(qa, qb));
        h1 = Math.max(h1, -qa, -qb);
      }
      const n = slot[k]!;
      sagLo[n] = Math.max(sagLo[n]!, s0);
      sagHi[n] = Math.max(sagHi[n]!, s1);
      hogLo[n] = Math.max(hogLo[n]!, h0);
      hogHi[n] = Math.max(hogHi[n]!, h1);
    }
    return { xs, sagLo, sagHi, hogLo, hogHi };
  };
  const at = (g: number): MomentEnvelope => {
    const sag = new Float64Array(nX);
    const hog = new Float64Array(nX);
    for (let k = 0; k < nK; k++) {
      const mg = g * Mg[k]!;
      let M0 = -Infinity;
      let M1 = Infinity;
      for (let j = 0; j < nG; j++) {
        const gg = G[j]!;
        const m0 = hiA[k * nG + j]! + gg * mg;
        if (m0 > M0) M0 = m0;
        const m1 = loA[k * nG + j]! + gg * mg;
        if (m1 < M1) M1 = m1;
      }
      const n = slot[k]!;
      if (M0 > sag[n]!) sag[n] = M0;
      if (M1 < hog[n]!) hog[n] = M1;
    }
    return { xs, sag, hog };
  };
  return { at, range };
}

/**
 * momentEnvelopeOf(designEffects(a, g).stations) without building the stations: per station the
 * same three moments designEffects keeps (largest, least, and the one beside the largest |V|),
 * computed with the same floating-point operations, then per distinct x the largest sagging and
 * hogging value (envelopeOf's order: stations ascending in x, equal x merged).
 */
export function analysisMomentEnvelope(a: Analysis, g: number): MomentEnvelope {
  const nK = a.stationX.length;
  const X = a.stationX;
  for (let k = 1; k < nK; k++) if (X[k]! < X[k - 1]!) return momentEnvelopeOf(designEffects(a, g).stations);
  const nC = a.gammaG.length;
  const A = a.A;
  const xs = new Float64Array(nK);
  const sag = new Float64Array(nK);
  const hog = new Float64Array(nK);
  let n = -1;
  for (let k = 0; k < nK; k++) {
    const mg = g * a.Mg[k]!;
    const vg = g * a.Vg[k]!;
    let M0 = -Infinity;
    let M1 = Infinity;
    let M2 = 0;
    let aV2 = -1;
    for (let c = 0; c < nC; c++) {
      const gg = a.gammaG[c]!;
      const b = (c * nK + k) * 8;
      const m0 = A[b]! + gg * mg;
      if (m0 > M0) M0 = m0;
      const m1 = A[b + 2]! + gg * mg;
      if (m1 < M1) M1 = m1;
      const v2 = A[b + 5]! + gg * vg;
      if (Math.abs(v2) > aV2) {
        aV2 = Math.abs(v2);
        M2 = A[b + 4]! + gg * mg;
      }
      const v3 = A[b + 7]! + gg * vg;
      if (Math.abs(v3) > aV2) {
        aV2 = Math.abs(v3);
        M2 = A[b + 6]! + gg * mg;
      }
    }
    const x = X[k]!;
    if (n < 0 || xs[n] !== x) {
      n++;
      xs[n] = x;
      sag[n] = 0;
      hog[n] = 0;
    }
    // the largest of the three (≥ 0) and the least (≤ 0); a moment designEffects drops equals one it keeps
    const hi = Math.max(M0, M1, M2);
    const lo = Math.min(M0, M1, M2);
    if (hi > sag[n]!) sag[n] = hi;
    if (lo < hog[n]!) hog[n] = lo;
  }
  return { xs: xs.subarray(0, n + 1), sag: sag.subarray(0, n + 1), hog: hog.subarray(0, n + 1) };
}

/**
 * The check library ignores moments below negligibleMoment(the largest |MEd|) when it decides
 * which flange is ever in compression; a sign is "always present" only above that, at any g.
 */
function signed(Msag: number, Mhog: number, V: number, sag: boolean, hog: boolean, mAbsUpper: number): DemandBound {
  const tiny = negligibleMoment(mAbsUpper);
  return { Msag, Mhog, V, sagAlways: sag && Msag > tiny, hogAlways: hog && Mhog > tiny };
}

/** A deflection point with lower bounds of its terms over a self-weight range, and its limit (mm). */
export interface DeflectionFloor {
  bend: number;
  shear: number;
  limit: number;
}

/** Lower bounds of the downward SLS deflection terms for any g in [gLo, gHi] (affine in g: extremes at the ends). */
export function analysisDeflectionFloor(a: Analysis, gLo: number, gHi: number): DeflectionFloor[] {
  const out: DeflectionFloor[] = [];
  for (const d of a.sls) {
    const np = d.x.length;
    for (let i = 0; i < np; i++) {
      const o = i * 4;
      const bend = Math.min(d.down[o]! + gLo * d.down[o + 2]!, d.down[o]! + gHi * d.down[o + 2]!);
      const shear = Math.min(d.down[o + 1]! + gLo * d.down[o + 3]!, d.down[o + 1]! + gHi * d.down[o + 3]!);
      const x = d.x[i]!;
      out.push({ bend, shear, limit: spanAt(a.supports, x).L / d.ratio });
    }
  }
  return out;
}

/** The largest sagging moment guaranteed at station x for g in [gLo, gHi] (see LoadModel.sagFloorAt). */
export function analysisSagFloorAt(a: Analysis, x: number, gLo: number, gHi: number): number {
  const nK = a.stationX.length;
  let best = 0;
  for (let k = 0; k < nK; k++) {
    if (Math.abs(a.stationX[k]! - x) > SAME_POSITION_MM) continue;
    for (let c = 0; c < a.combinations.length; c++) {
      const mg = a.gammaG[c]! * a.Mg[k]!;
      for (let t = 0; t < 4; t++) {
        const M = a.A[(c * nK + k) * 8 + 2 * t]!;
        best = Math.max(best, Math.min(M + gLo * mg, M + gHi * mg));
      }
    }
  }
  return best;
}
