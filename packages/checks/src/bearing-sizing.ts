import { PLATE_THICKNESSES, fy as fyOf } from '@platesmith/catalogue';
import { withBearing } from './context.js';
import { bearingStiffenerCheck, endPostCheck } from './en1993-1-5/shear-family.js';
import { bearingCrushing } from './en1993-1-5/end-post.js';
import { flatTorsion } from './en1993-1-5/stiffeners.js';
import { bearingPairCount } from './section.js';
import type { BearingStiffener, CheckContext, CheckOptions, EndPost, Effects } from './types.js';
import { BEARING_SIZING_MARGIN } from './tolerances.js';

/**
 * The most double-sided pairs the sizing stands side by side over one support (common practice,
 * no source: more pairs than this do not fit under a bearing of ordinary length).
 */
export const BEARING_MAX_PAIRS = 3;

/** Narrowest bearing stiffener cut from plate, mm (the default's least outstand, resolveBearing). */
export const BEARING_MIN_WIDTH = 40;

/** Widths of bearing stiffeners cut from plate go in steps of this, mm (common practice, no source). */
export const BEARING_WIDTH_STEP = 10;

/** Widest bearing stiffener cut from plate, mm (the public limit of a bearing outstand). */
export const BEARING_MAX_WIDTH = 1000;

/** A bearing stiffener the sizing may choose: `pairs` double-sided pairs of bs × ts over each support. */
export interface BearingOption {
  bs: number;
  ts: number;
  pairs: number;
  /** from the flat-bar stock (else cut from plate) */
  flat: boolean;
  /** crushing resistance of all its pairs (9.4, after the snipes), N; Infinity when the grade gives no fy at ts (the check reports that) */
  FbRd: number;
}

/**
 * Every bearing stiffener the sizing may choose for a stiffener grade: the stock flats and plates of
 * options.bearingPlates (default PLATE_THICKNESSES) in widths of BEARING_WIDTH_STEP from
 * BEARING_MIN_WIDTH, each as 1 … BEARING_MAX_PAIRS pairs, kept only when the flat meets the
 * torsional requirement of EN 1993-1-5 9.2.1(8) (It/Ip ≥ 5.3 fy/E at its own thickness band).
 * That requirement is stricter than the Class 3 outstand limit of EN 1993-1-1 Table 5.2
 * (c/t ≤ 14ε) for every grade, so each option is at most Class 3 and 9.4's column counts its whole
 * area (a property test holds this). Cached per options' stock, grade and fy source.
 */
export function bearingOptions(o: Pick<CheckOptions, 'bearingFlats' | 'bearingPlates' | 'E' | 'snipe' | 'factors' | 'fySource'>, grade: string): readonly BearingOption[] {
  let byFlats = CACHE.get(o.bearingFlats);
  if (!byFlats) CACHE.set(o.bearingFlats, (byFlats = new Map()));
  const plates = o.bearingPlates ?? PLATE_THICKNESSES;
  const key = `${grade}|${o.fySource}|${o.E}|${o.snipe}|${o.factors.gammaM0}|${plates === PLATE_THICKNESSES ? 'stock' : plates.join(',')}`;
  let hit = byFlats.get(key);
  if (hit) return hit;
  const out: BearingOption[] = [];
  const add = (bs: number, ts: number, flat: boolean, strict: boolean): void => {
    let fyB: number;
    try {
      fyB = fyOf(grade, ts, o.fySource);
    } catch {
      // a flat of the user's stock outside the grade's bands: the check names it; a plate of the catalogue is left out
      if (strict) return;
      for (let n = 1; n <= BEARING_MAX_PAIRS; n++) out.push({ bs, ts, pairs: n, flat, FbRd: Infinity });
      return;
    }
    const tors = flatTorsion(bs, ts, fyB, o.E);
    if (tors.ItOverIp < tors.limit) return;
    const one = bearingCrushing(bs, ts, o.snipe, fyB, o.factors.gammaM0).FbRd;
    for (let n = 1; n <= BEARING_MAX_PAIRS; n++) out.push({ bs, ts, pairs: n, flat, FbRd: n === 1 ? one : n * one });
  };
  for (const f of o.bearingFlats) add(f.b, f.t, true, false);
  for (const t of plates) {
    for (let bs = BEARING_MIN_WIDTH; bs <= BEARING_MAX_WIDTH; bs += BEARING_WIDTH_STEP) {
      if (o.bearingFlats.some((f) => f.b === bs && f.t === t)) continue;
      const before = out.length;
      add(bs, t, false, true);
      // wider is only less stiff in torsion: the first width that fails ends this thickness
      if (out.length === before) break;
    }
  }
  hit = out;
  byFlats.set(key, hit);
  return hit;
}

const CACHE = new WeakMap<object, Map<string, readonly BearingOption[]>>();
const ORDERED = new WeakMap<readonly BearingOption[], Map<string, readonly BearingOption[]>>();

/**
 * Steel area × count that the mass model multiplies by hw and the density: (flats · bs) · ts with
 * flats = 2 · bearingPairCount — the same operations as girderMass, so a floor and the exact mass agree to the bit.
 */
export function bearingFlatArea(endPost: EndPost, supports: number, b: { bs: number; ts: number; pairs?: number | undefined }): number {
  return bearingPairCount(endPost, supports, b.pairs ?? 1) * 2 * b.bs * b.ts;
}

/** The options in the order the sizing tries them for this end post and number of supports: least steel first. */
function ordered(all: readonly BearingOption[], endPost: EndPost, supports: number): readonly BearingOption[] {
  let byKey = ORDERED.get(all);
  if (!byKey) ORDERED.set(all, (byKey = new Map()));
  const key = `${endPost}|${supports}`;
  let hit = byKey.get(key);
  if (!hit) {
    const area = (b: BearingOption) => bearingFlatArea(endPost, supports, b);
    hit = [...all].sort((p, q) => area(p) - area(q) || p.pairs - q.pairs || p.bs - q.bs || p.ts - q.ts || Number(q.flat) - Number(p.flat));
    byKey.set(key, hit);
  }
  return hit;
}

function largestReaction(e: Effects): number {
  let R = 0;
  for (const r of e.reactions) R = Math.max(R, Math.abs(r.R));
  return R;
}

/**
 * Sizes the bearing stiffeners over the supports when the section does not give them (common
 * practice, no source: local details sized for their reaction, one size for every support of the
 * girder). Every option it returns for a section that can pass meets the torsional requirement of
 * 9.2.1(8) (so the Class 3 outstand limit too), fits within the narrower flange outstand and passes
 * 'end-post' (9.3.1) and 'bearing-stiffener' (9.4):
 * 1. one pair of stock flats, the lightest that passes (as before plates were offered);
 * 2. when no pair of flats passes: the least steel of every option (flats and plates of the plate
 *    stock, 1 … BEARING_MAX_PAIRS pairs over each support) that passes.
 * When none passes, the option with the greatest crushing resistance that fits is returned (it
 * still meets 9.2.1(8)), so that the failing checks report the strongest the stock allows; when
 * nothing fits the flanges at all, the section's default (resolveBearing).
 */
export function sizeBearing(ctx: CheckContext, e: Effects): BearingStiffener {
  const { s, o } = ctx;
  const e0 = ctx.bearing.e;
  const outstand = (Math.min(s.top.b, s.bot.b) - s.tw) / 2;
  const all = bearingOptions(o, s.grade.stiffener);
  const passes = (b: BearingStiffener): boolean => {
    const c = withBearing(ctx, b);
    return endPostCheck(c).passes && bearingStiffenerCheck(c, e).passes;
  };
  // 1. one pair of flats, lightest first (area, then width)
  const flats = all.filter((f) => f.flat && f.pairs === 1 && f.bs <= outstand).sort((p, q) => p.bs * p.ts - q.bs * q.ts || p.bs - q.bs);
  for (const f of flats) {
    const b: BearingStiffener = { bs: f.bs, ts: f.ts, e: e0 };
    if (passes(b)) return b;
  }
  // 2. every option, least steel first
  const R = largestReaction(e);
  let strongest: BearingOption | null = null;
  for (const f of ordered(all, s.endPost, o.supports.length)) {
    if (f.bs > outstand) continue;
    if (strongest === null || f.FbRd > strongest.FbRd) strongest = f;
    if (f.pairs === 1 && f.flat) continue; // tried in 1.
    if (R > f.FbRd * (1 + BEARING_SIZING_MARGIN)) continue; // crushes (9.4): cannot pass
    const b = asBearing(f, e0);
    if (passes(b)) return b;
  }
  if (strongest === null) return ctx.bearing;
  return asBearing(strongest, e0);
}

function asBearing(f: BearingOption, e: number): BearingStiffener {
  return f.pairs === 1 ? { bs: f.bs, ts: f.ts, e } : { bs: f.bs, ts: f.ts, e, pairs: f.pairs };
}

/** The least bearing-flat area any sizing can return for this flange width (a bound for the search). */
export function lightestFittingBearing(flats: readonly { b: number; t: number }[], minFlangeWidth: number, tw: number): { b: number; t: number } | null {
  const outstand = (minFlangeWidth - tw) / 2;
  let best: { b: number; t: number } | null = null;
  for (const f of flats) if (f.b <= outstand && (best === null || f.b * f.t < best.b * best.t)) best = f;
  return best;
}

/** A floor on the bearing stiffeners of one end post: the least of each term the objectives read. */
export interface BearingFloor {
  /** least bearingFlatArea (mm²) */
  area: number;
  /** least number of single flats (2 × pairs on the girder) */
  flats: number;
  /** least outstand, mm */
  bs: number;
  /** thinnest and thickest plate, mm (a cost rate may depend on the thickness either way) */
  tsMin: number;
  tsMax: number;
}

/**
 * The bearing stiffeners sizeBearing can accept for a support reaction, from what reads only the
 * option and the reaction: of bearingOptions (every one meets 9.2.1(8)), those that fit within
 * the narrower flange outstand and do not crush under the largest reaction (9.4: n · 2(bs − snipe)
 * ts fy/γM0 ≥ R, with BEARING_SIZING_MARGIN for round-off, the test sizeBearing skips with). Every
 * option sizeBearing returns for a section that passes every check is among them, so the least of
 * each term over them bounds its mass and cost from below (a bound for the search).
 */
export interface BearingCandidates {
  /** null when no option fits the flanges (the sizing keeps the section's default); 'none' when some fit but none carries Rmax */
  floorFor(minFlangeWidth: number, tw: number, Rmax: number, endPost: EndPost): BearingFloor | null | 'none';
  /** the least bs·ts of any option (mm²) */
  minArea: number;
}

export function bearingCandidates(o: Pick<CheckOptions, 'bearingFlats' | 'bearingPlates' | 'E' | 'snipe' | 'factors' | 'fySource' | 'supports'>, grade: string): BearingCandidates {
  const all = bearingOptions(o, grade);
  const S = o.supports.length;
  let minArea = Infinity;
  for (const f of all) minArea = Math.min(minArea, f.bs * f.ts);
  // per outstand: the fitting options by crushing resistance ascending, with suffix minima of each
  // term, so a reaction picks the options that carry it (a suffix) by bisection
  interface Table {
    F: Float64Array;
    area: Record<EndPost, Float64Array>;
    pairs: Int32Array;
    bs: Float64Array;
    tsMin: Float64Array;
    tsMax: Float64Array;
  }
  const tables = new Map<number, Table | null>();
  const tableOf = (outstand: number): Table | null => {
    let t = tables.get(outstand);
    if (t !== undefined) return t;
    const fit = all.filter((f) => f.bs <= outstand).sort((p, q) => p.FbRd - q.FbRd);
    if (fit.length === 0) t = null;
    else {
      const n = fit.length;
      t = { F: Float64Array.from(fit, (f) => f.FbRd), area: { rigid: new Float64Array(n), 'non-rigid': new Float64Array(n) }, pairs: new Int32Array(n), bs: new Float64Array(n), tsMin: new Float64Array(n), tsMax: new Float64Array(n) };
      for (let i = n - 1; i >= 0; i--) {
        const f = fit[i]!;
        const last = i === n - 1;
        for (const ep of ['rigid', 'non-rigid'] as const) t.area[ep][i] = last ? bearingFlatArea(ep, S, f) : Math.min(t.area[ep][i + 1]!, bearingFlatArea(ep, S, f));
        t.pairs[i] = last ? f.pairs : Math.min(t.pairs[i + 1]!, f.pairs);
        t.bs[i] = last ? f.bs : Math.min(t.bs[i + 1]!, f.bs);
        t.tsMin[i] = last ? f.ts : Math.min(t.tsMin[i + 1]!, f.ts);
        t.tsMax[i] = last ? f.ts : Math.max(t.tsMax[i + 1]!, f.ts);
      }
    }
    tables.set(outstand, t);
    return t;
  };
  return {
    minArea,
    floorFor(minFlangeWidth, tw, Rmax, endPost) {
      const t = tableOf((minFlangeWidth - tw) / 2);
      if (t === null) return null;
      // the first option that does not crush: !(R > FbRd (1 + margin)), monotone in FbRd
      let lo = 0;
      let hi = t.F.length;
      while (lo < hi) {
        const mid = (lo + hi) >> 1;
        if (Rmax > t.F[mid]! * (1 + BEARING_SIZING_MARGIN)) lo = mid + 1;
        else hi = mid;
      }
      if (lo === t.F.length) return 'none';
      return { area: t.area[endPost][lo]!, flats: 2 * bearingPairCount(endPost, S, t.pairs[lo]!), bs: t.bs[lo]!, tsMin: t.tsMin[lo]!, tsMax: t.tsMax[lo]! };
    },
  };
}
