/**
 * EN 1993-1-5:2006 (+AC:2009) section 4 (Tables 4.1, 4.2, eqs. 4.2–4.3) and section 6 (eqs. 6.1–6.13),
 * transcribed from memory of the standard — no published numerical worked example with an EN 1993-1-5
 * effective section or patch resistance could be read (the JRC–ECCS "Commentary and worked examples
 * to EN 1993-1-5", EUR 22898 EN, 2007, was only available as its opening pages). These tests therefore
 * assert the standard's printed table values and structural facts of the clauses; values derived with
 * the same formulas are marked "regression".
 */
import { describe, expect, test } from 'vitest';
import { expectClose } from '../../../../test/helpers/close.js';
import { internalEffectiveWidths, kSigmaInternal, kSigmaOutstand, rhoInternal, rhoOutstand, effectiveSection } from '../../src/en1993-1-5/effective-section.js';
import { kF, patchResistance } from '../../src/en1993-1-5/patch-loading.js';
import { fibLimit } from '../../src/en1993-1-5/flange-induced.js';
import { material } from '../../src/section.js';
import type { Section } from '../../src/types.js';

describe('EN 1993-1-5 Table 4.1 (internal elements): printed kσ', () => {
  test.for([
    [1, 4.0],
    [0, 7.81],
    [-1, 23.9],
  ] as const)('ψ = %s: kσ = %s (printed to 3 s.f.)', ([psi, k]) => {
    expectClose(kSigmaInternal(psi), k, 1e-9, `kσ(ψ = ${psi})`);
  });
  test('branch formulas meet the printed end values within the table rounding (0.5 %)', () => {
    expectClose(8.2 / (1.05 + 1e-9), 7.81, 0.005, '8.2/(1.05 + ψ) at ψ → 0');
    expectClose(kSigmaInternal(-1 + 1e-9), 23.9, 0.005, '7.81 − 6.29ψ + 9.78ψ² at ψ → −1 (23.88)');
    expectClose(kSigmaInternal(-1 - 1e-9), 23.9, 0.005, '5.98(1 − ψ)² at ψ → −1 (23.92)');
  });
});

describe('EN 1993-1-5 Table 4.2 (outstands, compression at the free edge): printed kσ', () => {
  test('ψ = 1: 0.43; ψ = 0: 0.57; ψ = −1: 0.85', () => {
    expectClose(kSigmaOutstand(1), 0.43, 1e-9, 'ψ = 1');
    expectClose(kSigmaOutstand(0), 0.57, 1e-9, 'ψ = 0');
    expectClose(kSigmaOutstand(-1), 0.85, 1e-9, 'ψ = −1');
  });
});

describe('EN 1993-1-5 4.4(2): ρ (2006 text; A1:2017 plateau gives the same capped values)', () => {
  test('plateau: ρ = 1 up to λ̄p = 0.673 (ψ = 1, 2006) and 0.748 (outstand)', () => {
    expect.soft(rhoInternal(0.673, 1)).toBe(1);
    expect.soft(rhoOutstand(0.748)).toBe(1);
  });
  test('A1:2017 limit 0.5 + √(0.085 − 0.055ψ) is the root of the formula = 1 (so the cap makes the editions agree)', () => {
    for (const psi of [1, 0.5, 0, -0.5, -1, -2, -3]) {
      const l = 0.5 + Math.sqrt(0.085 - 0.055 * psi);
      expectClose((l - 0.055 * (3 + psi)) / (l * l), 1, 1e-12, `ψ = ${psi}`);
    }
  });
  test('regression values (derived with the same formula): ψ = 1, λ̄p = 1.0 → 0.780; ψ = −1, λ̄p = 1.0 → 0.890; outstand 0.9 → 0.879', () => {
    expectClose(rhoInternal(1.0, 1), 0.78, 1e-9, 'regression');
    expectClose(rhoInternal(1.0, -1), 0.89, 1e-9, 'regression');
    expectClose(rhoOutstand(0.9), 0.879, 0.0005, 'regression');
  });
});

describe('EN 1993-1-5 Table 4.1 effective widths and a Class 4 web in pure bending (hand calculation)', () => {
  test('ψ < 0: beff = ρ b̄/(1 − ψ), be1 = 0.4 beff, be2 = 0.6 beff; ψ ≥ 0: be1 = 2beff/(5 − ψ)', () => {
    const w = internalEffectiveWidths(1800, 10, Math.sqrt(235 / 355), -1);
    expectClose(w.bc, 900, 1e-12, 'bc');
    expectClose(w.be1, 0.4 * w.rho * 900, 1e-12, 'be1');
    expectClose(w.be2, 0.6 * w.rho * 900, 1e-12, 'be2');
    const u = internalEffectiveWidths(1800, 10, Math.sqrt(235 / 355), 0.5);
    expectClose(u.be1, (2 * u.beff) / 4.5, 1e-12, 'be1 at ψ = 0.5');
  });
  test('symmetric girder hw 1800 × 10, flanges 400 × 25 (S355): hole and Ieff by hand (independent arithmetic, regression)', () => {
    const s: Section = { hw: 1800, tw: 10, top: { b: 400, t: 25 }, bot: { b: 400, t: 25 }, stiffeners: null, endPost: 'rigid', grade: { web: 'S355', top: 'S355', bot: 'S355', stiffener: 'S355' } };
    const m = material(s, { fySource: 'product' });
    const e = effectiveSection(s, m, 'top', 3);
    // gross flanges (c/t = 7.6 < 14ε), ψ = −1: λ̄p = 180/(28.4·0.8136·√23.9) = 1.5935, ρ = (λ̄p − 0.11)/λ̄p²
    const eps = Math.sqrt(235 / 355);
    const lp = 180 / (28.4 * eps * Math.sqrt(23.9));
    const rho = (lp - 0.11) / lp ** 2;
    expectClose(e.web.rho, rho, 1e-9, 'ρ web');
    const be1 = 0.4 * rho * 900;
    const be2 = 0.6 * rho * 900;
    const hole = 900 - be1 - be2;
    expectClose(e.holeZ1 - e.holeZ0, hole, 1e-9, 'width of the ineffective zone');
    expectClose(e.holeZ1, 25 + 1800 - be1, 1e-9, 'top of the ineffective zone = be1 below the flange');
    // Ieff by parallel axes about the shifted axis
    const zh = (e.holeZ0 + e.holeZ1) / 2;
    const A = 2 * 400 * 25 + 1800 * 10 - hole * 10;
    const z = (400 * 25 * 12.5 + 1800 * 10 * 925 + 400 * 25 * 1837.5 - hole * 10 * zh) / A;
    const I = 2 * (400 * 25 ** 3) / 12 + 400 * 25 * ((12.5 - z) ** 2 + (1837.5 - z) ** 2) + (10 * 1800 ** 3) / 12 + 1800 * 10 * (925 - z) ** 2 - ((10 * hole ** 3) / 12 + hole * 10 * (zh - z) ** 2);
    expectClose(e.Aeff, A, 1e-9, 'Aeff');
    expectClose(e.zEff, z, 1e-9, 'zEff (shifted down)');
    expectClose(e.Ieff, I, 1e-9, 'Ieff');
    expect.soft(e.zEff).toBeLessThan(925);
    // first yield: the neutral axis moved towards the tension flange, so the compression flange's top
    // fibre (345 MPa, tf 25 > 16 mm) is the farthest from it
    expectClose(e.Meff, (345 * I) / (1850 - z), 1e-9, 'Meff');
    expectClose(e.Weff, I / (1850 - z), 1e-9, 'Weff,min');
  });
});

describe('EN 1993-1-5 section 6, Figure 6.1 and eqs. 6.3–6.13 (from memory)', () => {
  test('kF: type (a) 6 + 2(hw/a)², (b) 3.5 + 2(hw/a)², (c) 2 + 6(ss + c)/hw ≤ 6', () => {
    expectClose(kF('a', 1000, 1000), 8, 1e-12, 'a, hw = a');
    expectClose(kF('b', 1000, 1000), 5.5, 1e-12, 'b, hw = a');
    expectClose(kF('c', 1000, 1e9, 100, 50), 2.9, 1e-12, 'c');
    expectClose(kF('c', 100, 1e9, 100, 50), 6, 1e-12, 'c capped at 6');
  });
  test('m2 iteration, both branches; with λ̄F ≤ 0.5 the resistance is recomputed with m2 = 0 and χF = 1', () => {
    const stocky = patchResistance({ type: 'a', hw: 300, tw: 20, bf: 300, tf: 30, fyw: 355, fyf: 355, ss: 100, a: 2000, E: 210000, gammaM1: 1 });
    expect.soft(stocky.m2Branch).toBe('lambdaF<=0.5');
    expect.soft(stocky.m2).toBe(0);
    expect.soft(stocky.chiF).toBe(1);
    expectClose(stocky.ly, 100 + 2 * 30 * (1 + Math.sqrt(stocky.m1)), 1e-12, 'ly eq. 6.10 with m2 = 0');
    expectClose(stocky.FRd, 355 * stocky.ly * 20, 1e-12, 'FRd = fyw ly tw / γM1');
    const slender = patchResistance({ type: 'a', hw: 1800, tw: 10, bf: 400, tf: 25, fyw: 355, fyf: 345, ss: 100, a: 20000, E: 210000, gammaM1: 1 });
    expect.soft(slender.m2Branch).toBe('lambdaF>0.5');
    expectClose(slender.m2, 0.02 * (1800 / 25) ** 2, 1e-12, 'm2 eq. 6.9');
    expectClose(slender.Fcr, (0.9 * slender.kF * 210000 * 1000) / 1800, 1e-12, 'Fcr eq. 6.5');
    expectClose(slender.chiF, 0.5 / slender.lambdaF, 1e-12, 'χF eq. 6.3');
  });
  test('6.5(3) as corrected: type (c) ℓy is the least of eqs. 6.10, 6.11, 6.12 with ℓe ≤ ss + c', () => {
    const r = patchResistance({ type: 'c', hw: 600, tw: 8, bf: 200, tf: 12, fyw: 275, fyf: 275, ss: 50, c: 0, a: 5000, E: 210000, gammaM1: 1 });
    const le = Math.min((r.kF * 210000 * 64) / (2 * 275 * 600), 50);
    expectClose(r.le!, le, 1e-12, 'ℓe');
    const l610 = 50 + 24 * (1 + Math.sqrt(r.m1 + r.m2));
    const l611 = le + 12 * Math.sqrt(r.m1 / 2 + (le / 12) ** 2 + r.m2);
    const l612 = le + 12 * Math.sqrt(r.m1 + r.m2);
    expectClose(r.ly, Math.min(l610, l611, l612), 1e-12, 'least of three');
  });
  test('ℓy ≤ a for type (a)', () => {
    const r = patchResistance({ type: 'a', hw: 1000, tw: 10, bf: 500, tf: 60, fyw: 355, fyf: 355, ss: 400, a: 500, E: 210000, gammaM1: 1 });
    expect.soft(r.ly).toBeLessThanOrEqual(500);
  });
});

describe('EN 1993-1-5 8(1) eq. 8.1 (from memory)', () => {
  test('hw/tw ≤ k (E/fyf) √(Aw/Afc): k = 0.55, E = 210000, fyf = 355, Aw = Afc → 325.4', () => {
    expectClose(fibLimit({ k: 0.55, E: 210000, fyf: 355, Aw: 1e4, Afc: 1e4 }), (0.55 * 210000) / 355, 1e-12, 'limit');
  });
});
