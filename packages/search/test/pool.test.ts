import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { fc } from '@fast-check/vitest';
import { FLAT_BARS } from '@platesmith/catalogue';
import { defaultOptions } from '@platesmith/checks';
import { analyse } from '@platesmith/actions';
import { DEFAULT_COST, defaultSpace, problemOf, search, stiffenerStations, webConfigs, type Evaluated, type SearchTask, type SpaceSpec } from '../src/index.js';
import { WebTable, webPlateCounts } from '../src/space.js';
import { createSearchPool, searchOnPool, type SearchPool } from '../src/pool.js';
import { createSharedStairs, SharedStairs } from '../src/shared-bound.js';

/**
 * The parallel search: two slices on two workers sharing a staircase must give exactly the
 * answer of the single-threaded search (which the exactness property ties to brute force), and the
 * shared staircase must never claim a value better than one offered.
 */
function frontKey(f: Evaluated[]) {
  return f.map((e) => ({ depth: e.depth, value: e.value, key: e.key }));
}

let pool: SearchPool;
beforeAll(() => {
  pool = createSearchPool({ threads: 2 });
});
afterAll(async () => {
  await pool.close();
});

describe('searchOnPool = search', () => {
  const arb = fc.record({
    hw: fc.subarray([700, 900, 1100, 1300, 1500], { minLength: 2, maxLength: 4 }),
    tw: fc.subarray([8, 10, 12, 15], { minLength: 1, maxLength: 3 }),
    symmetric: fc.boolean(),
    q: fc.double({ min: 10, max: 40, noNaN: true }),
    P: fc.constantFrom(0, 200),
    objective: fc.constantFrom('mass', 'cost') as fc.Arbitrary<'mass' | 'cost'>,
  });
  const samples = fc.sample(arb, { numRuns: 6 });
  test.each(samples.map((s, i) => [i, s] as const))('space %i', async (_, s) => {
    const spans = [12000];
    const space: SpaceSpec = {
      hw: s.hw,
      tw: s.tw,
      bf: [200, 300, 400],
      tf: [12, 20, 30],
      symmetric: s.symmetric,
      panels: [0, 3, 6],
      flats: [...FLAT_BARS].slice(0, 2),
      sides: [1, 2],
      endPosts: ['rigid', 'non-rigid'],
      webGrades: ['S355'],
      flangeGrades: ['S355'],
      minDepth: 0,
      maxDepth: Infinity,
      rules: {},
    };
    const analysis = analyse({
      spans,
      actions: [
        { kind: 'permanent', load: 'udl', value: 8 },
        { kind: 'variable', load: 'udl', value: s.q, category: 'B' },
        ...(s.P > 0 ? [{ kind: 'variable' as const, load: 'point' as const, value: s.P * 1e3, at: 5000, ss: 150, category: 'E' }] : []),
      ],
      combination: '6.10',
      extraStations: stiffenerStations(spans, space.panels),
    });
    const task: SearchTask = { space, options: defaultOptions(12000, { restraint: { kind: 'at', at: [0, 4000, 8000, 12000] } }), analysis, objective: s.objective, cost: DEFAULT_COST };
    const one = search(problemOf(task));
    const par = await searchOnPool(pool, task);
    expect(par.stats.workers).toBe(2);
    expect(one.pareto.length).toBeGreaterThan(0); // the spaces are drawn so that something passes: an empty front would prove nothing
    expect(frontKey(par.pareto)).toEqual(frontKey(one.pareto));
  });
});

describe('shared staircase', () => {
  test('holds, per depth, at least the least value offered at that depth or shallower', () => {
    fc.assert(
      fc.property(fc.array(fc.record({ d: fc.integer({ min: 0, max: 9 }), v: fc.double({ min: 0, max: 1e6, noNaN: true }) }), { maxLength: 30 }), (offers) => {
        const depths = [1000, 1010, 1020, 1030, 1040, 1050, 1060, 1070, 1080, 1090];
        const st = new SharedStairs(createSharedStairs(depths));
        for (const o of offers) st.offer(depths[o.d]!, o.v);
        for (const [i, d] of depths.entries()) {
          const best = Math.min(Infinity, ...offers.filter((o) => o.d <= i).map((o) => o.v));
          const got = st.bestAt(d);
          // never below what was offered (pruning stays sound), and within rounding of it
          expect(got).toBeGreaterThanOrEqual(best);
          if (best < Infinity) expect(got - best).toBeLessThanOrEqual(0.0021);
          // between grid depths: the deeper neighbour's bound is not used
          expect(st.bestAt(d + 5)).toBe(got);
        }
        expect(st.bestAt(999)).toBe(Infinity);
      }),
    );
  });
});

test('WebTable gives webConfigs at every index, and its plate starts are where the plate changes (consistency property)', () => {
  fc.assert(
    fc.property(fc.subarray([6, 8, 10, 12, 15, 20], { minLength: 1 }), fc.boolean(), fc.subarray([0, 2, 4, 8], { minLength: 1 }), fc.subarray([1, 2] as const, { minLength: 1 }), fc.subarray(['rigid', 'non-rigid'] as const, { minLength: 1 }), (tw, atLeastWeb, panels, sides, endPosts) => {
      const sp: SpaceSpec = { ...defaultSpace(), hw: [800, 1200, 1250], tw, panels, sides: [...sides], endPosts: [...endPosts], flats: [...FLAT_BARS].slice(0, 7), rules: { stiffenerAtLeastWeb: atLeastWeb } };
      const list = webConfigs(sp, 'product');
      const table = new WebTable(sp, 'product');
      expect(table.length).toBe(list.length);
      for (let i = 0; i < list.length; i++) expect(table.at(i)).toEqual(list[i]);
      const starts = list.flatMap((w, i) => (i === 0 || w.hw !== list[i - 1]!.hw || w.tw !== list[i - 1]!.tw ? [i] : []));
      expect([...table.plateStarts]).toEqual([...starts, list.length]);
      expect(() => table.at(list.length)).toThrow(RangeError);
    }),
    { numRuns: 60 },
  );
});

test('webPlateCounts counts the web configurations of each plate as webConfigs lists them', () => {
  fc.assert(
    fc.property(fc.subarray([6, 8, 10, 12, 15, 20], { minLength: 1 }), fc.boolean(), fc.subarray([0, 2, 4, 8], { minLength: 1 }), fc.subarray([1, 2] as const, { minLength: 1 }), (tw, atLeastWeb, panels, sides) => {
      const sp: SpaceSpec = { ...defaultSpace(), hw: [800, 1200], tw, panels, sides: [...sides], flats: [...FLAT_BARS].slice(0, 5), rules: { stiffenerAtLeastWeb: atLeastWeb } };
      const webs = webConfigs(sp, 'product');
      const runs: number[] = [];
      let last = '';
      for (const w of webs) {
        const k = `${w.grade}|${w.hw}|${w.tw}`;
        if (k !== last) runs.push(0);
        last = k;
        runs[runs.length - 1]!++;
      }
      expect(webPlateCounts(sp, 'product').filter((c) => c > 0)).toEqual(runs);
    }),
  );
});
