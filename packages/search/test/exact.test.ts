import { describe, expect, it } from 'vitest';
import { fc, test } from '@fast-check/vitest';
import { FLAT_BARS } from '@platesmith/catalogue';
import { defaultOptions } from '@platesmith/checks';
import { analyse } from '@platesmith/actions';
import { analysisLoadModel, bruteForce, DEFAULT_COST, mergeSlices, prepareSearch, search, searchSlice, spaceSize, stiffenerStations, type Evaluated, type SpaceSpec } from '../src/index.js';
import { simpleSpanModel } from './fixtures.js';
import { rulesArb, SMALL_LISTS, spaceArb as spaceOver, spaceOf } from './spaces.js';

/**
 * Exactness: on randomly drawn small spaces the search returns the same Pareto set (depth, value,
 * section) as exhaustive enumeration with the same check library and objective. This is the
 * property the product stands on; no tolerance. Every space comes from the one builder
 * (spaces.ts): plate lists, fabrication rules, hybrid web/flange grades, least and greatest depth.
 */
const spaceArb = spaceOver(SMALL_LISTS);

const problemArb = fc.record({
  space: spaceArb,
  L: fc.constantFrom(8000, 12000, 16000),
  q: fc.double({ min: 10, max: 80, noNaN: true }),
  // 1.2 MN: a force patch loading often rules out, so that load-bearing stiffeners decide
  P: fc.constantFrom(0, 150e3, 400e3, 1.2e6),
  objective: fc.constantFrom('mass', 'mass', 'cost') as fc.Arbitrary<'mass' | 'cost'>,
  restrained: fc.boolean(),
});

function frontKey(f: Evaluated[]) {
  return f.map((e) => ({ depth: e.depth, value: e.value, key: e.key }));
}

describe('search = brute force', () => {
  test.prop([problemArb], { numRuns: 200 })('Pareto set and optimum equal exhaustive enumeration', ({ space, L, q, P, objective, restrained }) => {
    const sp = spaceOf(space);
    const options = defaultOptions(L, restrained ? { restraint: { kind: 'continuous' } } : { restraint: { kind: 'at', at: [0, L / 2, L] } });
    const problem = { space: sp, options, load: simpleSpanModel(L, q, P, q / 1.4), objective, cost: DEFAULT_COST };
    const fast = search(problem);
    const brute = bruteForce(problem);
    expect(frontKey(fast.pareto)).toEqual(frontKey(brute.front));
    expect(fast.lightest?.value ?? null).toEqual(brute.front.at(-1)?.value ?? null);
    expect(fast.stats.fullEvaluations).toBeLessThanOrEqual(brute.evaluations);
    // every candidate of the space is accounted for once: judged in full, or pruned for one reason
    const pruned = Object.values(fast.stats.pruned).reduce((a, b) => a + b, 0);
    expect(pruned + fast.stats.fullEvaluations).toBe(fast.stats.spaceSize);
  });
});

describe('search = brute force when the bearing stiffeners come from plate or in several pairs', () => {
  // a stock of one or two small flats and a few plate thicknesses, under reactions that crush a pair of the flats:
  // the sizing's second stage (plates, 1-3 pairs) decides, and the search's bearing floor (bearingCandidates) prunes
  const arb = fc.record({
    problem: problemArb,
    flats: fc.subarray([{ b: 80, t: 8 }, { b: 100, t: 10 }], { minLength: 1 }),
    // 45 mm: above the cost model's thickAbove (40), so the bearing plates' own rate is exercised under the cost objective
    plates: fc.subarray([8, 10, 12, 15, 20, 25, 45], { minLength: 1, maxLength: 3 }),
    heavy: fc.double({ min: 60, max: 160, noNaN: true }),
  });
  let beyondFlats = 0;
  test.prop([arb], { numRuns: 60 })('Pareto set and optimum equal exhaustive enumeration', ({ problem: { space, L, P, objective, restrained }, flats, plates, heavy }) => {
    const sp = spaceOf(space);
    const options = defaultOptions(L, { bearingFlats: flats, bearingPlates: plates, ...(restrained ? { restraint: { kind: 'continuous' as const } } : { restraint: { kind: 'at' as const, at: [0, L / 2, L] } }) });
    const problem = { space: sp, options, load: simpleSpanModel(L, heavy, P, heavy / 1.4), objective, cost: DEFAULT_COST };
    const fast = search(problem);
    const brute = bruteForce(problem);
    expect(frontKey(fast.pareto)).toEqual(frontKey(brute.front));
    const pruned = Object.values(fast.stats.pruned).reduce((a, b) => a + b, 0);
    expect(pruned + fast.stats.fullEvaluations).toBe(fast.stats.spaceSize);
    for (const e of fast.pareto) if ((e.section.bearing?.pairs ?? 1) > 1 || !flats.some((f) => f.b === e.section.bearing?.bs && f.t === e.section.bearing?.ts)) beyondFlats++;
  });
  test('some answers above stood on bearing stiffeners beyond one pair of the flats', () => {
    expect(beyondFlats).toBeGreaterThan(3);
  });
});

describe('a search shared out over workers (SlicePart)', () => {
  // consistency property: the parts divide the space (sizes add up) and their merged fronts are the whole search's
  test.prop([problemArb, fc.integer({ min: 2, max: 4 })], { numRuns: 60 })('the merged parts give the same answer as one search', ({ space, L, q, P, objective, restrained }, of) => {
    const sp = spaceOf(space);
    const options = defaultOptions(L, restrained ? { restraint: { kind: 'continuous' } } : { restraint: { kind: 'at', at: [0, L / 2, L] } });
    const problem = { space: sp, options, load: simpleSpanModel(L, q, P, q / 1.4), objective, cost: DEFAULT_COST };
    const one = search(problem);
    const prep = prepareSearch(problem);
    const parts = Array.from({ length: of }, (_, slot) => searchSlice(prep, [[0, prep.webs.length]], undefined, undefined, { slot, of }));
    // the parts divide the slice's candidates (those the fabrication rules leave) between them
    expect(parts.reduce((n, r) => n + r.spaceSize, 0)).toBe(searchSlice(prep, [[0, prep.webs.length]]).spaceSize);
    const merged = mergeSlices(parts, 0, of, prep.webs.length, spaceSize(sp));
    expect(frontKey(merged.pareto)).toEqual(frontKey(one.pareto));
    // the rules' share is decided run by run and plate by plate, however the runs are dealt
    expect(merged.stats.pruned.rules).toBe(one.stats.pruned.rules);
    const counted = Object.values(merged.stats.pruned).reduce((a, b) => a + b, 0) + merged.stats.fullEvaluations;
    expect(counted).toBe(spaceSize(sp));
  });
});

describe('search = brute force, with loads analysed by the actions package (point loads, continuous spans)', () => {
  const arb = fc.record({
    space: spaceArb,
    spans: fc.constantFrom([10000], [14000], [9000, 12000]).map((s) => [...s]),
    g: fc.double({ min: 5, max: 30, noNaN: true }),
    q: fc.double({ min: 5, max: 40, noNaN: true }),
    P: fc.constantFrom(0, 150, 400, 1500),
    objective: fc.constantFrom('mass', 'mass', 'cost') as fc.Arbitrary<'mass' | 'cost'>,
  });
  test.prop([arb], { numRuns: 60 })('Pareto set and optimum equal exhaustive enumeration', ({ space, spans, g, q, P, objective }) => {
    const L = spans.reduce((a, b) => a + b, 0);
    const a = analyse({
      spans,
      actions: [
        { kind: 'permanent', load: 'udl', value: g },
        { kind: 'variable', load: 'udl', value: q, category: 'B' },
        ...(P > 0 ? [{ kind: 'variable' as const, load: 'point' as const, value: P * 1e3, at: spans[0]! / 2, ss: 150, category: 'E' }] : []),
      ],
      combination: '6.10',
      extraStations: stiffenerStations(spans, space.panels),
    });
    const sp = spaceOf(space);
    const supports = [0, ...spans.map((_, i) => spans.slice(0, i + 1).reduce((s, x) => s + x, 0))];
    const options = defaultOptions(L, { supports, restraint: { kind: 'at', at: [0, L / 2, L] } });
    const problem = { space: sp, options, load: analysisLoadModel(a), objective, cost: DEFAULT_COST };
    const fast = search(problem);
    const brute = bruteForce(problem);
    expect(frontKey(fast.pareto)).toEqual(frontKey(brute.front));
  });
});

describe('search = brute force on mono-symmetric spaces with many flange widths', () => {
  // rows of 5-7 columns: the LTB set bound of a row covers its first 4 columns, then the next 8
  // (ROW_STRETCH); the spaces above have at most 3 widths, so a row never needs a second stretch.
  // Checked by mutation: declaring every second stretch dead unbounded, or leaving the widest
  // member of each stretch out of its bound, each fails this test (300 runs; 100 caught only the latter)
  const arb = fc.record({
    space: spaceOver({
      hw: [600, 800, 1000, 1200],
      tw: [6, 8, 10, 12],
      bf: [150, 175, 200, 225, 250, 300, 350, 400, 450],
      bfCount: [5, 7],
      tf: [10, 12, 15, 20, 25],
      panels: [0, 2, 4],
      max: 2,
      symmetric: false,
      flats: [...FLAT_BARS].slice(0, 2),
      sides: [2],
      endPosts: ['rigid'],
      webGradeCount: 1,
      flangeGradeCount: 1,
      // rules off on two draws in three: the rows keep the 5-7 columns the stretches need above
      rules: fc.oneof({ arbitrary: fc.constant({}), weight: 2 }, { arbitrary: rulesArb, weight: 1 }),
      // today's layouts: this test is about the LTB set bound's row stretches (the tests above draw
      // the load-bearing and restraint stiffeners); see the known failure below for why it is held here
      loadStiffeners: [null],
      restraintStiffener: null,
    }),
    span: fc.constantFrom(9000, 12000, 15000, 20000),
    restraints: fc.constantFrom(1, 2, 3, 4, 6),
    g: fc.double({ min: 5, max: 20, noNaN: true }),
    q: fc.double({ min: 5, max: 30, noNaN: true }),
    P: fc.constantFrom(0, 100, 250, 500),
  });
  test.prop([arb], { numRuns: 300 })('Pareto set and optimum equal exhaustive enumeration', ({ space, span, restraints, g, q, P }) => {
    const a = analyse({
      spans: [span],
      actions: [
        { kind: 'permanent', load: 'udl', value: g },
        { kind: 'variable', load: 'udl', value: q, category: 'B' },
        ...(P > 0 ? [{ kind: 'variable' as const, load: 'point' as const, value: P * 1e3, at: span / 3, ss: 150, category: 'E' }] : []),
      ],
      combination: '6.10',
      extraStations: stiffenerStations([span], space.panels),
    });
    const sp = spaceOf(space);
    const at = Array.from({ length: restraints + 1 }, (_, i) => (i * span) / restraints);
    const options = defaultOptions(span, { supports: [0, span], restraint: { kind: 'at', at } });
    const problem = { space: sp, options, load: analysisLoadModel(a), objective: 'mass' as const, cost: DEFAULT_COST };
    const fast = search(problem);
    const brute = bruteForce(problem);
    expect(frontKey(fast.pareto)).toEqual(frontKey(brute.front));
    const pruned = Object.values(fast.stats.pruned).reduce((s, x) => s + x, 0);
    expect(pruned + fast.stats.fullEvaluations).toBe(fast.stats.spaceSize);
    // a time-out, not a speed target: 300 brute-force enumerations take ~30 s alone and passed 60 s on the shared 2-core host
  }, 180_000);
});

describe('fabrication rules that leave nothing to search', () => {
  // regression: the search used to throw (a self-weight of Infinity from the lightest of no flanges)
  const problemWith = (rules: SpaceSpec['rules'], panels: number[]) => {
    const sp: SpaceSpec = {
      hw: [900], tw: [12], bf: [300], tf: [40], symmetric: false, panels, flats: [...FLAT_BARS].slice(0, 1),
      sides: [2], endPosts: ['rigid'], webGrades: ['S355'], flangeGrades: ['S355'], minDepth: 0, maxDepth: Infinity, rules,
    };
    return { space: sp, options: defaultOptions(10000), load: simpleSpanModel(10000, 20, 0, 14), objective: 'mass' as const, cost: DEFAULT_COST };
  };
  it.for([
    ['bf/tf leaves no flange option (300/40 = 7.5 < 8)', { bfOverTfMin: 8 }, [0]],
    ['flats thinner than the web leave no stiffened layout', { stiffenerAtLeastWeb: true }, [2]],
  ] as const)('%s: an empty answer, every candidate pruned by the rules', ([, rules, panels]) => {
    const problem = problemWith(rules, [...panels]);
    expect(bruteForce(problem).front).toEqual([]);
    const r = search(problem);
    expect(r.pareto).toEqual([]);
    expect(r.stats.pruned.rules).toBe(spaceSize(problem.space));
    expect(r.stats.fullEvaluations).toBe(0);
  });
});
