import { describe, expect } from 'vitest';
import { beamAnalysis } from './fixtures.js';
import { fc, test } from '@fast-check/vitest';
import { analyse, designEffects } from '@platesmith/actions';
import { defaultOptions, girderSelfWeight } from '@platesmith/checks';
import { analysisLoadModel, analysisReactionFloor, DEFAULT_COST, prepareSearch, selfWeightRange, webConfigs } from '../src/index.js';
import { buildSection, webParts } from '../src/objective.js';
import { SMALL_LISTS, spaceArb, spaceOf } from './spaces.js';

/**
 * The bounds the search reads over a range of self-weights, now that every candidate is judged
 * with its own (issue 17, item 5). No published source: each property ties a bound to the value it
 * bounds (every section beyond it fails, or every candidate's own value lies within it).
 */

const beamArb = fc.record({
  // unequal spans: an inner support can lift off under a pattern of the variable load
  spans: fc.constantFrom([12000], [9000, 15000], [4000, 16000], [5000, 18000, 5000]).map((s) => [...s]),
  g: fc.double({ min: 0, max: 30, noNaN: true }),
  q: fc.double({ min: 2, max: 60, noNaN: true }),
  P: fc.constantFrom(0, 150, 600),
  combination: fc.constantFrom('6.10', '6.10ab') as fc.Arbitrary<'6.10' | '6.10ab'>,
  gLo: fc.double({ min: 0, max: 40, noNaN: true }),
  width: fc.double({ min: 0, max: 10, noNaN: true }),
  at: fc.array(fc.double({ min: 0, max: 1, noNaN: true }), { minLength: 1, maxLength: 6 }),
});


const maxReaction = (a: ReturnType<typeof beamAnalysis>, g: number) => Math.max(0, ...designEffects(a, g).reactions.map((r) => Math.abs(r.R)));

describe('the least support reaction over a range of self-weights (bearing-stiffener floor)', () => {
  test.prop([beamArb], { numRuns: 150 })('never above max |R| of the design effects at any self-weight of the range, ends included', (b) => {
    const a = beamAnalysis(b, 1 / 2);
    const gHi = b.gLo + b.width;
    const floor = analysisReactionFloor(a, b.gLo, gHi);
    expect(floor).toBeGreaterThanOrEqual(0);
    for (const t of [0, 1, ...b.at]) expect(maxReaction(a, b.gLo + t * (gHi - b.gLo))).toBeGreaterThanOrEqual(floor);
  });

  test.prop([beamArb], { numRuns: 60 })('over a range of one self-weight it is max |R| itself (the bound is tight where the range is)', (b) => {
    const a = beamAnalysis(b, 1 / 2);
    expect(analysisReactionFloor(a, b.gLo, b.gLo)).toBe(maxReaction(a, b.gLo));
  });
});

describe('every candidate of a set of plates has its own self-weight within selfWeightRange', () => {
  // point loads (none, one, two in a span) so that layouts with load-bearing stiffeners have their pairs
  test.prop([spaceArb(SMALL_LISTS), fc.constantFrom([10000], [8000, 12000], [6000, 9000, 6000]).map((s) => [...s]), fc.constantFrom(0, 1, 2)], { numRuns: 40 })('girderSelfWeight (what check adds) of every layout lies in [lo, hi]; the bare plates at lo within the margin', (d, spans, nP) => {
    const space = spaceOf(d);
    const supports = [0, ...spans.map((_, i) => spans.slice(0, i + 1).reduce((x, y) => x + y, 0))];
    const points = Array.from({ length: nP }, (_, i) => ({ kind: 'permanent' as const, load: 'point' as const, value: 500e3, at: (spans[0]! * (i + 1)) / (nP + 1), ss: 150 }));
    const analysis = analyse({ spans, actions: [{ kind: 'permanent', load: 'udl', value: 10 }, ...points], combination: '6.10' });
    const options = defaultOptions(supports[supports.length - 1]!, { supports });
    const prep = prepareSearch({ space, options, load: analysisLoadModel(analysis), objective: 'mass', cost: DEFAULT_COST });
    for (const w of webConfigs(space, prep.fySource)) {
      const parts = webParts(w, prep.L, supports, prep.Lmax, analysis.forces.map((f) => f.x));
      for (const T of prep.flanges.slice(0, 3)) {
        for (const B of prep.flanges.slice(-2)) {
          const [lo, hi] = selfWeightRange(prep, w, T, B);
          const g = girderSelfWeight(buildSection(w, parts, T, B), supports);
          expect(g).toBeGreaterThanOrEqual(lo);
          expect(g).toBeLessThanOrEqual(hi);
          if (parts.stiffMass === 0) expect(g / lo - 1).toBeLessThan(2e-12);
        }
      }
    }
  });
});
