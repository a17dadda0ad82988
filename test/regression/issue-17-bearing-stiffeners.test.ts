import { FLAT_BARS, fy, STEEL_KG_PER_MM3 } from '@platesmith/catalogue';
import { bearingCrushing, checkGirder, defaultOptions, girderMass, type Section } from '@platesmith/checks';
import { fromSection, parseWith, SearchInput, toCheckProblem, CheckProblemInput, toSearchTask } from '@platesmith/schema';
import { problemOf, search } from '@platesmith/search';
import { analyse, designEffects } from '@platesmith/actions';
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { main } from '../../services/cli/src/main.js';
import { expectClose } from '../helpers/close.js';

/**
 * Issue 17, item 3: bearing stiffeners that scale. They came from one pair of stock flats, so no
 * girder in S355 could take a support reaction above what the strongest pair carries, and a
 * two-span 35 + 35 m girder under bridge factors came back with no section.
 *
 * The scenario is invented for this test (not a project's, not a course's): two equal spans of
 * 35 m, a permanent UDL of 55 kN/m and a variable UDL of 45 kN/m (category B), EN 1993-2's
 * partial factors (options.factors "bridges"), flanges held laterally every 3.5 m.
 */
const problem = {
  spans: [35000, 35000],
  actions: [
    { kind: 'permanent', load: 'udl', value: 55 },
    { kind: 'variable', load: 'udl', value: 45, category: 'B' },
  ],
  options: { factors: 'bridges', restraint: { spacing: 3500 }, bottomRestraint: { spacing: 3500 } },
};
const space = {
  webDepth: [2400, 2800, 3200],
  webThickness: [15, 20],
  flangeThickness: [40, 50, 60, 70],
  panels: [0, 10, 14],
  endPost: 'non-rigid',
};

function searched(flangeWidth: number[], flangeThickness = space.flangeThickness) {
  const input = parseWith(SearchInput, { ...problem, space: { ...space, flangeWidth, flangeThickness } });
  if (!input.ok) throw new Error(JSON.stringify(input.issues));
  return search(problemOf(toSearchTask(input.value)));
}

/** The answer's section checked through the public check path (its own analysis and self-weight). */
function checked(section: Section) {
  const p = parseWith(CheckProblemInput, { ...problem, section: fromSection(section) });
  if (!p.ok) throw new Error(JSON.stringify(p.issues));
  const job = toCheckProblem(p.value);
  return checkGirder(job.section, job.effects, job.options);
}

describe('a 35 + 35 m two-span girder under bridge factors (invented scenario)', () => {
  test('its interior reaction is above 5 MN: 1.25 w L of a two-span beam under UDL', () => {
    const a = analyse({ spans: [35000, 35000], actions: problem.actions as never, combination: '6.10' });
    const R = Math.max(...designEffects(a, 0).reactions.map((r) => Math.abs(r.R)));
    // handbook closed form, two equal spans under a UDL on both: R_B = 10 w L / 8 (e.g. the
    // Steel Designers' Manual's continuous-beam tables, from memory); w = 1.35·55 + 1.5·45 kN/m
    // (EN 1990 eq. 6.10, Table A1.2(B) recommended factors): 1.25 · 141.75 · 35 = 6 201.6 kN
    expectClose(R / 1000, 1.25 * (1.35 * 55 + 1.5 * 45) * 35, 1e-9, 'interior reaction without self-weight, kN');
    expect(R).toBeGreaterThan(5e6);
  });

  test('no pair of stock flats carries it: the strongest crushes (EN 1993-1-5 9.4, 2·(bs − snipe)·ts·fy/γM0)', () => {
    const o = defaultOptions(70000);
    for (const f of FLAT_BARS) {
      const FbRd = bearingCrushing(f.b, f.t, o.snipe, fy('S355', f.t), 1.0).FbRd;
      // 300 × 25 in S355 (fy 345 MPa over 16 mm, EN 10025-2): 2 · 280 · 25 · 345 = 4.83 MN
      expect(FbRd).toBeLessThan(5e6);
    }
  });

  const free = searched([500, 600, 700]);

  test('has a feasible answer: bearing stiffeners cut from plate, within the flange outstand, passing every check', () => {
    expect(free.status).toBe('exact');
    expect(free.lightest).not.toBeNull();
    for (const e of free.pareto) {
      const b = e.section.bearing!;
      expect(FLAT_BARS.some((f) => f.b === b.bs && f.t === b.ts) && (b.pairs ?? 1) === 1).toBe(false);
      expect(b.bs).toBeLessThanOrEqual((Math.min(e.section.top.b, e.section.bot.b) - e.section.tw) / 2);
      const v = checked(e.section);
      expect(v.passes).toBe(true);
      const bearing = v.checks.find((c) => c.id === 'bearing-stiffener')!;
      expect(bearing.values['R']).toBeGreaterThan(5e6);
    }
  });

  const narrow = searched([350, 400], [50, 60, 70, 80]);

  test('with narrow flanges the bearing stiffeners come in several pairs, and the mass counts every pair', () => {
    expect(narrow.lightest).not.toBeNull();
    const e = narrow.lightest!;
    const b = e.section.bearing!;
    expect(b.pairs ?? 1).toBeGreaterThan(1);
    // the bearing part of the mass: (supports · pairs) double-sided pairs of bs × ts over hw, at 7850 kg/m³
    // (non-rigid end posts: no outer pair); the published mass is plates + stiffeners + that
    const s = e.section;
    const m = girderMass(s, 70000, [0, 35000, 70000], b);
    expectClose(m.bearing, 3 * b.pairs! * 2 * b.bs * b.ts * s.hw * STEEL_KG_PER_MM3, 1e-12, 'bearing stiffeners, kg');
    expectClose(e.mass, m.total, 1e-12, 'girder mass, kg');
    expect(checked(e.section).passes).toBe(true);
  });
});

describe('the demo schedule (invented): tool-sized parts pass their own checks', () => {
  const dir = mkdtempSync(join(tmpdir(), 'platesmith-issue17-'));
  afterAll(() => rmSync(dir, { recursive: true, force: true }));
  const root = new URL('../../', import.meta.url).pathname;
  let r: any;
  beforeAll(async () => {
    const code = await main(['schedule', `${root}demo/schedule-harbour-sheds.json`, '--out', join(dir, 'r.json'), '--quiet', '--threads', '1'], { out: () => {}, err: () => {} });
    expect(code).toBe(0);
    r = JSON.parse(readFileSync(join(dir, 'r.json'), 'utf8'));
  }, 300_000);

  test('the tool-sized end posts and bearing stiffeners of the demo schedule pass stiffener-torsion (EN 1993-1-5 9.2.1(8))', () => {
    let seen = 0;
    for (const m of r.marks) {
      for (const p of m.search?.pareto ?? []) {
        // the space gives no bearing stiffeners: every one here was sized by the tool, with rigid end posts
        expect(p.section.endPost).toBe('rigid');
        const t = p.checks.find((c: { id: string }) => c.id === 'stiffener-torsion');
        expect(t.passes).toBe(true);
        expect(t.utilisation).toBeLessThanOrEqual(1);
        // eq. 9.3 by its closed form for the flat published: It/Ip = ts²/(bs² + ts²) ≥ 5.3 fy/E (E = 210 000 MPa, fy of its band, EN 10025-2)
        const b = p.section.bearing;
        const ts = b.thickness;
        const bs = b.width;
        expect((ts * ts) / (bs * bs + ts * ts)).toBeGreaterThanOrEqual((5.3 * fy('S355', ts)) / 210000);
        for (const id of ['end-post', 'bearing-stiffener']) expect(p.checks.find((c: { id: string }) => c.id === id).passes).toBe(true);
        seen++;
      }
    }
    expect(seen).toBeGreaterThanOrEqual(4);
  });
});
