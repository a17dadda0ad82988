/**
 * The staircase of feasible points found so far (depth ascending, value strictly descending), the
 * pruning test every node goes through, and the failed candidates kept for the nearest-miss report.
 */
import { checkGirder } from '@platesmith/checks';
import { better, type Evaluated } from '../core.js';
import type { Miss, SliceState } from './state.js';

/**
 * Whether the staircase beats a bound `lb` at depth `d`: some feasible point at depth ≤ d has a
 * value below lb, or equal to it at a strictly smaller depth (then nothing of value ≥ lb at depth d
 * is on the Pareto set). Values fall strictly as depths rise, so of the points at depth ≤ d only
 * the deepest can prune. Other workers' points (OuterBound) prune strictly only.
 */
export function prunes(s: SliceState, d: number, lb: number): boolean {
  const stairs = s.stairs;
  let lo = 0;
  let hi = stairs.length;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if (stairs[mid]!.depth <= d) lo = mid + 1;
    else hi = mid;
  }
  if (lo > 0) {
    const st = stairs[lo - 1]!;
    if (st.value < lb || (st.value === lb && st.depth < d)) return true;
  }
  return s.outer !== undefined && s.outer.bestAt(d) < lb;
}

/** A feasible point joins the staircase, dropping the points it dominates (ties by the total order `better`). */
export function admit(s: SliceState, e: Evaluated): void {
  s.outer?.offer(e.depth, e.value);
  const stairs = s.stairs;
  for (let i = stairs.length - 1; i >= 0; i--) {
    const st = stairs[i]!;
    const dominated = st.depth >= e.depth && (e.value < st.value || (e.value === st.value && (e.depth < st.depth || better(e.value, e.key, st.value, st.key))));
    if (dominated) stairs.splice(i, 1);
  }
  for (const st of stairs) {
    if (st.depth <= e.depth && (st.value < e.value || (st.value === e.value && (st.depth < e.depth || better(st.value, st.key, e.value, e.key))))) return;
  }
  let i = 0;
  while (i < stairs.length && stairs[i]!.depth < e.depth) i++;
  stairs.splice(i, 0, e);
}

/** How many failed candidates are kept for the nearest-miss report (the 5 reported are chosen among them). */
const MISSES_KEPT = 24;

/** Keeps a failed candidate for the nearest-miss report: the heaviest (closest to passing, as a rule). */
export function keepMiss(s: SliceState, m: Miss): void {
  const misses = s.misses;
  if (misses.length < MISSES_KEPT) misses.push(m);
  else {
    let i = 0;
    for (let j = 1; j < misses.length; j++) if (misses[j]!.lb < misses[i]!.lb) i = j;
    if (m.lb > misses[i]!.lb) misses[i] = m;
  }
}

/** Full results for the nearest misses, lowest governing utilisation first (only worth it when nothing passed). */
export function nearMissesOf(s: SliceState): Evaluated[] {
  if (s.stairs.length > 0) return [];
  const { p, o } = s;
  return s.misses
    .map((mi) => {
      const verdict = checkGirder(mi.section, p.load.effects(mi.g), o);
      return { key: mi.key, section: { ...mi.section, bearing: verdict.bearing }, depth: mi.depth, mass: mi.lb, value: mi.lb, verdict };
    })
    .sort((x, y) => x.verdict.governing.utilisation - y.verdict.governing.utilisation)
    .slice(0, 5);
}
