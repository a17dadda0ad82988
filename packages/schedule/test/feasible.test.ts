/**
 * The rationalisation's feasibility checks (feasibleFor: one analysis per stiffener spacing, each
 * candidate stopped at its first failing check) against the plain path a standalone check takes
 * (sectionPassesFor: toCheckProblem and checkGirder for every pair). Oracle: the check library
 * itself on the full path (consistency, no published value asserted; the checks are validated
 * against published examples in their own package).
 */
import { expect } from 'vitest';
import { test as prop, fc } from '@fast-check/vitest';
import type { SectionJson } from '@platesmith/schema';
import { feasibleFor, sectionKey, sectionMassPerMetre, sectionPassesFor, type RationaliseCandidate } from '@platesmith/schedule';

const plate = fc.constantFrom(12, 15, 20, 25, 30, 35, 40);
const section = fc
  .record({
    hw: fc.integer({ min: 60, max: 140 }).map((v) => v * 10),
    tw: fc.constantFrom(8, 10, 12),
    bt: fc.integer({ min: 25, max: 50 }).map((v) => v * 10),
    tt: plate,
    bb: fc.integer({ min: 25, max: 50 }).map((v) => v * 10),
    tb: plate,
    a: fc.option(fc.constantFrom(1500, 2000, 3000), { nil: null }),
  })
  .map(
    (r): SectionJson => ({
      web: { depth: r.hw, thickness: r.tw },
      topFlange: { width: r.bt, thickness: r.tt },
      bottomFlange: { width: r.bb, thickness: r.tb },
      stiffeners: r.a === null ? null : { spacing: r.a, width: 100, thickness: 10, sides: 2 },
      endPost: 'rigid',
      grade: 'S355',
    }),
  );

const problem = fc.record({
  spans: fc.oneof(fc.tuple(fc.integer({ min: 50, max: 120 }).map((v) => v * 100)), fc.tuple(fc.integer({ min: 50, max: 100 }).map((v) => v * 100), fc.integer({ min: 50, max: 100 }).map((v) => v * 100))),
  g: fc.integer({ min: 3, max: 15 }),
  q: fc.integer({ min: 3, max: 20 }),
  restraint: fc.constantFrom<unknown>('continuous', { spacing: 2500 }, 'continuous'),
});

prop.prop([problem, fc.array(section, { minLength: 1, maxLength: 8 })], { numRuns: 40 })('feasibleFor gives sectionPassesFor for every candidate', (p, sections) => {
  const fields = {
    spans: p.spans,
    actions: [
      { kind: 'permanent', load: 'udl', value: p.g },
      { kind: 'variable', load: 'udl', value: p.q, category: 'B' },
    ],
    options: { restraint: p.restraint },
    space: { panels: [0] },
  };
  const seen = new Set<string>();
  const candidates: RationaliseCandidate[] = [];
  for (const s of sections) {
    const id = sectionKey(s);
    if (seen.has(id)) continue;
    seen.add(id);
    candidates.push({ id, section: s, massPerMetre: sectionMassPerMetre(s) });
  }
  expect(feasibleFor(fields, candidates)).toEqual(candidates.map((c) => sectionPassesFor(fields, c.section)));
});
