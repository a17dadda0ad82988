/**
 * Slicing: which web plates a slice holds, how a slice is shared out between workers (SlicePart),
 * and the runs of flange pairs it starts from — one per web plate and pair of flange groups, each
 * past the bounds that read the plate and the groups alone, pushed on the heap at its first bound.
 */
import { iyOfPlates, maxCompressionFlangeAreaFIB, minFlangeForceForBending, minIyForDeflection, webShearCapacityBound, type EndPost } from '@platesmith/checks';
import { flangeMass, SUM_ORDER_MARGIN } from '../objective.js';
import { lastAtOrBelow, type FlangeOption, type WebConfig } from '../space.js';
import { floorOf } from './cost-floor.js';
import { bearingAreaFloor, bearingFlatCount } from './plate-tables.js';
import { KG_PER_MM3, type Pairs, type Plate, type SliceState } from './state.js';

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
 * The web plates of a slice: [first web index, count] each (a plate's layouts are consecutive in
 * webConfigs' order; runs are cut where plates start, and a run that continues the previous one
 * within the same plate joins it).
 */
export function platesOfRuns(plateStarts: Int32Array, runs: readonly (readonly [first: number, count: number])[]): [number, number][] {
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
        if (last && last[0] + last[1] === x && x !== plateStarts[k]) last[1] += upto - x;
        else byPlate.push([x, upto - x]);
      }
      x = upto;
    }
  }
  return byPlate;
}

/** The flange pairs of groups gt and gb, ascending plate mass (ties by top, then bottom option): once per pair of groups. */
export function pairsOf(s: SliceState, gt: number, gb: number): Pairs {
  const { groups, groupStart, flanges, L } = s;
  const key = gt * groups.length + gb;
  let hit = s.pairCache.get(key);
  if (!hit) {
    const t0 = groupStart[gt]!;
    const b0 = groupStart[gb]!;
    const nt = groups[gt]!.options.length;
    const nb = groups[gb]!.options.length;
    const list: { ti: number; bi: number; kg: number }[] = [];
    if (s.sp.symmetric) for (let i = 0; i < nt; i++) list.push({ ti: t0 + i, bi: t0 + i, kg: flangeMass(flanges[t0 + i]!, L) + flangeMass(flanges[t0 + i]!, L) });
    else for (let i = 0; i < nt; i++) for (let j = 0; j < nb; j++) list.push({ ti: t0 + i, bi: b0 + j, kg: flangeMass(flanges[t0 + i]!, L) + flangeMass(flanges[b0 + j]!, L) });
    list.sort((x, y) => x.kg - y.kg || x.ti - y.ti || x.bi - y.bi);
    hit = { ti: Int32Array.from(list, (x) => x.ti), bi: Int32Array.from(list, (x) => x.bi), kg: Float64Array.from(list, (x) => x.kg) };
    s.pairCache.set(key, hit);
  }
  return hit;
}

/**
 * Per end post the least stiffener kg per mm of web depth over layouts first … first+nL−1
 * (count × sides × b × t, as webPartsWith computes the kg before × hw × density, plus the
 * load-bearing pairs of a layout with them), and their panel
 * counts, most first. Whole plates with the same flat filter list the same layouts: once per pattern.
 */
export function patternOf(s: SliceState, first: number, nL: number, tw: number): { rigid: number; nonRigid: number; panelCounts: number[] } {
  const { plateStarts, webs } = s;
  const whole = first === plateStarts[lastAtOrBelow(plateStarts, first)] && nL === plateLength(plateStarts, first);
  const key = whole ? `${nL}|${s.sp.rules.stiffenerAtLeastWeb ? tw : ''}` : '';
  let hit = whole ? s.patterns.get(key) : undefined;
  if (!hit) {
    let rigid = Infinity;
    let nonRigid = Infinity;
    const counts = new Set<number>();
    for (let wi = first; wi < first + nL; wi++) {
      const lw = webs.at(wi);
      let m = lw.panels === 0 || !lw.flat ? 0 : ((lw.load ? s.stiffCountLoaded : s.stiffCount).get(lw.panels) ?? 0) * lw.sides * lw.flat.b * lw.flat.t;
      // load-bearing pairs (webPartsWith adds their kg apart: lowered by the sum-order margin)
      if (lw.load) m = (m + s.prep.loadXs.length * 2 * lw.load.b * lw.load.t) * (1 - SUM_ORDER_MARGIN);
      if (lw.endPost === 'rigid') rigid = Math.min(rigid, m);
      else nonRigid = Math.min(nonRigid, m);
      counts.add(lw.panels);
    }
    hit = { rigid, nonRigid, panelCounts: [...counts].sort((x, y) => y - x) };
    if (whole) s.patterns.set(key, hit);
  }
  return hit;
}

/** The least total flange force (N) the bending bound asks of a web plate in a girder of depth ≤ hMax. */
function flangeForce(s: SliceState, w: WebConfig, MEd: number, hMax: number, tfTop: number, fyf: number): number {
  const o = s.o;
  return minFlangeForceForBending({ hw: w.hw, tw: w.tw, fyw: w.fyw, MEd, gammaM0: o.factors.gammaM0, hMax, symmetric: s.sp.symmetric, tfMax: tfTop, fyfMax: fyf });
}

/**
 * Seeds the heap: per web plate of the slice the bounds that read the plate alone (depth, shear,
 * deflection), then per pair of flange groups those that read the groups (depth, fabrication
 * rules, bending and deflection with the widest flanges), and a run node for what is left.
 */
export function seedRuns(s: SliceState): void {
  const { webs, sp, o, L, pruned, part, dem } = s;
  for (const [first, nL] of s.byPlate) {
    const w = webs.at(first);
    // this slice's runs of the plate (all of them unless the plate is shared out by SlicePart)
    const own = part ? s.groupPairs.filter(([gt, gb]) => unitSlot(first, gt, gb, part.of) === part.slot) : s.groupPairs;
    if (own.length === 0) continue;
    let total = s.pairsPerWeb * nL;
    if (part) {
      total = 0;
      for (const [gt, gb] of own) total += groupSize(s, gt, gb) * nL;
    }
    s.spaceSize += total;
    if (w.hw + 2 * s.tfMin > sp.maxDepth) {
      pruned.depth += total;
      continue;
    }
    if (webShearCapacityBound(w.hw, w.tw, w.fyw, o.eta, o.factors.gammaM0, o.factors.gammaM1) < dem.V) {
      pruned.shear += total;
      continue;
    }
    const IyReq = minIyForDeflection(s.deflFloor, w.hw * w.tw, o.E, o.G);
    if (IyReq === Infinity) {
      pruned.deflection += total;
      continue;
    }
    // the least intermediate-stiffener kg per end post, as webPartsWith computes it (an integer product, then × hw × density)
    const pat = patternOf(s, first, nL, w.tw);
    const minStiff = new Map<EndPost, number>();
    if (pat.rigid < Infinity) minStiff.set('rigid', pat.rigid * w.hw * KG_PER_MM3);
    if (pat.nonRigid < Infinity) minStiff.set('non-rigid', pat.nonRigid * w.hw * KG_PER_MM3);
    const layouts = new Int32Array(nL);
    for (let j = 0; j < nL; j++) layouts[j] = first + j;
    const aFloor = bearingAreaFloor(s, w.grade, w.tw);
    let minLayoutKg = Infinity;
    for (const [ep, st] of minStiff) minLayoutKg = Math.min(minLayoutKg, st + bearingFlatCount(s, ep) * aFloor * w.hw * KG_PER_MM3);
    const fib = (always: boolean) => (always ? maxCompressionFlangeAreaFIB({ hw: w.hw, tw: w.tw, fyfMin: 1, k: s.kFibMax, E: o.E }) : Infinity);
    const plate: Plate = {
      w,
      layouts,
      parts: [],
      webMass: w.hw * w.tw * L * KG_PER_MM3,
      minLayoutKg,
      minStiff,
      // most panels first: the patch resistance grows as the panels shorten, so one passes soonest
      panelCounts: pat.panelCounts,
      Mneed: s.Mneed,
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
    for (const [gt, gb] of own) seedRun(s, plate, gt, gb);
  }
}

/** One run (plate, flange groups gt and gb) past its group-level bounds, onto the heap. */
function seedRun(s: SliceState, plate: Plate, gt: number, gb: number): void {
  const { groups, sp, pruned, L } = s;
  const w = plate.w;
  const nL = plate.layouts.length;
  const IyReq = plate.IyReq;
  const GT = groups[gt]!;
  const GB = groups[gb]!;
  const nPairs = (sp.symmetric ? GT.options.length : GT.options.length * GB.options.length) * nL;
  const d = w.hw + GT.t + GB.t;
  if (d < sp.minDepth || d > sp.maxDepth) {
    pruned.depth += nPairs;
    return;
  }
  const r = sp.rules;
  if (r.tfMaxOverTw !== undefined && (GT.t > r.tfMaxOverTw * w.tw || GB.t > r.tfMaxOverTw * w.tw)) {
    pruned.rules += nPairs;
    return;
  }
  const Freq = flangeForce(s, w, s.Mneed, d, Math.max(GT.t, GB.t), Math.max(GT.fy, GB.fy));
  // the widest flanges of the group: if even they miss the bending or the deflection bound, all do
  const Tw = GT.options[GT.options.length - 1]!;
  const Bw = GB.options[GB.options.length - 1]!;
  if (Tw.A * Tw.fy + Bw.A * Bw.fy < Freq) {
    pruned.bending += nPairs;
    return;
  }
  if (IyReq > 0 && iyOfPlates(w.hw, w.tw, Tw.b, Tw.t, Bw.b, Bw.t) * (1 + 1e-9) < IyReq) {
    pruned.deflection += nPairs;
    return;
  }
  const pairs = pairsOf(s, gt, gb);
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
  if (k >= pairs.kg.length) return;
  // flange area: at least the lightest remaining pair, and at least what the bending bound needs
  const kgFloor = Math.max(pairs.kg[k]!, (Freq / Math.max(GT.fy, GB.fy)) * L * KG_PER_MM3);
  const lb = floorOf(s, plate.webMass + kgFloor + plate.minLayoutKg, 0);
  const fibT = plate.fibTop === Infinity ? Infinity : plate.fibTop / (GT.fy * GT.fy);
  const fibB = plate.fibBot === Infinity ? Infinity : plate.fibBot / (GB.fy * GB.fy);
  // every field from the start: one object shape for all runs (the heap reads many of them)
  s.heap.push({ kind: 0, lb, seq: s.seq++, plate, pairs, k, d, Freq, fibT, fibB, gt, gb, ltbTop: undefined, ltbBot: undefined, segsTop: undefined, segsBot: undefined, ltbSec: undefined, block: undefined, grid: undefined, iyRange: undefined, opened: false });
}

function groupSize(s: SliceState, gt: number, gb: number): number {
  const { groups } = s;
  return s.sp.symmetric ? groups[gt]!.options.length : groups[gt]!.options.length * groups[gb]!.options.length;
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
