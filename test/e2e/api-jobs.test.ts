/**
 * Schedule jobs over real HTTP: submit (202, Location, Retry-After), status, SSE events
 * (snapshot, progress, done), result, list, cancel, delete. Tiny spaces keep it fast. Tonnage is
 * checked against the same run's own numbers (Σ quantity × lightest mass): a regression
 * relation, not a validation of any engineering value. Run on both job backends: embedded and
 * the queue (Redis, BullMQ, a worker in this process).
 */
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { PROBLEM, SECTION, TINY_SPACE } from '../../services/api/test/harness.js';
import { backendName, BACKENDS, startOn, stopRedis, type OnBackend } from '../helpers/backends.js';

let srv: OnBackend;
afterAll(() => stopRedis());

// the same tests on the embedded backend and on the queue backend (Redis, BullMQ, a worker)
describe.each(BACKENDS)(backendName, (backend) => {
beforeAll(async () => {
  srv = await startOn(backend, { threads: 2 });
});
afterAll(async () => {
  await srv.close();
});

const SCHEDULE = {
  name: 'tiny',
  defaults: { ...PROBLEM, space: TINY_SPACE },
  girders: [
    { mark: 'G1', quantity: 4, adopted: SECTION },
    { mark: 'G2', quantity: 2, spans: [10000], space: { webDepth: [600, 700] } },
    { mark: 'G3', quantity: 1, spans: ['12 m'] },
  ],
};

/** Reads an SSE stream to its end: the list of { event, data }. */
async function readEvents(url: string): Promise<{ event: string; data: any }[]> {
  const res = await fetch(url, { headers: { accept: 'text/event-stream' } });
  expect(res.status).toBe(200);
  expect(res.headers.get('content-type')).toMatch(/^text\/event-stream/);
  const text = await res.text();
  return text
    .split('\n\n')
    .filter((b) => b.includes('data:'))
    .map((b) => {
      const ev = /^event: (.*)$/m.exec(b)?.[1] ?? 'message';
      const data = b.split('\n').filter((l) => l.startsWith('data: ')).map((l) => l.slice(6)).join('\n');
      return { event: ev, data: JSON.parse(data) };
    });
}

test('submit, follow the events to done, read the result, list', async () => {
  const sub = await srv.post('/v1/schedules', SCHEDULE);
  expect(sub.status).toBe(202);
  const id = sub.body.id as string;
  expect(sub.headers.get('location')).toBe(`/v1/schedules/${id}`);
  expect(sub.headers.get('retry-after')).toBe('1');
  expect(sub.body).toMatchObject({ id, status: 'queued', marks: 3, name: 'tiny', links: { self: `/v1/schedules/${id}`, events: `/v1/schedules/${id}/events`, result: `/v1/schedules/${id}/result` } });

  const events = await readEvents(`${srv.url}/v1/schedules/${id}/events`);
  expect(events[0]!.event).toBe('snapshot');
  expect(events.at(-1)!.event).toBe('done');
  expect(events.at(-1)!.data).toMatchObject({ id, status: 'done', progress: { marksDone: 3, marksTotal: 3, currentMark: null, estimateMs: 0 } });
  if (events[0]!.data.status !== 'done') expect(events.some((e) => e.event === 'progress')).toBe(true);

  const st = await srv.get(`/v1/schedules/${id}`);
  expect(st.status).toBe(200);
  expect(st.body).toMatchObject({ status: 'done', progress: { marksDone: 3 } });

  const res = await srv.get(`/v1/schedules/${id}/result`);
  expect(res.status).toBe(200);
  const [g1, g2, g3] = res.body.marks;
  expect(g1).toMatchObject({ mark: 'G1', quantity: 4, status: 'ok' });
  expect(g1.adopted.checks.length).toBeGreaterThan(5);
  expect(g1.adopted.selfWeight).toBeGreaterThan(0);
  expect(g2).toMatchObject({ mark: 'G2', status: 'ok', adopted: null });
  // G2's space is the defaults' with webDepth replaced (merged one level deep)
  expect(g2.search.stats.spaceSize).toBe(2 * 2 * 3 * 3);
  // G3 fails alone, naming its field
  expect(g3).toMatchObject({ mark: 'G3', status: 'failed', search: null, error: { code: 'INVALID_INPUT' } });
  expect(g3.error.issues.map((i: { path: string }) => i.path)).toContain('spans[0]');
  const tonnage = (4 * g1.search.lightest.mass + 2 * g2.search.lightest.mass) / 1000;
  expect(Math.abs(res.body.totals.tonnage - tonnage)).toBeLessThan(1e-3); // rounded to kg in t
  expect(res.body.totals).toMatchObject({ marks: 3, marksFailed: 1, girders: 7 });

  const list = await srv.get('/v1/schedules');
  expect(list.status).toBe(200);
  expect(list.body.jobs.map((j: { id: string }) => j.id)).toContain(id);
  const done = await srv.get('/v1/schedules?status=done&limit=1');
  expect(done.body.jobs).toHaveLength(1);

  // a finished job is deleted by DELETE
  const del = await fetch(`${srv.url}/v1/schedules/${id}`, { method: 'DELETE' });
  expect(del.status).toBe(204);
  expect((await srv.get(`/v1/schedules/${id}`)).body).toMatchObject({ status: 404, code: 'JOB_NOT_FOUND' });
});

test('cancel a running job and a queued one', async () => {
  // the default space on 24 m takes seconds per mark: long enough to be running when cancelled
  const long = { defaults: { spans: [24000], actions: PROBLEM.actions }, girders: [{ mark: 'L1', quantity: 1 }, { mark: 'L2', quantity: 1 }] };
  const a = (await srv.post('/v1/schedules', long)).body.id as string;
  const b = (await srv.post('/v1/schedules', long)).body.id as string; // waits for turns between a's marks (queued, or running once its first mark's turn came)

  // wait for a to be running, from its own event stream (no sleeping)
  const running = new Promise<void>((resolve, reject) => {
    const unsub = srv.app.jobs.subscribe(a, (e) => {
      if (e.job.status === 'running') {
        unsub();
        resolve();
      }
    });
    setTimeout(() => reject(new Error('job never ran')), 30_000).unref();
  });
  const stA = await srv.get(`/v1/schedules/${a}`);
  if (stA.body.status !== 'running') await running;

  const notYet = await srv.get(`/v1/schedules/${a}/result`);
  expect(notYet.status).toBe(409);
  expect(notYet.body).toMatchObject({ code: 'JOB_NOT_FINISHED', jobStatus: 'running' });

  const qb = await fetch(`${srv.url}/v1/schedules/${b}`, { method: 'DELETE' });
  expect(qb.status).toBe(200);
  expect(await qb.json()).toMatchObject({ id: b, status: 'cancelled' });

  const ca = await fetch(`${srv.url}/v1/schedules/${a}`, { method: 'DELETE' });
  expect(ca.status).toBe(200);
  expect(await ca.json()).toMatchObject({ id: a, status: 'cancelled' });

  const events = await readEvents(`${srv.url}/v1/schedules/${a}/events`);
  expect(events.map((e) => e.event)).toEqual(['snapshot', 'done']);
  expect(events[1]!.data.status).toBe('cancelled');

  // the pool still serves
  expect((await srv.post('/v1/searches', { ...PROBLEM, space: TINY_SPACE })).status).toBe(200);
});

test('events with Accept: application/json → 406 problem+json; unknown job → 404', async () => {
  const sub = await srv.post('/v1/schedules', { defaults: { ...PROBLEM, space: TINY_SPACE }, girders: [{ mark: 'G1', quantity: 1 }] });
  const r = await srv.get(`/v1/schedules/${sub.body.id}/events`, { accept: 'application/json' });
  expect(r.status).toBe(406);
  expect(r.body).toMatchObject({ code: 'NOT_ACCEPTABLE' });
  const u = await srv.get('/v1/schedules/no-such-job/events', { accept: 'text/event-stream' });
  expect(u.status).toBe(404);
  expect(u.headers.get('content-type')).toMatch(/^application\/problem\+json/);
  await readEvents(`${srv.url}/v1/schedules/${sub.body.id}/events`); // let it finish before close
});
});
