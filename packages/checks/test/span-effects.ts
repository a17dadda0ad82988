/**
 * Test fixture shared by the check library's property tests: the design effects of a simply
 * supported span under a UDL and a central force, from the handbook closed forms
 * M = w x (L − x)/2 + P min(x, L − x)/2, V = w (L/2 − x) ± P/2, and the SLS deflection demands of
 * the UDL at its characteristic level (w/1.4), E·I·δ = w x (L³ − 2 L x² + x³)/24, G·Av·δs = w x (L − x)/2.
 */
import type { Effects } from '../src/index.js';

/** Simply supported span under a UDL w (N/mm) and a central force P (N): closed-form M, V (handbook). */
export function effectsOf(L: number, w: number, P: number, sag: boolean): Effects {
  const n = 16;
  const sgn = sag ? 1 : -1;
  const stations = Array.from({ length: n + 1 }, (_, i) => {
    const x = (L * i) / n;
    return { x, MEd: sgn * ((w * x * (L - x)) / 2 + (P * Math.min(x, L - x)) / 2), VEd: sgn * (w * (L / 2 - x) + (x < L / 2 ? P / 2 : -P / 2)) };
  });
  return {
    stations,
    forces: P > 0 ? [{ x: L / 2, F: P, ss: 150 }] : [],
    reactions: [
      { x: 0, R: (w * L + P) / 2 },
      { x: L, R: (w * L + P) / 2 },
    ],
    sls: [{ name: 'total', ratio: 250, points: stations.map((s) => ({ x: s.x, bend: ((w / 1.4) * s.x * (L * L * L - 2 * L * s.x * s.x + s.x * s.x * s.x)) / 24, shear: ((w / 1.4) * s.x * (L - s.x)) / 2 })) }],
  };
}
