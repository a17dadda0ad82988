/**
 * The command line's outputs mean one thing (#19): an unknown option exits 2 with the usage; a
 * missing file and an unknown grade are said in words; `check --json` and `effects --json`
 * carry the caution and the scope; text tables fit 120 columns (`--wide` shows the rest);
 * `record` writes the calculation record, creating its folder. Behaviour tests of the commands,
 * in-process (main() with captured output); no engineering value is asserted.
 */
import { existsSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, expect, test } from 'vitest';
import { CAUTION, SCOPE } from '@platesmith/schema';
import { main } from '../../services/cli/src/main.js';

const dir = mkdtempSync(join(tmpdir(), 'platesmith-cli-outputs-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));
const f = (name: string) => join(dir, name);
const root = new URL('../../', import.meta.url).pathname;

async function run(...argv: string[]): Promise<{ code: number; out: string; err: string }> {
  let out = '';
  let err = '';
  const code = await main(argv, { out: (s) => (out += s + '\n'), err: (s) => (err += s + '\n') });
  return { code, out, err };
}

const demo = `${root}examples/check-demo.json`;
const PROBLEM = { spans: [12000], actions: [{ kind: 'permanent', load: 'udl', value: 10 }, { kind: 'variable', load: 'udl', value: 15, category: 'B' }] };

test.for([
  ['check', demo, '--josn'],
  ['effects', demo, '--bogus'],
  ['search', demo, '--jsn'],
  ['record', demo, '--output', 'x.html'],
  ['demo', '--fast'],
  ['check', demo, '--json=yes'],
])('an unknown or misused option exits 2 with the usage: %s', async (argv) => {
  const r = await run(...argv);
  expect(r.code).toBe(2);
  expect(r.out).toBe('');
  expect(r.err).toMatch(/^error: /);
  expect(r.err).toContain('usage');
});

test('a missing file is said in words; an unknown grade lists the grades', async () => {
  const m = await run('check', f('nope.json'));
  expect([m.code, m.err.trim()]).toEqual([2, `error: cannot read ${f('nope.json')}: no such file`]);
  const input = JSON.parse(readFileSync(demo, 'utf8'));
  writeFileSync(f('grade.json'), JSON.stringify({ ...input, section: { ...input.section, grade: 'S999' } }));
  const g = await run('check', f('grade.json'));
  expect(g.code).toBe(2);
  expect(g.err).toContain('section.grade: unknown steel grade "S999": the grades are S235, S275, S355, S420, S460');
});

test('check --json and effects --json carry the caution and the scope', async () => {
  const c = await run('check', demo, '--json');
  expect(JSON.parse(c.out)).toMatchObject({ caution: CAUTION, scope: SCOPE });
  writeFileSync(f('problem.json'), JSON.stringify(PROBLEM));
  const e = await run('effects', f('problem.json'), '--json');
  expect(e.code).toBe(0);
  expect(JSON.parse(e.out)).toMatchObject({ caution: CAUTION, scope: SCOPE, envelope: { MEdMax: expect.any(Number) } });
  const t = await run('effects', f('problem.json'));
  expect(t.out).toContain(`Caution: ${CAUTION}`);
});

test('text tables fit 120 columns; --wide adds the key values', async () => {
  const narrow = await run('check', demo);
  const width = (s: string) => Math.max(...s.split('\n').filter((l) => !l.startsWith('Caution') && !l.startsWith('Not covered')).map((l) => l.length));
  expect(width(narrow.out)).toBeLessThanOrEqual(120);
  const wide = await run('check', demo, '--wide');
  expect(wide.out).toContain('key values');
  expect(narrow.out).not.toContain('key values');
});

test('record writes the HTML record into a folder it creates; exit 1 when a check fails', async () => {
  const out = f('records/new/girder.html');
  const r = await run('record', demo, '--out', out, '--mark', 'G-07', '--checked-by', 'A. Checker');
  expect(existsSync(out)).toBe(true);
  const html = readFileSync(out, 'utf8');
  expect(html).toContain('G-07');
  expect(html).toContain('A. Checker');
  // the example's outcome decides the exit code: 0 when every check passes, 1 when one fails
  const passes = JSON.parse((await run('check', demo, '--json')).out).passes as boolean;
  expect(r.code).toBe(passes ? 0 : 1);
  expect(r.err).toContain(out);
});
