import { randomUUID } from 'node:crypto';
import { isDomainError } from '@platesmith/catalogue';
import { finishSchedule, type MarkResult, type ScheduleJson, type ScheduleProgress, type ScheduleResult } from '@platesmith/schedule';
import { ApiError } from '../errors.js';
import { TERMINAL, type JobPatch, type JobRecord, type JobStore } from './store.js';

export type JobEvent = { type: 'progress' | 'done'; job: JobRecord };

export type ScheduleWork = (input: ScheduleJson, signal: AbortSignal, onProgress: (p: ScheduleProgress) => void) => Promise<ScheduleResult>;

export interface JobManagerOptions {
  /** jobs run at once (default 1: each job already uses every worker) */
  concurrency?: number;
  /** jobs waiting before 503 (default 100) */
  maxQueued?: number;
  /** called with an unexpected failure of a job (for the log) */
  onFailure?: (id: string, err: unknown) => void;
  /**
   * take up at start the jobs the store holds as queued or running (left by a service that
   * stopped or was killed): finished marks are kept, the others run again (default true)
   */
  resume?: boolean;
}

/** Abort reason of a job stopped by shutdown (not by a client): it stays queued in the store. */
const SHUTDOWN = Symbol('shutdown');

/**
 * Runs schedule jobs from a queue, records their state in the store, and tells listeners.
 *
 * Restart rule: each mark's result is stored as soon as the mark finishes. When the service
 * stops, by a signal (shutdown) or by being killed, the jobs it ran stay (or are put back)
 * queued in the store; the next manager on the same store takes them up at start, keeps every
 * finished mark as it was stored and runs only the marks without a result. `resumed` counts
 * how often a job was taken up again after it had started.
 */
export class JobManager {
  readonly #store: JobStore;
  readonly #work: ScheduleWork;
  readonly #concurrency: number;
  readonly #maxQueued: number;
  readonly #onFailure: (id: string, err: unknown) => void;
  readonly #queue: string[] = [];
  readonly #running = new Map<string, { ac: AbortController; done: Promise<void> }>();
  readonly #listeners = new Map<string, Set<(e: JobEvent) => void>>();
  /** per-job chain of store writes, so events leave in the order they happened */
  readonly #writes = new Map<string, Promise<unknown>>();
  readonly #ready: Promise<void>;
  #stopping = false;

  constructor(store: JobStore, work: ScheduleWork, opts: JobManagerOptions = {}) {
    this.#store = store;
    this.#work = work;
    this.#concurrency = opts.concurrency ?? 1;
    this.#maxQueued = opts.maxQueued ?? 100;
    this.#onFailure = opts.onFailure ?? (() => {});
    this.#ready = opts.resume === false ? Promise.resolve() : this.#recover();
  }

  get store(): JobStore {
    return this.#store;
  }

  /** resolves when the jobs left in the store by an earlier service are queued again */
  get ready(): Promise<void> {
    return this.#ready;
  }

  async #recover(): Promise<void> {
    try {
      for (const j of await this.#store.unfinished()) {
        await this.#store.update(j.id, { status: 'queued', resumed: j.startedAt !== null ? j.resumed + 1 : j.resumed });
        this.#queue.push(j.id);
      }
    } catch (e) {
      this.#onFailure('(recovery)', e);
    }
    this.#pump();
  }

  async submit(input: ScheduleJson): Promise<JobRecord> {
    await this.#ready;
    if (this.#queue.length >= this.#maxQueued) throw new ApiError('JOBS_SATURATED', `${this.#queue.length} schedule jobs are queued (the limit is ${this.#maxQueued})`, { retryAfter: 5 });
    const job: JobRecord = { id: randomUUID(), kind: 'schedule', status: 'queued', createdAt: new Date().toISOString(), startedAt: null, finishedAt: null, progress: null, input, result: null, error: null, resumed: 0 };
    await this.#store.insert(job);
    this.#queue.push(job.id);
    this.#pump();
    return job;
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

  /** Cancels a queued or running job and resolves with its final record; a finished job is returned as it is. */
  async cancel(id: string): Promise<JobRecord | undefined> {
    const q = this.#queue.indexOf(id);
    if (q >= 0) {
      this.#queue.splice(q, 1);
      await this.#write(id, { status: 'cancelled', finishedAt: new Date().toISOString() }, 'done');
    }
    const r = this.#running.get(id);
    if (r) {
      r.ac.abort(new DOMException('the schedule was cancelled', 'AbortError'));
      await r.done;
    }
    return this.#store.get(id);
  }

  /** Deletes a finished job (cancel first if it runs). */
  async delete(id: string): Promise<boolean> {
    await this.cancel(id);
    return this.#store.delete(id);
  }

  /**
   * Stops for a shutdown: queued jobs stay queued in the store, running ones are stopped and put
   * back to queued (their finished marks are kept), so the next service on the same store
   * resumes them. Waits for the running jobs to settle.
   */
  async shutdown(): Promise<void> {
    await this.#ready;
    this.#stopping = true;
    this.#queue.length = 0;
    const running = [...this.#running.values()];
    for (const r of running) r.ac.abort(SHUTDOWN);
    await Promise.all(running.map((r) => r.done));
  }

  #pump(): void {
    while (!this.#stopping && this.#running.size < this.#concurrency && this.#queue.length > 0) {
      const id = this.#queue.shift()!;
      const ac = new AbortController();
      const entry = { ac, done: Promise.resolve() };
      this.#running.set(id, entry);
      entry.done = this.#run(id, ac).finally(() => {
        this.#running.delete(id);
        this.#pump();
      });
    }
  }

  async #run(id: string, ac: AbortController): Promise<void> {
    const before = await this.#store.get(id);
    if (!before) return;
    const job = await this.#write(id, { status: 'running', startedAt: before.startedAt ?? new Date().toISOString() }, 'progress');
    if (!job) return;
    let patch: JobPatch;
    try {
      const girders = job.input.girders;
      const indexOf = new Map(girders.map((g, i) => [g.mark, i]));
      const kept = new Map<number, MarkResult>();
      for (const { index, mark } of await this.#store.marks(id)) if (girders[index]?.mark === mark.mark) kept.set(index, mark);
      const todo = girders.filter((_, i) => !kept.has(i));
      const fresh = new Map<number, MarkResult>();
      if (todo.length > 0) {
        const onProgress = (p: ScheduleProgress): void => {
          const { finished, ...rest } = p;
          if (finished) {
            const i = indexOf.get(finished.mark)!;
            fresh.set(i, finished);
            void this.#putMark(id, i, finished);
          }
          void this.#write(id, { progress: { ...rest, marksDone: rest.marksDone + kept.size, marksTotal: girders.length } }, 'progress');
        };
        const r: ScheduleResult = await this.#work({ ...job.input, girders: todo }, ac.signal, onProgress);
        // the marks of the result are authoritative (a work function need not report `finished`)
        for (const m of r.marks) {
          const i = indexOf.get(m.mark)!;
          if (!fresh.has(i)) void this.#putMark(id, i, m);
          fresh.set(i, m);
        }
      } else {
        void this.#write(id, { progress: { marksDone: girders.length, marksTotal: girders.length, currentMark: null, elapsedMs: 0, estimateMs: 0 } }, 'progress');
      }
      const marks = girders.map((g, i) => kept.get(i) ?? fresh.get(i));
      const missing = girders.filter((_, i) => marks[i] === undefined).map((g) => g.mark);
      if (missing.length > 0) throw new Error(`the work returned no result for marks ${missing.join(', ')}`);
      patch = { status: 'done', result: await finishSchedule(job.input, marks as MarkResult[]) };
    } catch (e) {
      if (ac.signal.aborted && ac.signal.reason === SHUTDOWN) {
        // stopped by a shutdown: back to the queue in the store; the next start resumes it
        await this.#write(id, { status: 'queued' }, 'progress');
        return;
      }
      if (ac.signal.aborted) patch = { status: 'cancelled' };
      else if (isDomainError(e)) patch = { status: 'failed', error: { code: e.code, message: e.message } };
      else {
        this.#onFailure(id, e);
        patch = { status: 'failed', error: { code: 'INTERNAL', message: 'the schedule run failed unexpectedly; it is logged under the job id' } };
      }
    }
    await this.#write(id, { ...patch, finishedAt: new Date().toISOString() }, 'done');
  }

  /** stores one finished mark, in the job's chain of writes (before the progress that counts it) */
  #putMark(id: string, index: number, m: MarkResult): Promise<unknown> {
    const prev = this.#writes.get(id) ?? Promise.resolve();
    const next = prev.then(() => this.#store.putMark(id, index, m));
    this.#writes.set(id, next.catch(() => undefined));
    return next.catch((e: unknown) => this.#onFailure(id, e));
  }

  #write(id: string, patch: JobPatch, type: JobEvent['type']): Promise<JobRecord | undefined> {
    const prev = this.#writes.get(id) ?? Promise.resolve();
    const next = prev.then(async () => {
      const job = await this.#store.update(id, patch);
      if (job) for (const fn of this.#listeners.get(id) ?? []) fn({ type, job });
      return job;
    });
    this.#writes.set(id, next.catch(() => undefined));
    if (type === 'done') void next.finally(() => this.#writes.delete(id));
    return next;
  }
}

export { TERMINAL };
