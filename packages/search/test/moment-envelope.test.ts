import { describe, expect } from 'vitest';
import { beamAnalysis } from './fixtures.js';
import { fc, test } from '@fast-check/vitest';
import { bendingForSign, checkGirder, defaultOptions, ltbUtilisation, momentEnvelopeOf, prepare, type Section } from '@platesmith/checks';
import { designEffects } from '@platesmith/actions';
import { analysisMomentEnvelope, momentEnvelopeFor } from '../src/index.js';

/**
 * Consistency properties (no published source: they tie the search's shortcut to the check library).
 * The search rejects plates that fail lateral-torsional buckling from a moment envelope built
 * straight from the analysis, before the other checks run. That is exact only if (1) the envelope
 * is bit for bit the one the check builds from designEffects' stations, and (2) ltbUtilisation is
 * the check's own utilisation.
 */
const beamArb = fc.record({
  spans: fc.constantFrom([10000], [20000], [9000, 12000], [16000, 20000, 16000]).map((s) => [...s]),
  g: fc.double({ min: 2, max: 30, noNaN: true }),
  q: fc.double({ min: 2, max: 40, noNaN: true }),
  P: fc.constantFrom(0, 150, 400),
  combination: fc.constantFrom('6.10', '6.10ab') as fc.Arbitrary<'6.10' | '6.10ab'>,
  selfWeight: fc.double({ min: 0, max: 40, noNaN: true }),
});


describe('moment envelope for lateral-torsional buckling', () => {
  test.prop([beamArb], { numRuns: 60 })('built from the analysis = built from the design effects, bit for bit', (b) => {
    const a = beamAnalysis(b);
    const ref = momentEnvelopeOf(designEffects(a, b.selfWeight).stations);
    expect(momentEnvelopeFor(a)(b.selfWeight)).toEqual(ref);
    expect(analysisMomentEnvelope(a, b.selfWeight)).toEqual(ref);
  });

  const sectionArb = fc.record({
    hw: fc.constantFrom(600, 900, 1200, 1600),
    tw: fc.constantFrom(8, 10, 12),
    bt: fc.constantFrom(200, 300, 450),
    tt: fc.constantFrom(12, 20, 30),
    bb: fc.constantFrom(200, 300, 450),
    tb: fc.constantFrom(12, 20, 30),
    restraint: fc.constantFrom(2, 4, 0),
    bottom: fc.boolean(),
    loadHeight: fc.constantFrom('top-flange', 'shear-centre', 'bottom-flange') as fc.Arbitrary<'top-flange' | 'shear-centre' | 'bottom-flange'>,
    method: fc.constantFrom('general', 'rolled-equivalent') as fc.Arbitrary<'general' | 'rolled-equivalent'>,
    modified: fc.boolean(),
  });
  test.prop([beamArb, sectionArb], { numRuns: 120 })('ltbUtilisation: exact = the utilisation of the lateral-torsional buckling check; the screen a lower bound', (b, s) => {
    const a = beamAnalysis(b);
    const L = b.spans.reduce((x, y) => x + y, 0);
    const supports = [0, ...b.spans.map((_, i) => b.spans.slice(0, i + 1).reduce((x, y) => x + y, 0))];
    const at = (n: number) => (n === 0 ? { kind: 'continuous' as const } : { kind: 'at' as const, at: Array.from({ length: n * b.spans.length + 1 }, (_, i) => (L * i) / (n * b.spans.length)) });
    const o = defaultOptions(L, {
      supports,
      restraint: at(s.restraint),
      ...(s.bottom ? { restraintBottom: at(2) } : {}),
      loadHeight: s.loadHeight,
      ltbMethod: s.method,
      ltbModification: s.modified,
    });
    const section: Section = { hw: s.hw, tw: s.tw, top: { b: s.bt, t: s.tt }, bot: { b: s.bb, t: s.tb }, stiffeners: null, endPost: 'rigid', grade: { web: 'S355', top: 'S355', bot: 'S355', stiffener: 'S355' } };
    const ref = checkGirder(section, designEffects(a, b.selfWeight), o).checks.find((c) => c.id === 'lateral-torsional-buckling')!;
    const ctx = prepare(section, o);
    const u = ltbUtilisation(ctx, momentEnvelopeFor(a)(b.selfWeight), (side) => bendingForSign(ctx, side), Infinity, true);
    expect(u).toBe(ref.applies ? ref.utilisation : 0);
    // the screen (first Ritz basis only) never exceeds the check's utilisation; with a threshold,
    // above it only when the check's utilisation is (the search's use: it rejects on it)
    const refU = ref.applies ? ref.utilisation : 0;
    const screen = ltbUtilisation(ctx, momentEnvelopeFor(a)(b.selfWeight), (side) => bendingForSign(ctx, side));
    expect(screen).toBeLessThanOrEqual(refU);
    const early = ltbUtilisation(ctx, momentEnvelopeFor(a)(b.selfWeight), (side) => bendingForSign(ctx, side), 1);
    if (early > 1) expect(refU).toBeGreaterThan(1);
    if (refU <= 1) expect(early).toBe(screen);
  });
});
