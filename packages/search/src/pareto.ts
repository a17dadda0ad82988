import { better, type Evaluated } from './core.js';

/**
 * The Pareto set of (overall depth, objective) over a collection of feasible candidates: a point
 * is kept when nothing at its depth or shallower has a lower value, nothing strictly shallower has
 * an equal value, and, among equal values at one depth, it has the least key. The result is unique
 * whatever the order of the input, so slices can be merged in any order.
 */
export function paretoFront(points: Iterable<Evaluated>): Evaluated[] {
  const all = [...points].sort((a, b) => a.depth - b.depth || (better(a.value, a.key, b.value, b.key) ? -1 : better(b.value, b.key, a.value, a.key) ? 1 : 0));
  const out: Evaluated[] = [];
  let best = Infinity;
  let lastDepth = NaN;
  for (const e of all) {
    if (e.depth === lastDepth) continue; // the first at a depth is its best (sorted by value, then key)
    lastDepth = e.depth;
    if (e.value < best) {
      out.push(e);
      best = e.value;
    }
  }
  return out;
}
