import { STEEL_KG_PER_MM3 as KG_PER_MM3, type GradeName } from '@platesmith/catalogue';
import { panelsOf, type Section } from '@platesmith/checks';
import type { FlangeOption, WebConfig } from './space.js';

/**
 * Objectives. Mass: steel of plates, intermediate stiffeners and bearing stiffeners, the same
 * accounting as the check library's girderMass (a test keeps them equal).
 *
 * Cost: the Farkas–Jármai fabrication cost function (Jármai K., Farkas J., "Cost calculation and
 * optimisation of welded steel structures", J. Constr. Steel Res. 50 (1999) 115–135; Farkas &
 * Jármai, "Economic Design of Metal Structures", Millpress 2003):
 *   K = km·M + kf·(T1 + T2 + T3 + Tsp + Tp)
 *   T1 = Θd·√(κ·M)                      assembly, tacking (κ parts, M kg)
 *   T2 = Σ C2·aw²·Lw                     fillet welding (aw mm, Lw mm); C2 per process:
 *        SAW 0.2349e-3, GMAW-C 0.3394e-3, SMAW 0.7889e-3 min/mm³
 *   T3 = 0.3·T2                          electrode change, deslagging, chipping
 *   Tsp = Θsp·asp·As, asp = 3e-6 min/mm² surface preparation
 *   Tp = Θp·(agc + atc)·As, agc = 3e-6, atc = 4.15e-6 min/mm² painting (Θp 1/2/3: horizontal/vertical/overhead)
 * The constants are from memory of those publications (cited beside them); the rates km, kf and the
 * grade factors are illustrative and overridable. kf/km = 0 gives the mass optimum.
 */
export interface CostModel {
  /** material rate for S355 plate, €/kg (illustrative) */
  km: number;
  /** fabrication-to-material ratio kf/km, kg/min (published range 0–2) */
  kfOverKm: number;
  /** material rate multiplier per grade (illustrative) */
  gradeFactor: Record<GradeName, number>;
  /** plates thicker than this (mm) cost `thickFactor` times as much per kg (illustrative) */
  thickAbove: number;
  thickFactor: number;
  /** assembly difficulty factor Θd (Farkas–Jármai: 1–4) */
  thetaD: number;
  flangeWeld: WeldProcess;
  stiffenerWeld: WeldProcess;
  /** fillet throat of stiffener welds, mm */
  stiffenerThroat: number;
  thetaSp: number;
  thetaP: number;
  painted: boolean;
}

export type WeldProcess = 'SAW' | 'GMAW-C' | 'SMAW';

/** Farkas–Jármai C2 constants for fillet welds, min/mm³ (from memory of the publications above). */
export const C2: Readonly<Record<WeldProcess, number>> = { SAW: 0.2349e-3, 'GMAW-C': 0.3394e-3, SMAW: 0.7889e-3 };

export const DEFAULT_COST: CostModel = {
  km: 1.0,
  kfOverKm: 1.0,
  gradeFactor: { S235: 0.95, S275: 0.97, S355: 1.0, S420: 1.1, S460: 1.15 },
  thickAbove: 40,
  thickFactor: 1.05,
  thetaD: 2,
  flangeWeld: 'SAW',
  stiffenerWeld: 'GMAW-C',
  stiffenerThroat: 4,
  thetaSp: 1,
  thetaP: 2,
  painted: true,
};

/** Per-web quantities that do not depend on the flanges, computed once per web configuration. */
export interface WebParts {
  webMass: number;
  stiffMass: number;
  stiffCount: number;
  /** stiffener spacing a, mm, or null */
  a: number | null;
}

export function webParts(w: WebConfig, L: number, supports: readonly number[], Lmax: number): WebParts {
  const count = w.panels === 0 || !w.flat ? 0 : panelsOf(supports, Lmax / w.panels).stiffenerXs.length;
  return webPartsWith(w, L, count, Lmax);
}

/** webParts with the number of intermediate stiffener positions already known (the same on every web of a space). */
export function webPartsWith(w: WebConfig, L: number, count: number, Lmax: number): WebParts {
  const webMass = w.hw * w.tw * L * KG_PER_MM3;
  if (w.panels === 0 || !w.flat) return { webMass, stiffMass: 0, stiffCount: 0, a: null };
  const a = Lmax / w.panels;
  const n = count;
  return { webMass, stiffMass: n * w.sides * w.flat.b * w.flat.t * w.hw * KG_PER_MM3, stiffCount: n * w.sides, a };
}

export function buildSection(w: WebConfig, parts: WebParts, top: FlangeOption, bot: FlangeOption): Section {
  return {
    hw: w.hw,
    tw: w.tw,
    top: { b: top.b, t: top.t },
    bot: { b: bot.b, t: bot.t },
    stiffeners: w.flat && parts.a !== null ? { a: parts.a, bs: w.flat.b, ts: w.flat.t, sides: w.sides } : null,
    endPost: w.endPost,
    grade: { web: w.grade, top: top.grade, bot: bot.grade, stiffener: w.grade },
  };
}

/** Number of double-sided bearing-stiffener pairs over the supports. */
export function bearingPairs(endPost: 'rigid' | 'non-rigid', supports: readonly number[]): number {
  return 2 * (endPost === 'rigid' ? 2 : 1) + Math.max(0, supports.length - 2);
}

/** Flange plate mass, kg. */
export function flangeMass(f: FlangeOption, L: number): number {
  return f.A * L * KG_PER_MM3;
}

/** Fabrication time terms (min) and the cost (€) of a candidate with flange-weld throat aw (mm). */
export function costOf(
  cm: CostModel,
  w: WebConfig,
  parts: WebParts,
  top: FlangeOption,
  bot: FlangeOption,
  bearingKg: number,
  bearingFlats: number,
  bearingBs: number,
  L: number,
  aw: number,
): { cost: number; material: number; fabrication: number; minutes: number } {
  const rate = (g: GradeName, t: number) => cm.km * cm.gradeFactor[g] * (t > cm.thickAbove ? cm.thickFactor : 1);
  const tStiff = w.flat?.t ?? w.tw;
  const material =
    parts.webMass * rate(w.grade, w.tw) +
    flangeMass(top, L) * rate(top.grade, top.t) +
    flangeMass(bot, L) * rate(bot.grade, bot.t) +
    (parts.stiffMass + bearingKg) * rate(w.grade, tStiff);
  const mass = parts.webMass + parts.stiffMass + bearingKg + flangeMass(top, L) + flangeMass(bot, L);
  const kappa = 3 + parts.stiffCount + bearingFlats;
  const T1 = cm.thetaD * Math.sqrt(kappa * mass);
  const flats = parts.stiffCount + bearingFlats;
  const T2 = C2[cm.flangeWeld] * aw * aw * 4 * L + C2[cm.stiffenerWeld] * cm.stiffenerThroat ** 2 * flats * 2 * w.hw;
  const T3 = 0.3 * T2;
  const stiffB = w.flat?.b ?? 0;
  const As =
    L * (top.b + (top.b - w.tw) + 2 * top.t + bot.b + (bot.b - w.tw) + 2 * bot.t + 2 * w.hw) +
    parts.stiffCount * 2 * stiffB * w.hw +
    bearingFlats * 2 * bearingBs * w.hw;
  const Tsp = cm.painted ? cm.thetaSp * 3e-6 * As : 0;
  const Tp = cm.painted ? cm.thetaP * (3e-6 + 4.15e-6) * As : 0;
  const minutes = T1 + T2 + T3 + Tsp + Tp;
  const fabrication = cm.kfOverKm * cm.km * minutes;
  return { cost: material + fabrication, material, fabrication, minutes };
}
