import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { checkGirder } from '@platesmith/checks';
import { CheckEffectsInput, CheckProblemInput, parseWith, publishVerdict, toCheckEffects, toCheckProblem, toSearchTask, SearchInput } from '@platesmith/schema';
import { describe, expect, test } from 'vitest';

/**
 * Issue 17, item 1: no default may remove or weaken a check, and every answer lists the defaults
 * it applied. Omitting `options.restraint` used to mean "top flange restrained continuously"
 * (lateral-torsional buckling skipped): the example turned from FAILS to PASSES.
 */
const demo = JSON.parse(readFileSync(fileURLToPath(new URL('../../examples/check-demo.json', import.meta.url)), 'utf8')) as { options: Record<string, unknown> };

function verdictOf(input: unknown) {
  const p = parseWith(CheckEffectsInput, input);
  if (!p.ok) throw new Error(JSON.stringify(p.issues));
  const { section, effects, options, assumptions } = toCheckEffects(p.value);
  return publishVerdict(checkGirder(section, effects, options), assumptions);
}

describe('a missing restraint is the conservative one', () => {
  test('examples/check-demo.json without restraint still FAILS on lateral-torsional buckling', () => {
    const { restraint: _gone, ...options } = demo.options;
    const v = verdictOf({ ...demo, options });
    const ltb = v.checks.find((c) => c.id === 'lateral-torsional-buckling')!;
    expect(ltb.applies).toBe(true);
    expect(ltb.passes).toBe(false);
    expect(v.passes).toBe(false);
    // restrained at the supports only: one 24 m segment, longer than the 6 m of the example
    expect(ltb.values['Lseg']).toBe(24000);
    expect(v.assumptions).toContainEqual(expect.objectContaining({ field: 'options.restraint', value: 'supports' }));
  });

  test('the example as given (its own restraints) checks LTB over its shorter segments, and lists no restraint assumption', () => {
    const v = verdictOf(demo);
    const ltb = v.checks.find((c) => c.id === 'lateral-torsional-buckling')!;
    expect(ltb.applies).toBe(true);
    expect(ltb.values['Lseg'] as number).toBeLessThan(24000);
    expect(v.assumptions!.map((a) => a.field)).not.toContain('options.restraint');
  });
});

describe('every answer lists the defaults it applied', () => {
  const problem = { spans: [12000], actions: [{ kind: 'permanent', load: 'udl', value: 10 }, { kind: 'variable', load: 'udl', value: 15, category: 'B' }] };
  const section = { web: { depth: 1000, thickness: 10 }, topFlange: { width: 300, thickness: 20 }, bottomFlange: { width: 300, thickness: 20 } };

  test('a bare problem: restraint, load height, factor set (not the bridge set), combination, fy source, end post, bearing, snipe, weld throats', () => {
    const p = parseWith(CheckProblemInput, { ...problem, section });
    if (!p.ok) throw new Error('parse');
    const fields = new Map(toCheckProblem(p.value).assumptions.map((a) => [a.field, a]));
    for (const f of ['options.restraint', 'options.bottomRestraint', 'options.loadHeight', 'options.factors', 'combination', 'factors', 'options.fySource', 'section.endPost', 'section.bearing', 'options.supportBearingLength', 'options.snipe', 'options.weldThroats', 'deflection']) {
      expect(fields.has(f), f).toBe(true);
    }
    expect(fields.get('options.factors')!.note).toMatch(/not the bridge set/);
    expect(fields.get('options.weldThroats')!.value).toEqual([3, 4, 5, 6, 7, 8, 10, 12]);
  });

  test('given values are not listed as assumed', () => {
    const p = parseWith(CheckProblemInput, { ...problem, combination: '6.10ab', section: { ...section, endPost: 'non-rigid', grade: 'S275' }, options: { factors: 'bridges', restraint: 'continuous', loadHeight: 'shear-centre' } });
    if (!p.ok) throw new Error('parse');
    const fields = toCheckProblem(p.value).assumptions.map((a) => a.field);
    for (const f of ['combination', 'section.endPost', 'section.grade', 'options.factors', 'options.restraint', 'options.loadHeight']) expect(fields).not.toContain(f);
  });

  test('a search task carries them too', () => {
    const p = parseWith(SearchInput, { ...problem, space: { panels: [0] } });
    if (!p.ok) throw new Error('parse');
    const fields = toSearchTask(p.value).assumptions.map((a) => a.field);
    expect(fields).toContain('options.restraint');
    expect(fields).toContain('space');
  });
});
