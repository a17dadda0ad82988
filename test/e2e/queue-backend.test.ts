/**
 * The queue backend (PLATESMITH_QUEUE: Redis and BullMQ) keeps what the embedded one promises:
 * the job store's rules in Redis (quota counted and inserted atomically, a mark stored once, a
 * finished job never overwritten, retention), two API processes serving the same jobs with
 * ownership by key and the rate limit and quota counted in Redis, fairness between keys (per-key
 * queues consumed round-robin) and between one key's jobs (mark priorities), /ready false while
 * Redis is down (and true again when it is back), /metrics in the Prometheus text format behind
 * the keys, and a graceful worker shutdown (the running mark finishes, or goes back to its queue).
 *
 * Behaviour tests; the keys and schedules are invented; no engineering value is asserted.
 * Redis on a free loopback port (or CI's); every wait is bounded.
 */
import { createEngine, type Engine } from '@platesmith/app';
import { Writable } from 'node:stream';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { ApiKeys, parseKeys } from '../../services/api/src/keys.js';
import type { JobRecord } from '../../services/api/src/jobs/store.js';
import { RedisJobStore } from '../../services/api/src/queue/redis-store.js';
import { QueueWorker } from '../../services/api/src/queue/worker.js';
import { PROBLEM, start, TINY_SPACE, type Running } from '../../services/api/test/harness.js';
import { HAVE_REDIS, NO_REDIS, sharedRedis, startRedis, testPrefix, type RedisServer } from '../helpers/redis.js';

const ALICE = 'alice-secret-0123456789abcdef';
const BOB = 'bob-secret-fedcba9876543210';
const bearer = (k: string) => ({ authorization: `Bearer ${k}` });
const keys = () => new ApiKeys(parseKeys(`alice:${ALICE},bob:${BOB}`, 'PLATESMITH_API_KEYS'));
const schedule = (prefix: string, n: number, extra: object = {}) => ({ defaults: { ...PROBLEM, space: TINY_SPACE, ...extra }, girders: Array.from({ length: n }, (_, i) => ({ mark: `${prefix}${i + 1}`, quantity: 1 })) });
// invented: marks whose searches take about a second on one thread (a window to act in)
const SLOW = { defaults: { actions: PROBLEM.actions, options: { restraint: 'continuous' }, space: { webDepth: { min: 600, max: 2000, step: 50 }, panels: [0] } }, girders: [18000, 20000, 22000].map((s, i) => ({ mark: `S${i + 1}`, quantity: 1, spans: [s] })) };

let redis: RedisServer;
const engines: Engine[] = [];
const closers: (() => Promise<unknown>)[] = [];
beforeAll(async () => {
  if (HAVE_REDIS) redis = await sharedRedis();
});
afterAll(async () => {
  for (const c of closers.reverse()) await c().catch(() => {});
  for (const e of engines) await e.close();
  await redis?.stop();
}, 60_000);

/** a worker in this process, its own engine (one thread), its log lines collected */
async function worker(prefix: string, url = redis.url, budgets: { markBudgetMs?: number; jobBudgetMs?: number } = {}) {
  const engine = createEngine({ threads: 1 });
  engines.push(engine);
  const lines: Record<string, unknown>[] = [];
  const log = { info: (o: object, msg: string) => void lines.push({ ...o, msg }), warn: () => {}, error: (o: object, msg: string) => void lines.push({ ...o, msg, level: 'error' }) };
  const w = new QueueWorker({ url, prefix, engine, log, lockDurationMs: 2000, stalledIntervalMs: 1000, ...budgets });
  await w.start();
  closers.push(() => w.close(500));
  return { w, lines, taken: () => lines.filter((l) => l['msg'] === 'mark taken') };
}

async function until<T>(get: () => Promise<T>, ok: (v: T) => boolean, what: string, ms = 60_000): Promise<T> {
  const t0 = Date.now();
  for (;;) {
    const v = await get();
    if (ok(v)) return v;
    if (Date.now() - t0 > ms) throw new Error(`${what}: not reached in ${ms} ms: ${JSON.stringify(v).slice(0, 300)}`);
    await new Promise((r) => setTimeout(r, 50));
  }
}
const statusOf = (srv: Running, id: string, h: Record<string, string> = {}) => async () => (await srv.get(`/v1/schedules/${id}`, h)).body;
const finished = (b: { status: string }) => ['done', 'failed', 'cancelled'].includes(b.status);

function job(id: string, owner: string | null, at: string): JobRecord {
  return { id, kind: 'schedule', owner, status: 'queued', name: null, marks: 1, createdAt: at, startedAt: null, finishedAt: null, progress: null, input: schedule('G', 1) as never, result: null, error: null, resumed: 0 };
}

describe.skipIf(!HAVE_REDIS)(HAVE_REDIS ? 'queue backend' : `queue backend — ${NO_REDIS}`, () => {
test('the store in Redis: quota counted and inserted atomically, a mark stored once, a finished job left as it is, owner lists, retention', async () => {
  const s = new RedisJobStore({ url: redis.url, prefix: testPrefix() });
  closers.push(() => s.close());
  await s.connected();
  // 12 submits of one key at once, quota 3: exactly 3 stored
  const r = await Promise.all(Array.from({ length: 12 }, (_, i) => s.insert(job(`q${i}`, 'carol', '2026-01-01T00:00:00.000Z'), 3)));
  expect(r.filter(Boolean)).toHaveLength(3);
  expect((await s.list({ limit: 50, owner: 'carol' })).map((j) => j.owner)).toEqual(['carol', 'carol', 'carol']);
  expect(await s.list({ limit: 50, owner: 'dave' })).toEqual([]);
  const id = r.findIndex(Boolean);
  const jid = `q${id}`;
  // at-least-once delivery: the second result of a mark is not stored
  const m1 = { mark: 'G1', quantity: 1, status: 'ok' as const, search: null, adopted: null };
  expect(await s.putMarkOnce(jid, 0, m1)).toBe(true);
  expect(await s.putMarkOnce(jid, 0, { ...m1, quantity: 2 })).toBe(false);
  expect(await s.marks(jid)).toEqual([{ index: 0, mark: m1 }]);
  expect((await s.get(jid))!.progress).toMatchObject({ marksDone: 1, marksTotal: 1 });
  // a cancel is final: a late worker's write does not overwrite it; the quota counts it no more
  expect(await s.updateIfActive(jid, { status: 'cancelled', finishedAt: '2026-01-02T00:00:00.000Z' })).toBe('applied');
  expect(await s.updateIfActive(jid, { status: 'done' })).toBe('finished');
  expect((await s.get(jid))!.status).toBe('cancelled');
  expect(await s.insert(job('q-next', 'carol', '2026-01-03T00:00:00.000Z'), 3)).toBe(true);
  // retention: finished before the time given are removed with their marks; the rest stay
  expect(await s.purgeFinished('2026-01-01T12:00:00.000Z')).toBe(0);
  expect(await s.purgeFinished('2026-01-02T12:00:00.000Z')).toBe(1);
  expect(await s.get(jid)).toBeUndefined();
  expect(await s.marks(jid)).toEqual([]);
  expect((await s.unfinished()).map((j) => j.id).sort()).toEqual([...r.map((ok, i) => (ok ? `q${i}` : null)).filter((x) => x !== null && x !== jid), 'q-next'].sort());
});

test('two API processes on one Redis: the same jobs, ownership by key, the rate limit and the quota counted together; /metrics behind the keys', async () => {
  const prefix = testPrefix();
  const opts = { threads: 1, keys: keys(), rateLimit: 300, jobs: { quota: 2 }, queue: { url: redis.url, prefix } };
  const a = await start(opts);
  closers.push(() => a.close());
  const b = await start(opts);
  closers.push(() => b.close());
  // no worker yet: jobs stay queued
  const j1 = await a.post('/v1/schedules', schedule('A', 1), bearer(ALICE));
  expect(j1.status).toBe(202);
  const id = j1.body.id as string;
  expect((await b.get(`/v1/schedules/${id}`, bearer(ALICE))).body).toMatchObject({ id, status: 'queued' });
  expect((await b.get(`/v1/schedules/${id}`, bearer(BOB))).status).toBe(404);
  expect((await b.get('/v1/schedules', bearer(BOB))).body.jobs).toEqual([]);
  // the quota (2) over both processes
  expect((await b.post('/v1/schedules', schedule('A', 1), bearer(ALICE))).status).toBe(202);
  const over = await a.post('/v1/schedules', schedule('A', 1), bearer(ALICE));
  expect(over.status).toBe(429);
  expect(over.body).toMatchObject({ code: 'JOB_QUOTA_EXCEEDED', quota: 2 });
  // bob's submits at once to both processes: exactly his quota admitted
  const burst = await Promise.all(Array.from({ length: 6 }, (_, i) => (i % 2 ? a : b).post('/v1/schedules', schedule('B', 1), bearer(BOB))));
  expect(burst.filter((r) => r.status === 202)).toHaveLength(2);
  expect(burst.filter((r) => r.status === 429)).toHaveLength(4);

  // /metrics: 401 without a key; the queue's depth with one (4 jobs of one mark each, no worker)
  expect((await a.get('/metrics')).status).toBe(401);
  const m = await fetch(a.url + '/metrics', { headers: bearer(ALICE) });
  expect(m.status).toBe(200);
  expect(m.headers.get('content-type')).toMatch(/^text\/plain; version=0\.0\.4/);
  const text = await m.text();
  expect(text).toMatch(/^platesmith_queue_waiting_marks\{backend="redis"\} 4$/m);
  expect(text).toMatch(/^platesmith_jobs_active\{backend="redis"\} 4$/m);
  expect(text).toMatch(/^platesmith_workers\{backend="redis"\} 0$/m);

  // a worker runs them; bob cancels one of his through the other process
  const bobs = burst.filter((r) => r.status === 202).map((r) => r.body.id as string);
  expect((await (await fetch(`${a.url}/v1/schedules/${bobs[0]}`, { method: 'DELETE', headers: bearer(BOB) })).json()) as object).toMatchObject({ status: 'cancelled' });
  await worker(prefix);
  const done = await until(statusOf(b, id, bearer(ALICE)), finished, 'alice\'s job');
  expect(done).toMatchObject({ status: 'done', progress: { marksDone: 1 } });
  expect((await a.get(`/v1/schedules/${bobs[1]}/result`, bearer(BOB))).status === 200 || (await until(statusOf(a, bobs[1]!, bearer(BOB)), finished, 'bob\'s job')).status === 'done').toBe(true);
  expect((await a.get(`/v1/schedules/${bobs[0]}`, bearer(BOB))).body.status).toBe('cancelled');

  // the rate limit (300 a minute) counted over both processes: alice's requests alternate between
  // them, and the 429 comes within 300 of them (each process alone would allow 300)
  let limited: { status: number; body: any } | undefined;
  for (let i = 0; i < 300 && !limited; i++) {
    const r = await (i % 2 ? a : b).get('/v1/schedules', bearer(ALICE));
    if (r.status === 429) limited = r;
  }
  expect(limited?.body).toMatchObject({ code: 'RATE_LIMITED', limit: 300 });
});

test('fairness: keys take turns (a 2-mark job of bob is not held behind 8 marks of alice), and one key\'s jobs interleave mark by mark', async () => {
  const prefix = testPrefix();
  const srv = await start({ threads: 1, keys: keys(), rateLimit: 0, queue: { url: redis.url, prefix } });
  closers.push(() => srv.close());
  // submitted before any worker runs: alice's 6-mark job, bob's 2-mark job, alice's 2-mark job
  const a1 = (await srv.post('/v1/schedules', schedule('A', 6), bearer(ALICE))).body.id as string;
  const b1 = (await srv.post('/v1/schedules', schedule('B', 2), bearer(BOB))).body.id as string;
  const a2 = (await srv.post('/v1/schedules', schedule('C', 2), bearer(ALICE))).body.id as string;
  const w = await worker(prefix);
  for (const [id, k] of [[a1, ALICE], [b1, BOB], [a2, ALICE]] as const) expect((await until(statusOf(srv, id, bearer(k)), finished, id)).status).toBe('done');
  const order = w.taken().map((l) => String(l['mark']));
  expect(order).toHaveLength(10);
  const at = (m: string) => order.indexOf(m);
  // bob's two marks begin before alice's 4th (turns alternate between the keys' queues)
  expect(Math.max(at('B1'), at('B2'))).toBeLessThan(order.filter((m) => m[0] !== 'B').map(at)[3]!);
  // alice's second job's marks begin before her first job's 4th (mark priorities interleave her jobs)
  expect(Math.max(at('C1'), at('C2'))).toBeLessThan(at('A4'));
});

test('graceful worker shutdown: the running mark finishes and is stored; past the grace it goes back to its queue; another worker completes the job', async () => {
  const prefix = testPrefix();
  const srv = await start({ threads: 1, queue: { url: redis.url, prefix } });
  closers.push(() => srv.close());
  const id = (await srv.post('/v1/schedules', SLOW)).body.id as string;
  const w1 = await worker(prefix);
  await until(async () => w1.taken().length, (n) => n >= 1, 'w1 taking a mark');
  await w1.w.close(60_000);
  // it finished the mark it held, stored it, and took no other
  expect(w1.taken()).toHaveLength(1);
  expect(w1.w.counts).toMatchObject({ computed: 1, stored: 1, duplicates: 0 });
  const after1 = (await srv.get(`/v1/schedules/${id}/marks`)).body;
  expect(after1.marks.map((m: { mark: string }) => m.mark)).toEqual([w1.taken()[0]!['mark']]);

  // a worker closed with a short grace gives its mark back (not computed, not stored)
  const w2 = await worker(prefix);
  await until(async () => w2.taken().length, (n) => n >= 1, 'w2 taking a mark');
  await w2.w.close(50);
  expect(w2.w.counts).toMatchObject({ computed: 0, stored: 0 });
  expect((await srv.get(`/v1/schedules/${id}`)).body.status).toBe('running');

  // the next worker takes the mark given back and the rest: every mark once
  await worker(prefix);
  expect(await until(statusOf(srv, id), finished, 'the job', 120_000)).toMatchObject({ status: 'done', progress: { marksDone: 3 } });
  expect((await srv.get(`/v1/schedules/${id}/marks`)).body.marks.map((m: { mark: string }) => m.mark)).toEqual(['S1', 'S2', 'S3']);
}, 180_000);

test('/ready is 503 naming Redis while Redis is down, job routes 503 (checks still answer), and ready again once it is back', async () => {
  const own = await startRedis();
  closers.push(() => own.stop());
  const srv = await start({ threads: 1, queue: { url: own.url, prefix: testPrefix() } });
  closers.push(() => srv.close());
  await until(async () => (await srv.get('/ready')).status, (s) => s === 200, 'ready');
  expect((await srv.get('/ready')).body).toMatchObject({ status: 'ready', jobs: 'redis' });
  await own.stop();
  const down = await until(() => srv.get('/ready'), (r) => r.status === 503, '/ready 503');
  expect(down.body).toMatchObject({ code: 'NOT_READY' });
  expect(down.body.detail).toMatch(/Redis/);
  expect(down.headers.get('retry-after')).not.toBeNull();
  const list = await srv.get('/v1/schedules');
  expect(list.status).toBe(503);
  expect(list.body).toMatchObject({ code: 'STORE_UNAVAILABLE' });
  expect((await srv.post('/v1/schedules', schedule('G', 1))).body).toMatchObject({ status: 503, code: 'STORE_UNAVAILABLE' });
  expect((await srv.post('/v1/effects', { spans: [12000], actions: PROBLEM.actions })).status).toBe(200);
  const again = await startRedis(own.port);
  closers.push(() => again.stop());
  await until(async () => (await srv.get('/ready')).status, (s) => s === 200, '/ready 200 again', 30_000);
  // and the service closes within seconds while Redis is down (a shutdown never hangs on it)
  await again.stop();
  const t0 = Date.now();
  await srv.close();
  expect(Date.now() - t0).toBeLessThan(15_000);
});

test('budgets on the workers: a mark past its budget fails alone (MARK_BUDGET_EXCEEDED); a job past its budget fails (JOB_BUDGET_EXCEEDED)', async () => {
  const prefix = testPrefix();
  const srv = await start({ threads: 1, queue: { url: redis.url, prefix } });
  closers.push(() => srv.close());
  // a 1 ms mark budget: each search of SLOW is stopped, each mark fails alone, the job is done
  const w = await worker(prefix, redis.url, { markBudgetMs: 1 });
  const a = (await srv.post('/v1/schedules', { ...SLOW, girders: SLOW.girders.slice(0, 2) })).body.id as string;
  expect(await until(statusOf(srv, a), finished, 'job a')).toMatchObject({ status: 'done' });
  const ra = (await srv.get(`/v1/schedules/${a}/result`)).body;
  expect(ra.marks.map((m: { status: string; error?: { code: string } }) => [m.status, m.error?.code])).toEqual([['failed', 'MARK_BUDGET_EXCEEDED'], ['failed', 'MARK_BUDGET_EXCEEDED']]);
  await w.w.close(500);
  // a 1 ms job budget: the job fails at its first mark, naming the budget
  await worker(prefix, redis.url, { jobBudgetMs: 1 });
  const b = (await srv.post('/v1/schedules', SLOW)).body.id as string;
  const fb = await until(statusOf(srv, b), finished, 'job b');
  expect(fb).toMatchObject({ status: 'failed', error: { code: 'JOB_BUDGET_EXCEEDED' } });
});
});
