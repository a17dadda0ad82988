import { assertSpace, spaceSize } from './space.js';
import { prepareSearch, zeroPrunes, type Evaluated, type PruneStats, type SearchProblem, type SliceResult } from './core.js';
import { explained, explanationOf, needsMisses } from './limits.js';
import { searchSlice } from './slice/best-first.js';
import { paretoFront } from './pareto.js';

/**
 * How a search ended, as a scientific optimiser reports it: `exact` (the whole space was
 * searched and the Pareto set is exact), `infeasible` (the whole space was searched and nothing
 * passes), `aborted` (stopped before the end, e.g. by its time budget: every point returned
 * passes every check, but the set may be incomplete).
 */
export type SearchStatus = 'exact' | 'aborted' | 'infeasible';

export interface SearchResult {
  status: SearchStatus;
  /** Pareto set, depth ascending (so objective descending) */
  pareto: Evaluated[];
  /** the lightest (or cheapest) feasible candidate, or null */
  lightest: Evaluated | null;
  /** failed candidates closest to passing, when nothing is feasible (and otherwise for information) */
  nearMisses: Evaluated[];
  stats: {
    spaceSize: number;
    fullEvaluations: number;
    pruned: PruneStats;
    /** judged in full and failed, by governing check */
    failedBy: Record<string, number>;
    wallMs: number;
    workers: number;
    webConfigurations: number;
  };
}

/**
 * Merges slice results into one answer (exact: the front of a union is the front of the slices'
 * fronts). A slice that is missing (fewer slices than were started) or stopped early makes the
 * answer `aborted`; pass no slices for a search stopped before any slice ran.
 */
export function mergeSlices(slices: SliceResult[], wallMs: number, workers: number, webConfigurations: number, size: number): SearchResult {
  const pareto = paretoFront(slices.flatMap((s) => s.front));
  const pruned: PruneStats = zeroPrunes();
  for (const s of slices) for (const k of Object.keys(pruned) as (keyof PruneStats)[]) pruned[k] += s.pruned[k];
  // the slices hold the candidates the fabrication rules leave (bf/tf limits filter the flange
  // options, flats thinner than the web the layouts): the rest of the space the user was shown
  // is pruned by the rules, so that every candidate counts once
  pruned.rules += size - slices.reduce((n, s) => n + s.spaceSize, 0);
  const failedBy: Record<string, number> = {};
  for (const s of slices) for (const [k, v] of Object.entries(s.failedBy)) failedBy[k] = (failedBy[k] ?? 0) + v;
  const nearMisses = slices
    .flatMap((s) => s.nearMisses)
    .sort((a, b) => a.verdict.governing.utilisation - b.verdict.governing.utilisation)
    .slice(0, 5);
  const status: SearchStatus = slices.length === 0 || slices.some((s) => s.complete === false) ? 'aborted' : pareto.length > 0 ? 'exact' : 'infeasible';
  return {
    status,
    pareto,
    lightest: pareto.length > 0 ? pareto[pareto.length - 1]! : null,
    nearMisses,
    stats: { spaceSize: size, fullEvaluations: slices.reduce((n, s) => n + s.fullEvaluations, 0), pruned, failedBy, wallMs, workers, webConfigurations },
  };
}

/**
 * A stop signal the slice search polls between nodes, which records whether it ever answered
 * true: then the slice was cut short (its heap was not run empty) and is not complete.
 */
export function watchStop(stop: () => boolean): { signal: { readonly aborted: boolean }; cut(): boolean } {
  let cut = false;
  return {
    signal: {
      get aborted() {
        if (!cut && stop()) cut = true;
        return cut;
      },
    },
    cut: () => cut,
  };
}

/**
 * Single-threaded exact search (the worker pool runs the same slices in parallel). With
 * `explain`, each Pareto point says what rules out its lighter neighbours (limits.ts).
 */
export function search(p: SearchProblem, signal?: { aborted: boolean }, o: { explain?: boolean } = {}): SearchResult {
  const t0 = performance.now();
  assertSpace(p.space);
  const prep = prepareSearch(p);
  const w = signal ? watchStop(() => signal.aborted) : undefined;
  const r = searchSlice(prep, [[0, prep.webs.length]], w?.signal);
  const merged = mergeSlices([{ ...r, complete: !(w?.cut() ?? false) }], performance.now() - t0, 1, prep.webs.length, spaceSize(p.space));
  return o.explain ? explained(merged, explanationOf(prep, merged.pareto, needsMisses(merged))) : merged;
}
