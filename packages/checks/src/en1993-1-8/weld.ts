import { DomainError, betaW } from '@platesmith/catalogue';
import type { GradeName } from '@platesmith/catalogue';
import type { CheckContext, CheckResult, CheckValue, Effects } from '../types.js';
import { verdict } from '../result.js';
import { pickM, pickV, envelopeAt } from '../en1993-1-1/bending.js';
import { stiffenedAt } from '../en1993-1-5/stiffeners.js';

/**
 * Web-to-flange fillet welds, EN 1993-1-8:2005 4.5.3.3 (simplified method). Units: mm, N, MPa, N/mm.
 */

/** EN 1993-1-8 4.5.3.3(3) eq. 4.4: fvw,d = (fu/√3)/(βw γM2), MPa. */
export function fvwd(fu: number, betaWv: number, gammaM2: number): number {
  return fu / (Math.sqrt(3) * betaWv * gammaM2);
}

/** EN 1993-1-8 4.5.3.3(2) eq. 4.3: Fw,Rd = fvw,d · a, N/mm (a the throat, mm). */
export function fwRd(a: number, fvwdV: number): number {
  return fvwdV * a;
}

/** Longitudinal shear flow at a flange–web junction v = VEd Sf / Iy, N/mm (Sf first moment of the flange about the elastic neutral axis, mm³). */
export function shearFlow(VEd: number, Sf: number, Iy: number): number {
  return (Math.abs(VEd) * Sf) / Iy;
}

/** Force per unit length on each of two fillet welds from shear flow v and a direct transverse load q (N/mm), combined vectorially. */
export function weldForcePerLength(v: number, q: number): number {
  return Math.hypot(v / 2, q / 2);
}

/** Smallest throat (mm) of the ascending list with Fw,Rd ≥ Fw,Ed, or the largest if none passes. */
export function pickThroat(throats: readonly number[], FwEd: number, fvwdV: number): { a: number; passes: boolean } {
  if (throats.length === 0) {
    throw new DomainError('NO_WELD_THROATS', 'no fillet weld throat sizes to choose from', 'give at least one throat size a in mm, e.g. [4, 5, 6]', 'options.weldThroats');
  }
  const sorted = [...throats].sort((p, q) => p - q);
  for (const a of sorted) if (fwRd(a, fvwdV) >= FwEd) return { a, passes: true };
  return { a: sorted[sorted.length - 1]!, passes: false };
}

function weaker(g1: GradeName, fu1: number, g2: GradeName, fu2: number): { fu: number; betaW: number } {
  if (fu1 < fu2) return { fu: fu1, betaW: betaW(g1) };
  if (fu2 < fu1) return { fu: fu2, betaW: betaW(g2) };
  return { fu: fu1, betaW: Math.max(betaW(g1), betaW(g2)) };
}

/**
 * 'web-flange-weld': two fillet welds at each flange carry v = VEd Sf/Iy (largest |VEd| of the
 * stations); at each concentrated force on the top flange, the top welds also carry F/ℓy
 * (ℓy from EN 1993-1-5 6.5 for that force) as a direct transverse load, added vectorially to the
 * coexisting shear flow (largest |VEd| of the stations bracketing the force); a force on a
 * load-bearing stiffener (fitted to the flange) goes into the stiffener, not through these welds
 * (checked under load-bearing-stiffener). fu and βw are those
 * of the weaker part joined (lower fu). The smallest throat of the options that passes is reported.
 */
export function weldCheck(ctx: CheckContext, e: Effects): CheckResult {
  const clause = 'EN 1993-1-8 4.5.3.3';
  const { s, m, g, o } = ctx;
  const zTop = s.bot.t + s.hw + s.top.t / 2;
  const zBot = s.bot.t / 2;
  const SfTop = s.top.b * s.top.t * Math.abs(zTop - g.zElastic);
  const SfBot = s.bot.b * s.bot.t * Math.abs(g.zElastic - zBot);
  const Vmax = Math.max(0, ...e.stations.map((st) => Math.abs(st.VEd)));
  const xV = e.stations.find((st) => Math.abs(st.VEd) === Vmax)?.x ?? null;
  const wTop = weaker(s.grade.web, m.fuw, s.grade.top, m.fuTop);
  const wBot = weaker(s.grade.web, m.fuw, s.grade.bot, m.fuBot);
  const fTop = fvwd(wTop.fu, wTop.betaW, o.factors.gammaM2);
  const fBot = fvwd(wBot.fu, wBot.betaW, o.factors.gammaM2);
  const demands: { flange: 'top' | 'bottom'; FwEd: number; fvwd: number; at: number | null; vEd: number; q: number }[] = [
    { flange: 'top', FwEd: weldForcePerLength(shearFlow(Vmax, SfTop, g.Iy), 0), fvwd: fTop, at: xV, vEd: shearFlow(Vmax, SfTop, g.Iy), q: 0 },
    { flange: 'bottom', FwEd: weldForcePerLength(shearFlow(Vmax, SfBot, g.Iy), 0), fvwd: fBot, at: xV, vEd: shearFlow(Vmax, SfBot, g.Iy), q: 0 },
  ];
  for (const f of e.forces) {
    if (ctx.loadXs.length > 0 && stiffenedAt(ctx, f.x)) continue;
    // the weld right under the bearing: the force spread over ss + 5 tf (EN 1993-1-8 6.2.6.2(1) by
    // analogy, 1:2.5 through the flange; common practice) — not over the yield-line length ℓy
    const lw = f.ss + 5 * s.top.t;
    const V = envelopeAt(e.stations, f.x, pickV).maxAbsNear;
    const v = shearFlow(V, SfTop, g.Iy);
    const q = Math.abs(f.F) / lw;
    demands.push({ flange: 'top', FwEd: weldForcePerLength(v, q), fvwd: fTop, at: f.x, vEd: v, q });
  }
  // the throat must satisfy every demand: take the demand needing the largest throat
  let gov = demands[0]!;
  for (const d of demands) if (d.FwEd / d.fvwd > gov.FwEd / gov.fvwd) gov = d;
  const pick = pickThroat(o.weldThroats, gov.FwEd, gov.fvwd);
  const FwRd = fwRd(pick.a, gov.fvwd);
  const values: Record<string, CheckValue> = {
    throat: pick.a,
    vEd: gov.vEd,
    qEd: gov.q,
    FwEd: gov.FwEd,
    fvwd: gov.fvwd,
    FwRd,
    flange: gov.flange,
    aRequired: gov.FwEd / gov.fvwd,
  };
  return verdict('web-flange-weld', clause, gov.FwEd / FwRd, gov.at, values);
}
