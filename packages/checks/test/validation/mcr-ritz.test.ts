/**
 * Validation of the numerical elastic critical moment (Rayleigh–Ritz, mcr-ritz.ts) against:
 * - S.P. Timoshenko & J.M. Gere, "Theory of Elastic Stability", 2nd ed., McGraw-Hill 1961, §6.2:
 *   Mcr = (π/L)·√(E Iz G It (1 + π² E Iw/(G It L²))) for a doubly symmetric beam under uniform
 *   moment with fork ends (closed form).
 * - N.S. Trahair, "Flexural-Torsional Buckling of Structures", E & FN Spon 1993, §5 (mono-symmetric
 *   beams, uniform moment): Mcr = π²EIz/L²·[βx/2 + √((βx/2)² + Iw/Iz + G It L²/(π² E Iz))], βx = 2zj
 *   in the ENV 1993-1-1 Annex F sign convention (closed form).
 * - Access Steel NCCI SN003b-EN-EU "Elastic critical moment for lateral torsional buckling",
 *   end-moment table for k = 1 (C1 = 1.00, 1.14, 1.31, 1.52, 1.77 at ψ = 1 … 0) and C1 = 1.127,
 *   C2 = 0.454 for a uniform load, C1 = 1.348, C2 = 0.630 for a central point load (values as
 *   transcribed from memory in the project's research notes; the SBE example below prints 1.127
 *   and 0.454).
 * - ENV 1993-1-1:1992 Annex F Table F.1.2 (k = 1): UDL C1 = 1.132, C2 = 0.459; central point load
 *   C1 = 1.365, C2 = 0.553 (from memory).
 * - ECCS / Salvadori fit for end moments C1 = 1.88 − 1.40ψ + 0.52ψ² ≤ 2.7 (from memory).
 * - Steel Buildings in Europe, Multi-Storey Steel Buildings, Part 4: Detailed Design, Appendix A.1,
 *   sheet 5 (IPE 330, L = 5.7 m, UDL on the top flange): Mcr = 113.9 kNm.
 * Tabulated C1 values are for one torsion parameter each, and C1 depends on it by a few per cent
 * (more for negative ψ): the tolerances say so where they are wider than the printed precision.
 */
import { describe, expect, test } from 'vitest';
import { fc, test as ptest } from '@fast-check/vitest';
import { expectClose } from '../../../../test/helpers/close.js';
import { mcr } from '../../src/en1993-1-1/ltb.js';
import { mcrConverged, mcrRitz, mcrUniform, ritzTrial, ritzTrialMcr, type RitzSegment } from '../../src/en1993-1-1/mcr-ritz.js';

// IPE 330 as printed in SBE Part 4 A.1 sheet 5 (G = 80770 MPa as there)
const E = 210000;
const G = 80770;
const IPE330 = { Iz: 788.1e4, It: 28.15e4, Iw: 199100e6, h: 330 };
const L = 5700;

function segment(f: (xi: number) => number, o: { zg?: number; zj?: number; n?: number; L?: number; k?: number; kw?: number; props?: { Iz: number; It: number; Iw: number } } = {}): RitzSegment {
  const len = o.L ?? L;
  const n = o.n ?? 41;
  const p = o.props ?? IPE330;
  const xs = Array.from({ length: n }, (_, i) => (len * i) / (n - 1));
  return { E, G, L: len, xs, Ms: xs.map((x) => f(x / len) * 1e8), n, pieces: [{ x0: 0, x1: len, Iz: p.Iz, It: p.It, Iw: p.Iw, zj: o.zj ?? 0, zg: o.zg ?? 0 }], k: o.k ?? 1, kw: o.kw ?? 1 };
}
const Mu = mcrUniform(E, G, IPE330.Iz, IPE330.It, IPE330.Iw, L, 0);
const C1of = (f: (xi: number) => number, o: Parameters<typeof segment>[1] = {}) => mcrConverged(segment(f, o)).Mcr / Mu;

describe('uniform moment, doubly symmetric (Timoshenko & Gere 1961, §6.2)', () => {
  test('Ritz = closed form, with any number of terms (the mode is one half sine)', () => {
    const closed = (Math.PI / L) * Math.sqrt(E * IPE330.Iz * G * IPE330.It * (1 + (Math.PI ** 2 * E * IPE330.Iw) / (G * IPE330.It * L * L)));
    expectClose(Mu, closed, 1e-12, 'mcrUniform');
    for (const N of [1, 4, 8]) expectClose(mcrRitz(segment(() => 1), N).Mcr, closed, 1e-6, `Ritz, ${N} terms`);
    expectClose(mcrConverged(segment(() => 1)).Mcr, closed, 1e-6, 'converged');
  });
  test('k and kw as effective-length factors: k = kw = 0.5 equals the closed form over L/2 (SN003 eq. (1))', () => {
    const half = mcrUniform(E, G, IPE330.Iz, IPE330.It, IPE330.Iw, L / 2, 0);
    expectClose(mcrConverged(segment(() => 1, { k: 0.5, kw: 0.5 })).Mcr, half, 1e-6, 'k = kw = 0.5');
  });
});

describe('mono-symmetric, uniform moment (Trahair 1993, §5)', () => {
  test.for([60, -60, 150])('zj = %d mm: Ritz = closed form', (zj) => {
    const closed = ((Math.PI ** 2 * E * IPE330.Iz) / (L * L)) * (zj + Math.sqrt(zj * zj + IPE330.Iw / IPE330.Iz + (G * IPE330.It * L * L) / (Math.PI ** 2 * E * IPE330.Iz)));
    expectClose(mcrConverged(segment(() => 1, { zj })).Mcr, closed, 1e-6, `zj ${zj}`);
  });
  test('the larger flange in compression raises Mcr, the smaller lowers it', () => {
    const udl = (x: number) => 4 * x * (1 - x);
    expect(C1of(udl, { zj: 60 })).toBeGreaterThan(C1of(udl));
    expect(C1of(udl, { zj: -60 })).toBeLessThan(C1of(udl));
  });
  test('UDL with zj = 60 mm against the three-factor formula with C1 = 1.127, C3 = 0.525 (ENV 1993-1-1 Table F.1.2, from memory): within 3 % (C3 is an approximation of its own)', () => {
    const ritz = mcrConverged(segment((x) => 4 * x * (1 - x), { zj: 60 })).Mcr;
    const three = mcr({ E, G, ...IPE330, L, C1: 1.127, C2: 0.454, C3: 0.525, zg: 0, zj: 60 });
    expectClose(ritz, three, 0.03, 'mono-symmetric UDL');
  });
});

describe('C1 for linear moment diagrams, k = 1 (SN003 table; ECCS fit)', () => {
  const linear = (psi: number) => (x: number) => 1 - (1 - psi) * x;
  test.for([
    [0.75, 1.14],
    [0.5, 1.31],
  ])('ψ = %d: C1 = %d (SN003 and the ECCS fit agree here; 1 % for the torsion parameter)', ([psi, c1]) => {
    expectClose(C1of(linear(psi!)), c1!, 0.01, `ψ ${psi}`);
  });
  test.for([
    [0.25, 1.52],
    [0, 1.77],
    [-0.25, 2.05],
    [-0.5, 2.33],
  ])('ψ = %d: C1 between SN003 (%d, its table errs low) and the ECCS fit (the sources part as ψ falls)', ([psi, sn003]) => {
    const eccs = Math.min(2.7, 1.88 - 1.4 * psi! + 0.52 * psi! * psi!);
    const c1 = C1of(linear(psi!));
    expect(c1).toBeGreaterThanOrEqual(sn003! * 0.995);
    expect(c1).toBeLessThanOrEqual(eccs * 1.005);
  });
});

describe('transverse loads on a simply supported beam (SN003; SBE Part 4 A.1 sheet 5)', () => {
  const udl = (x: number) => 4 * x * (1 - x);
  const point = (x: number) => 1 - Math.abs(2 * x - 1);
  test('UDL at the shear centre: C1 = 1.127 (1 %: the torsion parameter)', () => expectClose(C1of(udl), 1.127, 0.01, 'C1 UDL'));
  test('central point load at the shear centre: C1 = 1.348 (1.5 %: the torsion parameter)', () => expectClose(C1of(point), 1.348, 0.015, 'C1 point'));
  test('SBE A.1 sheet 5: UDL on the top flange (zg = h/2 = 165 mm), Mcr = 113.9 kNm (0.5 %: the example uses C1, C2 from a table)', () => {
    expectClose(mcrConverged(segment(udl, { zg: 165, n: 81 })).Mcr / 1e6, 113.9, 0.005, 'Mcr');
  });
  test('UDL and central point load on the top flange against ENV 1993-1-1 Table F.1.2 (k = 1, from memory): C1 = 1.132, C2 = 0.459 and C1 = 1.365, C2 = 0.553 in the three-factor formula (0.5 %, 1.5 %)', () => {
    expectClose(mcrConverged(segment(udl, { zg: 165 })).Mcr, mcr({ E, G, ...IPE330, L, C1: 1.132, C2: 0.459, zg: 165 }), 0.005, 'UDL, top flange');
    expectClose(mcrConverged(segment(point, { zg: 165 })).Mcr, mcr({ E, G, ...IPE330, L, C1: 1.365, C2: 0.553, zg: 165 }), 0.015, 'point, top flange');
    // SN003's C2 = 0.630 for the point load (as transcribed) gives a lower Mcr: on the safe side of ours
    expect(mcr({ E, G, ...IPE330, L, C1: 1.348, C2: 0.63, zg: 165 })).toBeLessThan(mcrConverged(segment(point, { zg: 165 })).Mcr);
  });
  test('load height: top-flange loading lowers Mcr by the published C2 effect; loads below the shear centre are not credited (conservative)', () => {
    const atSc = mcrConverged(segment(udl)).Mcr;
    const top = mcrConverged(segment(udl, { zg: 165 })).Mcr;
    const bottom = mcrConverged(segment(udl, { zg: -165 })).Mcr;
    // the three-factor formula with the published C1, C2 gives the ratio top / shear centre
    const ratio = mcr({ E, G, ...IPE330, L, C1: 1.127, C2: 0.454, zg: 165 }) / mcr({ E, G, ...IPE330, L, C1: 1.127, C2: 0.454, zg: 0 });
    expectClose(top / atSc, ratio, 0.01, 'top / shear centre');
    expect(bottom).toBe(atSc);
  });
});

describe('convergence in the number of terms', () => {
  test.for([
    ['UDL, top flange', (x: number) => 4 * x * (1 - x), 165],
    ['central point load, top flange', (x: number) => 1 - Math.abs(2 * x - 1), 165],
    ['two point loads at the thirds', (x: number) => Math.min(1, 3 * x, 3 * (1 - x)), 0],
    ['ψ = −1', (x: number) => 1 - 2 * x, 0],
  ] as const)('%s: Mcr never rises with more terms; doubling from 16 to 32 changes it by < 0.5 %', ([, f, zg]) => {
    const values = [1, 2, 4, 8, 16, 32].map((N) => mcrRitz(segment(f, { zg }), N).Mcr);
    for (let i = 1; i < values.length; i++) expect(values[i]!).toBeLessThanOrEqual(values[i - 1]! * (1 + 1e-7));
    expect((values[4]! - values[5]!) / values[5]!).toBeLessThan(0.005);
    const c = mcrConverged(segment(f, { zg }));
    expect(c.converged).toBe(true);
    expect(Math.abs(c.change)).toBeLessThan(0.005);
    expect(c.Mcr).toBeLessThanOrEqual(values[1]!);
  });
});

describe('sections that vary along the segment', () => {
  const udl = (x: number) => 4 * x * (1 - x);
  test('two equal pieces give the prismatic value', () => {
    const one = segment(udl, { zg: 165 });
    const two: RitzSegment = { ...one, pieces: [{ ...one.pieces[0]!, x1: 2000 }, { ...one.pieces[0]!, x0: 2000 }] };
    expectClose(mcrConverged(two).Mcr, mcrConverged(one).Mcr, 1e-6, 'two pieces');
  });
  test('a stiffer middle third lies between the two prismatic beams', () => {
    const weak = segment(udl);
    const stiff = { Iz: 2 * IPE330.Iz, It: 2 * IPE330.It, Iw: 2 * IPE330.Iw };
    const strong = segment(udl, { props: stiff });
    const p = weak.pieces[0]!;
    const mixed: RitzSegment = { ...weak, pieces: [{ ...p, x1: L / 3 }, { ...p, ...stiff, x0: L / 3, x1: (2 * L) / 3 }, { ...p, x0: (2 * L) / 3 }] };
    const m = mcrConverged(mixed).Mcr;
    expect(m).toBeGreaterThan(mcrConverged(weak).Mcr);
    expect(m).toBeLessThan(mcrConverged(strong).Mcr);
  });
});

describe('the search bound: a two-amplitude subspace of the first basis (ritzTrial)', () => {
  ptest.prop(
    [
      fc.array(fc.double({ min: 0, max: 1, noNaN: true }), { minLength: 3, maxLength: 15 }),
      fc.double({ min: 0, max: 0.2, noNaN: true }),
      fc.double({ min: -150, max: 150, noNaN: true }),
      fc.double({ min: 0, max: 200, noNaN: true }),
      fc.double({ min: 2000, max: 25000, noNaN: true }),
    ],
    { numRuns: 150 },
  )('never below the converged Mcr of any diagram in the band, whatever zj and zg', (shape, spread, zj, zg, len) => {
    const n = shape.length;
    const xs = shape.map((_, i) => (len * i) / (n - 1));
    const lo = shape.map((v) => v * 1e8);
    const hi = lo.map((v) => v * (1 + spread) + 1e6 * spread);
    const mid = lo.map((v, i) => (v + hi[i]!) / 2);
    const t = ritzTrial(xs, mid, n, len);
    let cMin = 0;
    let cMax = 0;
    let wHi = 0;
    let wLo = 0;
    for (let s = 0; s < n; s++) {
      cMin += Math.min(t.gc[s]! * lo[s]!, t.gc[s]! * hi[s]!);
      cMax += Math.max(t.gc[s]! * lo[s]!, t.gc[s]! * hi[s]!);
      wLo += Math.min(t.gw[s]! * lo[s]!, t.gw[s]! * hi[s]!);
      wHi += Math.max(t.gw[s]! * lo[s]!, t.gw[s]! * hi[s]!);
    }
    const c2 = cMin > 0 ? cMin * cMin : cMax < 0 ? cMax * cMax : 0;
    const bound = ritzTrialMcr(E, G, IPE330.Iz, IPE330.It, IPE330.Iw, 1, 1, t.au, t.bt, t.bw, c2, 2 * zj * (zj > 0 ? wHi : wLo), Math.max(...hi));
    for (const u of [0, 0.5, 1]) {
      const Ms = lo.map((v, i) => v + u * (hi[i]! - v));
      // the check skips a segment whose moment is at most 1 N·mm
      if (Math.max(...Ms) <= 1) continue;
      const seg: RitzSegment = { E, G, L: len, xs, Ms, n, pieces: [{ x0: 0, x1: len, ...IPE330, zj, zg }], k: 1, kw: 1 };
      expect(bound * (1 + 1e-9)).toBeGreaterThanOrEqual(mcrConverged(seg).Mcr);
      expect(bound * (1 + 1e-9)).toBeGreaterThanOrEqual(mcrRitz(seg, 4).Mcr);
    }
  });
});
