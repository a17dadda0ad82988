/**
 * The slice search's two heaps: the best-first heap of nodes (least lower bound first, ties by
 * sequence number) and the small merge heap of a mono-symmetric grid (one entry per row taken up,
 * least pair mass first, ties by row then column).
 */
import type { Grid, Node } from './state.js';

/**
 * A binary min-heap on (lb, seq). The keys live in typed arrays beside the nodes: the comparisons
 * of a large heap (10^5 nodes and more on mono-symmetric spaces) then read contiguous memory
 * instead of one scattered node object each.
 */
export class Heap {
  private lbs = new Float64Array(1024);
  private seqs = new Float64Array(1024);
  private nodes: (Node | undefined)[] = [];
  private n = 0;
  get size(): number {
    return this.n;
  }
  peekLb(): number {
    return this.n > 0 ? this.lbs[0]! : Infinity;
  }
  push(nd: Node): void {
    if (this.n === this.lbs.length) {
      const grow = (a: Float64Array) => {
        const b = new Float64Array(a.length * 2);
        b.set(a);
        return b;
      };
      this.lbs = grow(this.lbs);
      this.seqs = grow(this.seqs);
    }
    const { lbs, seqs, nodes } = this;
    const lb = nd.lb;
    const sq = nd.seq;
    let i = this.n++;
    while (i > 0) {
      const p = (i - 1) >> 1;
      const pl = lbs[p]!;
      if (!(lb < pl || (lb === pl && sq < seqs[p]!))) break;
      lbs[i] = pl;
      seqs[i] = seqs[p]!;
      nodes[i] = nodes[p]!;
      i = p;
    }
    lbs[i] = lb;
    seqs[i] = sq;
    nodes[i] = nd;
  }
  pop(): Node | undefined {
    if (this.n === 0) return undefined;
    const { lbs, seqs, nodes } = this;
    const top = nodes[0]!;
    const n = --this.n;
    if (n > 0) {
      const lb = lbs[n]!;
      const sq = seqs[n]!;
      const nd = nodes[n]!;
      let i = 0;
      for (;;) {
        const l = 2 * i + 1;
        if (l >= n) break;
        const r = l + 1;
        let m = l;
        if (r < n && (lbs[r]! < lbs[l]! || (lbs[r] === lbs[l] && seqs[r]! < seqs[l]!))) m = r;
        const ml = lbs[m]!;
        if (!(ml < lb || (ml === lb && seqs[m]! < sq))) break;
        lbs[i] = ml;
        seqs[i] = seqs[m]!;
        nodes[i] = nodes[m]!;
        i = m;
      }
      lbs[i] = lb;
      seqs[i] = sq;
      nodes[i] = nd;
    }
    // the slot past the end lets go of its node (the array keeps its length for the next push)
    nodes[n] = undefined;
    return top;
  }
}

/** Whether merge entry i of grid g comes before the entry (kg, a, b). */
function gridBefore(g: Grid, i: number, kg: number, a: number, b: number): boolean {
  return g.hk[i]! < kg || (g.hk[i] === kg && (g.ha[i]! < a || (g.ha[i] === a && g.hb[i]! < b)));
}

function gridMove(g: Grid, to: number, from: number): void {
  g.ha[to] = g.ha[from]!;
  g.hb[to] = g.hb[from]!;
  g.hk[to] = g.hk[from]!;
}

/** Into the merge: entry (row a, column b), keyed by its pair's mass. */
export function gridPush(g: Grid, a: number, b: number): void {
  const kg = g.mT[a]! + g.mB[b]!;
  let i = g.hn++;
  while (i > 0) {
    const q = (i - 1) >> 1;
    // one entry per row, so "not before the parent" is "after it"
    if (gridBefore(g, q, kg, a, b)) break;
    gridMove(g, i, q);
    i = q;
  }
  g.ha[i] = a;
  g.hb[i] = b;
  g.hk[i] = kg;
}

/** Drops the merge's least entry (entry 0, read by the caller before). */
export function gridPop(g: Grid): void {
  const n = --g.hn;
  if (n === 0) return;
  const a = g.ha[n]!;
  const b = g.hb[n]!;
  const kg = g.hk[n]!;
  let i = 0;
  for (;;) {
    const l = 2 * i + 1;
    if (l >= n) break;
    const r = l + 1;
    const m = r < n && gridBefore(g, r, g.hk[l]!, g.ha[l]!, g.hb[l]!) ? r : l;
    if (!gridBefore(g, m, kg, a, b)) break;
    gridMove(g, i, m);
    i = m;
  }
  g.ha[i] = a;
  g.hb[i] = b;
  g.hk[i] = kg;
}
