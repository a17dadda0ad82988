/**
 * `platesmith search` in-process (main() with captured output): a search stopped by its
 * --budget-ms exits 0 with a warning on standard error and status aborted in the JSON; an exact
 * one prints no warning; a bad budget is bad input (exit 2). Behaviour tests; no engineering value.
 */
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, expect, test } from 'vitest';
import { main } from '../../services/cli/src/main.js';

const dir = mkdtempSync(join(tmpdir(), 'platesmith-search-cli-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

async function run(...argv: string[]): Promise<{ code: number; out: string; err: string }> {
  let out = '';
  let err = '';
  const code = await main(argv, { out: (s) => (out += s + '\n'), err: (s) => (err += s + '\n') });
  return { code, out, err };
}

const actions = [{ kind: 'permanent', load: 'udl', value: 10 }, { kind: 'variable', load: 'udl', value: 15, category: 'B' }];

test('a search past --budget-ms: exit 0, a warning on standard error, status aborted', async () => {
  const file = join(dir, 'big.json');
  // about 10^10 candidates on 24 m: seconds at best, never 200 ms
  writeFileSync(file, JSON.stringify({ spans: [24000], actions, space: { symmetric: false } }));
  const r = await run('search', file, '--json', '--quiet', '--budget-ms=200');
  expect(r.code).toBe(0);
  expect(r.err).toMatch(/^warning: aborted at its time budget of 200 ms: .*may be incomplete/m);
  expect(JSON.parse(r.out)).toMatchObject({ status: 'aborted', abort: { reason: 'time-budget', budgetMs: 200 } });
});

test('an exact search: no warning, status exact', async () => {
  const file = join(dir, 'small.json');
  // the compression flange pinned continuously restrained (a floor on top), as this small space was
  // drawn for: under the default (restraint at the supports only) every candidate fails lateral-
  // torsional buckling and the search is infeasible (exit 1), which is not what this test is about
  writeFileSync(file, JSON.stringify({ spans: [12000], actions, space: { webDepth: [700, 800, 900], webThickness: [8, 10], flangeWidth: [200, 250, 300], flangeThickness: [12, 15, 20], panels: [0], endPost: 'rigid' }, options: { restraint: 'continuous' } }));
  const r = await run('search', file, '--json', '--quiet', '--budget-ms', '60000');
  expect(r.code).toBe(0);
  expect(r.err).toBe('');
  expect(JSON.parse(r.out).status).toBe('exact');
});

test.for(['--budget-ms=0x1000', '--budget-ms=1e3', '--budget-ms', '--budget-ms=50'])('%s is bad input (exit 2)', async (flag) => {
  const file = join(dir, 'small.json');
  const r = await run('search', file, flag);
  expect(r.code).toBe(2);
  expect(r.err).toMatch(/--budget-ms/);
});

test('progress by work done on standard error (not a terminal: one line per tenth), ending at every candidate settled; stdout stays JSON', async () => {
  const file = join(dir, 'progress.json');
  writeFileSync(file, JSON.stringify({ spans: [12000], actions, space: { webDepth: [700, 800, 900], webThickness: [8, 10], flangeWidth: [200, 250, 300], flangeThickness: [12, 15, 20], panels: [0, 4], endPost: 'rigid' }, options: { restraint: 'continuous' } }));
  const r = await run('search', file, '--json');
  const lines = r.err.split('\n').filter((l) => l.startsWith('[search]'));
  expect(lines.length).toBeGreaterThan(0);
  const parsed = lines.map((l) => /\[search\] ([\d ]+) of ([\d ]+) candidates settled \(([\d.]+) %/.exec(l)!);
  for (const m of parsed) expect(m).not.toBeNull();
  const nums = parsed.map((m) => [Number(m[1]!.replace(/ /g, '')), Number(m[2]!.replace(/ /g, ''))] as const);
  // the count never goes down, and the last line has every candidate the search holds settled
  for (let i = 1; i < nums.length; i++) expect(nums[i]![0]).toBeGreaterThanOrEqual(nums[i - 1]![0]);
  expect(nums.at(-1)![0]).toBe(nums.at(-1)![1]);
  const out = JSON.parse(r.out);
  // the space of the answer: every candidate is settled, the rules' share counted at the merge
  expect(nums.at(-1)![1]).toBeLessThanOrEqual(out.stats.spaceSize);
});
