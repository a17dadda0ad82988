import * as lp from 'javascript-lp-solver';
import { DomainError, STEEL_DENSITY, type GradeName } from '@platesmith/catalogue';
import type { PublishedSearch, SectionJson } from '@platesmith/schema';
import type { Rates } from './tonnage.js';

// The package's .d.ts is read as CJS under NodeNext, so the default import has no `.Solve` in
// the types; at run time the namespace or its `default` is the solver (ESM and CJS builds).
interface LpSolver {
  Solve(model: lp.Model): lp.SolveResult;
}
const lpModule = lp as unknown as { default?: LpSolver } & Partial<LpSolver>;
const solver: LpSolver = lpModule.default ?? (lpModule as LpSolver);

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
}

export interface Assignment {
  mark: string;
  candidate: string;
  /** quantity × value of one girder: kg, or cost units */
  value: number;
}

export type RationalisedK =
  | {
      K: number;
      feasible: true;
      /** Σ quantity × value, kg (or cost units) */
      total: number;
      /** total − the unrationalised optimum (every mark its own best), kg (or cost units) */
      penalty: number;
      /** penalty / unrationalised optimum, - */
      penaltyRatio: number;
      /** candidate ids used (at most K) */
      sections: string[];
      assignment: Assignment[];
    }
  | { K: number; feasible: false; reason: string };

export interface Rationalisation {
  objective: 'mass' | 'cost';
  /** Σ quantity × value with every mark on its own best feasible candidate; null when a mark has none */
  unrationalised: number | null;
  /** one entry per K = 1 … N */
  byK: RationalisedK[];
}

/**
 * Mass per metre of a section, kg/m at 7850 kg/m³: web and flange plates plus the intermediate
 * stiffener flats smeared over their spacing (sides · bs · ts · hw / a). Bearing stiffeners are
 * left out (a few flats per girder whatever the section). Used for "mass per metre × length".
 */
export function sectionMassPerMetre(s: SectionJson): number {
  const k = STEEL_DENSITY * 1e-9 * 1000; // kg per mm² per metre
  let area = s.web.depth * s.web.thickness + s.topFlange.width * s.topFlange.thickness + s.bottomFlange.width * s.bottomFlange.thickness;
  if (s.stiffeners) area += (s.stiffeners.sides * s.stiffeners.width * s.stiffeners.thickness * s.web.depth) / s.stiffeners.spacing;
  return area * k;
}

/** Canonical key of a section (key order fixed), for de-duplicating candidates. */
export function sectionKey(s: SectionJson): string {
  const gs = s.grade ?? 'S355';
  const g = typeof gs === 'string' ? gs : `${gs.web}/${gs.flanges}/${gs.stiffeners ?? gs.web}`;
  const st = s.stiffeners ? `a${s.stiffeners.spacing}-${s.stiffeners.sides}x${s.stiffeners.width}x${s.stiffeners.thickness}` : 'none';
  const br = s.bearing ? `${s.bearing.width}x${s.bearing.thickness}${s.bearing.spacing !== undefined ? `e${s.bearing.spacing}` : ''}` : 'auto';
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

interface Solved {
  total: number;
  pick: number[];
}

/**
 * The MILP for one K (javascript-lp-solver): binary y_j (section j used), binary x_ij (mark i
 * takes j) only where j is feasible for i (x_ij = 0 elsewhere by absence), Σ_j x_ij = 1,
 * x_ij − y_j ≤ 0, Σ_j y_j ≤ K; minimise Σ w_ij x_ij. The returned assignment is re-read from
 * the x values and checked (one feasible section per mark, at most K distinct) before use.
 */
function solveK(w: (number | null)[][], K: number): Solved | { reason: string } {
  const nM = w.length;
  const nC = w[0]?.length ?? 0;
  const variables: Record<string, Record<string, number>> = {};
  const constraints: Record<string, { equal?: number; max?: number }> = { count: { max: K } };
  const binaries: Record<string, 1> = {};
  // scale so the objective is of order 1: the simplex tolerances are absolute
  let scale = 0;
  for (const row of w) for (const v of row) if (v !== null) scale = Math.max(scale, v);
  scale = scale > 0 ? scale : 1;
  const used = new Set<number>();
  for (let i = 0; i < nM; i++) {
    constraints[`a${i}`] = { equal: 1 };
    for (let j = 0; j < nC; j++) {
      const v = w[i]![j];
      if (v === null || v === undefined) continue;
      used.add(j);
      const x = `x${i}_${j}`;
      variables[x] = { obj: v / scale, [`a${i}`]: 1, [`l${i}_${j}`]: 1 };
      constraints[`l${i}_${j}`] = { max: 0 };
      binaries[x] = 1;
    }
  }
  for (const j of used) {
    const y = `y${j}`;
    const col: Record<string, number> = { obj: 0, count: 1 };
    for (let i = 0; i < nM; i++) if (w[i]![j] !== null && w[i]![j] !== undefined) col[`l${i}_${j}`] = -1;
    variables[y] = col;
    binaries[y] = 1;
  }
  const res = solver.Solve({ optimize: 'obj', opType: 'min', constraints, variables, binaries });
  if (!res.feasible) return { reason: `no choice of ${K} section${K === 1 ? '' : 's'} fits every mark` };
  const pick: number[] = [];
  for (let i = 0; i < nM; i++) {
    let best = -1;
    let bestX = 0.5;
    for (let j = 0; j < nC; j++) {
      const v = res[`x${i}_${j}`];
      if (typeof v === 'number' && v > bestX) {
        best = j;
        bestX = v;
      }
    }
    if (best < 0) return { reason: `the solver returned no section for mark ${i}` };
    pick.push(best);
  }
  if (new Set(pick).size > K) return { reason: `the solver returned more than ${K} sections` };
  let total = 0;
  for (let i = 0; i < nM; i++) total += w[i]![pick[i]!]!;
  return { total, pick };
}

/**
 * Rationalisation: at most K distinct sections for the whole schedule, each mark given one that
 * passes every check for it, minimising Σ quantity × mass (or cost). Solved as a MILP for every
 * K = 1 … N (N = min(marks, candidates), or `maxK`), with the penalty against every mark on its
 * own best section. A K with no feasible choice is data: { feasible: false, reason }.
 * The mass of a section on a mark is its mass per metre × the mark's length.
 */
export function rationalise(input: RationaliseInput): Rationalisation {
  const objective = input.objective ?? 'mass';
  const w = assignmentValues(input);
  const nM = input.marks.length;
  const nC = input.candidates.length;
  const N = Math.max(0, Math.min(input.maxK ?? Infinity, nM, nC));
  const orphan = w.findIndex((row) => row.every((v) => v === null));
  if (nM === 0) return { objective, unrationalised: 0, byK: [] };
  if (orphan >= 0) {
    const reason = `mark ${input.marks[orphan]!.mark} has no feasible candidate${objective === 'cost' ? ' with a rate' : ''}`;
    return { objective, unrationalised: null, byK: Array.from({ length: N }, (_, k) => ({ K: k + 1, feasible: false as const, reason })) };
  }
  let best = 0;
  for (const row of w) best += Math.min(...row.filter((v): v is number => v !== null));
  const byK: RationalisedK[] = [];
  for (let K = 1; K <= N; K++) {
    const s = solveK(w, K);
    if ('reason' in s) {
      byK.push({ K, feasible: false, reason: s.reason });
      continue;
    }
    const assignment = s.pick.map((j, i) => ({ mark: input.marks[i]!.mark, candidate: input.candidates[j]!.id, value: w[i]![j]! }));
    const sections = [...new Set(assignment.map((a) => a.candidate))];
    byK.push({ K, feasible: true, total: s.total, penalty: s.total - best, penaltyRatio: best > 0 ? (s.total - best) / best : 0, sections, assignment });
  }
  return { objective, unrationalised: best, byK };
}
