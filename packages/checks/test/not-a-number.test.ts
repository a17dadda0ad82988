import { describe, expect, test } from 'vitest';
import { checkGirder, defaultOptions, type Effects, type Section } from '../src/index.js';
import { governs } from '../src/result.js';

/**
 * A design quantity that is not a number must fail the check that reads it, wherever it comes
 * among the stations, forces or SLS points (consistency property, no published source: the
 * API validates its inputs finite, so this guards the library's own arithmetic). Before, each
 * check kept the largest utilisation with a plain comparison, which a NaN never wins: a NaN that
 * did not come first was skipped and the check could pass.
 */
const L = 12000;
const s: Section = { hw: 1200, tw: 12, top: { b: 400, t: 25 }, bot: { b: 400, t: 25 }, stiffeners: null, endPost: 'rigid', grade: { web: 'S355', top: 'S355', bot: 'S355', stiffener: 'S355' } };
const o = defaultOptions(L);

/** Simply supported span, UDL w (N/mm) and a central force P (N): closed-form M and V (handbook). */
function effects(w: number, P: number): Effects {
  const n = 12;
  const stations = Array.from({ length: n + 1 }, (_, i) => {
    const x = (L * i) / n;
    return { x, MEd: (w * x * (L - x)) / 2 + (P * Math.min(x, L - x)) / 2, VEd: w * (L / 2 - x) + (x < L / 2 ? P / 2 : -P / 2) };
  });
  return {
    stations,
    forces: [
      { x: L / 3, F: P / 2, ss: 200 },
      { x: L / 2, F: P, ss: 200 },
    ],
    reactions: [
      { x: 0, R: (w * L + P) / 2 },
      { x: L, R: (w * L + P) / 2 },
    ],
    sls: [{ name: 'total', ratio: 300, points: stations.map((st) => ({ x: st.x, bend: ((w / 1.4) * st.x * (L ** 3 - 2 * L * st.x ** 2 + st.x ** 3)) / 24, shear: ((w / 1.4) * st.x * (L - st.x)) / 2 })) }],
  };
}

const passing = (e: Effects, id: string) => checkGirder(s, e, o).checks.find((c) => c.id === id)!;

describe('a quantity that is not a number fails the check that reads it', () => {
  const base = effects(20, 1.5e5);
  test('premise: the clean effects pass the checks below', () => {
    for (const id of ['bending', 'shear', 'patch-loading', 'deflection', 'flange-induced-buckling']) expect(passing(base, id).passes).toBe(true);
  });
  test('a moment that is not a number at a middle station fails bending', () => {
    const e = structuredClone(base);
    e.stations[7]!.MEd = Number.NaN;
    expect(passing(e, 'bending').passes).toBe(false);
  });
  test('a force that is not a number (the second of two) fails patch loading', () => {
    const e = structuredClone(base);
    e.forces[1]!.F = Number.NaN;
    expect(passing(e, 'patch-loading').passes).toBe(false);
  });
  test('a deflection term that is not a number at a middle point fails deflection', () => {
    const e = structuredClone(base);
    e.sls[0]!.points[5]!.bend = Number.NaN;
    expect(passing(e, 'deflection').passes).toBe(false);
  });
  test('governs: the larger wins; a NaN wins wherever it comes and then stays', () => {
    expect(governs(0.5, null)).toBe(true);
    expect(governs(0.5, 0.7)).toBe(false);
    expect(governs(0.9, 0.7)).toBe(true);
    expect(governs(Number.NaN, 0.7)).toBe(true);
    expect(governs(2, Number.NaN)).toBe(false);
  });
});
