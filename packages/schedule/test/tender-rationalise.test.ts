/**
 * Rationalisation to at most K sections (MILP with javascript-lp-solver).
 * Oracle: brute-force enumeration of every candidate subset of size ≤ K (exhaustive search,
 * the definition of the optimum; no published example exists for this selection problem).
 * The small hand example is hand arithmetic (common practice, no source).
 */
import { describe, expect, test } from 'vitest';
import { test as prop, fc } from '@fast-check/vitest';
import type { SectionJson } from '@platesmith/schema';
import { candidatesFrom, feasibilityMatrix, rationalise, sectionMassPerMetre, type RationaliseInput } from '../src/tender/index.js';

const sec = (hw: number, grade = 'S355'): SectionJson => ({
  web: { depth: hw, thickness: 10 },
  topFlange: { width: 300, thickness: 20 },
  bottomFlange: { width: 300, thickness: 20 },
  stiffeners: null,
  endPost: 'rigid',
  grade,
});

/** exhaustive optimum over every subset of at most K candidates; null when none fits every mark */
function brute(inp: RationaliseInput, K: number): number | null {
  const nC = inp.candidates.length;
  let best: number | null = null;
  for (let mask = 1; mask < 1 << nC; mask++) {
    let bits = 0;
    for (let j = 0; j < nC; j++) if (mask & (1 << j)) bits++;
    if (bits > K) continue;
    let total = 0;
    let ok = true;
    inp.marks.forEach((m, i) => {
      let b = Infinity;
      for (let j = 0; j < nC; j++) {
        if (!(mask & (1 << j)) || !inp.feasible[i]![j]) continue;
        b = Math.min(b, m.quantity * inp.candidates[j]!.massPerMetre * (m.length / 1000));
      }
      if (b === Infinity) ok = false;
      else total += b;
    });
    if (ok && (best === null || total < best)) best = total;
  }
  return best;
}

describe('hand example: two marks, two sections', () => {
  // A: 2 × 10 m, B: 1 × 20 m; c1 100 kg/m fits A only, c2 120 kg/m fits both
  const input: RationaliseInput = {
    marks: [
      { mark: 'A', quantity: 2, length: 10000 },
      { mark: 'B', quantity: 1, length: 20000 },
    ],
    candidates: [
      { id: 'c1', section: sec(800), massPerMetre: 100 },
      { id: 'c2', section: sec(900), massPerMetre: 120 },
    ],
    feasible: [
      [true, true],
      [false, true],
    ],
  };
  const r = rationalise(input);
  test('K = 2 is the unrationalised optimum 2000 + 2400 = 4400 kg; K = 1 costs 400 kg more', () => {
    expect(r.unrationalised).toBe(4400);
    expect(r.byK).toEqual([
      { K: 1, feasible: true, total: 4800, penalty: 400, penaltyRatio: 400 / 4400, sections: ['c2'], assignment: [{ mark: 'A', candidate: 'c2', value: 2400 }, { mark: 'B', candidate: 'c2', value: 2400 }] },
      { K: 2, feasible: true, total: 4400, penalty: 0, penaltyRatio: 0, sections: ['c1', 'c2'], assignment: [{ mark: 'A', candidate: 'c1', value: 2000 }, { mark: 'B', candidate: 'c2', value: 2400 }] },
    ]);
  });
  test('no single section fits both marks → K = 1 is infeasible, as data', () => {
    const r2 = rationalise({ ...input, feasible: [[true, false], [false, true]] });
    expect(r2.byK[0]).toEqual({ K: 1, feasible: false, reason: 'no choice of 1 section fits every mark' });
    expect(r2.byK[1]!.feasible).toBe(true);
  });
  test('a mark with no feasible candidate makes every K infeasible and says which mark', () => {
    const r3 = rationalise({ ...input, feasible: [[true, true], [false, false]] });
    expect(r3.unrationalised).toBeNull();
    expect(r3.byK.map((k) => k.feasible)).toEqual([false, false]);
    expect(r3.byK[0]).toMatchObject({ reason: 'mark B has no feasible candidate' });
  });
  test('cost objective: rate per kg of the grade (S460 dearer)', () => {
    const rc = rationalise({ ...input, candidates: [input.candidates[0]!, { ...input.candidates[1]!, section: sec(900, 'S460') }], objective: 'cost', rates: { S355: 1, S460: 1.2 } });
    expect(rc.byK[1]).toMatchObject({ feasible: true, total: 2000 + 2400 * 1.2 });
  });
  test('bad input is a DomainError', () => {
    expect(() => rationalise({ ...input, feasible: [[true, true]] })).toThrow(/feasible has 1 rows/);
    expect(() => rationalise({ ...input, objective: 'cost' })).toThrow(/rates/);
  });
});

test('feasibilityMatrix asks the caller\'s judge for every (mark, candidate)', () => {
  const calls: string[] = [];
  const m = feasibilityMatrix(['A', 'B'], [800, 900, 1000], (mark, hw) => (calls.push(`${mark}${hw}`), mark === 'A' || hw >= 900));
  expect(m).toEqual([
    [true, true, true],
    [false, true, true],
  ]);
  expect(calls).toHaveLength(6);
});

test('candidatesFrom de-duplicates Pareto and lightest sections; mass per metre from the plates', () => {
  const p = (hw: number) => ({ section: sec(hw) }) as never;
  const c = candidatesFrom([{ pareto: [p(800), p(900)], lightest: p(900) } as never, null, { pareto: [p(900)], lightest: null } as never], [sec(1000)]);
  expect(c.map((x) => x.section.web.depth)).toEqual([800, 900, 1000]);
  // 800×10 + 2×300×20 = 20 000 mm² → 157 kg/m at 7850 kg/m³ (hand arithmetic)
  expect(Math.abs(c[0]!.massPerMetre / 157 - 1)).toBeLessThan(1e-12);
  expect(sectionMassPerMetre({ ...sec(1000), stiffeners: { spacing: 2000, width: 100, thickness: 10, sides: 2 } })).toBeCloseTo(((1000 * 10 + 12000 + (2 * 100 * 10 * 1000) / 2000) * 7850) / 1e6, 9);
});

describe('MILP optimum equals brute-force enumeration of all K-subsets (property)', () => {
  const instance = fc
    .record({ nM: fc.integer({ min: 1, max: 4 }), nC: fc.integer({ min: 1, max: 5 }) })
    .chain(({ nM, nC }) =>
      fc.record({
        marks: fc.array(fc.record({ q: fc.integer({ min: 1, max: 6 }), L: fc.integer({ min: 40, max: 400 }).map((v) => v * 100) }), { minLength: nM, maxLength: nM }),
        mpm: fc.array(fc.integer({ min: 50, max: 600 }), { minLength: nC, maxLength: nC }),
        feasible: fc.array(fc.array(fc.integer({ min: 0, max: 3 }).map((v) => v > 0), { minLength: nC, maxLength: nC }), { minLength: nM, maxLength: nM }),
      }),
    );
  prop.prop([instance], { numRuns: 150 })('random small schedules', ({ marks, mpm, feasible }) => {
    const input: RationaliseInput = {
      marks: marks.map((m, i) => ({ mark: `M${i}`, quantity: m.q, length: m.L })),
      candidates: mpm.map((v, j) => ({ id: `c${j}`, section: sec(500 + 100 * j), massPerMetre: v })),
      feasible,
    };
    const r = rationalise(input);
    expect(r.byK).toHaveLength(Math.min(marks.length, mpm.length));
    for (const k of r.byK) {
      const b = brute(input, k.K);
      if (b === null) expect(k.feasible, `K=${k.K}`).toBe(false);
      else {
        expect(k.feasible, `K=${k.K}`).toBe(true);
        if (!k.feasible) continue;
        // relative 1e-9: the solver works on objective/scale in floating point
        expect(Math.abs(k.total / b - 1), `K=${k.K}: MILP ${k.total}, brute force ${b}`).toBeLessThan(1e-9);
        expect(k.sections.length).toBeLessThanOrEqual(k.K);
        k.assignment.forEach((a, i) => expect(feasible[i]![Number(a.candidate.slice(1))]).toBe(true));
      }
    }
  });
});
