/**
 * Calculation records through the HTTP API: POST /v1/records (a check body and a title) answers
 * the HTML record with every check's clause, the title block and the caution; bad input answers
 * 400/422 naming the field; Accept: application/pdf answers a PDF where chromium is installed
 * and 406 where it is not; a finished schedule mark has its record (the adopted section, else the
 * lightest). Behaviour tests of the routes: no engineering value is asserted here.
 */
import { readFileSync } from 'node:fs';
import { afterAll, beforeAll, expect, test } from 'vitest';
import { CHECK_ORDER } from '@platesmith/checks';
import { chromiumPath } from '@platesmith/report';
import { SqliteJobStore } from '../../services/api/src/jobs/sqlite.js';
import { PROBLEM, SECTION, start, TINY_SPACE, type Running } from '../../services/api/test/harness.js';

let srv: Running;
beforeAll(async () => {
  srv = await start({ threads: 1, jobStore: new SqliteJobStore({ path: ':memory:' }) });
});
afterAll(async () => {
  await srv.close();
});

const demo = JSON.parse(readFileSync(new URL('../../examples/check-demo.json', import.meta.url), 'utf8'));

test('POST /v1/records: the HTML record with the title block, every check and the caution', async () => {
  const r = await srv.post('/v1/records', { ...demo, title: { project: 'Invented mill', mark: 'G-07', checkedBy: 'A. Checker' } });
  expect(r.status).toBe(200);
  expect(r.headers.get('content-type')).toMatch(/^text\/html/);
  const html = r.body as string;
  for (const s of ['Invented mill', 'G-07', 'A. Checker', 'design aid', 'Not covered', 'Design basis', 'Analysis', 'Checks']) expect.soft(html).toContain(s);
  for (const id of CHECK_ORDER) expect.soft(html, id).toContain(`id="check-${id}"`);
});

test('POST /v1/records: a problem with its section is recorded too (self-weight, combinations)', async () => {
  const r = await srv.post('/v1/records', { ...PROBLEM, section: SECTION });
  expect(r.status).toBe(200);
  expect(r.body).toContain('Self-weight of the girder added');
  expect(r.body).toContain('EN 1990 Table A1.1');
});

test('POST /v1/records: bad input names the field (400 for shape, 422 for values)', async () => {
  const a = await srv.post('/v1/records', { ...demo, title: { project: 7 } });
  expect(a.status).toBe(400);
  expect(a.body.errors.map((e: { path: string }) => e.path)).toEqual(['title.project']);
  const b = await srv.post('/v1/records', { ...demo, span: 24 });
  expect(b.status).toBe(422);
  expect(b.body.errors.map((e: { path: string }) => e.path)).toContain('span');
});

test('POST /v1/records with Accept: application/pdf: a PDF where chromium is installed, else 406', async () => {
  const res = await fetch(srv.url + '/v1/records', { method: 'POST', headers: { 'content-type': 'application/json', accept: 'application/pdf' }, body: JSON.stringify(demo) });
  if (chromiumPath()) {
    expect(res.status).toBe(200);
    expect(res.headers.get('content-type')).toBe('application/pdf');
    expect(Buffer.from(await res.arrayBuffer()).subarray(0, 5).toString()).toBe('%PDF-');
  } else {
    expect(res.status).toBe(406);
    expect(((await res.json()) as { code: string }).code).toBe('NOT_ACCEPTABLE');
  }
}, 120_000);

test('GET /v1/schedules/{id}/marks/{mark}/record: the adopted or the lightest section of a finished mark', async () => {
  const sub = await srv.post('/v1/schedules', {
    name: 'records',
    defaults: { ...PROBLEM, space: TINY_SPACE },
    girders: [
      { mark: 'R1', quantity: 2, adopted: { ...SECTION, bearing: { width: 120, thickness: 12 } } },
      { mark: 'R2', quantity: 1, spans: [10000] },
    ],
  });
  expect(sub.status).toBe(202);
  let st: any;
  for (let i = 0; i < 2400; i++) {
    st = (await srv.get(`/v1/schedules/${sub.body.id}`)).body;
    if (['done', 'failed', 'cancelled'].includes(st.status)) break;
    await new Promise((r) => setTimeout(r, 25));
  }
  expect(st.status).toBe('done');
  const r1 = await srv.get(`/v1/schedules/${sub.body.id}/marks/R1/record`);
  expect(r1.status).toBe(200);
  expect(r1.body).toContain('R1');
  expect(r1.body).toContain(`web plate ${SECTION.web.depth} mm deep × ${SECTION.web.thickness} mm thick`);
  const r2 = await srv.get(`/v1/schedules/${sub.body.id}/marks/R2/record`);
  expect(r2.status).toBe(200);
  expect(r2.body).toContain('records — R2');
  const none = await srv.get(`/v1/schedules/${sub.body.id}/marks/NOPE/record`);
  expect([none.status, none.body.code]).toEqual([404, 'MARK_NOT_FOUND']);
  const noJob = await srv.get('/v1/schedules/nope/marks/R1/record');
  expect([noJob.status, noJob.body.code]).toEqual([404, 'JOB_NOT_FOUND']);
});
