import { isDomainError } from '@platesmith/catalogue';
import {
  CheckProblemInput,
  fromN,
  parseWith,
  publishSearch,
  publishVerdict,
  runCheckJob,
  SearchInput,
  toCheckProblem,
  toSearchTask,
  DEFAULT_SPACE_CAP,
  type FieldIssue,
  type PublishedSearch,
  type PublishedVerdict,
} from '@platesmith/schema';
import type { SearchResult, SearchTask } from '@platesmith/search';
import { mergeGirder, type ScheduleJson } from './schema.js';

/** Progress of a schedule run; times in ms. */
export interface ScheduleProgress {
  marksDone: number;
  marksTotal: number;
  /** the mark being worked on, null before the first and after the last */
  currentMark: string | null;
  elapsedMs: number;
  /** remaining time estimated from the mean time per mark so far; null before the first mark is done */
  estimateMs: number | null;
  /**
   * the mark that has just finished, on the one report that counts it (absent otherwise), so a
   * caller that only listens to progress can store each mark's result as soon as it exists
   */
  finished?: MarkResult;
}

/** Why one mark failed, as data (the other marks still run). */
export interface MarkError {
  /** 'INVALID_INPUT' for field issues, else the DomainError code, or 'SEARCH_FAILED' */
  code: string;
  message: string;
  field?: string;
  hint?: string;
  /** field issues of the mark's merged input (paths relative to the mark) */
  issues?: FieldIssue[];
}

export interface AdoptedCheck extends PublishedVerdict {
  /** self-weight added to the actions, kN/m */
  selfWeight: number;
}

export interface MarkResult {
  mark: string;
  quantity: number;
  status: 'ok' | 'failed';
  search: PublishedSearch | null;
  adopted: AdoptedCheck | null;
  error?: MarkError;
}

export interface ScheduleTotals {
  marks: number;
  /** marks that could not be run, or have no section (none in their space passes and none is adopted) */
  marksFailed: number;
  /** Σ quantity */
  girders: number;
  /** Σ quantity × lightest mass of the marks that have one, t: the marks in `marksWithoutFeasible` are not in it */
  tonnage: number;
  /** marks whose search found no feasible section */
  marksWithoutFeasible: string[];
  /** Σ quantity of the marks whose search found no feasible section (not in `tonnage`) */
  girdersWithoutFeasible: number;
  /** marks whose adopted section fails a check */
  adoptedFailing: string[];
}

export interface ScheduleResult {
  name: string | null;
  marks: MarkResult[];
  totals: ScheduleTotals;
}

export interface ScheduleDeps {
  /** the exact search (e.g. on the worker pool); must reject when `signal` aborts */
  search(task: SearchTask, signal?: AbortSignal): Promise<SearchResult>;
  onProgress?(p: ScheduleProgress): void;
  /** called with each mark's result as soon as it is known (index in `schedule.girders`) */
  onMark?(m: MarkResult, index: number): void;
  /** cap on candidates per mark (default DEFAULT_SPACE_CAP) */
  spaceCap?: number;
  /** clock, ms (tests may inject one) */
  now?(): number;
}

const SEARCH_ONLY = new Set(['space', 'objective', 'cost']);

function abortReason(signal: AbortSignal): unknown {
  return signal.reason ?? new DOMException('the schedule was cancelled', 'AbortError');
}

function asError(e: unknown): MarkError {
  if (isDomainError(e)) {
    const out: MarkError = { code: e.code, message: e.message, hint: e.hint };
    if (e.field !== undefined) out.field = e.field;
    return out;
  }
  return { code: 'SEARCH_FAILED', message: 'the search of this mark failed unexpectedly' };
}

/**
 * Runs a schedule mark by mark: each mark's merged input is validated (SearchInput), searched
 * through `deps.search`, and, when an adopted section is given, checked for the same problem
 * (CheckProblemInput, self-weight of the adopted section added). A mark that fails validation or
 * whose search throws fails alone, with its error as data. When `signal` aborts, the run rejects
 * with the signal's reason (nothing partial is returned).
 */
export async function runSchedule(schedule: ScheduleJson, deps: ScheduleDeps, signal?: AbortSignal): Promise<ScheduleResult> {
  const now = deps.now ?? (() => performance.now());
  const t0 = now();
  const total = schedule.girders.length;
  const marks: MarkResult[] = [];
  const progress = (current: string | null, finished?: MarkResult): void => {
    const elapsedMs = now() - t0;
    const done = marks.length;
    const p: ScheduleProgress = { marksDone: done, marksTotal: total, currentMark: current, elapsedMs, estimateMs: done === 0 ? null : (elapsedMs / done) * (total - done) };
    if (finished) p.finished = finished;
    deps.onProgress?.(p);
  };
  const girders = schedule.girders;
  for (let i = 0; i < girders.length; i++) {
    if (signal?.aborted) throw abortReason(signal);
    const g = girders[i]!;
    // the first report names the first mark; each later one counts the mark just done and names the next
    if (i === 0) progress(g.mark);
    const m = await runMark(schedule.defaults, g, deps, signal);
    marks.push(m);
    deps.onMark?.(m, i);
    progress(girders[i + 1]?.mark ?? null, m);
  }
  if (girders.length === 0) progress(null);
  return { name: schedule.name ?? null, marks, totals: totalsOf(marks) };
}

async function runMark(defaults: Record<string, unknown>, g: ScheduleJson['girders'][number], deps: ScheduleDeps, signal?: AbortSignal): Promise<MarkResult> {
  const base = { mark: g.mark, quantity: g.quantity };
  const fields = mergeGirder(defaults, g);
  const failed = (error: MarkError, search: PublishedSearch | null = null): MarkResult => ({ ...base, status: 'failed', search, adopted: null, error });

  const parsed = parseWith(SearchInput, fields);
  if (!parsed.ok) return failed({ code: 'INVALID_INPUT', message: `mark ${g.mark}: the input is invalid`, issues: parsed.issues });

  let adoptedInput: CheckProblemInput | null = null;
  if (g.adopted !== undefined) {
    const problem: Record<string, unknown> = {};
    for (const [k, v] of Object.entries(fields)) if (!SEARCH_ONLY.has(k)) problem[k] = v;
    const p = parseWith(CheckProblemInput, { ...problem, section: g.adopted });
    if (!p.ok) {
      const issues = p.issues.map((i) => (i.path.startsWith('section') ? { ...i, path: 'adopted' + i.path.slice('section'.length), pointer: '#/adopted' + i.pointer.slice('#/section'.length) } : i));
      return failed({ code: 'INVALID_INPUT', message: `mark ${g.mark}: the adopted section or its problem is invalid`, issues });
    }
    adoptedInput = p.value;
  }

  let search: PublishedSearch;
  try {
    const task = toSearchTask(parsed.value, deps.spaceCap ?? DEFAULT_SPACE_CAP);
    const r = await deps.search(task, signal);
    search = publishSearch(r, task.objective, task.analysis.length, undefined, task.assumptions);
  } catch (e) {
    if (signal?.aborted) throw abortReason(signal);
    return failed(asError(e));
  }

  let adopted: AdoptedCheck | null = null;
  if (adoptedInput) {
    try {
      const job = toCheckProblem(adoptedInput);
      adopted = { ...publishVerdict(runCheckJob(job), job.assumptions), selfWeight: Math.round(fromN(job.g) * 1e6) / 1e3 };
    } catch (e) {
      const err = asError(e);
      if (err.field?.startsWith('section')) err.field = 'adopted' + err.field.slice('section'.length);
      return failed(err, search);
    }
  }
  // a mark without a section is a failed mark (summary, exit code, JUnit, report), its search kept for the nearest misses
  if (search.lightest === null && adopted === null) return failed(noSectionError(g.mark, search), search);
  return { ...base, status: 'ok', search, adopted };
}

/** Error code of a mark whose search found no feasible section and that has no adopted section. */
export const NO_FEASIBLE_SECTION = 'NO_FEASIBLE_SECTION';

const kgText = (v: number) => `${Math.round(v).toLocaleString('en-GB')} kg`;

/** The nearest misses of a search in words, or an explicit statement that there are none. */
export function nearMissesText(search: PublishedSearch): string {
  const misses = search.nearMisses;
  if (misses.length === 0) return 'the search returned no nearest miss (every candidate was ruled out by a bound before any was judged)';
  const m = misses[0]!;
  const s = m.section;
  const plates = `web ${s.web.depth}×${s.web.thickness}, flanges ${s.topFlange.width}×${s.topFlange.thickness} / ${s.bottomFlange.width}×${s.bottomFlange.thickness}`;
  return `nearest miss ${kgText(m.mass)} at h = ${Math.round(m.depth)} mm (${plates}) fails ${m.failing.join(', ') || m.governing.id}${misses.length > 1 ? ` (${misses.length} near misses in the result)` : ''}`;
}

function noSectionError(mark: string, search: PublishedSearch): MarkError {
  return {
    code: NO_FEASIBLE_SECTION,
    message: `mark ${mark}: no section in its space passes every check; ${nearMissesText(search)}`,
    hint: 'widen the space (deeper webs, thicker plates, more stiffener panels), or check the actions and restraints; or give an adopted section',
  };
}

/** Why a failed mark fails, in one line (JUnit, Markdown, comparison). */
export function failureReason(m: MarkResult): string {
  if (m.error?.code === NO_FEASIBLE_SECTION) return `no feasible section: ${m.search ? nearMissesText(m.search) : 'no search result'} (${NO_FEASIBLE_SECTION})`;
  return `the mark could not be run: ${m.error?.message ?? 'failed'} (${m.error?.code ?? 'FAILED'})`;
}

/** Totals of a list of mark results (Σ quantity, Σ quantity × lightest mass, marks without a feasible or with a failing adopted section). */
export function totalsOf(marks: readonly MarkResult[]): ScheduleTotals {
  let tonnage = 0;
  for (const m of marks) if (m.search?.lightest) tonnage += (m.quantity * m.search.lightest.mass) / 1000;
  return {
    marks: marks.length,
    marksFailed: marks.filter((m) => m.status === 'failed').length,
    girders: marks.reduce((n, m) => n + m.quantity, 0),
    tonnage: Math.round(tonnage * 1000) / 1000,
    marksWithoutFeasible: marks.filter((m) => m.search !== null && m.search.lightest === null).map((m) => m.mark),
    girdersWithoutFeasible: marks.filter((m) => m.search !== null && m.search.lightest === null).reduce((n, m) => n + m.quantity, 0),
    adoptedFailing: marks.filter((m) => m.adopted !== null && !m.adopted.passes).map((m) => m.mark),
  };
}
