import { withBearing } from './context.js';
import { bearingStiffenerCheck, endPostCheck } from './en1993-1-5/shear-family.js';
import { flatTorsion } from './en1993-1-5/stiffeners.js';
import type { BearingStiffener, CheckContext, Effects } from './types.js';

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
