import type { FySource } from '@platesmith/catalogue';
import { bearingCandidates, bearingFlatArea, bearingPairCount, loadStiffenerPositions, panelsOf, resolveBearing, restraintStiffenerPositions, type BearingCandidates, type BearingFloor, type CheckOptions, type EndPost, type GirderVerdict, type RestraintStiffeners, type Section } from '@platesmith/checks';
import { fy, G_ACC, STEEL_KG_PER_MM3 as KG_PER_MM3 } from '@platesmith/catalogue';
import type { LoadModel } from './load.js';
import type { Limit, SpaceEdge } from './limits.js';
import { buildSection, costOf, flangeMass, type CostModel, type WebParts } from './objective.js';

import { flangeGroups, loadOptions, WebTable, type FlangeGroup, type FlangeOption, type SpaceSpec, type WebConfig } from './space.js';

/** Gravity, N per kg: the catalogue's, re-exported for the modules that took it from here. */
export { G_ACC };

export type Objective = 'mass' | 'cost';

export interface SearchProblem {
  space: SpaceSpec;
  options: CheckOptions;
  load: LoadModel;
  objective: Objective;
  cost: CostModel;
}

/** Indices of a candidate: web configuration, top and bottom flange options (global option indices). */
export type CandidateKey = readonly [number, number, number];

export interface Evaluated {
  key: CandidateKey;
  section: Section;
  /** h = hw + tf,top + tf,bot, mm */
  depth: number;
  /** kg */
  mass: number;
  /** the objective's value (kg or €) */
  value: number;
  verdict: GirderVerdict;
  /** what rules out each one-step lighter neighbour (explained answers only: limits.ts) */
  limitedBy?: Limit[];
  /** the space's fields at whose largest value this point sits (explained answers only) */
  edge?: SpaceEdge[];
}

export interface PruneStats {
  depth: number;
  rules: number;
  shear: number;
  bending: number;
  flangeInducedBuckling: number;
  deflection: number;
  patchLoading: number;
  patchBending: number;
  /** the plates fail lateral-torsional buckling (EN 1993-1-1 6.3.2), found from the moment envelope before any other check */
  lateralTorsional: number;
  /** no stock bearing flat that fits the flanges meets the torsional requirement and carries the largest support reaction in bearing (EN 1993-1-5 9.2.1(8), 9.4) */
  bearing: number;
  /** the same plates failed a layout-free check (with any layout), or a panel-only check with the same panels and end post */
  sameFlanges: number;
  /** the layout failed a check that reads only the web and its stiffeners (on any flanges) */
  webOnly: number;
  incumbent: number;
}

export interface SliceResult {
  front: Evaluated[];
  /** failed candidates closest to passing (lowest governing utilisation) */
  nearMisses: Evaluated[];
  spaceSize: number;
  fullEvaluations: number;
  pruned: PruneStats;
  /** candidates judged that failed, by the first check that failed them */
  failedBy: Record<string, number>;
  /**
   * false when the slice was stopped before its heap ran empty (a time budget): its front holds
   * verified points, but points of the exact front may be missing. Absent means complete.
   */
  complete?: boolean;
}

/** Every prune count at zero (a slice before its search, or one that never ran). */
export function zeroPrunes(): PruneStats {
  return { depth: 0, rules: 0, shear: 0, bending: 0, flangeInducedBuckling: 0, deflection: 0, patchLoading: 0, patchBending: 0, lateralTorsional: 0, bearing: 0, sameFlanges: 0, webOnly: 0, incumbent: 0 };
}

/** Total order on (value, key): the tie-break that makes the answer unique and equal to brute force. */
export function better(v1: number, k1: CandidateKey, v2: number, k2: CandidateKey): boolean {
  if (v1 !== v2) return v1 < v2;
  if (k1[0] !== k2[0]) return k1[0] < k2[0];
  if (k1[1] !== k2[1]) return k1[1] < k2[1];
  return k1[2] < k2[2];
}

/**
 * Everything the search derives from a problem before it looks at any candidate. Built identically
 * in every worker (plain data in, deterministic), so global indices agree across threads.
 */
export interface Prepared {
  p: SearchProblem;
  /** the web configurations (webConfigs' order, made on demand) */
  webs: WebTable;
  groups: FlangeGroup[];
  /** all flange options, group by group; global index = position here */
  flanges: FlangeOption[];
  /** first global index of each group */
  groupStart: number[];
  /** first web index of each web plate (grade, hw, tw), ascending, and webs.length at the end */
  plateStarts: Int32Array;
  L: number;
  Lmax: number;
  supports: number[];
  fySource: FySource;
  /** kg of intermediate and load-bearing stiffeners per mm of web depth for the heaviest layout in the space */
  stiffKgPerHw: number;
  /** per stiffener grade: the bearing stiffeners the sizing can accept (made when first asked for) */
  bearingByGrade: Map<string, BearingCandidates>;
  /** the positions of the concentrated forces (mm; they do not depend on the self-weight) where the space offers load-bearing stiffeners, else none */
  forceXs: number[];
  /** the load-bearing stiffener positions a layout with them has (loadStiffenerPositions of forceXs) */
  loadXs: number[];
  /** the stiffener pairs every candidate has at the lateral restraints (space.restraintStiffener), or null */
  restraintPair: RestraintStiffeners | null;
}

/** The stiffener pairs at lateral restraints a space puts on every candidate: its flat at each restraint position of either flange inside the girder. */
export function restraintPairOf(space: SpaceSpec, options: CheckOptions): RestraintStiffeners | null {
  const f = space.restraintStiffener;
  if (!f) return null;
  const at = [...(options.restraint.kind === 'at' ? options.restraint.at : []), ...(options.restraintBottom.kind === 'at' ? options.restraintBottom.at : [])];
  return { bs: f.b, ts: f.t, xs: restraintStiffenerPositions(options.supports, at) };
}

export function prepareSearch(p: SearchProblem): Prepared {
  const fySource = p.options.fySource;
  // the web configurations are made on demand (WebTable): building a space is cheap however large
  const webs = new WebTable(p.space, fySource);
  const plateStarts = webs.plateStarts;
  const groups = flangeGroups(p.space, fySource);
  const flanges: FlangeOption[] = [];
  const groupStart: number[] = [];
  for (const g of groups) {
    groupStart.push(flanges.length);
    flanges.push(...g.options);
  }
  const supports = p.options.supports;
  const L = supports[supports.length - 1]! - supports[0]!;
  let Lmax = 0;
  for (let i = 1; i < supports.length; i++) Lmax = Math.max(Lmax, supports[i]! - supports[i - 1]!);
  // the concentrated forces' positions, where a layout may stand load-bearing stiffeners on them
  const offersLoad = loadOptions(p.space).some((f) => f !== null);
  const forceXs = offersLoad ? p.load.effects(0).forces.map((f) => f.x) : [];
  const loadXs = loadStiffenerPositions(supports, forceXs);
  // the heaviest stiffener layout of the space, per mm of web depth (see selfWeightRange): the
  // most intermediate flats (without load-bearing pairs, which only take the place of some) and
  // the heaviest load-bearing pairs
  let stiffKgPerHw = 0;
  for (const n of p.space.panels) {
    if (n <= 1) continue;
    const count = panelsOf(supports, Lmax / n).stiffenerXs.length;
    for (const f of p.space.flats) for (const sides of p.space.sides) stiffKgPerHw = Math.max(stiffKgPerHw, count * sides * f.b * f.t * KG_PER_MM3);
  }
  let loadKgPerHw = 0;
  for (const f of loadOptions(p.space)) if (f) loadKgPerHw = Math.max(loadKgPerHw, loadXs.length * 2 * f.b * f.t * KG_PER_MM3);
  stiffKgPerHw += loadKgPerHw;
  // the restraint pairs, on every candidate
  const restraintPair = restraintPairOf(p.space, p.options);
  if (restraintPair) stiffKgPerHw += restraintPair.xs.length * 2 * restraintPair.bs * restraintPair.ts * KG_PER_MM3;
  return { p, webs, groups, flanges, groupStart, plateStarts, L, Lmax, supports, fySource, stiffKgPerHw, bearingByGrade: new Map(), forceXs, loadXs, restraintPair };
}

/** The relative margin by which selfWeightRange widens its ends (round-off between two ways of summing the same masses). */
const G_RANGE_MARGIN = 1e-12;

/**
 * The self-weights (N/mm) of every candidate on web plate w (its depth and thickness) with flanges
 * T and B lie in [lo, hi]: lo, the bare plates (no intermediate stiffeners), and hi, the plates with
 * the heaviest stiffener layout of the space, each widened by a hair for round-off. Only bounds
 * read this range: a candidate's verdict reads its own girderSelfWeight, as `check` does (the
 * heaviest layout's self-weight is never a verdict: it would fail a lighter layout that passes).
 */
export function selfWeightRange(prep: Prepared, w: WebConfig, T: FlangeOption, B: FlangeOption): readonly [number, number] {
  const L = prep.L;
  const bare = w.hw * w.tw * L * KG_PER_MM3 + (flangeMass(T, L) + flangeMass(B, L));
  return [((bare * G_ACC) / L) * (1 - G_RANGE_MARGIN), (((bare + prep.stiffKgPerHw * w.hw) * G_ACC) / L) * (1 + G_RANGE_MARGIN)];
}

export function throatOf(v: GirderVerdict, fallback: number): number {
  const w = v.checks.find((c) => c.id === 'web-flange-weld');
  const t = w?.values['throat'];
  return typeof t === 'number' ? t : fallback;
}

/** The bearing stiffeners the check library's sizing can accept, per stiffener grade (bearingCandidates). */
export function bearingCandidatesOf(prep: Prepared, grade: string): BearingCandidates {
  let hit = prep.bearingByGrade.get(grade);
  if (!hit) prep.bearingByGrade.set(grade, (hit = bearingCandidates(prep.p.options, grade)));
  return hit;
}

/**
 * Bearing stiffeners as the objectives read them, per end post: steel area × count (bearingFlatArea),
 * single flats on the girder, outstand. Either a floor (the least of each term over what the sizing
 * can return) or the exact terms of one bearing stiffener.
 */
export type BearingFlat = Readonly<Record<EndPost, BearingFloor>>;

/** The exact terms of one bearing stiffener (both end posts). */
export function bearingTerms(supports: readonly number[], b: { bs: number; ts: number; pairs?: number | undefined }): BearingFlat {
  const S = supports.length;
  const n = b.pairs ?? 1;
  const of = (ep: EndPost): BearingFloor => ({ area: bearingFlatArea(ep, S, b), flats: 2 * bearingPairCount(ep, S, n), bs: b.bs, tsMin: b.ts, tsMax: b.ts });
  return { rigid: of('rigid'), 'non-rigid': of('non-rigid') };
}

/** The floor of the sizing's bearing stiffeners for a reaction up to R: null when none fits the flanges, 'none' when none that fits carries R. */
export function bearingFloorOfCandidates(c: BearingCandidates, minB: number, tw: number, R: number): BearingFlat | null | 'none' {
  const r = c.floorFor(minB, tw, R, 'rigid');
  if (r === null || r === 'none') return r;
  const n = c.floorFor(minB, tw, R, 'non-rigid') as BearingFloor;
  return { rigid: r, 'non-rigid': n };
}

/**
 * The least bearing stiffeners the library's sizing can return for this candidate (they fit
 * within the narrower flange outstand), or the default it falls back to when none fits.
 */
function bearingFloor(prep: Prepared, w: WebConfig, parts: WebParts, T: FlangeOption, B: FlangeOption, cache: Map<number, BearingFlat>): BearingFlat {
  const minB = Math.min(T.b, B.b);
  let hit = cache.get(minB);
  if (!hit) {
    const f = bearingFloorOfCandidates(bearingCandidatesOf(prep, w.grade), minB, w.tw, 0);
    hit = f === null || f === 'none' ? defaultBearing(prep, buildSection(w, parts, T, B)) : f;
    cache.set(minB, hit);
  }
  return hit;
}

/** The bearing stiffeners the check library falls back on for a section when nothing of the stock fits (resolveBearing). */
export function defaultBearing(prep: Prepared, s: Section): BearingFlat {
  const d = resolveBearing(s, fy(s.grade.stiffener, s.stiffeners?.ts ?? s.tw, prep.fySource));
  return bearingTerms(prep.supports, d);
}

function bearingKg(w: WebConfig, b: BearingFlat): number {
  return b[w.endPost].area * w.hw * KG_PER_MM3;
}

/** The value of a candidate's objective before its checks are known: exact for mass, a lower bound for cost. */
interface Pricing {
  /** kg of web, flanges and intermediate stiffeners */
  plates: number;
  /** lower bound on the objective */
  lb: number;
}

/**
 * Before the checks: the plates' mass (web, flanges, intermediate stiffeners: the self-weight
 * the girder carries; bearing stiffeners stand over the supports) and a lower bound on the
 * objective (with the lightest bearing flats the sizing could choose).
 */
export function price(prep: Prepared, w: WebConfig, parts: WebParts, T: FlangeOption, B: FlangeOption, cache: Map<number, BearingFlat>, minThroat: number): Pricing {
  // flanges added together first, so that swapping top and bottom gives the identical float
  const plates = parts.webMass + parts.stiffMass + (flangeMass(T, prep.L) + flangeMass(B, prep.L));
  const floor = bearingFloor(prep, w, parts, T, B, cache);
  if (prep.p.objective === 'mass') return { plates, lb: plates + bearingKg(w, floor) };
  return { plates, lb: priceCost(prep, w, parts, T, B, floor, minThroat) };
}

/** After the checks: the objective's value with the bearing flats and weld throat the checks settled on. */
export function settle(prep: Prepared, w: WebConfig, parts: WebParts, T: FlangeOption, B: FlangeOption, plates: number, v: GirderVerdict, minThroat: number): { mass: number; value: number } {
  const b = bearingTerms(prep.supports, v.bearing);
  const mass = plates + bearingKg(w, b);
  if (prep.p.objective === 'mass') return { mass, value: mass };
  return { mass, value: priceCost(prep, w, parts, T, B, b, throatOf(v, minThroat)) };
}

export function priceCost(prep: Prepared, w: WebConfig, parts: WebParts, T: FlangeOption, B: FlangeOption, b: BearingFlat, throat: number): number {
  const e = b[w.endPost];
  const cm = prep.p.cost;
  // the bearing plates' rate depends only on which side of thickAbove they are: the cheaper of the floor's extremes
  const cheaper = (cm.thickFactor < 1) === (e.tsMax > cm.thickAbove) ? e.tsMax : e.tsMin;
  return costOf(cm, w, parts, T, B, bearingKg(w, b), e.flats, e.bs, cheaper, prep.L, throat).cost;
}

