import * as highsModule from 'highs';
import type { Highs } from 'highs';

// The package's .d.ts is read as CommonJS under NodeNext, so its default export is not callable in
// the types; at run time the ESM build's default (or the CJS module itself) is the loader.
type Loader = () => Promise<Highs>;
const loadHighs: Loader = (highsModule as unknown as { default?: Loader }).default ?? (highsModule as unknown as Loader);

/**
 * The selection MILP of the rationalisation, solved by HiGHS (compiled to WebAssembly, the `highs`
 * package): a reduced instance (groups of marks with the same feasible candidates, candidates that
 * no other dominates; see `reduce` in rationalise.ts) and the limits asked for.
 *
 *   minimise   Σ_g Σ_{j ∈ F_g} C_g v_j x_gj
 *   subject to Σ_{j ∈ F_g} x_gj = 1                      every group takes one section
 *              x_gj ≤ y_j,  Σ_j y_j ≤ K                    at most K sections        (when K is set)
 *              Σ_{j ∈ F_g, k ∈ T(j)} x_gj ≤ t_k,  Σ t_k ≤ T  at most T plate thicknesses (when set)
 *              Σ_{j ∈ F_g, l ∈ W(j)} x_gj ≤ u_l,  Σ u_l ≤ W  at most W flange widths     (when set)
 *              y, t, u binary;  0 ≤ x ≤ 1
 *
 * x may stay continuous: once y, t and u are whole, the allowed sections are fixed and each group
 * takes its cheapest allowed one (the assignment LP of an uncapacitated choice has whole vertices).
 * The link x_gj ≤ y_j per pair (not Σ_g x_gj ≤ |G| y_j) is the strong, disaggregated form of the
 * facility-location models: its LP relaxation is what makes branch-and-bound short. The plate links
 * are per group and plate (Σ_j x_gj = 1 makes them as strong as per pair, with far fewer rows).
 */

let runtime: Promise<Highs> | null = null;

/** The HiGHS runtime, loaded once per process on first use (~0.2 s to compile the WebAssembly). */
export function highsRuntime(): Promise<Highs> {
  runtime ??= loadHighs();
  return runtime!;
}

export interface SelectionModel {
  /** C_g: Σ quantity × length (m) of the group's marks [× nothing else], - */
  weight: readonly number[];
  /** v_j: kg per metre [× rate] of each candidate */
  value: readonly number[];
  /** F_g: candidate indices feasible for group g */
  feasible: readonly (readonly number[])[];
  /** plate thicknesses (ids) of each candidate, when T is set */
  thicknesses?: readonly (readonly number[])[];
  /** flange widths (ids) of each candidate, when W is set */
  widths?: readonly (readonly number[])[];
  maxSections?: number;
  maxThicknesses?: number;
  maxWidths?: number;
}

export interface SelectionProgress {
  /** best total found so far (the model's units) */
  incumbent: number | null;
  /** proven lower bound */
  bound: number | null;
  /** seconds into this solve */
  seconds: number;
}

export interface SelectionOptions {
  /** seconds this solve may take */
  timeLimit: number;
  /** relative optimality gap at which HiGHS stops, - (HiGHS's default 1e-4) */
  gap?: number;
  /** a known choice (candidate index per group), given to HiGHS as its first incumbent */
  start?: readonly number[];
  onProgress?(p: SelectionProgress): void;
}

export type SelectionOutcome =
  | { found: true; pick: number[]; optimal: boolean; bound: number; seconds: number }
  | { found: false; infeasible: boolean; seconds: number };

/** A selection model laid out for HiGHS: the model data, and how to read and seed its columns. */
export interface Built {
  data: Parameters<Highs['createModel']>[0] & { numCols: number; numRows: number };
  /** the row of Σ y ≤ K, or -1 */
  countRow: number;
  /** the y columns, as a selection, or null */
  yCols: { from: number; to: number } | null;
  scale: number;
  /** the choice read from a column vector (each group its cheapest allowed candidate), null when a group has none */
  decode(cv: ArrayLike<number>): number[] | null;
  /** a column vector of a choice (candidate per group) */
  encode(pick: readonly number[]): Float64Array;
}

export function buildSelection(h: Highs, m: SelectionModel): Built {
  const nG = m.feasible.length;
  const nC = m.value.length;
  // scale so the objective is of order 1 (HiGHS's absolute tolerances)
  let scale = 0;
  for (let g = 0; g < nG; g++) {
    let best = Infinity;
    for (const j of m.feasible[g]!) best = Math.min(best, m.value[j]!);
    scale += m.weight[g]! * best;
  }
  if (!(scale > 0)) scale = 1;

  const useY = m.maxSections !== undefined;
  const thick = m.maxThicknesses !== undefined ? idsOf(m.thicknesses!) : null;
  const wide = m.maxWidths !== undefined ? idsOf(m.widths!) : null;

  // columns: x (pairs) first, then y_j, t_k, u_l
  const pairG: number[] = [];
  const pairJ: number[] = [];
  const pairOf: Map<number, number>[] = [];
  for (let g = 0; g < nG; g++) {
    const mp = new Map<number, number>();
    for (const j of m.feasible[g]!) {
      mp.set(j, pairG.length);
      pairG.push(g);
      pairJ.push(j);
    }
    pairOf.push(mp);
  }
  const nX = pairG.length;
  const yCol = (j: number) => nX + j;
  const nY = useY ? nC : 0;
  const tBase = nX + nY;
  const nT = thick ? thick.ids.length : 0;
  const uBase = tBase + nT;
  const nU = wide ? wide.ids.length : 0;
  const numCols = uBase + nU;

  // rows: assign_g, then link_p (x_p − y_j ≤ 0), count, then plate links per (g, k) and their counts
  const rowLower: number[] = [];
  const rowUpper: number[] = [];
  const cols: { r: number; v: number }[][] = Array.from({ length: numCols }, () => []);
  for (let g = 0; g < nG; g++) {
    const r = rowLower.length;
    rowLower.push(1);
    rowUpper.push(1);
    for (const p of pairOf[g]!.values()) cols[p]!.push({ r, v: 1 });
  }
  let countRow = -1;
  if (useY) {
    for (let p = 0; p < nX; p++) {
      const r = rowLower.length;
      rowLower.push(-Infinity);
      rowUpper.push(0);
      cols[p]!.push({ r, v: 1 });
      cols[yCol(pairJ[p]!)]!.push({ r, v: -1 });
    }
    countRow = rowLower.length;
    rowLower.push(-Infinity);
    rowUpper.push(m.maxSections!);
    for (let j = 0; j < nC; j++) cols[yCol(j)]!.push({ r: countRow, v: 1 });
  }
  const plateRows = (ids: { ids: number[]; index: Map<number, number> }, of: readonly (readonly number[])[], base: number, limit: number) => {
    for (let g = 0; g < nG; g++) {
      const byK = new Map<number, number[]>();
      for (const [j, p] of pairOf[g]!) for (const k of of[j]!) (byK.get(k) ?? byK.set(k, []).get(k)!).push(p);
      for (const [k, ps] of byK) {
        const r = rowLower.length;
        rowLower.push(-Infinity);
        rowUpper.push(0);
        for (const p of ps) cols[p]!.push({ r, v: 1 });
        cols[base + ids.index.get(k)!]!.push({ r, v: -1 });
      }
    }
    const r = rowLower.length;
    rowLower.push(-Infinity);
    rowUpper.push(limit);
    for (let i = 0; i < ids.ids.length; i++) cols[base + i]!.push({ r, v: 1 });
  };
  if (thick) plateRows(thick, m.thicknesses!, tBase, m.maxThicknesses!);
  if (wide) plateRows(wide, m.widths!, uBase, m.maxWidths!);

  const numRows = rowLower.length;
  const starts = new Int32Array(numCols + 1);
  let nnz = 0;
  for (let c = 0; c < numCols; c++) nnz += cols[c]!.length;
  const indices = new Int32Array(nnz);
  const values = new Float64Array(nnz);
  let k = 0;
  for (let c = 0; c < numCols; c++) {
    starts[c] = k;
    for (const e of cols[c]!.sort((a, b) => a.r - b.r)) {
      indices[k] = e.r;
      values[k++] = e.v;
    }
  }
  starts[numCols] = k;
  const colCost = new Float64Array(numCols);
  for (let p = 0; p < nX; p++) colCost[p] = (m.weight[pairG[p]!]! * m.value[pairJ[p]!]!) / scale;
  const integrality = new Int32Array(numCols);
  for (let c = nX; c < numCols; c++) integrality[c] = h.constants.variableType.integer;
  const inf = h.infinity;
  const data = {
    numCols,
    numRows,
    colCost,
    colLower: new Float64Array(numCols),
    colUpper: new Float64Array(numCols).fill(1),
    rowLower: rowLower.map((v) => (v === -Infinity ? -inf : v)),
    rowUpper,
    matrix: { format: 'csc' as const, numRows, numCols, starts, indices, values },
    integrality,
  };

  const decode = (cv: ArrayLike<number>): number[] | null => {
    if (cv.length !== numCols) return null;
    const open = (j: number): boolean => {
      if (useY && !(cv[yCol(j)]! > 0.5)) return false;
      if (thick && m.thicknesses![j]!.some((t) => !(cv[tBase + thick.index.get(t)!]! > 0.5))) return false;
      if (wide && m.widths![j]!.some((w) => !(cv[uBase + wide.index.get(w)!]! > 0.5))) return false;
      return true;
    };
    const pick: number[] = [];
    for (let g = 0; g < nG; g++) {
      let best = -1;
      for (const j of m.feasible[g]!) if (open(j) && (best < 0 || m.value[j]! < m.value[best]! || (m.value[j] === m.value[best] && j < best))) best = j;
      if (best < 0) return null;
      pick.push(best);
    }
    return pick;
  };
  const encode = (pick: readonly number[]): Float64Array => {
    const x = new Float64Array(numCols);
    for (let g = 0; g < nG; g++) {
      const j = pick[g]!;
      x[pairOf[g]!.get(j)!] = 1;
      if (useY) x[yCol(j)] = 1;
      if (thick) for (const t of m.thicknesses![j]!) x[tBase + thick.index.get(t)!] = 1;
      if (wide) for (const w of m.widths![j]!) x[uBase + wide.index.get(w)!] = 1;
    }
    return x;
  };
  return { data, countRow, yCols: useY ? { from: nX, to: nX + nC - 1 } : null, scale, decode, encode };
}

/**
 * Solves one selection model. `pick[g]` is the candidate of group g, re-derived from the open
 * sections, thicknesses and widths (each group its cheapest allowed candidate), so the caller's
 * totals are computed from the data, never from solver floating point. `bound` is HiGHS's proven
 * lower bound in the model's units (the objective is scaled inside and scaled back here).
 */
export function solveSelection(h: Highs, m: SelectionModel, opts: SelectionOptions): SelectionOutcome {
  const b = buildSelection(h, m);
  const t0 = performance.now();
  const model = h.createModel(b.data);
  try {
    // presolve off: its probing of the binaries took 2-14 s on a 500-mark schedule and reduced nothing
    // (the root LP is whole there); with it off each K solved in 1.4-5 s instead of 1.5-25 s
    model.options.set({ output_flag: false, presolve: 'off', time_limit: Math.max(0.01, opts.timeLimit), mip_rel_gap: opts.gap ?? 1e-4 });
    if (opts.start) model.setSolution({ colValue: b.encode(opts.start) });
    const progress = opts.onProgress;
    // the time limit is also enforced from the callbacks: HiGHS checks its own clock between
    // simplex solves only (a K of a 500-mark schedule ran 9 s over a 3.7 s limit without this)
    const deadline = t0 + opts.timeLimit * 1000;
    const stop = (e: { interrupt(): void }): undefined => {
      if (performance.now() > deadline) e.interrupt();
      return undefined;
    };
    const T = h.constants.callbackType;
    model.run({
      [T.simplexInterrupt]: stop,
      [T.mipInterrupt]: stop,
      ...(progress
        ? {
            [T.mipImprovingSolution](e: { data: { mip_primal_bound?: number; mip_dual_bound?: number; running_time?: number } }): undefined {
              const d = e.data;
              progress({ incumbent: d.mip_primal_bound !== undefined ? d.mip_primal_bound * b.scale : null, bound: d.mip_dual_bound !== undefined ? d.mip_dual_bound * b.scale : null, seconds: d.running_time ?? 0 });
              return undefined;
            },
          }
        : {}),
    });
    const seconds = (performance.now() - t0) / 1000;
    const st = model.getModelStatus();
    const S = h.constants.modelStatus;
    if (st === S.infeasible) return { found: false, infeasible: true, seconds };
    const hasSolution = st === S.optimal || Number(model.info.get('primal_solution_status')) === 2;
    const pick = hasSolution ? b.decode(model.getSolution().colValue) : null;
    if (!pick) return { found: false, infeasible: false, seconds };
    const bound = Number(model.info.get('mip_dual_bound')) * b.scale;
    return { found: true, pick, optimal: st === S.optimal, bound: Number.isFinite(bound) ? bound : 0, seconds };
  } finally {
    model.dispose();
  }
}

function idsOf(of: readonly (readonly number[])[]): { ids: number[]; index: Map<number, number> } {
  const ids = [...new Set(of.flat())].sort((a, b) => a - b);
  return { ids, index: new Map(ids.map((v, i) => [v, i])) };
}
