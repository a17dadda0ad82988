/**
 * The SQLite job store (better-sqlite3): WAL on a file, records round-trip as JSON, per-mark
 * rows, unfinished jobs oldest first, delete cascades to the marks, a later schema version is
 * refused, and the path rule of openJobStore (option, PLATESMITH_DB, default under the working
 * directory). Behaviour tests; no engineering value.
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { createRequire } from 'node:module';
import { fileURLToPath } from 'node:url';
import { afterAll, expect, test } from 'vitest';
import { JobManager } from '../../services/api/src/jobs/manager.js';
import { openJobStore, SqliteJobStore } from '../../services/api/src/jobs/sqlite.js';
import { summaryOf, type JobRecord, type JobSummary } from '../../services/api/src/jobs/store.js';
import type { MarkResult, ScheduleJson } from '@platesmith/schedule';

// better-sqlite3 is the service's dependency, not the test package's: load it from there
const Database = createRequire(fileURLToPath(new URL('../../services/api/package.json', import.meta.url)))('better-sqlite3') as new (path: string) => { pragma(s: string): unknown; close(): void };
const dir = mkdtempSync(join(tmpdir(), 'platesmith-store-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

const input = { defaults: {}, girders: [{ mark: 'G1', quantity: 1 }, { mark: 'G2', quantity: 2 }] } as unknown as ScheduleJson;
const job = (id: string, status: JobRecord['status'] = 'queued'): JobRecord => ({ id, kind: 'schedule', owner: null, status, name: null, marks: 2, createdAt: '2026-01-01T00:00:00.000Z', startedAt: null, finishedAt: null, progress: null, input, result: null, error: null, resumed: 0 });
const mark = (m: string): MarkResult => ({ mark: m, quantity: 1, status: 'failed', search: null, adopted: null, error: { code: 'X', message: 'invented' } });

test('file store: WAL, round trip, marks, unfinished, cascade delete, reopen keeps everything', async () => {
  const path = join(dir, 'a', 'jobs.sqlite');
  const s = new SqliteJobStore({ path });
  expect(s.journalMode).toBe('wal');
  await s.insert(job('j1'));
  await s.insert(job('j2', 'running'));
  await s.insert(job('j3', 'done'));
  expect(await s.get('j1')).toEqual(summaryOf(job('j1')));
  expect(await s.input('j1')).toEqual(input);
  expect(await s.result('j1')).toBeNull();
  expect(await s.update('j1', { status: 'running', startedAt: '2026-01-01T00:00:01.000Z', progress: { marksDone: 1, marksTotal: 2, currentMark: 'G2', elapsedMs: 5, estimateMs: 5 } })).toBe(true);
  expect(await s.get('j1')).toMatchObject({ id: 'j1', status: 'running', progress: { marksDone: 1 } });
  expect(await s.update('nope', { status: 'done' })).toBe(false);
  await s.putMark('j1', 0, mark('G1'));
  await s.putMark('j1', 0, mark('G1')); // replaces, not duplicates
  await s.putMark('nope', 0, mark('G1')); // unknown job: ignored
  expect(await s.marks('j1')).toEqual([{ index: 0, mark: mark('G1') }]);
  expect((await s.unfinished()).map((j) => j.id)).toEqual(['j1', 'j2']);
  expect((await s.list({ limit: 2 })).map((j) => j.id)).toEqual(['j3', 'j2']);
  expect((await s.list({ limit: 10, status: 'done' })).map((j) => j.id)).toEqual(['j3']);
  await s.close();

  const again = new SqliteJobStore({ path });
  expect(await again.get('j1')).toMatchObject({ status: 'running', progress: { marksDone: 1 } });
  expect(await again.marks('j1')).toHaveLength(1);
  expect(await again.delete('j1')).toBe(true);
  expect(await again.delete('j1')).toBe(false);
  expect(await again.marks('j1')).toEqual([]);
  await again.close();
});

test('a store file of a later version is refused with a domain error naming PLATESMITH_DB', () => {
  const path = join(dir, 'future.sqlite');
  const db = new Database(path);
  db.pragma('user_version = 99');
  db.close();
  expect(() => new SqliteJobStore({ path })).toThrow(expect.objectContaining({ code: 'JOB_STORE_VERSION', field: 'PLATESMITH_DB' }));
});

test('openJobStore: option, then PLATESMITH_DB, then .platesmith/jobs.sqlite under the working directory', async () => {
  const a = openJobStore({ path: ':memory:' });
  expect(a.path).toBe(':memory:');
  await a.close();
  const b = openJobStore({ env: { PLATESMITH_DB: 'x/env.sqlite' }, cwd: dir });
  expect(b.path).toBe(join(dir, 'x', 'env.sqlite'));
  await b.close();
  const c = openJobStore({ env: {}, cwd: dir });
  expect(c.path).toBe(join(dir, '.platesmith', 'jobs.sqlite'));
  await c.close();
});

test('manager on a store with interrupted jobs: takes them up, keeps stored marks, runs the rest', async () => {
  const s = new SqliteJobStore({ path: ':memory:' });
  await s.insert({ ...job('k1', 'running'), startedAt: '2026-01-01T00:00:01.000Z' });
  await s.putMark('k1', 0, mark('G1'));
  const ran: string[][] = [];
  const m = new JobManager(s, async (inp, _signal, onProgress) => {
    ran.push(inp.girders.map((g) => g.mark));
    const marks = inp.girders.map((g) => mark(g.mark));
    onProgress({ marksDone: marks.length, marksTotal: marks.length, currentMark: null, elapsedMs: 1, estimateMs: 0, finished: marks[0]! });
    return { name: null, marks, totals: { marks: marks.length, marksFailed: marks.length, girders: 0, tonnage: 0, marksWithoutFeasible: [], girdersWithoutFeasible: 0, adoptedFailing: [] } };
  });
  await m.ready;
  const done = await new Promise<JobSummary>((resolve) => {
    const unsub = m.subscribe('k1', (e) => {
      if (e.type === 'done') {
        unsub();
        resolve(e.job);
      }
    });
  });
  expect(ran).toEqual([['G2']]); // G1 was stored: not run again
  expect(done).toMatchObject({ status: 'done', resumed: 1, progress: { marksDone: 2, marksTotal: 2 } });
  expect((await s.result('k1'))!.marks.map((x) => x.mark)).toEqual(['G1', 'G2']);
  expect((await s.marks('k1')).map((x) => x.mark.mark)).toEqual(['G1', 'G2']);
  await m.shutdown();
  await s.close();
});
