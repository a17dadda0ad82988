/**
 * Every numeric value a check publishes has a unit in the published map (VALUE_UNITS, or '-' for
 * a ratio), and no published number carries binary round-off (e.g. 31826.286400000005). The
 * checks are run on a spread of invented sections and problems (symmetric and mono-symmetric,
 * stiffened and not, sagging and hogging, point loads, one and two spans, effects given) so that
 * every check publishes its values; the test fails when a check adds a key nobody classified.
 * No published source: a contract of the public JSON.
 */
import { describe, expect, test } from 'vitest';
import { CheckEffectsInput, CheckProblemInput, parseWith, publishVerdict, runCheckJob, toCheckEffects, toCheckProblem, unitOf, type PublishedVerdict } from '@platesmith/schema';
import { checkGirder } from '@platesmith/checks';

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
