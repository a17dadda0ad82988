import { describe, expect } from 'vitest';
import { fc, test } from '@fast-check/vitest';
import { fy } from '@platesmith/catalogue';
import { chi, chiValue, mcr, mcrOf, assembleVerdict, bearingCandidates, bearingCrushing, bearingFlatArea, bearingOptions, bearingPairCount, flatTorsion, iyNeedRange, minIyForDeflectionAt, checkGirder, defaultOptions, firstFailure, firstFailureAmong, judgeGirder, LAYOUT_IDS, PANEL_ONLY, PLATE_IDS, type Judged, minIyForDeflection, panelsOf, patchBendingFloor, patchBendingMelNeed, patchEta2s, patchUtilisation, prepare, type Effects, type Section } from '../src/index.js';
import { effectsOf } from './span-effects.js';

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

const loadArb = fc.record({ L: fc.constantFrom(8000, 16000, 24000), w: fc.double({ min: 5, max: 120, noNaN: true }), P: fc.constantFrom(0, 2e5, 8e5), sag: fc.boolean() });

describe('functions the search relies on', () => {
  test.prop([fc.double({ min: 0, max: 4, noNaN: true }), fc.constantFrom('a0' as const, 'a' as const, 'b' as const, 'c' as const, 'd' as const)], { numRuns: 300 })('chiValue is chi(…).chi exactly', (l, curve) => {
    expect(chiValue(l, curve)).toBe(chi(l, curve).chi);
  });
  test.prop([fc.double({ min: 1e6, max: 1e10, noNaN: true }), fc.double({ min: 1e5, max: 1e8, noNaN: true }), fc.double({ min: 1e10, max: 1e15, noNaN: true }), fc.integer({ min: 1000, max: 20000 }), fc.double({ min: 1, max: 2.6, noNaN: true }), fc.double({ min: 0, max: 1, noNaN: true }), fc.double({ min: 0, max: 1.8, noNaN: true }), fc.double({ min: -900, max: 900, noNaN: true }), fc.double({ min: -600, max: 600, noNaN: true })], { numRuns: 300 })(
    'mcrOf is mcr exactly',
    (Iz, It, Iw, L, C1, C2, C3, zg, zj) => {
      expect(mcrOf(210000, 81000, Iz, It, Iw, L, C1, C2, C3, zg, zj)).toBe(mcr({ E: 210000, G: 81000, Iz, It, Iw, L, C1, C2, C3, zg, zj }));
    },
  );
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
    // the split the search uses (from the registry): checks that read no layout, then the rest
    const first = PLATE_IDS;
    const rest = LAYOUT_IDS;
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
      const ids = [...PANEL_ONLY];
      const va = checkGirder(base, e, o);
      const vb = checkGirder(other, e, o);
      for (const id of ids) expect(vb.checks.find((c) => c.id === id)).toEqual(va.checks.find((c) => c.id === id));
      // the search's second call, with those results given: the same outcome as checkGirder
      const rest = LAYOUT_IDS;
      const known = new Map(va.checks.filter((c) => ids.includes(c.id) && c.passes).map((c) => [c.id, c] as const));
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
    // the same operations in the same order: equal, not merely close
    expect(u).toBe(v.utilisation);
  });

  test.prop([sectionArb, fc.array(fc.record({ x: fc.integer({ min: 500, max: 15500 }), F: fc.double({ min: 2e4, max: 1.5e6, noNaN: true }), ss: fc.constantFrom(0, 100, 250), M: fc.oneof(fc.constant(0), fc.double({ min: -5e9, max: -1e5, noNaN: true }), fc.double({ min: 1e5, max: 8e9, noNaN: true })) }), { minLength: 1, maxLength: 4 }), fc.constantFrom(1, 1 + 1e-9)], { numRuns: 300 })(
    'patchBendingMelNeed is the least MelRd at which patchBendingFloor is within the limit',
    (r, fs, limit) => {
      const s = sectionOf(r);
      const o = defaultOptions(16000);
      const ctx = prepare(s, o);
      const web = { hw: s.hw, tw: s.tw, fyw: ctx.m.fyw };
      const top = { b: s.top.b, t: s.top.t, fy: ctx.m.fyTop };
      const panels = panelsOf(o.supports, s.stiffeners?.a ?? null).panels;
      const forces = fs.map((f) => ({ x: f.x, F: f.F, ss: f.ss }));
      const sag = fs.map((f) => f.M);
      const etas = patchEta2s(forces, web, top, panels, o.E, o.factors.gammaM1);
      expect(Math.max(0, ...etas)).toBe(patchUtilisation(forces, web, top, panels, o.E, o.factors.gammaM1));
      const need = patchBendingMelNeed(etas, sag, limit);
      const floor = (MelRd: number) => patchBendingFloor(forces, web, top, panels, o.E, o.factors.gammaM1, sag, MelRd);
      if (need === Infinity) {
        // some force's η2 alone leaves no room: no resistance passes
        expect(floor(1e30)).toBeGreaterThan(limit);
      } else if (need === 0) {
        expect(sag.every((M) => !(M > 0))).toBe(true);
      } else {
        expect(floor(need * (1 + 1e-9))).toBeLessThanOrEqual(limit);
        expect(floor(need * (1 - 1e-9))).toBeGreaterThan(limit);
      }
    },
  );

  test.prop(
    [
      sectionArb,
      fc.array(fc.record({ x: fc.integer({ min: 500, max: 15500 }), F: fc.double({ min: 2e4, max: 1.5e6, noNaN: true }), ss: fc.constantFrom(0, 100, 250) }), { minLength: 1, maxLength: 3 }),
      fc.array(fc.integer({ min: 100, max: 900 }), { minLength: 2, maxLength: 8 }),
      fc.constantFrom(235, 275, 345, 355, 440, 460),
    ],
    { numRuns: 300 },
  )('patchEta2s never rises as the loaded flange widens (its thickness and fy fixed): the search drops a run when its widest top flange fails 6.4', (r, fs, widths, fyf) => {
    const s = sectionOf(r);
    const o = defaultOptions(16000);
    const panels = panelsOf(o.supports, s.stiffeners?.a ?? null).panels;
    const web = { hw: s.hw, tw: s.tw, fyw: fy('S355', s.tw) };
    const bs = [...widths].sort((x, y) => x - y);
    let prev: Float64Array | null = null;
    for (const b of bs) {
      const etas = patchEta2s(fs, web, { b, t: s.top.t, fy: fyf }, panels, o.E, o.factors.gammaM1);
      // the same operations on a wider flange: never a larger η2, to round-off
      if (prev) for (let i = 0; i < etas.length; i++) expect(etas[i]!).toBeLessThanOrEqual(prev[i]! * (1 + 1e-12));
      prev = etas;
    }
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

describe('bearing floor (bearingCandidates)', () => {
  let checked = 0;
  let bitten = 0;
  let plated = 0;
  // consistency property: the floor the search puts on the bearing stiffeners (each term the objectives read) is never above what the sizing returns for a section whose bearing checks pass
  test.prop([sectionArb, loadArb, fc.double({ min: 0.2, max: 12, noNaN: true })], { numRuns: 300 })('is at most the sized stiffeners whenever the bearing checks pass', (r, l, k) => {
    const s = sectionOf(r);
    const e0 = effectsOf(l.L, l.w, l.P, l.sag);
    // reactions scaled independently of the span's effects: light to crushing a pair of flats
    const e: Effects = { ...e0, reactions: e0.reactions.map((x, i) => ({ x: x.x, R: x.R * k * (i === 0 ? 1 : 0.7) })) };
    const o = defaultOptions(l.L);
    const v = checkGirder(s, e, o);
    const ok = v.checks.filter((c) => c.id === 'end-post' || c.id === 'bearing-stiffener' || c.id === 'stiffener-torsion').every((c) => c.passes);
    const Rmax = Math.max(...e.reactions.map((x) => Math.abs(x.R)));
    const cands = bearingCandidates(o, 'S355');
    const floor = cands.floorFor(Math.min(r.bt, r.bb), r.tw, Rmax, s.endPost);
    if (ok && v.bearingSized && floor !== null) {
      checked++;
      if ((v.bearing.pairs ?? 1) > 1 || !o.bearingFlats.some((f) => f.b === v.bearing.bs && f.t === v.bearing.ts)) plated++;
      const none = cands.floorFor(Math.min(r.bt, r.bb), r.tw, 0, s.endPost);
      expect(floor).not.toBe('none');
      if (floor === 'none' || none === null || none === 'none') return;
      if (floor.area > none.area) bitten++;
      expect(floor.area).toBeLessThanOrEqual(bearingFlatArea(s.endPost, o.supports.length, v.bearing));
      expect(floor.flats).toBeLessThanOrEqual(2 * bearingPairCount(s.endPost, o.supports.length, v.bearing.pairs ?? 1));
      expect(floor.bs).toBeLessThanOrEqual(v.bearing.bs);
    }
  });

  test('the property above was tested on sections whose bearing checks pass, with stiffeners cut from plate or in several pairs, and the floor was above the lightest fitting option in some', () => {
    expect(checked).toBeGreaterThan(30);
    expect(bitten).toBeGreaterThan(5);
    expect(plated).toBeGreaterThan(3);
  });

  test('a large reaction excludes the options that would crush (EN 1993-1-5 9.4 bearing: n·2·(bs − snipe)·ts·fy/γM0 ≥ R)', () => {
    const o = defaultOptions(12000);
    const cands = bearingCandidates(o, 'S355');
    const light = cands.floorFor(400, 12, 0, 'non-rigid');
    const R = 1.2e6;
    const heavy = cands.floorFor(400, 12, R, 'non-rigid');
    if (light === null || light === 'none' || heavy === null || heavy === 'none') throw new Error('options fit a 400 mm flange');
    expect(heavy.area).toBeGreaterThan(light.area);
    // every option that fits, with less steel than the floor, would crush under R; one option with the floor's steel does not
    let lighter = 0;
    let atFloor = 0;
    for (const f of bearingOptions(o, 'S355')) {
      if (f.bs > (400 - 12) / 2) continue;
      const FbRd = f.pairs * bearingCrushing(f.bs, f.ts, o.snipe, fy('S355', f.ts, o.fySource), o.factors.gammaM0).FbRd;
      const area = bearingFlatArea('non-rigid', 2, f);
      if (area < heavy.area) {
        lighter++;
        expect(FbRd).toBeLessThan(R);
      } else if (area === heavy.area && FbRd >= R) atFloor++;
    }
    expect(lighter).toBeGreaterThan(0);
    expect(atFloor).toBeGreaterThan(0);
  });

  // EN 1993-1-1:2005 Table 5.2 (sheet 2, outstand flanges): Class 3 limit c/t ≤ 14ε, ε = √(235/fy)
  test.each(['S235', 'S275', 'S355', 'S420', 'S460'])('every option the sizing may choose in %s meets 9.2.1(8), so it is at most Class 3 as an outstand (EN 1993-1-1 Table 5.2: c/t ≤ 14ε)', (grade) => {
    const o = defaultOptions(12000);
    const all = bearingOptions(o, grade);
    expect(all.length).toBeGreaterThan(100);
    for (const f of all) {
      const fyf = fy(grade, f.ts, o.fySource);
      const tors = flatTorsion(f.bs, f.ts, fyf, o.E);
      expect(tors.ItOverIp).toBeGreaterThanOrEqual(tors.limit);
      expect(f.bs / f.ts).toBeLessThanOrEqual(14 * Math.sqrt(235 / fyf));
    }
  });
});


describe('iyNeedRange', () => {
  // consistency property: the enclosure holds at every self-weight of the range, and its points give the same requirement
  const pointArb = fc.record({
    bA: fc.double({ min: -1e13, max: 1e14, noNaN: true }),
    bB: fc.double({ min: -1e11, max: 1e11, noNaN: true }),
    sA: fc.double({ min: -1e9, max: 1e10, noNaN: true }),
    sB: fc.double({ min: -1e7, max: 1e7, noNaN: true }),
    limit: fc.double({ min: 5, max: 100, noNaN: true }),
  });
  test.prop([fc.array(pointArb, { minLength: 1, maxLength: 30 }), fc.double({ min: 0, max: 20, noNaN: true }), fc.double({ min: 0, max: 20, noNaN: true }), fc.double({ min: 0, max: 1, noNaN: true }), fc.double({ min: 0, max: 1, noNaN: true })], { numRuns: 300 })(
    'over the points an enclosing range kept, a range within it gives the same answer as over every point',
    (pts, a, b, u, v) => {
      const [g0, g1] = [Math.min(a, b), Math.max(a, b)];
      const lo = g0 + Math.min(u, v) * (g1 - g0);
      const hi = g0 + Math.max(u, v) * (g1 - g0);
      const f = (k: 'bA' | 'bB' | 'sA' | 'sB' | 'limit') => Float64Array.from(pts, (p) => p[k]);
      const [bA, bB, sA, sB, limit] = [f('bA'), f('bB'), f('sA'), f('sB'), f('limit')];
      const outer = iyNeedRange(g0, g1, bA, bB, sA, sB, limit, 12000, 210000, 81000);
      const all = iyNeedRange(lo, hi, bA, bB, sA, sB, limit, 12000, 210000, 81000);
      const some = iyNeedRange(lo, hi, bA, bB, sA, sB, limit, 12000, 210000, 81000, outer.points);
      expect(some.lo).toBe(all.lo);
      expect(some.hi).toBe(all.hi);
      expect([...some.points]).toEqual([...all.points]);
    },
  );
  test.prop([fc.array(pointArb, { minLength: 1, maxLength: 30 }), fc.double({ min: 0, max: 20, noNaN: true }), fc.double({ min: 0, max: 20, noNaN: true }), fc.array(fc.double({ min: 0, max: 1, noNaN: true }), { minLength: 1, maxLength: 6 })], { numRuns: 300 })(
    'lo ≤ the requirement ≤ hi for every g of the range, and the kept points give the same requirement',
    (pts, g1, spread, ts) => {
      const f = (k: 'bA' | 'bB' | 'sA' | 'sB' | 'limit') => Float64Array.from(pts, (p) => p[k]);
      const [bA, bB, sA, sB, limit] = [f('bA'), f('bB'), f('sA'), f('sB'), f('limit')];
      const Av = 12000;
      const E = 210000;
      const G = 81000;
      const gLo = g1;
      const gHi = g1 + spread;
      const r = iyNeedRange(gLo, gHi, bA, bB, sA, sB, limit, Av, E, G);
      for (const t of [0, 1, ...ts]) {
        const g = Math.min(gHi, gLo + t * (gHi - gLo));
        const need = minIyForDeflectionAt(g, bA, bB, sA, sB, limit, Av, E, G);
        expect(need).toBeGreaterThanOrEqual(r.lo);
        expect(need).toBeLessThanOrEqual(r.hi);
        expect(minIyForDeflectionAt(g, bA, bB, sA, sB, limit, Av, E, G, r.points)).toBe(need);
      }
    },
  );
});
