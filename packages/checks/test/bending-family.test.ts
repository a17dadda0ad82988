// Contract and regression tests of bendingChecks (no external values).
import { describe, expect, test } from 'vitest';
import { bendingChecks } from '../src/en1993-1-1/bending-family.js';
import { wagnerZj, momentFactors, ltbUtilisation } from '../src/en1993-1-1/ltb.js';
import { bendingForSign } from '../src/en1993-1-1/bending.js';
import { prepare } from '../src/context.js';
import { defaultOptions } from '../src/options.js';
import type { Effects, Section } from '../src/types.js';

const s: Section = { hw: 1800, tw: 10, top: { b: 400, t: 25 }, bot: { b: 400, t: 25 }, stiffeners: null, endPost: 'rigid', grade: { web: 'S355', top: 'S355', bot: 'S355', stiffener: 'S355' } };
const L = 20000;
const udl = (w: number): Effects => ({
  stations: Array.from({ length: 41 }, (_, i) => {
    const x = (i * L) / 40;
    return { x, MEd: (w * x * (L - x)) / 2, VEd: w * (L / 2 - x) };
  }),
  forces: [],
  reactions: [],
  sls: [],
});

describe('bendingChecks contract', () => {
  test('one result per id, in order; not-applicable checks say why', () => {
    const r = bendingChecks(prepare(s, defaultOptions(L, { restraint: { kind: 'continuous' } })), udl(60));
    expect(r.map((c) => c.id)).toEqual(['classification', 'bending', 'flange-induced-buckling', 'patch-loading', 'patch-bending', 'lateral-torsional-buckling', 'deflection', 'restraint-stiffener', 'web-flange-weld']);
    for (const c of r.filter((q) => !q.applies)) expect(c.reason).toBeTruthy();
    expect(r.find((c) => c.id === 'lateral-torsional-buckling')!.applies).toBe(false);
    // the library's default restraint is at the supports only (issue 17): the check applies
    expect(bendingChecks(prepare(s, defaultOptions(L)), udl(60)).find((c) => c.id === 'lateral-torsional-buckling')!.applies).toBe(true);
    const cls = r[0]!;
    expect(cls).toMatchObject({ utilisation: 0, passes: true, applies: true });
    expect(cls.values.sectionClass).toBe(4);
  });
  test('LTB with restraints at third points: the middle segment under near-uniform moment governs', () => {
    const ctx = prepare(s, defaultOptions(L, { restraint: { kind: 'at', at: [L / 3, (2 * L) / 3] } }));
    const ltb = bendingChecks(ctx, udl(60)).find((c) => c.id === 'lateral-torsional-buckling')!;
    expect(ltb.applies).toBe(true);
    expect(ltb.values.x0).toBeCloseTo(L / 3, 6);
    expect(ltb.values.momentShape).toBe('transverse-with-end-moments');
  });
  test('a failing section is a result, not an exception', () => {
    const r = bendingChecks(prepare(s, defaultOptions(L)), udl(600));
    const b = r.find((c) => c.id === 'bending')!;
    expect(b.passes).toBe(false);
    expect(b.utilisation).toBeGreaterThan(1);
  });
});

describe('LTB helpers (regression)', () => {
  test('zj = 0 for a doubly symmetric I; positive with the larger flange in compression, sign flips with the moment', () => {
    expect(Math.abs(wagnerZj(prepare(s, defaultOptions(L)), 'top'))).toBeLessThan(1e-9);
    const mono = prepare({ ...s, top: { b: 600, t: 30 }, bot: { b: 300, t: 20 } }, defaultOptions(L));
    const up = wagnerZj(mono, 'top');
    expect(up).toBeGreaterThan(0);
    expect(wagnerZj(mono, 'bot')).toBeLessThan(0);
    // ENV 1993-1-1 F.1.4 approximation 0.8(2βf − 1) hs/2 (from memory) should be of the same size
    const bf = mono.g.IzTop / (mono.g.IzTop + mono.g.IzBot);
    const approx = (0.8 * (2 * bf - 1) * mono.g.hs) / 2;
    expect(Math.abs(up / approx - 1)).toBeLessThan(0.25);
  });
  test('moment shapes: linear → end moments with ψ; parabola → UDL factors', () => {
    const lin = momentFactors([{ x: 0, M: 100 }, { x: 5, M: 25 }, { x: 10, M: -50 }]);
    expect(lin.shape).toBe('end-moments');
    expect(lin.psi).toBeCloseTo(-0.5, 12);
    const par = momentFactors(Array.from({ length: 21 }, (_, i) => ({ x: i, M: i * (20 - i) })));
    expect(par).toMatchObject({ shape: 'udl-simply-supported', C1: 1.127, C2: 0.454 });
    const tri = momentFactors(Array.from({ length: 21 }, (_, i) => ({ x: i, M: i <= 10 ? i : 20 - i })));
    expect(tri.shape).toBe('point-load-simply-supported');
  });
});

describe('LTB: a utilisation that is not a number fails wherever it appears', () => {
  // safety property (common practice, no source: a computation that gives no number must not pass)
  const s: Section = { hw: 1000, tw: 10, top: { b: 300, t: 20 }, bot: { b: 300, t: 20 }, stiffeners: null, endPost: 'rigid', grade: { web: 'S355', top: 'S355', bot: 'S355', stiffener: 'S355' } };
  const L = 12000;
  const o = defaultOptions(L, { restraint: { kind: 'at', at: [0, 4000, 12000] } });
  const xs = Float64Array.from([0, 2000, 4000, 6000, 8000, 10000, 12000]);
  const sag = Float64Array.from([0, 0.6e8, 1e8, 1.1e8, 1e8, 0.6e8, 0]);
  const hog = new Float64Array(xs.length);
  // at the restraint (x = 4000): the second segment's governing moment is not a number, the first's is;
  // at x = 2000 or 8000: a moment inside a segment that would not govern it
  for (const at of [2, 1, 4]) {
    test(`a moment that is not a number at x = ${xs[at]} fails the check (segments that pass elsewhere)`, () => {
      const ctx = prepare(s, o);
      const bad = sag.slice();
      bad[at] = Number.NaN;
      const clean = ltbUtilisation(ctx, { xs, sag, hog }, (side) => bendingForSign(ctx, side));
      expect(clean).toBeGreaterThan(0);
      expect(clean).toBeLessThan(1);
      const u = ltbUtilisation(ctx, { xs, sag: bad, hog }, (side) => bendingForSign(ctx, side));
      expect(u <= 1).toBe(false);
    });
  }
});
