/**
 * Rationalisation to at most K sections, and to at most T plate thicknesses and W flange widths
 * (MILP with HiGHS, and enumeration for small K).
 * Oracles: brute-force enumeration of every candidate subset of size ≤ K, and of every assignment
 * for the plate limits (exhaustive search, the definition of the optimum; no published example
 * exists for this selection problem); a closed form for a family of larger instances (below).
 * The small hand example is hand arithmetic (common practice, no source).
 */
import { describe, expect, test } from 'vitest';
import { test as prop, fc } from '@fast-check/vitest';
import type { SectionJson } from '@platesmith/schema';
import { candidatesFrom, feasibilityMatrix, platesOf, rationalise, sectionMassPerMetre, type RationaliseInput, type RationaliseProgress } from '../src/tender/index.js';

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

describe('hand example: two marks, two sections', async () => {
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
  const r = await rationalise(input);
  test('K = 2 is the unrationalised optimum 2000 + 2400 = 4400 kg; K = 1 costs 400 kg more', () => {
    expect(r.unrationalised).toBe(4400);
    expect(r.leftOut).toEqual([]);
    expect(r.byK).toMatchObject([
      { K: 1, feasible: true, total: 4800, penalty: 400, penaltyRatio: 400 / 4400, status: 'optimal', gap: 0, bound: 4800, sections: ['c2'], assignment: [{ mark: 'A', candidate: 'c2', value: 2400 }, { mark: 'B', candidate: 'c2', value: 2400 }] },
      { K: 2, feasible: true, total: 4400, penalty: 0, penaltyRatio: 0, status: 'optimal', gap: 0, source: 'unrationalised', sections: ['c1', 'c2'], assignment: [{ mark: 'A', candidate: 'c1', value: 2000 }, { mark: 'B', candidate: 'c2', value: 2400 }] },
    ]);
  });
  test.for([1e8, 0])('no single section fits both marks → K = 1 is infeasible, as data (enumeration limit %s)', async (limit) => {
    const r2 = await rationalise({ ...input, feasible: [[true, false], [false, true]], enumerationLimit: limit });
    expect(r2.byK[0]).toMatchObject({ K: 1, feasible: false, status: 'infeasible', reason: 'no choice of 1 section fits every mark' });
    expect(r2.byK[1]!.feasible).toBe(true);
  });
  test('a mark with no feasible candidate is left out of the model and listed; the others are rationalised', async () => {
    const r3 = await rationalise({ ...input, feasible: [[true, true], [false, false]] });
    expect(r3.leftOut).toEqual([{ mark: 'B', quantity: 1, reason: 'no feasible candidate' }]);
    // A alone: 2 × 10 m on c1 (100 kg/m) = 2000 kg
    expect(r3.unrationalised).toBe(2000);
    expect(r3.byK).toMatchObject([{ K: 1, feasible: true, total: 2000, assignment: [{ mark: 'A', candidate: 'c1', value: 2000 }] }]);
    expect(r3.model).toMatchObject({ marks: 1, groups: 1 });
  });
  test('cost objective: rate per kg of the grade (S460 dearer)', async () => {
    const rc = await rationalise({ ...input, candidates: [input.candidates[0]!, { ...input.candidates[1]!, section: sec(900, 'S460') }], objective: 'cost', rates: { S355: 1, S460: 1.2 } });
    expect(rc.byK[1]).toMatchObject({ feasible: true, total: 2000 + 2400 * 1.2 });
  });
  test('bad input is a DomainError', async () => {
    await expect(rationalise({ ...input, feasible: [[true, true]] })).rejects.toThrow(/feasible has 1 rows/);
    await expect(rationalise({ ...input, objective: 'cost' })).rejects.toThrow(/rates/);
    await expect(rationalise({ ...input, timeLimit: 0 })).rejects.toThrow(/timeLimit/);
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
  prop.prop([instance, fc.constantFrom(0, 1e8)], { numRuns: 150 })('random small schedules (MILP, and enumeration)', async ({ marks, mpm, feasible }, enumerationLimit) => {
    const input: RationaliseInput = {
      marks: marks.map((m, i) => ({ mark: `M${i}`, quantity: m.q, length: m.L })),
      candidates: mpm.map((v, j) => ({ id: `c${j}`, section: sec(500 + 100 * j), massPerMetre: v })),
      feasible,
      enumerationLimit,
    };
    const r = await rationalise(input);
    // marks without a feasible candidate are left out; the optimum is over the others
    const kept = feasible.map((row) => row.some(Boolean));
    expect(r.leftOut.map((l) => l.mark)).toEqual(marks.flatMap((_, i) => (kept[i] ? [] : [`M${i}`])));
    const sub: RationaliseInput = { ...input, marks: input.marks.filter((_, i) => kept[i]), feasible: feasible.filter((_, i) => kept[i]) };
    expect(r.byK).toHaveLength(Math.min(sub.marks.length, mpm.length));
    for (const k of r.byK) {
      const b = brute(sub, k.K);
      if (b === null) expect(k.feasible, `K=${k.K}`).toBe(false);
      else {
        expect(k.feasible, `K=${k.K}`).toBe(true);
        if (!k.feasible) continue;
        // relative 1e-9: totals are sums of products in floating point
        expect(Math.abs(k.total / b - 1), `K=${k.K}: rationalised ${k.total}, brute force ${b}`).toBeLessThan(1e-9);
        expect(k.status).toBe('optimal');
        // the bound is a true lower bound, and the gap is what it says
        expect(k.bound).toBeLessThanOrEqual(b * (1 + 1e-9));
        expect(Math.abs(k.gap - (k.total - k.bound) / k.total)).toBeLessThan(1e-12);
        expect(k.gap).toBeLessThanOrEqual(1e-4 + 1e-12);
        expect(k.sections.length).toBeLessThanOrEqual(k.K);
        k.assignment.forEach((a) => expect(feasible[Number(a.mark.slice(1))]![Number(a.candidate.slice(1))]).toBe(true));
      }
    }
  });
});

/** exhaustive optimum over every assignment (each mark any feasible candidate) using at most T thicknesses and W flange widths */
function brutePlates(inp: RationaliseInput, T: number | undefined, W: number | undefined): number | null {
  const nM = inp.marks.length;
  let best: number | null = null;
  const pick: number[] = [];
  const walk = (i: number): void => {
    if (i === nM) {
      const th = new Set<number>();
      const wd = new Set<number>();
      let total = 0;
      pick.forEach((j, m) => {
        const p = platesOf(inp.candidates[j]!.section);
        p.thicknesses.forEach((t) => th.add(t));
        p.widths.forEach((w) => wd.add(w));
        total += inp.marks[m]!.quantity * inp.candidates[j]!.massPerMetre * (inp.marks[m]!.length / 1000);
      });
      if ((T === undefined || th.size <= T) && (W === undefined || wd.size <= W) && (best === null || total < best)) best = total;
      return;
    }
    inp.candidates.forEach((_, j) => {
      if (!inp.feasible[i]![j]) return;
      pick.push(j);
      walk(i + 1);
      pick.pop();
    });
  };
  walk(0);
  return best;
}

describe('plate rationalisation equals brute force over every assignment (property)', () => {
  const plate = fc.record({ hw: fc.constantFrom(800, 900), tw: fc.constantFrom(8, 10, 12), b: fc.constantFrom(250, 300, 350), t: fc.constantFrom(15, 20, 25) });
  const instance = fc
    .record({ nM: fc.integer({ min: 1, max: 4 }), nC: fc.integer({ min: 1, max: 5 }) })
    .chain(({ nM, nC }) =>
      fc.record({
        marks: fc.array(fc.record({ q: fc.integer({ min: 1, max: 6 }), L: fc.integer({ min: 40, max: 400 }).map((v) => v * 100) }), { minLength: nM, maxLength: nM }),
        cands: fc.array(fc.record({ p: plate, bb: fc.constantFrom(250, 300, 350), mpm: fc.integer({ min: 50, max: 600 }) }), { minLength: nC, maxLength: nC }),
        feasible: fc.array(fc.array(fc.integer({ min: 0, max: 3 }).map((v) => v > 0), { minLength: nC, maxLength: nC }), { minLength: nM, maxLength: nM }),
        T: fc.option(fc.integer({ min: 1, max: 4 }), { nil: undefined }),
        W: fc.option(fc.integer({ min: 1, max: 3 }), { nil: undefined }),
      }),
    );
  prop.prop([instance], { numRuns: 120 })('random small schedules, T thicknesses and W widths', async ({ marks, cands, feasible, T, W }) => {
    fc.pre(T !== undefined || W !== undefined);
    const input: RationaliseInput = {
      marks: marks.map((m, i) => ({ mark: `M${i}`, quantity: m.q, length: m.L })),
      candidates: cands.map((c, j) => ({
        id: `c${j}`,
        section: { web: { depth: c.p.hw, thickness: c.p.tw }, topFlange: { width: c.p.b, thickness: c.p.t }, bottomFlange: { width: c.bb, thickness: c.p.t }, stiffeners: null, endPost: 'rigid', grade: 'S355' },
        massPerMetre: c.mpm,
      })),
      feasible,
      maxK: 0,
      plates: { ...(T !== undefined ? { thicknesses: T } : {}), ...(W !== undefined ? { widths: W } : {}) },
    };
    const r = await rationalise(input);
    const kept = feasible.map((row) => row.some(Boolean));
    const sub: RationaliseInput = { ...input, marks: input.marks.filter((_, i) => kept[i]), feasible: feasible.filter((_, i) => kept[i]) };
    if (sub.marks.length === 0) return;
    const b = brutePlates(sub, T, W);
    const p = r.plates!;
    expect(p).not.toBeNull();
    if (b === null) {
      expect(p.feasible).toBe(false);
      return;
    }
    expect(p.feasible, JSON.stringify(p)).toBe(true);
    if (!p.feasible) return;
    expect(Math.abs(p.total / b - 1), `plates ${p.total}, brute force ${b}`).toBeLessThan(1e-9);
    if (T !== undefined) expect(p.thicknesses.length).toBeLessThanOrEqual(T);
    if (W !== undefined) expect(p.widths.length).toBeLessThanOrEqual(W);
    // the thicknesses and widths reported are those of the sections assigned
    const used = p.assignment.map((a) => platesOf(input.candidates[Number(a.candidate.slice(1))]!.section));
    expect(p.thicknesses).toEqual([...new Set(used.flatMap((u) => u.thicknesses))].sort((x, y) => x - y));
    expect(p.widths).toEqual([...new Set(used.flatMap((u) => u.widths))].sort((x, y) => x - y));
  });
});

/**
 * A family whose optimum is known in closed form, large enough that only the MILP can solve it
 * (enumeration off): a universal section U (feasible for every mark, u kg/m) and one own section
 * per mark i (v_i < u, feasible for i alone). With K < n sections, U must be among them (nothing
 * else covers every mark), and the best K − 1 own sections are those of the largest savings
 * w_i (u − v_i): optimum = Σ w_i u − (the K − 1 largest savings). Derivation: exchange argument,
 * hand reasoning (common practice, no source).
 */
describe('closed form: one universal section and one own section per mark', () => {
  const n = 60;
  const u = 500;
  const marks = Array.from({ length: n }, (_, i) => ({ mark: `M${i}`, quantity: 1 + (i % 5), length: 6000 + 250 * ((i * 7) % 40) }));
  const own = marks.map((_, i) => 200 + ((i * 37) % 250));
  const input: RationaliseInput = {
    marks,
    candidates: [{ id: 'U', section: sec(1200), massPerMetre: u }, ...own.map((v, i) => ({ id: `o${i}`, section: sec(500 + i), massPerMetre: v }))],
    feasible: marks.map((_, i) => [true, ...marks.map((_, j) => j === i)]),
    maxK: 15,
    enumerationLimit: 0,
  };
  const w = marks.map((m) => m.quantity * (m.length / 1000));
  const savings = w.map((wi, i) => wi * (u - own[i]!)).sort((a, b) => b - a);
  const all = w.reduce((s, wi) => s + wi * u, 0);
  const optimum = (K: number) => all - savings.slice(0, K - 1).reduce((s, x) => s + x, 0);

  test('every K = 1 … 15 is proven optimal and equals the closed form', async () => {
    const r = await rationalise(input);
    expect(r.byK).toHaveLength(15);
    for (const k of r.byK) {
      expect(k.feasible).toBe(true);
      if (!k.feasible) continue;
      expect(Math.abs(k.total / optimum(k.K) - 1), `K=${k.K}`).toBeLessThan(1e-9);
      expect(k.status).toBe('optimal');
      expect(k.source).not.toBe('enumeration');
    }
  });

  test('with too little time, whatever comes back states a true bound and its gap', async () => {
    const r = await rationalise({ ...input, timeLimit: 0.001 });
    for (const k of r.byK) {
      if (!k.feasible) {
        expect(k.status).toBe('time-limit');
        continue;
      }
      // bound ≤ optimum ≤ total, and gap = (total − bound) / total
      expect(k.bound).toBeLessThanOrEqual(optimum(k.K) * (1 + 1e-9));
      expect(k.total).toBeGreaterThanOrEqual(optimum(k.K) * (1 - 1e-9));
      expect(Math.abs(k.gap - (k.total - k.bound) / k.total)).toBeLessThan(1e-12);
      if (k.status === 'optimal') expect(k.gap).toBeLessThanOrEqual(1e-4 + 1e-12);
    }
  });
});

test('progress: a report per solve, its K, and a bound never above the incumbent', async () => {
  const reports: RationaliseProgress[] = [];
  const r = await rationalise({
    marks: [
      { mark: 'A', quantity: 2, length: 10000 },
      { mark: 'B', quantity: 1, length: 20000 },
      { mark: 'C', quantity: 3, length: 8000 },
    ],
    candidates: [100, 120, 150].map((v, j) => ({ id: `c${j}`, section: sec(800 + 100 * j), massPerMetre: v })),
    feasible: [
      [true, true, true],
      [false, true, true],
      [false, false, true],
    ],
    enumerationLimit: 0,
    onProgress: (p) => reports.push(p),
  });
  const done = reports.filter((p) => p.done);
  expect(done.map((p) => p.K)).toEqual(r.byK.filter((k) => k.K < 3).map((k) => k.K));
  for (const p of reports) if (p.incumbent !== null && p.bound !== null) expect(p.bound).toBeLessThanOrEqual(p.incumbent * (1 + 1e-9));
});
