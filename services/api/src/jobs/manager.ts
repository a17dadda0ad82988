import { DomainError, isDomainError } from '@platesmith/catalogue';
import { finishSchedule, type MarkResult, type ScheduleJson, type ScheduleProgress, type ScheduleResult, type ScheduleRunResult } from '@platesmith/schedule';
import { ApiError } from '../errors.js';
import { FairGate } from './fair.js';
import { newScheduleJob, TERMINAL, type JobPatch, type JobStore, type JobSummary } from './store.js';

export type JobEvent = { type: 'progress' | 'done'; job: JobSummary };

/**
 * One fair turn on the pool: waits for the job's turn (fairness between keys and jobs), then
 * runs `search` with a signal that aborts on cancellation and at the mark's or the job's time
 * budget. A mark past its budget rejects with the DomainError MARK_BUDGET_EXCEEDED (the mark
 * fails alone, as data); a job past its budget is stopped.
 */
export type Turn = <T>(search: (signal: AbortSignal, flow: JobFlow) => Promise<T>) => Promise<T>;

/** Whose work a job's pool tasks are: its owner ('' without keys) and the job (the pool's queue takes flows in turns). */
export interface JobFlow {
  owner: string;
  flow: string;
}

export type ScheduleWork = (input: ScheduleJson, signal: AbortSignal, onProgress: (p: ScheduleProgress) => void, turn: Turn) => Promise<ScheduleResult>;

/**
 * A schedule's finish once its marks are done (records, tonnage, the rationalisation): the
 * service runs it on a worker (engine.finish); `signal` aborts on cancellation, shutdown and at
 * what is left of the job's budget.
 */
export type FinishWork = (input: ScheduleJson, marks: readonly MarkResult[], signal: AbortSignal, flow: JobFlow) => Promise<ScheduleRunResult>;

/** Defaults of the job settings (README: "Running it for a team"). */
export const JOB_DEFAULTS = {
  maxActive: 100,
  quota: 10,
  slots: 1,
  // a mark is a search: it may take as long as a synchronous search may at most (maxBudgetMs)
  markBudgetMs: 5 * 60_000,
  jobBudgetMs: 6 * 3_600_000,
  retentionMs: 7 * 86_400_000,
} as const;

export interface JobManagerOptions {
  /** marks searched at once, over all jobs (default 1: each search already uses every worker) */
  slots?: number;
  /** jobs queued or running, over all keys, before 503 JOBS_SATURATED (default 100) */
  maxActive?: number;
  /** jobs queued or running per owner before 429 JOB_QUOTA_EXCEEDED (default 10; jobs without an owner have none) */
  quota?: number;
  /** time one mark's search may take, ms; past it the mark fails alone (default 5 min) */
  markBudgetMs?: number;
  /** time the searches of one job may take in all (its own turns, not its waits), ms; past it the job fails (default 6 h) */
  jobBudgetMs?: number;
  /** finished jobs are deleted this long after they finished, ms; 0 keeps them (default 7 days) */
  retentionMs?: number;
  /** the finish of a job (default finishSchedule in this thread; the service passes its engine's worker) */
  finish?: FinishWork;
  /** called with an unexpected failure of a job or of a store write (for the log) */
  onFailure?: (id: string, err: unknown) => void;
  /**
   * take up at start the jobs the store holds as queued or running (left by a service that
   * stopped or was killed): finished marks are kept, the others run again (default true)
   */
  resume?: boolean;
  /** clock, ms since the epoch (retention tests inject one) */
  now?: () => number;
}

/** Abort reasons of a job stopped by shutdown (it stays queued in the store) or by its budget. */
const SHUTDOWN = Symbol('shutdown');
const JOB_BUDGET = Symbol('job budget');
/** waits before the retries of a job's final write, ms (~15 s in all) */
const FINAL_RETRIES_MS = [500, 1000, 2000, 4000, 8000];

interface Active {
  job: JobSummary;
  ac: AbortController;
  done: Promise<void>;
  /** ms of search this job's turns have taken */
  spentMs: number;
  /** marks whose write failed (retried before the job's next write) */
  unsaved: Map<number, MarkResult>;
}

/**
 * Runs schedule jobs, records their state in the store, and tells listeners.
 *
 * Every admitted job runs at once; their marks take fair turns on the pool (FairGate): round-robin
 * over owners, then over each owner's jobs. A job is `queued` until its first mark gets a turn.
 *
 * Restart rule: each mark's result is stored as soon as the mark finishes. When the service
 * stops, by a signal (shutdown) or by being killed, the jobs it ran stay (or are put back)
 * queued in the store; the next manager on the same store takes them up at start, keeps every
 * finished mark as it was stored and runs only the marks without a result. `resumed` counts
 * how often a job was taken up again after it had started.
 *
 * Store failures never reject into the caller's void: a failed progress write is logged and the
 * next one carries the state; a failed mark write is retried before the job's next write; a job
 * whose final write fails stays queued or running in the store and is taken up at the next start.
 */
export class JobManager {
  readonly #store: JobStore;
  readonly #work: ScheduleWork;
  readonly #gate: FairGate;
  readonly #o: Required<Omit<JobManagerOptions, 'onFailure' | 'resume' | 'now' | 'finish'>>;
  readonly #finish: FinishWork;
  readonly #onFailure: (id: string, err: unknown) => void;
  readonly #now: () => number;
  readonly #active = new Map<string, Active>();
  readonly #listeners = new Map<string, Set<(e: JobEvent) => void>>();
  /** per-job chain of store writes, so events leave in the order they happened */
  readonly #writes = new Map<string, Promise<void>>();
  readonly #ready: Promise<void>;
  #sweeper: NodeJS.Timeout | undefined;
  #stopping = false;
  readonly #stopped = new AbortController();

  constructor(store: JobStore, work: ScheduleWork, opts: JobManagerOptions = {}) {
    this.#store = store;
    this.#work = work;
    this.#o = {
      slots: opts.slots ?? JOB_DEFAULTS.slots,
      maxActive: opts.maxActive ?? JOB_DEFAULTS.maxActive,
      quota: opts.quota ?? JOB_DEFAULTS.quota,
      markBudgetMs: opts.markBudgetMs ?? JOB_DEFAULTS.markBudgetMs,
      jobBudgetMs: opts.jobBudgetMs ?? JOB_DEFAULTS.jobBudgetMs,
      retentionMs: opts.retentionMs ?? JOB_DEFAULTS.retentionMs,
    };
    this.#gate = new FairGate(this.#o.slots);
    this.#finish = opts.finish ?? ((input, marks) => finishSchedule(input, marks));
    this.#onFailure = opts.onFailure ?? (() => {});
    this.#now = opts.now ?? Date.now;
    this.#ready = opts.resume === false ? Promise.resolve() : this.#recover();
    if (this.#o.retentionMs > 0) {
      // a sweep at start and then every tenth of the retention (at most hourly); never keeps the process alive
      const every = Math.min(this.#o.retentionMs / 10, 3_600_000);
      void this.#ready.then(() => this.sweep());
      this.#sweeper = setInterval(() => void this.sweep(), Math.max(every, 1000));
      this.#sweeper.unref();
    }
  }

  get store(): JobStore {
    return this.#store;
  }

  /** the fair gate of the marks' turns (tests watch it) */
  get gate(): FairGate {
    return this.#gate;
  }

  /** resolves when the jobs left in the store by an earlier service are taken up again */
  get ready(): Promise<void> {
    return this.#ready;
  }

  async #recover(): Promise<void> {
    try {
      for (const j of await this.#store.unfinished()) {
        const resumed = j.startedAt !== null ? j.resumed + 1 : j.resumed;
        await this.#store.update(j.id, { status: 'queued', resumed });
        this.#start({ ...j, status: 'queued', resumed }, null);
      }
    } catch (e) {
      this.#onFailure('(recovery)', e);
    }
  }

  /**
   * Deletes the finished jobs older than the retention; resolves with their count (0 on a store
   * failure, which is logged). Runs on a timer; tests call it with their clock.
   */
  async sweep(): Promise<number> {
    if (this.#o.retentionMs <= 0) return 0;
    try {
      return await this.#store.purgeFinished(new Date(this.#now() - this.#o.retentionMs).toISOString());
    } catch (e) {
      this.#onFailure('(retention)', e);
      return 0;
    }
  }

  /** Admits a job of `owner` (null when keys are off): 503 when the service holds too many, 429 over the owner's quota. */
  async submit(input: ScheduleJson, owner: string | null = null): Promise<JobSummary> {
    await this.#ready;
    if (this.#stopping) throw new ApiError('SHUTTING_DOWN', 'the service is shutting down', { retryAfter: 5 });
    if (this.#active.size >= this.#o.maxActive) throw new ApiError('JOBS_SATURATED', `${this.#active.size} schedule jobs are queued or running (the limit is ${this.#o.maxActive})`, { retryAfter: 5 });
    const job = newScheduleJob(input, owner, this.#now());
    const stored = await this.#store.insert(job, owner !== null ? this.#o.quota : undefined);
    if (!stored) throw new ApiError('JOB_QUOTA_EXCEEDED', `this key has ${this.#o.quota} schedule jobs queued or running (its quota); wait for one to finish or cancel one`, { retryAfter: 30, extra: { quota: this.#o.quota } });
    const { input: _i, result: _r, ...summary } = job;
    this.#start(summary, input);
    return summary;
  }

  /** Listens to one job's events until the returned function is called. */
  subscribe(id: string, fn: (e: JobEvent) => void): () => void {
    let set = this.#listeners.get(id);
    if (!set) this.#listeners.set(id, (set = new Set()));
    set.add(fn);
    return () => {
      set.delete(fn);
      if (set.size === 0) this.#listeners.delete(id);
    };
  }

  /** Cancels a queued or running job and resolves with its final summary; a finished job is returned as it is. */
  async cancel(id: string): Promise<JobSummary | undefined> {
    const a = this.#active.get(id);
    if (a) {
      a.ac.abort(new DOMException('the schedule was cancelled', 'AbortError'));
      await a.done;
    }
    return this.#store.get(id);
  }

  /** Deletes a job (cancelled first if it runs). */
  async delete(id: string): Promise<boolean> {
    await this.cancel(id);
    return this.#store.delete(id);
  }

  /**
   * Stops for a shutdown: running and waiting jobs are stopped and put back to queued (their
   * finished marks are kept), so the next service on the same store resumes them. Waits for them
   * to settle.
   */
  async shutdown(): Promise<void> {
    await this.#ready;
    this.#stopping = true;
    this.#stopped.abort();
    if (this.#sweeper) clearInterval(this.#sweeper);
    const all = [...this.#active.values()];
    for (const a of all) a.ac.abort(SHUTDOWN);
    await Promise.all(all.map((a) => a.done));
  }

  #start(job: JobSummary, input: ScheduleJson | null): void {
    const a: Active = { job, ac: new AbortController(), done: Promise.resolve(), spentMs: 0, unsaved: new Map() };
    this.#active.set(job.id, a);
    a.done = this.#run(a, input)
      .catch((e: unknown) => this.#onFailure(job.id, e))
      .finally(() => {
        this.#active.delete(job.id);
        this.#writes.delete(job.id);
      });
  }

  /** A fair turn for job `a`, with the mark's and the job's budgets (see Turn). */
  #turn(a: Active): Turn {
    const { markBudgetMs, jobBudgetMs } = this.#o;
    return async (search) => {
      const release = await this.#gate.acquire(a.job.owner ?? '', a.job.id, a.ac.signal);
      const t0 = performance.now();
      try {
        if (a.job.status === 'queued') this.#write(a, { status: 'running', startedAt: a.job.startedAt ?? new Date(this.#now()).toISOString() }, 'progress');
        const left = jobBudgetMs - a.spentMs;
        if (left <= 0) {
          a.ac.abort(JOB_BUDGET);
          throw JOB_BUDGET;
        }
        const byJob = left < markBudgetMs;
        const timer = AbortSignal.timeout(Math.max(1, Math.ceil(byJob ? left : markBudgetMs)));
        try {
          return await search(AbortSignal.any([a.ac.signal, timer]), this.#flowOf(a));
        } catch (e) {
          if (!timer.aborted || a.ac.signal.aborted) throw e;
          if (byJob) {
            a.ac.abort(JOB_BUDGET);
            throw JOB_BUDGET;
          }
          throw new DomainError(
            'MARK_BUDGET_EXCEEDED',
            `the search of this mark ran past its time budget of ${markBudgetMs} ms and was stopped`,
            'narrow the mark\'s space (fewer web depths, plates or panel counts), or ask the operator to raise PLATESMITH_MARK_BUDGET',
            'space',
          );
        }
      } finally {
        a.spentMs += performance.now() - t0;
        release();
      }
    };
  }

  #flowOf(a: Active): JobFlow {
    return { owner: a.job.owner ?? '', flow: a.job.id };
  }

  /**
   * The job's finish within what is left of its budget (its time counts in the job's, as its
   * turns do): past it the job stops with JOB_BUDGET_EXCEEDED; cancellation and shutdown stop it.
   */
  async #finishing(a: Active, input: ScheduleJson, marks: readonly MarkResult[]): Promise<ScheduleRunResult> {
    const left = this.#o.jobBudgetMs - a.spentMs;
    if (left <= 0) {
      a.ac.abort(JOB_BUDGET);
      throw JOB_BUDGET;
    }
    const timer = AbortSignal.timeout(Math.max(1, Math.ceil(left)));
    const t0 = performance.now();
    try {
      return await this.#finish(input, marks, AbortSignal.any([a.ac.signal, timer]), this.#flowOf(a));
    } catch (e) {
      if (timer.aborted && !a.ac.signal.aborted) {
        a.ac.abort(JOB_BUDGET);
        throw JOB_BUDGET;
      }
      throw e;
    } finally {
      a.spentMs += performance.now() - t0;
    }
  }

  async #run(a: Active, given: ScheduleJson | null): Promise<void> {
    const id = a.job.id;
    const ac = a.ac;
    let patch: JobPatch;
    try {
      const input = given ?? (await this.#store.input(id));
      if (!input) return;
      const girders = input.girders;
      const indexOf = new Map(girders.map((g, i) => [g.mark, i]));
      const kept = new Map<number, MarkResult>();
      if (given === null) for (const { index, mark } of await this.#store.marks(id)) if (girders[index]?.mark === mark.mark) kept.set(index, mark);
      const todo = girders.filter((_, i) => !kept.has(i));
      const fresh = new Map<number, MarkResult>();
      if (todo.length > 0) {
        const onProgress = (p: ScheduleProgress): void => {
          const { finished, ...rest } = p;
          if (finished) {
            const i = indexOf.get(finished.mark)!;
            fresh.set(i, finished);
            a.unsaved.set(i, finished);
          }
          this.#write(a, { progress: { ...rest, marksDone: rest.marksDone + kept.size, marksTotal: girders.length } }, 'progress');
        };
        const r: ScheduleResult = await this.#work({ ...input, girders: todo }, ac.signal, onProgress, this.#turn(a));
        // the marks of the result are authoritative (a work function need not report `finished`)
        for (const m of r.marks) {
          const i = indexOf.get(m.mark)!;
          if (!fresh.has(i)) a.unsaved.set(i, m);
          fresh.set(i, m);
        }
      } else {
        this.#write(a, { progress: { marksDone: girders.length, marksTotal: girders.length, currentMark: null, elapsedMs: 0, estimateMs: 0 } }, 'progress');
      }
      const marks = girders.map((g, i) => kept.get(i) ?? fresh.get(i));
      const missing = girders.filter((_, i) => marks[i] === undefined).map((g) => g.mark);
      if (missing.length > 0) throw new Error(`the work returned no result for marks ${missing.join(', ')}`);
      patch = { status: 'done', result: await this.#finishing(a, input, marks as MarkResult[]) };
    } catch (e) {
      const reason: unknown = ac.signal.aborted ? ac.signal.reason : undefined;
      if (reason === SHUTDOWN) {
        // stopped by a shutdown: back to the queue in the store; the next start resumes it
        this.#write(a, { status: 'queued' }, 'progress');
        await this.#writes.get(id);
        return;
      }
      if (reason === JOB_BUDGET) {
        const done = (a.job.progress?.marksDone ?? 0);
        patch = { status: 'failed', error: { code: 'JOB_BUDGET_EXCEEDED', message: `the schedule's searches and finish ran past the job's time budget of ${this.#o.jobBudgetMs} ms; ${done} of ${a.job.marks} marks finished (GET its marks); split the schedule or narrow its spaces` } };
      } else if (ac.signal.aborted) patch = { status: 'cancelled' };
      else if (isDomainError(e)) patch = { status: 'failed', error: { code: e.code, message: e.message } };
      else {
        this.#onFailure(id, e);
        patch = { status: 'failed', error: { code: 'INTERNAL', message: 'the schedule run failed unexpectedly; it is logged under the job id' } };
      }
    }
    this.#write(a, { ...patch, finishedAt: new Date(this.#now()).toISOString() }, 'done');
    await this.#writes.get(id);
  }

  /** waits `ms`, or less when the manager stops */
  #pause(ms: number): Promise<void> {
    return new Promise((resolve) => {
      const t = setTimeout(resolve, ms);
      t.unref();
      this.#stopped.signal.addEventListener('abort', () => {
        clearTimeout(t);
        resolve();
      }, { once: true });
    });
  }

  /**
   * Queues a write of the job's state in its chain: applies the patch to the summary in memory,
   * tells the listeners, and writes the patch's fields only (marks not yet stored go first). A
   * failed write is logged, never thrown: the job runs on and the next write carries its state.
   */
  #write(a: Active, patch: JobPatch, type: JobEvent['type']): void {
    const id = a.job.id;
    const { result: _r, ...shown } = patch;
    a.job = { ...a.job, ...shown };
    const snapshot = a.job;
    const prev = this.#writes.get(id) ?? Promise.resolve();
    const next = prev.then(async () => {
      // the final state is retried a few times (a lock held by another connection passes), not during a shutdown
      for (let attempt = 0; ; attempt++) {
        try {
          for (const [i, m] of [...a.unsaved]) {
            await this.#store.putMark(id, i, m);
            a.unsaved.delete(i);
          }
          await this.#store.update(id, patch);
          break;
        } catch (e) {
          this.#onFailure(id, e);
          if (type !== 'done' || attempt >= FINAL_RETRIES_MS.length || this.#stopping) break;
          await this.#pause(FINAL_RETRIES_MS[attempt]!);
        }
      }
      for (const fn of this.#listeners.get(id) ?? []) {
        try {
          fn({ type, job: snapshot });
        } catch (e) {
          this.#onFailure(id, e);
        }
      }
    });
    this.#writes.set(id, next);
  }
}

export { TERMINAL };
