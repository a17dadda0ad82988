import type { FySource } from '@platesmith/catalogue';
import {
  checkGirder,
  firstFailure,
  type CheckResult,
  flangeOutstand,
  iyOfPlates,
  lightestFittingBearing,
  minIyForDeflection,
  minIyForDeflectionAt,
  panelsOf,
  patchUtilisation,
  patchBendingFloor,
  grossProps,
  material,
  maxCompressionFlangeAreaFIB,
  minFlangeForceForBending,
  resolveBearing,
  webShearCapacityBound,
  type CheckOptions,
  type GirderVerdict,
  type Section,
} from '@platesmith/checks';
import { fy } from '@platesmith/catalogue';
import type { DemandBound, LoadModel } from './load.js';
import { bearingPairs, buildSection, costOf, flangeMass, webParts, type CostModel, type WebParts } from './objective.js';

const KG_PER_MM3 = 7850e-9;
import { flangeGroups, webConfigs, type FlangeGroup, type FlangeOption, type SpaceSpec, type WebConfig } from './space.js';

/** Gravity, N per kg. */
export const G_ACC = 9.80665;

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
  /** failed a layout-free check with another stiffener layout or end post of the same plates */
  sameFlanges: number;
  webOnly: number;
  incumbent: number;
}

interface Miss {
  key: CandidateKey;
  section: Section;
  depth: number;
  g: number;
  lb: number;
}

export interface SliceResult {
  front: Evaluated[];
  /** failed candidates closest to passing (lowest governing utilisation) */
  nearMisses: Evaluated[];
  spaceSize: number;
  fullEvaluations: number;
  pruned: PruneStats;
  /** candidates judged in full that failed, by their governing check */
  failedBy: Record<string, number>;
}

/** Total order on (value, key): the tie-break that makes the answer unique and equal to brute force. */
export function better(v1: number, k1: CandidateKey, v2: number, k2: CandidateKey): boolean {
  if (v1 !== v2) return v1 < v2;
  if (k1[0] !== k2[0]) return k1[0] < k2[0];
  if (k1[1] !== k2[1]) return k1[1] < k2[1];
  return k1[2] < k2[2];
}

/**
 * A failed check whose inputs are the web and its intermediate stiffeners only fails every flange
 * on that web: stiffener stiffness (EN 1993-1-5 9.3.3(3): a, hw, tw, the flats and 15εtw of web)
 * and the torsional requirement of the intermediate flats (9.2.1(8)). The torsion of the bearing
 * flats is not web-only: they are sized to fit the flanges.
 */
function failsWebOnly(c: CheckResult): boolean {
  return !c.passes && (c.id === 'stiffener-stiffness' || (c.id === 'stiffener-torsion' && c.values['stiffener'] === 'intermediate'));
}

/**
 * Everything the search derives from a problem before it looks at any candidate. Built identically
 * in every worker (plain data in, deterministic), so global indices agree across threads.
 */
export interface Prepared {
  p: SearchProblem;
  webs: WebConfig[];
  groups: FlangeGroup[];
  /** all flange options, group by group; global index = position here */
  flanges: FlangeOption[];
  /** first global index of each group */
  groupStart: number[];
  L: number;
  Lmax: number;
  supports: number[];
  fySource: FySource;
  /** kg of intermediate stiffeners per mm of web depth for the heaviest layout in the space */
  stiffKgPerHw: number;
}

export function prepareSearch(p: SearchProblem): Prepared {
  const fySource = p.options.fySource;
  const webs = webConfigs(p.space, fySource);
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
  // the heaviest stiffener layout of the space, per mm of web depth (see selfWeightOf)
  let stiffKgPerHw = 0;
  for (const n of p.space.panels) {
    if (n <= 1) continue;
    const count = panelsOf(supports, Lmax / n).stiffenerXs.length;
    for (const f of p.space.flats) for (const sides of p.space.sides) stiffKgPerHw = Math.max(stiffKgPerHw, count * sides * f.b * f.t * KG_PER_MM3);
  }
  return { p, webs, groups, flanges, groupStart, L, Lmax, supports, fySource, stiffKgPerHw };
}

/**
 * The self-weight a candidate's effects are computed with, N/mm: web and flanges, plus the
 * intermediate stiffeners of the heaviest layout in the space (conservative by at most that
 * layout's weight, about 1–3 % of the girder's). Taking the same allowance for every stiffener
 * layout makes the effects, and so every check that does not read the stiffeners (bending,
 * lateral-torsional buckling, deflection, flange-induced buckling, plastic shear), identical
 * across the layouts of one web and flange choice: a failure of one of those checks then fails
 * every layout, exactly. Bearing stiffeners stand over the supports and load no span.
 */
export function selfWeightOf(prep: Prepared, w: WebConfig, T: FlangeOption, B: FlangeOption): number {
  const kg = w.hw * w.tw * prep.L * KG_PER_MM3 + (flangeMass(T, prep.L) + flangeMass(B, prep.L)) + prep.stiffKgPerHw * w.hw;
  return (kg * G_ACC) / prep.L;
}

/** Checks that read nothing of the intermediate stiffeners or the end post: equal across layouts. */
const LAYOUT_FREE = new Set(['deflection', 'lateral-torsional-buckling', 'bending', 'flange-induced-buckling', 'shear', 'classification']);

/** The value of a candidate's objective before its checks are known: exact for mass, a lower bound for cost. */
interface Pricing {
  /** kg of web, flanges and intermediate stiffeners */
  plates: number;
  /** lower bound on the objective */
  lb: number;
}

/**
 * Exact search over the web configurations `webIdx` (a slice of prep.webs): the Pareto set of
 * overall depth against the objective, for that slice.
 *
 * A candidate is judged in full only when no bound excludes it: bounds from the check library
 * (shear, bending, flange-induced buckling, deflection) that every passing section satisfies, and
 * the staircase of feasible points found so far (a candidate whose objective cannot beat what is
 * already feasible at its depth or shallower is not on the Pareto set). Webs are visited in
 * ascending order of a lower bound on their lightest candidate, and a web's flange groups in
 * ascending order of theirs, so that light feasible points are found early and prune the rest.
 */
export function searchSlice(prep: Prepared, webIdx: readonly number[], signal?: { aborted: boolean }): SliceResult {
  const { p, webs, groups, flanges, groupStart, L, Lmax, supports } = prep;
  const o = p.options;
  const sp = p.space;
  const pruned: PruneStats = { depth: 0, rules: 0, shear: 0, bending: 0, flangeInducedBuckling: 0, deflection: 0, patchLoading: 0, patchBending: 0, sameFlanges: 0, webOnly: 0, incumbent: 0 };
  let fullEvaluations = 0;
  let spaceSize = 0;
  const minThroat = o.weldThroats[0]!;
  const failedBy: Record<string, number> = {};
  // web plate and flanges whose candidates failed a layout-free check (at the shared self-weight)
  const sharedFailures = new Set<string>();

  // staircase of feasible points found so far: depth ascending, value strictly descending
  const stairs: Evaluated[] = [];
  const prunes = (d: number, lb: number): boolean => {
    for (const s of stairs) {
      if (s.depth > d) break;
      if (s.value < lb) return true;
      if (s.value === lb && s.depth < d) return true;
    }
    return false;
  };
  const admit = (e: Evaluated): void => {
    for (let i = stairs.length - 1; i >= 0; i--) {
      const s = stairs[i]!;
      const dominated = s.depth >= e.depth && (e.value < s.value || (e.value === s.value && (e.depth < s.depth || better(e.value, e.key, s.value, s.key))));
      if (dominated) stairs.splice(i, 1);
    }
    for (const s of stairs) {
      if (s.depth <= e.depth && (s.value < e.value || (s.value === e.value && (s.depth < e.depth || better(s.value, s.key, e.value, e.key))))) return;
    }
    let i = 0;
    while (i < stairs.length && stairs[i]!.depth < e.depth) i++;
    stairs.splice(i, 0, e);
  };
  // failed candidates kept for the nearest-miss report: the heaviest (closest to passing, as a rule)
  const misses: Miss[] = [];
  const keepMiss = (m: Miss): void => {
    if (misses.length < 24) misses.push(m);
    else {
      let i = 0;
      for (let j = 1; j < misses.length; j++) if (misses[j]!.lb < misses[i]!.lb) i = j;
      if (m.lb > misses[i]!.lb) misses[i] = m;
    }
  };

  const tfSorted = [...new Set(groups.map((g) => g.t))].sort((x, y) => x - y);
  const tfMin = tfSorted[0] ?? 0;
  const gMax = maxMassPerLength(prep) * G_ACC;
  const nFlange = flanges.length;
  const pairsPerWeb = sp.symmetric ? nFlange : nFlange * nFlange;
  const kFibMax = o.kFib === 'auto' ? 0.55 : o.kFib;
  const lightestFlange = minFlangeMass(prep);
  const fyfMax = Math.max(...groups.map((g) => g.fy));
  const lightestBearingKg = (w: WebConfig) => {
    let a = Infinity;
    for (const f of o.bearingFlats) a = Math.min(a, f.b * f.t);
    return a === Infinity ? 0 : bearingFlatCount(w, supports) * a * w.hw * KG_PER_MM3;
  };
  /** the bending bound (least total flange force) for a web, a depth and the flanges' extremes */
  const flangeForce = (w: WebConfig, MEd: number, hMax: number, tfMax: number, fyf: number) =>
    minFlangeForceForBending({ hw: w.hw, tw: w.tw, fyw: w.fyw, MEd, gammaM0: o.factors.gammaM0, hMax, symmetric: sp.symmetric, tfMax, fyfMax: fyf });
  const groupPairs = sp.symmetric ? groups.map((_, i) => [i, i] as const) : groups.flatMap((_, i) => groups.map((__, j) => [i, j] as const));

  // demand bounds valid for every candidate of the slice: self-weight from the lightest web plate
  // and the two lightest flanges up to the heaviest conceivable girder
  let lightestWebKg = Infinity;
  for (const wi of webIdx) lightestWebKg = Math.min(lightestWebKg, webs[wi]!.hw * webs[wi]!.tw * L * KG_PER_MM3);
  const gLoAll = ((lightestWebKg + 2 * lightestFlange) * G_ACC) / L;
  const demGlobal = p.load.demandLowerBound(gLoAll, gMax);
  const deflFloor = p.load.deflectionFloor(gLoAll, gMax);
  // concentrated forces do not depend on the self-weight: the patch-loading check is exact here
  const forces = p.load.effects(gLoAll).forces;
  const sagAtForces = forces.length && p.load.sagFloorAt ? p.load.sagFloorAt(forces.map((f) => f.x), gLoAll, gMax) : [];

  // web-level pass: cheap bounds, and the order of visit
  interface WebPlan {
    wi: number;
    parts: WebParts;
    lb: number;
    dMin: number;
    Freq: number;
    Mneed: number;
    dem: DemandBound;
    IyReq: number;
  }
  const plans: WebPlan[] = [];
  for (const wi of webIdx) {
    const w = webs[wi]!;
    spaceSize += pairsPerWeb;
    const dMin = w.hw + 2 * tfMin;
    if (dMin > sp.maxDepth) {
      pruned.depth += pairsPerWeb;
      continue;
    }
    const parts = webParts(w, L, supports, Lmax);
    const dem = demGlobal;
    if (webShearCapacityBound(w.hw, w.tw, w.fyw, o.eta, o.factors.gammaM0, o.factors.gammaM1) < dem.V) {
      pruned.shear += pairsPerWeb;
      continue;
    }
    const IyReq = minIyForDeflection(deflFloor, w.hw * w.tw, o.E, o.G);
    if (IyReq === Infinity) {
      pruned.deflection += pairsPerWeb;
      continue;
    }
    const Mneed = Math.max(dem.Msag, dem.Mhog);
    const tfTop = tfSorted[tfSorted.length - 1] ?? 0;
    const Freq = flangeForce(w, Mneed, Math.min(sp.maxDepth, w.hw + 2 * tfTop), tfTop, fyfMax);
    const flangeKgFloor = Math.max(2 * lightestFlange, (Freq / fyfMax) * L * KG_PER_MM3);
    const lb = parts.webMass + parts.stiffMass + flangeKgFloor + lightestBearingKg(w);
    plans.push({ wi, parts, lb, dMin, Freq, Mneed, dem, IyReq });
  }
  plans.sort(byLbThenWeb);

  for (const plan of plans) {
    if (signal?.aborted) break;
    const { wi, parts, dem, Mneed, IyReq } = plan;
    const w = webs[wi]!;
    if (p.objective === 'mass' && prunes(plan.dMin, plan.lb)) {
      pruned.incumbent += pairsPerWeb;
      continue;
    }
    const fibTop = dem.sagAlways ? maxCompressionFlangeAreaFIB({ hw: w.hw, tw: w.tw, fyfMin: 1, k: kFibMax, E: o.E }) : Infinity;
    const fibBot = dem.hogAlways ? maxCompressionFlangeAreaFIB({ hw: w.hw, tw: w.tw, fyfMin: 1, k: kFibMax, E: o.E }) : Infinity;
    const bearingCache = new Map<number, BearingFlat>();
    const webPanels = panelsOf(supports, parts.a).panels;
    // patch loading reads the web and the top flange only: once per top-flange option on this web
    const patchU = new Float64Array(flanges.length).fill(-1);
    const patchOf = (ti: number): number => {
      if (patchU[ti]! < 0) patchU[ti] = patchUtilisation(forces, w, flanges[ti]!, webPanels, o.E, o.factors.gammaM1);
      return patchU[ti]!;
    };

    // group pass: cheap per-group data only; candidates are generated when a group is reached
    interface GroupPlan {
      gt: number;
      gb: number;
      d: number;
      n: number;
      Freq: number;
      /** lower bound on the objective of any candidate in the group (mass objective) */
      lb: number;
    }
    const gplans: GroupPlan[] = [];
    for (const [gt, gb] of groupPairs) {
      const GT = groups[gt]!;
      const GB = groups[gb]!;
      const nPairs = sp.symmetric ? GT.options.length : GT.options.length * GB.options.length;
      const d = w.hw + GT.t + GB.t;
      if (d < sp.minDepth || d > sp.maxDepth) {
        pruned.depth += nPairs;
        continue;
      }
      const r = sp.rules;
      if (r.tfMaxOverTw !== undefined && (GT.t > r.tfMaxOverTw * w.tw || GB.t > r.tfMaxOverTw * w.tw)) {
        pruned.rules += nPairs;
        continue;
      }
      const Freq = flangeForce(w, Mneed, d, Math.max(GT.t, GB.t), Math.max(GT.fy, GB.fy));
      // the widest flanges of the group: if even they miss the bending or the deflection bound, all do
      const Tw = GT.options[GT.options.length - 1]!;
      const Bw = GB.options[GB.options.length - 1]!;
      if (Tw.A * Tw.fy + Bw.A * Bw.fy < Freq) {
        pruned.bending += nPairs;
        continue;
      }
      if (IyReq > 0 && iyOfPlates(w.hw, w.tw, Tw.b, Tw.t, Bw.b, Bw.t) * (1 + 1e-9) < IyReq) {
        pruned.deflection += nPairs;
        continue;
      }
      // flange area: at least the two narrowest plates, and at least what the bending bound needs
      const Amin = Math.max(GT.options[0]!.A + GB.options[0]!.A, Freq / Math.max(GT.fy, GB.fy));
      const lb = parts.webMass + parts.stiffMass + Amin * L * KG_PER_MM3 + lightestBearingKg(w);
      gplans.push({ gt, gb, d, n: nPairs, Freq, lb });
    }
    gplans.sort(byLbThenDepth);

    let webDead = false;
    for (const gp of gplans) {
      if (webDead || signal?.aborted) {
        pruned.webOnly += gp.n;
        continue;
      }
      const { gt, gb, d, Freq } = gp;
      if (p.objective === 'mass' && prunes(d, gp.lb)) {
        pruned.incumbent += gp.n;
        continue;
      }
      const GT = groups[gt]!;
      const GB = groups[gb]!;
      // FIB bounds apply to gross areas only where the compression flange's outstand is fully effective
      const fibT = fibTop === Infinity ? Infinity : fibTop / (GT.fy * GT.fy);
      const fibB = fibBot === Infinity ? Infinity : fibBot / (GB.fy * GB.fy);
      // candidates in ascending plate mass (bearing flats aside)
      const t0 = groupStart[gt]!;
      const b0 = groupStart[gb]!;
      const pairs: { ti: number; bi: number; plates: number }[] = [];
      let skipped = 0;
      if (sp.symmetric) {
        // widths ascending: area, force and Iy all grow with the width, so the options below the
        // bending and deflection bounds are a prefix, found by bisection
        const n = GT.options.length;
        const iB = firstByForce(GT.options, Freq);
        const iD = IyReq > 0 ? firstByIy(GT.options, w.hw, w.tw, IyReq) : 0;
        pruned.bending += Math.min(iB, n);
        pruned.deflection += Math.max(0, Math.min(iD, n) - Math.min(iB, n));
        skipped = Math.max(iB, iD);
        for (let i = skipped; i < n; i++) pairs.push({ ti: t0 + i, bi: t0 + i, plates: plateKg(parts, flanges, t0 + i, t0 + i, L) });
      } else {
        for (let i = 0; i < GT.options.length; i++) for (let j = 0; j < GB.options.length; j++) pairs.push({ ti: t0 + i, bi: b0 + j, plates: plateKg(parts, flanges, t0 + i, b0 + j, L) });
        pairs.sort(byPlates);
      }
      const floorKg = lightestBearingKg(w);
      let k = 0;
      for (; k < pairs.length; k++) {
        if (signal?.aborted) break;
        const pr = pairs[k]!;
        // every later pair is at least this heavy: stop when even the lightest bearing cannot save it
        if (p.objective === 'mass' && prunes(d, pr.plates + floorKg)) break;
        const T = flanges[pr.ti]!;
        const B = flanges[pr.bi]!;
        if (T.A * T.fy + B.A * B.fy < Freq) {
          pruned.bending++;
          continue;
        }
        if (!fibOk(T, fibT, w.tw, minThroat) || !fibOk(B, fibB, w.tw, minThroat)) {
          pruned.flangeInducedBuckling++;
          continue;
        }
        const Iy = iyOfPlates(w.hw, w.tw, T.b, T.t, B.b, B.t) * (1 + 1e-9);
        if (IyReq > 0 && Iy < IyReq) {
          pruned.deflection++;
          continue;
        }
        if (forces.length > 0 && patchOf(pr.ti) > 1 + 1e-9) {
          pruned.patchLoading++;
          continue;
        }
        const price0 = price(prep, w, parts, T, B, bearingCache, minThroat);
        if (prunes(d, price0.lb)) {
          pruned.incumbent++;
          continue;
        }
        const sharedKey = `${w.grade}|${w.hw}|${w.tw}|${pr.ti}|${pr.bi}`;
        if (sharedFailures.has(sharedKey)) {
          pruned.sameFlanges++;
          continue;
        }
        const g = selfWeightOf(prep, w, T, B);
        // the deflection bound again, at this candidate's own self-weight
        const da = p.load.deflectionAffine;
        if (da && Iy < minIyForDeflectionAt(g, da.bA, da.bB, da.sA, da.sB, da.limit, w.hw * w.tw, o.E, o.G)) {
          pruned.deflection++;
          continue;
        }
        const section = buildSection(w, parts, T, B);
        if (sagAtForces.some((m) => m > 0)) {
          const Mel = grossProps(section, material(section, o)).Mel;
          if (patchBendingFloor(forces, w, T, webPanels, o.E, o.factors.gammaM1, sagAtForces, Mel / o.factors.gammaM0) > 1 + 1e-9) {
            pruned.patchBending++;
            continue;
          }
        }
        const effects = p.load.effects(g);
        const fail = firstFailure(section, effects, o);
        fullEvaluations++;
        const key: CandidateKey = [wi, pr.ti, pr.bi];
        if (fail === null) {
          const verdict = checkGirder(section, effects, o);
          const { mass, value } = settle(prep, w, parts, T, B, price0.plates, verdict, minThroat);
          admit({ key, section: { ...section, bearing: verdict.bearing }, depth: d, mass, value, verdict });
          continue;
        }
        failedBy[fail.id] = (failedBy[fail.id] ?? 0) + 1;
        if (LAYOUT_FREE.has(fail.id)) sharedFailures.add(sharedKey);
        keepMiss({ key, section, depth: d, g, lb: price0.lb });
        if (failsWebOnly(fail)) {
          webDead = true;
          k++;
          break;
        }
      }
      pruned.incumbent += pairs.length - k;
    }
  }
  // full results for the nearest misses (only worth it when nothing passed)
  const nearMisses: Evaluated[] = stairs.length > 0 ? [] : misses
    .map((mi) => {
      const verdict = checkGirder(mi.section, p.load.effects(mi.g), o);
      return { key: mi.key, section: { ...mi.section, bearing: verdict.bearing }, depth: mi.depth, mass: mi.lb, value: mi.lb, verdict };
    })
    .sort((x, y) => x.verdict.governing.utilisation - y.verdict.governing.utilisation)
    .slice(0, 5);
  return { front: [...stairs], nearMisses, spaceSize, fullEvaluations, pruned, failedBy };
}

export function throatOf(v: GirderVerdict, fallback: number): number {
  const w = v.checks.find((c) => c.id === 'web-flange-weld');
  const t = w?.values['throat'];
  return typeof t === 'number' ? t : fallback;
}

/** Bearing-stiffener flats count (double-sided pairs × 2). */
function bearingFlatCount(w: WebConfig, supports: readonly number[]): number {
  return bearingPairs(w.endPost, supports) * 2;
}

/**
 * The least bearing-stiffener flat the library's sizing can return for this candidate (it fits
 * within the narrower flange outstand), or the default it falls back to when none fits.
 */
function bearingFloor(prep: Prepared, w: WebConfig, parts: WebParts, T: FlangeOption, B: FlangeOption, cache: Map<number, BearingFlat>): BearingFlat {
  const minB = Math.min(T.b, B.b);
  let hit = cache.get(minB);
  if (!hit) {
    const f = lightestFittingBearing(prep.p.options.bearingFlats, minB, w.tw);
    if (f) hit = { bs: f.b, ts: f.t };
    else {
      const s = buildSection(w, parts, T, B);
      const d = resolveBearing(s, fy(s.grade.stiffener, s.stiffeners?.ts ?? s.tw, prep.fySource));
      hit = { bs: d.bs, ts: d.ts };
    }
    cache.set(minB, hit);
  }
  return hit;
}

export interface BearingFlat {
  bs: number;
  ts: number;
}

function bearingKg(prep: Prepared, w: WebConfig, b: BearingFlat): number {
  return bearingFlatCount(w, prep.supports) * b.bs * b.ts * w.hw * KG_PER_MM3;
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
  if (prep.p.objective === 'mass') return { plates, lb: plates + bearingKg(prep, w, floor) };
  return { plates, lb: priceCost(prep, w, parts, T, B, floor, minThroat) };
}

/** After the checks: the objective's value with the bearing flats and weld throat the checks settled on. */
export function settle(prep: Prepared, w: WebConfig, parts: WebParts, T: FlangeOption, B: FlangeOption, plates: number, v: GirderVerdict, minThroat: number): { mass: number; value: number } {
  const b = { bs: v.bearing.bs, ts: v.bearing.ts };
  const mass = plates + bearingKg(prep, w, b);
  if (prep.p.objective === 'mass') return { mass, value: mass };
  return { mass, value: priceCost(prep, w, parts, T, B, b, throatOf(v, minThroat)) };
}

export function priceCost(prep: Prepared, w: WebConfig, parts: WebParts, T: FlangeOption, B: FlangeOption, b: BearingFlat, throat: number): number {
  return costOf(prep.p.cost, w, parts, T, B, bearingKg(prep, w, b), bearingFlatCount(w, prep.supports), b.bs, prep.L, throat).cost;
}

function minFlangeMass(prep: Prepared): number {
  let m = Infinity;
  for (const f of prep.flanges) m = Math.min(m, flangeMass(f, prep.L));
  return m;
}

/** An upper bound on the self-weight per length of any candidate, kg/mm (for the demand range). */
function maxMassPerLength(prep: Prepared): number {
  const sp = prep.p.space;
  const k = 7850e-9;
  const hw = Math.max(...sp.hw);
  const tw = Math.max(...sp.tw);
  const Af = Math.max(...sp.bf) * Math.max(...sp.tf);
  const flat = sp.flats.reduce((m, f) => Math.max(m, f.b * f.t), 0);
  const minA = Math.min(...sp.panels.filter((n) => n > 0).map((n) => prep.Lmax / n), Infinity);
  const stiffPerMm = minA === Infinity ? 0 : (2 * flat * hw) / minA;
  // bearing stiffeners: at most 2 pairs per end, one per inner support, flats no larger than the flange outstand × 100 mm
  const bearing = ((bearingPairs('rigid', prep.supports) * 2 * Math.max(flat, (Math.max(...sp.bf) / 2) * 150) * hw) / prep.L) * 1.5;
  return k * (hw * tw + 2 * Af + stiffPerMm + bearing);
}

// Hot-loop helpers kept at module level (no closure per group).
function fibOk(f: FlangeOption, lim: number, tw: number, throat: number): boolean {
  return lim === Infinity || f.A <= lim || flangeOutstand({ b: f.b, t: f.t }, tw, f.fy, throat).rho < 1;
}

function plateKg(parts: WebParts, flanges: readonly FlangeOption[], ti: number, bi: number, L: number): number {
  // flanges added together first, so that swapping top and bottom gives the identical float
  return parts.webMass + parts.stiffMass + (flangeMass(flanges[ti]!, L) + flangeMass(flanges[bi]!, L));
}

/** First index of widths (ascending) whose symmetric pair of flanges reaches the force bound. */
function firstByForce(options: readonly FlangeOption[], Freq: number): number {
  let lo = 0;
  let hi = options.length;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    const f = options[mid]!;
    if (2 * f.A * f.fy >= Freq) hi = mid;
    else lo = mid + 1;
  }
  return lo;
}

/** First index of widths (ascending) whose symmetric section reaches the deflection bound on Iy. */
function firstByIy(options: readonly FlangeOption[], hw: number, tw: number, IyReq: number): number {
  let lo = 0;
  let hi = options.length;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    const f = options[mid]!;
    if (iyOfPlates(hw, tw, f.b, f.t, f.b, f.t) * (1 + 1e-9) >= IyReq) hi = mid;
    else lo = mid + 1;
  }
  return lo;
}

function byPlates(x: { ti: number; bi: number; plates: number }, y: { ti: number; bi: number; plates: number }): number {
  return x.plates - y.plates || x.ti - y.ti || x.bi - y.bi;
}
function byLbThenWeb(x: { lb: number; wi: number }, y: { lb: number; wi: number }): number {
  return x.lb - y.lb || x.wi - y.wi;
}
function byLbThenDepth(x: { lb: number; d: number }, y: { lb: number; d: number }): number {
  return x.lb - y.lb || x.d - y.d;
}
