/**
 * Property tests of the EN 1993-1-5 shear family (fast-check). Continuity, monotonicity and
 * symmetry properties follow from EN 1993-1-5:2006 Table 5.1, Annex A.3 and 9.3.3(3) as written;
 * the one discontinuity the standard's rounding creates (Table 5.1 rigid column at λ̄w = 1.08:
 * 0.83/1.08 = 0.76852 below, 1.37/1.78 = 0.76966 above, a jump of +0.00114, 0.15 %) is asserted
 * as such, and monotonicity is asserted to within that jump.
 */
import { describe, expect } from 'vitest';
import { fc, test } from '@fast-check/vitest';
import { prepare } from '../src/context.js';
import { defaultOptions, FACTOR_SETS } from '../src/options.js';
import { minWebAreaForShear, webShearCapacityBound } from '../src/en1993-1-5/shear-bounds.js';
import type { CheckResult, Effects, Section } from '../src/types.js';
import { chiW, kTau, lambdaW, vbwRd } from '../src/en1993-1-5/shear-buckling.js';
import { stiffenerIstMin } from '../src/en1993-1-5/stiffeners.js';
import { shearChecks } from '../src/en1993-1-5/shear-family.js';

/** Table 5.1 rigid-column jump at λ̄w = 1.08, relative to the value below. */
const JUMP_108 = 1.37 / 1.78 / (0.83 / 1.08) - 1;

describe('Table 5.1 continuity', () => {
  test.prop([fc.double({ min: 1.0, max: 1.2, noNaN: true }), fc.constantFrom('rigid', 'non-rigid' as const)], { numRuns: 300 })(
    'χw is continuous at λ̄w = 0.83/η (both columns give η there)',
    (eta, ep) => {
      const lb = 0.83 / eta;
      expect(Math.abs(chiW(lb * (1 - 1e-9), eta, ep) - chiW(lb * (1 + 1e-9), eta, ep))).toBeLessThan(1e-6);
    },
  );
  test.prop([fc.double({ min: 1.0, max: 1.2, noNaN: true })], { numRuns: 300 })('χw at λ̄w = 1.08: non-rigid continuous, rigid jumps up by 0.15 %', (eta) => {
    const below = 1.08 * (1 - 1e-12);
    expect.soft(Math.abs(chiW(below, eta, 'non-rigid') - chiW(1.08, eta, 'non-rigid'))).toBeLessThan(1e-9);
    const jump = chiW(1.08, eta, 'rigid') / chiW(below, eta, 'rigid') - 1;
    expect.soft(jump).toBeGreaterThan(0.0014);
    expect.soft(jump).toBeLessThan(0.0015);
  });
});

describe('Annex A.3 and 9.3.3(3) continuity', () => {
  test.prop([fc.double({ min: 200, max: 4000, noNaN: true })], { numRuns: 300 })('kτ is continuous at a/hw = 1 (9.34 both sides)', (hw) => {
    expect(Math.abs(kTau(hw * (1 - 1e-12), hw) - kTau(hw, hw))).toBeLessThan(1e-6);
    expect(Math.abs(kTau(hw, hw) - 9.34)).toBeLessThan(1e-12);
  });
  test.prop([fc.double({ min: 200, max: 4000, noNaN: true }), fc.double({ min: 5, max: 40, noNaN: true })], { numRuns: 300 })(
    'Ist,min is continuous at a/hw = √2: 1.5 hw³tw³/(2hw²) = 0.75 hw tw³',
    (hw, tw) => {
      const a = Math.SQRT2 * hw;
      const lo = stiffenerIstMin(a * (1 - 1e-12), hw, tw);
      const hi = stiffenerIstMin(a * (1 + 1e-12), hw, tw);
      expect(Math.abs(lo / hi - 1)).toBeLessThan(1e-9);
    },
  );
});

describe('monotonicity of Vbw,Rd (to within the Table 5.1 jump)', () => {
  const arb = fc.record({
    hw: fc.double({ min: 400, max: 3500, noNaN: true }),
    t1: fc.double({ min: 5, max: 30, noNaN: true }),
    dt: fc.double({ min: 0, max: 10, noNaN: true }),
    a: fc.double({ min: 200, max: 8000, noNaN: true }),
    da: fc.double({ min: 0, max: 4000, noNaN: true }),
    fy: fc.constantFrom(235, 275, 355, 460),
    eta: fc.constantFrom(1.0, 1.2),
    ep: fc.constantFrom('rigid' as const, 'non-rigid' as const),
  });
  const vbw = (hw: number, tw: number, a: number, fy: number, eta: number, ep: 'rigid' | 'non-rigid') =>
    vbwRd(chiW(lambdaW(hw, tw, Math.sqrt(235 / fy), kTau(a, hw)), eta, ep), fy, hw, tw, 1.0);
  test.prop([arb], { numRuns: 500 })('a thicker web never lowers Vbw,Rd at equal fyw', ({ hw, t1, dt, a, fy, eta, ep }) => {
    const tol = ep === 'rigid' ? JUMP_108 + 1e-9 : 1e-12;
    expect(vbw(hw, t1 + dt, a, fy, eta, ep)).toBeGreaterThanOrEqual(vbw(hw, t1, a, fy, eta, ep) * (1 - tol));
  });
  test.prop([arb], { numRuns: 500 })('closer stiffeners never lower Vbw,Rd', ({ hw, t1, a, da, fy, eta, ep }) => {
    const tol = ep === 'rigid' ? JUMP_108 + 1e-9 : 1e-12;
    expect(vbw(hw, t1, a, fy, eta, ep)).toBeGreaterThanOrEqual(vbw(hw, t1, a + da, fy, eta, ep) * (1 - tol));
  });
});

/** Random girders: a section, a simply supported span, stations with coexisting M and V, reactions. */
const girderArb = fc
  .record({
    hw: fc.integer({ min: 400, max: 3000 }),
    tw: fc.constantFrom(6, 8, 10, 12, 15, 20),
    bt: fc.integer({ min: 200, max: 800 }),
    tt: fc.constantFrom(12, 15, 20, 25, 30, 40, 50),
    bb: fc.integer({ min: 200, max: 800 }),
    tb: fc.constantFrom(12, 15, 20, 25, 30, 40, 50),
    stiff: fc.option(fc.record({ k: fc.double({ min: 0.5, max: 3, noNaN: true }), bs: fc.integer({ min: 60, max: 200 }), ts: fc.constantFrom(8, 10, 12, 15, 20), sides: fc.constantFrom(1 as const, 2 as const) }), { nil: null }),
    endPost: fc.constantFrom('rigid' as const, 'non-rigid' as const),
    grade: fc.constantFrom('S235' as const, 'S275' as const, 'S355' as const),
    spanOverHw: fc.double({ min: 5, max: 20, noNaN: true }),
    loads: fc.array(fc.record({ xi: fc.double({ min: 0, max: 1, noNaN: true }), M: fc.double({ min: -1, max: 1, noNaN: true }), V: fc.double({ min: -1, max: 1, noNaN: true }) }), { minLength: 1, maxLength: 6 }),
    scale: fc.double({ min: 0.1, max: 3, noNaN: true }),
  })
  .map((r) => {
    const s: Section = {
      hw: r.hw,
      tw: r.tw,
      top: { b: r.bt, t: r.tt },
      bot: { b: r.bb, t: r.tb },
      stiffeners: r.stiff ? { a: Math.round(r.stiff.k * r.hw), bs: r.stiff.bs, ts: r.stiff.ts, sides: r.stiff.sides } : null,
      endPost: r.endPost,
      grade: { web: r.grade, top: r.grade, bot: r.grade, stiffener: r.grade },
    };
    const L = Math.round(r.spanOverHw * r.hw);
    const fy0 = 355;
    const V0 = r.scale * (fy0 * r.hw * r.tw) / Math.sqrt(3);
    const M0 = r.scale * fy0 * r.bt * r.tt * r.hw;
    const e: Effects = {
      stations: r.loads.map((l) => ({ x: Math.round(l.xi * L), MEd: l.M * M0, VEd: l.V * V0 })),
      forces: [],
      reactions: [
        { x: 0, R: Math.abs(r.loads[0]!.V * V0) },
        { x: L, R: Math.abs(r.loads[0]!.V * V0) },
      ],
      sls: [],
    };
    return { s, L, e };
  });

/** MEd (and MEdVbf) are reported with their sign; compare magnitudes when the sign of M is reversed on purpose. */
const unsign = (rs: CheckResult[]) =>
  rs.map((r) => ({
    ...r,
    values: {
      ...r.values,
      ...(typeof r.values['MEd'] === 'number' ? { MEd: Math.abs(r.values['MEd']) } : {}),
      ...(typeof r.values['MEdVbf'] === 'number' ? { MEdVbf: Math.abs(r.values['MEdVbf']) } : {}),
    },
  }));

/** Deep equality with numbers to 1e-9 relative (the plastic neutral-axis search sums in stack order). */
function expectSame(b: unknown, a: unknown, path = ''): void {
  if (typeof a === 'number' && typeof b === 'number') {
    const ok = a === b || Math.abs(a - b) <= 1e-9 * Math.max(Math.abs(a), Math.abs(b));
    expect(ok, `${path}: ${b} vs ${a}`).toBe(true);
  } else if (a !== null && typeof a === 'object') {
    expect(typeof b, path).toBe('object');
    const ka = Object.keys(a as object).sort();
    expect(Object.keys(b as object).sort(), path).toEqual(ka);
    for (const k of ka) expectSame((b as Record<string, unknown>)[k], (a as Record<string, unknown>)[k], `${path}.${k}`);
  } else {
    expect(b, path).toEqual(a);
  }
}

const flip = (s: Section): Section => ({ ...s, top: s.bot, bot: s.top, grade: { ...s.grade, top: s.grade.bot, bot: s.grade.top } });

describe('symmetry of shearChecks', () => {
  test.prop([girderArb], { numRuns: 200 })('a section flipped upside down, with M → −M, gives identical results', ({ s, L, e }) => {
    const o = defaultOptions(L);
    const a = shearChecks(prepare(s, o), e);
    const b = shearChecks(prepare(flip(s), o), { ...e, stations: e.stations.map((st) => ({ ...st, MEd: -st.MEd })) });
    expectSame(unsign(b), unsign(a));
  });
  test.prop([girderArb], { numRuns: 200 })('on a doubly symmetric section M → −M gives identical results', ({ s, L, e }) => {
    const sym: Section = { ...s, bot: s.top, grade: { ...s.grade, bot: s.grade.top } };
    const o = defaultOptions(L);
    const a = shearChecks(prepare(sym, o), e);
    const b = shearChecks(prepare(sym, o), { ...e, stations: e.stations.map((st) => ({ ...st, MEd: -st.MEd })) });
    expectSame(unsign(b), unsign(a));
  });
  test.prop([girderArb], { numRuns: 100 })('one result per id, in the contract order', ({ s, L, e }) => {
    const ids = shearChecks(prepare(s, defaultOptions(L)), e).map((c) => c.id);
    expect(ids).toEqual(['shear', 'shear-buckling', 'bending-shear', 'stiffener-stiffness', 'stiffener-strength', 'load-bearing-stiffener', 'stiffener-torsion', 'end-post', 'bearing-stiffener']);
  });
});

/*
 * Bounds of shear-bounds.ts: EN 1993-1-1 6.2.6 (Vpl,Rd) and EN 1993-1-5 5.2(1) eq. 5.1
 * (Vb,Rd ≤ η fyw hw tw/(√3 γM1)) make them sound; these properties check that the full evaluation
 * in shearChecks agrees (consistency, not validation).
 */
const failsShear = (r: ReturnType<typeof shearChecks>) => r.filter((c) => c.id === 'shear' || c.id === 'shear-buckling').some((c) => !c.passes);

describe('shear bounds', () => {
  test.prop([girderArb, fc.double({ min: 1.000001, max: 3, noNaN: true }), fc.constantFrom('buildings' as const, 'bridges' as const), fc.constantFrom(1.0, 1.2)], { numRuns: 300 })(
    'VEd above webShearCapacityBound always fails shear or shear-buckling',
    ({ s, L, e }, k, set, eta) => {
      const o = defaultOptions(L, { factors: FACTOR_SETS[set], eta });
      const ctx = prepare(s, o);
      const first = shearChecks(ctx, e);
      const buckling = first.find((c) => c.id === 'shear-buckling')!.applies;
      const f = o.factors;
      const bound = webShearCapacityBound(s.hw, s.tw, ctx.m.fyw, eta, f.gammaM0, f.gammaM1, buckling);
      const VEd = k * bound;
      const stations = [...e.stations, { x: e.stations[0]!.x, MEd: 0, VEd }];
      expect(failsShear(shearChecks(ctx, { ...e, stations }))).toBe(true);
    },
  );
  test.prop([girderArb, fc.constantFrom('buildings' as const, 'bridges' as const)], { numRuns: 300 })(
    'every section passing shear and shear-buckling has hw·tw ≥ minWebAreaForShear',
    ({ s, L, e }, set) => {
      const o = defaultOptions(L, { factors: FACTOR_SETS[set] });
      const ctx = prepare(s, o);
      const r = shearChecks(ctx, e);
      if (failsShear(r)) return;
      const VEd = Math.max(...e.stations.map((st) => Math.abs(st.VEd)));
      const buckling = r.find((c) => c.id === 'shear-buckling')!.applies;
      const f = o.factors;
      expect(s.hw * s.tw).toBeGreaterThanOrEqual(minWebAreaForShear(VEd, ctx.m.fyw, o.eta, f.gammaM0, f.gammaM1, buckling) * (1 - 1e-12));
    },
  );
});
