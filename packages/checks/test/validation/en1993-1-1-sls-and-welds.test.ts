/**
 * - Deflection: handbook closed forms for a simply supported span under uniform load w:
 *   bending δ = 5wL⁴/(384EI) and shear δ = wL²/(8 G Av) (Roark's Formulas for Stress and Strain,
 *   7th ed., Young & Budynas, McGraw-Hill 2002, Table 8.1, uniform load on a simply supported beam;
 *   the shear term is Timoshenko & Gere, Mechanics of Materials, shear deflection of beams — both from memory).
 * - Fillet welds, EN 1993-1-8:2005 4.5.3.3 eqs. 4.3–4.4 and Table 4.1 (βw), from memory: no published
 *   web-to-flange weld worked example was found, so these are formula checks (regression).
 */
import { describe, expect, test } from 'vitest';
import { expectClose } from '../../../../test/helpers/close.js';
import { deflection, unitLoadIntegrals } from '../../src/sls/deflection.js';
import { fvwd, fwRd, pickThroat, shearFlow, weldForcePerLength } from '../../src/en1993-1-8/weld.js';
import { betaW } from '@platesmith/catalogue';

describe('simply supported span, UDL: virtual-work integrals against the handbook closed forms', () => {
  const L = 24000;
  const w = 30; // N/mm
  const n = 240;
  const pts = Array.from({ length: n + 1 }, (_, i) => {
    const x = (i * L) / n;
    return { x, M: (w * x * (L - x)) / 2, V: w * (L / 2 - x) };
  });
  test('midspan: ∫Mm = 5wL⁴/384, ∫Vv = wL²/8 (piecewise-linear M on 240 intervals: 1e-4)', () => {
    const r = unitLoadIntegrals(pts, 0, L, L / 2);
    expectClose(r.bend, (5 * w * L ** 4) / 384, 1e-4, 'bend');
    expectClose(r.shear, (w * L * L) / 8, 1e-9, 'shear (V linear: exact)');
    const E = 210000;
    const Iy = 2e10;
    const d = deflection({ bend: r.bend, shear: r.shear, E, Iy, G: 81000, Av: 18000 });
    expectClose(d, (5 * w * L ** 4) / (384 * E * Iy) + (w * L * L) / (8 * 81000 * 18000), 1e-4, 'δ');
  });
  test('quarter span: EI δ = w x (L³ − 2Lx² + x³)/24 at x = L/4 (same handbook table)', () => {
    const x = L / 4;
    const r = unitLoadIntegrals(pts, 0, L, x);
    expectClose(r.bend, (w * x * (L ** 3 - 2 * L * x * x + x ** 3)) / 24, 1e-4, 'bend at L/4');
  });
});

describe('EN 1993-1-8 4.5.3.3 simplified method (formula, no worked example found)', () => {
  test('fvw,d = fu/(√3 βw γM2): S355, fu = 470 (EN 10025-2), βw = 0.9 (Table 4.1), γM2 = 1.25 → 241.2 MPa', () => {
    expect.soft(betaW('S355')).toBe(0.9);
    expectClose(fvwd(470, 0.9, 1.25), 470 / (Math.sqrt(3) * 0.9 * 1.25), 1e-12, 'fvw,d');
    expectClose(fvwd(470, 0.9, 1.25), 241.2, 0.0005, 'fvw,d to 4 s.f. (regression)');
  });
  test('two welds share v; direct load adds vectorially; the smallest passing throat is picked', () => {
    expectClose(shearFlow(-1e6, 1e7, 1e10), 1000, 1e-12, 'v = |V| Sf / Iy');
    expectClose(weldForcePerLength(600, 800), 500, 1e-12, '√(300² + 400²)');
    const f = fvwd(470, 0.9, 1.25);
    const p = pickThroat([3, 4, 5, 6], 4.5 * f, f);
    expect.soft(p).toEqual({ a: 5, passes: true });
    expect.soft(pickThroat([3, 4], 4.5 * f, f)).toEqual({ a: 4, passes: false });
    expectClose(fwRd(5, f), 5 * f, 1e-12, 'Fw,Rd = a fvw,d');
  });
});
