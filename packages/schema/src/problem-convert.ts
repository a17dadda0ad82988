import { analyse, analyseEnvelope, type ActionSpec, type Analysis } from '@platesmith/actions';
import { DomainError, FLAT_BARS, type GradeName } from '@platesmith/catalogue';
import { checkGirder, girderSelfWeight, type CheckOptions, type Effects, type GirderVerdict, type Section } from '@platesmith/checks';
import { DEFAULT_COST, defaultSpace, spaceSize, stiffenerStations, type CostModel, type SearchTask, type SpaceSpec } from '@platesmith/search';
import { designEffects } from '@platesmith/actions';
import { z } from 'zod';
import { assertStockThickness, BEARING_SIZING_NOTE, resolveOptions, restraintPositions, sectionAssumptions, toSection, type Assumption } from './convert.js';
import { ProblemFields, problemShape, type ProblemJson } from './problem.js';
import { SectionJson } from './section.js';
import { CostJson, SpaceJson, type SpaceJson as SpaceJsonT } from './space.js';
import { LIMITS } from './limits.js';
import { toN, toNmm } from './units.js';

export const CheckProblemInput = z
  .strictObject({ ...ProblemFields, section: SectionJson })
  .superRefine((p, ctx) => problemShape(p, ctx))
  .meta({ id: 'CheckProblemInput', description: 'a section checked for a problem; its own self-weight is added' });
export type CheckProblemInput = z.output<typeof CheckProblemInput>;

export const SearchInput = z
  .strictObject({
    ...ProblemFields,
    space: SpaceJson.default(SpaceJson.parse({})),
    objective: z.enum(['mass', 'cost']).default('mass'),
    cost: CostJson.optional(),
  })
  .superRefine((p, ctx) => problemShape(p, ctx))
  .meta({ id: 'SearchInput', description: 'a problem and the space of plates to search' });
export type SearchInput = z.output<typeof SearchInput>;

/** Support positions of a problem, mm. */
export function supportsOf(p: Pick<ProblemJson, 'spans' | 'envelope'>): number[] {
  if (p.envelope) return p.envelope.supports ? [...p.envelope.supports] : [0, p.envelope.length];
  const xs = [0];
  for (const L of p.spans ?? []) xs.push(xs[xs.length - 1]! + L);
  return xs;
}

/** Public problem → analysis (kN → N, kNm → N·mm; kN/m is N/mm). Domain errors name the field. */
export function toAnalysis(p: ProblemJson, extraStations: number[] = []): Analysis {
  if (p.envelope) {
    const e = p.envelope;
    return analyseEnvelope({
      envelope: e.stations.map((s) => ({ x: s.x, MEd: toNmm(s.M), VEd: toN(s.V) })),
      length: e.length,
      ...(e.supports ? { supports: e.supports } : {}),
      ...(e.reactions ? { reactions: e.reactions.map((r) => ({ x: r.x, R: toN(r.R) })) } : {}),
      ...(e.forces ? { forces: e.forces.map((f) => ({ x: f.x, F: toN(f.F), ss: f.ss })) } : {}),
    });
  }
  const actions: ActionSpec[] = (p.actions ?? []).map((a) => {
    const out: ActionSpec = { kind: a.kind, load: a.load, value: a.load === 'point' ? toN(a.value) : a.value };
    for (const k of ['at', 'from', 'to', 'ss', 'psi0', 'psi1', 'psi2', 'category', 'group', 'name'] as const) {
      if (a[k] !== undefined) (out as unknown as Record<string, unknown>)[k] = a[k];
    }
    return out;
  });
  const L = (p.spans ?? []).reduce((s, x) => s + x, 0);
  const inside = extraStations.filter((x) => x > 0 && x < L);
  return analyse({
    spans: p.spans ?? [],
    actions,
    combination: p.combination ?? '6.10',
    ...(p.annex ? { annex: p.annex } : {}),
    ...(p.factors ? { factors: p.factors } : {}),
    ...(p.deflection ? { deflection: p.deflection } : {}),
    ...(p.gridDivisions ? { gridDivisions: p.gridDivisions } : {}),
    ...(inside.length ? { extraStations: inside } : {}),
  });
}

/** Self-weight the girder carries, N/mm: web, flanges and intermediate stiffeners (girderSelfWeight, the search's own). */
export function selfWeight(s: Section, supports: readonly number[]): number {
  return girderSelfWeight(s, supports);
}

/**
 * The defaults a problem took (combination rule, load factors, deflection limits, analysis grid),
 * as assumptions of the answer. With an envelope the user's own analysis stands: none of these.
 */
export function problemAssumptions(p: ProblemJson): Assumption[] {
  if (p.envelope) return [{ field: 'envelope', value: 'given', note: 'design effects taken from your own global analysis as given (no combination, no self-weight added)' }];
  const out: Assumption[] = [];
  const a2 = p.annex === 'A2-road';
  if (p.annex === undefined) out.push({ field: 'annex', value: 'A1', note: 'EN 1990 Annex A1 (buildings); give "A2-road" for a road bridge (Table A2.4(B) factors, traffic groups)' });
  if (p.combination === undefined) out.push({ field: 'combination', value: '6.10', note: `EN 1990 eq. 6.10, each variable action${a2 ? ' (or traffic group)' : ''} leading in turn; 6.10ab for the worse of 6.10a and 6.10b` });
  const f = p.factors ?? {};
  const rec = a2 ? { gammaGsup: 1.35, gammaGinf: 1.0, gammaQ: 1.5, gammaQTraffic: 1.35, xi: 0.85 } : { gammaGsup: 1.35, gammaGinf: 1.0, gammaQ: 1.5, xi: 0.85 };
  const missing = (Object.keys(rec) as (keyof typeof rec)[]).filter((k) => (f as Record<string, unknown>)[k] === undefined);
  if (missing.length > 0) out.push({ field: 'factors', value: a2 ? 'A2.4(B)' : 'A1.2(B)', note: `EN 1990 Table ${a2 ? 'A2.4(B)' : 'A1.2(B)'} recommended ${missing.map((k) => `${k} = ${(rec as Record<string, number>)[k]}`).join(', ')} (${a2 ? 'road bridges' : 'buildings'})` });
  if (p.deflection === undefined) out.push({ field: 'deflection', value: 'L/250 total, L/360 variable', note: 'characteristic SLS combination (common practice, no source)' });
  if (p.gridDivisions === undefined) out.push({ field: 'gridDivisions', value: 40, note: 'analysis stations per span (plus supports, loads, stiffeners and restraints)' });
  for (const [i, a] of (p.actions ?? []).entries()) {
    if (a.kind === 'variable' && a.category === undefined && (a.psi0 === undefined || a.psi1 === undefined || a.psi2 === undefined)) {
      out.push({ field: `actions[${i}].psi`, value: 'category A', note: 'ψ factors not all given: the missing ones from EN 1990 Table A1.1 category A' });
    }
    if (a.load === 'point' && a.ss === undefined) out.push({ field: `actions[${i}].ss`, value: 100, note: 'stiff bearing length of the point load, mm' });
  }
  return out;
}

export interface CheckJob {
  section: Section;
  effects: Effects;
  options: CheckOptions;
  analysis: Analysis;
  /** self-weight added, N/mm */
  g: number;
  /** every default applied to the request */
  assumptions: Assumption[];
}

function restraintStations(o: CheckOptions): number[] {
  return [...(o.restraint.kind === 'at' ? o.restraint.at : []), ...(o.restraintBottom.kind === 'at' ? o.restraintBottom.at : [])];
}

/** A section checked for a problem, its own self-weight added as a permanent action. */
export function toCheckProblem(j: CheckProblemInput): CheckJob {
  return checkProblemsFor(j)(j.section);
}

/**
 * toCheckProblem for many sections on one problem (a schedule judging candidate sections for a
 * mark): the analysis depends on the section only through its stiffener positions (extra
 * stations), so it is made once per stiffener spacing and shared; the self-weight and effects are
 * the section's own. `toCheckProblem(j)` is `checkProblemsFor(j)(j.section)`, so both give the
 * same job. The problem's `section` field, if any, is not read.
 */
export function checkProblemsFor(j: Omit<CheckProblemInput, 'section'>): (s: SectionJson) => CheckJob {
  const supports = supportsOf(j);
  const { options, assumptions } = resolveOptions(j.options, supports);
  const general = [...problemAssumptions(j), ...assumptions];
  const restraint = restraintStations(options);
  const analyses = new Map<number, Analysis>();
  return (s) => {
    const section = toSection(s);
    assertStockThickness(section.top.t, 'section.topFlange.thickness');
    assertStockThickness(section.bot.t, 'section.bottomFlange.thickness');
    const a = section.stiffeners ? section.stiffeners.a : 0;
    let analysis = analyses.get(a);
    if (!analysis) {
      analysis = toAnalysis(j, [...(section.stiffeners ? exactStiffenerXs(supports, section.stiffeners.a) : []), ...restraint]);
      analyses.set(a, analysis);
    }
    // load-bearing stiffeners without positions stand under every concentrated force (whose positions do not depend on the self-weight)
    const withLoads = (section.loadStiffeners && s.loadStiffeners?.at === undefined) || (section.restraintStiffeners && s.restraintStiffeners?.at === undefined) ? toSection(s, analysis.forces.map((f) => f.x), restraintPositions(options)) : section;
    const g = analysis.kind === 'envelope' ? 0 : selfWeight(withLoads, supports);
    return { section: withLoads, effects: designEffects(analysis, g), options, analysis, g, assumptions: [...general, ...sectionAssumptions(s)] };
  };
}

export function runCheckJob(job: CheckJob): GirderVerdict {
  return checkGirder(job.section, job.effects, job.options);
}

function spansOf(supports: readonly number[]): number[] {
  return supports.slice(1).map((x, i) => x - supports[i]!);
}

function exactStiffenerXs(supports: readonly number[], a: number): number[] {
  // counted before the array is built: a small spacing on a long girder would be millions of stations
  const L = supports[supports.length - 1]! - supports[0]!;
  if (L / a > LIMITS.restraints) {
    throw new DomainError('TOO_MANY_STATIONS', `section.stiffeners.spacing = ${a} mm gives about ${Math.floor(L / a)} stiffeners over ${L} mm, over the limit of ${LIMITS.restraints}`, 'give the stiffener spacing a in mm (e.g. 2000)', 'section.stiffeners.spacing', { count: Math.floor(L / a), limit: LIMITS.restraints });
  }
  const xs: number[] = [];
  for (let i = 0; i + 1 < supports.length; i++) for (let k = 1; supports[i]! + k * a < supports[i + 1]! - 1; k++) xs.push(supports[i]! + k * a);
  return xs;
}

function grid(v: number[] | { min: number; max: number; step: number } | undefined, fallback: number[], field: string, tMax?: number): number[] {
  let xs: number[];
  if (v === undefined) xs = fallback;
  else if (Array.isArray(v)) xs = [...new Set(v)].sort((a, b) => a - b);
  else {
    // the count first (the schema caps it at 1000): a loop on min + i·step never ends where the step is below the values' precision
    const n = Math.floor((v.max - v.min) / v.step + 1e-9) + 1;
    xs = Array.from({ length: Math.min(n, 1001) }, (_, i) => Math.round((v.min + i * v.step) * 1e6) / 1e6);
  }
  for (const x of xs) {
    if (!(x > 0)) throw new DomainError('BAD_DIMENSION', `${field} holds ${x}: plate dimensions must be positive (mm)`, 'give positive values in mm', field, { value: x });
    if (tMax !== undefined && x > tMax) throw new DomainError('BAD_DIMENSION', `${field} holds ${x} mm, over ${tMax} mm`, 'lengths are in mm', field, { value: x });
  }
  return xs;
}

const list = (g: GradeName | GradeName[]): GradeName[] => (Array.isArray(g) ? [...new Set(g)] : [g]);

/** Public space → internal SpaceSpec with the catalogue's defaults. */
export function toSpace(j: SpaceJsonT): SpaceSpec {
  const d = defaultSpace();
  const panels = j.panels === undefined ? d.panels : Array.isArray(j.panels) ? [...new Set(j.panels)] : Array.from({ length: Math.max(0, j.panels.max - j.panels.min + 1) }, (_, i) => j.panels && !Array.isArray(j.panels) ? j.panels.min + i : 0);
  // one panel in the longest span is the same girder as none: keep the one form
  const panelsNorm = [...new Set(panels.map((n) => (n === 1 ? 0 : n)))].sort((a, b) => a - b);
  const g = j.grade;
  const grades = typeof g === 'string' || Array.isArray(g) ? { web: list(g as GradeName | GradeName[]), flanges: list(g as GradeName | GradeName[]) } : { web: list(g.web as GradeName | GradeName[]), flanges: list(g.flanges as GradeName | GradeName[]) };
  const tf = grid(j.flangeThickness, d.tf, 'space.flangeThickness', 150);
  for (const t of tf) assertStockThickness(t, 'space.flangeThickness');
  const flats = (j.flats ?? FLAT_BARS.map((f) => ({ width: f.b, thickness: f.t }))).map((f, i) => {
    if (!(f.width > 0 && f.thickness > 0)) throw new DomainError('BAD_DIMENSION', `space.flats[${i}] must have a positive width and thickness (mm)`, 'give flats in mm', `space.flats[${i}]`);
    return { b: f.width, t: f.thickness };
  });
  if (panelsNorm.some((n) => n > 0) && flats.length === 0) throw new DomainError('EMPTY_SPACE', 'stiffened layouts are asked for but space.flats is empty', 'give flats, or panels [0]', 'space.flats');
  const tw = grid(j.webThickness, d.tw, 'space.webThickness', 150);
  const bf = grid(j.flangeWidth, d.bf, 'space.flangeWidth', 3000);
  return {
    hw: grid(j.webDepth, d.hw, 'space.webDepth', 10_000),
    tw,
    bf,
    tf,
    symmetric: j.symmetric,
    panels: panelsNorm,
    flats,
    sides: j.stiffenerSides === 'both' ? [1, 2] : [j.stiffenerSides],
    loadStiffeners: [null, ...(j.loadStiffeners ?? []).map((f) => ({ b: f.width, t: f.thickness }))],
    restraintStiffener: j.restraintStiffeners ? { b: j.restraintStiffeners.width, t: j.restraintStiffeners.thickness } : null,
    endPosts: j.endPost === 'both' ? ['rigid', 'non-rigid'] : [j.endPost],
    webGrades: grades.web,
    flangeGrades: grades.flanges,
    minDepth: j.minDepth ?? 0,
    maxDepth: j.maxDepth ?? Number.POSITIVE_INFINITY,
    rules: {
      tfMaxOverTw: j.rules.tfMaxOverTw,
      bfOverTfMin: j.rules.bfOverTfMin,
      bfOverTfMax: j.rules.bfOverTfMax,
      stiffenerAtLeastWeb: j.rules.stiffenerAtLeastWeb,
    },
  };
}

export function toCost(j: z.output<typeof CostJson> | undefined): CostModel {
  if (!j) return DEFAULT_COST;
  return {
    ...DEFAULT_COST,
    ...(j.km !== undefined ? { km: j.km } : {}),
    ...(j.kfOverKm !== undefined ? { kfOverKm: j.kfOverKm } : {}),
    ...(j.gradeFactor ? { gradeFactor: { ...DEFAULT_COST.gradeFactor, ...j.gradeFactor } } : {}),
    ...(j.thetaD !== undefined ? { thetaD: j.thetaD } : {}),
    ...(j.flangeWeld ? { flangeWeld: j.flangeWeld } : {}),
    ...(j.stiffenerWeld ? { stiffenerWeld: j.stiffenerWeld } : {}),
    ...(j.painted !== undefined ? { painted: j.painted } : {}),
  };
}

/** Default cap on the number of candidates a request may ask the search to consider. */
export const DEFAULT_SPACE_CAP = 1e12;

/** Public search input → plain task for the workers. The space's size is checked against the cap first. */
export function toSearchTask(j: SearchInput, cap = DEFAULT_SPACE_CAP): SearchTask & { assumptions: Assumption[] } {
  const space = toSpace(j.space);
  const size = spaceSize(space);
  if (size > cap) {
    throw new DomainError('SPACE_TOO_LARGE', `the space holds ${size.toExponential(3)} candidates, over the cap of ${cap.toExponential(0)}`, 'narrow the grids (fewer widths, thicknesses or panel counts) or ask the operator to raise the cap', 'space', { size, cap });
  }
  // every flange wider than every web: the check library takes no other section (EN 1993 I-section),
  // so a narrower width would stop the search at its first such candidate, not be judged (checked
  // after the size: a space too large to search is refused as such first)
  const bfMin = Math.min(...space.bf);
  const twMax = Math.max(...space.tw);
  if (bfMin <= twMax) {
    throw new DomainError('FLANGE_NARROWER_THAN_WEB', `space.flangeWidth holds ${bfMin} mm, not wider than the thickest web of the space (${twMax} mm)`, 'every flange width must exceed every web thickness of the space (widths and thicknesses in mm)', 'space.flangeWidth', { value: bfMin, limit: twMax });
  }
  const supports = supportsOf(j);
  const { options, assumptions } = resolveOptions(j.options, supports);
  const spans = spansOf(supports);
  // the stations at every layout's stiffeners, counted before they are made
  const Lmax = Math.max(0, ...spans);
  let count = 0;
  for (const n of space.panels) if (n > 1) for (const L of spans) count += Math.ceil((L * n) / Lmax);
  if (count > LIMITS.stiffenerStations) {
    throw new DomainError('TOO_MANY_STATIONS', `space.panels gives ${count} stiffener stations over the spans, over the limit of ${LIMITS.stiffenerStations}`, 'ask for fewer or smaller panel counts (e.g. { "min": 0, "max": 16 })', 'space.panels', { count, limit: LIMITS.stiffenerStations });
  }
  const analysis = toAnalysis(j, [...stiffenerStations(spans, space.panels), ...restraintStations(options)]);
  const spaceDefaults = Object.keys(SpaceJson.shape).filter((k) => (j.space as Record<string, unknown>)[k] === undefined && !['minDepth', 'maxDepth'].includes(k));
  const all = [...problemAssumptions(j), ...assumptions];
  if (spaceDefaults.length > 0) all.push({ field: 'space', value: spaceDefaults.join(', '), note: 'these fields of the space take the catalogue defaults (see the API schema)' });
  // load-bearing stiffeners: offered only when asked for (today's girders otherwise), and only where there are concentrated forces
  const forces = analysis.forces;
  if (forces.length > 0 && j.space.loadStiffeners === undefined) {
    all.push({ field: 'space.loadStiffeners', value: 'none offered', note: 'concentrated forces enter the web unstiffened (patch loading, EN 1993-1-5 6, and the web-to-flange welds); list flats in space.loadStiffeners to let the search place load-bearing stiffeners under them (EN 1993-1-5 9.4)' });
  }
  const task = forces.length === 0 && (space.loadStiffeners?.length ?? 1) > 1 ? { ...space, loadStiffeners: [null] } : space;
  // the search sizes bearing stiffeners as check does (sizeBearing) and reports both end-post types only when asked
  all.push({ field: 'bearing', value: 'sized', note: BEARING_SIZING_NOTE });
  return { space: task, options, analysis, objective: j.objective, cost: toCost(j.cost), assumptions: all };
}
