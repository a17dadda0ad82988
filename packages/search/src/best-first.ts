import {
  assembleVerdict,
  bearingCandidates,
  bendingForSign,
  CHECK_ORDER,
  checkGirder,
  flatTorsion,
  firstFailureAmong,
  flangeOutstand,
  grossProps,
  inJudgeOrder,
  iyOfPlates,
  lightestFittingBearing,
  ltbUtilisation,
  material,
  momentEnvelopeOf,
  maxCompressionFlangeAreaFIB,
  minFlangeForceForBending,
  minIyForDeflection,
  minIyForDeflectionAt,
  iyNeedRange,
  panelsOf,
  patchBendingMelNeed,
  patchEta2s,
  prepare,
  webShearCapacityBound,
  type BearingCandidates,
  type CheckId,
  type CheckResult,
  type IyNeedRange,
  type EndPost,
  type Effects,
  type Judged,
  type Material,
  type Section,
  type SignBending,
} from '@platesmith/checks';
import { fy, STEEL_DENSITY } from '@platesmith/catalogue';
import {
  better,
  defaultBearing,
  G_ACC,
  priceCost,
  selfWeightOf,
  settle,
  type BearingFlat,
  type CandidateKey,
  type Evaluated,
  type Prepared,
  type PruneStats,
  type SliceResult,
} from './core.js';
import { ltbSetBound, type Segments } from './ltb-bound.js';
import { bearingPairs, buildSection, C2, flangeMass, webPartsWith, type WebParts } from './objective.js';
import { lastAtOrBelow, type FlangeOption, type WebConfig } from './space.js';

const KG_PER_MM3 = STEEL_DENSITY * 1e-9;

/**
 * Checks that read nothing of the intermediate stiffeners, the end post or the bearing
 * stiffeners: judged once per set of plates (web plate and flanges). With the self-weight
 * convention of selfWeightOf every stiffener layout of those plates has the same effects, so the
 * verdict of these checks is the same for all of them.
 */
const PLATE_IDS = inJudgeOrder(['deflection', 'lateral-torsional-buckling', 'bending', 'shear', 'flange-induced-buckling', 'web-flange-weld', 'classification']);
/** The other checks: judged per stiffener layout. PLATE_IDS and LAYOUT_IDS together are CHECK_ORDER. */
const LAYOUT_IDS = (() => {
  // stiffener stiffness first: cheap, and its failure is shared by every flange on the web
  const rest = inJudgeOrder(CHECK_ORDER.filter((id) => !PLATE_IDS.includes(id) && id !== 'stiffener-stiffness'));
  return ['stiffener-stiffness' as const, ...rest];
})();
/**
 * Layout checks that read the panel layout (stiffener positions, end-post type) but not the flats
 * (EN 1993-1-5 5.2–5.5 with Table 5.1, 6, 7.1, 7.2): a failure fails every flat and every number
 * of sides with the same panels and end post, on the same plates.
 */
const PANEL_ONLY: ReadonlySet<string> = new Set(['shear-buckling', 'bending-shear', 'patch-loading', 'patch-bending']);

/**
 * A failed check whose inputs are the web and its intermediate stiffeners only fails every flange
 * on that web: stiffener stiffness (EN 1993-1-5 9.3.3(3): a, hw, tw, the flats and 15εtw of web)
 * and the torsional requirement of the intermediate flats (9.2.1(8)). The torsion of the bearing
 * flats is not web-only: they are sized to fit the flanges.
 */
function failsWebOnly(c: CheckResult): boolean {
  return !c.passes && (c.id === 'stiffener-stiffness' || (c.id === 'stiffener-torsion' && c.values['stiffener'] === 'intermediate'));
}

/** One web plate (grade, hw, tw) with all its stiffener layouts and end posts in the slice. */
interface Plate {
  w: WebConfig;
  /** web indices of its layouts (consecutive) */
  layouts: Int32Array;
  /** per layout, made when first asked for (most plates never get that far): see partOf */
  parts: (WebParts | undefined)[];
  webMass: number;
  /** least (intermediate stiffeners + bearing flats) kg over the layouts, with the least bearing any sizing returns */
  minLayoutKg: number;
  /** per end post: least intermediate-stiffener kg over its layouts */
  minStiff: Map<EndPost, number>;
  panelCounts: number[];
  Mneed: number;
  IyReq: number;
  fibTop: number;
  fibBot: number;
  /** patch-loading utilisation per (top flange option, panel count) */
  patch: Float64Array | null;
  /** per top flange option: rowPatchNeed's answer (NaN until asked) */
  rowNeed: Float64Array | null;
  /** the SLS points that can govern the deflection bound for some pair of flanges on this plate (iyNeedRange; made when first asked) */
  iyPoints: Int32Array | null;
  /** per (top flange option, panel count): the least Mel,Rd the 7.2 floor lets pass (patchBendingMelNeed) */
  patchNeed: Float64Array | null;
  fit: Map<number, BearingFlat | null>;
  /** layouts in ascending order of their own kg (stiffeners and least bearing flats), per bearing floor */
  orders: Map<string, { order: Int32Array; add: Float64Array }>;
}

/** One set of plates (web plate, top and bottom flange): its layouts are judged from here. */
interface Plates {
  plate: Plate;
  ti: number;
  bi: number;
  T: FlangeOption;
  B: FlangeOption;
  d: number;
  g: number;
  fit: BearingFlat | null;
  /** Mel,Rd of the gross section (0 until needed) */
  MelRd: number;
  effects?: Effects;
  /** the results of the layout-free checks (all passed), once a layout has passed the others */
  plateResults?: Judged['results'];
  /** the section of layout 0 (the layout-free checks read its plates only) */
  section?: Section;
  order?: Int32Array;
  lbs?: number[];
  k: number;
  layoutCalls: number;
  panelDead: Set<number> | null;
  /** per panels and end post: the PANEL_ONLY results that passed on one layout (the same on every flat and side) */
  panelPassed?: Map<number, Map<CheckId, CheckResult>>;
}

/**
 * The state of a mono-symmetric run's enumeration (see gridOf). Rows: top options, columns:
 * bottom options, indices within their groups (widths ascending, so masses ascending).
 */
interface Grid {
  nt: number;
  nb: number;
  /** global index of each group's first option */
  t0: number;
  b0: number;
  /** flange masses, kg */
  mT: Float64Array;
  mB: Float64Array;
  /** per column: 0 not judged yet, 1 live, 2 + reason when ruled out (GRID_OUT) */
  col: Int8Array;
  /** the next row to take up (rows are taken up in order, when the merge reaches their lightest pair) */
  nextRow: number;
  /**
   * per row: the column before which the LTB set bound has shown every pair failing (0: not asked
   * yet), or −1 once a stretch of it was not all dead (its pairs are then bounded one by one)
   */
  rowLtb: Int16Array;
  /** per row: how many stretches the LTB set bound has been asked for (each is twice the last) */
  rowChunks: Uint8Array;
  /** per row: the least Mel,Rd any panel count's 7.2 floor lets pass (0: none needed) */
  rowMel: number[];
  /** the Iy every pair of the run needs (the deflection bounds that do not read the pair's own self-weight), 0 none */
  iyNeed: number;
  /** the merge's heap: row, column and the pair's mass */
  ha: number[];
  hb: number[];
  hk: number[];
  hn: number;
  /** pairs taken from the merge */
  yielded: number;
  /** pairs ruled out without being taken, by reason (GRID_OUT) */
  out: Float64Array;
  /** the first column any row can use (the bending and deflection bounds with the widest row) */
  col0: number;
}

/**
 * n zeros as a plain array of doubles: on the JS heap with the object that holds it. A typed array
 * above 64 bytes keeps its data in a separate buffer, one more allocation for the collector to
 * track and one more cache miss each time a run comes back from the heap (the merge's arrays were
 * the first-touch hot spots of the mono-symmetric search).
 */
function doubles(n: number): number[] {
  // allocated at its length once (a push loop regrew it several times); filled with a double
  // first so that its elements are stored as doubles from the start
  return new Array<number>(n).fill(0.5).fill(0);
}

/**
 * How far (relative) a mono-symmetric run's floor may pass the heap's least before the run goes
 * back to the heap: measured on the mono-symmetric bench problem (single-threaded, CPU time,
 * medians of 3 alternating runs): 0 → 7.4 s, 0.02 → 6.8 s, 0.05 → 7.4 s, 0.1 → 8.3 s; the
 * candidates judged in full did not change (1 328).
 */
const GRID_SLACK = 0.02;
/**
 * The columns of a mono-symmetric row the LTB set bound takes first (then twice as many each
 * time the merge reaches past them).
 */
const ROW_STRETCH = 4;
/**
 * The same for the layouts of a set of plates. Each layout taken early may be judged where a
 * feasible point found later would have dropped it: on the same problem 0 → 7.3 s with 1 328
 * judged in full, 0.002 → 7.0 s (1 404), 0.01 → 6.8 s (1 634), 0.03 → 6.9 s (2 007).
 */
const LAYOUT_SLACK = 0.01;

/** Why a grid's pairs were ruled out without being taken (Grid.out). */
const enum GRID_OUT {
  FIB = 0,
  PATCH = 1,
  LTB = 2,
  BENDING = 3,
  DEFLECTION = 4,
  PATCH_BENDING = 5,
}

interface Pairs {
  ti: Int32Array;
  bi: Int32Array;
  kg: Float64Array;
}

type Node =
  | {
      kind: 0;
      lb: number;
      seq: number;
      plate: Plate;
      pairs: Pairs;
      k: number;
      d: number;
      Freq: number;
      fibT: number;
      fibB: number;
      gt: number;
      gb: number;
      /** per flange option of its group fixed on one side: 0 unknown, 1 every pair of the run with it fails LTB, 2 not shown (ltbSetBound) */
      ltbTop?: Int8Array;
      ltbBot?: Int8Array;
      /** the LTB segments' bounds over the self-weights of every pair of the run, per compressed flange */
      segsTop?: Segments;
      segsBot?: Segments;
      /** the run's section the LTB stretch bounds set widths on, and its material (one per run: thicknesses and grades are the run's) */
      ltbSec?: { sec: Section; m: Material };
      /** symmetric runs: how many pairs the next LTB block bound tries to drop at once (0: no more tries) */
      block?: number;
      /** mono-symmetric runs: the enumeration over live top and bottom options (made when first popped) */
      grid?: Grid;
      /** the deflection bound's Iy over the run's self-weights (iyRangeOf) */
      iyRange?: IyNeedRange;
      /** popped before (the run-level bounds were asked at its first pop) */
      opened: boolean;
    }
  | { kind: 1; lb: number; seq: number; ps: Plates }
  | { kind: 2; lb: number; seq: number; ps: Plates };

/**
 * A binary min-heap on (lb, seq). The keys live in typed arrays beside the nodes: the comparisons
 * of a large heap (10^5 nodes and more on mono-symmetric spaces) then read contiguous memory
 * instead of one scattered node object each.
 */
class Heap {
  private lbs = new Float64Array(1024);
  private seqs = new Float64Array(1024);
  private nodes: (Node | undefined)[] = [];
  private n = 0;
  get size(): number {
    return this.n;
  }
  peekLb(): number {
    return this.n > 0 ? this.lbs[0]! : Infinity;
  }
  push(nd: Node): void {
    if (this.n === this.lbs.length) {
      const grow = (a: Float64Array) => {
        const b = new Float64Array(a.length * 2);
        b.set(a);
        return b;
      };
      this.lbs = grow(this.lbs);
      this.seqs = grow(this.seqs);
    }
    const { lbs, seqs, nodes } = this;
    const lb = nd.lb;
    const sq = nd.seq;
    let i = this.n++;
    while (i > 0) {
      const p = (i - 1) >> 1;
      const pl = lbs[p]!;
      if (!(lb < pl || (lb === pl && sq < seqs[p]!))) break;
      lbs[i] = pl;
      seqs[i] = seqs[p]!;
      nodes[i] = nodes[p]!;
      i = p;
    }
    lbs[i] = lb;
    seqs[i] = sq;
    nodes[i] = nd;
  }
  pop(): Node | undefined {
    if (this.n === 0) return undefined;
    const { lbs, seqs, nodes } = this;
    const top = nodes[0]!;
    const n = --this.n;
    if (n > 0) {
      const lb = lbs[n]!;
      const sq = seqs[n]!;
      const nd = nodes[n]!;
      let i = 0;
      for (;;) {
        const l = 2 * i + 1;
        if (l >= n) break;
        const r = l + 1;
        let m = l;
        if (r < n && (lbs[r]! < lbs[l]! || (lbs[r] === lbs[l] && seqs[r]! < seqs[l]!))) m = r;
        const ml = lbs[m]!;
        if (!(ml < lb || (ml === lb && seqs[m]! < sq))) break;
        lbs[i] = ml;
        seqs[i] = seqs[m]!;
        nodes[i] = nodes[m]!;
        i = m;
      }
      lbs[i] = lb;
      seqs[i] = sq;
      nodes[i] = nd;
    }
    // the slot past the end lets go of its node (the array keeps its length for the next push)
    nodes[n] = undefined;
    return top;
  }
}

interface Miss {
  key: CandidateKey;
  section: Section;
  depth: number;
  g: number;
  lb: number;
}

/**
 * A value below which no feasible candidate of `slice` lies, known from elsewhere (other workers'
 * feasible points): `bestAt(d)` is a value some feasible candidate at depth ≤ d has. Used for
 * strict pruning only (lb > bestAt(d)), so sharing it never changes the answer.
 */
export interface OuterBound {
  bestAt(d: number): number;
  offer(d: number, value: number): void;
}

/**
 * A share of a slice's runs (one web plate, one thickness and grade per flange): the runs whose
 * unitSlot is `slot` of `of`. Workers given the same web plates and different slots divide the
 * work finely — a fixed pseudo-random deal of runs rather than of plates, so that each has about
 * its share of the runs near the front at every bound (plates dealt in order give one worker
 * every other web thickness, and with them most of the light sections).
 */
export interface SlicePart {
  slot: number;
  of: number;
}

/** The slot of the run (plate whose first web index is `wi`, flange groups gt, gb) among `of`: a fixed integer hash. */
export function unitSlot(wi: number, gt: number, gb: number, of: number): number {
  let h = Math.imul(wi, 0x9e3779b1) ^ Math.imul(gt + 1, 0x85ebca77) ^ Math.imul(gb + 1, 0xc2b2ae3d);
  h ^= h >>> 16;
  h = Math.imul(h, 0x7feb352d);
  h ^= h >>> 15;
  h = Math.imul(h, 0x846ca68b);
  h ^= h >>> 16;
  return (h >>> 0) % of;
}

/**
 * Exact search over the web configurations of `runs` (runs of consecutive indices of prep.webs:
 * a slice): the Pareto set of overall depth against the objective, for that slice. A run may hold
 * several web plates or part of one; the parts of one plate in different runs are searched apart
 * (the same answer, less sharing).
 *
 * Best first: every candidate belongs to a node whose lower bound on the objective is known — a
 * run of flange pairs on one web plate (ascending plate mass), one set of plates, or the stiffener
 * layouts of one set of plates (ascending lower bound) — and the node of least bound is expanded
 * next. A node is dropped when the staircase of feasible points already found has, at its depth or
 * shallower, a value its bound cannot beat: nothing in it is on the Pareto set. The checks that do
 * not read the stiffener layout are judged once per set of plates; the rest once per layout, with
 * failures that only depend on the panels, or only on the web and its stiffeners, shared.
 * Bounds from the check library (shear, bending, flange-induced buckling, deflection, patch
 * loading) exclude candidates that every passing section would satisfy.
 */
export function searchSlice(prep: Prepared, runs: readonly (readonly [first: number, count: number])[], signal?: { aborted: boolean }, outer?: OuterBound, part?: SlicePart): SliceResult {
  const { p, webs, groups, flanges, groupStart, plateStarts, L, Lmax, supports } = prep;
  const o = p.options;
  const sp = p.space;
  const pruned: PruneStats = { depth: 0, rules: 0, shear: 0, bending: 0, flangeInducedBuckling: 0, deflection: 0, patchLoading: 0, patchBending: 0, lateralTorsional: 0, bearing: 0, sameFlanges: 0, webOnly: 0, incumbent: 0 };
  let fullEvaluations = 0;
  let spaceSize = 0;
  const minThroat = Math.min(...o.weldThroats);
  // the throat settle() falls back on, as the brute-force reference passes it
  const throat0 = o.weldThroats[0]!;
  const failedBy: Record<string, number> = {};
  const isMass = p.objective === 'mass';

  // staircase of feasible points found so far: depth ascending, value strictly descending
  const stairs: Evaluated[] = [];
  // values fall strictly as depths rise, so of the points at depth ≤ d only the deepest can prune
  const prunes = (d: number, lb: number): boolean => {
    let lo = 0;
    let hi = stairs.length;
    while (lo < hi) {
      const mid = (lo + hi) >> 1;
      if (stairs[mid]!.depth <= d) lo = mid + 1;
      else hi = mid;
    }
    if (lo > 0) {
      const s = stairs[lo - 1]!;
      if (s.value < lb || (s.value === lb && s.depth < d)) return true;
    }
    return outer !== undefined && outer.bestAt(d) < lb;
  };
  const admit = (e: Evaluated): void => {
    outer?.offer(e.depth, e.value);
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

  // the objective's floor for a candidate of at least `kg` (exact for mass; for cost see costFloor)
  const cm = p.cost;
  const gradeMin = Math.min(...[...sp.webGrades, ...sp.flangeGrades].map((g) => cm.gradeFactor[g]));
  const rateMin = cm.km * gradeMin * Math.min(1, cm.thickFactor);
  const weldFloorMin = 1.3 * C2[cm.flangeWeld] * minThroat * minThroat * 4 * L;
  const paint = cm.painted ? cm.thetaSp * 3e-6 + cm.thetaP * (3e-6 + 4.15e-6) : 0;
  /**
   * A lower bound on the Farkas–Jármai cost of any candidate of at least `kg` whose painted surface
   * is at least `As` (mm²): every rate at its least, κ ≥ 3 parts, the flange welds at the least
   * throat, no stiffener welds (each term of costOf is non-decreasing in what is dropped).
   */
  const floorOf = (kg0: number, As: number): number => {
    // summed in another order than the exact value: lowered by a hair so that it is never above it
    const kg = kg0 * (1 - 1e-12);
    return isMass ? kg : rateMin * kg + cm.kfOverKm * cm.km * (cm.thetaD * Math.sqrt(3 * kg) + weldFloorMin + paint * As);
  };

  const tfSorted = [...new Set(groups.map((g) => g.t))].sort((x, y) => x - y);
  const tfMin = tfSorted[0] ?? 0;
  const tfMax = tfSorted[tfSorted.length - 1] ?? 0;
  const gMax = maxMassPerLength(prep) * G_ACC;
  const nFlange = flanges.length;
  const kFibMax = o.kFib === 'auto' ? 0.55 : o.kFib;
  let lightestFlange = Infinity;
  for (const f of flanges) lightestFlange = Math.min(lightestFlange, flangeMass(f, L));
  const fyfMax = Math.max(...groups.map((g) => g.fy));
  let minStockBearing = Infinity;
  for (const f of o.bearingFlats) minStockBearing = Math.min(minStockBearing, f.b * f.t);
  let minFlatArea = Infinity;
  for (const f of sp.flats) minFlatArea = Math.min(minFlatArea, f.b * f.t);
  /** the least bearing-flat area (mm²) the sizing can return on a web of thickness tw (a stock flat, or a default of resolveBearing) */
  const bearingAreaFloor = (tw: number): number => {
    let a = Math.min(minStockBearing, 40 * tw);
    for (const f of sp.flats) a = Math.min(a, f.b * Math.max(f.t, tw));
    return a;
  };
  const bearingFlatCount = (ep: EndPost): number => bearingPairs(ep, supports) * 2;
  const flangeForce = (w: WebConfig, MEd: number, hMax: number, tfTop: number, fyf: number) =>
    minFlangeForceForBending({ hw: w.hw, tw: w.tw, fyw: w.fyw, MEd, gammaM0: o.factors.gammaM0, hMax, symmetric: sp.symmetric, tfMax: tfTop, fyfMax: fyf });

  // stiffener counts and web panels per number of panels (the same on every web)
  const stiffCount = new Map<number, number>();
  const panelsByCount = new Map<number, { x0: number; x1: number; a: number }[]>();
  const panelSlots = new Map<number, number>();
  for (const n of new Set(sp.panels)) panelSlots.set(n, panelSlots.size);
  // the slot of a panel count, by array (panel counts are small non-negative integers)
  const slotOf = new Int32Array(Math.max(0, ...sp.panels) + 1).fill(-1);
  for (const [n, k] of panelSlots) slotOf[n] = k;
  for (const n of new Set(sp.panels)) {
    const r = panelsOf(supports, n > 0 ? Lmax / n : null);
    stiffCount.set(n, n > 0 ? r.stiffenerXs.length : 0);
    panelsByCount.set(n, r.panels);
  }

  // web plates of the slice: [first web index, count] each (a plate's layouts are consecutive in
  // webConfigs' order; runs are cut where plates start)
  const byPlate: [number, number][] = [];
  for (const [a, c] of runs) {
    // the plate holding index a: the last start ≤ a
    const lo = lastAtOrBelow(plateStarts, a);
    let x = a;
    const end = a + c;
    for (let k = lo; x < end && k + 1 < plateStarts.length; k++) {
      const upto = Math.min(end, plateStarts[k + 1]!);
      if (upto > x) {
        const last = byPlate[byPlate.length - 1];
        // a run that continues the previous one within the same plate joins it
        if (last && last[0] + last[1] === x && x !== plateStarts[k]) last[1] += upto - x;
        else byPlate.push([x, upto - x]);
      }
      x = upto;
    }
  }
  // demand bounds valid for every candidate of the slice: self-weight from the lightest web plate
  // and the two lightest flanges up to the heaviest conceivable girder
  let lightestWebKg = Infinity;
  for (const [wi] of byPlate) {
    const w = webs.at(wi);
    lightestWebKg = Math.min(lightestWebKg, w.hw * w.tw * L * KG_PER_MM3);
  }
  const gLoAll = ((lightestWebKg + 2 * lightestFlange) * G_ACC) / L;
  const dem = p.load.demandLowerBound(gLoAll, gMax);
  const deflFloor = p.load.deflectionFloor(gLoAll, gMax);
  // concentrated forces do not depend on the self-weight: the patch-loading bound is exact here
  const forces = p.load.effects(gLoAll).forces;
  const sagAtForces = forces.length && p.load.sagFloorAt ? p.load.sagFloorAt(forces.map((f) => f.x), gLoAll, gMax) : [];
  const anySag = sagAtForces.some((m) => m > 0);
  const Mneed = Math.max(dem.Msag, dem.Mhog);

  const heap = new Heap();
  const webDead = new Set<number>();
  // per grade, per flat (the stock's objects, shared by every configuration that uses them)
  const torsionFails = new Map<string, Map<object, boolean>>();
  let seq = 0;
  const pairCache = new Map<number, Pairs>();
  const pairsOf = (gt: number, gb: number): Pairs => {
    const key = gt * groups.length + gb;
    let hit = pairCache.get(key);
    if (!hit) {
      const t0 = groupStart[gt]!;
      const b0 = groupStart[gb]!;
      const nt = groups[gt]!.options.length;
      const nb = groups[gb]!.options.length;
      const list: { ti: number; bi: number; kg: number }[] = [];
      if (sp.symmetric) for (let i = 0; i < nt; i++) list.push({ ti: t0 + i, bi: t0 + i, kg: flangeMass(flanges[t0 + i]!, L) + flangeMass(flanges[t0 + i]!, L) });
      else for (let i = 0; i < nt; i++) for (let j = 0; j < nb; j++) list.push({ ti: t0 + i, bi: b0 + j, kg: flangeMass(flanges[t0 + i]!, L) + flangeMass(flanges[b0 + j]!, L) });
      list.sort((x, y) => x.kg - y.kg || x.ti - y.ti || x.bi - y.bi);
      hit = { ti: Int32Array.from(list, (x) => x.ti), bi: Int32Array.from(list, (x) => x.bi), kg: Float64Array.from(list, (x) => x.kg) };
      pairCache.set(key, hit);
    }
    return hit;
  };
  const groupPairs = sp.symmetric ? groups.map((_, i) => [i, i] as const) : groups.flatMap((_, i) => groups.map((__, j) => [i, j] as const));
  const pairsPerWeb = sp.symmetric ? nFlange : nFlange * nFlange;

  const groupSize = (gt: number, gb: number): number => (sp.symmetric ? groups[gt]!.options.length : groups[gt]!.options.length * groups[gb]!.options.length);
  /**
   * Per end post the least intermediate-stiffener kg per mm of web depth over layouts first … first+nL−1
   * (count × sides × b × t, as webPartsWith computes the kg before × hw × density), and their panel
   * counts, most first. Whole plates with the same flat filter list the same layouts: once per pattern.
   */
  const patterns = new Map<string, { rigid: number; nonRigid: number; panelCounts: number[] }>();
  const patternOf = (first: number, nL: number, tw: number) => {
    const whole = first === plateStarts[lastAtOrBelow(plateStarts, first)] && nL === plateLength(plateStarts, first);
    const key = whole ? `${nL}|${sp.rules.stiffenerAtLeastWeb ? tw : ''}` : '';
    let hit = whole ? patterns.get(key) : undefined;
    if (!hit) {
      let rigid = Infinity;
      let nonRigid = Infinity;
      const counts = new Set<number>();
      for (let wi = first; wi < first + nL; wi++) {
        const lw = webs.at(wi);
        const m = lw.panels === 0 || !lw.flat ? 0 : (stiffCount.get(lw.panels) ?? 0) * lw.sides * lw.flat.b * lw.flat.t;
        if (lw.endPost === 'rigid') rigid = Math.min(rigid, m);
        else nonRigid = Math.min(nonRigid, m);
        counts.add(lw.panels);
      }
      hit = { rigid, nonRigid, panelCounts: [...counts].sort((x, y) => y - x) };
      if (whole) patterns.set(key, hit);
    }
    return hit;
  };
  for (const [first, nL] of byPlate) {
    const w = webs.at(first);
    // this slice's runs of the plate (all of them unless the plate is shared out by SlicePart)
    const own = part ? groupPairs.filter(([gt, gb]) => unitSlot(first, gt, gb, part.of) === part.slot) : groupPairs;
    if (own.length === 0) continue;
    let total = pairsPerWeb * nL;
    if (part) {
      total = 0;
      for (const [gt, gb] of own) total += groupSize(gt, gb) * nL;
    }
    spaceSize += total;
    if (w.hw + 2 * tfMin > sp.maxDepth) {
      pruned.depth += total;
      continue;
    }
    if (webShearCapacityBound(w.hw, w.tw, w.fyw, o.eta, o.factors.gammaM0, o.factors.gammaM1) < dem.V) {
      pruned.shear += total;
      continue;
    }
    const IyReq = minIyForDeflection(deflFloor, w.hw * w.tw, o.E, o.G);
    if (IyReq === Infinity) {
      pruned.deflection += total;
      continue;
    }
    // the least intermediate-stiffener kg per end post, as webPartsWith computes it (an integer product, then × hw × density)
    const pat = patternOf(first, nL, w.tw);
    const minStiff = new Map<EndPost, number>();
    if (pat.rigid < Infinity) minStiff.set('rigid', pat.rigid * w.hw * KG_PER_MM3);
    if (pat.nonRigid < Infinity) minStiff.set('non-rigid', pat.nonRigid * w.hw * KG_PER_MM3);
    const layouts = new Int32Array(nL);
    for (let j = 0; j < nL; j++) layouts[j] = first + j;
    const aFloor = bearingAreaFloor(w.tw);
    let minLayoutKg = Infinity;
    for (const [ep, s] of minStiff) minLayoutKg = Math.min(minLayoutKg, s + bearingFlatCount(ep) * aFloor * w.hw * KG_PER_MM3);
    const fib = (always: boolean) => (always ? maxCompressionFlangeAreaFIB({ hw: w.hw, tw: w.tw, fyfMin: 1, k: kFibMax, E: o.E }) : Infinity);
    const plate: Plate = {
      w,
      layouts,
      parts: [],
      webMass: w.hw * w.tw * L * KG_PER_MM3,
      minLayoutKg,
      minStiff,
      // most panels first: the patch resistance grows as the panels shorten, so one passes soonest
      panelCounts: pat.panelCounts,
      Mneed,
      IyReq,
      fibTop: fib(dem.sagAlways),
      fibBot: fib(dem.hogAlways),
      patch: null,
      patchNeed: null,
      iyPoints: null,
      rowNeed: null,
      fit: new Map(),
      orders: new Map(),
    };
    for (const [gt, gb] of own) {
      const GT = groups[gt]!;
      const GB = groups[gb]!;
      const nPairs = (sp.symmetric ? GT.options.length : GT.options.length * GB.options.length) * nL;
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
      const pairs = pairsOf(gt, gb);
      let k = 0;
      if (sp.symmetric) {
        // widths ascending: area, force and Iy all grow with the width, so the options below the
        // bending and deflection bounds are a prefix, found by bisection
        const iB = firstByForce(GT.options, Freq);
        const iD = IyReq > 0 ? firstByIy(GT.options, w.hw, w.tw, IyReq) : 0;
        pruned.bending += Math.min(iB, pairs.kg.length) * nL;
        pruned.deflection += Math.max(0, Math.min(iD, pairs.kg.length) - Math.min(iB, pairs.kg.length)) * nL;
        k = Math.min(Math.max(iB, iD), pairs.kg.length);
      }
      if (k >= pairs.kg.length) continue;
      // flange area: at least the lightest remaining pair, and at least what the bending bound needs
      const kgFloor = Math.max(pairs.kg[k]!, ((Freq / Math.max(GT.fy, GB.fy)) * L * KG_PER_MM3));
      const lb = floorOf(plate.webMass + kgFloor + minLayoutKg, 0);
      const fibT = plate.fibTop === Infinity ? Infinity : plate.fibTop / (GT.fy * GT.fy);
      const fibB = plate.fibBot === Infinity ? Infinity : plate.fibBot / (GB.fy * GB.fy);
      // every field from the start: one object shape for all runs (the heap reads many of them)
      heap.push({ kind: 0, lb, seq: seq++, plate, pairs, k, d, Freq, fibT, fibB, gt, gb, ltbTop: undefined, ltbBot: undefined, segsTop: undefined, segsBot: undefined, ltbSec: undefined, block: undefined, grid: undefined, iyRange: undefined, opened: false });
    }
  }

  /** The quantities of layout j of a plate, made when first asked for. */
  const partOf = (plate: Plate, j: number): WebParts => {
    let hit = plate.parts[j];
    if (!hit) {
      const w = webs.at(plate.layouts[j]!);
      hit = webPartsWith(w, L, stiffCount.get(w.panels) ?? 0, Lmax);
      plate.parts[j] = hit;
    }
    return hit;
  };
  /** The torsional requirement of intermediate flats (EN 1993-1-5 9.2.1(8)) reads the flat alone: once per flat. */
  const flatFailsTorsion = (w: WebConfig): boolean => {
    if (!w.flat || w.panels === 0) return false;
    let byFlat = torsionFails.get(w.grade);
    if (!byFlat) torsionFails.set(w.grade, (byFlat = new Map()));
    let fails = byFlat.get(w.flat);
    if (fails === undefined) {
      const t = flatTorsion(w.flat.b, w.flat.t, fy(w.grade, w.flat.t, prep.fySource), o.E);
      fails = t.limit / t.ItOverIp > 1 + 1e-9;
      byFlat.set(w.flat, fails);
    }
    return fails;
  };
  /**
   * Patch loading on a plate under top flange option ti with n panels: the largest η2 (6.4, exact),
   * and the least Mel,Rd with which the 7.2 floor passes (patchBendingMelNeed; a table per plate,
   * NaN until computed).
   */
  const patchTables = (plate: Plate, ti: number, n: number): number => {
    const slots = panelSlots.size;
    const table = (plate.patch ??= new Float64Array(nFlange * slots).fill(Number.NaN));
    const need = (plate.patchNeed ??= new Float64Array(nFlange * slots));
    const key = ti * slots + slotOf[n]!;
    if (Number.isNaN(table[key]!)) {
      const etas = patchEta2s(forces, plate.w, flanges[ti]!, panelsByCount.get(n)!, o.E, o.factors.gammaM1);
      let u = 0;
      for (const e of etas) u = Math.max(u, e);
      table[key] = u;
      need[key] = anySag ? patchBendingMelNeed(etas, sagAtForces, 1 + 1e-9) : 0;
    }
    return key;
  };
  const patchOf = (plate: Plate, ti: number, n: number): number => {
    const key = patchTables(plate, ti, n);
    return plate.patch![key]!;
  };
  /** Mel,Rd of the plates' gross section: grossProps(·).Mel of the same three rectangles at the plates' own fy, over γM0 (to round-off). */
  const melRdOf = (ps: Plates): number => {
    if (ps.MelRd === 0) ps.MelRd = melRd(ps.plate.w, ps.T, ps.B);
    return ps.MelRd;
  };
  const melRd = (w: WebConfig, T: FlangeOption, B: FlangeOption): number => plateStackMel(w, T, B) / o.factors.gammaM0;
  /** Whether a panel count passes the patch-loading bounds on these plates: 6.4 and the 7.2 floor (from the plate's tables). */
  const panelOk = (ps: Plates, np: number): boolean => {
    if (forces.length === 0) return true;
    // the plate's tables hold the per-flange work; only Mel,Rd is the pair's own (kept on it)
    const key = patchTables(ps.plate, ps.ti, np);
    if (!(ps.plate.patch![key]! <= 1 + 1e-9)) return false;
    // the 7.2 floor: Mel,Rd at least its need (a hair of margin: only a clear failure drops it)
    const need = ps.plate.patchNeed![key]!;
    return !(need > 0) || melRdOf(ps) >= need * (1 - 1e-9);
  };

  /** per stiffener grade: the bearing flats the sizing can accept (torsion, crushing under a reaction) */
  const bearingByGrade = new Map<string, BearingCandidates>();
  const bearingOf = (grade: WebConfig['grade']): BearingCandidates => {
    let hit = bearingByGrade.get(grade);
    if (!hit) {
      hit = bearingCandidates(o.bearingFlats, (t) => fy(grade, t, prep.fySource), o);
      bearingByGrade.set(grade, hit);
    }
    return hit;
  };
  /**
   * The bearing floor of a set of plates under a largest support reaction R: null when no stock
   * flat fits the flanges (the sizing keeps the section's default), 'none' when flats fit but
   * none of them can pass (every layout of these plates fails), else the lightest that can.
   */
  const bearingFloorFor = (plate: Plate, minB: number, R: number): BearingFlat | null | 'none' => {
    if (!fitOf(plate, minB)) return null;
    const f = bearingOf(plate.w.grade).lightestFor(minB, plate.w.tw, R);
    return f ? { bs: f.b, ts: f.t } : 'none';
  };
  const fitOf = (plate: Plate, minB: number): BearingFlat | null => {
    let hit = plate.fit.get(minB);
    if (hit === undefined) {
      const f = lightestFittingBearing(o.bearingFlats, minB, plate.w.tw);
      hit = f ? { bs: f.b, ts: f.t } : null;
      plate.fit.set(minB, hit);
    }
    return hit;
  };
  /** the least bearing flats a layout's sizing can return: the plates' bearing floor (bearingFloorFor), or the section's default when no stock flat fits */
  const bearingFloorOf = (ps: Plates, j: number): BearingFlat => {
    if (ps.fit) return ps.fit;
    const w = webs.at(ps.plate.layouts[j]!);
    return defaultBearing(prep, buildSection(w, partOf(ps.plate, j), ps.T, ps.B));
  };
  const surfaceOf = (w: WebConfig, T: FlangeOption, B: FlangeOption): number => L * (T.b + (T.b - w.tw) + 2 * T.t + B.b + (B.b - w.tw) + 2 * B.t + 2 * w.hw);

  const ltbSet = p.load.momentEnvelopeRange ? ltbSetBound(o) : undefined;
  // a sign of moment that no self-weight of the space produces needs no bound (no segment to bound)
  const signPresent = { top: true, bot: true };
  if (ltbSet) {
    const all = p.load.momentEnvelopeRange!(0, gMax);
    signPresent.top = all.sagHi.some((m) => m > 1);
    signPresent.bot = all.hogHi.some((m) => m > 1);
  }
  /**
   * Whether every pair of run c with flange option `fixed` on the top (or the bottom) fails
   * lateral-torsional buckling, whatever the other flange of its group
   * (widths ascending): ltbSetBound over those options, at the self-weights they give. Once per
   * option and run (the columns of a mono-symmetric grid ask it; its rows ask ltbStretchDead).
   */
  const ltbDeadWith = (c: Extract<Node, { kind: 0 }>, top: boolean, fixed: number): boolean => {
    if (!boundsSide(top)) return false;
    const own = top ? c.gt : c.gb;
    const memo = top ? (c.ltbTop ??= new Int8Array(groups[own]!.options.length)) : (c.ltbBot ??= new Int8Array(groups[own]!.options.length));
    const slot = fixed - groupStart[own]!;
    let known = memo[slot]!;
    if (known === 0) {
      const other = top ? c.gb : c.gt;
      const group = groups[other]!;
      const w = c.plate.w;
      const F = flanges[fixed]!;
      const segs = runSegments(c, top);
      const part = partOf(c.plate, 0);
      const widest = group.options[group.options.length - 1]!;
      const section = top ? buildSection(w, part, F, widest) : buildSection(w, part, widest, F);
      // widest first: as a rule the strongest, so a set that is not all dead is shown so soonest
      const u = ltbSet!.over(segs, section, top, widthsDown(other), 1 + 1e-6);
      // a bound: only a clear failure drops the set (the margin covers round-off)
      known = u > 1 + 1e-6 ? 1 : 2;
      memo[slot] = known;
    }
    return known === 1;
  };
  /** ltbDeadWith over the other flange's options from … to−1 only (not kept: each stretch is asked once), where boundsSide(top) */
  const ltbStretchDead = (c: Extract<Node, { kind: 0 }>, top: boolean, fixed: number, from: number, to: number): boolean => {
    const gi = top ? c.gb : c.gt;
    const n = groups[gi]!.options.length;
    const t = (c.ltbSec ??= ltbSecOf(c));
    (top ? t.sec.top : t.sec.bot).b = flanges[fixed]!.b;
    // widest first, as in ltbDeadWith: widthsDown holds option n−1−k at k
    return ltbSet!.overWidths(runSegments(c, top), t.sec, t.m, top, widthsDown(gi), n - to, n - from, 1 + 1e-6) > 1 + 1e-6;
  };
  const ltbSecOf = (c: Extract<Node, { kind: 0 }>): { sec: Section; m: Material } => {
    const sec = buildSection(c.plate.w, partOf(c.plate, 0), groups[c.gt]!.options[0]!, groups[c.gb]!.options[0]!);
    return { sec, m: material(sec, o) };
  };
  /** Whether the set bound shows pair (T, B) of run c failing LTB (either sign). */
  const ltbPairDead = (c: Extract<Node, { kind: 0 }>, T: FlangeOption, B: FlangeOption): boolean => {
    const section = buildSection(c.plate.w, partOf(c.plate, 0), T, B);
    for (const top of [true, false]) {
      if (!boundsSide(top)) continue;
      if (ltbSet!.over(runSegments(c, top), section, top, [top ? B.b : T.b], 1 + 1e-6) > 1 + 1e-6) return true;
    }
    return false;
  };
  /** a group's widths, widest first (options are widths ascending) */
  const widthsDownOf: Float64Array[] = [];
  const widthsDown = (gi: number): Float64Array => (widthsDownOf[gi] ??= Float64Array.from(groups[gi]!.options, (f) => f.b).reverse());


  /** Whether the set bound can bite with this flange in compression (a segment to bound, a moment of that sign). */
  const boundsSide = (top: boolean): boolean => ltbSet!.bounds(top) && signPresent[top ? 'top' : 'bot'];
  /** The least and greatest self-weight of the run's pairs (the self-weight grows with each flange's area). */
  const runSelfWeights = (c: Extract<Node, { kind: 0 }>): readonly [number, number] => {
    const w = c.plate.w;
    const byArea = (os: readonly FlangeOption[]) => [os.reduce((a, b) => (b.A < a.A ? b : a)), os.reduce((a, b) => (b.A > a.A ? b : a))] as const;
    const [tLo, tHi] = byArea(groups[c.gt]!.options);
    const [bLo, bHi] = byArea(groups[c.gb]!.options);
    return [selfWeightOf(prep, w, tLo, bLo), selfWeightOf(prep, w, tHi, bHi)];
  };
  /**
   * The run's LTB segment bounds for one compressed flange, once per run: one envelope range for
   * all its pairs (the self-weight grows with each flange's area, so the lightest and heaviest
   * options of the two groups bound every pair's).
   */
  const runSegments = (c: Extract<Node, { kind: 0 }>, top: boolean): Segments => {
    let segs = top ? c.segsTop : c.segsBot;
    if (!segs) {
      const range = p.load.momentEnvelopeRange!(...runSelfWeights(c));
      segs = ltbSet!.segments(range, top);
      if (top) c.segsTop = segs;
      else c.segsBot = segs;
    }
    return segs;
  };
  /** Whether pairs k … k+m−1 of run c all fail LTB (ltbSetBound over their sections, either sign). */
  const ltbBlockDead = (c: Extract<Node, { kind: 0 }>, k: number, m: number): boolean => {
    const part = partOf(c.plate, 0);
    const secs: Section[] = [];
    for (let j = k; j < k + m; j++) secs.push(buildSection(c.plate.w, part, flanges[c.pairs.ti[j]!]!, flanges[c.pairs.bi[j]!]!));
    for (const top of [true, false]) {
      if (!boundsSide(top)) continue;
      if (ltbSet!.overSections(runSegments(c, top), secs) > 1 + 1e-6) return true;
    }
    return false;
  };

  /** Next flange pairs of a run: cheap bounds, then a node for the first set of plates they leave. */
  const advancePairs = (c: Extract<Node, { kind: 0 }>): void => {
    if (!sp.symmetric) {
      advanceGrid(c);
      return;
    }
    const { plate, pairs, d } = c;
    const nL = plate.layouts.length;
    const n = pairs.kg.length;
    while (c.k < n) {
      const kg = plate.webMass + pairs.kg[c.k]!;
      const floor = floorOf(kg + plate.minLayoutKg, 0);
      if (prunes(d, floor)) {
        pruned.incumbent += (n - c.k) * nL;
        return;
      }
      if (floor > heap.peekLb()) {
        c.lb = floor;
        heap.push(c);
        return;
      }
      // a block of the next (lightest) pairs that all fail LTB is dropped at once
      if (ltbSet && c.block !== 0) {
        const m = Math.min(c.block ?? 1, n - c.k);
        if (ltbBlockDead(c, c.k, m)) {
          pruned.lateralTorsional += m * nL;
          c.k += m;
          c.block = Math.min(32, 2 * m);
          continue;
        }
        // heavier pairs resist LTB better as a rule: after a block that is not all dead, one pair
        // at a time; once a single pair is not shown dead, no more tries on this run
        c.block = m > 1 ? 1 : 0;
      }
      const ti = pairs.ti[c.k]!;
      const bi = pairs.bi[c.k]!;
      c.k++;
      if (flangeFails(c, flanges[ti]!, c.fibT) || flangeFails(c, flanges[bi]!, c.fibB)) {
        pruned.flangeInducedBuckling += nL;
        continue;
      }
      tryPair(c, ti, bi, kg);
    }
  };

  /** The Iy the deflection bound asks over the run's self-weights, and the SLS points that can govern there (iyNeedRange). Once per run. */
  const iyRangeOf = (c: Extract<Node, { kind: 0 }>, da: NonNullable<typeof p.load.deflectionAffine>): IyNeedRange => {
    if (c.iyRange) return c.iyRange;
    const w = c.plate.w;
    // the points that can govern anywhere on the plate (its lightest to its heaviest pair of
    // flanges), once per plate; a run's range lies within, so those points give its exact answer
    const plate = c.plate;
    if (!plate.iyPoints) {
      const gLo = selfWeightOf(prep, w, lightestOption, lightestOption);
      const gHi = selfWeightOf(prep, w, heaviestOption, heaviestOption);
      plate.iyPoints = iyNeedRange(gLo, gHi, da.bA, da.bB, da.sA, da.sB, da.limit, w.hw * w.tw, o.E, o.G).points;
    }
    const [gLo, gHi] = runSelfWeights(c);
    c.iyRange = iyNeedRange(gLo, gHi, da.bA, da.bB, da.sA, da.sB, da.limit, w.hw * w.tw, o.E, o.G, plate.iyPoints);
    return c.iyRange;
  };
  const lightestOption = flanges.reduce((a, b) => (b.A < a.A ? b : a));
  const heaviestOption = flanges.reduce((a, b) => (b.A > a.A ? b : a));

  /** Flange-induced buckling (EN 1993-1-5 8) rules out this flange as the one it limits, with any other. */
  const flangeFails = (c: Extract<Node, { kind: 0 }>, f: FlangeOption, lim: number): boolean => !fibOk(f, lim, c.plate.w.tw, throat0);

  /**
   * One flange pair of a run, past the bounds that read one flange alone: the bounds that read both
   * (bending, deflection, patch loading with bending, bearing), then a node for its set of plates.
   */
  const tryPair = (c: Extract<Node, { kind: 0 }>, ti: number, bi: number, kg: number): void => {
    const { plate, d, Freq } = c;
    const w = plate.w;
    const nL = plate.layouts.length;
    const T = flanges[ti]!;
    const B = flanges[bi]!;
    if (T.A * T.fy + B.A * B.fy < Freq) {
      pruned.bending += nL;
      return;
    }
    const Iy = iyOfPlates(w.hw, w.tw, T.b, T.t, B.b, B.t) * (1 + 1e-9);
    if (plate.IyReq > 0 && Iy < plate.IyReq) {
      pruned.deflection += nL;
      return;
    }
    const g = selfWeightOf(prep, w, T, B);
    // the deflection bound again, at these plates' own self-weight (decided by the run's range when it can be)
    const da = p.load.deflectionAffine;
    if (da) {
      const r = iyRangeOf(c, da);
      if (Iy < r.lo || (Iy < r.hi && Iy < minIyForDeflectionAt(g, da.bA, da.bB, da.sA, da.sB, da.limit, w.hw * w.tw, o.E, o.G, r.points))) {
        pruned.deflection += nL;
        return;
      }
    }
    // patch loading reads the web, the top flange and the panels: some panel count must pass it
    // (the first that does is enough here; the others are judged when a layout asks)
    const ps: Plates = { plate, ti, bi, T, B, d, g, fit: null, MelRd: 0, k: 0, layoutCalls: 0, panelDead: null };
    if (forces.length > 0) {
      let any = false;
      let patchFails = false;
      for (const np of plate.panelCounts) {
        if (panelOk(ps, np)) {
          any = true;
          break;
        }
        if (patchOf(plate, ti, np) > 1 + 1e-9) patchFails = true;
      }
      if (!any) {
        if (patchFails) pruned.patchLoading += nL;
        else pruned.patchBending += nL;
        return;
      }
    }
    // the bearing flats at least as heavy as the sizing needs for these plates' own reaction
    const fit = bearingFloorFor(plate, Math.min(T.b, B.b), p.load.maxReaction ? p.load.maxReaction(g) : 0);
    if (fit === 'none') {
      pruned.bearing += nL;
      return;
    }
    let layoutKg = Infinity;
    if (fit) {
      for (const [ep, s] of plate.minStiff) layoutKg = Math.min(layoutKg, s + bearingFlatCount(ep) * fit.bs * fit.ts * w.hw * KG_PER_MM3);
    } else layoutKg = plate.minLayoutKg;
    const lb = floorOf(kg + layoutKg, surfaceOf(w, T, B));
    if (prunes(d, lb)) {
      pruned.incumbent += nL;
      return;
    }
    // the LTB set bound on this pair alone (its rows and columns were not shown dead as sets):
    // far cheaper than the exact screen the plates would get next
    if (ltbSet && !sp.symmetric && ltbPairDead(c, T, B)) {
      pruned.lateralTorsional += nL;
      return;
    }
    ps.fit = fit;
    heap.push({ kind: 1, lb, seq: seq++, ps });
  };

  /**
   * Mono-symmetric runs as a grid: the top options (widths of one thickness, ascending mass) by the
   * bottom ones, enumerated in ascending pair mass (a merge: a small heap of one entry per row
   * taken up). A row is taken up when the merge reaches its lightest conceivable pair; then it is
   * judged on its own — flange-induced buckling, patch loading on every panel count, the columns
   * that reach the bending and deflection bounds (a prefix fails them: area and Iy grow with the
   * bottom width, found by bisection), and the LTB set bound over the columns left — and ruled out
   * whole or started at its first live column. A column is judged once, when a row first reaches
   * it (flange-induced buckling, the LTB set bound with it fixed), and skipped by every row after.
   * The run's bound is the lightest pair left, or the next row's lightest conceivable pair.
   */
  const massOfGroup: Float64Array[] = [];
  const groupMass = (gi: number): Float64Array => (massOfGroup[gi] ??= Float64Array.from(groups[gi]!.options, (f) => flangeMass(f, L)));
  const gridOf = (c: Extract<Node, { kind: 0 }>): Grid => {
    if (c.grid) return c.grid;
    const nt = groups[c.gt]!.options.length;
    const nb = groups[c.gb]!.options.length;
    const da = p.load.deflectionAffine;
    const iyNeed = Math.max(c.plate.IyReq, da ? iyRangeOf(c, da).lo : 0);
    const g: Grid = {
      nt,
      nb,
      t0: groupStart[c.gt]!,
      b0: groupStart[c.gb]!,
      mT: groupMass(c.gt),
      mB: groupMass(c.gb),
      col: new Int8Array(nb),
      nextRow: 0,
      rowLtb: new Int16Array(nt),
      rowChunks: new Uint8Array(nt),
      rowMel: doubles(nt),
      iyNeed,
      ha: doubles(nt),
      hb: doubles(nt),
      hk: doubles(nt),
      hn: 0,
      yielded: 0,
      out: new Float64Array(6),
      col0: 0,
    };
    c.grid = g;
    // the rows and columns no pair of which meets the bending and deflection bounds, at once: a
    // row fails them with every column when it fails them with the widest (area and Iy grow with
    // either width), so those rows are a prefix; likewise the columns that fail with the widest row
    const w = c.plate.w;
    const T = groups[c.gt]!.options;
    const B = groups[c.gb]!.options;
    const meets = (t: FlangeOption, b: FlangeOption): 0 | 1 | 2 =>
      t.A * t.fy + b.A * b.fy < c.Freq ? 1 : iyNeed > 0 && iyOfPlates(w.hw, w.tw, t.b, t.t, b.b, b.t) * (1 + 1e-9) < iyNeed ? 2 : 0;
    let lo = 0;
    let hi = nt;
    while (lo < hi) {
      const mid = (lo + hi) >> 1;
      if (meets(T[mid]!, B[nb - 1]!) !== 0) lo = mid + 1;
      else hi = mid;
    }
    for (let i = 0; i < lo; i++) g.out[meets(T[i]!, B[nb - 1]!) === 1 ? GRID_OUT.BENDING : GRID_OUT.DEFLECTION]! += nb;
    g.nextRow = lo;
    if (lo < nt) {
      let l = 0;
      let h = nb;
      while (l < h) {
        const mid = (l + h) >> 1;
        if (meets(T[nt - 1]!, B[mid]!) !== 0) l = mid + 1;
        else h = mid;
      }
      // every row's own bisection starts at or beyond it (its first column is at least this one)
      g.col0 = l;
    }
    return g;
  };
  /** The first live column at or after j (judging columns as it goes; the pairs of row-to-be skipped over dead ones are counted), or nb. */
  const liveColumnFrom = (c: Extract<Node, { kind: 0 }>, g: Grid, j: number): number => {
    for (; j < g.nb; j++) {
      let st = g.col[j]!;
      if (st === 0) {
        const bi = g.b0 + j;
        if (flangeFails(c, flanges[bi]!, c.fibB)) st = 2 + GRID_OUT.FIB;
        else if (ltbSet && ltbDeadWith(c, false, bi)) st = 2 + GRID_OUT.LTB;
        else st = 1;
        g.col[j] = st;
      }
      if (st === 1) return j;
      g.out[st - 2]!++;
    }
    return g.nb;
  };
  /**
   * Patch loading of top option ti on a plate, over its panel counts: the least Mel,Rd the 7.2 floor
   * needs on the counts that pass 6.4; −1 when none passes 6.4, −2 when none that does leaves room
   * for the floor. Once per plate and option (the runs of every bottom thickness share it).
   */
  const rowPatchNeed = (plate: Plate, ti: number): number => {
    const memo = (plate.rowNeed ??= new Float64Array(nFlange).fill(Number.NaN));
    let need = memo[ti]!;
    if (Number.isNaN(need)) {
      need = Infinity;
      let any = false;
      for (const np of plate.panelCounts) {
        const key = patchTables(plate, ti, np);
        if (plate.patch![key]! <= 1 + 1e-9) {
          any = true;
          need = Math.min(need, plate.patchNeed![key]!);
        }
      }
      if (need === Infinity) need = any ? -2 : -1;
      memo[ti] = need;
    }
    return need;
  };
  /**
   * Whether every pair of run c fails patch loading (6.4) on every panel count: its widest top
   * option does. η2 never rises as the loaded flange widens with its thickness and fy fixed (ℓy
   * grows with m1, and FRd with ℓy, through either branch of m2; a property test in the check
   * library), so every narrower option of the group fails where the widest does — judged with a
   * hair more than the per-pair test's margin, which covers the round-off of that comparison.
   */
  const runFailsPatch = (c: Extract<Node, { kind: 0 }>): boolean => {
    if (forces.length === 0) return false;
    const widest = groupStart[c.gt]! + groups[c.gt]!.options.length - 1;
    for (const np of c.plate.panelCounts) if (!(patchOf(c.plate, widest, np) > (1 + 1e-9) * (1 + 1e-12))) return false;
    return true;
  };
  /** The first live column at or after j whose pair with row a meets the row's 7.2 floor (pairs below it counted), or nb. */
  const viableColumnFrom = (c: Extract<Node, { kind: 0 }>, g: Grid, a: number, j: number): number => {
    const need = g.rowMel[a]!;
    for (;;) {
      j = liveColumnFrom(c, g, j);
      if (j >= g.nb || !(need > 0)) return j;
      // tryPair's test on every panel count at once: Mel,Rd below the least need fails them all
      if (melRd(c.plate.w, flanges[g.t0 + a]!, flanges[g.b0 + j]!) >= need * (1 - 1e-9)) return j;
      g.out[GRID_OUT.PATCH_BENDING]!++;
      j++;
    }
  };
  /** Takes up the next row: judged on its own, then its first live column into the merge. */
  const takeUpRow = (c: Extract<Node, { kind: 0 }>, g: Grid): void => {
    const i = g.nextRow++;
    const ti = g.t0 + i;
    const T = flanges[ti]!;
    const { nb } = g;
    if (flangeFails(c, T, c.fibT)) {
      g.out[GRID_OUT.FIB]! += nb;
      return;
    }
    if (forces.length > 0) {
      const need = rowPatchNeed(c.plate, ti);
      if (need < 0) {
        // no count passes 6.4 (−1), or none that does leaves room for the 7.2 floor (−2)
        g.out[need === -1 ? GRID_OUT.PATCH : GRID_OUT.PATCH_BENDING]! += nb;
        return;
      }
      g.rowMel[i] = need;
    }
    // the columns below the bending bound, then below the deflection bound: prefixes
    const opts = groups[c.gb]!.options;
    const w = c.plate.w;
    const TF = T.A * T.fy;
    let lo = 0;
    let hi = nb;
    while (lo < hi) {
      const mid = (lo + hi) >> 1;
      const B = opts[mid]!;
      if (TF + B.A * B.fy < c.Freq) lo = mid + 1;
      else hi = mid;
    }
    const jF = lo;
    if (g.iyNeed > 0) {
      hi = nb;
      while (lo < hi) {
        const mid = (lo + hi) >> 1;
        const B = opts[mid]!;
        if (iyOfPlates(w.hw, w.tw, T.b, T.t, B.b, B.t) * (1 + 1e-9) < g.iyNeed) lo = mid + 1;
        else hi = mid;
      }
    }
    const j0 = lo;
    g.out[GRID_OUT.BENDING]! += jF;
    g.out[GRID_OUT.DEFLECTION]! += j0 - jF;
    if (j0 >= nb) return;
    // into the merge at its first live column; the LTB set bound waits until the merge reaches it
    const j = viableColumnFrom(c, g, i, j0);
    if (j < nb) gridPush(g, i, j);
  };
  /** The merge's heap: entry (row a, column b), keyed by its pair's mass, ties by (a, b). */
  /** Whether heap entry i comes before the entry (kg, a, b). */
  const gridBefore = (g: Grid, i: number, kg: number, a: number, b: number): boolean =>
    g.hk[i]! < kg || (g.hk[i] === kg && (g.ha[i]! < a || (g.ha[i] === a && g.hb[i]! < b)));
  const gridMove = (g: Grid, to: number, from: number): void => {
    g.ha[to] = g.ha[from]!;
    g.hb[to] = g.hb[from]!;
    g.hk[to] = g.hk[from]!;
  };
  const gridPush = (g: Grid, a: number, b: number): void => {
    const kg = g.mT[a]! + g.mB[b]!;
    let i = g.hn++;
    while (i > 0) {
      const q = (i - 1) >> 1;
      // one entry per row, so "not before the parent" is "after it"
      if (gridBefore(g, q, kg, a, b)) break;
      gridMove(g, i, q);
      i = q;
    }
    g.ha[i] = a;
    g.hb[i] = b;
    g.hk[i] = kg;
  };
  const gridPop = (g: Grid): void => {
    const n = --g.hn;
    if (n === 0) return;
    const a = g.ha[n]!;
    const b = g.hb[n]!;
    const kg = g.hk[n]!;
    let i = 0;
    for (;;) {
      const l = 2 * i + 1;
      if (l >= n) break;
      const r = l + 1;
      const m = r < n && gridBefore(g, r, g.hk[l]!, g.ha[l]!, g.hb[l]!) ? r : l;
      if (!gridBefore(g, m, kg, a, b)) break;
      gridMove(g, i, m);
      i = m;
    }
    g.ha[i] = a;
    g.hb[i] = b;
    g.hk[i] = kg;
  };
  /** The run is over (every pair taken, or the rest beaten by feasible points): its pairs counted once each. */
  const finishGrid = (c: Extract<Node, { kind: 0 }>, g: Grid): void => {
    const nL = c.plate.layouts.length;
    const o5 = g.out;
    pruned.flangeInducedBuckling += o5[GRID_OUT.FIB]! * nL;
    pruned.patchLoading += o5[GRID_OUT.PATCH]! * nL;
    pruned.lateralTorsional += o5[GRID_OUT.LTB]! * nL;
    pruned.bending += o5[GRID_OUT.BENDING]! * nL;
    pruned.deflection += o5[GRID_OUT.DEFLECTION]! * nL;
    pruned.patchBending += o5[GRID_OUT.PATCH_BENDING]! * nL;
    const counted = o5[0]! + o5[1]! + o5[2]! + o5[3]! + o5[4]! + o5[5]!;
    pruned.incumbent += (g.nt * g.nb - counted - g.yielded) * nL;
  };
  const advanceGrid = (c: Extract<Node, { kind: 0 }>): void => {
    const g = gridOf(c);
    const { plate, d } = c;
    // a row's lightest conceivable pair: with the first column any row can use
    const mB0 = g.mB[g.col0]!;
    for (;;) {
      const rowKg = g.nextRow < g.nt ? g.mT[g.nextRow]! + mB0 : Infinity;
      const pairKg = g.hn > 0 ? g.hk[0]! : Infinity;
      const least = Math.min(rowKg, pairKg);
      if (least === Infinity) {
        finishGrid(c, g);
        return;
      }
      const kg = plate.webMass + least;
      const floor = floorOf(kg + plate.minLayoutKg, 0);
      if (prunes(d, floor)) {
        finishGrid(c, g);
        return;
      }
      // back to the heap only once clearly past its least (GRID_SLACK): a run comes back ~13 times
      // otherwise, each a cache miss on its node and arrays; the order is only for speed (every
      // pruning reads a true bound against a feasible value), so the answer cannot change
      if (floor > heap.peekLb() * (1 + GRID_SLACK)) {
        c.lb = floor;
        heap.push(c);
        return;
      }
      if (rowKg <= pairKg) {
        takeUpRow(c, g);
        continue;
      }
      const a = g.ha[0]!;
      const b = g.hb[0]!;
      gridPop(g);
      // the merge has reached a pair of the row that no LTB set bound covers yet: the bound over
      // its next stretch of columns (ROW_STRETCH, twice as many each time), not over the rest of
      // the row at once — the heavier columns are most often never reached (beaten first)
      if (ltbSet && boundsSide(true)) {
        const shown = g.rowLtb[a]!;
        if (shown >= 0 && b >= shown) {
          const e = Math.min(g.nb, b + (ROW_STRETCH << g.rowChunks[a]!++));
          if (ltbStretchDead(c, true, g.t0 + a, b, e)) {
            g.out[GRID_OUT.LTB]! += e - b;
            g.rowLtb[a] = e;
            const next = viableColumnFrom(c, g, a, e);
            if (next < g.nb) gridPush(g, a, next);
            continue;
          }
          g.rowLtb[a] = -1;
        }
      }
      // the row's next live column
      const nb = viableColumnFrom(c, g, a, b + 1);
      if (nb < g.nb) gridPush(g, a, nb);
      g.yielded++;
      tryPair(c, g.t0 + a, g.b0 + b, kg);
    }
  };

  /**
   * Lateral-torsional buckling alone, from the load model's moment envelope at the plates' own
   * self-weight (ltbUtilisation: the check's own computation, without building the effects): most
   * light plates at shallow depths fail it, and this rejects them before the other checks run.
   */
  const envelopeOf = p.load.momentEnvelope?.bind(p.load) ?? ((g: number) => momentEnvelopeOf(p.load.effects(g).stations));
  const ltbFails = (section: Section, g: number): boolean => {
    const ctx = prepare(section, o);
    const memo: Partial<Record<'top' | 'bot', SignBending>> = {};
    // the check fails above 1 + 1e-9; a hair more here leaves any round-off doubt to the check itself
    const limit = (1 + 1e-9) * (1 + 1e-12);
    const u = ltbUtilisation(ctx, envelopeOf(g), (side) => (memo[side] ??= bendingForSign(ctx, side)), limit);
    return !(u <= limit);
  };

  /** The checks that do not read the layout, once for these plates; then their layouts, best first. */
  const judgePlates = (nd: Extract<Node, { kind: 1 }>): void => {
    const { ps } = nd;
    const { plate, T, B, d } = ps;
    const nL = plate.layouts.length;
    if (prunes(d, nd.lb)) {
      pruned.incumbent += nL;
      return;
    }
    const section = buildSection(webs.at(plate.layouts[0]!), partOf(plate, 0), T, B);
    if (ltbFails(section, ps.g)) {
      pruned.lateralTorsional += nL;
      keepMiss({ key: [plate.layouts[0]!, ps.ti, ps.bi], section, depth: d, g: ps.g, lb: nd.lb });
      return;
    }
    if (ps.fit && !p.load.maxReaction) {
      const effects = (ps.effects = p.load.effects(ps.g));
      // a load model without maxReaction: the bearing floor from the reactions of the effects
      let R = 0;
      for (const r of effects.reactions) R = Math.max(R, Math.abs(r.R));
      const fit = bearingFloorFor(plate, Math.min(T.b, B.b), R);
      if (fit === 'none') {
        pruned.bearing += nL;
        return;
      }
      ps.fit = fit;
    }
    // the layout-free checks wait until a layout has passed the others (judgeLayouts): past the
    // bounds and the LTB screen they rarely fail, and most sets never get that far (on the
    // mono-symmetric problem 130 of 4 244); the effects wait for the first layout judged (487 of
    // the 4 244 there: ~50 kB each, which the collector copied and kept for every set)
    ps.section = section;
    // a plain array: read on every return of the node from the heap, with the node (no separate buffer)
    const lbs = doubles(nL);
    const kgPlates = flangeMass(T, L) + flangeMass(B, L);
    let order: Int32Array;
    if (isMass) {
      // the order of the layouts depends on the plates only through the bearing floor: cached
      const minB = Math.min(T.b, B.b);
      const key = ps.fit ? `${ps.fit.bs}x${ps.fit.ts}` : `none:${minB}`;
      let hit = plate.orders.get(key);
      if (!hit) {
        const add = new Float64Array(nL);
        for (let j = 0; j < nL; j++) {
          const w = webs.at(plate.layouts[j]!);
          const b = bearingFloorOf(ps, j);
          add[j] = partOf(plate, j).stiffMass + bearingFlatCount(w.endPost) * b.bs * b.ts * w.hw * KG_PER_MM3;
        }
        const idx = Array.from({ length: nL }, (_, j) => j);
        idx.sort((x, y) => add[x]! - add[y]! || plate.layouts[x]! - plate.layouts[y]!);
        hit = { order: Int32Array.from(idx), add };
        plate.orders.set(key, hit);
      }
      // a lower bound by a hair (summed in another order than the exact mass): never above it
      const base = plate.webMass + kgPlates;
      for (let j = 0; j < nL; j++) lbs[j] = (base + hit.add[j]!) * (1 - 1e-12);
      order = hit.order;
    } else {
      const idx: number[] = [];
      for (let j = 0; j < nL; j++) {
        const w = webs.at(plate.layouts[j]!);
        lbs[j] = priceCost(prep, w, partOf(plate, j), T, B, bearingFloorOf(ps, j), minThroat);
        idx.push(j);
      }
      idx.sort((x, y) => lbs[x]! - lbs[y]! || plate.layouts[x]! - plate.layouts[y]!);
      order = Int32Array.from(idx);
    }
    ps.order = order;
    ps.lbs = lbs;
    if (order.length > 0) heap.push({ kind: 2, lb: lbs[order[0]!]!, seq: seq++, ps });
  };

  /** The layout checks for the next layouts of a set of plates, in ascending lower bound. */
  const judgeLayouts = (nd: Extract<Node, { kind: 2 }>): void => {
    const { ps } = nd;
    const { plate, T, B, d } = ps;
    const order = ps.order!;
    const lbs = ps.lbs!;
    while (ps.k < order.length) {
      const j = order[ps.k]!;
      const lb = lbs[j]!;
      if (prunes(d, lb)) {
        pruned.incumbent += order.length - ps.k;
        ps.k = order.length;
        return;
      }
      // likewise a set of plates' layouts (LAYOUT_SLACK): their bounds differ by a few stiffeners
      // and came back ~34 times per set, each a cache miss on the set
      if (lb > heap.peekLb() * (1 + LAYOUT_SLACK)) {
        nd.lb = lb;
        heap.push(nd);
        return;
      }
      ps.k++;
      const wi = plate.layouts[j]!;
      const w = webs.at(wi);
      if (webDead.has(wi) || flatFailsTorsion(w)) {
        pruned.webOnly++;
        continue;
      }
      if (!panelOk(ps, w.panels)) {
        pruned.patchLoading++;
        continue;
      }
      // panels and end post (the panel-only checks read nothing else of the layout)
      const panelKey = 2 * w.panels + (w.endPost === 'rigid' ? 1 : 0);
      if (ps.panelDead?.has(panelKey)) {
        pruned.sameFlanges++;
        continue;
      }
      const parts = partOf(plate, j);
      const section = buildSection(w, parts, T, B);
      const judged: Judged = { results: [] };
      const known = ps.panelPassed?.get(panelKey);
      const effects = (ps.effects ??= p.load.effects(ps.g));
      const fail = firstFailureAmong(section, effects, o, LAYOUT_IDS, judged, known);
      // the panel-only checks that passed here pass, with the same results, on every flat and side
      for (const r of judged.results) {
        if (!PANEL_ONLY.has(r.id) || !r.passes || known?.has(r.id)) continue;
        const panelMap = (ps.panelPassed ??= new Map());
        let got = panelMap.get(panelKey);
        if (!got) panelMap.set(panelKey, (got = new Map()));
        got.set(r.id, r);
      }
      // each layout judged completes a judgement (the plates' part was judged once for all of them);
      // layouts dropped before it are counted under their reason, so every candidate counts once
      ps.layoutCalls++;
      fullEvaluations++;
      const key: CandidateKey = [wi, ps.ti, ps.bi];
      if (fail === null && !ps.plateResults) {
        // the layout-free checks, once for these plates, now that a layout needs their verdict
        const pj: Judged = { results: [] };
        const plateFail = firstFailureAmong(ps.section!, effects, o, PLATE_IDS, pj);
        if (plateFail) {
          // it fails every layout of these plates: the rest are dropped with this one
          failedBy[plateFail.id] = (failedBy[plateFail.id] ?? 0) + 1;
          keepMiss({ key, section, depth: d, g: ps.g, lb });
          pruned.sameFlanges += order.length - ps.k;
          ps.k = order.length;
          return;
        }
        ps.plateResults = pj.results;
      }
      if (fail === null) {
        // both parts passed: together they are checkGirder's verdict (a property test keeps them equal)
        const verdict = assembleVerdict([...ps.plateResults!, ...judged.results], judged.bearing!, judged.bearingSized!);
        const plates = parts.webMass + parts.stiffMass + (flangeMass(T, L) + flangeMass(B, L));
        const { mass, value } = settle(prep, w, parts, T, B, plates, verdict, throat0);
        admit({ key, section: { ...section, bearing: verdict.bearing }, depth: d, mass, value, verdict });
        continue;
      }
      failedBy[fail.id] = (failedBy[fail.id] ?? 0) + 1;
      keepMiss({ key, section, depth: d, g: ps.g, lb });
      if (failsWebOnly(fail)) webDead.add(wi);
      else if (PANEL_ONLY.has(fail.id)) (ps.panelDead ??= new Set()).add(panelKey);
    }
  };

  for (;;) {
    if (signal?.aborted) break;
    const nd = heap.pop();
    if (!nd) break;
    if (nd.kind === 0) {
      if (!nd.opened) {
        nd.opened = true;
        if (runFailsPatch(nd)) {
          // every pair left (the prefix below the bending and deflection bounds is counted already)
          pruned.patchLoading += (nd.pairs.kg.length - nd.k) * nd.plate.layouts.length;
          continue;
        }
      }
      advancePairs(nd);
    }
    else if (nd.kind === 1) judgePlates(nd);
    else judgeLayouts(nd);
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

/**
 * Mel (N·mm, no partial factor) of the gross section of a web plate and two flanges, each plate at
 * its own fy: the first yield of any plate's farthest fibre, as grossProps(·).Mel computes it from
 * the same three rectangles (to round-off; a property test keeps them equal).
 */
export function plateStackMel(w: Pick<WebConfig, 'hw' | 'tw' | 'fyw'>, T: Pick<FlangeOption, 'b' | 't' | 'fy'>, B: Pick<FlangeOption, 'b' | 't' | 'fy'>): number {
  const z1 = B.t;
  const z2 = B.t + w.hw;
  const h = z2 + T.t;
  const A0 = B.b * B.t;
  const A1 = w.tw * w.hw;
  const A2 = T.b * T.t;
  const zc = (A0 * (z1 / 2) + A1 * ((z1 + z2) / 2) + A2 * ((z2 + h) / 2)) / (A0 + A1 + A2);
  const d0 = z1 / 2 - zc;
  const d1 = (z1 + z2) / 2 - zc;
  const d2 = (z2 + h) / 2 - zc;
  const I = (A0 * B.t * B.t) / 12 + A0 * d0 * d0 + (A1 * w.hw * w.hw) / 12 + A1 * d1 * d1 + (A2 * T.t * T.t) / 12 + A2 * d2 * d2;
  return Math.min((B.fy * I) / Math.max(zc, Math.abs(z1 - zc)), (w.fyw * I) / Math.max(Math.abs(z1 - zc), Math.abs(z2 - zc)), (T.fy * I) / Math.max(Math.abs(z2 - zc), h - zc));
}

/** An upper bound on the self-weight per length of any candidate, kg/mm (for the demand range). */
function maxMassPerLength(prep: Prepared): number {
  const sp = prep.p.space;
  const hw = Math.max(...sp.hw);
  const tw = Math.max(...sp.tw);
  const Af = Math.max(...sp.bf) * Math.max(...sp.tf);
  const flat = sp.flats.reduce((m, f) => Math.max(m, f.b * f.t), 0);
  const minA = Math.min(...sp.panels.filter((n) => n > 0).map((n) => prep.Lmax / n), Infinity);
  const stiffPerMm = minA === Infinity ? 0 : (2 * flat * hw) / minA;
  // bearing stiffeners: at most 2 pairs per end, one per inner support, flats no larger than the flange outstand × 100 mm
  const bearing = ((bearingPairs('rigid', prep.supports) * 2 * Math.max(flat, (Math.max(...sp.bf) / 2) * 150) * hw) / prep.L) * 1.5;
  return KG_PER_MM3 * (hw * tw + 2 * Af + stiffPerMm + bearing);
}

function fibOk(f: FlangeOption, lim: number, tw: number, throat: number): boolean {
  return lim === Infinity || f.A <= lim || flangeOutstand({ b: f.b, t: f.t }, tw, f.fy, throat).rho < 1;
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

/** The number of web configurations of the plate that starts at `first` (a start of `starts`). */
function plateLength(starts: Int32Array, first: number): number {
  const k = lastAtOrBelow(starts, first);
  return k + 1 < starts.length ? starts[k + 1]! - starts[k]! : 0;
}

