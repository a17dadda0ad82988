/**
 * Worker failure, time budget, admission and request logging over real HTTP. The crash and the
 * held worker go through a fixture worker (the production worker has no test hook) and test
 * routes added by the harness; every wait is on a gate, never a sleep. The one engineering
 * assertion (an aborted search's points pass their own check) is the product's own contract.
 */
import { afterAll, beforeAll, expect, test } from 'vitest';
import { FIXTURE_WORKER, gate } from '../../services/app/test/fixtures/worker.js';
import { PROBLEM, start, TINY_SPACE, type Running } from '../../services/api/test/harness.js';

const crashRoute = (app: Running['app']) => {
  app.post('/_test/crash', async (req: { body: unknown }) => app.engine.run({ kind: 'crash', how: (req.body as { how: string }).how }));
};

let srv: Running;
beforeAll(async () => {
  srv = await start({ threads: 2, workerFile: FIXTURE_WORKER, routes: crashRoute });
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

test('a search past its time budget answers 200 aborted: the points found so far, each passing its own check', async () => {
  // the default space with independent flanges on a 24 m span (about 10^10 candidates) takes
  // seconds: a 300 ms budget cannot be met however fast the search gets
  const problem = { spans: [24000], actions: PROBLEM.actions };
  const r = await srv.post('/v1/searches?budgetMs=300', { ...problem, space: { symmetric: false } });
  expect(r.status).toBe(200);
  expect(r.body).toMatchObject({ status: 'aborted', abort: { reason: 'time-budget', budgetMs: 300 } });
  expect(r.body.message).toMatch(/^aborted at its time budget of 300 ms: .* may be incomplete/);
  for (const p of r.body.pareto) {
    const c = await srv.post('/v1/checks', { ...problem, section: p.section });
    expect(c.status).toBe(200);
    expect(c.body.passes).toBe(true);
  }
  const ok = await srv.post('/v1/searches', { ...PROBLEM, space: TINY_SPACE });
  expect(ok.status).toBe(200);
  expect(ok.body.status).toBe('exact');
});

test('one log line per request, at info, with the search statistics and the request id', async () => {
  const r = await srv.post('/v1/searches', { ...PROBLEM, space: TINY_SPACE });
  expect(r.status).toBe(200);
  const id = r.headers.get('x-request-id');
  const lines = srv.logs.filter((l) => l.reqId === id);
  expect(lines).toHaveLength(1);
  const line = lines[0] as { level: number; msg: string; status: number; search: Record<string, unknown> };
  expect(line).toMatchObject({ level: 30, msg: 'request', method: 'POST', path: '/v1/searches', status: 200 });
  expect(line!.search).toMatchObject({ status: 'exact', spaceSize: r.body.stats.spaceSize, fullEvaluations: r.body.stats.fullEvaluations, paretoPoints: r.body.pareto.length });
  expect(r.body.stats.spaceSize).toBe(3 * 2 * 3 * 3); // TINY_SPACE: 3 depths × 2 webs × 3 widths × 3 thicknesses, symmetric, no stiffeners, one end post
});

test('requests beyond the admission limit get 503 POOL_SATURATED with Retry-After, and lose nothing', async () => {
  const g = gate();
  const one = await start({
    threads: 1,
    maxActiveSearches: 1,
    workerFile: FIXTURE_WORKER,
    routes: (app) => app.post('/_test/gate', async () => ({ answer: await app.engine.run({ kind: 'gate', gate: g.buffer }) })),
  });
  try {
    // the gated request holds the only admission slot until the gate opens
    const held = one.post('/_test/gate', {});
    await g.entered;
    expect(one.app.engine.active()).toBe(1);
    for (const [path, body] of [['/v1/searches', { ...PROBLEM, space: TINY_SPACE }], ['/v1/effects', PROBLEM]] as const) {
      const r = await one.post(path, body);
      expect(r.status).toBe(503);
      expect(r.headers.get('retry-after')).toBe('1');
      expect(r.body).toMatchObject({ status: 503, code: 'POOL_SATURATED' });
    }
    g.open();
    expect(await held).toMatchObject({ status: 200, body: { answer: 'opened' } });
    expect(one.app.engine.active()).toBe(0);
    expect((await one.post('/v1/searches', { ...PROBLEM, space: TINY_SPACE })).status).toBe(200);
  } finally {
    g.open();
    await one.close();
  }
});

test('warm-up on start: the service is ready at once, logs when the workers are warm, and searches meanwhile still answer', async () => {
  let warm!: () => void;
  const warmed = new Promise<void>((r) => (warm = r));
  const w = await start({ threads: 2, warmUp: true });
  // resolved by the log line itself: no polling
  const logs = w.logs;
  const push = logs.push.bind(logs);
  logs.push = (...items) => {
    const n = push(...items);
    if (items.some((l) => l['msg'] === 'search workers warmed up')) warm();
    return n;
  };
  if (logs.some((l) => l['msg'] === 'search workers warmed up')) warm();
  try {
    expect((await w.get('/ready')).status).toBe(200);
    const ok = await w.post('/v1/searches', { ...PROBLEM, space: TINY_SPACE });
    expect(ok.status).toBe(200);
    expect(ok.body.lightest).not.toBeNull();
    await warmed;
    const line = w.logs.find((l) => l['msg'] === 'search workers warmed up');
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
