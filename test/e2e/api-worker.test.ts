/**
 * Worker failure, time budget and request logging over real HTTP. The crash goes through the
 * worker's deliberate 'crash' message (test-only route); no engineering value is asserted.
 */
import { afterAll, beforeAll, expect, test } from 'vitest';
import { PROBLEM, start, TINY_SPACE, type Running } from '../../services/api/test/harness.js';

let srv: Running;
beforeAll(async () => {
  srv = await start({ threads: 2, testHooks: true });
});
afterAll(async () => {
  await srv.close();
});

test.for(['throw', 'exit'] as const)('a worker that does %s fails its request alone (500), the next search passes', async (how) => {
  const r = await srv.post('/_test/crash', { how });
  expect(r.status).toBe(500);
  expect(r.headers.get('content-type')).toMatch(/^application\/problem\+json/);
  expect(r.body).toMatchObject({ status: 500, code: 'WORKER_FAILED', instance: '/_test/crash' });
  expect(JSON.stringify(r.body)).not.toMatch(/deliberate|\n\s+at /); // the worker's message stays in the log
  const ok = await srv.post('/v1/searches', { ...PROBLEM, space: TINY_SPACE });
  expect(ok.status).toBe(200);
  expect(ok.body.lightest).not.toBeNull();
  expect((await srv.get('/ready')).status).toBe(200);
});

test('a search past its time budget is aborted: 503 TIME_BUDGET_EXCEEDED, then the pool serves again', async () => {
  // the default space with independent flanges on a 24 m span (about 10^10 candidates) takes
  // tens of seconds: a 100 ms budget cannot be met however fast the search gets
  const r = await srv.post('/v1/searches?budgetMs=100', { spans: [24000], actions: PROBLEM.actions, space: { symmetric: false } });
  expect(r.status).toBe(503);
  expect(r.body).toMatchObject({ status: 503, code: 'TIME_BUDGET_EXCEEDED', budgetMs: 100 });
  expect(r.body.detail).toMatch(/100 ms/);
  const ok = await srv.post('/v1/searches', { ...PROBLEM, space: TINY_SPACE });
  expect(ok.status).toBe(200);
});

test('search statistics are logged with the request id', async () => {
  const r = await srv.post('/v1/searches', { ...PROBLEM, space: TINY_SPACE });
  expect(r.status).toBe(200);
  const id = r.headers.get('x-request-id');
  const line = srv.logs.find((l) => l.reqId === id && l.msg === 'search statistics') as { search: Record<string, unknown> } | undefined;
  expect(line).toBeDefined();
  expect(line!.search).toMatchObject({ spaceSize: r.body.stats.spaceSize, fullEvaluations: r.body.stats.fullEvaluations, paretoPoints: r.body.pareto.length });
  expect(r.body.stats.spaceSize).toBe(3 * 2 * 3 * 3); // TINY_SPACE: 3 depths × 2 webs × 3 widths × 3 thicknesses, symmetric, no stiffeners, one end post
});

test('a client given its own x-request-id gets it back', async () => {
  const r = await srv.get('/health', { 'x-request-id': 'abc-123' });
  expect(r.headers.get('x-request-id')).toBe('abc-123');
});

test('searches beyond the admission limit get 503 POOL_SATURATED with Retry-After, and lose nothing', async () => {
  const one = await start({ threads: 1, maxActiveSearches: 1 });
  try {
    // the default space on a 24 m span keeps the only admission slot busy for a while
    const slow = one.post('/v1/searches', { spans: [24000], actions: PROBLEM.actions });
    const t0 = Date.now();
    while (one.app.searcher.active() < 1 && Date.now() - t0 < 10_000) await new Promise((r) => setTimeout(r, 5));
    expect(one.app.searcher.active()).toBe(1);
    const r = await one.post('/v1/searches', { ...PROBLEM, space: TINY_SPACE });
    expect(r.status).toBe(503);
    expect(r.headers.get('retry-after')).toBe('1');
    expect(r.body).toMatchObject({ status: 503, code: 'POOL_SATURATED' });
    // the admitted search is unaffected, and the slot is free again afterwards
    expect((await slow).status).toBe(200);
    expect((await one.post('/v1/searches', { ...PROBLEM, space: TINY_SPACE })).status).toBe(200);
  } finally {
    await one.close();
  }
});

test('warm-up on start: the service is ready at once, logs when the workers are warm, and searches meanwhile still answer', async () => {
  const w = await start({ threads: 2, warmUp: true });
  try {
    expect((await w.get('/ready')).status).toBe(200);
    const ok = await w.post('/v1/searches', { ...PROBLEM, space: TINY_SPACE });
    expect(ok.status).toBe(200);
    expect(ok.body.lightest).not.toBeNull();
    const t0 = Date.now();
    while (!w.logs.some((l) => l['msg'] === 'search workers warmed up') && Date.now() - t0 < 60_000) await new Promise((r) => setTimeout(r, 50));
    const line = w.logs.find((l) => l['msg'] === 'search workers warmed up');
    expect(line).toBeDefined();
    expect(line!['ms']).toBeGreaterThan(0);
  } finally {
    await w.close();
  }
});

test('closing during the warm-up stops it quietly (no failure logged)', async () => {
  const w = await start({ threads: 2, warmUp: true });
  await w.close();
  expect(w.logs.some((l) => l['level'] === 40 && String(l['msg']).includes('warm-up failed'))).toBe(false);
});
