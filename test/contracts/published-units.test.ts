/**
 * Every numeric value a check publishes has a unit in the published map (VALUE_UNITS, or '-' for
 * a ratio), and no published number carries binary round-off (e.g. 31826.286400000005). The
 * checks are run on a spread of invented sections and problems (symmetric and mono-symmetric,
 * stiffened and not, sagging and hogging, point loads, one and two spans, effects given) so that
 * every check publishes its values; the test fails when a check adds a key nobody classified.
 * No published source: a contract of the public JSON.
 */
import { describe, expect, test } from 'vitest';
import { CheckEffectsInput, CheckProblemInput, parseWith, publishVerdict, runCheckJob, toCheckEffects, toCheckProblem, unitOf, VALUE_UNITS, type PublishedVerdict } from '@platesmith/schema';
import { CHECKS, checkGirder, defaultOptions, type Effects, type Section } from '@platesmith/checks';
import { expectClose } from '../helpers/close.js';

const SECTION = {
  web: { depth: 1400, thickness: 12 },
  topFlange: { width: 450, thickness: 30 },
  bottomFlange: { width: 450, thickness: 30 },
  stiffeners: { spacing: 2400, width: 120, thickness: 12, sides: 2 },
  endPost: 'rigid',
  grade: 'S355',
};
const MONO = { ...SECTION, web: { depth: 1100, thickness: 10 }, topFlange: { width: 300, thickness: 20 }, bottomFlange: { width: 400, thickness: 25 }, stiffeners: null, endPost: 'non-rigid' };

const problems: unknown[] = [
  {
    section: SECTION,
    spans: [20000],
    actions: [
      { kind: 'permanent', load: 'udl', value: 18 },
      { kind: 'variable', load: 'udl', value: 24, category: 'B' },
      { kind: 'variable', load: 'point', value: 300, at: 8000, category: 'B', psi0: 0.6, ss: 150 },
    ],
    options: { restraint: { spacing: 5000 } },
  },
  {
    section: MONO,
    spans: [15000, 15000],
    actions: [
      { kind: 'permanent', load: 'udl', value: 12 },
      { kind: 'variable', load: 'udl', value: 20, category: 'E' },
    ],
    options: { restraint: 'supports', bottomRestraint: { spacing: 3000 }, ltbMethod: 'rolled-equivalent', ltbModification: true },
  },
  {
    section: { ...MONO, grade: { web: 'S275', flanges: 'S460' } },
    spans: [12000],
    actions: [
      { kind: 'permanent', load: 'udl', value: 30 },
      { kind: 'variable', load: 'point', value: 600, at: 6000, category: 'C', ss: 50 },
    ],
    combination: '6.10ab',
  },
];
const raw = {
  section: SECTION,
  span: 24000,
  effects: [
    { x: 0, M: 0, V: 950 },
    { x: 4800, M: 7000, V: 1900 },
    { x: 8000, M: 5067, V: 317, F: 300, ss: 150 },
    { x: 12000, M: 5700, V: 0 },
    { x: 24000, M: 0, V: -950 },
  ],
  sls: [{ name: 'total', ratio: 250, udl: 55 }],
  options: { restraint: { spacing: 6000 } },
};

function verdicts(): PublishedVerdict[] {
  const out: PublishedVerdict[] = [];
  for (const p of problems) {
    const parsed = parseWith(CheckProblemInput, p);
    if (!parsed.ok) throw new Error(JSON.stringify(parsed.issues));
    out.push(publishVerdict(runCheckJob(toCheckProblem(parsed.value))));
  }
  const r = parseWith(CheckEffectsInput, raw);
  if (!r.ok) throw new Error(JSON.stringify(r.issues));
  const { section, effects, options } = toCheckEffects(r.value);
  out.push(publishVerdict(checkGirder(section, effects, options)));
  return out;
}

describe('published check values', () => {
  const vs = verdicts();
  const all = vs.flatMap((v) => v.checks);

  test('the invented cases exercise every check that can apply', () => {
    const applied = new Set(all.filter((c) => c.applies).map((c) => c.id));
    expect([...applied].sort()).toEqual(
      ['bearing-stiffener', 'bending', 'bending-shear', 'classification', 'deflection', 'end-post', 'flange-induced-buckling', 'lateral-torsional-buckling', 'patch-bending', 'patch-loading', 'shear', 'shear-buckling', 'stiffener-stiffness', 'stiffener-strength', 'stiffener-torsion', 'web-flange-weld'].sort(),
    );
  });

  test('every numeric value key has a unit in the published map', () => {
    const missing = new Set<string>();
    for (const c of all) for (const [k, v] of Object.entries(c.values)) if (typeof v === 'number' && unitOf(k, c.id) === undefined) missing.add(`${c.id}.${k}`);
    expect([...missing].sort()).toEqual([]);
  });

  test('a key that means a length in one check and a ratio in another gets the unit of its check', () => {
    expect([unitOf('limit', 'deflection'), unitOf('limit', 'flange-induced-buckling'), unitOf('limit', 'stiffener-torsion'), unitOf('McRd_hogging')]).toEqual(['mm', '-', '-', 'kNm']);
  });

  test('each check publishes the unit of each of its numeric values beside them', () => {
    for (const c of all) {
      const numeric = Object.entries(c.values).filter(([, v]) => typeof v === 'number').map(([k]) => k).sort();
      expect.soft(Object.keys(c.units).sort(), c.id).toEqual(numeric);
    }
  });

  test('moments are published in kNm: no value of a moment key above 1e6 (N·mm leaking through)', () => {
    for (const c of all)
      for (const [k, v] of Object.entries(c.values)) if (typeof v === 'number' && unitOf(k, c.id) === 'kNm') expect.soft(Math.abs(v), `${c.id}.${k}`).toBeLessThan(1e6);
  });

  test('numbers are rounded: at most 5 significant figures (utilisations 4 decimals), integers for counts', () => {
    const sig = (v: number) => (v === 0 ? 0 : v.toPrecision(15).replace(/^-?0\.0*/, '').replace(/\./, '').replace(/0+e.*$|0+$/, '').length);
    for (const c of all) {
      for (const [k, v] of Object.entries(c.values)) if (typeof v === 'number' && Number.isFinite(v)) expect.soft(sig(Math.abs(Math.round(v) === v ? 1 : v)), `${c.id}.${k} = ${v}`).toBeLessThanOrEqual(5);
      if (c.utilisation !== null) expect.soft(Math.round(c.utilisation * 1e4) / 1e4).toBe(c.utilisation);
    }
  });
});

/**
 * Published units of the checks' values, from the check registry. Before the registry the units
 * were one hand-kept list of keys: `McRd_sagging`, `McRd_hogging`, `MEdMax` (bending),
 * `MRdElastic` (patch-bending) and `MVRd` (bending-shear) were missing from it and were published
 * in N·mm beside values in kNm.
 *
 * Sources: 1 kNm = 10⁶ N·mm and 1 kN = 10³ N (SI); the simply supported span under a uniform load
 * w has its largest moment wL²/8 at midspan (any beam-tables handbook).
 */
const L16 = 16000;
const w = 30; // N/mm = kN/m

function udl(): Effects {
  const n = 16;
  const stations = Array.from({ length: n + 1 }, (_, i) => {
    const x = (L16 * i) / n;
    return { x, MEd: (w * x * (L16 - x)) / 2, VEd: w * (L16 / 2 - x) };
  });
  return { stations, forces: [{ x: L16 / 2, F: 1e5, ss: 150 }], reactions: [{ x: 0, R: (w * L16) / 2 }, { x: L16, R: (w * L16) / 2 }], sls: [] };
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

describe('published units of check values, against closed forms (regression of the unclassified keys)', () => {
  const v = checkGirder(section, udl(), defaultOptions(L16));
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
