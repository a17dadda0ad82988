import { isDomainError, type GradeName } from '@platesmith/catalogue';
import { firstFailure } from '@platesmith/checks';
import { CAUTION, CheckProblemInput, checkProblemsFor, parseWith, runCheckJob, SCOPE, SearchInput, SectionJson, supportsOf, toCheckProblem } from '@platesmith/schema';
import type { MarkResult, ScheduleResult } from './run.js';
import { failureReason, NO_FEASIBLE_SECTION, totalsOf } from './run.js';
import { mergeGirder, type BaselineJson, type ScheduleJson } from './schema.js';
import { compare, markRecord, type CompareResult, type CompareStatus, type MarkRecord } from './tender/compare.js';
import { candidatesFrom, rationalise, type RationaliseCandidate, type Rationalisation, type RationaliseMark, type RationaliseProgress } from './tender/rationalise.js';
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

export type RationalisationOutcome =
  | (Rationalisation & {
      skipped?: undefined;
      candidates: number;
      /** marks judged against the candidates (every mark whose input is valid and that was searched) */
      marks: string[];
      /** wall time of the feasibility checks (each mark × each candidate, by the check library), s */
      checkSeconds: number;
    })
  | { skipped: string };

/**
 * The estimate line of a mark without a section: the nearest miss's mass × quantity, flagged, so a
 * tender total is never silently short. `massPerGirder` is null when the search returned no
 * nearest miss (then nothing is estimated and the mark is named in `coverage.short`).
 */
export interface EstimateLine {
  mark: string;
  quantity: number;
  /** kg of one girder of the nearest miss; null: no nearest miss was returned */
  massPerGirder: number | null;
  /** quantity × massPerGirder, kg; null as above */
  mass: number | null;
  /** checks the nearest miss fails */
  failing: string[];
  /** why the line is flagged, in words */
  flag: string;
}

/** What the tonnage covers, and what it leaves out, in marks and girders. */
export interface TonnageCoverage {
  /** marks and girders in the tonnage */
  marks: number;
  girders: number;
  /** kg: the tonnage total */
  tonnage: number;
  /** marks and girders left out (listed in `leftOut`) */
  excludedMarks: number;
  excludedGirders: number;
  /** kg: Σ of the estimate lines (nearest misses), flagged, not designs */
  estimated: number;
  /** kg: tonnage + estimated */
  totalWithEstimates: number;
  /** marks left out with no estimate (no nearest miss, or the mark could not be run): the totals are short by them */
  short: string[];
}

/** Tender outputs of a run: tonnage (by grade, thickness, mark), the plate list, cost, rationalisation. */
export interface ScheduleTender {
  /** which section each mark's tonnage counts: the adopted one where given, else the lightest */
  basis: { mark: string; section: 'adopted' | 'lightest' }[];
  /** marks left out of the tonnage, with their quantity and the reason (failed, or no feasible section) */
  leftOut: { mark: string; quantity: number; reason: string }[];
  tonnage: Tonnage | null;
  /** what the tonnage covers and leaves out */
  coverage: TonnageCoverage;
  /** flagged estimate lines of the marks without a section */
  estimates: EstimateLine[];
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

/** Progress of finishing a run: the feasibility checks of the rationalisation, then its solves. */
export type FinishProgress = { stage: 'checks'; pairsDone: number; pairs: number; elapsedMs: number } | RationaliseProgress;

export interface FinishOptions {
  onProgress?(p: FinishProgress): void;
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
    // a mark without a section fails whether or not the baseline had one (a new mark too)
    if (f && (r.baseline !== null || f.error?.code === NO_FEASIBLE_SECTION)) {
      r.status = 'regressed';
      r.reasons = [failureReason(f), ...r.reasons];
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

function tenderOf(schedule: ScheduleJson, marks: readonly MarkResult[], inputs: Map<string, SearchInput | null>): Omit<ScheduleTender, 'rationalisation'> {
  const opts = schedule.tender;
  const basis: ScheduleTender['basis'] = [];
  const leftOut: ScheduleTender['leftOut'] = [];
  const estimates: EstimateLine[] = [];
  const short: string[] = [];
  const girders: TenderGirder[] = [];
  const byMark = new Map(schedule.girders.map((g) => [g.mark, g]));
  for (const m of marks) {
    const input = inputs.get(m.mark) ?? null;
    const g = byMark.get(m.mark);
    const adopted = g?.adopted !== undefined ? SectionJson.safeParse(g.adopted) : null;
    let section: SectionJson | null = null;
    if (input !== null && m.status === 'ok' && adopted?.success) {
      section = adopted.data;
      basis.push({ mark: m.mark, section: 'adopted' });
    } else if (input !== null && m.status === 'ok' && m.search?.lightest) {
      section = m.search.lightest.section;
      basis.push({ mark: m.mark, section: 'lightest' });
    }
    if (section === null) {
      const noSection = m.search !== null && m.search.lightest === null && (m.status === 'ok' || m.error?.code === NO_FEASIBLE_SECTION);
      leftOut.push({ mark: m.mark, quantity: m.quantity, reason: noSection ? 'no section in its space passes every check (and none adopted)' : `the mark failed: ${m.error?.message ?? 'invalid input'}` });
      if (noSection) {
        const miss = m.search!.nearMisses[0];
        if (miss) {
          estimates.push({ mark: m.mark, quantity: m.quantity, massPerGirder: miss.mass, mass: miss.mass * m.quantity, failing: miss.failing, flag: `ESTIMATE, not a design: the nearest miss (fails ${miss.failing.join(', ') || miss.governing.id}) × ${m.quantity}` });
        } else {
          estimates.push({ mark: m.mark, quantity: m.quantity, massPerGirder: null, mass: null, failing: [], flag: 'NO ESTIMATE: the search returned no nearest miss (every candidate was ruled out by a bound before any was judged); the totals are short by this mark' });
          short.push(m.mark);
        }
      } else short.push(m.mark);
      continue;
    }
    girders.push(tenderGirder(m.mark, m.quantity, section, supportsOf(input!)));
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
  const total = t?.total ?? 0;
  const estimated = estimates.reduce((s, e) => s + (e.mass ?? 0), 0);
  const coverage: TonnageCoverage = rounded({
    marks: girders.length,
    girders: girders.reduce((s, g) => s + g.quantity, 0),
    tonnage: total,
    excludedMarks: leftOut.length,
    excludedGirders: leftOut.reduce((s, l) => s + l.quantity, 0),
    estimated,
    totalWithEstimates: total + estimated,
    short,
  });
  return { basis, leftOut, tonnage: t, reconciliation, currency: opts?.currency ?? null, coverage, estimates: rounded(estimates) };
}

/**
 * Whether each candidate passes every check for one mark: the mark's own problem (spans, actions,
 * options; the candidate's self-weight added), exactly as `sectionPassesFor` judges it, with the
 * analysis shared between candidates of the same stiffener spacing (`checkProblemsFor`) and each
 * candidate stopped at its first failing check (`firstFailure`: the same verdict as checkGirder).
 */
export function feasibleFor(fields: Readonly<Record<string, unknown>>, candidates: readonly RationaliseCandidate[]): boolean[] {
  const problem: Record<string, unknown> = {};
  for (const [k, v] of Object.entries(fields)) if (!SEARCH_ONLY.has(k)) problem[k] = v;
  if (candidates.length === 0) return [];
  const p = parseWith(CheckProblemInput, { ...problem, section: candidates[0]!.section });
  if (!p.ok) return candidates.map(() => false);
  let jobs: ReturnType<typeof checkProblemsFor>;
  try {
    jobs = checkProblemsFor(p.value);
  } catch (e) {
    if (isDomainError(e)) return candidates.map(() => false);
    throw e;
  }
  return candidates.map((c) => {
    const s = SectionJson.safeParse(c.section);
    if (!s.success) return false;
    try {
      const job = jobs(s.data);
      return firstFailure(job.section, job.effects, job.options) === null;
    } catch (e) {
      if (isDomainError(e)) return false; // out of the checks' scope for this mark: not offered
      throw e;
    }
  });
}

const yieldTurn = (): Promise<void> => new Promise((resolve) => setImmediate(resolve));

async function rationaliseRun(schedule: ScheduleJson, marks: readonly MarkResult[], inputs: Map<string, SearchInput | null>, opts: FinishOptions): Promise<RationalisationOutcome> {
  const tender = schedule.tender!;
  const byMark = new Map(schedule.girders.map((g) => [g.mark, g]));
  // every mark that was searched is judged: a mark whose own space has no section may still take another mark's
  const usable = marks.filter((m) => m.search !== null && inputs.get(m.mark));
  if (usable.length === 0) return { skipped: 'no mark has a search result' };
  const candidates = candidatesFrom(usable.map((m) => m.search));
  const pairs = usable.length * candidates.length;
  if (pairs > tender.maxPairs) {
    return { skipped: `${usable.length} marks × ${candidates.length} candidates = ${pairs} pairs to check is over the limit of ${tender.maxPairs} (tender.maxPairs)` };
  }
  if (tender.objective === 'cost' && !tender.rates) return { skipped: 'the cost objective needs tender.rates' };
  const rm: RationaliseMark[] = usable.map((m) => {
    const sup = supportsOf(inputs.get(m.mark)!);
    return { mark: m.mark, quantity: m.quantity, length: sup[sup.length - 1]! - sup[0]! };
  });
  const t0 = performance.now();
  const feasible: boolean[][] = [];
  for (const m of usable) {
    feasible.push(feasibleFor(mergeGirder(schedule.defaults, byMark.get(m.mark)!), candidates));
    opts.onProgress?.({ stage: 'checks', pairsDone: feasible.length * candidates.length, pairs, elapsedMs: performance.now() - t0 });
    await yieldTurn(); // one mark's checks at a time on the caller's thread (tens of ms), so a server stays responsive
  }
  const checkSeconds = (performance.now() - t0) / 1000;
  const r = await rationalise({
    marks: rm,
    candidates,
    feasible,
    objective: tender.objective,
    ...(tender.rates ? { rates: tender.rates as Partial<Record<GradeName, number>> } : {}),
    maxK: tender.rationalise ?? 0,
    ...(tender.plates ? { plates: tender.plates } : {}),
    timeLimit: tender.timeLimit,
    ...(opts.onProgress ? { onProgress: opts.onProgress } : {}),
  });
  return { ...r, candidates: candidates.length, marks: usable.map((m) => m.mark), checkSeconds };
}

/**
 * Finishes a schedule run: totals, the record of every mark, the comparison with the
 * schedule's baseline (when given), tonnage and plate list of the adopted (else lightest)
 * sections (what it covers, and flagged estimates for the marks without a section), and the
 * rationalisation when `tender.rationalise` (K sections) or `tender.plates` is given. `marks`
 * must be in schedule order (one per girder). Pure apart from the check library's and the MILP
 * solver's work, bounded by `tender.maxPairs` and `tender.timeLimit`; it yields to the event loop
 * after each mark's checks and between solves (one solve, up to its share of the time limit, runs
 * without a break).
 */
export async function finishSchedule(schedule: ScheduleJson, marks: readonly MarkResult[], opts: FinishOptions = {}): Promise<ScheduleRunResult> {
  const inputs = inputsOf(schedule);
  const asked = schedule.tender !== undefined && (schedule.tender.rationalise !== undefined || schedule.tender.plates !== undefined);
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
    tender: { ...tenderOf(schedule, marks, inputs), rationalisation: asked ? await rationaliseRun(schedule, marks, inputs, opts) : null },
  };
}
