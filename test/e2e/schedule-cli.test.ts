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
  // the compression flange pinned continuously restrained (a floor on top), as this schedule was
  // drawn for: under the default (restraint at the supports only) lateral-torsional buckling
  // leaves N2 without a passing section in SPACE on day 2, and N2 would regress as well as N1
  defaults: { spans: [12000], actions: [{ kind: 'permanent', load: 'udl', value: 10 }, { kind: 'variable', load: 'udl', value: q, category: 'B' }], space: SPACE, options: { restraint: 'continuous' } },
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

test('a mark without a section fails: summary, exit 1, JUnit failure (with or without a baseline), report, tonnage that lists it with a flagged estimate', async () => {
  // X: 20 m under 30 + 40 kN/m in a space of shallow webs (invented): nothing can pass
  const s = {
    name: 'with a mark without a section',
    defaults: { spans: [12000], actions: [{ kind: 'permanent', load: 'udl', value: 10 }, { kind: 'variable', load: 'udl', value: 15, category: 'B' }], space: SPACE },
    girders: [
      { mark: 'OK1', quantity: 3 },
      { mark: 'X', quantity: 2, spans: [20000], actions: [{ kind: 'permanent', load: 'udl', value: 30 }, { kind: 'variable', load: 'udl', value: 40, category: 'B' }], space: { ...SPACE, webDepth: [400], flangeThickness: [12] } },
    ],
    tender: { rationalise: 2 },
  };
  writeFileSync(f('nosec.json'), JSON.stringify(s));
  const r = await run('schedule', f('nosec.json'), '--out', f('nosec-out.json'), '--junit', f('nosec.xml'), '--markdown', f('nosec.md'), '--report', f('nosec.html'), '--quiet', '--threads', '2');
  expect(r.code).toBe(1);
  const res = JSON.parse(readFileSync(f('nosec-out.json'), 'utf8'));
  const x = res.marks[1];
  expect(x).toMatchObject({ mark: 'X', status: 'failed', error: { code: 'NO_FEASIBLE_SECTION' } });
  expect(x.search.lightest).toBeNull();
  const misses = x.search.nearMisses.length;
  // the nearest misses in words, or an explicit statement that there are none
  const words = misses > 0 ? /nearest miss [\d,]+ kg at h = \d+ mm/ : /the search returned no nearest miss/;
  expect(x.error.message).toMatch(words);
  expect(res.totals).toMatchObject({ marks: 2, marksFailed: 1, marksWithoutFeasible: ['X'], girdersWithoutFeasible: 2 });
  // the tonnage says what it leaves out, with the quantity, and the estimate line is flagged
  expect(res.tender.leftOut).toEqual([{ mark: 'X', quantity: 2, reason: 'no section in its space passes every check (and none adopted)' }]);
  expect(res.tender.coverage).toMatchObject({ marks: 1, girders: 3, excludedMarks: 1, excludedGirders: 2 });
  expect(res.tender.estimates).toHaveLength(1);
  const e = res.tender.estimates[0];
  if (misses > 0) {
    expect(e.mass).toBeCloseTo(2 * x.search.nearMisses[0].mass, 6);
    expect(e.flag).toMatch(/^ESTIMATE, not a design/);
    expect(res.tender.coverage.short).toEqual([]);
  } else {
    expect(e.mass).toBeNull();
    expect(e.flag).toMatch(/^NO ESTIMATE/);
    expect(res.tender.coverage.short).toEqual(['X']);
  }
  expect(res.tender.coverage.totalWithEstimates).toBeCloseTo(res.tender.coverage.tonnage + (e.mass ?? 0), 6);
  // the rationalisation leaves X out, lists it, and rationalises the other mark
  expect(res.tender.rationalisation.leftOut).toEqual([{ mark: 'X', quantity: 2, reason: 'no feasible candidate' }]);
  expect(res.tender.rationalisation.byK[0]).toMatchObject({ K: 1, feasible: true, status: 'optimal' });

  expect(r.out).toMatch(/2 marks \(1 failed\)/);
  expect(r.out).toMatch(/FAILED X ×2: no feasible section: /);
  expect(r.out).toMatch(/NOT in the tonnage: 1 marks, 2 girders: X ×2\./);
  expect(r.out).toMatch(/not counted: 1 marks without a section \(2 girders\)/);
  const xml = readFileSync(f('nosec.xml'), 'utf8');
  expect(xml).toMatch(/<testsuites [^>]*failures="1"/);
  expect(xml).toMatch(/<testcase [^>]*name="X">\s*<failure message="no feasible section: /);
  expect(readFileSync(f('nosec.md'), 'utf8')).toMatch(/NOT in the tonnage: 1 marks, 2 girders: X ×2\./);
  const html = readFileSync(f('nosec.html'), 'utf8');
  expect(html).toContain('<h2>Not in the tonnage</h2>');
  expect(html).toMatch(/id="mark-X">.*FAILED/s);
  expect(html).toMatch(misses > 0 ? /nearest miss [\d,]+ kg at h = \d+ mm fails/ : /the search returned no nearest miss/);

  // against its own result as the baseline, and against a baseline without X: X still fails
  const again = await run('schedule', f('nosec.json'), '--baseline', f('nosec-out.json'), '--junit', f('nosec2.xml'), '--json', '--quiet', '--threads', '2');
  expect(again.code).toBe(1);
  expect(JSON.parse(again.out).comparison.regressed).toEqual(['X']);
  expect(readFileSync(f('nosec2.xml'), 'utf8')).toMatch(/<testcase [^>]*name="X">\s*<failure /);
  writeFileSync(f('base-noX.json'), JSON.stringify({ records: res.records.filter((rec: { mark: string }) => rec.mark !== 'X') }));
  const fresh = await run('schedule', f('nosec.json'), '--baseline', f('base-noX.json'), '--json', '--quiet', '--threads', '2');
  expect(fresh.code).toBe(1);
  expect(JSON.parse(fresh.out).comparison.regressed).toEqual(['X']);
}, 180_000);
