import type { CheckContext, CheckResult, CheckValue, Effects } from '../types.js';
import { governs, notApplicable, verdict } from '../result.js';

/**
 * Vertical deflection, EN 1990:2002 A1.4.3 and EN 1993-1-1:2005 7.2.1 (limits to be agreed with the
 * client; span/250 and span/360 are common practice, no source). Units: mm, N, N·mm, MPa.
 */

/**
 * δ = bend/(E Iy) + shear/(G Av): bend (N·mm³) = ∫ M m dx and shear (N·mm) = ∫ V v dx, with m and v
 * the moment and shear of a unit load at the point (virtual work).
 */
export function deflection(p: { bend: number; shear: number; E: number; Iy: number; G: number; Av: number }): number {
  return p.bend / (p.E * p.Iy) + p.shear / (p.G * p.Av);
}

/**
 * Virtual-work integrals for a point x of a simply supported span [x0, x1] from a piecewise-linear
 * moment and shear diagram given at points (N·mm, N): bend = ∫ M m dξ, shear = ∫ V v dξ, with
 * m(ξ) = (ξ − x0)(x1 − x)/L for ξ ≤ x, (x − x0)(x1 − ξ)/L for ξ ≥ x and v = (x1 − x)/L left of x,
 * −(x − x0)/L right of x. Each interval is integrated by Simpson's rule (exact for the product of
 * two linear functions).
 */
export function unitLoadIntegrals(pts: readonly { x: number; M: number; V: number }[], x0: number, x1: number, x: number): { bend: number; shear: number } {
  const L = x1 - x0;
  const sorted = [...pts].sort((a, b) => a.x - b.x);
  const at = (xi: number, key: 'M' | 'V', fromLeft: boolean): number => {
    // linear interpolation; at a repeated x take the left/right value
    for (let i = 0; i + 1 < sorted.length; i++) {
      const a = sorted[i]!;
      const b = sorted[i + 1]!;
      if (b.x <= a.x) continue;
      const inside = fromLeft ? xi > a.x && xi <= b.x : xi >= a.x && xi < b.x;
      if (inside) return a[key] + ((b[key] - a[key]) * (xi - a.x)) / (b.x - a.x);
    }
    return xi <= sorted[0]!.x ? sorted[0]![key] : sorted[sorted.length - 1]![key];
  };
  const m = (xi: number): number => (xi <= x ? ((xi - x0) * (x1 - x)) / L : ((x - x0) * (x1 - xi)) / L);
  const v = (xi: number): number => (xi < x ? (x1 - x) / L : -(x - x0) / L);
  const nodes = [...new Set([x0, x1, x, ...sorted.map((p) => p.x).filter((q) => q > x0 && q < x1)])].sort((a, b) => a - b);
  let bend = 0;
  let shear = 0;
  for (let i = 0; i + 1 < nodes.length; i++) {
    const a = nodes[i]!;
    const b = nodes[i + 1]!;
    const c = (a + b) / 2;
    const h = b - a;
    const Ma = at(a, 'M', false);
    const Mb = at(b, 'M', true);
    const Mc = at(c, 'M', true);
    bend += (h / 6) * (Ma * m(a) + 4 * Mc * m(c) + Mb * m(b));
    const Va = at(a, 'V', false);
    const Vb = at(b, 'V', true);
    const Vc = at(c, 'V', true);
    const vm = v(c);
    shear += (h / 6) * (Va + 4 * Vc + Vb) * vm;
  }
  return { bend, shear };
}

/** Span (between consecutive supports) containing x. */
export function spanAt(supports: readonly number[], x: number): { x0: number; x1: number; L: number } {
  for (let i = 0; i + 1 < supports.length; i++) {
    const x0 = supports[i]!;
    const x1 = supports[i + 1]!;
    if (x >= x0 && x <= x1) return { x0, x1, L: x1 - x0 };
  }
  const x0 = supports[0]!;
  const x1 = supports[supports.length - 1]!;
  return { x0, x1, L: x1 - x0 };
}

/**
 * 'deflection': for each SLS limit and point, δ = bend/(E Iy) + shear/(G Av) with Av = hw tw (the web
 * carries the shear, common practice, no source); limit = Lspan/ratio for the span containing x;
 * the worst δ/limit governs.
 */
export function deflectionCheck(ctx: CheckContext, e: Effects): CheckResult {
  const clause = 'EN 1990 A1.4.3; EN 1993-1-1 7.2.1';
  if (e.sls.length === 0) return notApplicable('deflection', clause, 'no serviceability deflection limits given');
  const Av = ctx.s.hw * ctx.s.tw;
  let best: { u: number; at: number; values: Record<string, CheckValue> } | null = null;
  for (const lim of e.sls) {
    for (const p of lim.points) {
      const delta = deflection({ bend: p.bend, shear: p.shear, E: ctx.o.E, Iy: ctx.g.Iy, G: ctx.o.G, Av });
      const span = spanAt(ctx.o.supports, p.x);
      const limit = span.L / lim.ratio;
      const u = Math.abs(delta) / limit;
      if (governs(u, best?.u)) best = { u, at: p.x, values: { delta, limit, name: lim.name, ratio: lim.ratio, span: span.L, Iy: ctx.g.Iy, Av } };
    }
  }
  if (!best) return notApplicable('deflection', clause, 'no deflection points given');
  return verdict('deflection', clause, best.u, best.at, best.values);
}

/**
 * A bound for the search: the least gross Iy (mm⁴) any section with shear area Av (mm²) needs to
 * pass 'deflection' at these points. Each point gives lower bounds of its bending and shear
 * terms (N·mm³, N·mm, downward positive) and its limit (mm). Since |δ| ≤ limit implies
 * bend/(E Iy) + shear/(G Av) ≤ limit, a point with bend > 0 needs Iy ≥ bend / (E (limit − shear/(G Av))),
 * and no Iy suffices when the shear term alone uses up the limit (returns Infinity).
 */
export function minIyForDeflection(points: readonly { bend: number; shear: number; limit: number }[], Av: number, E: number, G: number): number {
  let Iy = 0;
  for (const p of points) {
    if (!(p.bend > 0)) continue;
    const room = p.limit - p.shear / (G * Av);
    if (room <= 0) return Number.POSITIVE_INFINITY;
    Iy = Math.max(Iy, p.bend / (E * room));
  }
  return Iy;
}

/**
 * minIyForDeflection for demands affine in the self-weight g: point i has bend = bA[i] + g·bB[i],
 * shear = sA[i] + g·sB[i] and limit[i] (the form the search holds; no allocation per call).
 * `only`: the points to read, when the caller knows the others cannot govern (the same value).
 */
export function minIyForDeflectionAt(g: number, bA: Float64Array, bB: Float64Array, sA: Float64Array, sB: Float64Array, limit: Float64Array, Av: number, E: number, G: number, only?: Int32Array): number {
  let Iy = 0;
  const n = only ? only.length : bA.length;
  for (let k = 0; k < n; k++) {
    const need = pointIyNeed(only ? only[k]! : k, g, bA, bB, sA, sB, limit, Av, E, G);
    if (need === Number.POSITIVE_INFINITY) return need;
    Iy = Math.max(Iy, need);
  }
  return Iy;
}

/** The Iy point i of minIyForDeflectionAt asks: 0 when it does not bend downward, ∞ when its shear deflection alone reaches the limit. */
export function pointIyNeed(i: number, g: number, bA: Float64Array, bB: Float64Array, sA: Float64Array, sB: Float64Array, limit: Float64Array, Av: number, E: number, G: number): number {
  const bend = bA[i]! + g * bB[i]!;
  if (!(bend > 0)) return 0;
  const room = limit[i]! - (sA[i]! + g * sB[i]!) / (G * Av);
  if (room <= 0) return Number.POSITIVE_INFINITY;
  return bend / (E * room);
}

/** The Iy minIyForDeflectionAt can ask for any g of a range, and the points that can give it. */
export interface IyNeedRange {
  /** every g of the range asks at least this */
  lo: number;
  /** and at most this */
  hi: number;
  /** the points that can govern somewhere in the range: minIyForDeflectionAt over them alone is the same value */
  points: Int32Array;
}

/**
 * Encloses minIyForDeflectionAt(g, …) for every g in [gLo, gHi]. Each point's bend and shear
 * terms are affine in g, so over the range they lie between their values at the ends (rounding is
 * monotone, so this holds for the computed values too); its need bend/(E·room) lies between the
 * least bend over the greatest room and the greatest bend over the least room (0 where it may not
 * bend downward, ∞ where the room may be gone). The requirement is at least the largest least
 * need and at most the largest greatest need, and a point whose greatest need is below that
 * largest least need never governs. With `only`, just those points are read: given the points an
 * enclosing range kept, the answer for a range within it is the same as over every point (a point
 * that never governs in the wider range has its greatest need below that range's largest least
 * need, which the narrower range's can only exceed).
 */
export function iyNeedRange(gLo: number, gHi: number, bA: Float64Array, bB: Float64Array, sA: Float64Array, sB: Float64Array, limit: Float64Array, Av: number, E: number, G: number, only?: Int32Array): IyNeedRange {
  const n = only ? only.length : bA.length;
  const most = new Float64Array(n);
  let lo = 0;
  let hi = 0;
  for (let k = 0; k < n; k++) {
    const i = only ? only[k]! : k;
    const b0 = bA[i]! + gLo * bB[i]!;
    const b1 = bA[i]! + gHi * bB[i]!;
    const r0 = limit[i]! - (sA[i]! + gLo * sB[i]!) / (G * Av);
    const r1 = limit[i]! - (sA[i]! + gHi * sB[i]!) / (G * Av);
    const bMin = Math.min(b0, b1);
    const bMax = Math.max(b0, b1);
    const rMin = Math.min(r0, r1);
    const rMax = Math.max(r0, r1);
    const least = !(bMin > 0) ? 0 : rMax <= 0 ? Number.POSITIVE_INFINITY : bMin / (E * rMax);
    most[k] = !(bMax > 0) ? 0 : rMin <= 0 ? Number.POSITIVE_INFINITY : bMax / (E * rMin);
    lo = Math.max(lo, least);
    hi = Math.max(hi, most[k]!);
  }
  const keep: number[] = [];
  for (let k = 0; k < n; k++) if (most[k]! >= lo) keep.push(only ? only[k]! : k);
  return { lo, hi, points: Int32Array.from(keep) };
}
