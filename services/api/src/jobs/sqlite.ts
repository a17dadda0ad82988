import { mkdirSync } from 'node:fs';
import { dirname, resolve } from 'node:path';
import Database from 'better-sqlite3';
import { DomainError } from '@platesmith/catalogue';
import type { MarkResult, ScheduleRunResult } from '@platesmith/schedule';
import { ApiError } from '../errors.js';
import type { JobPatch, JobRecord, JobState, JobStore, JobSummary, StoreHealth } from './store.js';

/** Version of the tables below (PRAGMA user_version); a file of a later version is refused. */
export const JOB_STORE_VERSION = 2;

/** Where the job store lives when nothing else is said: under the working directory. */
export const DEFAULT_DB_PATH = '.platesmith/jobs.sqlite';

/**
 * How long a statement waits for another connection's lock, ms. better-sqlite3 is synchronous:
 * the wait blocks the event loop, so it is short and a busy store answers 503 + Retry-After.
 */
export const DEFAULT_BUSY_TIMEOUT_MS = 200;

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
  error       TEXT,
  owner       TEXT,
  name        TEXT,
  marks       INTEGER NOT NULL DEFAULT 0
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

/** Version 1 → 2: owner, name and mark count as columns (the summary is read without the input). */
const MIGRATE_1_2 = `
ALTER TABLE jobs ADD COLUMN owner TEXT;
ALTER TABLE jobs ADD COLUMN name TEXT;
ALTER TABLE jobs ADD COLUMN marks INTEGER NOT NULL DEFAULT 0;
UPDATE jobs SET name = json_extract(input, '$.name'), marks = coalesce(json_array_length(input, '$.girders'), 0);
`;
const INDEXES_2 = `
CREATE INDEX IF NOT EXISTS jobs_by_owner ON jobs (owner, status);
CREATE INDEX IF NOT EXISTS jobs_by_finish ON jobs (finished_at) WHERE finished_at IS NOT NULL;
`;

interface Row {
  id: string;
  kind: 'schedule';
  owner: string | null;
  status: JobState;
  name: string | null;
  marks: number;
  created_at: string;
  started_at: string | null;
  finished_at: string | null;
  resumed: number;
  progress: string | null;
  error: string | null;
}

const parse = <T>(s: string | null): T | null => (s === null ? null : (JSON.parse(s) as T));
const text = (v: unknown): string | null => (v === null || v === undefined ? null : JSON.stringify(v));

function fromRow(r: Row): JobSummary {
  return {
    id: r.id,
    kind: r.kind,
    owner: r.owner,
    status: r.status,
    name: r.name,
    marks: r.marks,
    createdAt: r.created_at,
    startedAt: r.started_at,
    finishedAt: r.finished_at,
    progress: parse(r.progress),
    error: parse(r.error),
    resumed: r.resumed,
  };
}

/** The patch's fields and their columns (JSON ones as text). */
const COLUMNS: Record<keyof JobPatch, { col: string; json: boolean }> = {
  status: { col: 'status', json: false },
  startedAt: { col: 'started_at', json: false },
  finishedAt: { col: 'finished_at', json: false },
  resumed: { col: 'resumed', json: false },
  progress: { col: 'progress', json: true },
  result: { col: 'result', json: true },
  error: { col: 'error', json: true },
};

/** SQLite result codes (extended codes start with the primary's name) that make the store unusable until fixed. */
const FATAL = /^SQLITE_(FULL|CORRUPT|NOTADB|IOERR|READONLY|CANTOPEN|PROTOCOL|NOMEM)/;
const BUSY = /^SQLITE_(BUSY|LOCKED)/;
/** a fault that a later successful write clears (space freed, lock released); the others stay until restart */
const PASSING = /^SQLITE_(FULL|IOERR|READONLY|NOMEM)/;

function sqliteCode(e: unknown): string | undefined {
  const c = (e as { code?: unknown } | null)?.code;
  return typeof c === 'string' && c.startsWith('SQLITE_') ? c : undefined;
}

export interface SqliteJobStoreOptions {
  /** database file, or ':memory:' (tests); its folder is created when missing */
  path: string;
  /** how long a statement waits for another connection's lock, ms (default DEFAULT_BUSY_TIMEOUT_MS) */
  busyTimeoutMs?: number;
  /** run PRAGMA quick_check at open (default true); a store that fails it opens unusable, /ready says why */
  integrityCheck?: boolean;
  /** cap on the file's size in pages of 4 KiB (PRAGMA max_page_count); past it a write fails as on a full disk (tests make a full store with it) */
  maxPages?: number;
}

type Statements = {
  insert: Database.Statement;
  count: Database.Statement<unknown[], { n: number }>;
  get: Database.Statement<[string], Row>;
  input: Database.Statement<[string], { input: string }>;
  result: Database.Statement<[string], { result: string | null }>;
  list: Database.Statement<[number], Row>;
  unfinished: Database.Statement<[], Row>;
  delete: Database.Statement<[string]>;
  putMark: Database.Statement;
  marks: Database.Statement<[string], { idx: number; result: string }>;
  purge: Database.Statement<[string]>;
};

const SUMMARY = 'id, kind, owner, status, name, marks, created_at, started_at, finished_at, resumed, progress, error';

/**
 * The durable job store: one SQLite file (better-sqlite3, WAL journal, a short busy_timeout,
 * synchronous=FULL so a committed write survives a killed process and a power cut). A job is
 * one row of `jobs` (times as text, input/progress/result/error as JSON text, owner, name and
 * mark count as columns so the summary is read without the input); each finished mark is one
 * row of `job_marks`, written when the mark finishes. better-sqlite3 is synchronous: each method
 * runs to completion before it returns, so writes never interleave.
 *
 * It never throws a raw SQLite error: a lock held by another connection is ApiError STORE_BUSY
 * (503, Retry-After 1); a full, corrupt, read-only or failing file is STORE_UNAVAILABLE and
 * `health()` turns false with the cause. A file that fails the integrity check at open, or that is
 * corrupt, stays unusable until the service restarts on a repaired or new file; a full disk or a
 * read-only file clears at the next write that succeeds.
 */
export class SqliteJobStore implements JobStore {
  readonly path: string;
  readonly #db: Database.Database;
  #st: Statements | undefined;
  readonly #updates = new Map<string, Database.Statement>();
  #fault: { cause: string; passing: boolean } | null = null;

  constructor(opts: SqliteJobStoreOptions) {
    this.path = opts.path;
    const unusable = (what: string, e: unknown): DomainError =>
      new DomainError(
        'JOB_STORE_UNUSABLE',
        `the job store PLATESMITH_DB=${opts.path} ${what}${e instanceof Error ? ` (${e.message})` : ''}`,
        'point PLATESMITH_DB at a job store file of this service, or at a path where a new one can be created',
        'PLATESMITH_DB',
      );
    try {
      if (opts.path !== ':memory:') mkdirSync(dirname(resolve(opts.path)), { recursive: true });
      this.#db = new Database(opts.path);
    } catch (e) {
      throw unusable('cannot be opened', e);
    }
    try {
      this.#db.pragma(`busy_timeout = ${Math.max(0, Math.round(opts.busyTimeoutMs ?? DEFAULT_BUSY_TIMEOUT_MS))}`);
      this.#db.pragma('journal_mode = WAL');
      this.#db.pragma('synchronous = FULL');
      this.#db.pragma('foreign_keys = ON');
      if (opts.maxPages !== undefined) this.#db.pragma(`max_page_count = ${Math.max(1, Math.floor(opts.maxPages))}`);
    } catch (e) {
      const code = sqliteCode(e);
      if (code === 'SQLITE_NOTADB') {
        this.#db.close();
        throw unusable('is not a SQLite database', e);
      }
      if (!code?.match(/^SQLITE_CORRUPT/)) {
        this.#db.close();
        throw unusable('cannot be opened', e);
      }
      this.#fault = { cause: `the job store ${opts.path} is corrupt: ${(e as Error).message}`, passing: false };
      return;
    }
    try {
      if (opts.integrityCheck !== false) {
        const rows = this.#db.pragma('quick_check(5)') as { quick_check: string }[];
        const found = rows.map((r) => r.quick_check).filter((s) => s !== 'ok');
        if (found.length > 0) {
          this.#fault = { cause: `the job store ${opts.path} failed its integrity check: ${found.join('; ')}`, passing: false };
          return;
        }
      }
      const version = this.#db.pragma('user_version', { simple: true }) as number;
      if (version > JOB_STORE_VERSION) {
        this.#db.close();
        throw new DomainError('JOB_STORE_VERSION', `the job store ${opts.path} has version ${version}; this service reads version ${JOB_STORE_VERSION}`, 'point PLATESMITH_DB at another file, or run the newer service', 'PLATESMITH_DB');
      }
      this.#db.transaction(() => {
        const fresh = !(this.#db.prepare("SELECT 1 FROM sqlite_master WHERE type = 'table' AND name = 'jobs'").get());
        if (!fresh && version < 2) this.#db.exec(MIGRATE_1_2);
        this.#db.exec(DDL);
        this.#db.exec(INDEXES_2);
        this.#db.pragma(`user_version = ${JOB_STORE_VERSION}`);
      })();
      this.#prepare();
    } catch (e) {
      if (e instanceof DomainError) throw e;
      const code = sqliteCode(e);
      if (code === 'SQLITE_NOTADB') {
        this.#db.close();
        throw unusable('is not a SQLite database', e);
      }
      if (!code || !FATAL.test(code)) {
        if (this.#db.open) this.#db.close();
        throw unusable('cannot be set up', e);
      }
      this.#fault = { cause: `the job store ${opts.path} cannot be used (${code}): ${(e as Error).message}`, passing: false };
    }
  }

  #prepare(): void {
    const db = this.#db;
    const cols = 'id, kind, owner, status, name, marks, created_at, started_at, finished_at, resumed, input, progress, result, error';
    this.#st = {
      insert: db.prepare(`INSERT INTO jobs (${cols}) VALUES (@id, @kind, @owner, @status, @name, @marks, @created_at, @started_at, @finished_at, @resumed, @input, @progress, @result, @error)`),
      count: db.prepare("SELECT count(*) AS n FROM jobs WHERE owner IS ? AND status IN ('queued', 'running')"),
      get: db.prepare(`SELECT ${SUMMARY} FROM jobs WHERE id = ?`),
      input: db.prepare('SELECT input FROM jobs WHERE id = ?'),
      result: db.prepare('SELECT result FROM jobs WHERE id = ?'),
      list: db.prepare(`SELECT ${SUMMARY} FROM jobs ORDER BY seq DESC LIMIT ?`),
      unfinished: db.prepare(`SELECT ${SUMMARY} FROM jobs WHERE status IN ('queued', 'running') ORDER BY seq ASC`),
      delete: db.prepare('DELETE FROM jobs WHERE id = ?'),
      putMark: db.prepare(
        'INSERT INTO job_marks (job_id, idx, mark, result) SELECT @id, @idx, @mark, @result WHERE EXISTS (SELECT 1 FROM jobs WHERE id = @id) ON CONFLICT (job_id, idx) DO UPDATE SET mark = excluded.mark, result = excluded.result',
      ),
      marks: db.prepare('SELECT idx, result FROM job_marks WHERE job_id = ? ORDER BY idx'),
      purge: db.prepare("DELETE FROM jobs WHERE status IN ('done', 'failed', 'cancelled') AND finished_at IS NOT NULL AND finished_at < ?"),
    };
  }

  /** Runs one operation; SQLite errors become ApiErrors, and a fatal one marks the store unusable. */
  #run<T>(write: boolean, fn: (st: Statements) => T): T {
    const f = this.#fault;
    if (f && !f.passing) throw new ApiError('STORE_UNAVAILABLE', 'the job store is unusable; see /ready and the log', { retryAfter: 30, cause: new Error(f.cause) });
    if (!this.#db.open || !this.#st) throw new ApiError('STORE_UNAVAILABLE', 'the job store is closed', { retryAfter: 30 });
    try {
      const out = fn(this.#st);
      if (write && f) this.#fault = null;
      return out;
    } catch (e) {
      const code = sqliteCode(e);
      if (code && BUSY.test(code)) throw new ApiError('STORE_BUSY', 'the job store is locked by another connection', { retryAfter: 1, cause: e });
      if (code && FATAL.test(code)) {
        this.#fault = { cause: `the job store ${this.path} failed (${code}): ${(e as Error).message}`, passing: PASSING.test(code) };
        throw new ApiError('STORE_UNAVAILABLE', `the job store failed (${code})`, { retryAfter: 30, cause: e });
      }
      throw e;
    }
  }

  health(): StoreHealth {
    return this.#fault ? { ok: false, cause: this.#fault.cause } : { ok: true };
  }

  /** the journal mode SQLite reports ('wal' for a file, 'memory' for ':memory:') */
  get journalMode(): string {
    return String(this.#db.pragma('journal_mode', { simple: true }));
  }

  async insert(job: JobRecord, quota?: number): Promise<boolean> {
    return this.#run(true, (st) =>
      this.#db.transaction((): boolean => {
        if (quota !== undefined && st.count.get(job.owner)!.n >= quota) return false;
        st.insert.run({
          id: job.id,
          kind: job.kind,
          owner: job.owner,
          status: job.status,
          name: job.name,
          marks: job.marks,
          created_at: job.createdAt,
          started_at: job.startedAt,
          finished_at: job.finishedAt,
          resumed: job.resumed,
          input: JSON.stringify(job.input),
          progress: text(job.progress),
          result: text(job.result),
          error: text(job.error),
        });
        return true;
      }).immediate(),
    );
  }

  async get(id: string): Promise<JobSummary | undefined> {
    const r = this.#run(false, (st) => st.get.get(id));
    return r ? fromRow(r) : undefined;
  }

  async input(id: string): Promise<JobRecord['input'] | undefined> {
    const r = this.#run(false, (st) => st.input.get(id));
    return r ? (JSON.parse(r.input) as JobRecord['input']) : undefined;
  }

  async result(id: string): Promise<ScheduleRunResult | null | undefined> {
    const r = this.#run(false, (st) => st.result.get(id));
    return r ? parse<ScheduleRunResult>(r.result) : undefined;
  }

  /** One UPDATE of the patch's columns (a statement per set of fields, prepared once): the job is not read. */
  async update(id: string, patch: JobPatch): Promise<boolean> {
    const keys = (Object.keys(patch) as (keyof JobPatch)[]).filter((k) => COLUMNS[k] !== undefined && patch[k] !== undefined).sort();
    if (keys.length === 0) return (await this.get(id)) !== undefined;
    const values: Record<string, unknown> = { id };
    for (const k of keys) values[k] = COLUMNS[k].json ? text(patch[k]) : patch[k];
    return this.#run(true, () => {
      const sig = keys.join(',');
      let st = this.#updates.get(sig);
      if (!st) this.#updates.set(sig, (st = this.#db.prepare(`UPDATE jobs SET ${keys.map((k) => `${COLUMNS[k].col} = @${k}`).join(', ')} WHERE id = @id`)));
      return st.run(values).changes > 0;
    });
  }

  async list(query: { limit: number; status?: JobState; owner?: string | null }): Promise<JobSummary[]> {
    const where: string[] = [];
    const args: unknown[] = [];
    if (query.status !== undefined) {
      where.push('status = ?');
      args.push(query.status);
    }
    if (query.owner !== undefined) {
      where.push('owner IS ?');
      args.push(query.owner);
    }
    const rows = this.#run(false, (st) =>
      where.length === 0 ? st.list.all(query.limit) : (this.#db.prepare(`SELECT ${SUMMARY} FROM jobs WHERE ${where.join(' AND ')} ORDER BY seq DESC LIMIT ?`).all(...args, query.limit) as Row[]),
    );
    return rows.map(fromRow);
  }

  async delete(id: string): Promise<boolean> {
    return this.#run(true, (st) => st.delete.run(id).changes > 0);
  }

  async putMark(id: string, index: number, mark: MarkResult): Promise<void> {
    // a job deleted meanwhile gets no mark (the INSERT selects nothing)
    this.#run(true, (st) => st.putMark.run({ id, idx: index, mark: mark.mark, result: JSON.stringify(mark) }));
  }

  async marks(id: string): Promise<{ index: number; mark: MarkResult }[]> {
    return this.#run(false, (st) => st.marks.all(id)).map((r) => ({ index: r.idx, mark: JSON.parse(r.result) as MarkResult }));
  }

  async unfinished(): Promise<JobSummary[]> {
    return this.#run(false, (st) => st.unfinished.all()).map(fromRow);
  }

  async purgeFinished(before: string): Promise<number> {
    return this.#run(true, (st) => st.purge.run(before).changes);
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
