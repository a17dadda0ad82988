/**
 * The slice search: best first over a heap of nodes, each holding candidates under a lower bound.
 *
 * Exactness rests on three rules, and every module of this folder keeps them:
 * 1. Every bound is a true lower bound: a node's `lb` is at most the objective of every candidate
 *    in it that passes `check`, and a bound that rules a candidate out is one that every passing
 *    section meets (each has a property test that a section beyond it fails the check).
 * 2. A node is dropped only when the staircase of feasible points found so far, at its depth or
 *    shallower, strictly beats its bound (staircase.ts `prunes`): nothing in it is on the Pareto
 *    set. Other workers' points (OuterBound) prune strictly only.
 * 3. Ties are broken by a total order: the heap by (lb, sequence number), the staircase by
 *    (value, candidate key) (core.ts `better`), so the answer is unique and equals brute force
 *    whatever the order of the space or the split into slices.
 * The order in which nodes are taken (the heap, the slacks of the runs and layouts) is for speed
 * only: it changes how many candidates are judged, never which are on the answer.
 *
 * Nodes: a run of flange pairs on one web plate and one pair of flange groups (runs.ts, grid.ts),
 * one set of plates (judge.ts judgePlates) and the stiffener layouts of a set of plates
 * (judgeLayouts). The state of the search is one object (state.ts SliceState) passed to plain
 * functions.
 */
import type { Prepared, SliceResult } from '../core.js';
import { advanceGrid } from './grid.js';
import { judgeLayouts, judgePlates } from './judge.js';
import { advanceSymmetric, runFailsPatch } from './runs.js';
import { platesOfRuns, seedRuns, type SlicePart } from './slicing.js';
import { nearMissesOf } from './staircase.js';
import { createSliceState, type OuterBound } from './state.js';

/**
 * Exact search over the web configurations of `runs` (runs of consecutive indices of prep.webs:
 * a slice): the Pareto set of overall depth against the objective, for that slice. A run may hold
 * several web plates or part of one; the parts of one plate in different runs are searched apart
 * (the same answer, less sharing). `part` shares the slice's runs out between workers; `signal`
 * stops the search (the points found so far are returned). `progress` is told, every few thousand
 * nodes and at the end, how many of the slice's candidates are settled (judged, or ruled out by a
 * bound or the rules) out of its size: the work done, for a progress display.
 */
export function searchSlice(
  prep: Prepared,
  runs: readonly (readonly [first: number, count: number])[],
  signal?: { aborted: boolean },
  outer?: OuterBound,
  part?: SlicePart,
  progress?: (settled: number, size: number) => void,
): SliceResult {
  const byPlate = platesOfRuns(prep.plateStarts, runs);
  // the fabrication rules can leave no flange option or no web configuration: nothing to search
  // (the candidates they left out are counted when the slices are merged, mergeSlices)
  if (prep.flanges.length === 0 || byPlate.length === 0) return emptySlice();
  const s = createSliceState(prep, byPlate, signal, outer, part);
  seedRuns(s);
  const { heap, pruned } = s;
  let pops = 0;
  if (progress) progress(settledOf(s.pruned, s.fullEvaluations), s.spaceSize);
  for (;;) {
    if (s.signal?.aborted) break;
    if (progress && (++pops & (PROGRESS_EVERY - 1)) === 0) progress(settledOf(s.pruned, s.fullEvaluations), s.spaceSize);
    const nd = heap.pop();
    if (!nd) break;
    if (nd.kind === 0) {
      if (!nd.opened) {
        nd.opened = true;
        if (runFailsPatch(s, nd)) {
          // every pair left (the prefix below the bending and deflection bounds is counted already)
          pruned.patchLoading += (nd.pairs.kg.length - nd.k) * nd.plate.layouts.length;
          continue;
        }
      }
      if (s.sp.symmetric) advanceSymmetric(s, nd);
      else advanceGrid(s, nd);
    } else if (nd.kind === 1) judgePlates(s, nd);
    else judgeLayouts(s, nd);
  }
  if (progress) progress(settledOf(s.pruned, s.fullEvaluations), s.spaceSize);
  return { front: [...s.stairs], nearMisses: nearMissesOf(s), spaceSize: s.spaceSize, fullEvaluations: s.fullEvaluations, pruned, failedBy: s.failedBy };
}

/** How many nodes between two progress reports (a power of two). */
const PROGRESS_EVERY = 4096;

/** Candidates settled so far: judged in full, or counted under the bound or rule that ruled them out. */
function settledOf(pruned: SliceResult['pruned'], judged: number): number {
  let n = judged;
  for (const k in pruned) n += pruned[k as keyof typeof pruned];
  return n;
}

function emptySlice(): SliceResult {
  const pruned = { depth: 0, rules: 0, shear: 0, bending: 0, flangeInducedBuckling: 0, deflection: 0, patchLoading: 0, patchBending: 0, lateralTorsional: 0, bearing: 0, sameFlanges: 0, webOnly: 0, incumbent: 0 };
  return { front: [], nearMisses: [], spaceSize: 0, fullEvaluations: 0, pruned, failedBy: {} };
}

export { unitSlot, type SlicePart } from './slicing.js';
export type { OuterBound } from './state.js';
