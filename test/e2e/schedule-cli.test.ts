/**
 * `platesmith schedule` in-process (main() with captured output): the nightly regression round
 * trip (--out, then --baseline with heavier loads: exit 1, JUnit failure, Markdown row), CSV
 * input, and bad input (exit 2 with the row and column, or the field, named). Behaviour tests of
 * the command; no engineering value is asserted (which section passes is the check library's
 * business, tested elsewhere against published values).
 */
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, expect, test } from 'vitest';
import { main } from '../../services/cli/src/main.js';

const dir = mkdtempSync(join(tmpdir(), 'platesmith-schedule-cli-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));
const f = (name: string) => join(dir, name);

async function run(...argv: string[]): Promise<{ code: number; out: string; err: string }> {
  let out = '';
  let err = '';
  const code = await main(argv, { out: (s) => (out += s + '\n'), err: (s) => (err += s + '\n') });
  return { code, out, err };
}

const SPACE = { webDepth: [700, 800, 900, 1000], webThickness: [8, 10, 12], flangeWidth: [200, 250, 300, 350], flangeThickness: [12, 15, 20, 25], panels: [0], endPost: 'rigid' };
// the (invented) adopted section: generous for 12 m under 10 + 15 kN/m
const ADOPTED = { web: { depth: 1000, thickness: 12 }, topFlange: { width: 350, thickness: 25 }, bottomFlange: { width: 350, thickness: 25 }, bearing: { width: 150, thickness: 20 } };
const schedule = (q: number) => ({
  name: 'nightly',
  defaults: { spans: [12000], actions: [{ kind: 'permanent', load: 'udl', value: 10 }, { kind: 'variable', load: 'udl', value: q, category: 'B' }], space: SPACE },
  girders: [
    { mark: 'N1', quantity: 2, adopted: ADOPTED },
    { mark: 'N2', quantity: 1, spans: [9000] },
  ],
});

test('nightly round trip: --out, then --baseline with heavier loads → exit 1, JUnit failure, Markdown row', async () => {
  writeFileSync(f('day1.json'), JSON.stringify(schedule(15)));
  const d1 = await run('schedule', f('day1.json'), '--out', f('base.json'), '--junit', f('d1.xml'), '--quiet', '--threads', '2');
  const base = JSON.parse(readFileSync(f('base.json'), 'utf8'));
  expect(base.records[0], 'precondition: the adopted section passes on day 1').toMatchObject({ mark: 'N1', adoptedPasses: true });
  expect(d1.code).toBe(0);
  expect(base).toMatchObject({ format: 'platesmith-schedule-result', version: 1, comparison: null });
  expect((readFileSync(f('d1.xml'), 'utf8').match(/<testcase /g) ?? []).length).toBe(2);

  // day 2: the imposed load is ten times larger; the adopted section no longer passes
  writeFileSync(f('day2.json'), JSON.stringify(schedule(150)));
  const d2 = await run('schedule', f('day2.json'), '--baseline', f('base.json'), '--junit', f('d2.xml'), '--markdown', f('d2.md'), '--report', f('d2.html'), '--json', '--quiet', '--threads=2');
  expect(d2.code).toBe(1);
  const r2 = JSON.parse(d2.out);
  expect(r2.comparison.regressed).toEqual(['N1']);
  const xml = readFileSync(f('d2.xml'), 'utf8');
  expect((xml.match(/<testcase /g) ?? []).length).toBe(2);
  expect(xml).toMatch(/<testsuites [^>]*failures="1"/);
  expect(xml).toMatch(/<testcase [^>]*name="N1">\s*<failure /);
  const md = readFileSync(f('d2.md'), 'utf8');
  expect(md).toMatch(/^\| N1 \| regressed \|/m);
  expect(readFileSync(f('d2.html'), 'utf8')).toContain('id="mark-N1"');

  // the same day again against day 2's result: the adopted section still fails, and a failing
  // adopted section fails the nightly job with a baseline as without one (#19: it exited 0)
  writeFileSync(f('base2.json'), JSON.stringify(r2));
  const d3 = await run('schedule', f('day2.json'), '--baseline', f('base2.json'), '--junit', f('d3.xml'), '--json', '--quiet', '--threads', '2');
  expect(d3.code).toBe(1);
  expect(JSON.parse(d3.out).comparison.counts).toMatchObject({ regressed: 1, pass: 1 });
  expect(readFileSync(f('d3.xml'), 'utf8')).toMatch(/<testcase [^>]*name="N1">\s*<failure message="adopted section fails/);
  expect(readFileSync(f('d2.md'), 'utf8')).toContain('> **Caution.** Platesmith is a design aid.');
  expect(r2).toMatchObject({ caution: expect.stringContaining('design aid'), scope: expect.stringContaining('Not covered') });
});

test('CSV schedule with --rationalise: exit 0, rationalisation per K in the result', async () => {
  writeFileSync(f('s.csv'), 'mark,quantity,spans,g_udl,q_udl,q_category,max_depth\nK1,4,12000,10,15,B,1100\nK2,2,10000,10,15,B,1100\n');
  // CSV carries no space: the default space is searched (bounded here by max_depth)
  const r = await run('schedule', f('s.csv'), '--rationalise', '2', '--json', '--quiet', '--threads', '2');
  expect(r.err).toBe('');
  expect(r.code).toBe(0);
  const res = JSON.parse(r.out);
  expect(res.marks.map((m: { mark: string; status: string }) => [m.mark, m.status])).toEqual([
    ['K1', 'ok'],
    ['K2', 'ok'],
  ]);
  expect(res.tender.rationalisation.byK.length).toBeGreaterThanOrEqual(1);
}, 120_000);

test('bad input: exit 2 naming the row and column, the field, the flag, or the file', async () => {
  writeFileSync(f('bad.csv'), 'mark,quantity,spans\nB1,two,12000\nB2,1,24\n');
  const csv = await run('schedule', f('bad.csv'));
  expect(csv.code).toBe(2);
  expect(csv.err).toContain('row 2, column quantity');
  expect(csv.err).toContain('row 3, column spans');

  writeFileSync(f('bad.json'), '{ "girders": [ { "mark": "B1", "quantity": 1 }, ]');
  const js = await run('schedule', f('bad.json'));
  expect(js.code).toBe(2);
  // Node 20 names the position for some syntax errors only; the message then says the line and column
  expect(js.err).toContain('not valid JSON');

  writeFileSync(f('shape.json'), JSON.stringify({ girders: [{ mark: 'B1', quantity: 0 }] }));
  const sh = await run('schedule', f('shape.json'));
  expect(sh.code).toBe(2);
  expect(sh.err).toContain('girders[0].quantity');

  writeFileSync(f('base-bad.json'), JSON.stringify({ records: [{ mark: 'X' }] }));
  writeFileSync(f('ok.json'), JSON.stringify(schedule(15)));
  const bb = await run('schedule', f('ok.json'), '--baseline', f('base-bad.json'));
  expect(bb.code).toBe(2);
  expect(bb.err).toContain('lightestMass');

  expect((await run('schedule', f('ok.json'), '--rationalise', '0')).code).toBe(2);
  expect((await run('schedule', f('ok.json'), '--colour')).code).toBe(2);
  expect((await run('schedule', f('missing.json'))).err).toContain(`cannot read ${f('missing.json')}: no such file`);
  expect((await run('schedule')).code).toBe(2);
});
