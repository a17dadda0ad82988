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
import { iyOfPlates } from '@platesmith/checks';
import type { FlangeOption } from '../space.js';
import { floorOf } from './cost-floor.js';
import { gridPop, gridPush } from './heap.js';
import { boundsSide, ltbDeadWith, ltbStretchDead } from './ltb.js';
import { groupMass, melRd, rowPatchNeed } from './plate-tables.js';
import { flangeFails, iyRangeOf, tryPair } from './runs.js';
import { prunes } from './staircase.js';
import { doubles, type Grid, type RunNode, type SliceState } from './state.js';

/** Why a grid's pairs were ruled out without being taken (Grid.out). */
const enum GRID_OUT {
  FIB = 0,
  PATCH = 1,
  LTB = 2,
  BENDING = 3,
  DEFLECTION = 4,
  PATCH_BENDING = 5,
}


/** How far (relative) a run's floor may pass the heap's least before the run goes back to the heap: fewer returns, each a cache miss (only the order changes). */
const GRID_SLACK = 0.02;
/** The columns of a row the LTB set bound takes first (then twice as many each time the merge reaches past them): the heavier columns are most often never reached. */
const ROW_STRETCH = 4;

/** The grid of run c, made when first asked for: the rows and columns no pair of which meets the bending and deflection bounds are cut at once. */
function gridOf(s: SliceState, c: RunNode): Grid {
  if (c.grid) return c.grid;
  const { groups, groupStart } = s;
  const nt = groups[c.gt]!.options.length;
  const nb = groups[c.gb]!.options.length;
  const da = s.p.load.deflectionAffine;
  const iyNeed = Math.max(c.plate.IyReq, da ? iyRangeOf(s, c, da).lo : 0);
  const g: Grid = {
    nt,
    nb,
    t0: groupStart[c.gt]!,
    b0: groupStart[c.gb]!,
    mT: groupMass(s, c.gt),
    mB: groupMass(s, c.gb),
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
  // a row fails the bounds with every column when it fails them with the widest (area and Iy grow
  // with either width), so those rows are a prefix; likewise the columns that fail with the widest row
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
}

/** The first live column at or after j (judging columns as it goes; the pairs of row-to-be skipped over dead ones are counted), or nb. */
function liveColumnFrom(s: SliceState, c: RunNode, g: Grid, j: number): number {
  for (; j < g.nb; j++) {
    let st = g.col[j]!;
    if (st === 0) {
      const bi = g.b0 + j;
      if (flangeFails(s, c, s.flanges[bi]!, c.fibB)) st = 2 + GRID_OUT.FIB;
      else if (s.ltbSet && ltbDeadWith(s, c, false, bi)) st = 2 + GRID_OUT.LTB;
      else st = 1;
      g.col[j] = st;
    }
    if (st === 1) return j;
    g.out[st - 2]!++;
  }
  return g.nb;
}

/** The first live column at or after j whose pair with row a meets the row's 7.2 floor (pairs below it counted), or nb. */
function viableColumnFrom(s: SliceState, c: RunNode, g: Grid, a: number, j: number): number {
  const need = g.rowMel[a]!;
  for (;;) {
    j = liveColumnFrom(s, c, g, j);
    if (j >= g.nb || !(need > 0)) return j;
    // tryPair's test on every panel count at once: Mel,Rd below the least need fails them all
    if (melRd(s, c.plate.w, s.flanges[g.t0 + a]!, s.flanges[g.b0 + j]!) >= need * (1 - 1e-9)) return j;
    g.out[GRID_OUT.PATCH_BENDING]!++;
    j++;
  }
}

/** Takes up the next row: judged on its own, then its first live column into the merge. */
function takeUpRow(s: SliceState, c: RunNode, g: Grid): void {
  const i = g.nextRow++;
  const ti = g.t0 + i;
  const T = s.flanges[ti]!;
  const { nb } = g;
  if (flangeFails(s, c, T, c.fibT)) {
    g.out[GRID_OUT.FIB]! += nb;
    return;
  }
  if (s.forces.length > 0 && !s.loadable) {
    const need = rowPatchNeed(s, c.plate, ti);
    if (need < 0) {
      // no count passes 6.4 (−1), or none that does leaves room for the 7.2 floor (−2)
      g.out[need === -1 ? GRID_OUT.PATCH : GRID_OUT.PATCH_BENDING]! += nb;
      return;
    }
    g.rowMel[i] = need;
  }
  // the columns below the bending bound, then below the deflection bound: prefixes
  const opts = s.groups[c.gb]!.options;
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
  const j = viableColumnFrom(s, c, g, i, j0);
  if (j < nb) gridPush(g, i, j);
}

/** The run is over (every pair taken, or the rest beaten by feasible points): its pairs counted once each. */
function finishGrid(s: SliceState, c: RunNode, g: Grid): void {
  const pruned = s.pruned;
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
}

/** Next flange pairs of a mono-symmetric run, in ascending pair mass, until its floor passes the heap's least. */
export function advanceGrid(s: SliceState, c: RunNode): void {
  const g = gridOf(s, c);
  const { plate, d } = c;
  const heap = s.heap;
  // a row's lightest conceivable pair: with the first column any row can use
  const mB0 = g.mB[g.col0]!;
  for (;;) {
    const rowKg = g.nextRow < g.nt ? g.mT[g.nextRow]! + mB0 : Infinity;
    const pairKg = g.hn > 0 ? g.hk[0]! : Infinity;
    const least = Math.min(rowKg, pairKg);
    if (least === Infinity) {
      finishGrid(s, c, g);
      return;
    }
    const kg = plate.webMass + least;
    const floor = floorOf(s, kg + plate.minLayoutKg, 0);
    if (prunes(s, d, floor)) {
      finishGrid(s, c, g);
      return;
    }
    // back to the heap only once clearly past its least: the order is only for speed (every
    // pruning reads a true bound against a feasible value), so the answer cannot change
    if (floor > heap.peekLb() * (1 + GRID_SLACK)) {
      c.lb = floor;
      heap.push(c);
      return;
    }
    if (rowKg <= pairKg) {
      takeUpRow(s, c, g);
      continue;
    }
    const a = g.ha[0]!;
    const b = g.hb[0]!;
    gridPop(g);
    // the merge has reached a pair of the row that no LTB set bound covers yet: the bound over
    // its next stretch of columns (ROW_STRETCH, twice as many each time), not over the rest of
    // the row at once
    if (s.ltbSet && boundsSide(s, true)) {
      const shown = g.rowLtb[a]!;
      if (shown >= 0 && b >= shown) {
        const e = Math.min(g.nb, b + (ROW_STRETCH << g.rowChunks[a]!++));
        if (ltbStretchDead(s, c, true, g.t0 + a, b, e)) {
          g.out[GRID_OUT.LTB]! += e - b;
          g.rowLtb[a] = e;
          const next = viableColumnFrom(s, c, g, a, e);
          if (next < g.nb) gridPush(g, a, next);
          continue;
        }
        g.rowLtb[a] = -1;
      }
    }
    // the row's next live column
    const nb = viableColumnFrom(s, c, g, a, b + 1);
    if (nb < g.nb) gridPush(g, a, nb);
    g.yielded++;
    tryPair(s, c, g.t0 + a, g.b0 + b, kg);
  }
}
