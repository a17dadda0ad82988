import { describe, expect, test } from 'vitest';
import { CHECKS, checkGirder, defaultOptions, type Effects, type Section } from '@platesmith/checks';
import { publishVerdict, VALUE_UNITS } from '@platesmith/schema';
import { expectClose } from '../helpers/close.js';

/**
 * Published units of the checks' values, from the check registry. Before the registry the units
 * were one hand-kept list of keys: `McRd_sagging`, `McRd_hogging`, `MEdMax` (bending),
 * `MRdElastic` (patch-bending) and `MVRd` (bending-shear) were missing from it and were published
 * in N·mm beside values in kNm.
 *
 * Sources: 1 kNm = 10⁶ N·mm and 1 kN = 10³ N (SI); the simply supported span under a uniform load
 * w has its largest moment wL²/8 at midspan (any beam-tables handbook).
 */
const L = 16000;
const w = 30; // N/mm = kN/m

function udl(): Effects {
  const n = 16;
  const stations = Array.from({ length: n + 1 }, (_, i) => {
    const x = (L * i) / n;
    return { x, MEd: (w * x * (L - x)) / 2, VEd: w * (L / 2 - x) };
  });
  return { stations, forces: [{ x: L / 2, F: 1e5, ss: 150 }], reactions: [{ x: 0, R: (w * L) / 2 }, { x: L, R: (w * L) / 2 }], sls: [] };
}

const section: Section = {
  hw: 1200,
  tw: 14,
  top: { b: 400, t: 25 },
  bot: { b: 400, t: 25 },
  stiffeners: { a: 2000, bs: 120, ts: 12, sides: 2 },
  endPost: 'rigid',
  grade: { web: 'S355', top: 'S355', bot: 'S355', stiffener: 'S355' },
};

describe('published units of check values', () => {
  const v = checkGirder(section, udl(), defaultOptions(L));
  const pub = new Map(publishVerdict(v).checks.map((c) => [c.id, c]));
  const bending = pub.get('bending')!.values;

  test('bending: MEdMax in kNm is wL²/8 (simply supported span, uniform load)', () => {
    // w = 30 kN/m, L = 16 m: wL²/8 = 960 kNm; published to 5 significant figures
    expectClose(bending['MEdMax'] as number, (30 * 16 * 16) / 8, 1e-5, 'MEdMax');
  });

  test('bending: the per-sign McRd is the McRd of that sign, both in kNm', () => {
    expect(bending['sign']).toBe('sagging');
    expect(bending['McRd_sagging']).toBe(bending['McRd']);
  });

  test('patch-bending: MRdElastic is the bending check\'s Mel,Rd, both in kNm (Class 1–3 section)', () => {
    expect(bending['sectionClass']).toBeLessThanOrEqual(3);
    expect(pub.get('patch-bending')!.values['MRdElastic']).toBe(bending['MelRd']);
  });

  test('every force, moment and line force of the registry is published in kN, kNm, kN/m', () => {
    const want = { N: 'kN', Nmm: 'kNm', 'N/mm': 'kN/m', mm: 'mm', mm2: 'mm2', mm3: 'mm3', mm4: 'mm4', MPa: 'MPa', '-': '-' } as const;
    for (const c of CHECKS) {
      for (const [k, u] of Object.entries(c.values as Record<string, keyof typeof want | 'text'>)) {
        if (u === 'text') expect.soft(VALUE_UNITS[c.id][k], `${c.id}.${k}`).toBeUndefined();
        else expect.soft(VALUE_UNITS[c.id][k], `${c.id}.${k}`).toBe(want[u]);
      }
    }
  });

  test('a value in kN is the internal value in N over 10³ (shear: VplRd)', () => {
    const internal = v.checks.find((c) => c.id === 'shear')!.values['VplRd'] as number;
    expectClose(pub.get('shear')!.values['VplRd'] as number, internal / 1e3, 1e-5, 'VplRd (5 significant figures)');
  });
});
