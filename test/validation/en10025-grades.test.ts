/**
 * Yield and tensile strengths by nominal thickness.
 * Sources:
 * - EN 10025-2:2004 "Hot rolled products of structural steels — Part 2: Technical delivery
 *   conditions for non-alloy structural steels", Table 7 (ReH, Rm).
 *   S275 and S355 rows as printed in SCI P363 (Blue Book) online explanatory notes §5
 *   "Introduction to resistance tables" and the ArcelorMittal S355 grade datasheet (both read);
 *   the S235 row from memory.
 * - EN 10025-4:2004 (M/ML grades) from memory; the S460 row agrees with the SCI explanatory note
 *   for hollow sections (read), the S420 row is from memory only.
 * - EN 1993-1-1:2005 Table 3.1 (from memory; fu of S355 t <= 40 as 490 MPa, later printings).
 * - EN 1993-1-8:2005 Table 4.1, βw (from memory).
 * Exact equality: these are tabulated integers.
 */
import { describe, expect, test } from 'vitest';
import { betaW, fu, fy } from '@platesmith/catalogue';

const mid = (lo: number, hi: number) => (lo + hi) / 2;
const BANDS: [number, number][] = [[0, 16], [16, 40], [40, 63], [63, 80], [80, 100], [100, 150]];

describe('EN 10025-2:2004 Table 7, ReH by thickness band', () => {
  test.for([
    // grade, values per band (<=16, <=40, <=63, <=80, <=100, <=150)
    ['S235', [235, 225, 215, 215, 215, 195]], // from memory
    ['S275', [275, 265, 255, 245, 235, 225]], // SCI P363 notes §5 (read)
    ['S355', [355, 345, 335, 325, 315, 295]], // SCI P363 notes §5; ArcelorMittal S355 datasheet (read)
  ] as const)('%s', ([grade, values]) => {
    BANDS.forEach(([lo, hi], i) => {
      expect.soft(fy(grade, mid(lo, hi)), `${grade} mid-band ${lo}-${hi}`).toBe(values[i]);
      expect.soft(fy(grade, hi), `${grade} at band edge ${hi}`).toBe(values[i]);
    });
  });
  test('S355 Rm lower bound 470 MPa for 3-100 mm, 450 MPa above 100 mm (ArcelorMittal datasheet, read)', () => {
    expect(fu('S355', 20)).toBe(470);
    expect(fu('S355', 120)).toBe(450);
  });
});

describe('EN 10025-4:2004 M/ML grades (from memory)', () => {
  test('S460M ReH 460/440/430/410/400/385 (agrees with SCI explanatory note, read)', () => {
    expect([10, 30, 50, 70, 90, 110].map((t) => fy('S460', t))).toEqual([460, 440, 430, 410, 400, 385]);
  });
  test('S420M ReH 420/400/390/380/370/365 (from memory)', () => {
    expect([10, 30, 50, 70, 90, 110].map((t) => fy('S420', t))).toEqual([420, 400, 390, 380, 370, 365]);
  });
});

describe('EN 1993-1-1:2005 Table 3.1 two bands (from memory)', () => {
  test.for([
    ['S235', 235, 360, 215, 360],
    ['S275', 275, 430, 255, 410],
    ['S355', 355, 490, 335, 470],
  ] as const)('%s: t <= 40 and 40 < t <= 80', ([g, fy1, fu1, fy2, fu2]) => {
    expect.soft(fy(g, 40, 'table3.1')).toBe(fy1);
    expect.soft(fu(g, 40, 'table3.1')).toBe(fu1);
    expect.soft(fy(g, 41, 'table3.1')).toBe(fy2);
    expect.soft(fu(g, 80, 'table3.1')).toBe(fu2);
  });
  test('the two sources disagree inside 16-40 mm, which is why the choice is an input', () => {
    expect(fy('S355', 25, 'table3.1')).toBe(355);
    expect(fy('S355', 25, 'product')).toBe(345);
  });
});

describe('EN 1993-1-8:2005 Table 4.1 correlation factor βw (from memory)', () => {
  test.for([
    ['S235', 0.8],
    ['S275', 0.85],
    ['S355', 0.9],
    ['S420', 1.0],
    ['S460', 1.0],
  ] as const)('%s → %s', ([g, b]) => {
    expect(betaW(g)).toBe(b);
  });
});
