import type { MarkResult, ScheduleJson, ScheduleProgress, ScheduleRunResult } from '@platesmith/schedule';

export type JobState = 'queued' | 'running' | 'done' | 'failed' | 'cancelled';

export const TERMINAL: ReadonlySet<JobState> = new Set(['done', 'failed', 'cancelled']);

/** One schedule job as stored. Times are ISO 8601 strings so a row store keeps them as text. */
export interface JobRecord {
  id: string;
  kind: 'schedule';
  status: JobState;
  createdAt: string;
  startedAt: string | null;
  finishedAt: string | null;
  progress: ScheduleProgress | null;
  input: ScheduleJson;
  result: ScheduleRunResult | null;
  error: { code: string; message: string } | null;
  /** times the job was taken up again after the service stopped while it ran (0 normally) */
  resumed: number;
}

export type JobPatch = Partial<Pick<JobRecord, 'status' | 'startedAt' | 'finishedAt' | 'progress' | 'result' | 'error' | 'resumed'>>;

/**
 * Where jobs live. Every method is async and takes and returns plain JSON-able records, so a
 * durable store (one SQLite table: id, status, times as columns, input/progress/result/error as
 * JSON text) can replace the in-memory one without touching the manager or the routes.
 */
export interface JobStore {
  insert(job: JobRecord): Promise<void>;
  get(id: string): Promise<JobRecord | undefined>;
  /** applies the patch and returns the updated record (undefined when the id is unknown) */
  update(id: string, patch: JobPatch): Promise<JobRecord | undefined>;
  /** newest first */
  list(query: { limit: number; status?: JobState }): Promise<JobRecord[]>;
  /** deletes the job and its mark results */
  delete(id: string): Promise<boolean>;
  /** stores one finished mark of a job (written as each mark finishes, so a kill keeps it); replaces an earlier result of the same mark */
  putMark(id: string, index: number, mark: MarkResult): Promise<void>;
  /** the finished marks of a job so far, in schedule order */
  marks(id: string): Promise<{ index: number; mark: MarkResult }[]>;
  /** jobs left queued or running (e.g. by a service that stopped), oldest first */
  unfinished(): Promise<JobRecord[]>;
  close(): Promise<void>;
}

/** In-memory job store (lost on restart). Records are copied in and out, as a row store would. */
export class MemoryJobStore implements JobStore {
  readonly #jobs = new Map<string, JobRecord>();
  readonly #marks = new Map<string, Map<number, MarkResult>>();

  async insert(job: JobRecord): Promise<void> {
    this.#jobs.set(job.id, structuredClone(job));
  }
  async get(id: string): Promise<JobRecord | undefined> {
    const j = this.#jobs.get(id);
    return j ? structuredClone(j) : undefined;
  }
  async update(id: string, patch: JobPatch): Promise<JobRecord | undefined> {
    const j = this.#jobs.get(id);
    if (!j) return undefined;
    const next = { ...j, ...structuredClone(patch) };
    this.#jobs.set(id, next);
    return structuredClone(next);
  }
  async list(query: { limit: number; status?: JobState }): Promise<JobRecord[]> {
    const all = [...this.#jobs.values()].filter((j) => query.status === undefined || j.status === query.status);
    return all.reverse().slice(0, query.limit).map((j) => structuredClone(j));
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
  async unfinished(): Promise<JobRecord[]> {
    return [...this.#jobs.values()].filter((j) => j.status === 'queued' || j.status === 'running').map((j) => structuredClone(j));
  }
  async close(): Promise<void> {
    this.#jobs.clear();
    this.#marks.clear();
  }
}
