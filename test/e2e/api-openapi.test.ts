/**
 * The OpenAPI document and the errors documentation. Structural checks of OpenAPI 3.1 (the
 * OpenAPI Specification 3.1.0: required `openapi`, `info.title`, `info.version`, `paths`; every
 * operation has `responses`; every local $ref resolves). docs/openapi.json is a generated file:
 * this test fails while it differs from the generated document, and writes nothing (`pnpm openapi`
 * regenerates it). docs/api.md's errors table must equal ERROR_CODES, and every DomainError code
 * in the packages and the services must be listed.
 */
import { readdirSync, readFileSync, existsSync, statSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, beforeAll, expect, test } from 'vitest';
import { CAUTION, SCOPE } from '@platesmith/schema';
import { ERROR_CODES, generateOpenApi, GENERATED_NOTE } from '../../services/api/src/index.js';
import { start, type Running } from '../../services/api/test/harness.js';

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

test('docs/openapi.json is the generated document (a diff fails; `pnpm openapi` regenerates it)', async () => {
  const file = join(root, 'docs', 'openapi.json');
  const now = await generateOpenApi();
  const committed = existsSync(file) ? readFileSync(file, 'utf8') : '';
  expect(JSON.parse(now)['x-generated']).toBe(GENERATED_NOTE);
  expect(committed === now, 'docs/openapi.json differs from the generated document: run `pnpm openapi`, review and commit it').toBe(true);
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
