import { availableParallelism } from 'node:os';
import { DomainError } from '@platesmith/catalogue';
import type { MarkResult, ScheduleJson, ScheduleRunResult } from '@platesmith/schedule';
import { DEFAULT_SPACE_CAP, supportsOf, type EffectsSummaryJson, type ProblemJson, type PublishedSearch, type RecordRequest, type SearchInput } from '@platesmith/schema';
import { mergeSlices, type SearchResult, type SearchTask } from '@platesmith/search';
import { createSearchPool, inFlow, pingPool, searchOnPool, warmPool, type Flow, type SearchPool } from '@platesmith/search/pool';
import { publishSearchOf, type CheckRequest, type CheckResponse } from './requests.js';
import type { AppMessage, Answers, RequestMessage } from './worker.js';

/**
 * The engine of the service: one worker pool for everything heavy (analyses, checks, the
 * search's slices), an admission gate, the request's time budget and its cancellation. The
 * HTTP service maps its failures (EngineError) to answers; the CLI uses it for searches.
 */

export type EngineErrorCode = 'SATURATED' | 'TIME_BUDGET_EXCEEDED' | 'WORKER_FAILED' | 'CANCELLED';

/** A failure of the engine, not of the input (those are DomainError). */
export class EngineError extends Error {
  readonly code: EngineErrorCode;
  /** seconds after which a retry may succeed (load shedding) */
  readonly retryAfter: number | undefined;
  readonly budgetMs: number | undefined;
  constructor(code: EngineErrorCode, message: string, opts: { retryAfter?: number; budgetMs?: number; cause?: unknown } = {}) {
    super(message, opts.cause !== undefined ? { cause: opts.cause } : undefined);
    this.name = 'EngineError';
    this.code = code;
    this.retryAfter = opts.retryAfter;
    this.budgetMs = opts.budgetMs;
  }
}

export const isEngineError = (e: unknown): e is EngineError => e instanceof EngineError;

export interface EngineOptions {
  /** worker threads (default: the cores) */
  threads?: number;
  /** requests on the pool at once before SATURATED (default 4 per thread) */
  maxActive?: number;
  /** tasks waiting in the pool's queue before SATURATED (default 64 per thread) */
  maxQueue?: number;
  /** cap on the candidates of one search's space (default DEFAULT_SPACE_CAP) */
  spaceCap?: number;
  /** after a search's budget, how long its workers may take to hand back their points, ms (default 2000) */
  stopGraceMs?: number;
  /** the worker module (default this package's worker; tests pass a fixture worker) */
  workerFile?: string | URL;
  /** an error of the pool itself (a worker that failed to load) */
  onError?: (e: unknown) => void;
}

export interface RunOptions {
  /** the client went away: stop at once, answer nothing */
  signal?: AbortSignal;
  /** the request's time budget, ms (absent: none) */
  budgetMs?: number;
  /**
   * whose work this is (the key's id, '' without keys; and the request or job): its tasks take
   * turns on the pool's queue with every other flow's, schedule marks included (FairTaskQueue)
   */
  flow?: Flow;
}

export interface Engine {
  readonly pool: SearchPool;
  readonly threads: number;
  readonly spaceCap: number;
  /** requests now on the pool */
  active(): number;
  check(input: CheckRequest, o?: RunOptions): Promise<CheckResponse>;
  effects(input: ProblemJson, o?: RunOptions): Promise<EffectsSummaryJson>;
  /**
   * A search: the analysis on a worker, then the slices; at its budget the workers hand back the
   * verified points found so far and the answer is `aborted` (never an error).
   */
  search(input: SearchInput, o?: RunOptions & { onSlice?: (done: number, total: number) => void; onProgress?: (settled: number, size: number) => void }): Promise<PublishedSearch>;
  /** a search of a prepared task outside the admission gate (schedule marks); rejects when `signal` aborts */
  searchTask(task: SearchTask, signal?: AbortSignal, flow?: Flow): Promise<SearchResult>;
  /** the calculation record of one girder as HTML (the check and the document on a worker), admitted and budgeted like a check */
  record(request: RecordRequest, o?: RunOptions): Promise<string>;
  /**
   * a schedule's finish (records, tonnage, the rationalisation's checks and MILP solves) on a
   * worker, outside the admission gate (a job's work: its budget is the job's, given by `signal`)
   */
  finish(schedule: ScheduleJson, marks: readonly MarkResult[], o?: Pick<RunOptions, 'signal' | 'flow'>): Promise<ScheduleRunResult>;
  /** any message on the pool, admitted and budgeted like a request (tests send fixture messages) */
  run(msg: AppMessage | { kind: string; [k: string]: unknown }, o?: RunOptions): Promise<unknown>;
  ping(signal?: AbortSignal): Promise<void>;
  warmUp(rounds: number, signal?: AbortSignal): Promise<number>;
  close(): Promise<void>;
}

const OWN_WORKER = new URL(import.meta.url.endsWith('.ts') ? './worker.ts' : './worker.js', import.meta.url);

function signalOf(o: RunOptions, budget: AbortSignal | undefined): AbortSignal | undefined {
  const all = [o.signal, budget].filter((s): s is AbortSignal => s !== undefined);
  return all.length === 0 ? undefined : all.length === 1 ? all[0] : AbortSignal.any(all);
}

export function createEngine(opts: EngineOptions = {}): Engine {
  const threads = Math.max(1, opts.threads ?? availableParallelism());
  const pool = createSearchPool({
    threads,
    maxQueue: opts.maxQueue ?? threads * 64,
    filename: opts.workerFile ?? OWN_WORKER,
    ...(opts.onError ? { onError: opts.onError } : {}),
  });
  const maxActive = opts.maxActive ?? threads * 4;
  const spaceCap = opts.spaceCap ?? DEFAULT_SPACE_CAP;
  let active = 0;

  /** why a pool task failed, as an EngineError (the client, the budget, a full queue, the worker) */
  function failure(e: unknown, o: RunOptions, budget: AbortSignal | undefined): EngineError {
    if (o.signal?.aborted) return new EngineError('CANCELLED', 'the client went away; the work was stopped', { cause: e });
    if (budget?.aborted) {
      return new EngineError('TIME_BUDGET_EXCEEDED', `the work did not finish within its time budget of ${o.budgetMs} ms; raise budgetMs or make the problem smaller (fewer stations, actions or spans)`, { budgetMs: o.budgetMs!, retryAfter: 1, cause: e });
    }
    if (e instanceof Error && /queue is at limit/i.test(e.message)) return new EngineError('SATURATED', 'the worker queue is full', { retryAfter: 1, cause: e });
    return new EngineError('WORKER_FAILED', 'a worker failed; the pool replaces it, retry the request', { cause: e });
  }

  async function admitted<T>(f: () => Promise<T>): Promise<T> {
    if (active >= maxActive) throw new EngineError('SATURATED', `${active} requests are on the workers (the limit is ${maxActive})`, { retryAfter: 1 });
    active++;
    try {
      return await f();
    } finally {
      active--;
    }
  }

  async function onPool(msg: AppMessage | { kind: string; [k: string]: unknown }, o: RunOptions, budget: AbortSignal | undefined): Promise<unknown> {
    const signal = signalOf(o, budget);
    try {
      return await pool.piscina.run(inFlow(msg, o.flow), signal ? { signal } : {});
    } catch (e) {
      throw failure(e, o, budget);
    }
  }

  async function request<K extends RequestMessage['kind']>(msg: Extract<RequestMessage, { kind: K }>, o: RunOptions, budget: AbortSignal | undefined): Promise<Extract<Answers[K], { ok: true }>['value']> {
    const a = (await onPool(msg, o, budget)) as Answers[K];
    if (!a.ok) throw new DomainError(a.domain.code, a.domain.message, a.domain.hint, a.domain.field, a.domain.data);
    return a.value as Extract<Answers[K], { ok: true }>['value'];
  }

  const budgetOf = (o: RunOptions) => (o.budgetMs !== undefined ? AbortSignal.timeout(o.budgetMs) : undefined);

  return {
    pool,
    threads,
    spaceCap,
    active: () => active,
    check: (input, o = {}) => admitted(() => request({ kind: 'check', input }, o, budgetOf(o))),
    effects: (input, o = {}) => admitted(() => request({ kind: 'effects', input }, o, budgetOf(o))),
    record: (r, o = {}) => admitted(() => request({ kind: 'record', request: r }, o, budgetOf(o))),
    finish: async (schedule, marks, o = {}) => {
      const { format, version, caution, scope, name, ...tail } = await request({ kind: 'finish', schedule, marks: [...marks] }, o, undefined);
      // the marks stay here (they crossed once); the result's fields in finishSchedule's order
      return { format, version, caution, scope, name, marks: [...marks], ...tail };
    },
    run: (msg, o = {}) => admitted(() => onPool(msg, o, budgetOf(o))),
    search: (input, o = {}) =>
      admitted(async () => {
        const budget = budgetOf(o);
        const abort = o.budgetMs !== undefined ? { reason: 'time-budget' as const, budgetMs: o.budgetMs } : undefined;
        let task: SearchTask;
        try {
          task = await request({ kind: 'search-task', input, spaceCap }, o, budget);
        } catch (e) {
          // the budget ran out in the analysis: an aborted search with no point yet
          if (e instanceof EngineError && e.code === 'TIME_BUDGET_EXCEEDED') {
            return publishSearchOf(mergeSlices([], 0, threads, 0, 0), { objective: input.objective, analysis: { length: lengthOf(input) } }, abort);
          }
          throw e;
        }
        let r: SearchResult;
        try {
          r = await searchOnPool(pool, task, {
            ...(o.signal ? { signal: o.signal } : {}),
            ...(budget ? { stop: budget } : {}),
            ...(opts.stopGraceMs !== undefined ? { stopGraceMs: opts.stopGraceMs } : {}),
            ...(o.onSlice ? { onSlice: o.onSlice } : {}),
            ...(o.flow ? { flow: o.flow } : {}),
            ...(o.onProgress ? { onProgress: o.onProgress } : {}),
            explain: true,
          });
        } catch (e) {
          throw failure(e, o, undefined);
        }
        return publishSearchOf(r, task, r.status === 'aborted' ? abort : undefined);
      }),
    searchTask: (task, signal, flow) => searchOnPool(pool, task, { ...(signal ? { signal } : {}), ...(flow ? { flow } : {}) }),
    ping: (signal) => pingPool(pool, signal),
    warmUp: (rounds, signal) => warmPool(pool, rounds, signal),
    close: () => pool.close(),
  };
}

/** The girder's length of a search input, mm (spans or the envelope). */
function lengthOf(input: SearchInput): number {
  const s = supportsOf(input);
  return s[s.length - 1]! - s[0]!;
}
