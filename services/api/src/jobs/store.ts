import { randomUUID } from 'node:crypto';
import type { MarkResult, ScheduleJson, ScheduleProgress, ScheduleRunResult } from '@platesmith/schedule';

export type JobState = 'queued' | 'running' | 'done' | 'failed' | 'cancelled';

export const TERMINAL: ReadonlySet<JobState> = new Set(['done', 'failed', 'cancelled']);

/**
 * What the status routes, the list and the events show of a job: small and of fixed size, so
 * reading or writing it costs the same whatever the size of the schedule (its input and result
 * are read apart, only where they are needed). Times are ISO 8601 strings.
 */
export interface JobSummary {
  id: string;
  kind: 'schedule';
  /** id of the API key that created the job (never the secret); null when keys are off */
  owner: string | null;
  status: JobState;
  /** the schedule's name */
  name: string | null;
  /** marks in the schedule */
  marks: number;
  createdAt: string;
  startedAt: string | null;
  finishedAt: string | null;
  progress: ScheduleProgress | null;
  error: { code: string; message: string } | null;
  /** times the job was taken up again after the service stopped while it ran (0 normally) */
  resumed: number;
}

/** One schedule job as stored. */
export interface JobRecord extends JobSummary {
  input: ScheduleJson;
  result: ScheduleRunResult | null;
}

export type JobPatch = Partial<Pick<JobRecord, 'status' | 'startedAt' | 'finishedAt' | 'progress' | 'result' | 'error' | 'resumed'>>;

/** Whether the store can be used; `cause` says why not (for /ready and the log). */
export type StoreHealth = { ok: true } | { ok: false; cause: string };

/** The summary of a record (what the routes show). */
export function summaryOf(j: JobRecord): JobSummary {
  const { input: _input, result: _result, ...s } = j;
  return s;
}

/**
 * Where jobs live: the embedded SQLite store, or a queue backend that must keep the same rules.
 * Every method is async and takes and returns plain JSON-able records.
 *
 * Rules every backend keeps (the routes and the manager rely on them):
 * - ownership: `owner` is set at insert and never changes; the routes show a job only to its owner
 *   when keys are on (another key gets 404, as for an unknown id);
 * - quota: `insert(job, quota)` refuses (false, nothing stored) when the owner already has
 *   `quota` jobs queued or running — counted and inserted atomically, so concurrent submits
 *   cannot pass it together;
 * - retention: `purgeFinished(before)` removes finished jobs (and their marks) finished before
 *   that time;
 * - cost: `update` writes the patch's fields only and `get`/`list` read summaries, never the input
 *   or result, so a progress write costs the same for a 1-mark and a 500-mark schedule;
 * - failures: a busy store throws ApiError STORE_BUSY (503, Retry-After), an unusable one
 *   (full, corrupt, read-only, I/O error) ApiError STORE_UNAVAILABLE and `health()` says why.
 */
export interface JobStore {
  /** stores a new job; false (nothing stored) when its owner already has `quota` jobs queued or running */
  insert(job: JobRecord, quota?: number): Promise<boolean>;
  get(id: string): Promise<JobSummary | undefined>;
  /** the job's input (undefined when the id is unknown) */
  input(id: string): Promise<JobRecord['input'] | undefined>;
  /** the job's result (null before it is done; undefined when the id is unknown) */
  result(id: string): Promise<ScheduleRunResult | null | undefined>;
  /** writes the patch's fields; false when the id is unknown */
  update(id: string, patch: JobPatch): Promise<boolean>;
  /** newest first; `owner` keeps only that owner's jobs */
  list(query: { limit: number; status?: JobState; owner?: string | null }): Promise<JobSummary[]>;
  /** deletes the job and its mark results */
  delete(id: string): Promise<boolean>;
  /** stores one finished mark of a job (written as each mark finishes, so a kill keeps it); replaces an earlier result of the same mark */
  putMark(id: string, index: number, mark: MarkResult): Promise<void>;
  /** the finished marks of a job so far, in schedule order */
  marks(id: string): Promise<{ index: number; mark: MarkResult }[]>;
  /** jobs left queued or running (e.g. by a service that stopped), oldest first */
  unfinished(): Promise<JobSummary[]>;
  /** deletes the finished jobs (done, failed, cancelled) whose finishedAt is before `before` (ISO 8601); how many */
  purgeFinished(before: string): Promise<number>;
  health(): StoreHealth;
  close(): Promise<void>;
}

const active = (j: JobSummary): boolean => j.status === 'queued' || j.status === 'running';

/** In-memory job store (lost on restart). Records are copied in and out, as a row store would. */
export class MemoryJobStore implements JobStore {
  readonly #jobs = new Map<string, JobRecord>();
  readonly #marks = new Map<string, Map<number, MarkResult>>();

  async insert(job: JobRecord, quota?: number): Promise<boolean> {
    if (quota !== undefined && [...this.#jobs.values()].filter((j) => j.owner === job.owner && active(j)).length >= quota) return false;
    this.#jobs.set(job.id, structuredClone(job));
    return true;
  }
  async get(id: string): Promise<JobSummary | undefined> {
    const j = this.#jobs.get(id);
    return j ? structuredClone(summaryOf(j)) : undefined;
  }
  async input(id: string): Promise<JobRecord['input'] | undefined> {
    const j = this.#jobs.get(id);
    return j ? structuredClone(j.input) : undefined;
  }
  async result(id: string): Promise<ScheduleRunResult | null | undefined> {
    const j = this.#jobs.get(id);
    return j ? structuredClone(j.result) : undefined;
  }
  async update(id: string, patch: JobPatch): Promise<boolean> {
    const j = this.#jobs.get(id);
    if (!j) return false;
    this.#jobs.set(id, { ...j, ...structuredClone(patch) });
    return true;
  }
  async list(query: { limit: number; status?: JobState; owner?: string | null }): Promise<JobSummary[]> {
    const all = [...this.#jobs.values()].filter((j) => (query.status === undefined || j.status === query.status) && (query.owner === undefined || j.owner === query.owner));
    return all.reverse().slice(0, query.limit).map((j) => structuredClone(summaryOf(j)));
  }
  async delete(id: string): Promise<boolean> {
    this.#marks.delete(id);
    return this.#jobs.delete(id);
  }
  async putMark(id: string, index: number, mark: MarkResult): Promise<void> {
    if (!this.#jobs.has(id)) return;
    let m = this.#marks.get(id);
    if (!m) this.#marks.set(id, (m = new Map()));
    m.set(index, structuredClone(mark));
  }
  async marks(id: string): Promise<{ index: number; mark: MarkResult }[]> {
    const m = this.#marks.get(id);
    return m ? [...m.entries()].sort((a, b) => a[0] - b[0]).map(([index, mark]) => ({ index, mark: structuredClone(mark) })) : [];
  }
  async unfinished(): Promise<JobSummary[]> {
    return [...this.#jobs.values()].filter(active).map((j) => structuredClone(summaryOf(j)));
  }
  async purgeFinished(before: string): Promise<number> {
    let n = 0;
    for (const j of [...this.#jobs.values()]) {
      if (!active(j) && j.finishedAt !== null && j.finishedAt < before) {
        await this.delete(j.id);
        n++;
      }
    }
    return n;
  }
  health(): StoreHealth {
    return { ok: true };
  }
  async close(): Promise<void> {
    this.#jobs.clear();
    this.#marks.clear();
  }
}

/** A new schedule job as both backends store it at submission: queued, nothing done yet. */
export function newScheduleJob(input: ScheduleJson, owner: string | null, nowMs: number): JobRecord {
  return {
    id: randomUUID(),
    kind: 'schedule',
    owner,
    status: 'queued',
    name: input.name ?? null,
    marks: input.girders.length,
    createdAt: new Date(nowMs).toISOString(),
    startedAt: null,
    finishedAt: null,
    progress: null,
    input,
    result: null,
    error: null,
    resumed: 0,
  };
}
