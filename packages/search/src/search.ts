import { assertSpace, spaceSize } from './space.js';
import { prepareSearch, type Evaluated, type PruneStats, type SearchProblem, type SliceResult } from './core.js';
import { searchSlice } from './slice/best-first.js';
import { paretoFront } from './pareto.js';

export interface SearchResult {
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

/** Merges slice results into one answer (exact: the front of a union is the front of the slices' fronts). */
export function mergeSlices(slices: SliceResult[], wallMs: number, workers: number, webConfigurations: number, size: number): SearchResult {
  const pareto = paretoFront(slices.flatMap((s) => s.front));
  const pruned: PruneStats = { depth: 0, rules: 0, shear: 0, bending: 0, flangeInducedBuckling: 0, deflection: 0, patchLoading: 0, patchBending: 0, lateralTorsional: 0, bearing: 0, sameFlanges: 0, webOnly: 0, incumbent: 0 };
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
  return {
    pareto,
    lightest: pareto.length > 0 ? pareto[pareto.length - 1]! : null,
    nearMisses,
    stats: { spaceSize: size, fullEvaluations: slices.reduce((n, s) => n + s.fullEvaluations, 0), pruned, failedBy, wallMs, workers, webConfigurations },
  };
}

/** Single-threaded exact search (the worker pool runs the same slices in parallel). */
export function search(p: SearchProblem, signal?: { aborted: boolean }): SearchResult {
  const t0 = performance.now();
  assertSpace(p.space);
  const prep = prepareSearch(p);
  const r = searchSlice(prep, [[0, prep.webs.length]], signal);
  return mergeSlices([r], performance.now() - t0, 1, prep.webs.length, spaceSize(p.space));
}
