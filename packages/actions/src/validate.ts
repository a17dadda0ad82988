import { DomainError } from '@platesmith/catalogue';
import { isRoadTraffic, psiFor, type PsiFactors } from './psi.js';
import type { ActionSpec, BeamProblem, CombinationFactors, DeflectionLimitSpec } from './types.js';

/** EN 1990:2002 Table A1.2(B) recommended values (ξ from the note to that table). */
export const RECOMMENDED_FACTORS: Readonly<CombinationFactors> = Object.freeze({
  gammaGsup: 1.35,
  gammaGinf: 1.0,
  gammaQ: 1.5,
  xi: 0.85,
});

/** Common practice, no source: total L/250 and variable L/360 under the characteristic combination. */
export const DEFAULT_DEFLECTION_LIMITS: readonly DeflectionLimitSpec[] = Object.freeze([
  { name: 'total', ratio: 250, combination: 'characteristic', include: 'all' },
  { name: 'variable', ratio: 360, combination: 'characteristic', include: 'variable' },
] as const);

/** Shortest length accepted as a span, mm: anything shorter is almost surely given in metres. */
export const MIN_SPAN = 1000;

export const DEFAULT_SS = 100;
export const DEFAULT_GRID = 40;

/** A validated action: positions resolved, ψ resolved for variable actions. */
export interface ResolvedAction {
  index: number;
  kind: 'permanent' | 'variable';
  load: 'udl' | 'partial-udl' | 'point';
  value: number;
  from: number;
  to: number;
  at: number;
  ss: number;
  psi: PsiFactors;
  name: string;
  /** traffic group (actions of one group lead together) */
  group?: string;
  /** EN 1990 Table A2.1 road traffic (γQ of road traffic under Annex A2) */
  traffic: boolean;
}

export function finite(v: unknown, field: string, unit: string): number {
  if (typeof v !== 'number' || !Number.isFinite(v)) {
    throw new DomainError('NOT_FINITE', `${field} must be a finite number (${unit}), got ${String(v)}`, `give ${field} in ${unit}`, field, { value: v });
  }
  return v;
}

export function lengthMm(v: unknown, field: string): number {
  const L = finite(v, field, 'mm');
  if (L <= 0) {
    throw new DomainError('SPAN_NOT_POSITIVE', `${field} must be a positive length in mm, got ${L}`, 'give lengths in mm, e.g. 24000', field, { value: L });
  }
  if (L < MIN_SPAN) {
    throw new DomainError(
      'SPAN_IMPLAUSIBLE',
      `${field} = ${L} mm is implausibly short for a girder`,
      `lengths are in mm: did you mean ${L * 1000} mm?`,
      field,
      { value: L, min: MIN_SPAN },
    );
  }
  return L;
}

function position(v: unknown, field: string, length: number): number {
  const x = finite(v, field, 'mm');
  if (x < 0 || x > length) {
    throw new DomainError(
      'OUTSIDE_BEAM',
      `${field} = ${x} mm is outside the girder (0 to ${length} mm)`,
      'positions are in mm from the left end of the girder',
      field,
      { value: x, length },
    );
  }
  return x;
}

function psiValue(v: unknown, field: string): number {
  const p = finite(v, field, 'dimensionless');
  if (p < 0 || p > 1) {
    throw new DomainError('PSI_OUT_OF_RANGE', `${field} = ${p} is outside 0…1`, 'ψ factors lie between 0 and 1 (EN 1990 Table A1.1)', field, { value: p });
  }
  return p;
}

export function resolveActions(actions: unknown, length: number): ResolvedAction[] {
  if (!Array.isArray(actions)) {
    throw new DomainError('BAD_ACTIONS', 'actions must be a list', 'give a list of actions (may be empty)', 'actions');
  }
  let nVar = 0;
  return actions.map((a: ActionSpec, i): ResolvedAction => {
    const f = `actions[${i}]`;
    if (a === null || typeof a !== 'object') {
      throw new DomainError('BAD_ACTION', `${f} must be an object`, 'see ActionSpec', f);
    }
    if (a.kind !== 'permanent' && a.kind !== 'variable') {
      throw new DomainError('BAD_ACTION_KIND', `${f}.kind must be 'permanent' or 'variable'`, "use 'permanent' or 'variable'", `${f}.kind`, { kind: a.kind });
    }
    if (a.load !== 'udl' && a.load !== 'partial-udl' && a.load !== 'point') {
      throw new DomainError('BAD_LOAD_TYPE', `${f}.load must be 'udl', 'partial-udl' or 'point'`, "use 'udl', 'partial-udl' or 'point'", `${f}.load`, { load: a.load });
    }
    const value = finite(a.value, `${f}.value`, a.load === 'point' ? 'N' : 'N/mm');
    let from = 0;
    let to = length;
    let at = 0;
    let ss = DEFAULT_SS;
    if (a.load === 'partial-udl') {
      from = position(a.from, `${f}.from`, length);
      to = position(a.to, `${f}.to`, length);
      if (!(from < to)) {
        throw new DomainError('BAD_RANGE', `${f}: from (${from} mm) must be less than to (${to} mm)`, 'give from < to, in mm from the left end', `${f}.from`, { from, to });
      }
    } else if (a.load === 'point') {
      at = position(a.at, `${f}.at`, length);
      if (a.ss !== undefined) {
        ss = finite(a.ss, `${f}.ss`, 'mm');
        if (ss < 0) throw new DomainError('BAD_BEARING_LENGTH', `${f}.ss must not be negative`, 'give the stiff bearing length in mm (0 or more)', `${f}.ss`, { ss });
      }
    }
    let psi: PsiFactors = { psi0: 0, psi1: 0, psi2: 0 };
    let name = a.name ?? '';
    if (a.kind === 'variable') {
      nVar++;
      if (name === '') name = a.category !== undefined ? `Q${nVar} (${a.category})` : `Q${nVar}`;
      if (a.category !== undefined) {
        psi = psiFor(a.category, `${f}.category`);
      } else if (a.psi0 === undefined || a.psi1 === undefined || a.psi2 === undefined) {
        throw new DomainError(
          'PSI_MISSING',
          `${f} is variable but has neither a category nor all of psi0, psi1, psi2`,
          "give category (EN 1990 Table A1.1, e.g. 'B', 'snow', 'wind') or psi0, psi1 and psi2",
          `${f}.category`,
        );
      }
      if (a.psi0 !== undefined) psi.psi0 = psiValue(a.psi0, `${f}.psi0`);
      if (a.psi1 !== undefined) psi.psi1 = psiValue(a.psi1, `${f}.psi1`);
      if (a.psi2 !== undefined) psi.psi2 = psiValue(a.psi2, `${f}.psi2`);
    } else if (name === '') {
      name = `G${i + 1}`;
    }
    if (a.group !== undefined && (typeof a.group !== 'string' || a.group.length === 0 || a.kind !== 'variable')) {
      throw new DomainError('BAD_GROUP', `${f}.group must be a non-empty name on a variable action`, "e.g. 'gr1a' on each of the tandem system, the UDL and the footway load", `${f}.group`);
    }
    return { index: i, kind: a.kind, load: a.load, value, from, to, at, ss, psi, name, ...(a.group !== undefined ? { group: a.group } : {}), traffic: isRoadTraffic(a.category) };
  });
}

/** EN 1990:2002/A1:2005 Table A2.4(B) recommended values for road bridges (from memory): γG 1.35 / 1.00, γQ 1.35 for road traffic and 1.50 for other variable actions, ξ 0.85. */
export const RECOMMENDED_FACTORS_A2_ROAD: Readonly<CombinationFactors> = Object.freeze({
  gammaGsup: 1.35,
  gammaGinf: 1.0,
  gammaQ: 1.5,
  gammaQTraffic: 1.35,
  xi: 0.85,
});

export function resolveFactors(f: Partial<CombinationFactors> | undefined, annex: 'A1' | 'A2-road' = 'A1'): CombinationFactors {
  const out = { ...(annex === 'A2-road' ? RECOMMENDED_FACTORS_A2_ROAD : RECOMMENDED_FACTORS) };
  if (f === undefined) return out;
  for (const k of ['gammaGsup', 'gammaGinf', 'gammaQ', 'gammaQTraffic', 'xi'] as const) {
    const v = f[k];
    if (v === undefined) continue;
    const x = finite(v, `factors.${k}`, 'dimensionless');
    if (x < 0 || (k === 'xi' && x > 1)) {
      throw new DomainError('BAD_FACTOR', `factors.${k} = ${x} is out of range`, k === 'xi' ? 'ξ lies between 0 and 1 (EN 1990 Table A1.2(B))' : 'partial factors are not negative', `factors.${k}`, { value: x });
    }
    out[k] = x;
  }
  return out;
}

export function resolveDeflection(d: DeflectionLimitSpec[] | undefined): DeflectionLimitSpec[] {
  if (d === undefined) return DEFAULT_DEFLECTION_LIMITS.map((x) => ({ ...x }));
  if (!Array.isArray(d)) throw new DomainError('BAD_DEFLECTION_LIMIT', 'deflection must be a list', 'give a list of deflection limits', 'deflection');
  return d.map((x, i) => {
    const f = `deflection[${i}]`;
    const ratio = finite(x?.ratio, `${f}.ratio`, 'span/deflection');
    if (ratio <= 0) throw new DomainError('BAD_DEFLECTION_LIMIT', `${f}.ratio must be positive`, 'e.g. 250 for span/250', `${f}.ratio`, { ratio });
    if (x.combination !== 'characteristic' && x.combination !== 'frequent' && x.combination !== 'quasi-permanent') {
      throw new DomainError('BAD_DEFLECTION_LIMIT', `${f}.combination is not an SLS combination`, "use 'characteristic', 'frequent' or 'quasi-permanent'", `${f}.combination`);
    }
    if (x.include !== 'all' && x.include !== 'variable') {
      throw new DomainError('BAD_DEFLECTION_LIMIT', `${f}.include must be 'all' or 'variable'`, "use 'all' or 'variable'", `${f}.include`);
    }
    return { name: String(x.name ?? `limit ${i + 1}`), ratio, combination: x.combination, include: x.include };
  });
}

export interface ResolvedProblem {
  spans: number[];
  length: number;
  actions: ResolvedAction[];
  combination: '6.10' | '6.10ab';
  annex: 'A1' | 'A2-road';
  factors: CombinationFactors;
  deflection: DeflectionLimitSpec[];
  grid: number;
  extra: number[];
}

export function resolveProblem(p: BeamProblem): ResolvedProblem {
  if (p === null || typeof p !== 'object') throw new DomainError('BAD_PROBLEM', 'the problem must be an object', 'see BeamProblem');
  if (!Array.isArray(p.spans) || p.spans.length === 0) {
    throw new DomainError('BAD_SPANS', 'spans must be a non-empty list of lengths (mm)', 'give span lengths in mm, e.g. [24000]', 'spans');
  }
  const spans = p.spans.map((L, i) => lengthMm(L, `spans[${i}]`));
  const length = spans.reduce((a, b) => a + b, 0);
  if (p.combination !== '6.10' && p.combination !== '6.10ab') {
    throw new DomainError('BAD_COMBINATION', "combination must be '6.10' or '6.10ab'", "use '6.10' or '6.10ab' (EN 1990 6.4.3.2(3), chosen by the national annex)", 'combination');
  }
  let grid = DEFAULT_GRID;
  if (p.gridDivisions !== undefined) {
    grid = finite(p.gridDivisions, 'gridDivisions', 'divisions per span');
    if (!Number.isInteger(grid) || grid < 1 || grid > 10000) {
      throw new DomainError('BAD_GRID', 'gridDivisions must be an integer from 1 to 10000', 'e.g. 40 (span/40)', 'gridDivisions', { value: grid });
    }
  }
  const extra = (p.extraStations ?? []).map((x, i) => position(x, `extraStations[${i}]`, length));
  const annex = p.annex ?? 'A1';
  if (annex !== 'A1' && annex !== 'A2-road') throw new DomainError('BAD_ANNEX', "annex must be 'A1' or 'A2-road'", "use 'A1' (buildings) or 'A2-road' (road bridges)", 'annex');
  return {
    spans,
    length,
    actions: resolveActions(p.actions, length),
    combination: p.combination,
    annex,
    factors: resolveFactors(p.factors, annex),
    deflection: resolveDeflection(p.deflection),
    grid,
    extra,
  };
}
