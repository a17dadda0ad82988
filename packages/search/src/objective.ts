import { STEEL_KG_PER_MM3 as KG_PER_MM3, type GradeName } from '@platesmith/catalogue';
import { loadStiffenerPositions, panelsOf, type RestraintStiffeners, type Section } from '@platesmith/checks';
import type { FlangeOption, WebConfig } from './space.js';

/**
 * Objectives. Mass: steel of plates, intermediate, load-bearing and bearing stiffeners, the same
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

/** Farkas–Jármai: electrode change, deslagging and chipping, T3 = 0.3·T2. */
export const T3_OVER_T2 = 0.3;
/** Farkas–Jármai surface preparation time asp, min/mm². */
export const SURFACE_PREP_MIN_PER_MM2 = 3e-6;
/** Farkas–Jármai painting times agc (ground coat) and atc (top coat), min/mm². */
export const GROUND_COAT_MIN_PER_MM2 = 3e-6;
export const TOP_COAT_MIN_PER_MM2 = 4.15e-6;
/** The fewest parts a girder is assembled from (web and two flanges): κ ≥ 3. */
export const MIN_PARTS = 3;

/** T1 = Θd·√(κ·M): assembly and tacking of κ parts of M kg, min. */
export function assemblyMinutes(cm: CostModel, kappa: number, kg: number): number {
  return cm.thetaD * Math.sqrt(kappa * kg);
}

/** The four fillet welds joining the flanges to the web, throat aw (mm), over L (mm): C2·aw²·4L, min. */
export function flangeWeldMinutes(cm: CostModel, aw: number, L: number): number {
  return C2[cm.flangeWeld] * aw * aw * 4 * L;
}

/** Tsp = Θsp·asp·As: surface preparation of As mm², min (0 unpainted). */
export function surfacePrepMinutes(cm: CostModel, As: number): number {
  return cm.painted ? cm.thetaSp * SURFACE_PREP_MIN_PER_MM2 * As : 0;
}

/** Tp = Θp·(agc + atc)·As: painting of As mm², min (0 unpainted). */
export function paintingMinutes(cm: CostModel, As: number): number {
  return cm.painted ? cm.thetaP * (GROUND_COAT_MIN_PER_MM2 + TOP_COAT_MIN_PER_MM2) * As : 0;
}

/** Surface preparation and painting per mm² (Tsp + Tp = this × As, to round-off), min/mm². */
export function paintMinutesPerMm2(cm: CostModel): number {
  return cm.painted ? cm.thetaSp * SURFACE_PREP_MIN_PER_MM2 + cm.thetaP * (GROUND_COAT_MIN_PER_MM2 + TOP_COAT_MIN_PER_MM2) : 0;
}

/**
 * The painted surface of the web and flange plates over L (mm), mm²: both faces of the web, each
 * flange's outer face, its inner face less the web's footprint, and its two edges. The stiffeners'
 * faces come on top (costOf).
 */
export function platesSurface(w: Pick<WebConfig, 'hw' | 'tw'>, T: Pick<FlangeOption, 'b' | 't'>, B: Pick<FlangeOption, 'b' | 't'>, L: number): number {
  return L * (T.b + (T.b - w.tw) + 2 * T.t + B.b + (B.b - w.tw) + 2 * B.t + 2 * w.hw);
}

/** The least material rate (per kg) any plate of the given grades can have: every factor at its least. */
export function materialRateFloor(cm: CostModel, grades: Iterable<GradeName>): number {
  let g = Infinity;
  for (const name of grades) g = Math.min(g, cm.gradeFactor[name]);
  return cm.km * g * Math.min(1, cm.thickFactor);
}

/**
 * Summing the same masses in another order than costOf can round the other way: a floor built from
 * a mass summed elsewhere is lowered by this relative margin so that it is never above the value.
 */
export const SUM_ORDER_MARGIN = 1e-12;

/**
 * A lower bound on the cost (costOf(…).cost) of any candidate of at least `kg` of steel, whose
 * plates' painted surface is at least `As` (mm², platesSurface) and whose flange welds have a
 * throat of at least `awMin` (mm), with every plate's rate at least `rate` (materialRateFloor):
 * costOf's own terms with κ = MIN_PARTS, no stiffener welds and no stiffener faces. Each term of
 * costOf is non-decreasing in what is dropped, and the terms are summed in costOf's order.
 */
export function costFloor(cm: CostModel, rate: number, kg: number, As: number, awMin: number, L: number): number {
  const m = kg * (1 - SUM_ORDER_MARGIN);
  const T2 = flangeWeldMinutes(cm, awMin, L);
  const minutes = assemblyMinutes(cm, MIN_PARTS, m) + T2 + T3_OVER_T2 * T2 + surfacePrepMinutes(cm, As) + paintingMinutes(cm, As);
  return rate * m + cm.kfOverKm * cm.km * minutes;
}

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
  /** kg of the stiffeners standing in the span: intermediate and load-bearing (girderMass's `stiffeners`) */
  stiffMass: number;
  /** intermediate stiffener flats */
  stiffCount: number;
  /** stiffener spacing a, mm, or null */
  a: number | null;
  /** load-bearing stiffeners: their kg (within stiffMass), flats (two per position) and positions (loadStiffenerPositions), none without */
  loadMass: number;
  loadCount: number;
  loadXs: readonly number[];
  /** stiffener pairs at lateral restraints (the space's one choice, positions as restraintStiffenerPositions keeps them), their kg (within stiffMass) and flats; none without */
  restraint: RestraintStiffeners | null;
  restraintMass: number;
  restraintCount: number;
}

/**
 * The web configuration's parts; `forceXs`: the positions of the concentrated forces (mm), where
 * a configuration with load-bearing stiffeners has a pair each (as loadStiffenerPositions keeps them).
 */
export function webParts(w: WebConfig, L: number, supports: readonly number[], Lmax: number, forceXs: readonly number[] = [], restraint: RestraintStiffeners | null = null): WebParts {
  const loadXs = w.load ? loadStiffenerPositions(supports, forceXs) : [];
  const count = w.panels === 0 || !w.flat ? 0 : panelsOf(supports, Lmax / w.panels, loadXs).stiffenerXs.length;
  return webPartsWith(w, L, count, Lmax, loadXs, restraint && { ...restraint, xs: loadStiffenerPositions(supports, restraint.xs) });
}

/**
 * webParts with the number of intermediate stiffener positions already known (the same on every
 * web of a space with the same load-bearing choice: with one, an intermediate stiffener that falls
 * on a load-bearing pair is not counted) and the load-bearing positions.
 */
export function webPartsWith(w: WebConfig, L: number, count: number, Lmax: number, loadXs: readonly number[] = [], restraint: RestraintStiffeners | null = null): WebParts {
  const webMass = w.hw * w.tw * L * KG_PER_MM3;
  const xs = w.load ? loadXs : [];
  const loadMass = w.load ? xs.length * 2 * w.load.b * w.load.t * w.hw * KG_PER_MM3 : 0;
  const loadCount = 2 * xs.length;
  // restraint pairs (positions kept as restraintStiffenerPositions keeps them)
  const restraintMass = restraint ? restraint.xs.length * 2 * restraint.bs * restraint.ts * w.hw * KG_PER_MM3 : 0;
  const restraintCount = restraint ? 2 * restraint.xs.length : 0;
  const rest = { loadMass, loadCount, loadXs: xs, restraint, restraintMass, restraintCount };
  // summed as girderMass sums them: the intermediate flats, the load-bearing pairs, the restraint pairs
  if (w.panels === 0 || !w.flat) return { webMass, stiffMass: 0 + loadMass + restraintMass, stiffCount: 0, a: null, ...rest };
  const a = Lmax / w.panels;
  const n = count;
  const intermediate = n * w.sides * w.flat.b * w.flat.t * w.hw * KG_PER_MM3;
  return { webMass, stiffMass: intermediate + loadMass + restraintMass, stiffCount: n * w.sides, a, ...rest };
}

export function buildSection(w: WebConfig, parts: WebParts, top: FlangeOption, bot: FlangeOption): Section {
  return {
    hw: w.hw,
    tw: w.tw,
    top: { b: top.b, t: top.t },
    bot: { b: bot.b, t: bot.t },
    stiffeners: w.flat && parts.a !== null ? { a: parts.a, bs: w.flat.b, ts: w.flat.t, sides: w.sides } : null,
    endPost: w.endPost,
    ...(w.load ? { loadStiffeners: { bs: w.load.b, ts: w.load.t, xs: [...parts.loadXs] } } : {}),
    ...(parts.restraint ? { restraintStiffeners: { ...parts.restraint, xs: [...parts.restraint.xs] } } : {}),
    grade: { web: w.grade, top: top.grade, bot: bot.grade, stiffener: w.grade },
  };
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
  bearingTs: number,
  L: number,
  aw: number,
): { cost: number; material: number; fabrication: number; minutes: number } {
  const rate = (g: GradeName, t: number) => cm.km * cm.gradeFactor[g] * (t > cm.thickAbove ? cm.thickFactor : 1);
  const tStiff = w.flat?.t ?? w.tw;
  // the load-bearing flats at their own thickness's rate (none: no term)
  const loadMaterial = w.load ? parts.loadMass * rate(w.grade, w.load.t) : 0;
  const material =
    parts.webMass * rate(w.grade, w.tw) +
    flangeMass(top, L) * rate(top.grade, top.t) +
    flangeMass(bot, L) * rate(bot.grade, bot.t) +
    (parts.stiffMass - parts.loadMass - parts.restraintMass) * rate(w.grade, tStiff) +
    loadMaterial +
    (parts.restraint ? parts.restraintMass * rate(w.grade, parts.restraint.ts) : 0) +
    // bearing stiffeners at the rate of their own thickness (cut from thick plate they may cost more per kg)
    bearingKg * rate(w.grade, bearingTs);
  const mass = parts.webMass + parts.stiffMass + bearingKg + flangeMass(top, L) + flangeMass(bot, L);
  const kappa = MIN_PARTS + parts.stiffCount + parts.loadCount + parts.restraintCount + bearingFlats;
  const T1 = assemblyMinutes(cm, kappa, mass);
  const flats = parts.stiffCount + parts.loadCount + parts.restraintCount + bearingFlats;
  const T2 = flangeWeldMinutes(cm, aw, L) + C2[cm.stiffenerWeld] * cm.stiffenerThroat ** 2 * flats * 2 * w.hw;
  const T3 = T3_OVER_T2 * T2;
  const stiffB = w.flat?.b ?? 0;
  const As = platesSurface(w, top, bot, L) + parts.stiffCount * 2 * stiffB * w.hw + parts.loadCount * 2 * (w.load?.b ?? 0) * w.hw + parts.restraintCount * 2 * (parts.restraint?.bs ?? 0) * w.hw + bearingFlats * 2 * bearingBs * w.hw;
  const Tsp = surfacePrepMinutes(cm, As);
  const Tp = paintingMinutes(cm, As);
  const minutes = T1 + T2 + T3 + Tsp + Tp;
  const fabrication = cm.kfOverKm * cm.km * minutes;
  return { cost: material + fabrication, material, fabrication, minutes };
}
