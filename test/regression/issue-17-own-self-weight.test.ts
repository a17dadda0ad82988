import { checkGirder, girderMass } from '@platesmith/checks';
import { CheckProblemInput, fromSection, parseWith, SearchInput, toCheckProblem, toSearchTask } from '@platesmith/schema';
import { problemOf, search } from '@platesmith/search';
import { describe, expect, test } from 'vitest';

/**
 * Issue 17, item 5: the search's verdict is `check`'s verdict. The search used to give every
 * candidate the self-weight of the heaviest stiffener layout of the space; `check` gives a section
 * its own. A lighter layout that `check` passes could then be reported as failing, and the search
 * returned a heavier girder than the lightest that passes.
 *
 * The reference here is `check` itself, through the public path (the problem form of a check
 * request, its own analysis and self-weight): every candidate of a small space is checked that
 * way, and the search's answer must be exactly the lightest passing one at each depth. The
 * scenario is invented for this test (a 16 m simple span, UDL and one variable point load).
 */
const problem = {
  spans: [16000],
  actions: [
    { kind: 'permanent', load: 'udl', value: 14 },
    { kind: 'variable', load: 'udl', value: 20, category: 'B' },
    { kind: 'variable', load: 'point', value: 140, at: 7000, category: 'B' },
  ],
  options: { restraint: { spacing: 3200 } },
};
const hws = [1100, 1300];
const tws = [8, 10];
const bfs = [300, 350];
const tfs = [12, 15, 18];
const panels = [0, 4, 6];
const flats = [
  { width: 100, thickness: 10 },
  { width: 120, thickness: 12 },
];

/** Every candidate of the space as a section of a check request (symmetric flanges, two-sided flats, non-rigid end posts, S355). */
function candidates(): Record<string, unknown>[] {
  const out: Record<string, unknown>[] = [];
  for (const depth of hws)
    for (const thickness of tws)
      for (const width of bfs)
        for (const tf of tfs)
          for (const n of panels)
            for (const flat of n === 0 ? [null] : flats) {
              const flange = { width, thickness: tf };
              out.push({
                web: { depth, thickness },
                topFlange: flange,
                bottomFlange: flange,
                stiffeners: flat ? { spacing: 16000 / n, width: flat.width, thickness: flat.thickness, sides: 2 } : null,
                endPost: 'non-rigid',
                grade: 'S355',
              });
            }
  return out;
}

function checked(section: Record<string, unknown>) {
  const p = parseWith(CheckProblemInput, { ...problem, section });
  if (!p.ok) throw new Error(JSON.stringify(p.issues));
  const job = toCheckProblem(p.value);
  const verdict = checkGirder(job.section, job.effects, job.options);
  const depth = job.section.hw + job.section.top.t + job.section.bot.t;
  const mass = girderMass(job.section, 16000, [0, 16000], verdict.bearing).total;
  return { verdict, depth, mass, g: job.g };
}

describe('the search returns exactly what check passes, each candidate with its own self-weight', () => {
  const input = parseWith(SearchInput, {
    ...problem,
    space: { webDepth: hws, webThickness: tws, flangeWidth: bfs, flangeThickness: tfs, symmetric: true, panels, flats, stiffenerSides: 2, endPost: 'non-rigid', grade: 'S355' },
  });
  if (!input.ok) throw new Error(JSON.stringify(input.issues));
  const result = search(problemOf(toSearchTask(input.value)));
  const all = candidates().map(checked);

  test('the space is the one enumerated here, and check passes some of it and fails some', () => {
    expect(all.length).toBe(2 * 2 * 2 * 3 * (1 + 2 * 2));
    expect(all.some((c) => c.verdict.passes)).toBe(true);
    expect(all.some((c) => !c.verdict.passes)).toBe(true);
    // the layouts of one set of plates carry different self-weights (the point of the issue)
    expect(new Set(all.map((c) => c.g)).size).toBeGreaterThan(2 * 2 * 2 * 3);
  });

  test('every point returned passes check, with the same governing check and utilisation', () => {
    expect(result.pareto.length).toBeGreaterThan(0);
    for (const e of result.pareto) {
      const c = checked(fromSection(e.section) as unknown as Record<string, unknown>);
      expect(c.verdict.passes).toBe(true);
      expect(c.verdict.governing.id).toBe(e.verdict.governing.id);
      expect(c.verdict.governing.utilisation).toBe(e.verdict.governing.utilisation);
      expect(c.mass).toBeCloseTo(e.mass, 6);
    }
  });

  test('no candidate check passes is lighter at the same depth or less than a point returned, and the lightest passing one is returned', () => {
    const passing = all.filter((c) => c.verdict.passes);
    for (const e of result.pareto) {
      for (const c of passing) if (c.depth <= e.depth) expect(c.mass).toBeGreaterThanOrEqual(e.mass - 1e-6);
    }
    const lightest = Math.min(...passing.map((c) => c.mass));
    expect(Math.min(...result.pareto.map((e) => e.mass))).toBeCloseTo(lightest, 6);
  });
});

/**
 * The same through the public path on a two-span girder (9 m + 13 m, point load in the long span):
 * the search's analysis holds the stiffener stations of every layout of the space, `check`'s only
 * those of the section it checks; the verdicts must still agree, utilisation for utilisation.
 * Invented scenario.
 */
describe('on a two-span girder the search and check agree on every point and on the lightest', () => {
  const two = {
    spans: [9000, 13000],
    actions: [
      { kind: 'permanent', load: 'udl', value: 12 },
      { kind: 'variable', load: 'udl', value: 18, category: 'B' },
      { kind: 'variable', load: 'point', value: 160, at: 15000, category: 'B' },
    ],
    options: { restraint: { spacing: 2750 }, bottomRestraint: { spacing: 2750 } },
  };
  const space = { webDepth: [900, 1100], webThickness: [8, 10], flangeWidth: [250, 300], flangeThickness: [12, 15, 20], symmetric: true, panels: [0, 3, 5], flats: [{ width: 100, thickness: 10 }], stiffenerSides: 2, endPost: 'non-rigid', grade: 'S355' };
  const input = parseWith(SearchInput, { ...two, space });
  if (!input.ok) throw new Error(JSON.stringify(input.issues));
  const result = search(problemOf(toSearchTask(input.value)));
  const checkedTwo = (section: Record<string, unknown>) => {
    const p = parseWith(CheckProblemInput, { ...two, section });
    if (!p.ok) throw new Error(JSON.stringify(p.issues));
    const job = toCheckProblem(p.value);
    const verdict = checkGirder(job.section, job.effects, job.options);
    return { verdict, depth: job.section.hw + 2 * job.section.top.t, mass: girderMass(job.section, 22000, [0, 9000, 22000], verdict.bearing).total };
  };
  test('every point: the same verdict, governing check and utilisation as check', () => {
    expect(result.pareto.length).toBeGreaterThan(0);
    for (const e of result.pareto) {
      const c = checkedTwo(fromSection(e.section) as unknown as Record<string, unknown>);
      expect(c.verdict.passes).toBe(true);
      for (const r of e.verdict.checks) {
        const mine = c.verdict.checks.find((x) => x.id === r.id)!;
        expect(mine.utilisation, r.id).toBe(r.utilisation);
      }
    }
  });
  test('no candidate that check passes is lighter at no greater depth', () => {
    const all: Record<string, unknown>[] = [];
    for (const depth of space.webDepth)
      for (const thickness of space.webThickness)
        for (const width of space.flangeWidth)
          for (const tf of space.flangeThickness)
            for (const n of space.panels) {
              const flange = { width, thickness: tf };
              all.push({ web: { depth, thickness }, topFlange: flange, bottomFlange: flange, stiffeners: n === 0 ? null : { spacing: 13000 / n, width: 100, thickness: 10, sides: 2 }, endPost: 'non-rigid', grade: 'S355' });
            }
    const passing = all.map(checkedTwo).filter((c) => c.verdict.passes);
    expect(passing.length).toBeGreaterThan(0);
    for (const e of result.pareto) for (const c of passing) if (c.depth <= e.depth) expect(c.mass).toBeGreaterThanOrEqual(e.mass - 1e-6);
  });
});
