import { randomUUID } from 'node:crypto';
import type { ScheduleJson, ScheduleProgress, ScheduleResult } from '@platesmith/schedule';
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
}

/** Runs schedule jobs from a queue, records their state in the store, and tells listeners. */
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

  constructor(store: JobStore, work: ScheduleWork, opts: JobManagerOptions = {}) {
    this.#store = store;
    this.#work = work;
    this.#concurrency = opts.concurrency ?? 1;
    this.#maxQueued = opts.maxQueued ?? 100;
    this.#onFailure = opts.onFailure ?? (() => {});
  }

  get store(): JobStore {
    return this.#store;
  }

  async submit(input: ScheduleJson): Promise<JobRecord> {
    if (this.#queue.length >= this.#maxQueued) throw new ApiError('JOBS_SATURATED', `${this.#queue.length} schedule jobs are queued (the limit is ${this.#maxQueued})`, { retryAfter: 5 });
    const job: JobRecord = { id: randomUUID(), kind: 'schedule', status: 'queued', createdAt: new Date().toISOString(), startedAt: null, finishedAt: null, progress: null, input, result: null, error: null };
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

  /** Cancels every queued and running job and waits for them to settle. */
  async shutdown(): Promise<void> {
    for (const id of [...this.#queue]) await this.cancel(id);
    await Promise.all([...this.#running.keys()].map((id) => this.cancel(id)));
  }

  #pump(): void {
    while (this.#running.size < this.#concurrency && this.#queue.length > 0) {
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
    const job = await this.#write(id, { status: 'running', startedAt: new Date().toISOString() }, 'progress');
    if (!job) return;
    let patch: JobPatch;
    try {
      const result = await this.#work(job.input, ac.signal, (p) => void this.#write(id, { progress: p }, 'progress'));
      patch = { status: 'done', result };
    } catch (e) {
      if (ac.signal.aborted) patch = { status: 'cancelled' };
      else {
        this.#onFailure(id, e);
        patch = { status: 'failed', error: { code: 'INTERNAL', message: 'the schedule run failed unexpectedly; it is logged under the job id' } };
      }
    }
    await this.#write(id, { ...patch, finishedAt: new Date().toISOString() }, 'done');
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
