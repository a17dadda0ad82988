import { expect, test } from 'vitest';
import { checkGirder, defaultOptions, type Effects, type Section } from '../src/index.js';

/**
 * Regression: a station 1e-300 mm from a support made lateral-torsional buckling answer a
 * utilisation that was not a number (Infinity, `null` in the JSON answer; found by the API fuzz,
 * seed 20261203, /v1/checks #239). The Rayleigh–Ritz Mcr integrates the moment diagram by its
 * slopes ΔM/Δx, and 2.052e9 N·mm over 1e-300 mm overflowed. Points closer than 1e-9 of the
 * segment are now one point keeping the larger |M|. Asserted (consistency property, no published
 * source): the utilisation is a finite number, and it is the one of the same diagram with that
 * station exactly at the support (two stations at one x: the envelope keeps the larger moment).
 */
const L = 12000;
const s: Section = { hw: 1200, tw: 12, top: { b: 400, t: 25 }, bot: { b: 400, t: 25 }, stiffeners: null, endPost: 'rigid', grade: { web: 'S355', top: 'S355', bot: 'S355', stiffener: 'S355' } };
// lateral restraint at the supports only (fork ends), so the segment starts at the support
const o = { ...defaultOptions(L), restraint: { kind: 'at', at: [0, L] } } satisfies ReturnType<typeof defaultOptions>;

/** simply supported span, UDL w (N/mm): M = w x (L − x)/2 (handbook closed form), plus a jump to M1 just after x = 0 */
function effects(xNext: number, M1: number): Effects {
  const xs = [0, xNext, ...Array.from({ length: 11 }, (_, i) => (L * (i + 1)) / 12)];
  const w = 40;
  const stations = xs.map((x, i) => ({ x, MEd: i === 1 ? M1 : (w * x * (L - x)) / 2, VEd: w * (L / 2 - x) }));
  return { stations, forces: [], reactions: [{ x: 0, R: (w * L) / 2 }, { x: L, R: (w * L) / 2 }], sls: [] };
}

const ltb = (e: Effects) => checkGirder(s, e, o).checks.find((c) => c.id === 'lateral-torsional-buckling')!;

test('ltb: a station 1e-300 mm from a support still gives a finite utilisation (no overflowed Mcr slope)', () => {
  const M1 = 2.052e9; // N·mm, the fuzzed body's moment
  const near = ltb(effects(1e-300, M1));
  const at = ltb(effects(0, M1));
  expect(at.applies).toBe(true);
  expect(Number.isFinite(at.utilisation)).toBe(true); // premise: the same diagram at x = 0 is a number
  expect(Number.isFinite(near.utilisation)).toBe(true);
  expect(near.utilisation).toBeCloseTo(at.utilisation!, 9);
  expect(Number.isFinite(near.values?.['Mcr'] as number)).toBe(true);
});
