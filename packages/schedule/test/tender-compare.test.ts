/**
 * Nightly regression comparison and its writers.
 * Status rules are this project's definitions (common practice, no source). The JUnit XML is
 * checked for well-formedness with an independent XML validator (fast-xml-parser XMLValidator)
 * and for the element and attribute names of the JUnit XML format as read by CI tools
 * (testsuites / testsuite / testcase / failure / skipped / system-out — from memory).
 */
import { describe, expect, test } from 'vitest';
import { test as prop, fc } from '@fast-check/vitest';
import { XMLParser, XMLValidator } from 'fast-xml-parser';
import { compare, markRecord, toJUnit, toMarkdown, type MarkRecord } from '../src/tender/index.js';

const rec = (mark: string, o: Partial<MarkRecord> = {}): MarkRecord => ({ mark, lightestMass: 5000, lightestGoverning: 'bending', ...o });

describe('compare: one status per mark', () => {
  test.for([
    ['unchanged', rec('G', { adoptedPasses: true, adoptedGoverning: 'bending' }), rec('G', { adoptedPasses: true, adoptedGoverning: 'bending' }), 'pass', []],
    ['within tolerance', rec('G'), rec('G', { lightestMass: 5049 }), 'pass', []],
    ['adopted now fails', rec('G', { adoptedPasses: true, adoptedGoverning: 'bending' }), rec('G', { adoptedPasses: false, adoptedGoverning: 'shear-buckling' }), 'regressed', ['adopted section passed and now fails (governing: shear-buckling)', 'adopted governing check bending → shear-buckling']],
    ['mass moved', rec('G'), rec('G', { lightestMass: 5300 }), 'changed', ['lightest mass 5000.0 kg → 5300.0 kg (+6.00 %, tolerance 1.00 %)']],
    ['governing moved', rec('G'), rec('G', { lightestGoverning: 'deflection' }), 'changed', ['lightest governing check bending → deflection']],
    ['feasibility lost', rec('G'), rec('G', { lightestMass: null, lightestGoverning: null }), 'changed', ['no feasible section any more']],
    ['adopted failed, now passes', rec('G', { adoptedPasses: false, adoptedGoverning: 'bending' }), rec('G', { adoptedPasses: true, adoptedGoverning: 'bending' }), 'changed', ['adopted section failed and now passes']],
  ] as const)('%s', ([, was, now, status, reasons]) => {
    const [r] = compare([was], [now], { massTolerance: 0.01 });
    expect(r).toEqual({ mark: 'G', status, reasons, baseline: was, current: now });
  });

  test('new and removed marks; baseline order then new marks', () => {
    const out = compare([rec('A'), rec('B')], [rec('C'), rec('A')], { massTolerance: 0 });
    expect(out.map((r) => [r.mark, r.status])).toEqual([
      ['A', 'pass'],
      ['B', 'removed'],
      ['C', 'new'],
    ]);
  });

  test('markRecord reads a published search and adopted verdict', () => {
    const r = markRecord('G1', { lightest: { mass: 4321.5, governing: { id: 'shear-buckling' } } } as never, { passes: false, governing: { id: 'bending' } } as never);
    expect(r).toEqual({ mark: 'G1', lightestMass: 4321.5, lightestGoverning: 'shear-buckling', adoptedPasses: false, adoptedGoverning: 'bending' });
    expect(markRecord('G2', null, null)).toEqual({ mark: 'G2', lightestMass: null, lightestGoverning: null });
  });

  test('bad tolerance and duplicate marks are domain errors', () => {
    expect(() => compare([], [], { massTolerance: -1 })).toThrow(/massTolerance/);
    expect(() => compare([rec('A'), rec('A')], [], { massTolerance: 0 })).toThrow(/twice/);
  });
});

describe('toJUnit', () => {
  const results = compare(
    [rec('G1', { adoptedPasses: true }), rec('G2'), rec('G<3> & "x"'), rec('old')],
    [rec('G1', { adoptedPasses: false, adoptedGoverning: 'bending' }), rec('G2'), rec('G<3> & "x"', { lightestMass: 9000 }), rec('G4')],
    { massTolerance: 0.01 },
  );
  const xml = toJUnit(results);

  test('well-formed, one testcase per mark, a failure for the regressed mark only', () => {
    expect(XMLValidator.validate(xml)).toBe(true);
    const doc = new XMLParser({ ignoreAttributes: false, attributeNamePrefix: '' }).parse(xml);
    const suite = doc.testsuites.testsuite;
    expect.soft(suite.tests).toBe('5');
    expect.soft(suite.failures).toBe('1');
    expect.soft(suite.skipped).toBe('1');
    const cases = suite.testcase as { name: string; failure?: unknown; skipped?: unknown }[];
    expect.soft(cases.map((c) => c.name)).toEqual(['G1', 'G2', 'G<3> & "x"', 'old', 'G4']);
    expect.soft(cases.filter((c) => c.failure !== undefined).map((c) => c.name)).toEqual(['G1']);
    expect.soft(cases.filter((c) => c.skipped !== undefined).map((c) => c.name)).toEqual(['old']);
  });

  prop.prop([fc.array(fc.string({ unit: 'binary', maxLength: 12 }), { minLength: 1, maxLength: 6 })], { numRuns: 200 })('any mark text stays well-formed', (marks) => {
    const uniq = [...new Set(marks)];
    const out = compare(
      uniq.map((m) => rec(m, { adoptedPasses: true })),
      uniq.map((m) => rec(m, { adoptedPasses: false, adoptedGoverning: `${m}<&>` })),
      { massTolerance: 0 },
    );
    expect(XMLValidator.validate(toJUnit(out))).toBe(true);
  });
});

test('toMarkdown: counts, a row per non-passing mark, pipes escaped', () => {
  const out = compare([rec('A|1'), rec('B')], [rec('A|1', { lightestMass: 6000 }), rec('B')], { massTolerance: 0.01 });
  const md = toMarkdown(out);
  expect(md).toBe(
    [
      '## Girder schedule regression',
      '',
      '2 marks: 0 regressed, 1 changed, 0 new, 0 removed, 1 pass.',
      '',
      '| Mark | Status | Lightest, kg (baseline → current) | Governing (baseline → current) | Reasons |',
      '|---|---|---:|---|---|',
      '| A\\|1 | changed | 5000.0 → 6000.0 | bending → bending | lightest mass 5000.0 kg → 6000.0 kg (+20.00 %, tolerance 1.00 %) |',
      '',
    ].join('\n'),
  );
  expect(toMarkdown(compare([rec('B')], [rec('B')], { massTolerance: 0 }))).toContain('No mark changed.');
});
