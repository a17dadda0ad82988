/**
 * Stiffeners at lateral restraints (issue 17 item 4), against a hand calculation by the
 * standard's equations (no published worked example of this case is at hand):
 * - EN 1993-1-1:2005 5.3.3(4): the local force a restraint takes from the compression flange,
 *   αm·NEd/100, αm = √(0.5 (1 + 1/m)) (eq. 5.12; m = 1: αm = 1), NEd = MEd/hs the flange force.
 * - The pair as a cantilever of length hw out of the web plane: M = Fr·hw ≤ W fy/γM0 (EN 1993-1-1
 *   6.2.5, elastic), W = I/(tw/2 + bs) of the flats with 15 ε tw of web each side (EN 1993-1-5
 *   9.1(2)); the flats' torsion EN 1993-1-5 9.2.1(8) eq. 9.3.
 * The girder and its load are invented; the library must agree with the hand figures to 1e-9.
 */
import { describe, expect, test } from 'vitest';
import { expectClose } from '../../../../test/helpers/close.js';
import { checkGirder } from '../../src/girder.js';
import { defaultOptions } from '../../src/options.js';
import { girderMass, girderSelfWeight } from '../../src/section.js';
import type { Effects, Section } from '../../src/types.js';

const L = 12000;
const w = 80; // N/mm, design UDL (invented)
function udlEffects(): Effects {
  const n = 24;
  const stations = Array.from({ length: n + 1 }, (_, i) => {
    const x = (L * i) / n;
    return { x, MEd: (w * x * (L - x)) / 2, VEd: w * (L / 2 - x) };
  });
  return { stations, forces: [], reactions: [{ x: 0, R: (w * L) / 2 }, { x: L, R: (w * L) / 2 }], sls: [] };
}

const section: Section = {
  hw: 1200,
  tw: 10,
  top: { b: 300, t: 20 },
  bot: { b: 300, t: 20 },
  stiffeners: null,
  endPost: 'rigid',
  bearing: { bs: 140, ts: 15, e: 130 },
  restraintStiffeners: { bs: 80, ts: 10, xs: [6000] },
  grade: { web: 'S355', top: 'S355', bot: 'S355', stiffener: 'S355' },
};

describe('a stiffener pair at a lateral restraint of the top flange (hand calculation)', () => {
  const o = defaultOptions(L, { restraint: { kind: 'at', at: [0, 6000, L] } });
  const c = checkGirder(section, udlEffects(), o).checks.find((r) => r.id === 'restraint-stiffener')!;

  test('the restraint force: αm·NEd/100 with NEd = MEd/hs of the top flange (EN 1993-1-1 5.3.3(4))', () => {
    // MEd = w L²/8 = 80 × 12000²/8 = 1440 kNm, the largest over both segments (0–6 m, 6–12 m);
    // hs = 1200 + 20 = 1220 mm; NEd = 1180.3 kN; Fr = 11.803 kN
    const MEd = (w * L * L) / 8;
    expectClose(c.values['MEdFlange'] as number, MEd, 1e-9, 'MEd');
    expectClose(c.values['NEdFlange'] as number, MEd / 1220, 1e-9, 'NEd');
    expectClose(c.values['Fr'] as number, 11.803e3, 5e-4, 'Fr (4 figures)');
    expect(c.values['flange']).toBe('top');
  });

  test('the pair as a cantilever of hw: M = Fr·hw ≤ W fy/γM0; bending governs over the torsion of the flats', () => {
    // strip 15 ε tw = 15 × √(235/355) × 10 = 122.04 mm each side; I = 254.08 × 10³/12 + 2 (10 × 80³/12 + 800 × 45²) = 4.1145e6 mm⁴
    const strip = 15 * Math.sqrt(235 / 355) * 10;
    const I = ((10 + 2 * strip) * 1000) / 12 + 2 * ((10 * 80 * 80 * 80) / 12 + 800 * 45 * 45);
    expectClose(I, 4.1145e6, 5e-4, 'I (4 figures)');
    const W = I / (5 + 80); // 48 406 mm³
    const MRd = W * 355; // 17.18 kNm
    const M = ((w * L * L) / 8 / 1220 / 100) * 1200; // 14.16 kNm
    expectClose(c.values['MRd'] as number, MRd, 1e-9, 'MRd');
    expectClose(c.values['M'] as number, M, 1e-9, 'M');
    expectClose(c.utilisation, M / MRd, 1e-9, 'utilisation 0.824');
    expect(c.values['part']).toBe('bending');
    // torsion 9.2.1(8): 5.3 fy/E ÷ ts²/(bs² + ts²) = 0.00896/0.01538 = 0.58, below
    expect(c.values['ItOverIp'] as number).toBeCloseTo(100 / 6500, 12);
  });

  test('no restraint there: no force, the flats still meet 9.2.1(8) and fit', () => {
    const free = checkGirder(section, udlEffects(), defaultOptions(L)).checks.find((r) => r.id === 'restraint-stiffener')!;
    expect(free.values['Fr']).toBe(0);
    expect(free.values['flange']).toBe('none held here');
    expect(free.values['part']).toBe('torsion');
  });

  test('the pair counts in the mass and the self-weight', () => {
    const bare = { ...section, restraintStiffeners: null };
    const kg = 2 * 80 * 10 * 1200 * 7850e-9; // density 7850 kg/m³ (EN 1991-1-1 Table A.4)
    expectClose(girderMass(section, L, [0, L], section.bearing!).total - girderMass(bare, L, [0, L], section.bearing!).total, kg, 1e-9, 'pair kg');
    expect(girderSelfWeight(section, [0, L])).toBeGreaterThan(girderSelfWeight(bare, [0, L]));
  });
});
