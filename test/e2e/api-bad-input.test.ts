/**
 * End-to-end over real HTTP (127.0.0.1, port 0): malformed and hostile bodies are answered with
 * the right status and an RFC 9457 problem+json naming the offending field, and the server stays
 * up. Statuses follow RFC 9110 (400, 413, 415, 422) and RFC 9457 for the body; the field
 * rules (span under 1 m is a length given in metres, stock plate thicknesses) are common
 * practice, no source. No engineering value is asserted here.
 */
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { PROBLEM, SECTION, start, TINY_SPACE, type Running } from '../../services/api/test/harness.js';

let srv: Running;
beforeAll(async () => {
  srv = await start({ threads: 2 });
});
afterAll(async () => {
  await srv.close();
});

const effectsBody = (over: Record<string, unknown> = {}) => ({ section: SECTION, span: 12000, effects: [{ x: 0, M: 0, V: 200 }, { x: 6000, M: 600, V: 0 }], ...over });
const problemBody = (over: Record<string, unknown> = {}) => ({ ...PROBLEM, section: SECTION, ...over });
const nest = (n: number) => '['.repeat(n) + ']'.repeat(n);

interface Case {
  name: string;
  path: string;
  body: unknown;
  /** raw text sent as-is */
  raw?: string;
  contentType?: string;
  status: number;
  code: string;
  /** the field the problem must name (errors[].path or field); undefined = the whole body */
  field?: string;
  /** text the detail or hint must contain */
  says?: RegExp;
}

const cases: Case[] = [
  { name: 'web depth as a string', path: '/v1/checks', body: problemBody({ section: { ...SECTION, web: { depth: '800', thickness: 10 } } }), status: 400, code: 'INVALID_REQUEST', field: 'section.web.depth' },
  { name: '"NaN" as a string', path: '/v1/checks', body: problemBody({ section: { ...SECTION, web: { depth: 800, thickness: 'NaN' } } }), status: 400, code: 'INVALID_REQUEST', field: 'section.web.thickness' },
  { name: '"Infinity" as a string', path: '/v1/checks', body: effectsBody({ span: 'Infinity' }), status: 400, code: 'INVALID_REQUEST', field: 'span' },
  { name: 'span 1e308', path: '/v1/checks', body: effectsBody({ span: 1e308 }), status: 422, code: 'INVALID_VALUE', field: 'span' },
  { name: 'negative web depth', path: '/v1/checks', body: problemBody({ section: { ...SECTION, web: { depth: -800, thickness: 10 } } }), status: 422, code: 'INVALID_VALUE', field: 'section.web.depth' },
  { name: 'unknown grade', path: '/v1/checks', body: problemBody({ section: { ...SECTION, grade: 'S999' } }), status: 400, code: 'INVALID_REQUEST', field: 'section.grade' },
  { name: 'missing section', path: '/v1/checks', body: { ...PROBLEM }, status: 400, code: 'INVALID_REQUEST', field: 'section' },
  { name: 'missing spans', path: '/v1/effects', body: { actions: PROBLEM.actions }, status: 400, code: 'INVALID_REQUEST', field: 'spans' },
  { name: 'actions an object', path: '/v1/effects', body: { spans: [12000], actions: { kind: 'permanent' } }, status: 400, code: 'INVALID_REQUEST', field: 'actions' },
  { name: 'unknown action kind', path: '/v1/effects', body: { spans: [12000], actions: [{ kind: 'accidental', load: 'udl', value: 1 }] }, status: 400, code: 'INVALID_REQUEST', field: 'actions[0].kind' },
  { name: 'empty web depth list', path: '/v1/searches', body: { ...PROBLEM, space: { ...TINY_SPACE, webDepth: [] } }, status: 422, code: 'INVALID_VALUE', field: 'space.webDepth' },
  { name: 'empty flat-bar list with stiffened layouts', path: '/v1/searches', body: { ...PROBLEM, space: { ...TINY_SPACE, panels: [0, 4], flats: [] } }, status: 422, code: 'EMPTY_SPACE', field: 'space.flats' },
  {
    name: 'a space of about 1e15 candidates',
    path: '/v1/searches',
    body: { ...PROBLEM, space: { webDepth: { min: 500, max: 10000, step: 9.5 }, webThickness: { min: 5, max: 110, step: 1 }, flangeWidth: { min: 100, max: 2997, step: 2.9 }, flangeThickness: { min: 10, max: 109, step: 1 }, symmetric: false, panels: [0], endPost: 'rigid' } },
    status: 422,
    code: 'SPACE_TOO_LARGE',
    field: 'space',
    says: /1\.0\d\de\+15 candidates, over the cap of 1e\+12/,
  },
  { name: 'span 24 (metres given as mm)', path: '/v1/searches', body: { ...PROBLEM, spans: [24], space: TINY_SPACE }, status: 422, code: 'SPAN_IMPLAUSIBLE', field: 'spans[0]', says: /lengths are in mm: did you mean 24000 mm/ },
  { name: 'point load outside the span', path: '/v1/effects', body: { spans: [12000], actions: [{ kind: 'permanent', load: 'point', value: 50, at: 20000 }] }, status: 422, code: 'OUTSIDE_BEAM', field: 'actions[0].at', says: /outside the girder/ },
  { name: 'flange thinner than stock', path: '/v1/checks', body: problemBody({ section: { ...SECTION, topFlange: { width: 250, thickness: 3 } } }), status: 422, code: 'THINNER_THAN_STOCK', field: 'section.topFlange.thickness', says: /thinner than any stock plate/ },
  { name: 'station outside the span', path: '/v1/checks', body: effectsBody({ effects: [{ x: 13000, M: 0, V: 1 }] }), status: 422, code: 'INVALID_VALUE', field: 'effects[0].x' },
  { name: 'force without bearing length', path: '/v1/checks', body: effectsBody({ effects: [{ x: 6000, M: 600, V: 0, F: 100 }] }), status: 422, code: 'INVALID_VALUE', field: 'effects[0].ss' },
  { name: 'eta over 1.2', path: '/v1/checks', body: effectsBody({ options: { eta: 1.5 } }), status: 422, code: 'INVALID_VALUE', field: 'options.eta' },
  { name: 'negative plate grid', path: '/v1/searches', body: { ...PROBLEM, space: { ...TINY_SPACE, webThickness: { min: -5, max: 10, step: 5 } } }, status: 422, code: 'BAD_DIMENSION', field: 'space.webThickness' },
  { name: 'budgetMs not a number', path: '/v1/searches?budgetMs=soon', body: { ...PROBLEM, space: TINY_SPACE }, status: 400, code: 'INVALID_REQUEST', field: 'budgetMs' },
  { name: 'a JSON array as the body', path: '/v1/effects', body: [], status: 400, code: 'INVALID_REQUEST', field: '' },
  { name: 'malformed JSON', path: '/v1/effects', body: null, raw: '{"spans": [12000', status: 400, code: 'INVALID_JSON' },
  { name: '__proto__ key', path: '/v1/effects', body: null, raw: '{"spans":[12000],"actions":[],"__proto__":{"polluted":true}}', status: 400, code: 'INVALID_JSON' },
  { name: 'constructor.prototype key', path: '/v1/effects', body: null, raw: '{"spans":[12000],"actions":[],"constructor":{"prototype":{"polluted":true}}}', status: 400, code: 'INVALID_JSON' },
  { name: 'deeply nested JSON (5000 levels)', path: '/v1/effects', body: null, raw: `{"spans":[12000],"actions":[],"deep":${nest(5000)}}`, status: 400, code: 'INVALID_REQUEST', field: 'deep' },
  { name: 'a 10 MB body', path: '/v1/effects', body: null, raw: JSON.stringify({ ...PROBLEM, note: 'x'.repeat(10 * 1024 * 1024) }), status: 413, code: 'BODY_TOO_LARGE' },
  { name: 'text/plain body', path: '/v1/effects', body: null, raw: 'spans=12000', contentType: 'text/plain', status: 415, code: 'UNSUPPORTED_MEDIA_TYPE' },
  { name: 'empty JSON body', path: '/v1/effects', body: null, raw: '', status: 400, code: 'EMPTY_BODY' },
  { name: 'schedule without girders', path: '/v1/schedules', body: { defaults: PROBLEM, girders: [] }, status: 422, code: 'INVALID_VALUE', field: 'girders' },
  { name: 'schedule with a repeated mark', path: '/v1/schedules', body: { girders: [{ mark: 'G1', quantity: 1 }, { mark: 'G1', quantity: 2 }] }, status: 422, code: 'INVALID_VALUE', field: 'girders[1].mark' },
  { name: 'schedule quantity 2.5', path: '/v1/schedules', body: { girders: [{ mark: 'G1', quantity: 2.5 }] }, status: 400, code: 'INVALID_REQUEST', field: 'girders[0].quantity' },
];

describe('bad input over HTTP', () => {
  test('at least 25 distinct cases', () => {
    expect(new Set(cases.map((c) => c.name)).size).toBeGreaterThanOrEqual(25);
  });

  test.for(cases)('$name → $status $code', async (c) => {
    const res = await fetch(srv.url + c.path, {
      method: 'POST',
      headers: { 'content-type': c.contentType ?? 'application/json' },
      body: c.raw !== undefined ? c.raw : JSON.stringify(c.body),
    });
    const text = await res.text();
    expect(res.status, text.slice(0, 300)).toBe(c.status);
    expect(res.headers.get('content-type')).toMatch(/^application\/problem\+json/);
    const p = JSON.parse(text);
    expect(p).toMatchObject({ status: c.status, code: c.code, instance: c.path.split('?')[0], requestId: res.headers.get('x-request-id') });
    expect(p.type).toMatch(/^urn:platesmith:problem:/);
    expect(typeof p.title).toBe('string');
    expect(typeof p.detail).toBe('string');
    expect(text).not.toMatch(/\n\s+at |\.ts:\d+/); // never a stack trace
    if (c.field !== undefined) {
      const named = [p.field, ...(p.errors ?? []).map((e: { path: string }) => e.path)];
      expect(named, JSON.stringify(p.errors)).toContain(c.field);
      for (const e of p.errors ?? []) expect(e.pointer).toMatch(/^#/);
    }
    if (c.says) expect(`${p.detail} ${p.hint ?? ''}`).toMatch(c.says);
    if (c.status === 422 && !['INVALID_VALUE'].includes(c.code)) expect(typeof p.hint).toBe('string');
  });

  test('the server stays up: a valid request succeeds after all of them', async () => {
    const r = await srv.post('/v1/checks', problemBody());
    expect(r.status).toBe(200);
    expect(typeof r.body.passes).toBe('boolean');
    expect(r.body.checks.length).toBeGreaterThan(5);
    const h = await srv.get('/health');
    expect(h).toMatchObject({ status: 200, body: { status: 'ok' } });
  });

  test('unknown route: 404 problem+json', async () => {
    const r = await srv.get('/v1/nothing-here');
    expect(r.status).toBe(404);
    expect(r.headers.get('content-type')).toMatch(/^application\/problem\+json/);
    expect(r.body).toMatchObject({ status: 404, code: 'NOT_FOUND', instance: '/v1/nothing-here' });
  });
});
