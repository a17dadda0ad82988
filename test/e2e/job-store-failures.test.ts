/**
 * Regression tests of issue 16's store defects: a locked, full or corrupt job store used to kill
 * the process (an unhandled rejection from a progress write) or answer 500; a file that is no
 * database exited without naming PLATESMITH_DB; every progress write re-read and re-parsed the
 * whole job. Behaviour tests of the service; no engineering value is asserted. Every wait is on an
 * event or a promise the test controls (no sleeps).
 */
import { openSync, closeSync, mkdtempSync, rmSync, statSync, writeFileSync, writeSync } from 'node:fs';
import { createRequire } from 'node:module';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import type { MarkResult, ScheduleJson } from '@platesmith/schedule';
import { afterAll, afterEach, beforeEach, expect, test } from 'vitest';
import { JobManager } from '../../services/api/src/jobs/manager.js';
import { openJobStore, SqliteJobStore } from '../../services/api/src/jobs/sqlite.js';
import type { JobRecord, JobStore } from '../../services/api/src/jobs/store.js';
import { PROBLEM, start, TINY_SPACE, type Running } from '../../services/api/test/harness.js';

type Db = { exec(sql: string): void; prepare(sql: string): { run(...a: unknown[]): unknown }; pragma(s: string): unknown; close(): void };
// better-sqlite3 is the service's dependency, not the test package's: load it from there
const Database = createRequire(fileURLToPath(new URL('../../services/api/package.json', import.meta.url)))('better-sqlite3') as new (path: string) => Db;

const dir = mkdtempSync(join(tmpdir(), 'platesmith-store-failures-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));
let n = 0;
const fresh = (): string => join(dir, `jobs-${++n}.sqlite`);

// the job path must never leave a rejection unhandled (it used to exit the process)
const unhandled: unknown[] = [];
const onUnhandled = (e: unknown): void => void unhandled.push(e);
beforeEach(() => {
  unhandled.length = 0;
  process.on('unhandledRejection', onUnhandled);
});
afterEach(() => {
  process.off('unhandledRejection', onUnhandled);
  expect(unhandled).toEqual([]);
});

const SCHEDULE = { defaults: { ...PROBLEM, space: TINY_SPACE }, girders: [{ mark: 'G1', quantity: 1 }] };
const input = (marks: number, pad = 0): ScheduleJson => ({ defaults: { pad: 'x'.repeat(pad) }, girders: Array.from({ length: marks }, (_, i) => ({ mark: `G${i + 1}`, quantity: 1 })) }) as unknown as ScheduleJson;
const record = (id: string, inp: ScheduleJson): JobRecord => ({ id, kind: 'schedule', owner: null, status: 'queued', name: null, marks: inp.girders.length, createdAt: '2026-01-01T00:00:00.000Z', startedAt: null, finishedAt: null, progress: null, input: inp, result: null, error: null, resumed: 0 });
const markOf = (m: string): MarkResult => ({ mark: m, quantity: 1, status: 'failed', search: null, adopted: null, error: { code: 'X', message: 'invented' } });
const totals = (k: number) => ({ marks: k, marksFailed: k, girders: k, tonnage: 0, marksWithoutFeasible: [], girdersWithoutFeasible: 0, adoptedFailing: [] });

/** A work function whose marks finish when the test says (step()), reporting each through onProgress. */
function steppedWork() {
  const waiting: (() => void)[] = [];
  let arrived: (() => void) | null = null;
  const work = async (inp: ScheduleJson, _s: AbortSignal, onProgress: (p: any) => void) => {
    const marks: MarkResult[] = [];
    for (const g of inp.girders) {
      await new Promise<void>((r) => {
        waiting.push(r);
        arrived?.();
      });
      marks.push(markOf(g.mark));
      onProgress({ marksDone: marks.length, marksTotal: inp.girders.length, currentMark: null, elapsedMs: 1, estimateMs: 0, finished: marks.at(-1) });
    }
    return { name: null, marks, totals: totals(marks.length) };
  };
  /** resolves once a mark waits for its step */
  const next = (): Promise<void> => (waiting.length > 0 ? Promise.resolve() : new Promise((r) => (arrived = r)));
  const step = (): void => waiting.shift()!();
  return { work, next, step };
}

function doneOf(m: JobManager, id: string): Promise<void> {
  return new Promise((resolve) => {
    const unsub = m.subscribe(id, (e) => {
      if (e.type === 'done') {
        unsub();
        resolve();
      }
    });
  });
}

test('503 + Retry-After while the store is locked by a second connection; reads and /health still answer', async () => {
  const path = fresh();
  const srv: Running = await start({ threads: 1, jobStore: new SqliteJobStore({ path }) });
  try {
    const before = await srv.post('/v1/schedules', SCHEDULE);
    expect(before.status).toBe(202);
    const lock = new Database(path);
    lock.exec('BEGIN IMMEDIATE'); // holds the write lock (WAL: readers go on)
    try {
      const r = await srv.post('/v1/schedules', SCHEDULE);
      expect(r.status).toBe(503);
      expect(r.headers.get('retry-after')).toBe('1');
      expect(r.headers.get('content-type')).toMatch(/^application\/problem\+json/);
      expect(r.body).toMatchObject({ status: 503, code: 'STORE_BUSY' });
      expect((await srv.get('/v1/schedules')).status).toBe(200);
      expect((await srv.get('/health')).status).toBe(200);
    } finally {
      lock.exec('ROLLBACK');
      lock.close();
    }
    expect((await srv.post('/v1/schedules', SCHEDULE)).status).toBe(202);
  } finally {
    await srv.close();
  }
});

test('a job whose writes meet a locked store runs on: the failed writes are logged, its marks stored later, no unhandled rejection', async () => {
  const path = fresh();
  const store = new SqliteJobStore({ path, busyTimeoutMs: 0 });
  const failures: unknown[] = [];
  const w = steppedWork();
  const m = new JobManager(store, w.work, { onFailure: (_id, e) => failures.push(e), retentionMs: 0 });
  const job = await m.submit(input(2));
  const done = doneOf(m, job.id);
  await w.next();
  const lock = new Database(path);
  lock.exec('BEGIN IMMEDIATE');
  w.step(); // G1 finishes while the store is locked: its write fails
  await w.next();
  lock.exec('ROLLBACK');
  lock.close();
  w.step(); // G2 finishes: G1's mark is written first, then G2's and the result
  await done;
  expect(failures.length).toBeGreaterThan(0);
  expect(failures.every((e) => (e as { code?: string }).code === 'STORE_BUSY')).toBe(true);
  expect(await store.get(job.id)).toMatchObject({ status: 'done', progress: { marksDone: 2 } });
  expect((await store.marks(job.id)).map((x) => x.mark.mark)).toEqual(['G1', 'G2']);
  await m.shutdown();
  await store.close();
});

test('a full store: 503 STORE_UNAVAILABLE, /ready false naming SQLITE_FULL, both cleared once a write succeeds again', async () => {
  const store = new SqliteJobStore({ path: fresh(), maxPages: 48 });
  const srv = await start({ threads: 1, jobStore: store });
  try {
    const fillers: string[] = [];
    // invented padding until the capped file is full
    for (let i = 0; i < 100; i++) {
      const ok = await store.insert({ ...record(`fill-${i}`, input(1, 20_000)), status: 'done', finishedAt: '2026-01-01T00:00:00.000Z' }).then(
        () => true,
        (e: unknown) => {
          expect(e).toMatchObject({ code: 'STORE_UNAVAILABLE', retryAfter: 30 });
          return false;
        },
      );
      if (!ok) break;
      fillers.push(`fill-${i}`);
    }
    expect(store.health()).toMatchObject({ ok: false, cause: expect.stringContaining('SQLITE_FULL') });
    // ~40 kB of marks: more than any free space left in the capped file
    const r = await srv.post('/v1/schedules', { ...SCHEDULE, girders: Array.from({ length: 500 }, (_, i) => ({ mark: `G${i}-${'x'.repeat(30)}`, quantity: 1 })) });
    expect(r.status).toBe(503);
    expect(r.headers.get('retry-after')).toBe('30');
    expect(r.body).toMatchObject({ code: 'STORE_UNAVAILABLE' });
    const ready = await srv.get('/ready');
    expect(ready.status).toBe(503);
    expect(ready.headers.get('retry-after')).toBeTruthy();
    expect(ready.body).toMatchObject({ code: 'NOT_READY', detail: expect.stringContaining('SQLITE_FULL') });
    expect(srv.logs.some((l) => l['level'] === 50 && JSON.stringify(l).includes('SQLITE_FULL'))).toBe(true);
    // space freed: the next write succeeds and the store is usable again
    for (const id of fillers.slice(0, 4)) await store.delete(id);
    expect(store.health()).toEqual({ ok: true });
    expect((await srv.get('/ready')).status).toBe(200);
  } finally {
    await srv.close();
  }
});

test('/ready false with a corrupt store: the integrity check at start finds it, job routes answer 503, the cause is logged', async () => {
  const path = fresh();
  const s = new SqliteJobStore({ path });
  for (let i = 0; i < 200; i++) await s.insert(record(`j${i}`, input(20, 500)));
  await s.close();
  expect(statSync(path).size).toBeGreaterThan(30 * 4096);
  // invented damage: two pages of the file overwritten with garbage
  const fd = openSync(path, 'r+');
  for (const page of [3, 20]) writeSync(fd, Buffer.alloc(4096, 0x5a), 0, 4096, page * 4096);
  closeSync(fd);

  const srv = await start({ threads: 1, jobStore: new SqliteJobStore({ path }) });
  try {
    await srv.app.ready();
    const ready = await srv.get('/ready');
    expect(ready.status).toBe(503);
    expect(ready.body).toMatchObject({ code: 'NOT_READY', detail: expect.stringContaining('integrity check') });
    for (const r of [await srv.get('/v1/schedules'), await srv.get('/v1/schedules/j1'), await srv.post('/v1/schedules', SCHEDULE)]) {
      expect(r.status).toBe(503);
      expect(r.headers.get('retry-after')).toBe('30');
      expect(r.body).toMatchObject({ code: 'STORE_UNAVAILABLE' });
    }
    expect((await srv.get('/health')).status).toBe(200);
    expect(srv.logs.some((l) => l['level'] === 50 && String(l['cause']).includes('integrity check'))).toBe(true);
  } finally {
    await srv.close();
  }
});

test('a store path that is no database: a clear error naming PLATESMITH_DB', () => {
  const path = join(dir, 'notes.txt');
  writeFileSync(path, 'these are notes, not a job store\n'.repeat(200));
  expect(() => openJobStore({ env: { PLATESMITH_DB: path } })).toThrow(
    expect.objectContaining({ code: 'JOB_STORE_UNUSABLE', field: 'PLATESMITH_DB', message: expect.stringMatching(/PLATESMITH_DB=.*notes\.txt is not a SQLite database/) }),
  );
  expect(() => openJobStore({ env: { PLATESMITH_DB: dir } })).toThrow(expect.objectContaining({ code: 'JOB_STORE_UNUSABLE', field: 'PLATESMITH_DB' }));
});

test('a progress write does not read the job: it works on a row whose input is no longer JSON', async () => {
  const path = fresh();
  const s = new SqliteJobStore({ path });
  await s.insert(record('p1', input(500, 2000)));
  const other = new Database(path);
  other.prepare("UPDATE jobs SET input = 'not json' WHERE id = ?").run('p1');
  other.close();
  expect(await s.update('p1', { status: 'running', progress: { marksDone: 1, marksTotal: 500, currentMark: 'G2', elapsedMs: 5, estimateMs: 2000 } })).toBe(true);
  expect(await s.get('p1')).toMatchObject({ status: 'running', marks: 500, progress: { marksDone: 1 } });
  expect((await s.list({ limit: 5 })).map((j) => j.id)).toEqual(['p1']);
  await s.close();
});

test('a job of 300 marks writes its progress without reading the job back (the store sees updates and marks only)', async () => {
  const calls: Record<string, number> = {};
  const inner = new SqliteJobStore({ path: ':memory:' });
  const store = new Proxy(inner, {
    get(t, k, r) {
      const v = Reflect.get(t, k, r);
      if (typeof v !== 'function') return v;
      return (...a: unknown[]) => {
        calls[String(k)] = (calls[String(k)] ?? 0) + 1;
        return (v as (...x: unknown[]) => unknown).apply(t, a);
      };
    },
  }) as JobStore;
  const work = async (inp: ScheduleJson, _s: AbortSignal, onProgress: (p: any) => void) => {
    const marks = inp.girders.map((g) => markOf(g.mark));
    marks.forEach((mk, i) => onProgress({ marksDone: i + 1, marksTotal: marks.length, currentMark: null, elapsedMs: 1, estimateMs: 0, finished: mk }));
    return { name: null, marks, totals: totals(marks.length) };
  };
  const m = new JobManager(store, work, { retentionMs: 0 });
  await m.ready;
  const job = await m.submit(input(300, 1000));
  await doneOf(m, job.id);
  expect(calls).toMatchObject({ insert: 1, putMark: 300 });
  expect(calls['update']).toBeGreaterThanOrEqual(301);
  for (const read of ['get', 'input', 'result', 'list', 'marks']) expect(calls[read], read).toBeUndefined();
  await m.shutdown();
  await inner.close();
});

test('a version 1 store is migrated: name and mark count become columns, the jobs are kept', async () => {
  const path = fresh();
  const db = new Database(path);
  db.exec(`CREATE TABLE jobs (seq INTEGER PRIMARY KEY AUTOINCREMENT, id TEXT NOT NULL UNIQUE, kind TEXT NOT NULL, status TEXT NOT NULL, created_at TEXT NOT NULL, started_at TEXT, finished_at TEXT, resumed INTEGER NOT NULL DEFAULT 0, input TEXT NOT NULL, progress TEXT, result TEXT, error TEXT);
    CREATE TABLE job_marks (job_id TEXT NOT NULL REFERENCES jobs (id) ON DELETE CASCADE, idx INTEGER NOT NULL, mark TEXT NOT NULL, result TEXT NOT NULL, PRIMARY KEY (job_id, idx));`);
  db.prepare("INSERT INTO jobs (id, kind, status, created_at, input) VALUES ('old', 'schedule', 'queued', '2026-01-01T00:00:00.000Z', ?)").run(JSON.stringify({ name: 'shed', defaults: {}, girders: [{ mark: 'A', quantity: 1 }, { mark: 'B', quantity: 1 }] }));
  db.pragma('user_version = 1');
  db.close();
  const s = new SqliteJobStore({ path });
  expect(await s.get('old')).toMatchObject({ id: 'old', name: 'shed', marks: 2, owner: null, status: 'queued' });
  await s.close();
});
