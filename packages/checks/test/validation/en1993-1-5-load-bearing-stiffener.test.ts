/**
 * Load-bearing stiffeners under concentrated forces (issue 17 item 4), against hand calculations
 * by the standard's own equations (no published worked example of this case is at hand):
 * - EN 1993-1-5:2006 9.1(2), Figure 9.1: the stiffener's effective section, the flats plus a web
 *   strip of 15 ε tw each side; 9.4(2): a strut out of the web plane, buckling curve c,
 *   Lcr = 0.75 hw where both ends are held laterally (a larger value otherwise); 9.3.3(3) eq. 9.7:
 *   the tension-field force NEd = VEd − fyw hw tw/(√3 γM1 λ̄w²), λ̄w of the panel without the
 *   stiffener (5.3(3) eq. 5.6, kτ Annex A.3 eq. A.5).
 * - EN 1993-1-1:2005 6.3.1.2 eq. 6.49: χ = 1/(Φ + √(Φ² − λ̄²)), Φ = 0.5 (1 + α (λ̄ − 0.2) + λ̄²),
 *   curve c α = 0.49 (Table 6.1); λ̄ = √(A fy/Ncr), Ncr = π² E I/Lcr² (Euler).
 * The hand figures are computed in the test from those equations, with their values at 4 figures
 * beside them; the library must agree to 1e-6 (the same arithmetic in another order).
 * The transfer girder and its 3.2 MN column loads are an invented scenario.
 */
import { describe, expect, test } from 'vitest';
import { G_ACC } from '@platesmith/catalogue';
import { expectClose } from '../../../../test/helpers/close.js';
import { checkGirder } from '../../src/girder.js';
import { defaultOptions } from '../../src/options.js';
import { girderMass, girderSelfWeight, panelsOf } from '../../src/section.js';
import type { CheckResult, Effects, Section } from '../../src/types.js';

const E = 210000;
const SNIPE = 20;

/** Simply supported span L under a UDL w (N/mm) and forces P (N) at xs: M, V by statics (stations either side of each force). */
function spanEffects(L: number, w: number, loads: { x: number; P: number }[]): Effects {
  const R = (w * L) / 2 + loads.reduce((s, f) => s + (f.P * (L - f.x)) / L, 0);
  const M = (x: number) => R * x - (w * x * x) / 2 - loads.reduce((s, f) => s + (x > f.x ? f.P * (x - f.x) : 0), 0);
  const V = (x: number, right: boolean) => R - w * x - loads.reduce((s, f) => s + (x > f.x || (right && x === f.x) ? f.P : 0), 0);
  const xs = new Set<number>();
  for (let i = 0; i <= 24; i++) xs.add((L * i) / 24);
  for (const f of loads) xs.add(f.x);
  const stations = [...xs].sort((a, b) => a - b).flatMap((x) => {
    const atLoad = loads.some((f) => f.x === x);
    return atLoad ? [{ x, MEd: M(x), VEd: V(x, false) }, { x, MEd: M(x), VEd: V(x, true) }] : [{ x, MEd: M(x), VEd: V(x, false) }];
  });
  const Rb = w * L + loads.reduce((s, f) => s + f.P, 0) - R;
  return { stations, forces: loads.map((f) => ({ x: f.x, F: f.P, ss: 300 })), reactions: [{ x: 0, R }, { x: L, R: Rb }], sls: [] };
}

const byId = (checks: readonly CheckResult[], id: string) => checks.find((c) => c.id === id)!;

/** EN 1993-1-1 6.3.1.2, curve c: χ from λ̄. */
function chiC(lam: number): number {
  if (lam <= 0.2) return 1;
  const phi = 0.5 * (1 + 0.49 * (lam - 0.2) + lam * lam);
  return Math.min(1, 1 / (phi + Math.sqrt(phi * phi - lam * lam)));
}

describe('a stiffener pair as a strut, EN 1993-1-5 9.4 with EN 1993-1-1 6.3.1 curve c (hand calculation)', () => {
  // web 2000 × 10, flanges 400 × 25, S355; load-bearing flats 2 × 100 × 10 under F = 540 kN at midspan of 10 m
  const L = 10000;
  const section: Section = {
    hw: 2000,
    tw: 10,
    top: { b: 400, t: 25 },
    bot: { b: 400, t: 25 },
    stiffeners: null,
    endPost: 'rigid',
    bearing: { bs: 180, ts: 20, e: 210 },
    loadStiffeners: { bs: 100, ts: 10, xs: [5000] },
    grade: { web: 'S355', top: 'S355', bot: 'S355', stiffener: 'S355' },
  };
  const effects = spanEffects(L, 10, [{ x: 5000, P: 540e3 }]);
  // hand: ε = √(235/355) = 0.8136; strip 15 ε tw = 122.0 mm each side (panels 5000 mm: not limiting)
  const eps = Math.sqrt(235 / 355);
  const strip = 15 * eps * 10;
  const A = (10 + 2 * strip) * 10 + 2 * 100 * 10; // 4541 mm²
  const I = ((10 + 2 * strip) * 10 * 10 * 10) / 12 + 2 * ((10 * 100 * 100 * 100) / 12 + 100 * 10 * (5 + 50) ** 2); // 7.738e6 mm⁴ about the web mid-plane
  const strut = (Lcr: number) => {
    const Ncr = (Math.PI ** 2 * E * I) / (Lcr * Lcr);
    const lam = Math.sqrt((A * 355) / Ncr);
    return { lam, chi: chiC(lam), NbRd: (chiC(lam) * A * 355) / 1.0 };
  };

  test('hand figures at 4 digits (EN 1993-1-1 6.3.1.2, curve c)', () => {
    expectClose(A, 4541, 5e-4, 'A');
    expectClose(I, 7.738e6, 5e-4, 'I');
    // Lcr = hw = 2000: Ncr = 4.009 MN, λ̄ = 0.6341, χ = 0.7650, Nb,Rd = 1233 kN
    expectClose(strut(2000).lam, 0.6341, 5e-4, 'λ̄ (hw)');
    expectClose(strut(2000).chi, 0.765, 5e-4, 'χ (hw)');
    expectClose(strut(2000).NbRd, 1233.2e3, 5e-4, 'Nb,Rd (hw)');
    // Lcr = 0.75 hw = 1500: λ̄ = 0.4756, χ = 0.8566, Nb,Rd = 1381 kN
    expectClose(strut(1500).chi, 0.8566, 5e-4, 'χ (0.75 hw)');
  });

  test('a flange not held laterally at the force: Lcr = hw (9.4(2) asks for more than 0.75 hw); F is in NEd', () => {
    // restraint at the supports only (top and bottom)
    const o = defaultOptions(L, { restraint: { kind: 'at', at: [0, L] } });
    const c = byId(checkGirder(section, effects, o).checks, 'load-bearing-stiffener');
    expect(c.applies).toBe(true);
    expect(c.at).toBe(5000);
    expect(c.values['Lcr']).toBe(2000);
    // the column load itself is in the strut's force (9.4): F = 540 kN; the tension field adds nothing
    // here (eq. 9.7: the largest VEd of the two panels, R = 320 kN, is below fyw hw tw/(√3 γM1 λ̄w²)
    // = 522 kN with λ̄w = 2.803 of the 10 m panel)
    expect(c.values['F']).toBe(540e3);
    expect(c.values['Ntf']).toBe(0);
    expect(c.values['NEd']).toBe(540e3);
    const h = strut(2000);
    expectClose(c.values['A'] as number, A, 1e-9, 'A');
    expectClose(c.values['lambdaBar'] as number, h.lam, 1e-9, 'λ̄');
    expectClose(c.values['chi'] as number, h.chi, 1e-9, 'χ');
    expectClose(c.values['NbRd'] as number, h.NbRd, 1e-9, 'Nb,Rd');
    // fitted end: 2 (bs − snipe) ts fy/γM0 = 2 × 80 × 10 × 355 = 568 kN ≥ 540 kN (0.951), which governs
    // over the strut (540/1233 = 0.438) and the flats' torsion (9.2.1(8): 5.3 fy/E ÷ ts²/(bs² + ts²) = 0.905)
    expectClose(c.values['FbRd'] as number, 2 * (100 - SNIPE) * 10 * 355, 1e-12, 'Fb,Rd');
    expect(c.values['part']).toBe('fitted end');
    expectClose(c.utilisation, 540e3 / (2 * 80 * 10 * 355), 1e-12, 'utilisation');
    expect(c.passes).toBe(true);
  });

  test('both flanges held at the force: Lcr = 0.75 hw (9.4(2))', () => {
    const o = defaultOptions(L, { restraint: { kind: 'at', at: [0, 5000, L] }, restraintBottom: { kind: 'at', at: [0, 5000, L] } });
    const c = byId(checkGirder(section, effects, o).checks, 'load-bearing-stiffener');
    expect(c.values['Lcr']).toBe(1500);
    expectClose(c.values['NbRd'] as number, strut(1500).NbRd, 1e-9, 'Nb,Rd at 0.75 hw');
  });

  test('the pair is a panel boundary: two panels of 5 m, and its mass is in the girder and its self-weight', () => {
    expect(panelsOf([0, L], null, [5000]).panels.map((p) => p.a)).toEqual([5000, 5000]);
    const bare = { ...section, loadStiffeners: null };
    const kg = 2 * 100 * 10 * 2000 * 7850e-9; // one pair of full-depth flats, density 7850 kg/m³ (EN 1991-1-1 Table A.4)
    // its weight stands in the span: girderSelfWeight (N/mm) × L is its mass × g (standard gravity)
    expectClose(girderMass(section, L, [0, L], section.bearing!).total - girderMass(bare, L, [0, L], section.bearing!).total, kg, 1e-9, 'pair mass');
    expectClose((girderSelfWeight(section, [0, L]) - girderSelfWeight(bare, [0, L])) * L, kg * G_ACC, 1e-6, 'self-weight of the pair over the span, N');
  });
});

describe('a 12 m transfer girder under two 3.2 MN column loads (invented scenario)', () => {
  const L = 12000;
  const loads = [
    { x: 4000, P: 3.2e6 },
    { x: 8000, P: 3.2e6 },
  ];
  const effects = spanEffects(L, 20, loads);
  const base: Section = {
    hw: 1400,
    tw: 15,
    top: { b: 500, t: 30 },
    bot: { b: 500, t: 30 },
    stiffeners: null,
    endPost: 'rigid',
    bearing: { bs: 240, ts: 30, e: 150 },
    grade: { web: 'S355', top: 'S355', bot: 'S355', stiffener: 'S355' },
  };
  const withPairs: Section = { ...base, loadStiffeners: { bs: 240, ts: 30, xs: [4000, 8000] } };
  const o = defaultOptions(L, { restraint: { kind: 'at', at: [0, 4000, 8000, L] } });

  test('with stiffeners under the loads: no patch loading, no column load through the web-to-flange welds', () => {
    const v = checkGirder(withPairs, effects, o).checks;
    for (const id of ['patch-loading', 'patch-bending']) {
      expect(byId(v, id).applies, id).toBe(false);
      expect(byId(v, id).reason).toContain('EN 1993-1-5 9.4');
    }
    expect(byId(v, 'web-flange-weld').values['qEd']).toBe(0);
    // without them the same loads are patch loading (EN 1993-1-5 6) and load the top welds
    const u = checkGirder(base, effects, o).checks;
    expect(byId(u, 'patch-loading').applies).toBe(true);
    expect(byId(u, 'patch-loading').values['F']).toBe(3.2e6);
    expect(byId(u, 'patch-loading').passes).toBe(false);
    expect(byId(u, 'web-flange-weld').values['qEd'] as number).toBeGreaterThan(0);
  });

  test('the stiffener check carries the column load plus the tension field (EN 1993-1-5 9.4, 9.3.3(3) eq. 9.7)', () => {
    const c = byId(checkGirder(withPairs, effects, o).checks, 'load-bearing-stiffener');
    expect(c.values['F']).toBe(3.2e6);
    // hand: panels 4 m either side; without the pair one 8 m panel: kτ = 5.34 + 4 (1400/8000)² = 5.4625,
    // λ̄w = 1400/(37.4 × 0.8136 × 15 × √5.4625) = 1.3124; VEd the largest of the two panels, the
    // reaction R = 3.2 MN + 20 × 6000 N = 3.32 MN (the intermediate stiffeners' reading, conservative);
    // Ntf = 3.32 MN − 355 × 1400 × 15/(√3 × 1.0 × 1.3124²) = 3.32 − 2.499 = 0.8209 MN
    const eps = Math.sqrt(235 / 355);
    const lw = 1400 / (37.4 * eps * 15 * Math.sqrt(5.34 + 4 * (1400 / 8000) ** 2));
    const Ntf = 3.32e6 - (355 * 1400 * 15) / (Math.sqrt(3) * lw * lw);
    expectClose(Ntf, 0.8209e6, 5e-4, 'hand Ntf');
    expectClose(c.values['Ntf'] as number, Ntf, 1e-9, 'Ntf');
    expectClose(c.values['NEd'] as number, 3.2e6 + Ntf, 1e-9, 'NEd = F + Ntf');
    // the top flange is held at the loads but the bottom one is not: Lcr = hw
    expect(c.values['Lcr']).toBe(1400);
    expect(c.passes, JSON.stringify(c.values)).toBe(true);
  });
});
