import { epsilon, flangeOutstand, plastic, elastic, rects, type FlangeSide } from '../section.js';
import type { CheckContext } from '../types.js';
import { SAME_RATIO } from '../tolerances.js';

/**
 * Cross-section classification, EN 1993-1-1:2005 5.5.2 and Table 5.2 (sheets 1 and 2).
 * Inputs: c and t in mm, ε = √(235/fy) of the plate concerned (dimensionless).
 */

export type PartClass = 1 | 2 | 3 | 4;

export interface PartClassification {
  cOverT: number;
  /** Class 1, 2 and 3 limits of c/t */
  limits: [number, number, number];
  cls: PartClass;
}

function classOf(cOverT: number, limits: [number, number, number]): PartClass {
  if (cOverT <= limits[0]) return 1;
  if (cOverT <= limits[1]) return 2;
  if (cOverT <= limits[2]) return 3;
  return 4;
}

/** Table 5.2 sheet 2: outstand flange in compression, limits 9ε / 10ε / 14ε. */
export function classifyOutstand(c: number, t: number, eps: number): PartClassification {
  const limits: [number, number, number] = [9 * eps, 10 * eps, 14 * eps];
  const cOverT = c / t;
  return { cOverT, limits, cls: classOf(cOverT, limits) };
}

/** Table 5.2 sheet 1: internal part in bending, limits 72ε / 83ε / 124ε. */
export function classifyWebBending(c: number, t: number, eps: number): PartClassification {
  const limits: [number, number, number] = [72 * eps, 83 * eps, 124 * eps];
  const cOverT = c / t;
  return { cOverT, limits, cls: classOf(cOverT, limits) };
}

/** Table 5.2 sheet 1: internal part in compression, limits 33ε / 38ε / 42ε. */
export function classifyInternalCompression(c: number, t: number, eps: number): PartClassification {
  const limits: [number, number, number] = [33 * eps, 38 * eps, 42 * eps];
  const cOverT = c / t;
  return { cOverT, limits, cls: classOf(cOverT, limits) };
}

/**
 * Table 5.2 sheet 1: internal part in bending and compression.
 * α: fraction of c in compression at the plastic stress distribution (0 < α ≤ 1);
 * ψ: ratio of the elastic edge stresses σ2/σ1 (σ1 the larger compression).
 * Class 1: α > 0.5 → 396ε/(13α − 1), else 36ε/α; Class 2: 456ε/(13α − 1), else 41.5ε/α;
 * Class 3: ψ > −1 → 42ε/(0.67 + 0.33ψ), else 62ε(1 − ψ)√(−ψ).
 * At α = 0.5 and ψ = −1 the pure-bending column (72ε / 83ε / 124ε) is used: the general
 * expression gives 82.9ε for Class 2 there, the table prints 83ε.
 */
export function classifyWebBendingCompression(c: number, t: number, eps: number, alpha: number, psi: number): PartClassification {
  if (Math.abs(alpha - 0.5) < SAME_RATIO && Math.abs(psi + 1) < SAME_RATIO) return classifyWebBending(c, t, eps);
  const l1 = alpha > 0.5 ? (396 * eps) / (13 * alpha - 1) : (36 * eps) / alpha;
  const limits: [number, number, number] = [l1, webClass2Limit(eps, alpha), webClass3Limit(eps, psi)];
  const cOverT = c / t;
  return { cOverT, limits, cls: classOf(cOverT, limits) };
}

/** Table 5.2 sheet 1, bending and compression: the Class 2 limit of c/t, 456ε/(13α − 1) for α > 0.5, else 41.5ε/α. */
export function webClass2Limit(eps: number, alpha: number): number {
  return alpha > 0.5 ? (456 * eps) / (13 * alpha - 1) : (41.5 * eps) / alpha;
}

/** Table 5.2 sheet 1, bending and compression: the Class 3 limit of c/t, 42ε/(0.67 + 0.33ψ) for ψ > −1, else 62ε(1 − ψ)√(−ψ). */
export function webClass3Limit(eps: number, psi: number): number {
  return psi > -1 ? (42 * eps) / (0.67 + 0.33 * psi) : 62 * eps * (1 - psi) * Math.sqrt(-psi);
}

export interface SectionClassification {
  side: FlangeSide;
  sectionClass: PartClass;
  flangeClass: PartClass;
  webClass: PartClass;
  cFlange: number;
  cOverTflange: number;
  cOverTweb: number;
  /** plastic compression fraction of the web (0 when the web is wholly in tension) */
  alpha: number;
  /** elastic stress ratio of the web edges σ2/σ1 */
  psi: number;
  /** weld throat used in c of the flange, mm */
  throat: number;
}

/** Smallest fillet throat of the options (mm): the weld toe allowance in c of the flange. */
export function smallestThroat(ctx: CheckContext): number {
  const t = ctx.o.weldThroats;
  return t.length > 0 ? Math.min(...t) : 0;
}

/**
 * Class of the section for bending of one sign (compression flange `side`), EN 1993-1-1 5.5.2(6):
 * the worse of the compression flange and the web.
 * - Flange: c = (bf − tw)/2 − √2·a (to the weld toe; a the smallest throat of the options).
 * - Web: c = hw (the welds are ignored, which is conservative), α from the plastic neutral axis
 *   with each plate at its own fy, ψ from the gross elastic section. A web wholly in tension is Class 1.
 */
export function classifySection(ctx: CheckContext, side: FlangeSide): SectionClassification {
  const { s, m, g } = ctx;
  const throat = smallestThroat(ctx);
  const flange = side === 'top' ? s.top : s.bot;
  const fyF = side === 'top' ? m.fyTop : m.fyBot;
  const out = flangeOutstand(flange, s.tw, fyF, throat);
  const fl = classifyOutstand(out.c, flange.t, epsilon(fyF));
  const zw0 = s.bot.t;
  const zw1 = s.bot.t + s.hw;
  // distances measured from the compression edge of the web towards the tension edge
  const zp = g.zPlastic;
  const zc = g.zElastic;
  let alpha: number;
  let psi: number;
  if (side === 'top') {
    alpha = (zw1 - zp) / s.hw;
    psi = (zw0 - zc) / (zw1 - zc);
  } else {
    alpha = (zp - zw0) / s.hw;
    psi = (zw1 - zc) / (zw0 - zc);
  }
  alpha = Math.min(1, alpha);
  let web: PartClassification;
  if (alpha <= 0) {
    web = { cOverT: s.hw / s.tw, limits: [Infinity, Infinity, Infinity], cls: 1 };
    alpha = 0;
  } else {
    web = classifyWebBendingCompression(s.hw, s.tw, m.epsW, alpha, psi);
  }
  const sectionClass = Math.max(fl.cls, web.cls) as PartClass;
  return {
    side,
    sectionClass,
    flangeClass: fl.cls,
    webClass: web.cls,
    cFlange: out.c,
    cOverTflange: fl.cOverT,
    cOverTweb: web.cOverT,
    alpha,
    psi,
    throat,
  };
}

/** Convenience for tests: α and ψ of a gross section without a context. */
export function webAlphaPsi(rs: ReturnType<typeof rects>, side: FlangeSide): { alpha: number; psi: number } {
  const zp = plastic(rs).zp;
  const zc = elastic(rs).z;
  const w = rs[1]!;
  const hw = w.z1 - w.z0;
  return side === 'top'
    ? { alpha: (w.z1 - zp) / hw, psi: (w.z0 - zc) / (w.z1 - zc) }
    : { alpha: (zp - w.z0) / hw, psi: (w.z1 - zc) / (w.z0 - zc) };
}
