import { describe, expect, test } from 'vitest';
import { checkGirder, defaultOptions, vbfRd, type Effects, type Section } from '../src/index.js';

/**
 * Issue 17, item 7: EN 1993-1-5 5.4(1) Vbf,Rd = bf tf² fyf/(c γM1)·(1 − (MEd/Mf,Rd)²) is taken with
 * the largest MEd within the panel (the conservative reading used in practice; common practice,
 * no source), not with the MEd of the station, which is zero at a simple support.
 */
const s: Section = { hw: 1500, tw: 8, top: { b: 400, t: 25 }, bot: { b: 400, t: 25 }, stiffeners: { a: 2000, bs: 100, ts: 10, sides: 2 }, endPost: 'rigid', grade: { web: 'S355', top: 'S355', bot: 'S355', stiffener: 'S355' } };
const L = 16000;
const w = 60; // N/mm
const effects: Effects = {
  stations: Array.from({ length: 33 }, (_, i) => {
    const x = (L * i) / 32;
    return { x, MEd: (w * x * (L - x)) / 2, VEd: w * (L / 2 - x) };
  }),
  forces: [],
  reactions: [],
  sls: [],
};

describe('Vbf,Rd with the largest MEd in the panel', () => {
  const v = checkGirder(s, effects, defaultOptions(L, { restraint: { kind: 'continuous' } }));
  const sb = v.checks.find((c) => c.id === 'shear-buckling')!;
  test('the end panel governs at the support, where MEd = 0, and Vbf,Rd is taken at the panel\'s largest MEd (x = 2000)', () => {
    expect(sb.applies).toBe(true);
    expect(sb.at).toBe(0);
    const M2000 = (w * 2000 * (L - 2000)) / 2;
    expect(sb.values['MEdVbf']).toBe(M2000);
    // 5.4(1) by hand with the check's own c and Mf,Rd: the moment term reduces the contribution
    const bf = Math.min(400, 8 + 30 * Math.sqrt(235 / 345) * 25); // 15εtf each side, fy 345 for 25 mm
    const c = sb.values['c'] as number;
    const MfRd = sb.values['MfRd'] as number;
    expect(sb.values['VbfRd']).toBeCloseTo(vbfRd(bf, 25, 345, c, M2000, MfRd, 1), 6);
    expect(sb.values['VbfRd'] as number).toBeLessThan(vbfRd(bf, 25, 345, c, 0, MfRd, 1));
  });
});
