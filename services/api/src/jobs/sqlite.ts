import { mkdirSync } from 'node:fs';
import { dirname, resolve } from 'node:path';
import Database from 'better-sqlite3';
import { DomainError } from '@platesmith/catalogue';
import type { MarkResult } from '@platesmith/schedule';
import type { JobPatch, JobRecord, JobState, JobStore } from './store.js';

/** Version of the tables below (PRAGMA user_version); a file of a later version is refused. */
export const JOB_STORE_VERSION = 1;

/** Where the job store lives when nothing else is said: under the working directory. */
export const DEFAULT_DB_PATH = '.platesmith/jobs.sqlite';

const DDL = `
CREATE TABLE IF NOT EXISTS jobs (
  seq         INTEGER PRIMARY KEY AUTOINCREMENT,
  id          TEXT NOT NULL UNIQUE,
  kind        TEXT NOT NULL,
  status      TEXT NOT NULL CHECK (status IN ('queued', 'running', 'done', 'failed', 'cancelled')),
  created_at  TEXT NOT NULL,
  started_at  TEXT,
  finished_at TEXT,
  resumed     INTEGER NOT NULL DEFAULT 0,
  input       TEXT NOT NULL,
  progress    TEXT,
  result      TEXT,
  error       TEXT
);
CREATE INDEX IF NOT EXISTS jobs_by_status ON jobs (status, seq);
CREATE TABLE IF NOT EXISTS job_marks (
  job_id TEXT NOT NULL REFERENCES jobs (id) ON DELETE CASCADE,
  idx    INTEGER NOT NULL,
  mark   TEXT NOT NULL,
  result TEXT NOT NULL,
  PRIMARY KEY (job_id, idx)
);
`;

interface Row {
  id: string;
  kind: 'schedule';
  status: JobState;
  created_at: string;
  started_at: string | null;
  finished_at: string | null;
  resumed: number;
  input: string;
  progress: string | null;
  result: string | null;
  error: string | null;
}

const parse = <T>(s: string | null): T | null => (s === null ? null : (JSON.parse(s) as T));
const text = (v: unknown): string | null => (v === null || v === undefined ? null : JSON.stringify(v));

function fromRow(r: Row): JobRecord {
  return {
    id: r.id,
    kind: r.kind,
    status: r.status,
    createdAt: r.created_at,
    startedAt: r.started_at,
    finishedAt: r.finished_at,
    progress: parse(r.progress),
    input: JSON.parse(r.input) as JobRecord['input'],
    result: parse(r.result),
    error: parse(r.error),
    resumed: r.resumed,
  };
}

export interface SqliteJobStoreOptions {
  /** database file, or ':memory:' (tests); its folder is created when missing */
  path: string;
  /** how long a write waits for another connection's lock, ms (default 5000) */
  busyTimeoutMs?: number;
}

/**
 * The durable job store: one SQLite file (better-sqlite3, WAL journal, busy_timeout,
 * synchronous=FULL so a committed write survives a killed process and a power cut). A job is
 * one row of `jobs` (times as text, input/progress/result/error as JSON text); each finished
 * mark is one row of `job_marks`, written when the mark finishes. better-sqlite3 is
 * synchronous: each method runs to completion before it returns, so writes never interleave.
 */
export class SqliteJobStore implements JobStore {
  readonly path: string;
  readonly #db: Database.Database;
  readonly #st: {
    insert: Database.Statement;
    get: Database.Statement<[string], Row>;
    update: Database.Statement;
    list: Database.Statement<[number], Row>;
    listStatus: Database.Statement<[string, number], Row>;
    unfinished: Database.Statement<[], Row>;
    delete: Database.Statement<[string]>;
    putMark: Database.Statement;
    marks: Database.Statement<[string], { idx: number; result: string }>;
  };

  constructor(opts: SqliteJobStoreOptions) {
    this.path = opts.path;
    if (opts.path !== ':memory:') mkdirSync(dirname(resolve(opts.path)), { recursive: true });
    this.#db = new Database(opts.path);
    this.#db.pragma('journal_mode = WAL');
    this.#db.pragma(`busy_timeout = ${Math.max(0, Math.round(opts.busyTimeoutMs ?? 5000))}`);
    this.#db.pragma('synchronous = FULL');
    this.#db.pragma('foreign_keys = ON');
    const version = this.#db.pragma('user_version', { simple: true }) as number;
    if (version > JOB_STORE_VERSION) {
      this.#db.close();
      throw new DomainError('JOB_STORE_VERSION', `the job store ${opts.path} has version ${version}; this service reads version ${JOB_STORE_VERSION}`, 'point PLATESMITH_DB at another file, or run the newer service', 'PLATESMITH_DB');
    }
    this.#db.exec(DDL);
    this.#db.pragma(`user_version = ${JOB_STORE_VERSION}`);
    const cols = 'id, kind, status, created_at, started_at, finished_at, resumed, input, progress, result, error';
    this.#st = {
      insert: this.#db.prepare(`INSERT INTO jobs (${cols}) VALUES (@id, @kind, @status, @created_at, @started_at, @finished_at, @resumed, @input, @progress, @result, @error)`),
      get: this.#db.prepare(`SELECT ${cols} FROM jobs WHERE id = ?`),
      update: this.#db.prepare(
        'UPDATE jobs SET status = @status, started_at = @started_at, finished_at = @finished_at, resumed = @resumed, progress = @progress, result = @result, error = @error WHERE id = @id',
      ),
      list: this.#db.prepare(`SELECT ${cols} FROM jobs ORDER BY seq DESC LIMIT ?`),
      listStatus: this.#db.prepare(`SELECT ${cols} FROM jobs WHERE status = ? ORDER BY seq DESC LIMIT ?`),
      unfinished: this.#db.prepare(`SELECT ${cols} FROM jobs WHERE status IN ('queued', 'running') ORDER BY seq ASC`),
      delete: this.#db.prepare('DELETE FROM jobs WHERE id = ?'),
      putMark: this.#db.prepare('INSERT INTO job_marks (job_id, idx, mark, result) VALUES (?, ?, ?, ?) ON CONFLICT (job_id, idx) DO UPDATE SET mark = excluded.mark, result = excluded.result'),
      marks: this.#db.prepare('SELECT idx, result FROM job_marks WHERE job_id = ? ORDER BY idx'),
    };
  }

  /** the journal mode SQLite reports ('wal' for a file, 'memory' for ':memory:') */
  get journalMode(): string {
    return String(this.#db.pragma('journal_mode', { simple: true }));
  }

  async insert(job: JobRecord): Promise<void> {
    this.#st.insert.run({
      id: job.id,
      kind: job.kind,
      status: job.status,
      created_at: job.createdAt,
      started_at: job.startedAt,
      finished_at: job.finishedAt,
      resumed: job.resumed,
      input: JSON.stringify(job.input),
      progress: text(job.progress),
      result: text(job.result),
      error: text(job.error),
    });
  }

  async get(id: string): Promise<JobRecord | undefined> {
    const r = this.#st.get.get(id);
    return r ? fromRow(r) : undefined;
  }

  async update(id: string, patch: JobPatch): Promise<JobRecord | undefined> {
    const tx = this.#db.transaction((): JobRecord | undefined => {
      const r = this.#st.get.get(id);
      if (!r) return undefined;
      const next: JobRecord = { ...fromRow(r), ...patch };
      this.#st.update.run({
        id,
        status: next.status,
        started_at: next.startedAt,
        finished_at: next.finishedAt,
        resumed: next.resumed,
        progress: text(next.progress),
        result: text(next.result),
        error: text(next.error),
      });
      return next;
    });
    const out = tx();
    return out ? structuredClone(out) : undefined;
  }

  async list(query: { limit: number; status?: JobState }): Promise<JobRecord[]> {
    const rows = query.status === undefined ? this.#st.list.all(query.limit) : this.#st.listStatus.all(query.status, query.limit);
    return rows.map(fromRow);
  }

  async delete(id: string): Promise<boolean> {
    return this.#st.delete.run(id).changes > 0;
  }

  async putMark(id: string, index: number, mark: MarkResult): Promise<void> {
    if (!this.#st.get.get(id)) return; // deleted meanwhile
    this.#st.putMark.run(id, index, mark.mark, JSON.stringify(mark));
  }

  async marks(id: string): Promise<{ index: number; mark: MarkResult }[]> {
    return this.#st.marks.all(id).map((r) => ({ index: r.idx, mark: JSON.parse(r.result) as MarkResult }));
  }

  async unfinished(): Promise<JobRecord[]> {
    return this.#st.unfinished.all().map(fromRow);
  }

  async close(): Promise<void> {
    if (this.#db.open) this.#db.close();
  }
}

/**
 * Opens the service's job store: `path` if given, else the PLATESMITH_DB environment variable,
 * else `.platesmith/jobs.sqlite` under the working directory; ':memory:' keeps it in memory
 * (lost on restart, as in tests).
 */
export function openJobStore(opts: { path?: string; env?: NodeJS.ProcessEnv; cwd?: string; busyTimeoutMs?: number } = {}): SqliteJobStore {
  const env = opts.env ?? process.env;
  const chosen = opts.path ?? (env['PLATESMITH_DB'] !== undefined && env['PLATESMITH_DB'] !== '' ? env['PLATESMITH_DB'] : undefined);
  const path = chosen === ':memory:' ? ':memory:' : resolve(opts.cwd ?? process.cwd(), chosen ?? DEFAULT_DB_PATH);
  return new SqliteJobStore({ path, ...(opts.busyTimeoutMs !== undefined ? { busyTimeoutMs: opts.busyTimeoutMs } : {}) });
}
