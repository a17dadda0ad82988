import { betaW, fu } from '@platesmith/catalogue';
import type { CheckContext, CheckResult, CheckValue, Effects, Restraint } from '../types.js';
import { governs, notApplicable, verdict } from '../result.js';
import { SAME_POSITION_MM } from '../tolerances.js';
import { fvwd, fwRd, pickThroat } from '../en1993-1-8/weld.js';
import { bearingCrushing } from './end-post.js';
import { kTau, lambdaW, stationsIn } from './shear-buckling.js';
import { flatTorsion, stiffenerAxialForce, stiffenerIstMin, stiffenerSection, strutResistance } from './stiffeners.js';

/**
 * Load-bearing stiffeners under concentrated forces, EN 1993-1-5:2006 9.4 with 9.1 and 9.2.1(8),
 * and their welds to the web, EN 1993-1-8:2005 4.5.3.3. Units: mm, mm², mm⁴, MPa, N, N/mm.
 *
 * A double-sided pair of flats bs × ts stands under each concentrated force, fitted to the loaded
 * (top) flange; the force then enters the stiffener, not the web by patch loading (6) or the
 * web-to-flange welds. At each pair:
 * - strut (9.4(2), EN 1993-1-1 6.3.1, curve c): the flats with a web strip of 15 ε tw each side
 *   (9.1(2); at most half of each adjacent panel) under NEd = F + the 9.3.3(3) eq. 9.7 force of
 *   the tension field when the pair bounds shear panels (λ̄w of the panel obtained by removing it,
 *   VEd the largest |VEd| of its two panels). Lcr = 0.75 hw where both flanges are laterally held
 *   at the pair (9.4(2)); otherwise Lcr = hw (9.4(2) asks for a larger value with less end
 *   restraint; we take the pin-ended length between the flanges, the girder's lateral stability
 *   there being the lateral-torsional buckling check's: common practice, no source);
 * - fitted end (the load path from the flange, our choice over a flange weld): crushing of the
 *   flats' end area net of the corner snipes, 2 (bs − snipe) ts fy/γM0 ≥ F;
 * - welds to the web: four fillet welds (two per flat) over hw − 2 snipe carry NEd as a
 *   longitudinal shear (EN 1993-1-8 4.5.3.3; fu and βw of the weaker of web and stiffener), the
 *   smallest throat of the options that carries it reported;
 * - torsional buckling of the flats, 9.2.1(8) eq. 9.3;
 * - stiffness as a rigid panel boundary, 9.3.3(3) eq. 9.6 with a the shorter adjacent panel;
 * - fit: the outstand bs within the narrower flange's outstand (bf − tw)/2.
 * The utilisation is the largest of these; `part` names it.
 */

/** Whether a flange restraint holds the flange laterally at x (continuous, or a restraint or support there). */
export function heldAt(r: Restraint, supports: readonly number[], x: number): boolean {
  if (r.kind === 'continuous') return true;
  const near = (y: number) => Math.abs(y - x) < SAME_POSITION_MM;
  return r.at.some(near) || supports.some(near);
}

/** Lcr of a load-bearing stiffener (9.4(2)): 0.75 hw with both flanges held laterally at x, else hw. */
export function loadStiffenerLcr(ctx: CheckContext, x: number): { Lcr: number; bothHeld: boolean } {
  const { o, s } = ctx;
  const bothHeld = heldAt(o.restraint, o.supports, x) && heldAt(o.restraintBottom, o.supports, x);
  return { Lcr: (bothHeld ? 0.75 : 1) * s.hw, bothHeld };
}

/** Weld throat and resistance per length of the four stiffener-to-web fillets carrying N over hw − 2 snipe. */
export function loadStiffenerWelds(ctx: CheckContext, N: number): { lw: number; FwEd: number; fvwd: number; throat: number; FwRd: number } {
  const { s, m, o } = ctx;
  const lw = Math.max(0, s.hw - 2 * o.snipe);
  const FwEd = lw > 0 ? N / (4 * lw) : N > 0 ? Infinity : 0;
  // the weaker part joined: the lower fu of web and flats, with the larger βw of their grades (conservative)
  const fuStiff = fu(s.grade.stiffener, s.loadStiffeners?.ts ?? s.tw, o.fySource);
  const bw = Math.max(betaW(s.grade.web), betaW(s.grade.stiffener));
  const f = fvwd(Math.min(m.fuw, fuStiff), bw, o.factors.gammaM2);
  const pick = pickThroat(o.weldThroats, FwEd, f);
  return { lw, FwEd, fvwd: f, throat: pick.a, FwRd: fwRd(pick.a, f) };
}

/** The check at one load-bearing stiffener x under the concentrated force F (N, 0 when none is there). */
export function loadStiffenerAt(ctx: CheckContext, x: number, F: number, e: Effects) {
  const { s, m, o } = ctx;
  const ls = s.loadStiffeners!;
  const left = ctx.panels.find((p) => Math.abs(p.x1 - x) < SAME_POSITION_MM);
  const right = ctx.panels.find((p) => Math.abs(p.x0 - x) < SAME_POSITION_MM);
  const a1 = left?.a ?? 0;
  const a2 = right?.a ?? 0;
  const w = 15 * m.epsW * s.tw;
  const sec = stiffenerSection(ls.bs, ls.ts, 2, s.tw, Math.min(w, a1 / 2), Math.min(w, a2 / 2));
  // 9.3.3(3) eq. 9.7: the tension field's force on the pair, from the panel without it
  const lwRemoved = lambdaW(s.hw, s.tw, m.epsW, kTau(a1 + a2, s.hw));
  let VEd = 0;
  for (const st of stationsIn(e.stations, x - a1, x + a2)) VEd = Math.max(VEd, Math.abs(st.VEd));
  const Ntf = stiffenerAxialForce(VEd, m.fyw, s.hw, s.tw, lwRemoved, o.factors.gammaM1);
  const NEd = F + Ntf;
  const fyS = Math.min(m.fyw, m.fyLoad);
  const { Lcr, bothHeld } = loadStiffenerLcr(ctx, x);
  const strut = strutResistance(sec.A, sec.I, Lcr, fyS, o.E, o.factors.gammaM1);
  const crush = bearingCrushing(ls.bs, ls.ts, o.snipe, m.fyLoad, o.factors.gammaM0);
  const weld = loadStiffenerWelds(ctx, NEd);
  const tor = flatTorsion(ls.bs, ls.ts, m.fyLoad, o.E);
  const aMin = Math.min(a1, a2);
  const IstMin = aMin > 0 ? stiffenerIstMin(aMin, s.hw, s.tw) : 0;
  const outstand = (Math.min(s.top.b, s.bot.b) - s.tw) / 2;
  const parts: [string, number][] = [
    ['strut', strut.NbRd > 0 ? NEd / strut.NbRd : Infinity],
    ['fitted end', F === 0 ? 0 : crush.FbRd > 0 ? F / crush.FbRd : Infinity],
    ['welds to the web', weld.FwEd === 0 ? 0 : weld.FwEd / weld.FwRd],
    ['torsion', tor.limit / tor.ItOverIp],
    ['stiffness', IstMin / sec.I],
    ['fit', outstand > 0 ? ls.bs / outstand : Infinity],
  ];
  let part = parts[0]!;
  for (const p of parts) if (governs(p[1], part[1])) part = p;
  return {
    F,
    VEd,
    lambdaWRemoved: lwRemoved,
    Ntf,
    NEd,
    A: sec.A,
    I: sec.I,
    Lcr,
    bothHeld,
    ...strut,
    fy: fyS,
    ...crush,
    weld,
    ItOverIp: tor.ItOverIp,
    torsionLimit: tor.limit,
    IstMin,
    outstand,
    part: part[0],
    utilisation: part[1],
  };
}

/** 'load-bearing-stiffener': EN 1993-1-5 9.4 at every load-bearing stiffener of the section; the worst governs. */
export function loadStiffenerCheck(ctx: CheckContext, e: Effects): CheckResult {
  const clause = 'EN 1993-1-5 9.4';
  if (!ctx.s.loadStiffeners) return notApplicable('load-bearing-stiffener', clause, 'no load-bearing stiffeners: concentrated forces enter the web unstiffened (patch loading, EN 1993-1-5 6)');
  if (ctx.loadXs.length === 0) return notApplicable('load-bearing-stiffener', clause, 'no concentrated force inside the girder: no load-bearing stiffener stands');
  let best: { u: number; at: number; values: Record<string, CheckValue> } | null = null;
  for (const x of ctx.loadXs) {
    let F = 0;
    for (const f of e.forces) if (Math.abs(f.x - x) < SAME_POSITION_MM) F += Math.abs(f.F);
    const r = loadStiffenerAt(ctx, x, F, e);
    if (!governs(r.utilisation, best?.u)) continue;
    best = {
      u: r.utilisation,
      at: x,
      values: {
        part: r.part,
        F: r.F,
        VEd: r.VEd,
        lambdaWRemoved: r.lambdaWRemoved,
        Ntf: r.Ntf,
        NEd: r.NEd,
        A: r.A,
        I: r.I,
        Lcr: r.Lcr,
        LcrBasis: r.bothHeld
          ? '0.75 hw: both flanges laterally held here (EN 1993-1-5 9.4(2))'
          : 'hw: a flange is not laterally held here, so 9.4(2) asks for more than 0.75 hw; the pin-ended length between the flanges is taken (common practice, no source)',
        fy: r.fy,
        lambdaBar: r.lambdaBar,
        chi: r.chi,
        NbRd: r.NbRd,
        Abearing: r.Abearing,
        FbRd: r.FbRd,
        loadPath: 'fitted end on the loaded flange: crushing of the flats net of the snipes',
        weldLength: r.weld.lw,
        FwEd: r.weld.FwEd,
        fvwd: r.weld.fvwd,
        throat: r.weld.throat,
        FwRd: r.weld.FwRd,
        ItOverIp: r.ItOverIp,
        torsionLimit: r.torsionLimit,
        IstMin: r.IstMin,
        outstand: r.outstand,
      },
    };
  }
  return verdict('load-bearing-stiffener', clause, best!.u, best!.at, best!.values);
}
