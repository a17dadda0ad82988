import { afterAll, beforeAll, describe, expect } from 'vitest';
import { fc, test } from '@fast-check/vitest';
import { checkGirder, defaultOptions, girderMass, girderSelfWeight, type GirderVerdict, type Section } from '@platesmith/checks';
import { analyse } from '@platesmith/actions';
import { DEFAULT_COST, explainPoints, prepareSearch, problemOf, search, stiffenerStations, type Evaluated, type Limit, type SearchTask, type SpaceSpec } from '../src/index.js';
import { createSearchPool, searchOnPool, type SearchPool } from '../src/pool.js';
import { simpleSpanModel } from './fixtures.js';
import { SMALL_LISTS, spaceArb, spaceOf } from './spaces.js';

/**
 * Issue 17, item 6: "what stops it being lighter?". Every Pareto point of an explained search
 * carries limitedBy: each one-step lighter neighbour in the space and what rules it out. The
 * reference is `check` itself: the neighbours are rebuilt here from the point's section (not with
 * the search's code) and judged by checkGirder with their own self-weight. A neighbour that passes
 * and is lighter would contradict the exactness of the search: it must never appear.
 */

const below = (values: readonly number[], v: number) => values.filter((x) => x < v).reduce<number | undefined>((a, x) => (a === undefined || x > a ? x : a), undefined);

/** The section a limit's move makes of the point's section (bearing left to the check's sizing), or null when the move cannot be made. */
function neighbour(sp: SpaceSpec, s: Section, move: Limit['move'], Lmax: number): Section | null {
  const { bearing: _b, ...bare } = s;
  const t = (f: Section['top']) => below(sp.tf, f.t);
  const b = (f: Section['top']) => below(sp.bf, f.b);
  switch (move) {
    case 'web-thickness': {
      const tw = below(sp.tw, s.tw);
      return tw === undefined ? null : { ...bare, tw };
    }
    case 'flange-thickness':
      return t(s.top) === undefined ? null : { ...bare, top: { ...s.top, t: t(s.top)! }, bot: { ...s.bot, t: t(s.bot)! } };
    case 'top-flange-thickness':
      return t(s.top) === undefined ? null : { ...bare, top: { ...s.top, t: t(s.top)! } };
    case 'bottom-flange-thickness':
      return t(s.bot) === undefined ? null : { ...bare, bot: { ...s.bot, t: t(s.bot)! } };
    case 'flange-width':
      return b(s.top) === undefined ? null : { ...bare, top: { ...s.top, b: b(s.top)! }, bot: { ...s.bot, b: b(s.bot)! } };
    case 'top-flange-width':
      return b(s.top) === undefined ? null : { ...bare, top: { ...s.top, b: b(s.top)! } };
    case 'bottom-flange-width':
      return b(s.bot) === undefined ? null : { ...bare, bot: { ...s.bot, b: b(s.bot)! } };
    case 'fewer-panels': {
      if (!s.stiffeners) return null;
      const n = Math.round(Lmax / s.stiffeners.a);
      const fewer = below(sp.panels, n);
      if (fewer === undefined) return null;
      return { ...bare, stiffeners: fewer === 0 ? null : { ...s.stiffeners, a: Lmax / fewer } };
    }
    case 'lighter-flats': {
      if (!s.stiffeners) return null;
      const area = s.stiffeners.bs * s.stiffeners.ts;
      const f = sp.flats.filter((x) => x.b * x.t < area).sort((x, y) => y.b * y.t - x.b * x.t)[0];
      return f ? { ...bare, stiffeners: { ...s.stiffeners, bs: f.b, ts: f.t } } : null;
    }
    case 'one-side':
      return s.stiffeners && s.stiffeners.sides === 2 ? { ...bare, stiffeners: { ...s.stiffeners, sides: 1 } } : null;
    case 'no-load-stiffeners':
      return s.loadStiffeners ? { ...bare, loadStiffeners: null } : null;
    case 'lighter-load-flats': {
      const ls = s.loadStiffeners;
      if (!ls) return null;
      const f = (sp.loadStiffeners ?? []).filter((x): x is NonNullable<typeof x> => x !== null && x.b * x.t < ls.bs * ls.ts).sort((x, y) => y.b * y.t - x.b * x.t)[0];
      return f ? { ...bare, loadStiffeners: { ...ls, bs: f.b, ts: f.t } } : null;
    }
  }
}

function worst(v: GirderVerdict) {
  return v.checks.filter((c) => !c.passes).reduce((a, c) => (c.utilisation > a.utilisation ? c : a));
}

const problemArb = fc.record({
  space: spaceArb(SMALL_LISTS),
  L: fc.constantFrom(8000, 12000, 16000),
  q: fc.double({ min: 10, max: 80, noNaN: true }),
  P: fc.constantFrom(0, 150e3, 400e3),
  restrained: fc.boolean(),
});

const seen = { points: 0, fails: 0, notLighter: 0, outside: 0 };

describe('every Pareto point has limitedBy, and it is what check says of each lighter neighbour', () => {
  test.prop([problemArb], { numRuns: 150 })('limits agree with checkGirder on the neighbours rebuilt from the section; none passes lighter', ({ space, L, q, P, restrained }) => {
    const sp = spaceOf(space);
    const options = defaultOptions(L, restrained ? { restraint: { kind: 'continuous' } } : { restraint: { kind: 'at', at: [0, L / 2, L] } });
    const load = simpleSpanModel(L, q, P, q / 1.4);
    const r = search({ space: sp, options, load, objective: 'mass', cost: DEFAULT_COST }, undefined, { explain: true });
    for (const e of r.pareto) {
      expect(e.limitedBy).toBeDefined();
      expect(e.edge).toBeDefined();
      seen.points++;
      for (const l of e.limitedBy!) {
        expect(l.outcome).not.toBe('passes');
        if (l.outcome === 'fails') seen.fails++;
        else if (l.outcome === 'not-lighter') seen.notLighter++;
        else seen.outside++;
        const n = neighbour(sp, e.section, l.move, L);
        expect(n, l.move).not.toBeNull();
        if (l.outcome === 'outside-space') continue;
        const v = checkGirder(n!, load.effects(girderSelfWeight(n!, [0, L])), options);
        if (l.outcome === 'fails') {
          expect(v.passes).toBe(false);
          expect(l.check).toBe(worst(v).id);
          expect(l.utilisation).toBe(worst(v).utilisation);
        } else {
          // it passes and weighs no less: bearing stiffeners are what can make a lighter plate heavier overall
          expect(v.passes).toBe(true);
          expect(girderMass(n!, L, [0, L], v.bearing).total).toBeGreaterThanOrEqual(e.mass * (1 - 1e-9));
        }
      }
    }
  });

  test('the property judged points and failing neighbours (it is not vacuous)', () => {
    expect(seen.points).toBeGreaterThan(20);
    expect(seen.fails).toBeGreaterThan(20);
  });
});

describe('the nearest misses are always there when nothing passes', () => {
  let pool: SearchPool;
  beforeAll(() => {
    pool = createSearchPool({ threads: 2 });
  });
  afterAll(async () => {
    await pool.close();
  });
  // an invented case where every candidate is dropped by a bound before it is judged (a 30 m span
  // under 400 kN/m on small plates): the search keeps no failed candidate of its own
  const L = 30000;
  const space: SpaceSpec = {
    hw: [600, 800],
    tw: [8, 10],
    bf: [200, 250],
    tf: [12, 15],
    symmetric: true,
    panels: [0, 4],
    flats: [{ b: 100, t: 10 }],
    sides: [2],
    endPosts: ['non-rigid'],
    webGrades: ['S355'],
    flangeGrades: ['S355'],
    minDepth: 0,
    maxDepth: Number.POSITIVE_INFINITY,
    rules: {},
  };
  const problem = { space, options: defaultOptions(L), load: simpleSpanModel(L, 400, 0, 300), objective: 'mass' as const, cost: DEFAULT_COST };

  test('without explain the search has no near miss (every candidate pruned by a bound): the case the issue saw', () => {
    const r = search(problem);
    expect(r.status).toBe('infeasible');
    expect(r.stats.fullEvaluations).toBe(0);
    expect(r.nearMisses).toEqual([]);
  });

  test('explained, single-threaded and on the pool: the strongest candidates of the space, judged by check, lowest utilisation first', async () => {
    const one = search(problem, undefined, { explain: true });
    for (const r of [one]) {
      expect(r.nearMisses.length).toBeGreaterThan(0);
      const us = r.nearMisses.map((m: Evaluated) => m.verdict.governing.utilisation);
      expect([...us].sort((a, b) => a - b)).toEqual(us);
      for (const m of r.nearMisses) {
        // the deepest web and the heaviest flange of the space
        expect(m.section.hw).toBe(800);
        expect(m.section.top).toEqual({ b: 250, t: 15 });
        const v = checkGirder({ ...m.section, bearing: undefined }, problem.load.effects(girderSelfWeight(m.section, [0, L])), problem.options);
        expect(v.passes).toBe(false);
        expect(m.verdict.governing.utilisation).toBe(v.governing.utilisation);
      }
    }
  });

  test('on the worker pool the explained answer is the single-threaded one (limits of every point, near misses)', async () => {
    for (const [g, q] of [
      [150, 250],
      [10, 15],
    ] as const) {
      const analysis = analyse({ spans: [16000], actions: [{ kind: 'permanent', load: 'udl', value: g }, { kind: 'variable', load: 'udl', value: q, category: 'B' }], combination: '6.10', extraStations: stiffenerStations([16000], space.panels) });
      const task: SearchTask = { space: { ...space, hw: [900, 1100, 1300], bf: [250, 300, 350], tf: [15, 20, 25] }, options: defaultOptions(16000), analysis, objective: 'mass', cost: DEFAULT_COST };
      const one = search(problemOf(task), undefined, { explain: true });
      const pooled = await searchOnPool(pool, task, { explain: true });
      const view = (r: typeof one) => ({ pareto: r.pareto.map((e) => ({ key: e.key, limitedBy: e.limitedBy, edge: e.edge })), misses: r.nearMisses.map((m) => ({ section: m.section, u: m.verdict.governing.utilisation })) });
      expect(view(pooled)).toEqual(view(one));
      expect(pooled.pareto.length + pooled.nearMisses.length).toBeGreaterThan(0);
    }
  });
});

// regression of the fuzz test (seed 20261203): a flange width below the web thickness in the space made a
// neighbour the check library rejects as a section (DomainError), and the worker failed with a 500
test('a neighbour that is not a section (a flange not wider than the web) is outside the space, not a failure of the search', () => {
  const sp: SpaceSpec = { hw: [700], tw: [8], bf: [0.5, 250], tf: [12, 15], symmetric: true, panels: [0], flats: [], sides: [2], endPosts: ['rigid'], webGrades: ['S355'], flangeGrades: ['S355'], minDepth: 0, maxDepth: Infinity, rules: {} };
  const problem = { space: sp, options: defaultOptions(12000, { restraint: { kind: 'continuous' } }), load: simpleSpanModel(12000, 30, 0, 20), objective: 'mass' as const, cost: DEFAULT_COST };
  const r = search(problem);
  expect(r.pareto.length).toBeGreaterThan(0);
  const narrower = explainPoints(prepareSearch(problem), r.pareto).flatMap((x) => x.limitedBy).filter((l) => l.move === 'flange-width');
  expect(narrower.length).toBeGreaterThan(0);
  for (const l of narrower) expect(l.outcome).toBe('outside-space');
});
