import type { Effects } from '@platesmith/checks';
import { analyse } from '@platesmith/actions';
import type { LoadModel } from '../src/index.js';
import { affineDemandBound, type AffineDemand } from '../src/index.js';

/**
 * Test fixture (not a product feature): a simply supported span L (mm) under a design UDL q (N/mm)
 * plus γG × self-weight g, a central point load P (N), closed forms M = w x (L − x)/2, V = w (L/2 − x)
 * (handbook closed forms). SLS: total with the characteristic load qk + g.
 */
export function simpleSpanModel(L: number, q: number, P: number, qk: number, gammaG = 1.35, n = 24): LoadModel {
  const xs = Array.from({ length: n + 1 }, (_, i) => (L * i) / n);
  const M = new Float64Array(xs.map((x) => (q * x * (L - x)) / 2 + (P * Math.min(x, L - x)) / 2));
  const Mg = new Float64Array(xs.map((x) => (gammaG * x * (L - x)) / 2));
  const V = new Float64Array(xs.map((x) => q * (L / 2 - x) + (x < L / 2 ? P / 2 : -P / 2)));
  const Vg = new Float64Array(xs.map((x) => gammaG * (L / 2 - x)));
  const demand: AffineDemand = { M: [M], Mg: [Mg], V: [V], Vg: [Vg] };
  return {
    effects(g: number): Effects {
      const w = q + gammaG * g;
      return {
        stations: xs.map((x, i) => ({ x, MEd: M[i]! + g * Mg[i]!, VEd: V[i]! + g * Vg[i]! })),
        forces: P > 0 ? [{ x: L / 2, F: P, ss: 150 }] : [],
        reactions: [
          { x: 0, R: (w * L) / 2 + P / 2 },
          { x: L, R: (w * L) / 2 + P / 2 },
        ],
        sls: [
          {
            name: 'total',
            ratio: 250,
            points: xs.map((x) => {
              const wk = qk + g;
              return { x, bend: (wk * x * (L ** 3 - 2 * L * x * x + x ** 3)) / 24, shear: (wk * x * (L - x)) / 2 };
            }),
          },
        ],
      };
    },
    demandLowerBound: (gLo, gHi) => affineDemandBound(demand, gLo, gHi),
    deflectionFloor: (gLo) =>
      xs.map((x) => ({ bend: ((qk + gLo) * x * (L ** 3 - 2 * L * x * x + x ** 3)) / 24, shear: ((qk + gLo) * x * (L - x)) / 2, limit: L / 250 })),
  };
}

/**
 * Test fixture: the analysis of a girder over `spans` (mm) under a permanent UDL g and a variable
 * UDL q (kN/m, category B) and, when P > 0, a variable point load P (kN, category E) at `at` of the
 * first span. The beams the property tests of the load model's bounds draw.
 */
export function beamAnalysis(b: { spans: number[]; g: number; q: number; P: number; combination: '6.10' | '6.10ab' }, at = 1 / 3) {
  return analyse({
    spans: b.spans,
    actions: [
      { kind: 'permanent', load: 'udl', value: b.g },
      { kind: 'variable', load: 'udl', value: b.q, category: 'B' },
      ...(b.P > 0 ? [{ kind: 'variable' as const, load: 'point' as const, value: b.P * 1e3, at: b.spans[0]! * at, ss: 150, category: 'E' }] : []),
    ],
    combination: b.combination,
  });
}
