import { chi } from '../en1993-1-1/buckling-curves.js';
import type { CheckContext, Station } from '../types.js';
import { kTau, lambdaW, stationsIn } from './shear-buckling.js';
import { SAME_POSITION_MM } from '../tolerances.js';

/**
 * EN 1993-1-5:2006 Section 9: transverse stiffeners made of flats. Units: mm, mm², mm⁴, MPa, N.
 */

/**
 * 9.1(2), Figure 9.1: effective section of a transverse stiffener = the flats plus a web strip of
 * 15 ε tw on each side of the stiffener (less where the web ends or the panel is shorter: the
 * caller passes the width available on each side, e.g. min(15 ε tw, a/2)), plus the web under the
 * flats (width ts). sides = 2: flats on both faces, Ist about the web mid-plane; sides = 1: one flat,
 * Ist about the axis through the centroid of the effective section, parallel to the web.
 * bs outstand from the web face, ts thickness, tw web thickness, w1, w2 web widths either side, mm.
 */
export function stiffenerSection(
  bs: number,
  ts: number,
  sides: 1 | 2,
  tw: number,
  w1: number,
  w2: number,
): { A: number; I: number; webLength: number } {
  const webLength = ts + w1 + w2;
  const Aweb = webLength * tw;
  const Iweb = (webLength * (tw * tw * tw)) / 12;
  const Aflat = bs * ts;
  const d = tw / 2 + bs / 2; // flat centroid from the web mid-plane
  const Iflat = (ts * (bs * bs * bs)) / 12;
  if (sides === 2) {
    return { A: Aweb + 2 * Aflat, I: Iweb + 2 * (Iflat + Aflat * d * d), webLength };
  }
  const A = Aweb + Aflat;
  const zc = (Aflat * d) / A;
  const I = Iweb + Aweb * zc * zc + Iflat + Aflat * (d - zc) ** 2;
  return { A, I, webLength };
}

/**
 * 9.3.3(3), eq. 9.6: minimum second moment of area of an intermediate stiffener acting as a rigid
 * boundary: a/hw < √2 → 1.5 hw³ tw³ / a²; a/hw ≥ √2 → 0.75 hw tw³ (mm⁴). The two branches meet
 * at a/hw = √2 (1.5/2 = 0.75).
 */
export function stiffenerIstMin(a: number, hw: number, tw: number): number {
  return a / hw < Math.SQRT2 ? (1.5 * (hw * hw * hw) * (tw * tw * tw)) / (a * a) : 0.75 * hw * (tw * tw * tw);
}

/**
 * 9.3.3(3), eq. 9.7 (EN 1993-1-5:2006): axial force in an intermediate rigid stiffener,
 * NEd = VEd − fyw hw tw / (√3 γM1 λ̄w²) ≥ 0, with λ̄w of the panel obtained by removing the stiffener.
 * VEd N, fyw MPa, hw, tw mm.
 */
export function stiffenerAxialForce(VEd: number, fyw: number, hw: number, tw: number, lambdaWRemoved: number, gammaM1: number): number {
  return Math.max(0, Math.abs(VEd) - (fyw * hw * tw) / (Math.sqrt(3) * gammaM1 * lambdaWRemoved ** 2));
}

/**
 * Flexural buckling of a stiffener as a strut out of the web plane: EN 1993-1-1 6.3.1.2 with curve c
 * (EN 1993-1-5 9.4(2)), Lcr = 0.75 hw (both ends held laterally by the flanges),
 * Nb,Rd = χ A fy / γM1. A mm², I mm⁴, Lcr mm, fy and E MPa; N.
 */
export function strutResistance(A: number, I: number, Lcr: number, fy: number, E: number, gammaM1: number): { NbRd: number; chi: number; lambdaBar: number; Ncr: number } {
  const Ncr = (Math.PI ** 2 * E * I) / (Lcr * Lcr);
  const lambdaBar = Math.sqrt((A * fy) / Ncr);
  const c = chi(lambdaBar, 'c').chi;
  return { NbRd: (c * A * fy) / gammaM1, chi: c, lambdaBar, Ncr };
}

/**
 * 9.2.1(8), eq. 9.3 (warping stiffness neglected, as for flats): It/Ip ≥ 5.3 fy/E. For one flat bs × ts welded along its
 * edge: It = bs ts³/3, Ip (polar, about the welded edge) = bs³ ts/3 + bs ts³/3. Returns both sides.
 */
export function flatTorsion(bs: number, ts: number, fy: number, E: number): { ItOverIp: number; limit: number } {
  const It = (bs * (ts * ts * ts)) / 3;
  const Ip = ((bs * bs * bs) * ts) / 3 + (bs * (ts * ts * ts)) / 3;
  return { ItOverIp: It / Ip, limit: (5.3 * fy) / E };
}

/** An intermediate stiffener with its two adjacent panel lengths, mm. */
export interface StiffenerSite {
  x: number;
  a1: number;
  a2: number;
}

/** Intermediate stiffeners of the context with their adjacent panel lengths. */
export function stiffenerSites(ctx: CheckContext): StiffenerSite[] {
  const sites: StiffenerSite[] = [];
  for (const x of ctx.stiffenerXs) {
    const left = ctx.panels.find((p) => Math.abs(p.x1 - x) < SAME_POSITION_MM);
    const right = ctx.panels.find((p) => Math.abs(p.x0 - x) < SAME_POSITION_MM);
    if (left && right) sites.push({ x, a1: left.a, a2: right.a });
  }
  return sites;
}

/** Effective section of an intermediate stiffener at a site: web strip min(15 ε tw, a/2) on each side. */
export function siteSection(ctx: CheckContext, site: StiffenerSite): { A: number; I: number; webLength: number } {
  const st = ctx.s.stiffeners!;
  const w = 15 * ctx.m.epsW * ctx.s.tw;
  return stiffenerSection(st.bs, st.ts, st.sides, ctx.s.tw, Math.min(w, site.a1 / 2), Math.min(w, site.a2 / 2));
}

/** Strength of one intermediate stiffener: NEd from the largest |VEd| in its two panels, as a strut. */
export function siteStrength(ctx: CheckContext, site: StiffenerSite, stations: readonly Station[]) {
  const { s, o, m } = ctx;
  const sec = siteSection(ctx, site);
  const aMerged = site.a1 + site.a2;
  const lw = lambdaW(s.hw, s.tw, m.epsW, kTau(aMerged, s.hw));
  const near = stationsIn(stations, site.x - site.a1, site.x + site.a2);
  let VEd = 0;
  for (const st of near) VEd = Math.max(VEd, Math.abs(st.VEd));
  const NEd = stiffenerAxialForce(VEd, m.fyw, s.hw, s.tw, lw, o.factors.gammaM1);
  const fy = Math.min(m.fyw, m.fyStiff);
  const strut = strutResistance(sec.A, sec.I, 0.75 * s.hw, fy, o.E, o.factors.gammaM1);
  // 9.4(2): a one-sided stiffener carries NEd (applied in the web plane) at an eccentricity eN from
  // the centroid of its effective section; allowed for by EN 1993-1-1 6.3.3 with kyy = 1
  // (conservative, common practice): NEd/Nb,Rd + NEd·eN/(W fy/γM1), W to the web-side fibre.
  const st = s.stiffeners!;
  let eN = 0;
  let u = strut.NbRd > 0 ? NEd / strut.NbRd : Infinity;
  if (st.sides === 1 && NEd > 0) {
    eN = (st.bs * st.ts * (s.tw / 2 + st.bs / 2)) / sec.A;
    const W = sec.I / (eN + s.tw / 2);
    u += (NEd * eN) / ((W * fy) / o.factors.gammaM1);
  }
  return { VEd, NEd, lambdaWRemoved: lw, A: sec.A, I: sec.I, ...strut, eN, utilisation: u };
}

/** Whether a concentrated force at x stands on a load-bearing stiffener of the section (then it is not patch loading and not through the web-to-flange welds, but EN 1993-1-5 9.4). */
export function stiffenedAt(ctx: CheckContext, x: number): boolean {
  for (const y of ctx.loadXs) if (Math.abs(y - x) < SAME_POSITION_MM) return true;
  return false;
}
