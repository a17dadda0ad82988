import { describe, expect } from 'vitest';
import { fc, test } from '@fast-check/vitest';
import { assembleVerdict, CHECK_ORDER, checkGirder, defaultOptions, firstFailure, firstFailureAmong, inJudgeOrder, judgeGirder, type Judged, minIyForDeflection, panelsOf, patchUtilisation, prepare, type Effects, type Section } from '../src/index.js';

/**
 * Properties of the functions the search relies on (no published values: these are consistency
 * properties of the library with itself, each a statement the search's exactness depends on).
 */
const sectionArb = fc.record({
  hw: fc.integer({ min: 400, max: 2400 }),
  tw: fc.constantFrom(6, 8, 10, 12, 15, 20),
  bt: fc.integer({ min: 150, max: 700 }),
  tt: fc.constantFrom(10, 15, 20, 25, 30, 40, 50),
  bb: fc.integer({ min: 150, max: 700 }),
  tb: fc.constantFrom(10, 15, 20, 25, 30, 40, 50),
  a: fc.option(fc.integer({ min: 800, max: 6000 }), { nil: null }),
  endPost: fc.constantFrom('rigid' as const, 'non-rigid' as const),
});

function sectionOf(r: { hw: number; tw: number; bt: number; tt: number; bb: number; tb: number; a: number | null; endPost: 'rigid' | 'non-rigid' }): Section {
  return {
    hw: r.hw,
    tw: r.tw,
    top: { b: r.bt, t: r.tt },
    bot: { b: r.bb, t: r.tb },
    stiffeners: r.a === null ? null : { a: r.a, bs: 120, ts: 12, sides: 2 },
    endPost: r.endPost,
    grade: { web: 'S355', top: 'S355', bot: 'S355', stiffener: 'S355' },
  };
}

/** Simply supported span under a UDL w (N/mm) and a central force P (N): closed-form M, V (handbook). */
function effectsOf(L: number, w: number, P: number, sag: boolean): Effects {
  const n = 16;
  const sgn = sag ? 1 : -1;
  const stations = Array.from({ length: n + 1 }, (_, i) => {
    const x = (L * i) / n;
    return { x, MEd: sgn * ((w * x * (L - x)) / 2 + (P * Math.min(x, L - x)) / 2), VEd: sgn * (w * (L / 2 - x) + (x < L / 2 ? P / 2 : -P / 2)) };
  });
  return {
    stations,
    forces: P > 0 ? [{ x: L / 2, F: P, ss: 150 }] : [],
    reactions: [
      { x: 0, R: (w * L + P) / 2 },
      { x: L, R: (w * L + P) / 2 },
    ],
    sls: [{ name: 'total', ratio: 250, points: stations.map((s) => ({ x: s.x, bend: ((w / 1.4) * s.x * (L ** 3 - 2 * L * s.x ** 2 + s.x ** 3)) / 24, shear: ((w / 1.4) * s.x * (L - s.x)) / 2 })) }],
  };
}

const loadArb = fc.record({ L: fc.constantFrom(8000, 16000, 24000), w: fc.double({ min: 5, max: 120, noNaN: true }), P: fc.constantFrom(0, 2e5, 8e5), sag: fc.boolean() });

describe('functions the search relies on', () => {
  test.prop([sectionArb, loadArb], { numRuns: 300 })('judgeGirder is checkGirder(...).passes, and firstFailure names a failing check', (r, l) => {
    const s = sectionOf(r);
    const e = effectsOf(l.L, l.w, l.P, l.sag);
    const o = defaultOptions(l.L, { restraint: { kind: 'at', at: [0, l.L / 3, (2 * l.L) / 3, l.L] } });
    const v = checkGirder(s, e, o);
    expect(judgeGirder(s, e, o)).toBe(v.passes);
    const f = firstFailure(s, e, o);
    if (f) expect(v.checks.find((c) => c.id === f.id)?.passes).toBe(false);
  });

  test.prop([sectionArb, loadArb], { numRuns: 300 })('two firstFailureAmong calls covering every check give checkGirder\'s verdict exactly', (r, l) => {
    const s = sectionOf(r);
    const e = effectsOf(l.L, l.w, l.P, l.sag);
    const o = defaultOptions(l.L, { restraint: { kind: 'at', at: [0, l.L / 2, l.L] } });
    // the split the search uses: checks that do not read the stiffeners, then the rest
    const first = inJudgeOrder(['deflection', 'lateral-torsional-buckling', 'bending', 'shear', 'flange-induced-buckling', 'web-flange-weld', 'classification']);
    const rest = inJudgeOrder(CHECK_ORDER.filter((id) => !first.includes(id)));
    const a: Judged = { results: [] };
    const b: Judged = { results: [] };
    const v = checkGirder(s, e, o);
    const fa = firstFailureAmong(s, e, o, first, a);
    const fb = fa ? null : firstFailureAmong(s, e, o, rest, b);
    expect(fa === null && fb === null).toBe(v.passes);
    if (v.passes) expect(assembleVerdict([...a.results, ...b.results], b.bearing!, b.bearingSized!)).toEqual(v);
  });

  test.prop([sectionArb, loadArb, fc.constantFrom(60, 100, 160, 200), fc.constantFrom(8, 12, 20), fc.constantFrom(1 as const, 2 as const)], { numRuns: 200 })(
    'the panel-only checks read no flat: the same results on any flat and side, so results passed on one layout may be given as known',
    (r, l, bs, ts, sides) => {
      const base = sectionOf({ ...r, a: r.a ?? 2000 });
      const other: Section = { ...base, stiffeners: { ...base.stiffeners!, bs, ts, sides } };
      const e = effectsOf(l.L, l.w, l.P, l.sag);
      const o = defaultOptions(l.L, { restraint: { kind: 'at', at: [0, l.L / 2, l.L] } });
      const ids = ['shear-buckling', 'bending-shear', 'patch-loading', 'patch-bending'] as const;
      const va = checkGirder(base, e, o);
      const vb = checkGirder(other, e, o);
      for (const id of ids) expect(vb.checks.find((c) => c.id === id)).toEqual(va.checks.find((c) => c.id === id));
      // the search's second call, with those results given: the same outcome as checkGirder
      const rest = inJudgeOrder(CHECK_ORDER.filter((id) => !['deflection', 'lateral-torsional-buckling', 'bending', 'shear', 'flange-induced-buckling', 'web-flange-weld', 'classification'].includes(id)));
      const known = new Map(va.checks.filter((c) => (ids as readonly string[]).includes(c.id) && c.passes).map((c) => [c.id, c] as const));
      const j: Judged = { results: [] };
      const f = firstFailureAmong(other, e, o, rest, j, known);
      const plain = firstFailureAmong(other, e, o, rest);
      expect(f).toEqual(plain);
    },
  );

  test.prop([sectionArb, loadArb], { numRuns: 300 })('patchUtilisation equals the patch-loading check', (r, l) => {
    const s = sectionOf(r);
    const e = effectsOf(l.L, l.w, l.P, true);
    const o = defaultOptions(l.L);
    const ctx = prepare(s, o);
    const v = checkGirder(s, e, o).checks.find((c) => c.id === 'patch-loading')!;
    const u = patchUtilisation(e.forces, { hw: s.hw, tw: s.tw, fyw: ctx.m.fyw }, { b: s.top.b, t: s.top.t, fy: ctx.m.fyTop }, panelsOf(o.supports, s.stiffeners?.a ?? null).panels, o.E, o.factors.gammaM1);
    expect(u).toBeCloseTo(v.utilisation, 12);
  });

  test.prop([sectionArb, loadArb], { numRuns: 300 })('a section with Iy below minIyForDeflection fails deflection', (r, l) => {
    const s = sectionOf(r);
    const e = effectsOf(l.L, l.w, 0, true);
    const o = defaultOptions(l.L);
    const ctx = prepare(s, o);
    const need = minIyForDeflection(
      e.sls[0]!.points.map((p) => ({ bend: p.bend, shear: p.shear, limit: l.L / 250 })),
      s.hw * s.tw,
      o.E,
      o.G,
    );
    const defl = checkGirder(s, e, o).checks.find((c) => c.id === 'deflection')!;
    if (ctx.g.Iy < need * (1 - 1e-9)) expect(defl.passes).toBe(false);
    if (defl.passes) expect(ctx.g.Iy).toBeGreaterThanOrEqual(need * (1 - 1e-9));
  });
});
