/**
 * The OpenAPI document and the errors documentation. Structural checks of OpenAPI 3.1 (the
 * OpenAPI Specification 3.1.0: required `openapi`, `info.title`, `info.version`, `paths`; every
 * operation has `responses`; every local $ref resolves), and the maintained linter @redocly/cli
 * with its recommended rules (redocly.yaml: zero errors; the warnings kept are listed there).
 * docs/openapi.json is a generated file: this test compares it with what the service generates
 * and fails on a diff (`pnpm openapi` writes it). The operation ids are fixed here: a client
 * generated from the document names its methods after them. docs/api.md's errors table must
 * equal ERROR_CODES, and every DomainError code in the packages and the services must be listed.
 */
import { spawnSync } from 'node:child_process';
import { readdirSync, readFileSync, existsSync, statSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, beforeAll, expect, test } from 'vitest';
import { CAUTION, SCOPE } from '@platesmith/schema';
import { ERROR_CODES, generateOpenApi, GENERATED_NOTE } from '../../services/api/src/index.js';
import { start, type Running } from '../../services/api/test/harness.js';
import { DEMO_MARK, demoGirderRequest, FILES, readJson } from '../../scripts/openapi-examples.js';

const root = join(import.meta.dirname, '..', '..');
let srv: Running;
beforeAll(async () => {
  srv = await start({ threads: 1 });
});
afterAll(async () => {
  await srv.close();
});

const ROUTES: [string, string][] = [
  ['post', '/v1/checks'],
  ['post', '/v1/effects'],
  ['post', '/v1/searches'],
  ['post', '/v1/schedules'],
  ['get', '/v1/schedules'],
  ['get', '/v1/schedules/{id}'],
  ['get', '/v1/schedules/{id}/events'],
  ['get', '/v1/schedules/{id}/result'],
  ['delete', '/v1/schedules/{id}'],
  ['get', '/health'],
  ['get', '/ready'],
];

test('/openapi.json is OpenAPI 3.1 and lists every route, with the caution', async () => {
  const r = await srv.get('/openapi.json');
  expect(r.status).toBe(200);
  const doc = r.body;
  expect(doc.openapi).toBe('3.1.0');
  expect(doc.info).toMatchObject({ title: 'Platesmith API', version: expect.any(String) });
  expect(doc.info.description).toContain(CAUTION);
  expect(doc.info.description).toContain(SCOPE);
  for (const [m, p] of ROUTES) {
    expect(doc.paths[p]?.[m], `${m.toUpperCase()} ${p}`).toBeDefined();
    expect(Object.keys(doc.paths[p][m].responses ?? {}).length, `${m} ${p} responses`).toBeGreaterThan(0);
  }
  expect(Object.keys(doc.paths).some((p) => p.startsWith('/_test'))).toBe(false);
  // every local $ref resolves
  const refs: string[] = [];
  const walk = (v: unknown): void => {
    if (Array.isArray(v)) v.forEach(walk);
    else if (v && typeof v === 'object') for (const [k, x] of Object.entries(v)) k === '$ref' && typeof x === 'string' ? refs.push(x) : walk(x);
  };
  walk(doc);
  for (const ref of refs) {
    expect(ref.startsWith('#/'), ref).toBe(true);
    const target = ref.slice(2).split('/').reduce<any>((o, k) => o?.[k.replace(/~1/g, '/').replace(/~0/g, '~')], doc);
    expect(target, ref).toBeDefined();
  }
  // units reach the document from the schemas' .meta
  expect(JSON.stringify(doc)).toContain('span lengths, mm (24000 for 24 m)');
  const docs = await fetch(`${srv.url}/docs`, { redirect: 'follow' });
  expect(docs.status).toBe(200);
});

test('docs/openapi.json is the generated document (a diff fails: run pnpm openapi)', async () => {
  const file = join(root, 'docs', 'openapi.json');
  const now = await generateOpenApi();
  const before = existsSync(file) ? readFileSync(file, 'utf8') : '';
  expect(JSON.parse(now)['x-generated']).toBe(GENERATED_NOTE);
  expect(before === now, 'docs/openapi.json is not what the service generates: run pnpm openapi, review and commit it').toBe(true);
});

/** Every operation of the document: method, path, operationId. A client generated from it names its methods after these ids. */
const OPERATIONS: [string, string, string][] = [
  ['post', '/v1/checks', 'checkSection'],
  ['post', '/v1/effects', 'analyseEffects'],
  ['post', '/v1/searches', 'searchGirders'],
  ['post', '/v1/schedules', 'submitSchedule'],
  ['get', '/v1/schedules', 'listSchedules'],
  ['get', '/v1/schedules/{id}', 'getSchedule'],
  ['delete', '/v1/schedules/{id}', 'cancelSchedule'],
  ['get', '/v1/schedules/{id}/events', 'followSchedule'],
  ['get', '/v1/schedules/{id}/marks', 'getScheduleMarks'],
  ['get', '/v1/schedules/{id}/result', 'getScheduleResult'],
  ['get', '/v1/schedules/{id}/report', 'getScheduleReport'],
  ['get', '/v1/schedules/{id}/plates.csv', 'getSchedulePlates'],
  ['get', '/v1/schedules/{id}/marks/{mark}/record', 'getMarkRecord'],
  ['post', '/v1/records', 'recordGirder'],
  ['get', '/health', 'getHealth'],
  ['get', '/ready', 'getReadiness'],
  ['get', '/metrics', 'getMetrics'],
];

function operationsOf(doc: any): [string, string, any][] {
  const out: [string, string, any][] = [];
  for (const [p, item] of Object.entries<any>(doc.paths)) for (const m of ['get', 'post', 'put', 'patch', 'delete']) if (item[m]) out.push([m, p, item[m]]);
  return out;
}

test('every operation has its fixed operationId, a summary, examples of its request and of its success answers', () => {
  const doc = JSON.parse(readFileSync(join(root, 'docs', 'openapi.json'), 'utf8'));
  const ops = operationsOf(doc);
  expect(ops.map(([m, p, op]) => [m, p, op.operationId]).sort()).toEqual([...OPERATIONS].sort());
  for (const [m, p, op] of ops) {
    const at = `${m.toUpperCase()} ${p}`;
    expect.soft(op.summary, at).toMatch(/\w/);
    if (op.requestBody) expect.soft(Object.keys(op.requestBody.content['application/json']?.examples ?? {}).length, `${at}: request example`).toBeGreaterThan(0);
    for (const [status, r] of Object.entries<any>(op.responses)) {
      if (!status.startsWith('2') || !r.content) continue;
      // (a PDF is binary: no example)
      for (const [media, c] of Object.entries<any>(r.content)) if (media !== 'application/pdf') expect.soft(Object.keys(c.examples ?? {}).length, `${at} ${status} ${media}: example`).toBeGreaterThan(0);
    }
    // every error answer is problem+json; a 503 says when to retry
    for (const [status, r] of Object.entries<any>(op.responses)) {
      if (Number(status) < 400) continue;
      expect.soft(Object.keys(r.content), `${at} ${status}`).toEqual(['application/problem+json']);
      if (status === '503' && !/TIME_BUDGET_EXCEEDED/.test(r.description)) expect.soft(r.headers?.['Retry-After']?.required, `${at} 503 Retry-After`).toBe(true);
    }
  }
});

test('the request examples are the bundled demo and example files', () => {
  const doc = JSON.parse(readFileSync(join(root, 'docs', 'openapi.json'), 'utf8'));
  const example = (p: string) => Object.values<any>(doc.paths[p].post.requestBody.content['application/json'].examples)[0].value;
  const search = demoGirderRequest(readJson(root, FILES.demoProject) as any, DEMO_MARK);
  expect(example('/v1/checks')).toEqual(readJson(root, FILES.checkDemo));
  expect(example('/v1/schedules')).toEqual(readJson(root, FILES.schedule));
  expect(example('/v1/searches')).toEqual(search);
  expect(example('/v1/effects')).toEqual(readJson(root, FILES.problemDemo));
  expect(doc.paths['/v1/searches'].post.requestBody.content['application/json'].examples.searchDemo.value).toEqual(readJson(root, FILES.searchDemo));
});

test('the OpenAPI linter (@redocly/cli, recommended rules) finds no error; its warnings are the ones redocly.yaml keeps', () => {
  const r = spawnSync(join(root, 'node_modules', '.bin', 'redocly'), ['lint', '--format=json'], {
    cwd: root,
    encoding: 'utf8',
    env: { ...process.env, REDOCLY_TELEMETRY: 'off', NO_COLOR: '1' },
  });
  const report = JSON.parse(r.stdout) as { totals: { errors: number; warnings: number }; problems: { ruleId: string; severity: string; message: string }[] };
  expect(report.problems.filter((p) => p.severity === 'error')).toEqual([]);
  expect(report.totals.errors).toBe(0);
  expect(r.status).toBe(0);
  // a warning may stay only where the config keeps it at warn, with the comment line above saying why
  const config = readFileSync(join(root, 'redocly.yaml'), 'utf8').split('\n');
  const kept = new Set(config.flatMap((line, i) => (/^ {2}[a-z0-9-]+: warn$/.test(line) && /^ {2}# kept as a warning: \S/.test(config[i - 1] ?? '') ? [line.trim().split(':')[0]!] : [])));
  for (const p of report.problems) expect.soft(kept.has(p.ruleId), `${p.ruleId}: ${p.message}`).toBe(true);
});

function docsTable(): { code: string; status: number; title: string }[] {
  const md = readFileSync(join(root, 'docs', 'api.md'), 'utf8');
  const rows = [...md.matchAll(/^\| `([A-Z_]+)` \| (\d{3}) \| ([^|]+) \|/gm)];
  return rows.map((m) => ({ code: m[1]!, status: Number(m[2]), title: m[3]!.trim() }));
}

test('docs/api.md errors table equals ERROR_CODES', () => {
  const table = docsTable();
  expect(table).toEqual(Object.entries(ERROR_CODES).map(([code, e]) => ({ code, status: e.status, title: e.title })));
  const md = readFileSync(join(root, 'docs', 'api.md'), 'utf8');
  expect(md).toContain(CAUTION);
  expect(md).toContain(SCOPE);
});

test('docs/api.md lists every DomainError code of the packages and the services', () => {
  const md = readFileSync(join(root, 'docs', 'api.md'), 'utf8');
  const codes = new Set<string>();
  const walk = (dir: string): void => {
    for (const f of readdirSync(dir)) {
      const p = join(dir, f);
      if (statSync(p).isDirectory()) walk(p);
      else if (p.endsWith('.ts')) for (const m of readFileSync(p, 'utf8').matchAll(/new DomainError\(\s*'([A-Z_]+)'/g)) codes.add(m[1]!);
    }
  };
  for (const top of ['packages', 'services']) {
    for (const pkg of readdirSync(join(root, top))) if (existsSync(join(root, top, pkg, 'src'))) walk(join(root, top, pkg, 'src'));
  }
  expect(codes.size).toBeGreaterThan(10);
  for (const c of codes) expect.soft(md, c).toContain('`' + c + '`');
});
