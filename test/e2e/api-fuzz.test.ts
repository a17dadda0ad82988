/**
 * Seeded fuzz of the synchronous /v1 POST routes (issue 16): 2 000 mutated bodies per route, each
 * a valid body with one to three of its values replaced by a hostile one (huge, tiny, negative,
 * non-finite as text, wrong type, long lists, deep nesting), a key removed or an unknown key
 * added. Asserted for every answer: no 500; every 503 carries Retry-After; /health answers after
 * every request within a generous liveness limit (5 s: a hang, not a speed target); no `null` in
 * place of a computed number in a 200 answer (a documented absence stays: `lightest` of a search
 * without a point, `stiffeners` of a section without intermediate stiffeners, `at` of a check
 * with no governing station, `utilisation` of a check that does not apply). Four clients at
 * once, each waiting for its answer and then /health. The seed is fixed; PLATESMITH_FUZZ_SEED
 * replays another.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, beforeAll, expect, test } from 'vitest';
import { PROBLEM, SECTION, start, TINY_SPACE, type Running } from '../../services/api/test/harness.js';

const SEED = Number(process.env['PLATESMITH_FUZZ_SEED'] ?? 20261203);
const PER_ROUTE = 2000;

/** mulberry32: a small seeded PRNG (public domain), enough to replay a run. */
function prng(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

const HOSTILE: unknown[] = [1e308, -1e308, 9007199254740992, 2147483648, 1e9, 1e6, -1, 0, 0.01, 1e-300, 0.5, 3, 400, 401, 'NaN', 'Infinity', '1e3', '', 'x'.repeat(300), null, true, {}, [], [0], Array(3000).fill(1), Array(50).fill({ kind: 'variable', load: 'udl', value: 5, category: 'B' }), { deep: [[[[[[[[[[1]]]]]]]]]] }];

type Json = null | boolean | number | string | Json[] | { [k: string]: Json };

function paths(v: Json, at: (string | number)[] = [], out: (string | number)[][] = []): (string | number)[][] {
  if (Array.isArray(v)) v.forEach((x, i) => (out.push([...at, i]), paths(x, [...at, i], out)));
  else if (v !== null && typeof v === 'object') for (const [k, x] of Object.entries(v)) out.push([...at, k]), paths(x, [...at, k], out);
  return out;
}

function mutate(base: Json, rnd: () => number): Json {
  const body = structuredClone(base);
  const n = 1 + Math.floor(rnd() * 3);
  for (let i = 0; i < n; i++) {
    const ps = paths(body);
    const p = ps[Math.floor(rnd() * ps.length)]!;
    let parent: any = body;
    for (const k of p.slice(0, -1)) parent = parent[k];
    const last = p[p.length - 1]!;
    const op = rnd();
    if (op < 0.7) parent[last] = structuredClone(HOSTILE[Math.floor(rnd() * HOSTILE.length)]);
    else if (op < 0.85 && !Array.isArray(parent)) delete parent[last];
    else if (!Array.isArray(parent)) parent[`unknown${Math.floor(rnd() * 10)}`] = 1;
    else parent.push(structuredClone(parent[0]));
  }
  return body;
}

/** Where a `null` may stand in a 200 answer: documented absences, not numbers that overflowed. */
function nullsOutOfPlace(v: unknown, at = '', parent: Record<string, unknown> | null = null, out: string[] = []): string[] {
  if (v === null) {
    const key = at.split('.').pop()!.replace(/\[\d+\]$/, '');
    const absent = key === 'lightest' || key === 'stiffeners' || key === 'at' || (key === 'utilisation' && parent?.['applies'] === false);
    if (!absent) out.push(at);
  } else if (Array.isArray(v)) v.forEach((x, i) => nullsOutOfPlace(x, `${at}[${i}]`, null, out));
  else if (typeof v === 'object') for (const [k, x] of Object.entries(v as object)) nullsOutOfPlace(x, at ? `${at}.${k}` : k, v as Record<string, unknown>, out);
  return out;
}

const root = join(import.meta.dirname, '..', '..');
const BASES: [string, Json][] = [
  ['/v1/checks', { ...PROBLEM, section: { ...SECTION, stiffeners: { spacing: 2000, width: 100, thickness: 10 } }, options: { restraint: { spacing: 3000 } } } as Json],
  ['/v1/checks', JSON.parse(readFileSync(join(root, 'examples', 'check-demo.json'), 'utf8')) as Json],
  ['/v1/effects', { spans: [12000, 15000], actions: [...PROBLEM.actions, { kind: 'variable', load: 'point', value: 80, at: 5000, category: 'E' }], gridDivisions: 20 } as Json],
  ['/v1/searches', { ...PROBLEM, space: TINY_SPACE } as Json],
];

let srv: Running;
beforeAll(async () => {
  // rate limit off: one address sends thousands of bodies a minute here, far past the per-address
  // default (1200/min), and every lane (checks, effects, searches) must reach the routes, not the 429
  srv = await start({ threads: 2, defaultBudgetMs: 3000, rateLimit: 0 });
});
afterAll(async () => {
  await srv.close();
});

// a generous limit for a loaded shared host (the figures are in the report, not asserted)
test.for(['/v1/checks', '/v1/effects', '/v1/searches'])(`${PER_ROUTE} mutated bodies on %s: no 500, 503s with Retry-After, /health after each, no null numbers`, { timeout: 300_000 }, async (route) => {
  const rnd = prng(SEED ^ route.length);
  const bases = BASES.filter(([r]) => r === route).map(([, b]) => b);
  const statuses = new Map<number, number>();
  // the bodies drawn up front (the seed fixes them whatever the order of the answers)
  const bodies = Array.from({ length: PER_ROUTE }, (_, i) => mutate(bases[i % bases.length]!, rnd));
  let next = 0;
  const lane = async () => {
    for (let i = next++; i < PER_ROUTE; i = next++) await one(i, bodies[i]!);
  };
  await Promise.all([lane(), lane(), lane(), lane()]);
  // the mutations reach both sides: some bodies are still valid, most are refused
  expect(statuses.get(200) ?? 0, JSON.stringify([...statuses])).toBeGreaterThan(0);
  expect([...statuses.keys()].some((s) => s >= 400 && s < 500)).toBe(true);

  async function one(i: number, body: Json): Promise<void> {
    const res = await fetch(`${srv.url}${route}?budgetMs=1000`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify(body) });
    const text = await res.text();
    statuses.set(res.status, (statuses.get(res.status) ?? 0) + 1);
    const where = `${route} #${i} (seed ${SEED}): ${JSON.stringify(body).slice(0, 3000)} → ${res.status} ${text.slice(0, 300)}`;
    expect(res.status, where).toBeLessThan(500 + (res.status === 503 ? 4 : 0));
    if (res.status === 503) expect(res.headers.get('retry-after'), where).toMatch(/^\d+$/);
    if (res.status === 200) expect(nullsOutOfPlace(JSON.parse(text)), `${where} ${JSON.stringify(nullsOutOfPlace(JSON.parse(text)))}`).toEqual([]);
    // /health answers: 200, or 503 with Retry-After while the loop lags (this shared host stalls a process at times)
    const h = await fetch(srv.url + '/health', { signal: AbortSignal.timeout(5000) });
    expect([200, 503], `/health after ${where}`).toContain(h.status);
    if (h.status === 503) expect(h.headers.get('retry-after')).toMatch(/^\d+$/);
  }
});
