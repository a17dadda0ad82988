import { withBearing } from './context.js';
import { bearingStiffenerCheck, endPostCheck } from './en1993-1-5/shear-family.js';
import { flatTorsion } from './en1993-1-5/stiffeners.js';
import type { BearingStiffener, CheckContext, Effects } from './types.js';
import { BEARING_SIZING_MARGIN } from './tolerances.js';

/**
 * Sizes the bearing stiffeners over the supports when the section does not give them: the
 * lightest double-sided pair from options.bearingFlats that fits within the narrower flange
 * outstand and passes 'end-post' (EN 1993-1-5 9.3.1), 'bearing-stiffener' (9.4) and the torsional
 * requirement of 9.2.1(8). Bearing stiffeners are local details sized for their reaction
 * (common practice, no source). When none passes, the largest that fits is returned, so that the
 * failing checks report it.
 */
export function sizeBearing(ctx: CheckContext, e: Effects): BearingStiffener {
  const { s, o } = ctx;
  const e0 = ctx.bearing.e;
  const outstand = (Math.min(s.top.b, s.bot.b) - s.tw) / 2;
  const fits = o.bearingFlats.filter((f) => f.b <= outstand).sort((p, q) => p.b * p.t - q.b * q.t || p.b - q.b);
  if (fits.length === 0) return ctx.bearing;
  for (const f of fits) {
    const b: BearingStiffener = { bs: f.b, ts: f.t, e: e0 };
    const c = withBearing(ctx, b);
    const tors = flatTorsion(f.b, f.t, c.m.fyBearing, o.E);
    if (tors.ItOverIp < tors.limit) continue;
    if (!endPostCheck(c).passes) continue;
    if (!bearingStiffenerCheck(c, e).passes) continue;
    return b;
  }
  const last = fits[fits.length - 1]!;
  return { bs: last.b, ts: last.t, e: e0 };
}

/** The least bearing-flat area any sizing can return for this flange width (a bound for the search). */
export function lightestFittingBearing(flats: readonly { b: number; t: number }[], minFlangeWidth: number, tw: number): { b: number; t: number } | null {
  const outstand = (minFlangeWidth - tw) / 2;
  let best: { b: number; t: number } | null = null;
  for (const f of flats) if (f.b <= outstand && (best === null || f.b * f.t < best.b * best.t)) best = f;
  return best;
}

/**
 * The bearing flats sizeBearing can accept for a support reaction, from what reads only the flat
 * and the reaction: of its candidates (options.bearingFlats), those that meet the torsional
 * requirement of 9.2.1(8) (the same computation as sizeBearing's) and do not crush under the
 * largest reaction (9.4: 2·(bs − snipe)·ts·fy/γM0 ≥ R, with BEARING_SIZING_MARGIN for round-off).
 * Every flat sizeBearing returns for a section that passes every check is among them, so the
 * lightest of them that fits the flanges is a floor on its bearing flats (a bound for the search).
 */
export interface BearingCandidates {
  /** the lightest flat that fits within the narrower flange outstand and meets both criteria; null when none does */
  lightestFor(minFlangeWidth: number, tw: number, Rmax: number): { b: number; t: number } | null;
}

export function bearingCandidates(flats: readonly { b: number; t: number }[], fyOf: (t: number) => number, o: { E: number; snipe: number; factors: { gammaM0: number } }): BearingCandidates {
  const list = flats
    .map((f) => {
      let fyB: number;
      try {
        fyB = fyOf(f.t);
      } catch {
        // no strength for this thickness: the sizing reports that itself; the flat is not excluded here
        return { b: f.b, t: f.t, A: f.b * f.t, torsionOk: true, FbRd: Infinity };
      }
      const tors = flatTorsion(f.b, f.t, fyB, o.E);
      return { b: f.b, t: f.t, A: f.b * f.t, torsionOk: !(tors.ItOverIp < tors.limit), FbRd: (2 * Math.max(0, f.b - o.snipe) * f.t * fyB) / o.factors.gammaM0 };
    })
    .filter((f) => f.torsionOk)
    .sort((p, q) => p.A - q.A || p.b - q.b);
  return {
    lightestFor(minFlangeWidth, tw, Rmax) {
      const outstand = (minFlangeWidth - tw) / 2;
      for (const f of list) if (f.b <= outstand && Rmax <= f.FbRd * (1 + BEARING_SIZING_MARGIN)) return { b: f.b, t: f.t };
      return null;
    },
  };
}
