import { DomainError, STEEL_KG_PER_MM3, type GradeName } from '@platesmith/catalogue';
import type { PublishedSearch, SectionJson } from '@platesmith/schema';
import { highsRuntime, solveSelection, type SelectionModel, type SelectionOutcome } from './milp.js';
import type { Rates } from './tonnage.js';

/** A mark to be given one section: how many girders and how long. */
export interface RationaliseMark {
  mark: string;
  /** - */
  quantity: number;
  /** girder length, mm */
  length: number;
}

/** A section any mark may take. */
export interface RationaliseCandidate {
  /** stable id, e.g. the canonical section key */
  id: string;
  section: SectionJson;
  /** kg per metre of girder (plates and intermediate stiffeners smeared; see `sectionMassPerMetre`) */
  massPerMetre: number;
}

export interface RationaliseInput {
  marks: RationaliseMark[];
  candidates: RationaliseCandidate[];
  /** feasible[i][j]: candidate j passes every check for mark i (see `feasibilityMatrix`) */
  feasible: boolean[][];
  /** 'mass' (default) or 'cost' (needs `rates`) */
  objective?: 'mass' | 'cost';
  /** cost per kg of each grade; a hybrid section is priced by the area share of its plates */
  rates?: Rates;
  /** largest number of distinct sections to try; default N = min(marks, candidates) */
  maxK?: number;
  /**
   * also (or only, with `maxK: 0`) the plate rationalisation: at most `thicknesses` distinct plate
   * thicknesses (web and flanges) and at most `widths` distinct flange widths over the schedule
   */
  plates?: { thicknesses?: number; widths?: number };
  /** seconds for the whole rationalisation (every K and the plates), default 60 */
  timeLimit?: number;
  /** relative optimality gap at which a solve may stop, - (default 1e-4) */
  gap?: number;
  /**
   * largest C(candidates, K) × groups of marks solved by enumerating every choice of K sections
   * instead of the MILP (exact; small K: K = 1–3 on a 500-mark schedule, ~0.3 s for K = 3), default 1e8; 0: the MILP always
   */
  enumerationLimit?: number;
  /** progress, from the solver's callbacks and after each K */
  onProgress?(p: RationaliseProgress): void;
}

/** Progress of a rationalisation: which solve, the best total so far and the proven bound. */
export interface RationaliseProgress {
  /** 'sections' (K given) or 'plates' */
  stage: 'sections' | 'plates';
  /** K of this solve (sections) */
  K?: number;
  /** largest K to be solved */
  of?: number;
  /** best total found so far, kg or cost units; null before the first */
  incumbent: number | null;
  /** proven lower bound on the total, kg or cost units */
  bound: number | null;
  /** whether this solve is finished */
  done: boolean;
  /** ms since the rationalisation began */
  elapsedMs: number;
}

export interface Assignment {
  mark: string;
  candidate: string;
  /** quantity × value of one girder: kg, or cost units */
  value: number;
}

/** How a solve ended: proven optimal (within `gap`), or stopped by the time limit with a gap. */
export type SolveStatus = 'optimal' | 'time-limit';

export interface RationalisedChoice {
  feasible: true;
  /** Σ quantity × value, kg (or cost units) */
  total: number;
  /** total − the unrationalised optimum (every mark its own best), kg (or cost units) */
  penalty: number;
  /** penalty / unrationalised optimum, - */
  penaltyRatio: number;
  /** 'optimal': proven within the relative gap asked for (HiGHS's mip_rel_gap); 'time-limit': the best found when the time ran out */
  status: SolveStatus;
  /** proven lower bound on the total (kg or cost units): no choice within the limits is below it */
  bound: number;
  /** (total − bound) / total, -: how far from optimal the answer can be at most */
  gap: number;
  /** what gave the answer: the solver; the warm start it could not better in time (the greedy choice, or the answer for K − 1); or every mark's own best (already within the limits) */
  source: 'solver' | 'warm-start' | 'enumeration' | 'unrationalised';
  /** wall time of this solve, s */
  seconds: number;
  /** candidate ids used (at most K) */
  sections: string[];
  assignment: Assignment[];
}

export type RationalisedK = ({ K: number } & RationalisedChoice) | { K: number; feasible: false; status: 'infeasible' | 'time-limit'; reason: string; seconds: number };

/** At most T plate thicknesses and W flange widths over the schedule (whole sections otherwise free). */
export type PlateRationalisation = { maxThicknesses: number | null; maxWidths: number | null } & (
  | (RationalisedChoice & { thicknesses: number[]; widths: number[] })
  | { feasible: false; status: 'infeasible' | 'time-limit'; reason: string; seconds: number }
);

export interface Rationalisation {
  objective: 'mass' | 'cost';
  /** Σ quantity × value with every mark in the model on its own best feasible candidate */
  unrationalised: number | null;
  /** marks left out of the model (no feasible candidate, or none with a rate), with the reason */
  leftOut: { mark: string; quantity: number; reason: string }[];
  /** one entry per K = 1 … N */
  byK: RationalisedK[];
  /** the plate rationalisation, when asked */
  plates: PlateRationalisation | null;
  /** size of the model after reduction: groups of marks with the same feasible candidates, candidates no other dominates */
  model: { marks: number; groups: number; candidates: number; candidatesKept: number; pairs: number };
  /** the time limit, s, and the wall time of the whole rationalisation, s */
  timeLimit: number;
  seconds: number;
}

/**
 * Mass per metre of a section, kg/m at 7850 kg/m³: web and flange plates plus the intermediate
 * stiffener flats smeared over their spacing (sides · bs · ts · hw / a). Bearing stiffeners are
 * left out (a few flats per girder whatever the section). Used for "mass per metre × length".
 */
export function sectionMassPerMetre(s: SectionJson): number {
  const k = STEEL_KG_PER_MM3 * 1000; // kg per mm² per metre
  let area = s.web.depth * s.web.thickness + s.topFlange.width * s.topFlange.thickness + s.bottomFlange.width * s.bottomFlange.thickness;
  if (s.stiffeners) area += (s.stiffeners.sides * s.stiffeners.width * s.stiffeners.thickness * s.web.depth) / s.stiffeners.spacing;
  return area * k;
}

/** Canonical key of a section (key order fixed), for de-duplicating candidates. */
export function sectionKey(s: SectionJson): string {
  const gs = s.grade ?? 'S355';
  const g = typeof gs === 'string' ? gs : `${gs.web}/${gs.flanges}/${gs.stiffeners ?? gs.web}`;
  const st = s.stiffeners ? `a${s.stiffeners.spacing}-${s.stiffeners.sides}x${s.stiffeners.width}x${s.stiffeners.thickness}` : 'none';
  const br = s.bearing ? `${(s.bearing.pairs ?? 1) > 1 ? `${s.bearing.pairs}p` : ''}${s.bearing.width}x${s.bearing.thickness}${s.bearing.spacing !== undefined ? `e${s.bearing.spacing}` : ''}` : 'auto';
  return `${s.web.depth}x${s.web.thickness}|${s.topFlange.width}x${s.topFlange.thickness}|${s.bottomFlange.width}x${s.bottomFlange.thickness}|${st}|${s.endPost}|${br}|${g}`;
}

/**
 * Candidates for rationalisation from each mark's published search: its Pareto points and
 * lightest section, de-duplicated by section, plus any extra (near-optimal) sections the caller gives.
 */
export function candidatesFrom(searches: readonly (PublishedSearch | null)[], extra: readonly SectionJson[] = []): RationaliseCandidate[] {
  const out = new Map<string, RationaliseCandidate>();
  const add = (section: SectionJson) => {
    const id = sectionKey(section);
    if (!out.has(id)) out.set(id, { id, section, massPerMetre: sectionMassPerMetre(section) });
  };
  for (const s of searches) {
    if (!s) continue;
    for (const p of s.pareto) add(p.section);
    if (s.lightest) add(s.lightest.section);
  }
  for (const s of extra) add(s);
  return [...out.values()];
}

/**
 * feasible[i][j] = judge(marks[i], candidates[j]): the caller judges with the check library
 * (each mark's own actions and options), so this package never re-implements a check.
 */
export function feasibilityMatrix<M, C>(marks: readonly M[], candidates: readonly C[], judge: (mark: M, candidate: C, i: number, j: number) => boolean): boolean[][] {
  return marks.map((m, i) => candidates.map((c, j) => judge(m, c, i, j) === true));
}

function rateOf(s: SectionJson, rates: Rates): number | null {
  const g = s.grade ?? 'S355';
  if (typeof g === 'string') return rates[g as GradeName] ?? null;
  const rw = rates[g.web as GradeName];
  const rf = rates[g.flanges as GradeName];
  const rs = rates[(g.stiffeners ?? g.web) as GradeName];
  if (rw === undefined || rf === undefined || rs === undefined) return null;
  const aw = s.web.depth * s.web.thickness;
  const af = s.topFlange.width * s.topFlange.thickness + s.bottomFlange.width * s.bottomFlange.thickness;
  const as = s.stiffeners ? (s.stiffeners.sides * s.stiffeners.width * s.stiffeners.thickness * s.web.depth) / s.stiffeners.spacing : 0;
  return (rw * aw + rf * af + rs * as) / (aw + af + as);
}

function bad(message: string, field: string, hint: string): never {
  throw new DomainError('BAD_RATIONALISE_INPUT', message, hint, field);
}

/** value[i][j]: quantity_i × (mass per metre_j × length_i) [× rate of j], or null when j is infeasible for i. */
export function assignmentValues(input: RationaliseInput): (number | null)[][] {
  const { marks, candidates, feasible } = input;
  const objective = input.objective ?? 'mass';
  if (feasible.length !== marks.length) bad(`feasible has ${feasible.length} rows for ${marks.length} marks`, 'feasible', 'one row per mark');
  if (objective === 'cost' && !input.rates) bad('the cost objective needs rates per kg per grade', 'rates', 'give rates, or use the mass objective');
  const ids = new Set<string>();
  candidates.forEach((c, j) => {
    if (ids.has(c.id)) bad(`candidate id "${c.id}" repeats`, `candidates[${j}].id`, 'give each candidate its own id');
    ids.add(c.id);
    if (!(Number.isFinite(c.massPerMetre) && c.massPerMetre > 0)) bad(`candidates[${j}].massPerMetre must be positive, got ${c.massPerMetre}`, `candidates[${j}].massPerMetre`, 'kg/m');
  });
  const rate = candidates.map((c) => (objective === 'cost' ? rateOf(c.section, input.rates!) : 1));
  return marks.map((m, i) => {
    if (!(Number.isInteger(m.quantity) && m.quantity >= 1)) bad(`marks[${i}].quantity must be a whole number ≥ 1`, `marks[${i}].quantity`, 'number of girders');
    if (!(Number.isFinite(m.length) && m.length > 0)) bad(`marks[${i}].length must be positive (mm)`, `marks[${i}].length`, 'girder length in mm');
    const row = feasible[i]!;
    if (row.length !== candidates.length) bad(`feasible[${i}] has ${row.length} entries for ${candidates.length} candidates`, `feasible[${i}]`, 'one entry per candidate');
    return candidates.map((c, j) => {
      if (!row[j]) return null;
      const r = rate[j];
      if (r === null || r === undefined) return null; // no rate for its grade: not priced, so not offered
      return m.quantity * c.massPerMetre * (m.length / 1000) * r;
    });
  });
}


/** The plate thicknesses (web and flanges) and flange widths of a section, mm. */
export function platesOf(s: SectionJson): { thicknesses: number[]; widths: number[] } {
  return {
    thicknesses: [...new Set([s.web.thickness, s.topFlange.thickness, s.bottomFlange.thickness])].sort((a, b) => a - b),
    widths: [...new Set([s.topFlange.width, s.bottomFlange.width])].sort((a, b) => a - b),
  };
}

/** A reduced instance: groups of marks with the same feasible candidates, the candidates kept. */
interface Reduced {
  /** candidate indices kept (into the input's candidates) */
  kept: number[];
  /** per group: Σ quantity × length (m) of its marks */
  weight: number[];
  /** per group: feasible candidates, as indices into `kept` */
  feasible: number[][];
  /** group of each mark of the model (index into the groups), -1 for a mark left out */
  groupOf: number[];
}

/**
 * Exact reductions (they cannot change the optimum of any K or plate limit):
 * - marks with the same feasible candidates form one group whose weight is the sum of theirs
 *   (every candidate's value on a mark is the mark's weight × the candidate's value per metre);
 * - a candidate is dropped when another is no dearer, feasible for every group it is feasible for
 *   and (for the plate limits) uses no plate thickness or width it does not use: any choice with
 *   the dropped one stays within the limits, and no dearer, with the other instead.
 */
function reduce(rows: readonly (readonly number[])[], weight: readonly number[], v: readonly (number | null)[], plates: readonly { thicknesses: number[]; widths: number[] }[] | null): Reduced {
  const groupOf: number[] = [];
  const groups = new Map<string, number>();
  const gw: number[] = [];
  const gRows: (readonly number[])[] = [];
  rows.forEach((row, i) => {
    if (row.length === 0) {
      groupOf.push(-1);
      return;
    }
    const key = row.join(',');
    let g = groups.get(key);
    if (g === undefined) {
      g = gw.length;
      groups.set(key, g);
      gw.push(0);
      gRows.push(row);
    }
    gw[g]! += weight[i]!;
    groupOf.push(g);
  });
  const nG = gw.length;
  const words = Math.ceil(nG / 32);
  const nC = v.length;
  const bits: Uint32Array[] = Array.from({ length: nC }, () => new Uint32Array(words));
  const used = new Array<boolean>(nC).fill(false);
  gRows.forEach((row, g) => {
    for (const j of row) {
      bits[j]![g >>> 5]! |= 1 << (g & 31);
      used[j] = true;
    }
  });
  const order = [...Array(nC).keys()].filter((j) => used[j]).sort((a, b) => v[a]! - v[b]! || a - b);
  const subset = (a: readonly number[], b: readonly number[]) => a.every((x) => b.includes(x));
  const kept: number[] = [];
  for (const j of order) {
    const dominated = kept.some((k) => {
      const bj = bits[j]!;
      const bk = bits[k]!;
      for (let w = 0; w < words; w++) if ((bj[w]! & ~bk[w]!) !== 0) return false;
      if (plates && !(subset(plates[k]!.thicknesses, plates[j]!.thicknesses) && subset(plates[k]!.widths, plates[j]!.widths))) return false;
      return true;
    });
    if (!dominated) kept.push(j);
  }
  const index = new Map(kept.map((j, k) => [j, k]));
  const feasible = gRows.map((row) => row.filter((j) => index.has(j)).map((j) => index.get(j)!));
  return { kept, weight: gw, feasible, groupOf };
}

/** Total of a choice (candidate per group, kept indices) by the groups' weights; Infinity when a group has none. */
function totalOf(r: Reduced, v: readonly number[], pick: readonly number[]): number {
  let t = 0;
  for (let g = 0; g < pick.length; g++) t += r.weight[g]! * v[pick[g]!]!;
  return t;
}

/** Each group's cheapest candidate among `open` (kept indices); null when a group has none open. */
function assign(r: Reduced, v: readonly number[], open: ReadonlySet<number>): number[] | null {
  const pick: number[] = [];
  for (const row of r.feasible) {
    let best = -1;
    for (const j of row) if (open.has(j) && (best < 0 || v[j]! < v[best]! || (v[j] === v[best] && j < best))) best = j;
    if (best < 0) return null;
    pick.push(best);
  }
  return pick;
}

/**
 * A good choice of at most K sections, fast: greedy addition (the section that lowers the total
 * most, an uncovered group counting as dear as the dearest section twice over), then exchanges
 * (one open section for one closed) while any lowers the total, at most `passes` rounds. Null
 * when it covers not every group. The MILP's warm start.
 */
function greedy(r: Reduced, v: readonly number[], K: number, passes = 20): number[] | null {
  const nG = r.feasible.length;
  const nC = v.length;
  let vMax = 0;
  for (const x of v) vMax = Math.max(vMax, x);
  const miss = 2 * vMax + 1;
  const feas = new Uint8Array(nG * nC);
  const groupsOf: number[][] = Array.from({ length: nC }, () => []);
  r.feasible.forEach((row, g) =>
    row.forEach((j) => {
      groupsOf[j]!.push(g);
      feas[g * nC + j] = 1;
    }),
  );
  const C = r.weight;
  const cur = new Array<number>(nG).fill(miss);
  const open = new Set<number>();
  for (let step = 0; step < K; step++) {
    let best = -1;
    let bestGain = 0;
    for (let j = 0; j < nC; j++) {
      if (open.has(j)) continue;
      let gain = 0;
      for (const g of groupsOf[j]!) if (cur[g]! > v[j]!) gain += C[g]! * (cur[g]! - v[j]!);
      if (gain > bestGain) {
        bestGain = gain;
        best = j;
      }
    }
    if (best < 0) break;
    open.add(best);
    for (const g of groupsOf[best]!) cur[g] = Math.min(cur[g]!, v[best]!);
  }
  // exchanges: each group's best and second best open value, and which section gives the best
  const b1 = new Float64Array(nG);
  const b2 = new Float64Array(nG);
  const o1 = new Int32Array(nG);
  const bests = () => {
    let t = 0;
    for (let g = 0; g < nG; g++) {
      let x1 = miss;
      let x2 = miss;
      let k1 = -1;
      for (const j of open) {
        if (!feas[g * nC + j]) continue;
        if (v[j]! < x1) {
          x2 = x1;
          x1 = v[j]!;
          k1 = j;
        } else if (v[j]! < x2) x2 = v[j]!;
      }
      b1[g] = x1;
      b2[g] = x2;
      o1[g] = k1;
      t += C[g]! * x1;
    }
    return t;
  };
  let now = bests();
  for (let pass = 0; pass < passes; pass++) {
    let improved = false;
    search: for (const s of [...open]) {
      for (let j = 0; j < nC; j++) {
        if (open.has(j)) continue;
        let delta = 0;
        for (let g = 0; g < nG; g++) {
          const base = o1[g] === s ? b2[g]! : b1[g]!;
          const nb = feas[g * nC + j] && v[j]! < base ? v[j]! : base;
          delta += C[g]! * (nb - b1[g]!);
        }
        if (delta < -1e-12 * now) {
          open.delete(s);
          open.add(j);
          now = bests();
          improved = true;
          break search;
        }
      }
    }
    if (!improved) break;
  }
  return assign(r, v, open);
}

/** C(n, k) as a float (large values only compared with a limit). */
function choose(n: number, k: number): number {
  let c = 1;
  for (let i = 0; i < k; i++) c = (c * (n - i)) / (i + 1);
  return c;
}

/**
 * The best choice of K sections by enumerating every set of K (exact: a choice of fewer is no
 * better than any set of K that contains it); null when no set of K covers every group.
 */
function enumerate(r: Reduced, v: readonly number[], K: number): number[] | null {
  const nG = r.feasible.length;
  const nC = v.length;
  const cost: Float64Array[] = Array.from({ length: nC }, () => new Float64Array(nG).fill(Infinity));
  r.feasible.forEach((row, g) => row.forEach((j) => (cost[j]![g] = r.weight[g]! * v[j]!)));
  const k = Math.min(K, nC);
  const level: Float64Array[] = Array.from({ length: k + 1 }, () => new Float64Array(nG).fill(Infinity));
  const chosen: number[] = [];
  let best = Infinity;
  let bestSet: number[] | null = null;
  const walk = (depth: number, from: number): void => {
    if (depth === k) {
      let t = 0;
      const m = level[depth]!;
      for (let g = 0; g < nG && t < best; g++) t += m[g]!;
      if (t < best) {
        best = t;
        bestSet = [...chosen];
      }
      return;
    }
    const prev = level[depth]!;
    const next = level[depth + 1]!;
    for (let j = from; j <= nC - (k - depth); j++) {
      const c = cost[j]!;
      for (let g = 0; g < nG; g++) next[g] = c[g]! < prev[g]! ? c[g]! : prev[g]!;
      chosen.push(j);
      walk(depth + 1, j + 1);
      chosen.pop();
    }
  };
  walk(0, 0);
  return bestSet === null || !Number.isFinite(best) ? null : assign(r, v, new Set(bestSet));
}

/** One solve of the rationalisation and its best state so far. */
interface Job {
  stage: 'sections' | 'plates';
  K?: number;
  reduced: Reduced;
  v: number[];
  model: SelectionModel;
  pick: number[] | null;
  bound: number;
  optimal: boolean;
  infeasible: boolean;
  source: RationalisedChoice['source'];
  seconds: number;
  limits: number[];
}

function usedBy(pp: readonly { thicknesses: number[]; widths: number[] }[], pick: readonly number[]): { thicknesses: number[]; widths: number[] } {
  return {
    thicknesses: [...new Set(pick.flatMap((j) => pp[j]!.thicknesses))].sort((a, b) => a - b),
    widths: [...new Set(pick.flatMap((j) => pp[j]!.widths))].sort((a, b) => a - b),
  };
}

/**
 * Rationalisation: at most K distinct sections for the whole schedule (K = 1 … N), and, when
 * `plates` is given, at most T plate thicknesses and W flange widths; each mark given a candidate
 * that passes every check for it, minimising Σ quantity × mass (or cost). Marks without a
 * feasible (priced) candidate are left out of the model and listed. Each solve is the MILP of
 * milp.ts on the reduced instance, started from the greedy choice (or the previous K's, if
 * better), with a share of the time limit; the answer carries its proven bound and gap. A K with
 * no feasible choice is data: { feasible: false, reason }. The mass of a section on a mark is its
 * mass per metre × the mark's length.
 */
export async function rationalise(input: RationaliseInput): Promise<Rationalisation> {
  const t0 = performance.now();
  const objective = input.objective ?? 'mass';
  const w = assignmentValues(input);
  const timeLimit = input.timeLimit ?? 60;
  if (!(Number.isFinite(timeLimit) && timeLimit > 0)) bad(`timeLimit must be a positive number of seconds, got ${timeLimit}`, 'timeLimit', 'seconds for the whole rationalisation');
  const nM = input.marks.length;
  const nC = input.candidates.length;
  const elapsed = () => (performance.now() - t0) / 1000;
  // value per metre of each candidate (kg/m, × the rate for cost) and weight of each mark (quantity × m)
  const rate = input.candidates.map((c) => (objective === 'cost' ? rateOf(c.section, input.rates!) : 1));
  const v = input.candidates.map((c, j) => (rate[j] === null || rate[j] === undefined ? null : c.massPerMetre * rate[j]!));
  const weight = input.marks.map((m) => m.quantity * (m.length / 1000));
  const rows = w.map((row) => row.flatMap((x, j) => (x === null ? [] : [j])));
  const leftOut = input.marks.flatMap((m, i) => (rows[i]!.length === 0 ? [{ mark: m.mark, quantity: m.quantity, reason: `no feasible candidate${objective === 'cost' ? ' with a rate' : ''}` }] : []));
  const inModel = input.marks.map((_, i) => rows[i]!.length > 0);
  const pairs = rows.reduce((s, r) => s + r.length, 0);
  const N = Math.max(0, Math.min(input.maxK ?? Infinity, inModel.filter(Boolean).length, nC));

  const sec = reduce(rows, weight, v, null);
  const vs = sec.kept.map((j) => v[j]!);
  const model = { marks: inModel.filter(Boolean).length, groups: sec.weight.length, candidates: nC, candidatesKept: sec.kept.length, pairs };
  const empty: Rationalisation = { objective, unrationalised: null, leftOut, byK: [], plates: null, model, timeLimit, seconds: 0 };
  if (sec.weight.length === 0) return { ...empty, unrationalised: nM === 0 ? 0 : null, seconds: elapsed() };

  // every mark on its own best candidate: the unrationalised total, and how many sections it uses
  const bestPick = assign(sec, vs, new Set(vs.keys()))!;
  const answer = (r: Reduced, pick: readonly number[]) => {
    const assignment: Assignment[] = [];
    let total = 0;
    input.marks.forEach((m, i) => {
      const g = r.groupOf[i]!;
      if (g < 0) return;
      const j = r.kept[pick[g]!]!;
      const value = w[i]![j]!;
      total += value;
      assignment.push({ mark: m.mark, candidate: input.candidates[j]!.id, value });
    });
    return { total, assignment, sections: [...new Set(assignment.map((a) => a.candidate))] };
  };
  const base = answer(sec, bestPick);
  const best = base.total;
  const uCount = base.sections.length;
  const choice = (r: Reduced, pick: readonly number[], status: SolveStatus, bound: number, source: RationalisedChoice['source'], seconds: number): RationalisedChoice => {
    const a = answer(r, pick);
    const lb = Math.min(a.total, Math.max(bound, best));
    return {
      feasible: true,
      total: a.total,
      penalty: a.total - best,
      penaltyRatio: best > 0 ? (a.total - best) / best : 0,
      status,
      bound: lb,
      gap: a.total > 0 ? (a.total - lb) / a.total : 0,
      source,
      seconds,
      sections: a.sections,
      assignment: a.assignment,
    };
  };

  const platesAsked = input.plates !== undefined && (input.plates.thicknesses !== undefined || input.plates.widths !== undefined);
  const report = (p: Omit<RationaliseProgress, 'elapsedMs'>) => input.onProgress?.({ ...p, elapsedMs: elapsed() * 1000 });

  // the solves: each K below the unrationalised count of sections, and the plates
  const jobs: Job[] = [];
  for (let K = 1; K <= N && K < uCount; K++) {
    jobs.push({
      stage: 'sections',
      K,
      reduced: sec,
      v: vs,
      model: { weight: sec.weight, value: vs, feasible: sec.feasible, maxSections: K },
      pick: null,
      bound: 0,
      optimal: false,
      infeasible: false,
      source: 'solver',
      seconds: 0,
      limits: [],
    });
  }
  let platesJob: Job | null = null;
  let platesOwn: { pick: number[]; reduced: Reduced; use: { thicknesses: number[]; widths: number[] } } | null = null;
  const T = input.plates?.thicknesses;
  const W = input.plates?.widths;
  let pp: { thicknesses: number[]; widths: number[] }[] = [];
  if (platesAsked) {
    const all = input.candidates.map((c) => platesOf(c.section));
    const pr = reduce(rows, weight, v, all);
    const pv = pr.kept.map((j) => v[j]!);
    pp = pr.kept.map((j) => all[j]!);
    const own = assign(pr, pv, new Set(pv.keys()))!;
    const use = usedBy(pp, own);
    if ((T === undefined || use.thicknesses.length <= T) && (W === undefined || use.widths.length <= W)) platesOwn = { pick: own, reduced: pr, use };
    else {
      platesJob = {
        stage: 'plates',
        reduced: pr,
        v: pv,
        model: { weight: pr.weight, value: pv, feasible: pr.feasible, thicknesses: pp.map((p) => p.thicknesses), widths: pp.map((p) => p.widths), ...(T !== undefined ? { maxThicknesses: T } : {}), ...(W !== undefined ? { maxWidths: W } : {}) },
        pick: null,
        bound: 0,
        optimal: false,
        infeasible: false,
        source: 'solver',
        seconds: 0,
        limits: [],
      };
      jobs.push(platesJob);
    }
  }
  const h = jobs.length > 0 ? await highsRuntime() : null;

  // each solve gets an equal share of the time left (what one proves optimal early passes to the
  // rest); then those not proven share what is left over, each starting from its best so far. An
  // equal share of half the time first was tried: on 500 marks most solves need ~3 s for their
  // root LP, so short first shares were wasted (12 of 15 K not proven against 8)
  const enumerationLimit = input.enumerationLimit ?? 1e8;
  const run = (job: Job, limit: number) => {
    if (job.stage === 'sections' && job.limits.length === 0 && choose(job.v.length, job.K!) * job.reduced.weight.length <= enumerationLimit) {
      const t = performance.now();
      const pick = enumerate(job.reduced, job.v, job.K!);
      job.seconds = (performance.now() - t) / 1000;
      job.limits.push(0);
      if (pick) {
        job.pick = pick;
        job.optimal = true;
        job.source = 'enumeration';
        job.bound = totalOf(job.reduced, job.v, pick);
      } else job.infeasible = true;
      const total = pick ? answer(job.reduced, pick).total : null;
      report({ stage: 'sections', K: job.K!, of: N, incumbent: total, bound: total, done: true });
      return;
    }
    const starts: { pick: number[]; source: RationalisedChoice['source'] }[] = [];
    if (job.pick) starts.push({ pick: job.pick, source: job.source });
    if (job.stage === 'sections') {
      const g = greedy(job.reduced, job.v, job.K!);
      if (g) starts.push({ pick: g, source: 'warm-start' });
      const prev = jobs.find((x) => x.stage === 'sections' && x.K === job.K! - 1)?.pick;
      if (prev) starts.push({ pick: prev, source: 'warm-start' }); // K − 1 sections are a choice of at most K
    }
    let first: (typeof starts)[number] | null = null;
    for (const c of starts) if (!first || totalOf(job.reduced, job.v, c.pick) < totalOf(job.reduced, job.v, first.pick)) first = c;
    const start = first?.pick ?? null;
    const out = solveSelection(h!, job.model, {
      timeLimit: limit,
      ...(input.gap !== undefined ? { gap: input.gap } : {}),
      ...(start ? { start } : {}),
      onProgress: (p) => report({ stage: job.stage, ...(job.K !== undefined ? { K: job.K, of: N } : {}), incumbent: p.incumbent, bound: p.bound, done: false }),
    });
    job.seconds += out.seconds;
    job.limits.push(limit);
    if (out.found && (!first || totalOf(job.reduced, job.v, out.pick) <= totalOf(job.reduced, job.v, first.pick))) {
      job.pick = out.pick;
      job.source = 'solver';
      job.optimal = out.optimal;
    } else if (first) {
      // the solver found nothing better in its time: the start stands (not proven optimal)
      job.pick = first.pick;
      job.source = first.source;
    }
    if (out.found) job.bound = Math.max(job.bound, out.bound);
    if (!out.found && out.infeasible) job.infeasible = true;
    const total = job.pick ? answer(job.reduced, job.pick).total : null;
    report({ stage: job.stage, ...(job.K !== undefined ? { K: job.K, of: N } : {}), incumbent: total, bound: total === null ? null : Math.min(total, Math.max(job.bound, best)), done: true });
  };
  const yieldTurn = (): Promise<void> => new Promise((resolve) => setImmediate(resolve));
  for (let i = 0; i < jobs.length; i++) {
    run(jobs[i]!, Math.max(0.05, (timeLimit - elapsed()) / (jobs.length - i)));
    await yieldTurn(); // between solves, let the caller's event loop run
  }
  const open = jobs.filter((j) => !j.optimal && !j.infeasible);
  for (let i = 0; i < open.length; i++) {
    const limit = (timeLimit - elapsed()) / (open.length - i);
    if (limit < 0.05) break;
    run(open[i]!, limit);
    await yieldTurn();
  }

  const byK: RationalisedK[] = [];
  for (let K = 1; K <= N; K++) {
    const job = jobs.find((x) => x.stage === 'sections' && x.K === K);
    if (!job) {
      // every mark's own best already uses at most K sections: nothing to solve
      byK.push({ K, ...choice(sec, bestPick, 'optimal', best, 'unrationalised', 0) });
      continue;
    }
    byK.push({ K, ...outcome(job, `${K} section${K === 1 ? '' : 's'}`) });
  }
  let plates: PlateRationalisation | null = null;
  if (platesAsked) {
    const limits = { maxThicknesses: T ?? null, maxWidths: W ?? null };
    const what = [T !== undefined ? `${T} thickness${T === 1 ? '' : 'es'}` : null, W !== undefined ? `${W} flange width${W === 1 ? '' : 's'}` : null].filter(Boolean).join(' and ');
    if (platesOwn) plates = { ...limits, ...choice(platesOwn.reduced, platesOwn.pick, 'optimal', best, 'unrationalised', 0), ...platesOwn.use };
    else {
      const o = outcome(platesJob!, `at most ${what}`);
      plates = o.feasible ? { ...limits, ...o, ...usedBy(pp, platesJob!.pick!) } : { ...limits, ...o };
    }
  }
  function outcome(job: Job, what: string): RationalisedChoice | { feasible: false; status: 'infeasible' | 'time-limit'; reason: string; seconds: number } {
    if (job.pick) return choice(job.reduced, job.pick, job.optimal ? 'optimal' : 'time-limit', job.bound, job.source, job.seconds);
    if (job.infeasible) return { feasible: false, status: 'infeasible', reason: `no choice of ${what} fits every mark`, seconds: job.seconds };
    return { feasible: false, status: 'time-limit', reason: `no choice of ${what} found within ${job.limits.reduce((a, b) => a + b, 0).toFixed(1)} s (none is proven impossible)`, seconds: job.seconds };
  }
  return { objective, unrationalised: best, leftOut, byK, plates, model, timeLimit, seconds: elapsed() };
}
