/**
 * The state of one slice search (SliceState) and the shapes of what it holds: web plates and their
 * tables, sets of plates, the mono-symmetric grids and the heap's nodes. Every module of the slice
 * search reads and writes this one object; nothing is captured.
 */
import {
  momentEnvelopeOf,
  panelsOf,
  bearingPairCount,
  BEARING_MAX_PAIRS,
  type CheckContext,
  type CheckId,
  type CheckOptions,
  type CheckResult,
  type ConcentratedForce,
  type EndPost,
  type Effects,
  type IyNeedRange,
  type Judged,
  type Material,
  type MomentEnvelope,
  type Section,
  type SignBending,
} from '@platesmith/checks';
import { STEEL_KG_PER_MM3 } from '@platesmith/catalogue';
import { G_ACC, type BearingFlat, type Evaluated, type CandidateKey, type Prepared, type PruneStats, type SearchProblem } from '../core.js';
import type { DemandBound } from '../load.js';
import { ltbSetBound, type LtbSetBound, type Segments } from '../ltb-bound.js';
import { C2, flangeMass, type CostModel, type WebParts } from '../objective.js';
import { loadOptions, type FlangeGroup, type FlangeOption, type SpaceSpec, type WebConfig, type WebTable } from '../space.js';
import { Heap } from './heap.js';
import type { SlicePart } from './slicing.js';

export const KG_PER_MM3 = STEEL_KG_PER_MM3;

/**
 * A value below which no feasible candidate of `slice` lies, known from elsewhere (other workers'
 * feasible points): `bestAt(d)` is a value some feasible candidate at depth ≤ d has. Used for
 * strict pruning only (lb > bestAt(d)), so sharing it never changes the answer.
 */
export interface OuterBound {
  bestAt(d: number): number;
  offer(d: number, value: number): void;
}

/** One web plate (grade, hw, tw) with all its stiffener layouts and end posts in the slice. */
export interface Plate {
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
export interface Plates {
  plate: Plate;
  ti: number;
  bi: number;
  T: FlangeOption;
  B: FlangeOption;
  d: number;
  /** every layout's own self-weight lies in [gLo, gHi] (selfWeightRange): what the bounds read */
  gLo: number;
  gHi: number;
  fit: BearingFlat | null;
  /** Mel,Rd of the gross section (0 until needed) */
  MelRd: number;
  /** the effects of the last layout judged, at its own self-weight effectsG (the next layout often has the same) */
  effects?: Effects;
  effectsG?: number;
  /**
   * per own self-weight: the layout-free checks' results (all passed), or the first that failed.
   * Layouts with the same stiffener mass share one (their self-weight is the same float).
   */
  plateResults?: Map<number, Judged['results'] | CheckResult>;
  /** per own self-weight: whether the exact LTB screen fails it (ltbFailsAt) */
  ltbAt?: Map<number, boolean>;
  /** the screen's context of the plates' section and its bending resistances per sign (ltbFailsAt) */
  ltbCtx?: { ctx: CheckContext; bending: Partial<Record<'top' | 'bot', SignBending>> };
  /** the section of layout 0 (the layout-free checks read its plates only) */
  section?: Section;
  order?: Int32Array;
  lbs?: number[];
  k: number;
  layoutCalls: number;
  /** per own self-weight, the panels and end posts (panelKey) that failed a PANEL_ONLY check */
  panelDead: Map<number, Set<number>> | null;
  /** per own self-weight, per panels and end post: the PANEL_ONLY results that passed on one layout (the same on every flat and side of that self-weight) */
  panelPassed?: Map<number, Map<number, Map<CheckId, CheckResult>>>;
}

/**
 * The state of a mono-symmetric run's enumeration (see gridOf). Rows: top options, columns:
 * bottom options, indices within their groups (widths ascending, so masses ascending).
 */
export interface Grid {
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

/** A run's flange pairs, ascending plate mass (ties by top, then bottom option). */
export interface Pairs {
  ti: Int32Array;
  bi: Int32Array;
  kg: Float64Array;
}

/** A run of flange pairs on one web plate and one pair of flange groups (one depth). */
export interface RunNode {
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
/** One set of plates, before its layout-free screen (judgePlates). */
export interface PlatesNode {
  kind: 1;
  lb: number;
  seq: number;
  ps: Plates;
}
/** The stiffener layouts of one set of plates, ascending lower bound (judgeLayouts). */
export interface LayoutsNode {
  kind: 2;
  lb: number;
  seq: number;
  ps: Plates;
}
export type Node = RunNode | PlatesNode | LayoutsNode;

/** A failed candidate kept for the nearest-miss report. */
export interface Miss {
  key: CandidateKey;
  section: Section;
  depth: number;
  g: number;
  lb: number;
}

export interface SliceState {
  prep: Prepared;
  p: SearchProblem;
  o: CheckOptions;
  sp: SpaceSpec;
  webs: WebTable;
  groups: FlangeGroup[];
  flanges: FlangeOption[];
  groupStart: number[];
  plateStarts: Int32Array;
  L: number;
  Lmax: number;
  supports: number[];
  signal: { aborted: boolean } | undefined;
  outer: OuterBound | undefined;
  part: SlicePart | undefined;
  isMass: boolean;

  // counts reported with the answer
  pruned: PruneStats;
  fullEvaluations: number;
  spaceSize: number;
  failedBy: Record<string, number>;

  // the staircase of feasible points (depth ascending, value strictly descending) and the near misses
  stairs: Evaluated[];
  misses: Miss[];

  // the cost floor's terms (cost-floor.ts)
  cm: CostModel;
  rateMin: number;
  weldFloorMin: number;
  paint: number;

  /** the least and the first weld throat of the options (settle() falls back on the first, as brute force passes it) */
  minThroat: number;
  throat0: number;
  /** the least flange thickness of the space */
  tfMin: number;
  /** an upper bound on any candidate's self-weight, N/mm */
  gMax: number;
  nFlange: number;
  kFibMax: number;
  lightestOption: FlangeOption;
  heaviestOption: FlangeOption;

  // per number of panels (the same on every web)
  stiffCount: Map<number, number>;
  /** the same with load-bearing stiffeners under the forces (an intermediate stiffener on one of them is not counted) */
  stiffCountLoaded: Map<number, number>;
  /** the space offers load-bearing stiffeners and there are concentrated forces: patch loading (6, 7.2) bounds a layout without them only, never a whole set of plates */
  loadable: boolean;
  panelsByCount: Map<number, { x0: number; x1: number; a: number }[]>;
  panelSlots: Map<number, number>;
  slotOf: Int32Array;

  /** web plates of the slice: [first web index, count] each */
  byPlate: [number, number][];
  // demand bounds valid for every candidate of the slice
  dem: DemandBound;
  deflFloor: ReturnType<SearchProblem['load']['deflectionFloor']>;
  forces: ConcentratedForce[];
  sagAtForces: number[];
  anySag: boolean;
  Mneed: number;

  heap: Heap;
  /** a node's sequence number: the heap's tie-break (a total order) */
  seq: number;
  /** web configurations that failed a check reading only the web and its stiffeners */
  webDead: Set<number>;
  /** per grade, per flat (the stock's objects, shared by every configuration that uses them) */
  torsionFails: Map<string, Map<object, boolean>>;
  pairCache: Map<number, Pairs>;
  groupPairs: (readonly [number, number])[];
  pairsPerWeb: number;
  patterns: Map<string, { rigid: number; nonRigid: number; panelCounts: number[] }>;
  massOfGroup: Float64Array[];

  // lateral-torsional buckling (ltb.ts)
  ltbSet: LtbSetBound | undefined;
  /** a sign of moment that no self-weight of the space produces needs no bound (no segment to bound) */
  signPresent: { top: boolean; bot: boolean };
  widthsDownOf: Float64Array[];
  envelopeOf: (g: number) => MomentEnvelope;
}

/**
 * n zeros as a plain array of doubles: on the JS heap with the object that holds it. A typed array
 * above 64 bytes keeps its data in a separate buffer, one more allocation for the collector to
 * track and one more cache miss each time a run comes back from the heap (the merge's arrays were
 * the first-touch hot spots of the mono-symmetric search).
 */
export function doubles(n: number): number[] {
  // allocated at its length once (a push loop regrew it several times); filled with a double
  // first so that its elements are stored as doubles from the start
  return new Array<number>(n).fill(0.5).fill(0);
}

/** The state of a search over the web plates `byPlate` (platesOfRuns), before any run is seeded. */
export function createSliceState(
  prep: Prepared,
  byPlate: [number, number][],
  signal: { aborted: boolean } | undefined,
  outer: OuterBound | undefined,
  part: SlicePart | undefined,
): SliceState {
  const { p, webs, groups, flanges, groupStart, plateStarts, L, Lmax, supports } = prep;
  const o = p.options;
  const sp = p.space;
  const minThroat = Math.min(...o.weldThroats);
  const isMass = p.objective === 'mass';

  const cm = p.cost;
  const gradeMin = Math.min(...[...sp.webGrades, ...sp.flangeGrades].map((g) => cm.gradeFactor[g]));

  const tfSorted = [...new Set(groups.map((g) => g.t))].sort((x, y) => x - y);
  const gMax = maxMassPerLength(prep) * G_ACC;
  const nFlange = flanges.length;
  let lightestFlange = Infinity;
  for (const f of flanges) lightestFlange = Math.min(lightestFlange, flangeMass(f, L));

  const stiffCount = new Map<number, number>();
  const stiffCountLoaded = new Map<number, number>();
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
    stiffCountLoaded.set(n, n > 0 ? panelsOf(supports, Lmax / n, prep.loadXs).stiffenerXs.length : 0);
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
  const ltbSet = p.load.momentEnvelopeRange ? ltbSetBound(o) : undefined;
  const signPresent = { top: true, bot: true };
  if (ltbSet) {
    const all = p.load.momentEnvelopeRange!(0, gMax);
    signPresent.top = all.sagHi.some((m) => m > 1);
    signPresent.bot = all.hogHi.some((m) => m > 1);
  }

  // every field from the start: one object shape for the whole search
  return {
    prep,
    p,
    o,
    sp,
    webs,
    groups,
    flanges,
    groupStart,
    plateStarts,
    L,
    Lmax,
    supports,
    signal,
    outer,
    part,
    isMass,
    pruned: { depth: 0, rules: 0, shear: 0, bending: 0, flangeInducedBuckling: 0, deflection: 0, patchLoading: 0, patchBending: 0, lateralTorsional: 0, bearing: 0, sameFlanges: 0, webOnly: 0, incumbent: 0 },
    fullEvaluations: 0,
    spaceSize: 0,
    failedBy: {},
    stairs: [],
    misses: [],
    cm,
    rateMin: cm.km * gradeMin * Math.min(1, cm.thickFactor),
    weldFloorMin: 1.3 * C2[cm.flangeWeld] * minThroat * minThroat * 4 * L,
    paint: cm.painted ? cm.thetaSp * 3e-6 + cm.thetaP * (3e-6 + 4.15e-6) : 0,
    minThroat,
    throat0: o.weldThroats[0]!,
    tfMin: tfSorted[0] ?? 0,
    gMax,
    nFlange,
    kFibMax: o.kFib === 'auto' ? 0.55 : o.kFib,
    lightestOption: flanges.reduce((a, b) => (b.A < a.A ? b : a)),
    heaviestOption: flanges.reduce((a, b) => (b.A > a.A ? b : a)),
    stiffCount,
    stiffCountLoaded,
    loadable: forces.length > 0 && prep.loadXs.length > 0 && loadOptions(sp).some((f) => f !== null),
    panelsByCount,
    panelSlots,
    slotOf,
    byPlate,
    dem,
    deflFloor,
    forces,
    sagAtForces,
    anySag: sagAtForces.some((m) => m > 0),
    Mneed: Math.max(dem.Msag, dem.Mhog),
    heap: new Heap(),
    seq: 0,
    webDead: new Set(),
    torsionFails: new Map(),
    pairCache: new Map(),
    groupPairs: sp.symmetric ? groups.map((_, i) => [i, i] as const) : groups.flatMap((_, i) => groups.map((__, j) => [i, j] as const)),
    pairsPerWeb: sp.symmetric ? nFlange : nFlange * nFlange,
    patterns: new Map(),
    massOfGroup: [],
    ltbSet,
    signPresent,
    widthsDownOf: [],
    envelopeOf: p.load.momentEnvelope?.bind(p.load) ?? ((g: number) => momentEnvelopeOf(p.load.effects(g).stations)),
  };
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
  // load-bearing pairs: one under each force
  const loadFlat = loadOptions(sp).reduce((m, f) => Math.max(m, f ? f.b * f.t : 0), 0);
  const loadPerMm = (prep.loadXs.length * 2 * loadFlat * hw) / prep.L;
  const rp = prep.restraintPair;
  const restraintPerMm = rp ? (rp.xs.length * 2 * rp.bs * rp.ts * hw) / prep.L : 0;
  // bearing stiffeners: at most 2 pairs per end, one per inner support, flats no larger than the flange outstand × 100 mm
  const bearing = ((bearingPairCount('rigid', prep.supports.length, BEARING_MAX_PAIRS) * 2 * Math.max(flat, (Math.max(...sp.bf) / 2) * 150) * hw) / prep.L) * 1.5;
  return KG_PER_MM3 * (hw * tw + 2 * Af + stiffPerMm + loadPerMm + restraintPerMm + bearing);
}
