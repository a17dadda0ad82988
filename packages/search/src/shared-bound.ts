import type { OuterBound } from './slice/best-first.js';
import type { FlangeGroup, SpaceSpec } from './space.js';

/**
 * The staircase the worker threads of one search share: for each overall depth of the space, an
 * upper bound on the best feasible value found by any worker at that depth or shallower. Each
 * worker prunes with it strictly (a node whose lower bound exceeds it cannot hold a Pareto point),
 * so sharing it makes the slices faster and never changes the answer.
 *
 * Values are kept as integers (thousandths, rounded up, plus one) in an Int32Array over a
 * SharedArrayBuffer with Atomics: a stored value is never below the value it stands for. A value
 * too large to store is not stored (no information, still sound).
 */
const SCALE = 1000;
const NONE = 0x7fffffff;

export interface SharedStairsData {
  buffer: SharedArrayBuffer;
  depths: number[];
}

/** Every overall depth h = hw + tf,top + tf,bot the space can produce, ascending. */
export function depthGrid(sp: SpaceSpec, groups: readonly FlangeGroup[]): number[] {
  const tfs = [...new Set(groups.map((g) => g.t))];
  const sums = new Set<number>();
  for (const a of tfs) for (const b of tfs) if (!sp.symmetric || a === b) sums.add(a + b);
  const out = new Set<number>();
  for (const hw of sp.hw) for (const s of sums) out.add(hw + s);
  return [...out].sort((x, y) => x - y);
}

export function createSharedStairs(depths: number[]): SharedStairsData {
  const buffer = new SharedArrayBuffer(Math.max(1, depths.length) * 4);
  new Int32Array(buffer).fill(NONE);
  return { buffer, depths };
}

export class SharedStairs implements OuterBound {
  private readonly cells: Int32Array;
  private readonly depths: Float64Array;
  constructor(data: SharedStairsData) {
    this.cells = new Int32Array(data.buffer);
    this.depths = Float64Array.from(data.depths);
  }
  /** index of the deepest grid depth ≤ d, or −1 */
  private indexOf(d: number): number {
    const a = this.depths;
    let lo = 0;
    let hi = a.length;
    while (lo < hi) {
      const mid = (lo + hi) >> 1;
      if (a[mid]! <= d) lo = mid + 1;
      else hi = mid;
    }
    return lo - 1;
  }
  bestAt(d: number): number {
    const i = this.indexOf(d);
    if (i < 0) return Infinity;
    const v = Atomics.load(this.cells, i);
    return v === NONE ? Infinity : v / SCALE;
  }
  offer(d: number, value: number): void {
    const scaled = Math.ceil(value * SCALE) + 1;
    if (!(scaled < NONE) || scaled < 0) return;
    const c = this.cells;
    // every depth at or below d now has a feasible point of at most this value
    for (let i = Math.max(0, this.indexOf(d)); i < c.length; i++) {
      if (this.depths[i]! < d) continue;
      for (;;) {
        const cur = Atomics.load(c, i);
        if (cur <= scaled) break;
        if (Atomics.compareExchange(c, i, cur, scaled) === cur) break;
      }
    }
  }
}
