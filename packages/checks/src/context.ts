import { DomainError, fy } from '@platesmith/catalogue';
import { assertSection, grossProps, loadStiffenerPositions, material, panelsOf, resolveBearing } from './section.js';
import type { BearingStiffener, CheckContext, CheckOptions, Section } from './types.js';

/** Everything the check families share, computed once per section. */
export function prepare(s: Section, o: CheckOptions): CheckContext {
  assertSection(s);
  const sup = o.supports;
  if (sup.length < 2 || sup.some((x, i) => i > 0 && x <= sup[i - 1]!)) {
    throw new DomainError('BAD_SUPPORTS', 'supports must be at least two ascending positions (mm)', 'give support positions from the left end, e.g. [0, 24000]', 'options.supports');
  }
  const m = material(s, o);
  const g = grossProps(s, m);
  const L = sup[sup.length - 1]! - sup[0]!;
  const loadXs = s.loadStiffeners ? loadStiffenerPositions(sup, s.loadStiffeners.xs) : [];
  const { panels, stiffenerXs } = panelsOf(sup, s.stiffeners?.a ?? null, loadXs);
  const ctx: CheckContext = { s, o, m, g, L, panels, stiffenerXs, loadXs, bearing: resolveBearing(s, m.fyStiff) };
  return withBearing(ctx, ctx.bearing);
}

/** The same context with other bearing stiffeners (their fy from their own thickness band). */
export function withBearing(ctx: CheckContext, bearing: BearingStiffener): CheckContext {
  const fyBearing = fy(ctx.s.grade.stiffener, bearing.ts, ctx.o.fySource, 'section.bearing.thickness');
  return { ...ctx, bearing, m: { ...ctx.m, fyBearing } };
}

/**
 * Memoises a quantity that depends only on the section (the context) and the compression side:
 * computed once per context and side, however many stations and checks ask for it.
 */
export function perSide<T>(compute: (ctx: CheckContext, side: 'top' | 'bot') => T): (ctx: CheckContext, side: 'top' | 'bot') => T {
  const cache = new WeakMap<CheckContext, { top?: T; bot?: T }>();
  return (ctx, side) => {
    let c = cache.get(ctx);
    if (!c) {
      c = {};
      cache.set(ctx, c);
    }
    if (!(side in c)) c[side] = compute(ctx, side);
    return c[side] as T;
  };
}
