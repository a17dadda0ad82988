/**
 * CSV schedule input (format defined in src/tender/CSV.md; this project's own format, so the
 * tests check it against its documentation and the public schemas, no published source).
 */
import { describe, expect, test } from 'vitest';
import { test as prop, fc } from '@fast-check/vitest';
import { SearchInput, parseWith } from '@platesmith/schema';
import { ScheduleJson, mergeGirder } from '../src/index.js';
import { parseScheduleCsv } from '../src/tender/index.js';

const GOOD = [
  'mark,quantity,spans,g_udl,q_udl,q_category,q_point,restraint,grade,max_depth,adopted_hw,adopted_tw,adopted_bf,adopted_tf,adopted_a,adopted_bs,adopted_ts,note',
  'G1,4,20000,25,30,B,,continuous,S355,1500,1400,12,450,30,2500,120,12,"roof, line A"',
  'G2,2,12000;12000,15,20,B,80@6000;40@18000,4000,S355;S460,,,,,,,,,',
].join('\r\n');

describe('a good file', () => {
  const r = parseScheduleCsv('\uFEFF' + GOOD);
  test('parses to the schedule JSON shape', () => {
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(r.value.girders[0]).toEqual({
      mark: 'G1',
      quantity: 4,
      spans: [20000],
      actions: [
        { kind: 'permanent', load: 'udl', value: 25, name: 'g_udl' },
        { kind: 'variable', load: 'udl', value: 30, name: 'q_udl', category: 'B' },
      ],
      options: { restraint: 'continuous' },
      space: { grade: 'S355', maxDepth: 1500 },
      adopted: {
        web: { depth: 1400, thickness: 12 },
        topFlange: { width: 450, thickness: 30 },
        bottomFlange: { width: 450, thickness: 30 },
        stiffeners: { spacing: 2500, width: 120, thickness: 12, sides: 2 },
      },
      note: 'roof, line A',
    });
    expect(r.value.girders[1]).toMatchObject({
      spans: [12000, 12000],
      options: { restraint: { spacing: 4000 } },
      space: { grade: ['S355', 'S460'] },
    });
    expect(r.value.girders[1]!.actions!.filter((a) => a.load === 'point')).toEqual([
      { kind: 'variable', load: 'point', value: 80, at: 6000, name: 'q_point 1', category: 'B' },
      { kind: 'variable', load: 'point', value: 40, at: 18000, name: 'q_point 2', category: 'B' },
    ]);
  });
  test('validates against the schedule schema and, merged, the search input of every mark', () => {
    if (!r.ok) throw new Error('not parsed');
    const s = ScheduleJson.parse(r.value);
    for (const g of s.girders) {
      const p = parseWith(SearchInput, mergeGirder(s.defaults, g));
      expect(p.ok, JSON.stringify(p)).toBe(true);
    }
  });
});

describe('bad cells are reported by row and column', () => {
  const H = 'mark,quantity,spans,g_udl,q_udl,q_point,restraint,grade,adopted_hw,adopted_tw,adopted_bf,adopted_tf,adopted_a';
  const issues = (rows: string[]) => {
    const r = parseScheduleCsv([H, ...rows].join('\n'));
    return r.ok ? [] : r.issues.map((i) => i.message);
  };
  test.for([
    ['G1,1,20000,10,abc,,,,,,,,', "row 2, column q_udl: 'abc' is not a number"],
    ['G1,0,20000,10,5,,,,,,,,', "row 2, column quantity: '0' must be positive"],
    ['G1,2.5,20000,10,5,,,,,,,,', "row 2, column quantity: '2.5' is not a whole number"],
    ['G1,,20000,10,5,,,,,,,,', 'row 2, column quantity: is empty; give the number of girders of the mark'],
    ['G1,1,24,10,5,,,,,,,,', "row 2, column spans: '24' mm is implausibly small; lengths are in mm (24000 for 24 m)"],
    ['G1,1,20000;x,10,5,,,,,,,,', "row 2, column spans: span 2: 'x' is not a number"],
    ['G1,1,20000,10,5,50@30000,,,,,,,', 'row 2, column q_point: load 1: x = 30000 mm is outside the girder (0 to 20000 mm)'],
    ['G1,1,20000,10,5,50at3000,,,,,,,', 'row 2, column q_point: \'50at3000\' is not a point load "P@x" (kN@mm), e.g. "50@6000;50@12000"'],
    ['G1,1,20000,10,5,,sometimes,,,,,,', "row 2, column restraint: 'sometimes' is not a number (a restraint spacing in mm, or \"continuous\")"],
    ['G1,1,20000,10,5,,,S999,,,,,', "row 2, column grade: 'S999' is not one of S235, S275, S355, S420, S460"],
    ['G1,1,20000,10,5,,,,1400,12,,30,', 'row 2, column adopted_bf: is empty; an adopted section needs adopted_hw, adopted_tw, adopted_bf and adopted_tf'],
    ['G1,1,20000,10,5,,,,1400,12,450,30,2500', 'row 2, column adopted_bs: is empty; stiffeners need adopted_a, adopted_bs and adopted_ts (leave all three empty for none)'],
    ['G1,1,20000,10,5,,,,1400,12,450,-30,', 'row 2, column adopted_tf: top flange thickness must be positive (mm)'],
    ['G1,1,20000,10,5,,,,,,,,,,extra', 'row 2: 15 cells for 13 columns'],
  ] as const)('%s', ([row, message]) => {
    const got = issues([row]);
    expect(got, got.join('\n')).toContain(message);
  });

  test('every bad row is reported, with its spreadsheet row number (blank lines count)', () => {
    expect(issues(['G1,1,20000,10,5,,,,,,,,', '', 'G1,1,20000,x,5,,,,,,,,', 'G3,1,20000,10,y,,,,,,,,'])).toEqual([
      "row 4, column mark: 'G1' repeats row 2",
      "row 4, column g_udl: 'x' is not a number",
      "row 5, column q_udl: 'y' is not a number",
    ]);
  });

  test('header problems', () => {
    const r = parseScheduleCsv('mark,qty\nG1,1');
    expect(r.ok ? [] : r.issues.map((i) => i.message)).toEqual([
      'row 1, column qty: unknown column (known: mark, quantity, spans, g_udl, q_udl, q_category, g_point, q_point, combination, restraint, factors, grade, max_depth, min_depth, adopted_hw, adopted_tw, adopted_bf, adopted_tf, adopted_bf_bot, adopted_tf_bot, adopted_a, adopted_bs, adopted_ts, adopted_sides, adopted_end_post, adopted_grade, note)',
      'row 1: the header has no quantity column',
    ]);
    expect(parseScheduleCsv('')).toEqual({ ok: false, issues: [{ row: 0, column: null, message: 'the file has no header row' }] });
  });

  test('an unclosed quote is an issue, not a crash', () => {
    const r = parseScheduleCsv('mark,quantity\n"G1,1\n');
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.issues[0]!.message).toMatch(/^row 2: not readable as CSV \(Quote Not Closed/);
  });

  prop.prop([fc.string({ unit: 'binary', maxLength: 200 })], { numRuns: 300 })('arbitrary text never throws', (junk) => {
    const r = parseScheduleCsv('mark,quantity,spans,q_point,adopted_hw\n' + junk);
    expect(typeof r.ok).toBe('boolean');
  });
});
