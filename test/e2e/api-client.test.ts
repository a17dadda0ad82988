/**
 * Every operation of the API called through the client generated from the OpenAPI document
 * (openapi-typescript types of docs/openapi.json, type-checked by the suite; openapi-fetch), each
 * answer checked at run time against the document the server serves (test/client). A route
 * whose answer leaves its documented shape, or a document change the calls no longer fit, fails
 * here. Behaviour tests; the engineering figures asserted are closed forms named beside them.
 */
import { afterAll, beforeAll, expect, test } from 'vitest';
import { CAUTION } from '@platesmith/schema';
import { checkSection, parseCheckRequest } from '../../services/app/src/index.js';
import { SqliteJobStore } from '../../services/api/src/jobs/sqlite.js';
import { start, TINY_SPACE, type Running } from '../../services/api/test/harness.js';
import { DEMO_MARK, demoGirderRequest, FILES, readJson } from '../../scripts/openapi-examples.js';
import { ContractChecker, ContractViolation, contractClient, servedDocument } from '../client/index.js';

const root = new URL('../..', import.meta.url).pathname;
let srv: Running;
let api: Awaited<ReturnType<typeof contractClient>>;
beforeAll(async () => {
  srv = await start({ threads: 1, jobStore: new SqliteJobStore({ path: ':memory:' }) });
  api = await contractClient(srv.url);
});
afterAll(async () => {
  await srv.close();
});

test('getHealth and getReadiness', async () => {
  const h = await api.client.GET('/health');
  expect(h.data).toEqual({ status: 'ok' });
  const r = await api.client.GET('/ready');
  expect(r.data).toEqual({ status: 'ready', threads: 1, activeSearches: 0 });
});

test('checkSection: the bundled example answers the domain call\'s verdict; a span in m is a 422 naming the field', async () => {
  const body = readJson(root, FILES.checkDemo);
  const ok = await api.client.POST('/v1/checks', { body: body as any });
  expect(ok.response.status).toBe(200);
  // the whole answer is the domain call's (the route only maps it to HTTP)
  const parsed = parseCheckRequest(body);
  expect(parsed.ok).toBe(true);
  if (parsed.ok) expect(ok.data).toEqual(checkSection(parsed.value));
  const bad = await api.client.POST('/v1/checks', { body: { ...(readJson(root, FILES.checkDemo) as any), span: 24 } });
  expect(bad.response.status).toBe(422);
  expect(bad.error?.code).toBe('INVALID_VALUE');
  expect(bad.error?.errors?.[0]?.path).toBe('span');
});

test('recordGirder: the record of the bundled check example is HTML with the caution', async () => {
  const r = await api.client.POST('/v1/records', { body: readJson(root, FILES.checkDemo) as any, parseAs: 'text' });
  expect(r.response.status).toBe(200);
  expect(r.response.headers.get('content-type')).toMatch(/^text\/html/);
  expect(r.data).toContain(CAUTION);
});

test('analyseEffects: 12 m simply supported, 10 + 15 kN/m (category B) under EN 1990 6.10', async () => {
  const r = await api.client.POST('/v1/effects', {
    body: {
      spans: [12000],
      actions: [
        { kind: 'permanent', load: 'udl', value: 10 },
        { kind: 'variable', load: 'udl', value: 15, category: 'B' },
      ],
    },
  });
  expect(r.response.status).toBe(200);
  // EN 1990 6.10 with Table A1.2(B) recommended factors: q = 1.35·10 + 1.5·15 = 36 kN/m;
  // simply supported closed forms: MEd = q·L²/8 = 648 kNm, VEd = R = q·L/2 = 216 kN
  expect(r.data?.envelope.MEdMax).toBeCloseTo(648, 6);
  expect(r.data?.envelope.VEdMax).toBeCloseTo(216, 6);
  expect(r.data?.reactions.map((x) => x.R)).toEqual([216, 216]);
});

test('searchGirders: a small space answers its Pareto set; a saturated service answers 503 with Retry-After', async () => {
  const r = await api.client.POST('/v1/searches', {
    params: { query: { budgetMs: '60000' } },
    body: {
      spans: [12000],
      actions: [
        { kind: 'permanent', load: 'udl', value: 10 },
        { kind: 'variable', load: 'udl', value: 15, category: 'B' },
      ],
      space: { ...TINY_SPACE, endPost: 'rigid' },
      // the compression flange pinned continuously restrained (a floor on top), as this small space
      // was drawn for: under the default (restraint at the supports only) lateral-torsional
      // buckling fails all 54 candidates and the Pareto set is empty
      options: { restraint: 'continuous' },
    },
  });
  expect(r.response.status).toBe(200);
  expect(r.data?.pareto.length).toBeGreaterThan(0);
  expect(r.data?.stats.spaceSize).toBe(54);
  // issue 17 item 6: every Pareto point says what stops it being lighter, and the space fields it sits at the edge of
  for (const p of r.data!.pareto) {
    expect(Array.isArray(p.limitedBy)).toBe(true);
    expect(Array.isArray(p.edge)).toBe(true);
    for (const l of p.limitedBy!) expect(['fails', 'not-lighter', 'outside-space']).toContain(l.outcome);
  }
  const full = await start({ threads: 1, maxActiveSearches: 0 });
  try {
    const busy = await (await contractClient(full.url)).client.POST('/v1/searches', { body: demoGirderRequest(readJson(root, FILES.demoProject) as any, DEMO_MARK) as any });
    expect(busy.response.status).toBe(503);
    expect(busy.error?.code).toBe('POOL_SATURATED');
    expect(busy.response.headers.get('retry-after')).toBe('1');
  } finally {
    await full.close();
  }
});

test('a schedule: submitSchedule, followSchedule to done, getSchedule, listSchedules, getScheduleMarks, getScheduleResult, getScheduleReport, getSchedulePlates, getMarkRecord, cancelSchedule', async () => {
  const schedule = readJson(root, FILES.schedule) as any;
  const sub = await api.client.POST('/v1/schedules', { body: schedule });
  expect(sub.response.status).toBe(202);
  const id = sub.data!.id;
  expect(sub.response.headers.get('location')).toBe(`/v1/schedules/${id}`);

  const events = await api.client.GET('/v1/schedules/{id}/events', { params: { path: { id } }, parseAs: 'text', headers: { accept: 'text/event-stream' } });
  expect(events.response.status).toBe(200);
  const names = [...String(events.data).matchAll(/^event: (\w+)$/gm)].map((m) => m[1]);
  expect(names[0]).toBe('snapshot');
  expect(names.at(-1)).toBe('done');

  const st = await api.client.GET('/v1/schedules/{id}', { params: { path: { id } } });
  expect(st.data).toMatchObject({ id, status: 'done', marks: schedule.girders.length, progress: { marksDone: schedule.girders.length } });
  const list = await api.client.GET('/v1/schedules', { params: { query: { status: 'done' } } });
  expect(list.data?.jobs.map((j) => j.id)).toContain(id);
  const marks = await api.client.GET('/v1/schedules/{id}/marks', { params: { path: { id } } });
  expect(marks.data?.marks.map((m) => m.mark)).toEqual(schedule.girders.map((g: { mark: string }) => g.mark));
  const result = await api.client.GET('/v1/schedules/{id}/result', { params: { path: { id } } });
  expect(result.data?.totals.marks).toBe(schedule.girders.length);
  const report = await api.client.GET('/v1/schedules/{id}/report', { params: { path: { id } }, parseAs: 'text' });
  expect(report.response.headers.get('content-type')).toMatch(/^text\/html/);
  expect(report.data).toMatch(/^<!doctype html>/i);
  const plates = await api.client.GET('/v1/schedules/{id}/plates.csv', { params: { path: { id } }, parseAs: 'text' });
  expect(plates.response.headers.get('content-type')).toMatch(/^text\/csv/);
  expect(String(plates.data).split('\n')[0]).toMatch(/^product,grade,thickness_mm,width_mm,length_mm,count,unit_mass_kg,mass_kg/);
  const mark = schedule.girders[0].mark as string;
  const record = await api.client.GET('/v1/schedules/{id}/marks/{mark}/record', { params: { path: { id, mark } }, parseAs: 'text' });
  expect(record.response.headers.get('content-type')).toMatch(/^text\/html/);
  expect(record.data).toContain(mark);
  const noMark = await api.client.GET('/v1/schedules/{id}/marks/{mark}/record', { params: { path: { id, mark: 'NO-SUCH-MARK' } }, parseAs: 'text' });
  expect(noMark.response.status).toBe(404);

  const del = await api.client.DELETE('/v1/schedules/{id}', { params: { path: { id } } });
  expect(del.response.status).toBe(204);
  const gone = await api.client.GET('/v1/schedules/{id}', { params: { path: { id } } });
  expect(gone.response.status).toBe(404);
  expect(gone.error?.code).toBe('JOB_NOT_FOUND');
});

test('a queued job: its result is 409 with Retry-After, cancelSchedule answers its cancelled status', async () => {
  const idle = await start({ threads: 1, jobConcurrency: 0 });
  try {
    const { client } = await contractClient(idle.url);
    const sub = await client.POST('/v1/schedules', { body: readJson(root, FILES.schedule) as any });
    const id = sub.data!.id;
    const early = await client.GET('/v1/schedules/{id}/result', { params: { path: { id } } });
    expect(early.response.status).toBe(409);
    expect(early.error).toMatchObject({ code: 'JOB_NOT_FINISHED', jobStatus: 'queued' });
    expect(early.response.headers.get('retry-after')).toBe('1');
    const cancelled = await client.DELETE('/v1/schedules/{id}', { params: { path: { id } } });
    expect(cancelled.response.status).toBe(200);
    expect(cancelled.data).toMatchObject({ id, status: 'cancelled' });
  } finally {
    await idle.close();
  }
});

test('every operation of the document was answered here, each with a success', () => {
  const ops = [...api.checker.seen].filter(([, statuses]) => [...statuses].some((s) => s.startsWith('2'))).map(([id]) => id);
  // the queued-job and saturated-service calls above ran on servers of their own
  expect(ops.sort()).toEqual(
    [
      'getHealth',
      'getReadiness',
      'checkSection',
      'analyseEffects',
      'searchGirders',
      'recordGirder',
      'submitSchedule',
      'followSchedule',
      'getSchedule',
      'listSchedules',
      'getScheduleMarks',
      'getScheduleResult',
      'getScheduleReport',
      'getSchedulePlates',
      'getMarkRecord',
      'cancelSchedule',
    ].sort(),
  );
});

test('the checker refuses an answer the document does not describe', async () => {
  const c = new ContractChecker(await servedDocument(srv.url));
  const json = new Headers({ 'content-type': 'application/json; charset=utf-8' });
  const problem = new Headers({ 'content-type': 'application/problem+json' });
  // the body's shape: a verdict without its required fields
  expect(() => c.check('POST', '/v1/checks', 200, json, { passes: true })).toThrow(ContractViolation);
  // a field of the wrong type
  expect(() => c.check('GET', '/health', 200, json, { status: 'fine' })).toThrow(/body does not match/);
  // a status the operation does not list
  expect(() => c.check('GET', '/health', 418, json, {})).toThrow(/status not documented/);
  // an error answered as plain JSON instead of problem+json
  expect(() => c.check('GET', '/v1/schedules/{id}', 404, json, {})).toThrow(/content-type application\/json not documented/);
  // a 503 without its Retry-After
  const busy = { type: 'urn:platesmith:problem:not-ready', title: 'Not ready', status: 503, detail: 'no ping', instance: '/ready', code: 'NOT_READY', requestId: 'r' };
  expect(() => c.check('GET', '/ready', 503, problem, busy)).toThrow(/Retry-After missing/);
  // and the same answers as documented pass
  expect(() => c.check('GET', '/health', 200, json, { status: 'ok' })).not.toThrow();
  expect(() => c.check('GET', '/ready', 503, new Headers({ 'content-type': 'application/problem+json', 'retry-after': '5' }), busy)).not.toThrow();
});
