import type { BearingStiffener, CheckContext, EndPost, Reaction } from '../types.js';
import { stiffenerSection, strutResistance } from './stiffeners.js';

/**
 * EN 1993-1-5:2006 9.3.1 (end posts) and 9.4 (bearing stiffeners under support reactions).
 * Units: mm, mm², N, MPa.
 */

/**
 * 9.3.1(3)–(4): a rigid end post of two double-sided stiffeners e apart needs e > 0.1 hw and each
 * double-sided stiffener of flats an area of at least 4 hw tw² / e. Ast = 2 bs ts of one pair.
 * (The end post as a short beam carrying the longitudinal membrane stresses, 9.3.1(2), is not checked here.)
 */
export function rigidEndPost(hw: number, tw: number, bearing: BearingStiffener): { e: number; eMin: number; Ast: number; AstMin: number; utilisation: number } {
  const eMin = 0.1 * hw;
  const Ast = 2 * bearing.bs * bearing.ts;
  const AstMin = (4 * hw * tw * tw) / bearing.e;
  return { e: bearing.e, eMin, Ast, AstMin, utilisation: Math.max(eMin / bearing.e, AstMin / Ast) };
}

/**
 * Web strip on each side of the bearing stiffener pair over a support (9.1(2): 15 ε tw each side,
 * less where the web ends). Assumptions (ours, stated): at an interior support 15 ε tw on both
 * sides limited to half the adjacent panels; at an end support the pair stands at the web end with
 * 15 ε tw on the span side only, except a rigid end post, whose bearing pair is taken with
 * 15 ε tw on the span side and min(15 ε tw, e/2) towards the other pair; only one pair is counted.
 */
export function bearingWebStrips(ctx: CheckContext, x: number): { w1: number; w2: number; atEnd: boolean } {
  const { s, m, o } = ctx;
  const w = 15 * m.epsW * s.tw;
  const first = o.supports[0]!;
  const last = o.supports[o.supports.length - 1]!;
  const atEnd = Math.abs(x - first) < 1 || Math.abs(x - last) < 1;
  const left = ctx.panels.find((p) => Math.abs(p.x1 - x) < 1);
  const right = ctx.panels.find((p) => Math.abs(p.x0 - x) < 1);
  const span = (p: typeof left) => (p ? Math.min(w, p.a / 2) : 0);
  if (!atEnd) return { w1: span(left), w2: span(right), atEnd };
  const spanSide = span(left ?? right);
  const endSide = s.endPost === 'rigid' ? Math.min(w, ctx.bearing.e / 2) : 0;
  return { w1: spanSide, w2: endSide, atEnd };
}

/**
 * Bearing (crushing) resistance of the flats' contact area after the corner snipes:
 * Abearing = 2 (bs − snipe) ts, FbRd = Abearing fy / γM0 (common practice, no source: EN 1993-1-5
 * gives no explicit clause; the fillet-weld snipe removes that much of the contact).
 */
export function bearingCrushing(bs: number, ts: number, snipe: number, fy: number, gammaM0: number): { Abearing: number; FbRd: number } {
  const Abearing = 2 * Math.max(0, bs - snipe) * ts;
  return { Abearing, FbRd: (Abearing * fy) / gammaM0 };
}

/**
 * The column of n double-sided pairs side by side over a support (9.4(2), 9.1(2)): one pair with
 * its web strips (stiffenerSection), and each further pair's two flats added about the web
 * mid-plane; the web between the pairs is not counted (ours, stated: conservative, it only adds
 * area and stiffness). n = 1 is stiffenerSection itself, bit for bit.
 */
export function bearingColumnSection(bs: number, ts: number, n: number, tw: number, w1: number, w2: number): { A: number; I: number } {
  const one = stiffenerSection(bs, ts, 2, tw, w1, w2);
  if (n === 1) return { A: one.A, I: one.I };
  const Aflat = bs * ts;
  const d = tw / 2 + bs / 2;
  const Iflat = (ts * (bs * bs * bs)) / 12;
  return { A: one.A + (n - 1) * 2 * Aflat, I: one.I + (n - 1) * 2 * (Iflat + Aflat * d * d) };
}

/** One support reaction on its bearing stiffener: column (9.4) and crushing, `pairs` double-sided pairs. */
export function bearingStiffenerAt(ctx: CheckContext, r: Reaction) {
  const { s, m, o } = ctx;
  const b = ctx.bearing;
  const n = b.pairs ?? 1;
  const strips = bearingWebStrips(ctx, r.x);
  const sec = bearingColumnSection(b.bs, b.ts, n, s.tw, strips.w1, strips.w2);
  const fy = Math.min(m.fyw, m.fyBearing);
  const strut = strutResistance(sec.A, sec.I, 0.75 * s.hw, fy, o.E, o.factors.gammaM1);
  const one = bearingCrushing(b.bs, b.ts, o.snipe, m.fyBearing, o.factors.gammaM0);
  const crush = n === 1 ? one : { Abearing: n * one.Abearing, FbRd: n * one.FbRd };
  const R = Math.abs(r.R);
  const ratio = (cap: number) => (R === 0 ? 0 : R / cap);
  const utilisation = Math.max(ratio(strut.NbRd), ratio(crush.FbRd));
  const endPost: EndPost | 'interior' = strips.atEnd ? s.endPost : 'interior';
  return { R, A: sec.A, I: sec.I, ...strut, ...crush, utilisation, endPost, pairs: n, w1: strips.w1, w2: strips.w2 };
}
