import type { Analysis } from '@platesmith/actions';
import type { CheckOptions } from '@platesmith/checks';
import { analysisLoadModel } from './load.js';
import type { CostModel } from './objective.js';
import type { Objective, SearchProblem } from './core.js';
import type { SpaceSpec } from './space.js';

/**
 * A search problem as plain data (structured-clone safe): what crosses the worker-thread
 * boundary. Each worker rebuilds the identical SearchProblem from it.
 */
export interface SearchTask {
  space: SpaceSpec;
  options: CheckOptions;
  analysis: Analysis;
  objective: Objective;
  cost: CostModel;
}

export function problemOf(t: SearchTask): SearchProblem {
  return { space: t.space, options: t.options, load: analysisLoadModel(t.analysis), objective: t.objective, cost: t.cost };
}

/**
 * Stations the analysis should include for every stiffener layout in the space: the stiffener
 * positions x0 + k·a of each span for a = Lmax/n, n in space.panels (panel boundaries are where
 * the largest shear of a panel is read).
 */
export function stiffenerStations(spans: readonly number[], panels: readonly number[]): number[] {
  const Lmax = Math.max(...spans);
  const xs = new Set<number>();
  let x0 = 0;
  for (const L of spans) {
    for (const n of panels) {
      if (n <= 1) continue;
      const a = Lmax / n;
      for (let k = 1; k * a < L - 1; k++) xs.add(x0 + k * a);
    }
    x0 += L;
  }
  return [...xs].sort((p, q) => p - q);
}
