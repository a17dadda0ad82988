import type { FlangeSide } from '../section.js';
import type { CheckContext, CheckResult, CheckValue, Effects, Station } from '../types.js';
import { governs, verdict } from '../result.js';
import { effectiveSection, type EffectiveSection } from '../en1993-1-5/effective-section.js';
import { classifySection, type SectionClassification } from './classification.js';
import { negligibleMoment } from '../tolerances.js';

/**
 * Bending resistance of the cross-section, EN 1993-1-1:2005 6.2.5 (eqs. 6.12–6.15), with the
 * effective section of EN 1993-1-5:2006 4.3/4.4 for Class 4. Units: N·mm, mm, MPa.
 */

/** Plastic section modulus of a doubly symmetric welded I (mm³): Wpl,y = bf tf (hw + tf) + tw hw²/4. */
export function wplDoublySymmetric(hw: number, tw: number, bf: number, tf: number): number {
  return bf * tf * (hw + tf) + (tw * hw * hw) / 4;
}

/** Second moment of area of a doubly symmetric welded I (mm⁴). */
export function iyDoublySymmetric(hw: number, tw: number, bf: number, tf: number): number {
  return 2 * ((bf * (tf * tf * tf)) / 12 + bf * tf * ((hw + tf) / 2) ** 2) + (tw * (hw * hw * hw)) / 12;
}

/** EN 1993-1-1 6.2.5(2): Mc,Rd = W fy / γM0 with W = Wpl (Class 1, 2), Wel,min (3), Weff,min (4). */
export function mcRd(W: number, fy: number, gammaM0: number): number {
  return (W * fy) / gammaM0;
}

export interface SignBending {
  side: FlangeSide;
  cls: SectionClassification;
  MplRd: number;
  MelRd: number;
  McRd: number;
  /** resistance used is plastic (Class 1 or 2) */
  plastic: boolean;
  eff: EffectiveSection | null;
}

/**
 * Bending resistance for one sign. Class 1–2: Mpl,Rd (each plate at its own fy, gross plastic
 * stress blocks); Class 3: Mel,Rd (first yield of any plate at its own fy); Class 4: Meff,Rd, first
 * yield of any plate of the effective section. The "effective Class 2" web of EN 1993-1-1 6.2.2.4
 * (Class 3 web, Class 1–2 flanges) is not used: Class 3 takes Mel,Rd, which is conservative.
 */
export function bendingForSign(ctx: CheckContext, side: FlangeSide): SignBending {
  const g0 = ctx.o.factors.gammaM0;
  const cls = classifySection(ctx, side);
  const MplRd = ctx.g.Mpl / g0;
  const MelRd = ctx.g.Mel / g0;
  if (cls.sectionClass <= 2) return { side, cls, MplRd, MelRd, McRd: MplRd, plastic: true, eff: null };
  if (cls.sectionClass === 3) return { side, cls, MplRd, MelRd, McRd: MelRd, plastic: false, eff: null };
  const eff = effectiveSection(ctx.s, ctx.m, side, cls.throat);
  return { side, cls, MplRd, MelRd, McRd: eff.Meff / g0, plastic: false, eff };
}

/** Signs of moment that occur among the stations (sagging if none is non-zero). */
export function signsOf(stations: readonly Station[]): FlangeSide[] {
  let max = 0;
  for (const st of stations) max = Math.max(max, Math.abs(st.MEd));
  // a moment within round-off of zero is no sign of bending
  const tiny = negligibleMoment(max);
  const sides: FlangeSide[] = [];
  if (stations.some((st) => st.MEd > tiny)) sides.push('top');
  if (stations.some((st) => st.MEd < -tiny)) sides.push('bot');
  return sides.length > 0 ? sides : ['top'];
}

export function sideName(side: FlangeSide): 'sagging' | 'hogging' {
  return side === 'top' ? 'sagging' : 'hogging';
}

/** 'bending': utilisation max |MEd| / Mc,Rd over the stations, each sign with its own Mc,Rd. */
export function bendingCheck(ctx: CheckContext, e: Effects, per: ReadonlyMap<FlangeSide, SignBending>): CheckResult {
  const clause = 'EN 1993-1-1 6.2.5; EN 1993-1-5 4.3, 4.4';
  let worst = { u: 0, at: null as number | null, side: 'top' as FlangeSide };
  for (const st of e.stations) {
    const want: FlangeSide = st.MEd > 0 ? 'top' : 'bot';
    // a station of round-off moment may have a sign signsOf ignored: its |MEd| is negligible anyway
    const side: FlangeSide = per.has(want) ? want : [...per.keys()][0]!;
    const b = per.get(side)!;
    const u = Math.abs(st.MEd) / b.McRd;
    if (governs(u, worst.at === null ? null : worst.u)) worst = { u, at: st.x, side };
  }
  const gov = per.get(worst.side) ?? [...per.values()][0]!;
  const values: Record<string, CheckValue> = {
    sectionClass: gov.cls.sectionClass,
    sign: sideName(gov.side),
    McRd: gov.McRd,
    MplRd: gov.MplRd,
    MelRd: gov.MelRd,
  };
  if (gov.eff) {
    values.MeffRd = gov.McRd;
    values.Weff = gov.eff.Weff;
    values.Aeff = gov.eff.Aeff;
    values.Ieff = gov.eff.Ieff;
    values.zEff = gov.eff.zEff;
    values.rhoFlange = gov.eff.rhoFlange;
    values.psiWeb = gov.eff.psiWeb;
    values.rhoWeb = gov.eff.web.rho;
    values.effectiveWebProcedure = 'one step: psi from effective compression flange and gross web (EN 1993-1-5 4.4(3))';
  }
  for (const [side, b] of per) {
    const n = sideName(side);
    values[`McRd_${n}`] = b.McRd;
    values[`sectionClass_${n}`] = b.cls.sectionClass;
  }
  values.MEdMax = Math.max(0, ...e.stations.map((st) => Math.abs(st.MEd)));
  return verdict('bending', clause, worst.u, worst.at, values);
}

/**
 * Envelope value at x from stations that may repeat an x (one entry per combination):
 * at each x the entry of largest |value| is kept (sign kept), and the two stations
 * bracketing x are interpolated linearly. Returns the interpolated value and, for shear-like
 * quantities that jump, the larger |value| of the bracketing stations.
 */
export function envelopeAt(stations: readonly Station[], x: number, pick: (s: Station) => number): { value: number; maxAbsNear: number } {
  if (stations.length === 0) return { value: 0, maxAbsNear: 0 };
  const env = envelopeOf(stations, pick);
  const { gov, maxAbs } = env;
  const [lo, hi, t] = bracket(env.xs, x);
  if (t === 0) return { value: gov[lo]!, maxAbsNear: maxAbs[lo]! };
  return { value: gov[lo]! + t * (gov[hi]! - gov[lo]!), maxAbsNear: Math.max(maxAbs[lo]!, maxAbs[hi]!) };
}

/**
 * The stations either side of x in ascending xs and the interpolation weight: x = xs[lo] + t·(xs[hi] − xs[lo]);
 * t = 0 (and lo the station) at or beyond an end, or on a station.
 */
/** The first index of ascending xs whose value is > x (xs.length when none is). */
export function firstAbove(xs: Float64Array, x: number): number {
  let lo = 0;
  let hi = xs.length;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if (xs[mid]! > x) hi = mid;
    else lo = mid + 1;
  }
  return lo;
}

export function bracket(xs: Float64Array, x: number): [number, number, number] {
  const n = xs.length;
  if (x <= xs[0]!) return [0, 0, 0];
  if (x >= xs[n - 1]!) return [n - 1, n - 1, 0];
  let lo = 0;
  let hi = n - 1;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (xs[mid]! < x) lo = mid;
    else hi = mid;
  }
  if (xs[hi] === x) return [hi, hi, 0];
  return [lo, hi, (x - xs[lo]!) / (xs[hi]! - xs[lo]!)];
}

export interface Envelope {
  xs: Float64Array;
  /** per x: the value of largest magnitude (sign kept) */
  gov: Float64Array;
  maxAbs: Float64Array;
}

/** The two quantities envelopes are taken of; pass these (not fresh closures) so the cache hits. */
export const pickM = (s: Station): number => s.MEd;
export const pickV = (s: Station): number => s.VEd;

/** Per distinct x, the governing value and the largest magnitude; computed once per stations array and pick. */
const ENVELOPES = new WeakMap<readonly Station[], Map<(s: Station) => number, Envelope>>();

export function envelopeOf(stations: readonly Station[], pick: (s: Station) => number): Envelope {
  const key = pick;
  let perStations = ENVELOPES.get(stations);
  if (!perStations) {
    perStations = new Map();
    ENVELOPES.set(stations, perStations);
  }
  const hit = perStations.get(key);
  if (hit) return hit;
  let sorted = true;
  for (let i = 1; i < stations.length; i++) if (stations[i]!.x < stations[i - 1]!.x) sorted = false;
  const order = sorted ? stations.map((_, i) => i) : stations.map((_, i) => i).sort((p, q) => stations[p]!.x - stations[q]!.x);
  const xs: number[] = [];
  const gov: number[] = [];
  const maxAbs: number[] = [];
  for (const i of order) {
    const st = stations[i]!;
    const v = pick(st);
    const last = xs.length - 1;
    if (last >= 0 && xs[last] === st.x) {
      if (Math.abs(v) > Math.abs(gov[last]!)) gov[last] = v;
      maxAbs[last] = Math.max(maxAbs[last]!, Math.abs(v));
    } else {
      xs.push(st.x);
      // the first value at an x starts from 0 like the reduce it replaces
      gov.push(Math.abs(v) > 0 ? v : 0);
      maxAbs.push(Math.abs(v));
    }
  }
  const env = { xs: Float64Array.from(xs), gov: Float64Array.from(gov), maxAbs: Float64Array.from(maxAbs) };
  perStations.set(key, env);
  return env;
}

/** The largest |value| at x, interpolated linearly between the neighbouring stations (per-x maxima). */
export function absAt(stations: readonly Station[], x: number, pick: (s: Station) => number): number {
  if (stations.length === 0) return 0;
  const env = envelopeOf(stations, pick);
  const [lo, hi, t] = bracket(env.xs, x);
  return env.maxAbs[lo]! + t * (env.maxAbs[hi]! - env.maxAbs[lo]!);
}
