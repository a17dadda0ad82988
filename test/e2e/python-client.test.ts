/**
 * examples/client.py (Python, standard library only) against a live server: it searches girder
 * KQ-G1 of the demo project, submits the demo schedule, follows its events and prints the Pareto
 * tables. The rows it prints must be the Pareto set the API answers for the same search, and
 * every mark of the schedule must appear with the caution at the end. Needs python3 (as the
 * install of better-sqlite3 does).
 */
import { spawn } from 'node:child_process';
import { afterAll, beforeAll, expect, test } from 'vitest';
import { CAUTION } from '@platesmith/schema';
import { SqliteJobStore } from '../../services/api/src/jobs/sqlite.js';
import { start, type Running } from '../../services/api/test/harness.js';
import { DEMO_MARK, demoGirderRequest, FILES, readJson } from '../../scripts/openapi-examples.js';

const root = new URL('../..', import.meta.url).pathname;
let srv: Running;
beforeAll(async () => {
  srv = await start({ threads: 1, jobStore: new SqliteJobStore({ path: ':memory:' }) });
});
afterAll(async () => {
  await srv.close();
});

/** Runs a command without blocking the event loop (the server answers it in this process). */
function run(cmd: string, args: string[]): Promise<{ code: number | null; stdout: string; stderr: string }> {
  return new Promise((resolve, reject) => {
    const p = spawn(cmd, args, { cwd: root, env: { ...process.env, PYTHONDONTWRITEBYTECODE: '1' } });
    let stdout = '';
    let stderr = '';
    p.stdout.on('data', (d) => (stdout += d));
    p.stderr.on('data', (d) => (stderr += d));
    p.on('error', reject);
    p.on('close', (code) => resolve({ code, stdout, stderr }));
  });
}

test('examples/client.py searches, follows a schedule to the end and prints the Pareto tables the API answers', async () => {
  const r = await run('python3', ['examples/client.py', '--url', srv.url]);
  expect(r.stderr).toBe('');
  expect(r.code).toBe(0);
  const search = await srv.post('/v1/searches', demoGirderRequest(readJson(root, FILES.demoProject) as any, DEMO_MARK));
  const table = r.stdout.split('\nSchedule job ')[0]!;
  const rows = [...table.matchAll(/^ {2}\s*(\d+)\s+([\d.]+)\s+([\d.]+)\s+([a-z-]+)\s+([\d.]+)\s+web /gm)].map((m) => ({ depth: Number(m[1]), mass: Number(m[2]), governing: m[4] }));
  expect(rows.map((x) => [x.depth, x.governing])).toEqual(search.body.pareto.map((p: any) => [p.depth, p.governing.id]));
  // the mass printed to 0.1 kg (Python's rounding of the binary value, not always JavaScript's)
  rows.forEach((x, i) => expect(Math.abs(x.mass - search.body.pareto[i].mass)).toBeLessThanOrEqual(0.05 + 1e-9));
  const schedule = readJson(root, FILES.schedule) as { girders: { mark: string; quantity: number }[] };
  for (const g of schedule.girders) expect(r.stdout).toContain(`\nMark ${g.mark} (x${g.quantity})\n`);
  expect(r.stdout).toMatch(/^ {2}done: done, 4\/4 marks$/m);
  expect(r.stdout).toContain(CAUTION);
});

test('examples/client.py names the problem and the field of a rejected request (exit 2)', async () => {
  const bad = new URL('../../reports/client-py-bad-search.json', import.meta.url).pathname;
  const { mkdirSync, writeFileSync } = await import('node:fs');
  mkdirSync(new URL('../../reports/', import.meta.url).pathname, { recursive: true });
  writeFileSync(bad, JSON.stringify({ spans: [20], actions: [{ kind: 'permanent', load: 'udl', value: 10 }] }));
  const r = await run('python3', ['examples/client.py', '--url', srv.url, '--search', bad]);
  expect(r.code).toBe(2);
  expect(r.stderr).toMatch(/^error: 422 SPAN_IMPLAUSIBLE: .*\(spans\[0\]: .*\)$/m);
  expect(r.stderr).toMatch(/^hint: .*mm/m);
});
