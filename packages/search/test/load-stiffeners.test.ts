import { describe, expect } from 'vitest';
import { fc, test } from '@fast-check/vitest';
import { FLAT_BARS, STEEL_KG_PER_MM3 } from '@platesmith/catalogue';
import { analyse } from '@platesmith/actions';
import { checkGirder, defaultOptions, girderSelfWeight } from '@platesmith/checks';
import { analysisLoadModel, bruteForce, DEFAULT_COST, prepareSearch, search, stiffenerStations, type SpaceSpec } from '../src/index.js';
import { partOf } from '../src/slice/plate-tables.js';
import { patternOf } from '../src/slice/slicing.js';
import { createSliceState, type Plate } from '../src/slice/state.js';
import { SMALL_LISTS, spaceArb, spaceOf } from './spaces.js';

/**
 * Issue 17 item 4: load-bearing stiffeners under concentrated forces as a layout choice of the
 * search. The transfer girder is an invented scenario; the references are `check` (through brute
 * force over the same space) and the space's own layouts (for the layouts' least mass).
 */

/** A 12 m transfer girder carrying two columns at the third points: 1.3 MN permanent + 0.9 MN imposed each (design ≈ 3.1 MN by EN 1990 6.10). Invented. */
function transferProblem(loadStiffeners: SpaceSpec['loadStiffeners'], lists?: Partial<SpaceSpec>) {
  const L = 12000;
  const space: SpaceSpec = {
    hw: [1000, 1200, 1400, 1600],
    tw: [10, 12, 15, 20],
    bf: [300, 400, 500, 600, 700],
    tf: [20, 25, 30, 40, 50, 60, 70, 80],
    symmetric: true,
    panels: [0, 3, 6],
    flats: [...FLAT_BARS].slice(4, 9),
    sides: [2],
    loadStiffeners,
    endPosts: ['rigid', 'non-rigid'],
    webGrades: ['S355'],
    flangeGrades: ['S355'],
    minDepth: 0,
    maxDepth: Infinity,
    rules: {},
    ...lists,
  };
  const a = analyse({
    spans: [L],
    actions: [
      { kind: 'permanent', load: 'udl', value: 20 },
      { kind: 'permanent', load: 'point', value: 1.3e6, at: 4000, ss: 300 },
      { kind: 'permanent', load: 'point', value: 1.3e6, at: 8000, ss: 300 },
      { kind: 'variable', load: 'point', value: 0.9e6, at: 4000, ss: 300, category: 'B' },
      { kind: 'variable', load: 'point', value: 0.9e6, at: 8000, ss: 300, category: 'B' },
    ],
    combination: '6.10',
    extraStations: stiffenerStations([L], space.panels),
  });
  // the columns hold the top flange laterally where they stand (common practice, no source)
  const options = defaultOptions(L, { restraint: { kind: 'at', at: [0, 4000, 8000, L] } });
  return { space, options, load: analysisLoadModel(a), objective: 'mass' as const, cost: DEFAULT_COST };
}

describe('a transfer girder under two ~3 MN column loads (invented scenario)', () => {
  const offered = [null, { b: 200, t: 20 }, { b: 250, t: 25 }, { b: 250, t: 30 }];
  test('with load-bearing stiffeners on offer the lightest section has them and is lighter than the lightest without', () => {
    const without = search(transferProblem([null]));
    const withPairs = search(transferProblem(offered));
    expect(without.lightest).not.toBeNull();
    expect(withPairs.lightest).not.toBeNull();
    const a = without.lightest!;
    const b = withPairs.lightest!;
    // each checked again by `check` with its own self-weight (the verdict the search must equal)
    for (const [p, e] of [
      [transferProblem([null]), a],
      [transferProblem(offered), b],
    ] as const) {
      const v = checkGirder(e.section, p.load.effects(girderSelfWeight(e.section, p.options.supports)), p.options);
      expect(v.passes).toBe(true);
    }
    expect(b.section.loadStiffeners).toBeTruthy();
    expect(b.section.loadStiffeners!.xs).toEqual([4000, 8000]);
    expect(b.mass).toBeLessThan(a.mass);
    // without stiffeners the forces need thick flanges (patch loading and the top welds)
    expect(Math.max(a.section.top.t, b.section.top.t)).toBe(a.section.top.t);
  });

  test('on a narrowed space of the same problem the search equals brute force, stiffened layouts included', () => {
    const narrow = { hw: [1200, 1400], tw: [12, 15], bf: [400, 500, 600], tf: [25, 40, 60], panels: [0, 3] };
    const p = transferProblem(offered, narrow);
    const fast = search(p);
    const brute = bruteForce(p);
    const key = (f: typeof brute.front) => f.map((e) => ({ depth: e.depth, value: e.value, key: e.key }));
    expect(key(fast.pareto)).toEqual(key(brute.front));
    expect(brute.front.some((e) => e.section.loadStiffeners)).toBe(true);
  });
});

describe('the layouts\' least stiffener kg per plate (a bound of the layout nodes and runs)', () => {
  // patternOf's least kg per end post, × hw × density, is never above any layout's own stiffener kg
  // (intermediate flats and load-bearing pairs, webPartsWith): a layout lighter than it would be lost
  test.prop([spaceArb(SMALL_LISTS), fc.constantFrom(0, 1, 2), fc.constantFrom(8000, 12000)], { numRuns: 60 })('min over a plate\'s layouts of stiffMass ≥ the bound', (d, nP, L) => {
    const space = spaceOf(d);
    const points = Array.from({ length: nP }, (_, i) => ({ kind: 'permanent' as const, load: 'point' as const, value: 400e3, at: (L * (i + 1)) / (nP + 1), ss: 150 }));
    const a = analyse({ spans: [L], actions: [{ kind: 'permanent', load: 'udl', value: 10 }, ...points], combination: '6.10' });
    const prep = prepareSearch({ space, options: defaultOptions(L), load: analysisLoadModel(a), objective: 'mass', cost: DEFAULT_COST });
    const plates: [number, number][] = [];
    for (let p = 0; p + 1 < prep.plateStarts.length; p++) plates.push([prep.plateStarts[p]!, prep.plateStarts[p + 1]! - prep.plateStarts[p]!]);
    if (plates.length === 0 || prep.flanges.length === 0) return; // as searchSlice: nothing to search
    const s = createSliceState(prep, plates, undefined, undefined, undefined);
    for (let p = 0; p + 1 < prep.plateStarts.length; p++) {
      const first = prep.plateStarts[p]!;
      const nL = prep.plateStarts[p + 1]! - first;
      const w = prep.webs.at(first);
      const pat = patternOf(s, first, nL, w.tw);
      const plate = { layouts: Int32Array.from({ length: nL }, (_, j) => first + j), parts: [] } as unknown as Plate;
      for (let j = 0; j < nL; j++) {
        const lw = prep.webs.at(first + j);
        const bound = (lw.endPost === 'rigid' ? pat.rigid : pat.nonRigid) * lw.hw * STEEL_KG_PER_MM3;
        expect(partOf(s, plate, j).stiffMass).toBeGreaterThanOrEqual(bound);
      }
    }
  });
});
