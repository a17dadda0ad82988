/**
 * Regression tests, one per finding of an independent engineering review of the check library
 * (2026-12). The expected numbers are the reviewer's hand calculations (arithmetic shown in the
 * comments, clause formulas as recalled from EN 1993-1-1:2005 / EN 1993-1-5:2006 / EN 1993-1-8:2005);
 * they are not published values. Tolerances cover the hand calculation's rounding.
 */
import { describe, expect, test } from 'vitest';
import { checkGirder, defaultOptions, grossProps, material, vplRd, type Effects, type Section, type Station } from '../src/index.js';
import { expectClose } from '../../../test/helpers/close.js';

const S355 = { web: 'S355', top: 'S355', bot: 'S355', stiffener: 'S355' } as const;
const none = { forces: [], reactions: [], sls: [] };
const get = (v: ReturnType<typeof checkGirder>, id: string) => v.checks.find((c) => c.id === id)!;

function ss(L: number, w: number, n = 32): Station[] {
  return Array.from({ length: n + 1 }, (_, i) => {
    const x = (L * i) / n;
    return { x, MEd: (w * x * (L - x)) / 2, VEd: w * (L / 2 - x) };
  });
}

describe('finding 1: lateral-torsional buckling judges each sign of moment (uplift with gravity)', () => {
  const s: Section = { hw: 1400, tw: 12, top: { b: 600, t: 40 }, bot: { b: 300, t: 20 }, stiffeners: null, endPost: 'rigid', grade: S355 };
  const L = 16000;
  const o = defaultOptions(L, { restraint: { kind: 'at', at: [] } });
  const u = (stations: Station[]) => get(checkGirder(s, { stations, ...none }, o), 'lateral-torsional-buckling').utilisation;
  test('the utilisation with both combinations is the larger of each alone', () => {
    const grav = ss(L, 40);
    const up = ss(L, -30);
    const both = u([...grav, ...up]);
    expect(both).toBeCloseTo(Math.max(u(grav), u(up)), 12);
    // uplift puts the small bottom flange in compression: it governs. The reviewer's 0.750 took the
    // top-flange load height as destabilising for the uplift too (three-factor formula, C2·zg);
    // the numerical Mcr (issue 17) counts only destabilising loads, and an upward load at the top
    // flange is stabilising: left out (not credited), u = 0.7261 — a regression value of our own
    // computation, below the reviewer's bound as it must be
    expect(u(up)).toBeLessThan(0.75);
    expectClose(u(up), 0.7261, 0.002, 'uplift alone');
    expect(u(up)).toBeGreaterThan(u(grav));
  });
  test('a continuously restrained top flange does not exempt the hogging sign', () => {
    const v = get(checkGirder(s, { stations: ss(L, -30), ...none }, defaultOptions(L, { restraint: { kind: 'continuous' } })), 'lateral-torsional-buckling');
    expect(v.applies).toBe(true);
    expect(v.values['sign']).toBe('hogging');
  });
});

describe('finding 3: EN 1993-1-5 7.1 is checked at hw/2 from an inner support', () => {
  // two equal spans 30 m, w = 200 N/mm: RA = 3wL/8; at x = 28.8 m (support − hw/2):
  // MEd = −18144 kNm, VEd = 3510 kN; Mpl,Rd = 23992.8 kNm, Mf,Rd = 16836 kNm, Vbw,Rd = 3709.7 kN
  // → η̄1 = 0.7562, η̄3 = 0.9462, 0.7562 + 0.2983·0.8924² = 0.9938 (reviewer's hand calculation)
  test('utilisation 0.9938', () => {
    const L = 30000;
    const w = 200;
    const RA = (3 * w * L) / 8;
    const stations: Station[] = [];
    for (let i = 0; i <= 80; i++) {
      const x = (2 * L * i) / 80;
      const xi = x <= L ? x : 2 * L - x;
      const sgn = x <= L ? 1 : -1;
      stations.push({ x, MEd: RA * xi - (w * xi * xi) / 2, VEd: sgn * (RA - w * xi) });
    }
    const s: Section = { hw: 2400, tw: 14, top: { b: 500, t: 40 }, bot: { b: 500, t: 40 }, stiffeners: { a: 2400, bs: 200, ts: 20, sides: 2 }, endPost: 'rigid', grade: S355 };
    const v = get(checkGirder(s, { stations, ...none }, defaultOptions(2 * L, { supports: [0, L, 2 * L] })), 'bending-shear');
    expectClose(v.utilisation, 0.9938, 0.002, 'eq. 7.1 at support − hw/2');
  });
});

describe('finding 4: a one-sided intermediate stiffener carries its eccentricity (EN 1993-1-5 9.4(2))', () => {
  test('one-sided flats: NEd/Nb,Rd plus the bending of NEd·eN; two-sided lower', () => {
    const L = 12000;
    const base: Section = { hw: 1500, tw: 12, top: { b: 500, t: 30 }, bot: { b: 500, t: 30 }, stiffeners: { a: 1500, bs: 150, ts: 15, sides: 1 }, endPost: 'rigid', grade: S355 };
    const e: Effects = { stations: ss(L, 350), ...none };
    const one = get(checkGirder(base, e, defaultOptions(L)), 'stiffener-strength');
    const two = get(checkGirder({ ...base, stiffeners: { ...base.stiffeners!, sides: 2 } }, e, defaultOptions(L)), 'stiffener-strength');
    const NEd = one.values['NEd'] as number;
    expect(NEd).toBeGreaterThan(0);
    // reviewer's section (flat 150×15 on a 12 mm web, 15εtw strips): A = 5944.8 mm², eN = 30.66 mm,
    // W to the web-side fibre 366 560 mm³
    expectClose(one.values['eN'] as number, 30.66, 0.002, 'eN');
    const expected = NEd / (one.values['NbRd'] as number) + (NEd * 30.66) / (366560 * 355);
    expectClose(one.utilisation, expected, 0.005, 'utilisation with eccentricity');
    expect(two.utilisation).toBeLessThan(one.utilisation);
  });
});

describe('finding 5: the web-to-flange weld under a concentrated force', () => {
  // hw 2000 × 12, flanges 500 × 40, S355, F = 600 kN on ss = 100 mm, VEd = 1500 kN there:
  // v = 1.5e6·2.04e7/4.962e10 = 616.7 N/mm, q = 600e3/(100 + 5·40) = 2000 N/mm,
  // Fw,Ed = hypot(308.3, 1000) = 1046.5 N/mm; fvw,d = 470/(√3·0.9·1.25) = 241.2 MPa → a ≥ 4.34 mm
  test('throat 5 mm (reviewer: a ≥ 4.34 mm)', () => {
    const s: Section = { hw: 2000, tw: 12, top: { b: 500, t: 40 }, bot: { b: 500, t: 40 }, stiffeners: null, endPost: 'rigid', grade: S355 };
    const stations: Station[] = [0, 3500, 7000, 10500, 14000].map((x) => ({ x, MEd: 1e9, VEd: 1.5e6 }));
    const v = get(checkGirder(s, { stations, forces: [{ x: 7000, F: 600e3, ss: 100 }], reactions: [], sls: [] }, defaultOptions(14000)), 'web-flange-weld');
    expect(v.values['throat']).toBe(5);
  });
});

describe('finding 7: EN 1993-1-1 6.2.8 keeps the elastic basis of a Class 3 section', () => {
  // hw 900 × 20, flanges 500 × 25 (c/t = 9.4: Class 3), MEd = Mel,Rd, VEd = 0.774 Vpl,Rd (ρ = 0.30):
  // elastic with web (1 − ρ) tw gives MV,Rd = 4503 kNm → utilisation 1.059 (reviewer)
  test('utilisation about 1.059', () => {
    const s: Section = { hw: 900, tw: 20, top: { b: 500, t: 25 }, bot: { b: 500, t: 25 }, stiffeners: null, endPost: 'rigid', grade: S355 };
    const o = defaultOptions(10000);
    const m = material(s, o);
    const Mel = grossProps(s, m).Mel;
    const V = 0.774 * vplRd(s.hw, s.tw, m.fyw, o.eta, 1);
    const stations: Station[] = [2000, 5000, 8000].map((x) => ({ x, MEd: Mel, VEd: V }));
    const v = get(checkGirder(s, { stations, ...none }, o), 'bending-shear');
    expect(v.clause).toBe('EN 1993-1-1 6.2.8');
    expectClose(v.utilisation, 1.059, 0.005, '6.2.8, Class 3');
  });
});

describe('finding 8: EN 1993-1-5 7.2 applies to a force on the compression flange only', () => {
  test('hogging at the force: patch-bending does not apply', () => {
    const s: Section = { hw: 1200, tw: 12, top: { b: 400, t: 25 }, bot: { b: 400, t: 25 }, stiffeners: null, endPost: 'rigid', grade: S355 };
    const stations: Station[] = [0, 5000, 10000].map((x) => ({ x, MEd: -8e8, VEd: 3e5 }));
    const v = get(checkGirder(s, { stations, forces: [{ x: 5000, F: 2e5, ss: 150 }], reactions: [], sls: [] }, defaultOptions(10000)), 'patch-bending');
    expect(v.applies).toBe(false);
  });
});
