import { describe, expect } from 'vitest';
import { fc, test } from '@fast-check/vitest';
import {
  BEARING_DEPENDENT,
  CHECK_ORDER,
  CHECKS,
  JUDGE_ORDER,
  LAYOUT_IDS,
  PANEL_ONLY,
  PLATE_IDS,
  checkGirder,
  checkSpec,
  defaultOptions,
  failsWebOnly,
  prepare,
  type CheckInput,
  type CheckResult,
  type CheckSpec,
  type Effects,
  type Section,
} from '../src/index.js';
import { bendingThunks } from '../src/en1993-1-1/bending-family.js';
import { shearThunks } from '../src/en1993-1-5/shear-family.js';
import { effectsOf } from './span-effects.js';

/**
 * The check registry against the library itself: what an entry declares (where the check lives,
 * the clauses it names, the inputs it reads, the unit of every value) is what the check does.
 * The partitions the search prunes with are derived from `reads`, so a wrong `reads` would lose
 * exactness silently: here a change of any input an entry does not read must leave its result
 * equal, on randomly drawn sections and loads (consistency properties, no published values).
 */

const SPECS: readonly CheckSpec[] = CHECKS;

describe('check registry: the table itself', () => {
  test('the ids are the public contract\'s check ids, in its report order', () => {
    // the check ids of the public check-result contract (the project's API documentation)
    expect(CHECK_ORDER).toEqual([
      'classification',
      'bending',
      'shear',
      'shear-buckling',
      'bending-shear',
      'flange-induced-buckling',
      'patch-loading',
      'patch-bending',
      'stiffener-stiffness',
      'stiffener-strength',
      'load-bearing-stiffener',
      'stiffener-torsion',
      'end-post',
      'bearing-stiffener',
      'lateral-torsional-buckling',
      'deflection',
      'restraint-stiffener',
      'web-flange-weld',
    ]);
  });

  test('judging ranks are distinct, so the judging order is total', () => {
    expect(new Set(SPECS.map((c) => c.judge)).size).toBe(SPECS.length);
    expect([...JUDGE_ORDER].sort()).toEqual([...CHECK_ORDER].sort());
  });

  test('every entry names functions their files export (the check and the clause-level pieces beneath it)', async () => {
    const exportsOf = async (file: string) => (await import(/* @vite-ignore */ new URL(`../src/${file}`, import.meta.url).href)) as Record<string, unknown>;
    for (const c of SPECS) {
      expect.soft(typeof (await exportsOf(c.file))[c.fn], `${c.id}: ${c.file} exports ${c.fn}`).toBe('function');
      for (const b of c.beneath ?? []) {
        const file = b.file ?? c.file;
        expect.soft(typeof (await exportsOf(file))[b.fn], `${c.id}: ${file} exports ${b.fn}`).toBe('function');
      }
    }
  });

  test('each family computes exactly its entries', () => {
    const s = sectionOf({ hw: 1200, tw: 10, bt: 400, tt: 25, bb: 400, tb: 25, a: 2000, endPost: 'rigid' });
    const ctx = prepare(s, defaultOptions(16000));
    const e = effectsOf(16000, 40, 2e5, true);
    expect(Object.keys(bendingThunks(ctx, e)).sort()).toEqual(SPECS.filter((c) => c.family === 'bending').map((c) => c.id).sort());
    expect(Object.keys(shearThunks(ctx, e)).sort()).toEqual(SPECS.filter((c) => c.family === 'shear').map((c) => c.id).sort());
  });

  test('the search\'s two parts cover every check once; the bearing-dependent ones are all layout checks', () => {
    expect([...PLATE_IDS, ...LAYOUT_IDS].sort()).toEqual([...CHECK_ORDER].sort());
    expect(PLATE_IDS.length + LAYOUT_IDS.length).toBe(CHECK_ORDER.length);
    for (const id of BEARING_DEPENDENT) expect(LAYOUT_IDS).toContain(id);
    for (const id of PANEL_ONLY) expect(LAYOUT_IDS).toContain(id);
  });
});

const sectionArb = fc.record({
  hw: fc.integer({ min: 400, max: 2400 }),
  tw: fc.constantFrom(6, 8, 10, 12, 15, 20),
  bt: fc.integer({ min: 150, max: 700 }),
  tt: fc.constantFrom(10, 15, 20, 25, 30, 40, 50),
  bb: fc.integer({ min: 150, max: 700 }),
  tb: fc.constantFrom(10, 15, 20, 25, 30, 40, 50),
  a: fc.option(fc.integer({ min: 800, max: 6000 }), { nil: null }),
  endPost: fc.constantFrom('rigid' as const, 'non-rigid' as const),
  load: fc.option(fc.constantFrom({ bs: 120, ts: 15 }, { bs: 180, ts: 20 }, { bs: 250, ts: 12 }), { nil: null }),
  restraint: fc.option(fc.constantFrom({ bs: 100, ts: 10 }, { bs: 160, ts: 12 }), { nil: null }),
});

type SectionRecord = { hw: number; tw: number; bt: number; tt: number; bb: number; tb: number; a: number | null; endPost: 'rigid' | 'non-rigid'; load?: { bs: number; ts: number } | null; restraint?: { bs: number; ts: number } | null };

/** The section of a record; its load-bearing stiffeners (if any) under the central force of effectsOf(L, …). */
function sectionOf(r: SectionRecord, L = 16000): Section {
  return {
    ...(r.load ? { loadStiffeners: { ...r.load, xs: [L / 2] } } : {}),
    // a pair at the lateral restraint of the tests' options (L/4, both flanges)
    ...(r.restraint ? { restraintStiffeners: { ...r.restraint, xs: [L / 4] } } : {}),
    hw: r.hw,
    tw: r.tw,
    top: { b: r.bt, t: r.tt },
    bot: { b: r.bb, t: r.tb },
    stiffeners: r.a === null ? null : { a: r.a, bs: 120, ts: 12, sides: 2 },
    endPost: r.endPost,
    bearing: { bs: 140, ts: 15, e: Math.max(100, 0.12 * r.hw) },
    grade: { web: 'S355', top: 'S355', bot: 'S355', stiffener: 'S355' },
  };
}

const loadArb = fc.record({ L: fc.constantFrom(8000, 16000, 24000), w: fc.double({ min: 5, max: 120, noNaN: true }), P: fc.constantFrom(0, 2e5, 8e5), sag: fc.boolean() });

const byId = (checks: readonly CheckResult[]): Map<string, CheckResult> => new Map(checks.map((c) => [c.id, c]));

describe('check registry: each entry against its check', () => {
  test.prop([sectionArb, loadArb], { numRuns: 150 })('every result names its entry\'s clause and reports only values its entry declares, numbers with a unit', (r, ld) => {
    const v = checkGirder(sectionOf(r, ld.L), effectsOf(ld.L, ld.w, ld.P, ld.sag), defaultOptions(ld.L));
    for (const c of v.checks) {
      const spec = checkSpec(c.id);
      expect([spec.clause, ...(spec.alsoClauses ?? [])]).toContain(c.clause);
      for (const [k, val] of Object.entries(c.values)) {
        const unit = spec.values[k];
        expect(unit, `${c.id}.${k} declared`).toBeDefined();
        expect(unit === 'text', `${c.id}.${k}: ${typeof val} reported as ${unit}`).toBe(typeof val !== 'number');
      }
    }
  });

  // a change of one input, the rest held
  const changes: Record<Exclude<CheckInput, 'web'>, (s: Section, e: Effects, k: number) => [Section, Effects]> = {
    flanges: (s, e, k) => [{ ...s, top: { b: s.top.b + 40 * k, t: s.top.t + 5 }, bot: { b: s.bot.b + 30 * k, t: s.bot.t + 10 } }, e],
    // the layout of panels: spacing, end post, and load-bearing stiffeners under the forces or not
    panels: (s, e, k) => {
      const L = e.stations[e.stations.length - 1]!.x;
      return [
        {
          ...s,
          stiffeners: s.stiffeners ? { ...s.stiffeners, a: s.stiffeners.a * (0.6 + 0.1 * k) } : null,
          endPost: s.endPost === 'rigid' ? 'non-rigid' : 'rigid',
          loadStiffeners: s.loadStiffeners ? null : { bs: 150, ts: 15, xs: [L / 2] },
        },
        e,
      ];
    },
    flats: (s, e, k) => [{ ...s, stiffeners: s.stiffeners ? { ...s.stiffeners, bs: 60 + 20 * k, ts: 8 + 2 * k, sides: k % 2 === 0 ? 1 : 2 } : null }, e],
    restraintFlats: (s, e, k) => {
      const L = e.stations[e.stations.length - 1]!.x;
      return [{ ...s, restraintStiffeners: s.restraintStiffeners ? (k === 0 ? null : { bs: 80 + 40 * k, ts: 8 + 3 * k, xs: [L / 4, (3 * L) / 4].slice(0, k) }) : { bs: 120, ts: 12, xs: [L / 4] } }, e];
    },
    loadFlats: (s, e, k) => [s.loadStiffeners ? { ...s, loadStiffeners: { ...s.loadStiffeners, bs: 60 + 50 * k, ts: 8 + 4 * k } } : s, e],
    bearing: (s, e, k) => [{ ...s, bearing: { bs: 80 + 20 * k, ts: 10 + 2 * k, e: s.bearing!.e * (0.5 + 0.2 * k) } }, e],
    loads: (s, e, k) => {
      const L = e.stations[e.stations.length - 1]!.x;
      return [s, effectsOf(L, 10 + 25 * k, k % 2 === 0 ? 0 : 5e5, k !== 2)];
    },
  };

  for (const [input, change] of Object.entries(changes)) {
    test.prop([sectionArb, loadArb, fc.integer({ min: 0, max: 3 })], { numRuns: 120 })(
      `a check whose entry does not read ${input} gives the same result when only ${input} change`,
      (r, ld, k) => {
        const o = defaultOptions(ld.L, { restraint: { kind: 'at', at: [0, ld.L / 4, ld.L] }, restraintBottom: { kind: 'at', at: [0, ld.L / 4, ld.L] } });
        const s = sectionOf(r, ld.L);
        const e = effectsOf(ld.L, ld.w, ld.P, ld.sag);
        const [s2, e2] = change(s, e, k);
        const before = byId(checkGirder(s, e, o).checks);
        const after = byId(checkGirder(s2, e2, o).checks);
        for (const c of SPECS) {
          if (c.reads.includes(input as CheckInput)) continue;
          expect(after.get(c.id), `${c.id} does not read ${input}`).toEqual(before.get(c.id));
        }
      },
    );
  }

  test.prop([sectionArb, loadArb, fc.integer({ min: 0, max: 3 })], { numRuns: 200 })(
    'a failure failsWebOnly calls web-only still fails with other flanges, bearing stiffeners and loads',
    (r, ld, k) => {
      const o = defaultOptions(ld.L);
      const s = { ...sectionOf(r, ld.L), stiffeners: r.a === null ? null : { a: r.a, bs: 160, ts: 8, sides: 2 as const } };
      const e = effectsOf(ld.L, ld.w, ld.P, ld.sag);
      const webOnly = checkGirder(s, e, o).checks.filter(failsWebOnly);
      if (webOnly.length === 0) return;
      let [s2, e2] = changes.flanges(s, e, k);
      [s2, e2] = changes.bearing(s2, e2, k);
      [s2, e2] = changes.loads(s2, e2, k);
      const after = byId(checkGirder(s2, e2, o).checks);
      for (const c of webOnly) expect(after.get(c.id)!.passes, c.id).toBe(false);
    },
  );
});
