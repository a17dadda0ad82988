import { FLAT_BARS } from '@platesmith/catalogue';
import { defaultOptions } from '@platesmith/checks';
import { analyse } from '@platesmith/actions';
import { DEFAULT_COST } from './objective.js';
import { defaultSpace, type SpaceSpec } from './space.js';
import { stiffenerStations, type SearchTask } from './task.js';

/**
 * Small searches that take every worker through the search's code paths once (symmetric and
 * mono-symmetric spaces, a point load, a continuous girder): the first real search of a fresh
 * pool is otherwise 2–10× slower while the workers compile. The problems are invented for this
 * purpose (no project); their answers are not used.
 */
export function warmUpTasks(): SearchTask[] {
  const space = (symmetric: boolean): SpaceSpec => ({
    ...defaultSpace(),
    hw: [900, 1100, 1300, 1500],
    tw: [8, 10, 12],
    bf: [250, 300, 350, 400, 450],
    tf: [15, 20, 25, 30],
    symmetric,
    panels: [0, 3, 5, 8],
    flats: [...FLAT_BARS].slice(0, 4),
  });
  const tasks: SearchTask[] = [];
  for (const spans of [[16000], [12000, 15000, 12000]]) {
    const L = spans.reduce((a, b) => a + b, 0);
    const supports = [0, ...spans.map((_, i) => spans.slice(0, i + 1).reduce((a, b) => a + b, 0))];
    for (const symmetric of [true, false]) {
      const sp = space(symmetric);
      const analysis = analyse({
        spans,
        actions: [
          { kind: 'permanent', load: 'udl', value: 10 },
          { kind: 'variable', load: 'udl', value: 12, category: 'B' },
          { kind: 'variable', load: 'point', value: 150e3, at: spans[0]! / 2, ss: 200, category: 'E' },
        ],
        combination: '6.10',
        extraStations: stiffenerStations(spans, sp.panels),
      });
      const restraint = { kind: 'at' as const, at: Array.from({ length: 4 * spans.length + 1 }, (_, i) => (L * i) / (4 * spans.length)) };
      tasks.push({ space: sp, options: defaultOptions(L, { supports, restraint }), analysis, objective: symmetric ? 'mass' : 'cost', cost: DEFAULT_COST });
    }
  }
  return tasks;
}
