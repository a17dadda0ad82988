import { isDomainError, type GradeName } from '@platesmith/catalogue';
import { CAUTION, CheckProblemInput, parseWith, SCOPE, runCheckJob, SearchInput, SectionJson, supportsOf, toCheckProblem } from '@platesmith/schema';
import type { MarkResult, ScheduleResult } from './run.js';
import { totalsOf } from './run.js';
import { mergeGirder, type BaselineJson, type ScheduleJson } from './schema.js';
import { compare, markRecord, type CompareResult, type CompareStatus, type MarkRecord } from './tender/compare.js';
import { candidatesFrom, feasibilityMatrix, rationalise, type Rationalisation, type RationaliseMark } from './tender/rationalise.js';
import { tenderGirder, tonnage, type TenderGirder, type Tonnage } from './tender/tonnage.js';

/** Format tag and version of a schedule result file (what `--out` writes and `--baseline` reads). */
export const RESULT_FORMAT = 'platesmith-schedule-result' as const;
export const RESULT_VERSION = 1 as const;

/** The regression comparison of a run with its baseline. */
export interface ScheduleComparison {
  /** relative tolerance on the lightest mass, - */
  massTolerance: number;
  /** one entry per mark: baseline order, then marks new in this run */
  results: CompareResult[];
  counts: Record<CompareStatus, number>;
  /** marks whose status is 'regressed' (a non-empty list makes the nightly run fail) */
  regressed: string[];
}

export type RationalisationOutcome = (Rationalisation & { skipped?: undefined; candidates: number; marks: string[] }) | { skipped: string };

/** Tender outputs of a run: tonnage (by grade, thickness, mark), the plate list, cost, rationalisation. */
export interface ScheduleTender {
  /** which section each mark's tonnage counts: the adopted one where given, else the lightest */
  basis: { mark: string; section: 'adopted' | 'lightest' }[];
  /** marks left out of the tonnage, with the reason (failed, or no feasible section) */
  leftOut: { mark: string; reason: string }[];
  tonnage: Tonnage | null;
  /**
   * How the tonnage reconciles with the lightest sections, kg: per mark the section counted (its
   * mass per girder, bearing stiffeners included, as in byMark) against the lightest the search
   * found, and the saving if the lightest were adopted; `used` = `lightest` + `saving` in total
   * (marks left out of the tonnage count in neither).
   */
  reconciliation: {
    byMark: { mark: string; quantity: number; section: 'adopted' | 'lightest'; perGirder: number; lightestPerGirder: number | null; savingPerGirder: number | null; saving: number | null }[];
    used: number;
    lightest: number;
    saving: number;
  } | null;
  /** currency of the rates and costs, as given (null: not said) */
  currency: string | null;
  rationalisation: RationalisationOutcome | null;
}

/** Masses to the gram (kg, 3 decimals) and costs to the cent, without binary round-off in the JSON. */
function rounded<T>(v: T, key = ''): T {
  if (typeof v === 'number') {
    if (!Number.isFinite(v) || Number.isInteger(v)) return v;
    const d = /cost/i.test(key) ? 2 : 3;
    return Number(v.toFixed(d)) as T;
  }
  if (Array.isArray(v)) return v.map((x) => rounded(x, key)) as T;
  if (v !== null && typeof v === 'object') return Object.fromEntries(Object.entries(v).map(([k, x]) => [k, rounded(x, k)])) as T;
  return v;
}

/**
 * A finished schedule run as one JSON document: the marks and totals of `runSchedule`, the
 * record of every mark (the baseline of a later run), the comparison with this run's baseline,
 * and the tender outputs.
 */
export interface ScheduleRunResult extends ScheduleResult {
  format: typeof RESULT_FORMAT;
  version: typeof RESULT_VERSION;
  caution: string;
  scope: string;
  records: MarkRecord[];
  comparison: ScheduleComparison | null;
  tender: ScheduleTender;
}

/** The records of a baseline (a previous result, or its records alone). */
export function baselineRecords(b: BaselineJson): MarkRecord[] {
  return b.records.map((r) => {
    const out: MarkRecord = { mark: r.mark, lightestMass: r.lightestMass, lightestGoverning: r.lightestGoverning };
    if (r.adoptedPasses !== undefined) out.adoptedPasses = r.adoptedPasses;
    if (r.adoptedGoverning !== undefined) out.adoptedGoverning = r.adoptedGoverning;
    return out;
  });
}

/** The comparison record of one mark result. */
export function recordOf(m: MarkResult): MarkRecord {
  return markRecord(m.mark, m.search, m.adopted);
}

/**
 * Compares a run with its baseline (compare() of the tender outputs). One rule is added here: a
 * mark that is in the baseline and could not be run at all this time (its input is invalid or
 * its search failed) is 'regressed', since a nightly run must not pass a girder it cannot check.
 */
export function compareRun(marks: readonly MarkResult[], baseline: readonly MarkRecord[], massTolerance: number): ScheduleComparison {
  const results = compare(baseline, marks.map(recordOf), { massTolerance });
  const failed = new Map(marks.filter((m) => m.status === 'failed').map((m) => [m.mark, m]));
  // and one more (#19): an adopted section that fails now is a regression whatever the baseline
  // said (a nightly job must fail on it, as it does without a baseline), not a mere change
  const adoptedFails = new Map(marks.filter((m) => m.adopted !== null && !m.adopted.passes).map((m) => [m.mark, m.adopted!]));
  for (const r of results) {
    const f = failed.get(r.mark);
    if (f && r.baseline !== null) {
      r.status = 'regressed';
      r.reasons = [`the mark could not be run: ${f.error?.message ?? 'failed'} (${f.error?.code ?? 'FAILED'})`, ...r.reasons];
    }
    const a = adoptedFails.get(r.mark);
    if (a && r.status !== 'regressed') {
      r.status = 'regressed';
      r.reasons = [`adopted section fails (governing: ${a.governing.id}, ${a.governing.clause}, utilisation ${a.governing.utilisation ?? 'inf'})`, ...r.reasons];
    }
  }
  const counts: Record<CompareStatus, number> = { pass: 0, regressed: 0, changed: 0, new: 0, removed: 0 };
  for (const r of results) counts[r.status]++;
  return { massTolerance, results, counts, regressed: results.filter((r) => r.status === 'regressed').map((r) => r.mark) };
}

/** Search input (merged and validated) of every girder of the schedule, by mark; null when invalid. */
function inputsOf(schedule: ScheduleJson): Map<string, SearchInput | null> {
  const out = new Map<string, SearchInput | null>();
  for (const g of schedule.girders) {
    const p = parseWith(SearchInput, mergeGirder(schedule.defaults, g));
    out.set(g.mark, p.ok ? p.value : null);
  }
  return out;
}

const SEARCH_ONLY = new Set(['space', 'objective', 'cost']);

/**
 * Whether a section passes every check for a mark: the mark's own problem (spans, actions,
 * options; self-weight of the section added) checked by the check library through
 * toCheckProblem, exactly as an adopted section is checked.
 */
export function sectionPassesFor(fields: Readonly<Record<string, unknown>>, section: SectionJson): boolean {
  const problem: Record<string, unknown> = {};
  for (const [k, v] of Object.entries(fields)) if (!SEARCH_ONLY.has(k)) problem[k] = v;
  const p = parseWith(CheckProblemInput, { ...problem, section });
  if (!p.ok) return false;
  try {
    return runCheckJob(toCheckProblem(p.value)).passes;
  } catch (e) {
    if (isDomainError(e)) return false; // out of the checks' scope for this mark: not offered
    throw e;
  }
}

function tenderOf(schedule: ScheduleJson, marks: readonly MarkResult[], inputs: Map<string, SearchInput | null>): ScheduleTender {
  const opts = schedule.tender;
  const basis: ScheduleTender['basis'] = [];
  const leftOut: ScheduleTender['leftOut'] = [];
  const girders: TenderGirder[] = [];
  const byMark = new Map(schedule.girders.map((g) => [g.mark, g]));
  for (const m of marks) {
    const input = inputs.get(m.mark) ?? null;
    if (m.status === 'failed' || input === null) {
      leftOut.push({ mark: m.mark, reason: `the mark failed: ${m.error?.message ?? 'invalid input'}` });
      continue;
    }
    const g = byMark.get(m.mark);
    const adopted = g?.adopted !== undefined ? SectionJson.safeParse(g.adopted) : null;
    let section: SectionJson | null = null;
    if (adopted?.success) {
      section = adopted.data;
      basis.push({ mark: m.mark, section: 'adopted' });
    } else if (m.search?.lightest) {
      section = m.search.lightest.section;
      basis.push({ mark: m.mark, section: 'lightest' });
    } else {
      leftOut.push({ mark: m.mark, reason: 'no adopted section and no feasible section found' });
      continue;
    }
    girders.push(tenderGirder(m.mark, m.quantity, section, supportsOf(input)));
  }
  const t = girders.length > 0 ? rounded(tonnage(girders, opts?.rates as Partial<Record<GradeName, number>> | undefined)) : null;
  let reconciliation: ScheduleTender['reconciliation'] = null;
  if (t) {
    const used = new Map(basis.map((b) => [b.mark, b.section]));
    const lightestOf = new Map(marks.map((m) => [m.mark, m.search?.lightest?.mass ?? null]));
    const byMark = t.byMark.map((m) => {
      const l = lightestOf.get(m.mark) ?? null;
      const per = m.perGirder.total;
      const savingPerGirder = l === null ? null : per - l;
      return { mark: m.mark, quantity: m.quantity, section: used.get(m.mark) ?? 'lightest', perGirder: per, lightestPerGirder: l, savingPerGirder, saving: savingPerGirder === null ? null : savingPerGirder * m.quantity };
    });
    const usedTotal = byMark.reduce((a, m) => a + m.perGirder * m.quantity, 0);
    const saving = byMark.reduce((a, m) => a + (m.saving ?? 0), 0);
    reconciliation = rounded({ byMark, used: usedTotal, lightest: usedTotal - saving, saving });
  }
  return { basis, leftOut, tonnage: t, reconciliation, currency: opts?.currency ?? null, rationalisation: opts?.rationalise !== undefined ? rationaliseRun(schedule, marks, inputs) : null };
}

function rationaliseRun(schedule: ScheduleJson, marks: readonly MarkResult[], inputs: Map<string, SearchInput | null>): RationalisationOutcome {
  const opts = schedule.tender!;
  const byMark = new Map(schedule.girders.map((g) => [g.mark, g]));
  const usable = marks.filter((m) => m.status === 'ok' && m.search !== null && inputs.get(m.mark));
  if (usable.length === 0) return { skipped: 'no mark has a search result' };
  const candidates = candidatesFrom(usable.map((m) => m.search));
  const pairs = usable.length * candidates.length;
  if (pairs > opts.maxPairs) {
    return { skipped: `${usable.length} marks × ${candidates.length} candidates = ${pairs} pairs to check is over the limit of ${opts.maxPairs} (tender.maxPairs)` };
  }
  if (opts.objective === 'cost' && !opts.rates) return { skipped: 'the cost objective needs tender.rates' };
  const rm: RationaliseMark[] = usable.map((m) => {
    const sup = supportsOf(inputs.get(m.mark)!);
    return { mark: m.mark, quantity: m.quantity, length: sup[sup.length - 1]! - sup[0]! };
  });
  const fields = usable.map((m) => mergeGirder(schedule.defaults, byMark.get(m.mark)!));
  const feasible = feasibilityMatrix(usable, candidates, (_m, c, i) => sectionPassesFor(fields[i]!, c.section));
  const r = rationalise({
    marks: rm,
    candidates,
    feasible,
    objective: opts.objective,
    ...(opts.rates ? { rates: opts.rates as Partial<Record<GradeName, number>> } : {}),
    maxK: opts.rationalise!,
  });
  return { ...r, candidates: candidates.length, marks: usable.map((m) => m.mark) };
}

/**
 * Finishes a schedule run: totals, the record of every mark, the comparison with the
 * schedule's baseline (when given), tonnage and plate list of the adopted (else lightest)
 * sections, and the rationalisation when `tender.rationalise` is given. `marks` must be in
 * schedule order (one per girder). Pure apart from the check library's work.
 */
export function finishSchedule(schedule: ScheduleJson, marks: readonly MarkResult[]): ScheduleRunResult {
  const inputs = inputsOf(schedule);
  const records = marks.map(recordOf);
  const comparison = schedule.baseline !== undefined ? compareRun(marks, baselineRecords(schedule.baseline), schedule.compare?.massTolerance ?? 0.01) : null;
  return {
    format: RESULT_FORMAT,
    version: RESULT_VERSION,
    caution: CAUTION,
    scope: SCOPE,
    name: schedule.name ?? null,
    marks: [...marks],
    totals: totalsOf(marks),
    records,
    comparison,
    tender: tenderOf(schedule, marks, inputs),
  };
}
