import type { ScheduleJson } from '@platesmith/schedule';
import type { JobManager } from './manager.js';
import type { JobStore, JobSummary } from './store.js';

/** One event of a job: a change of its summary, or its final state. */
export type JobEvent = { type: 'progress' | 'done'; job: JobSummary };

/**
 * What the routes ask of the jobs, whichever backend runs them: the embedded JobManager (SQLite
 * and this process's worker pool) or the queue backend (Redis and BullMQ, marks run by
 * `platesmith worker` processes).
 */
export interface Jobs {
  readonly store: JobStore;
  /** resolves once the backend can take jobs */
  readonly ready: Promise<void>;
  /** which backend: 'embedded' or 'redis' */
  readonly backend: 'embedded' | 'redis';
  submit(input: ScheduleJson, owner?: string | null): Promise<JobSummary>;
  subscribe(id: string, fn: (e: JobEvent) => void): () => void;
  cancel(id: string): Promise<JobSummary | undefined>;
  delete(id: string): Promise<boolean>;
  sweep(): Promise<number>;
  shutdown(): Promise<void>;
  /** figures for /metrics: marks waiting, marks running, schedule jobs queued or running, processes taking marks */
  stats(): Promise<{ waiting: number; running: number; jobs: number; workers: number }>;
  /** closes the store and the backend's connections (after shutdown) */
  close(): Promise<void>;
}

/** The embedded backend as Jobs: the JobManager on this process's pool (SQLite or memory store). */
export function embeddedJobs(m: JobManager): Jobs {
  return {
    backend: 'embedded',
    get store() {
      return m.store;
    },
    get ready() {
      return m.ready;
    },
    submit: (input, owner) => m.submit(input, owner),
    subscribe: (id, fn) => m.subscribe(id, fn),
    cancel: (id) => m.cancel(id),
    delete: (id) => m.delete(id),
    sweep: () => m.sweep(),
    shutdown: () => m.shutdown(),
    // this process takes the marks: one worker
    stats: async () => ({ waiting: m.gate.waiting, running: m.gate.running, jobs: (await m.store.unfinished()).length, workers: 1 }),
    close: () => m.store.close(),
  };
}
