/**
 * The optimiser's status: a search run to the end is `exact` (or `infeasible` when nothing
 * passes); a search stopped early is `aborted`, and every point it returns passes every check:
 * each is on the exact front or dominated by a point of it (the exact search is tied to brute
 * force by exact.test.ts). The stop is a signal that trips after a fixed number of polls, so the
 * tests are deterministic. The problem is the test fixture (handbook closed forms), invented.
 */
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { FLAT_BARS } from '@platesmith/catalogue';
import { defaultOptions } from '@platesmith/checks';
import { analyse } from '@platesmith/actions';
import { DEFAULT_COST, problemOf, search, stiffenerStations, type Evaluated, type SearchProblem, type SearchTask, type SpaceSpec } from '../src/index.js';
import { createSearchPool, searchOnPool, type SearchPool } from '../src/pool.js';
import { simpleSpanModel } from './fixtures.js';

const space: SpaceSpec = {
  hw: [500, 600, 700, 800, 900, 1000, 1100, 1200],
  tw: [8, 10, 12],
  bf: [200, 250, 300, 350, 400],
  tf: [12, 15, 20, 25, 30],
  symmetric: false,
  panels: [0, 3, 6],
  flats: [...FLAT_BARS].slice(0, 2),
  sides: [2],
  endPosts: ['rigid'],
  webGrades: ['S355'],
  flangeGrades: ['S355'],
  minDepth: 0,
  maxDepth: Infinity,
  rules: {},
};
const L = 12000;
const problem = (q: number): SearchProblem => ({ space, options: defaultOptions(L, { restraint: { kind: 'at', at: [0, 4000, 8000, 12000] } }), load: simpleSpanModel(L, q, 0, q / 1.5), objective: 'mass', cost: DEFAULT_COST });

/** A stop signal that answers false `polls` times, then true. */
const after = (polls: number) => {
  let n = 0;
  return {
    get aborted() {
      return n++ >= polls;
    },
  };
};

/** How many times a search run to the end polls its stop signal (a signal that never trips). */
const countPolls = (p: SearchProblem): number => {
  let n = 0;
  const r = search(p, {
    get aborted() {
      n++;
      return false;
    },
  });
  if (r.status !== 'exact') throw new Error(`the counting run ended ${r.status}, not exact`);
  return n;
};

const dominatedBy = (p: Evaluated, front: Evaluated[]) => front.some((f) => f.depth <= p.depth && f.value <= p.value);

describe('search status', () => {
  const full = search(problem(40));

  test('run to the end: exact, and a stop that never trips changes nothing', () => {
    expect(full.status).toBe('exact');
    expect(full.pareto.length).toBeGreaterThan(1); // the space is drawn so that a front exists: an empty one would prove nothing
    const watched = search(problem(40), after(Number.MAX_SAFE_INTEGER));
    expect(watched.status).toBe('exact');
    expect(watched.pareto.map((e) => e.key)).toEqual(full.pareto.map((e) => e.key));
  });

  test('nothing passes: infeasible', () => {
    const none = search(problem(4000));
    expect(none.status).toBe('infeasible');
    expect(none.pareto).toEqual([]);
  });

  // the exact search's own number of polls: the stops below are drawn from it, so that each one
  // falls inside the search whatever the space, defaults and answers make that number
  const polls = countPolls(problem(40));
  const stops = [0, 1, 5, Math.floor(polls * 0.1), Math.floor(polls / 2), Math.floor(polls * 0.75), polls - 1];

  test('premise: the exact search polls its stop signal, and every stop below falls inside it', () => {
    expect(polls).toBeGreaterThan(20);
    for (const n of stops) expect(n).toBeLessThan(polls);
  });

  test.for(stops)('stopped after %i polls: aborted, and every point returned passes and is on or behind the exact front', (n) => {
    const r = search(problem(40), after(n));
    expect(r.status).toBe('aborted');
    if (n >= Math.floor(polls * 0.75)) expect(r.pareto.length).toBeGreaterThan(0); // late stops return points: the loop below then checks something
    for (const p of r.pareto) {
      expect(p.verdict.passes).toBe(true);
      expect(dominatedBy(p, full.pareto)).toBe(true);
    }
  });
});

describe('search status on the pool', () => {
  let pool: SearchPool;
  beforeAll(() => {
    pool = createSearchPool({ threads: 2 });
  });
  afterAll(async () => {
    await pool.close();
  });

  const spans = [L];
  const task: SearchTask = {
    space,
    options: defaultOptions(L, { restraint: { kind: 'at', at: [0, 4000, 8000, 12000] } }),
    analysis: analyse({ spans, actions: [{ kind: 'permanent', load: 'udl', value: 8 }, { kind: 'variable', load: 'udl', value: 20, category: 'B' }], combination: '6.10', extraStations: stiffenerStations(spans, space.panels) }),
    objective: 'mass',
    cost: DEFAULT_COST,
  };

  test('a stop given before the search starts: every worker returns at its first poll, aborted and empty', async () => {
    const r = await searchOnPool(pool, task, { stop: AbortSignal.abort() });
    expect(r.status).toBe('aborted');
    expect(r.pareto).toEqual([]);
  });

  test('no stop: exact, the single-threaded answer', async () => {
    const r = await searchOnPool(pool, task, { stop: new AbortController().signal });
    expect(r.status).toBe('exact');
    expect(r.pareto.map((e) => e.key)).toEqual(search(problemOf(task)).pareto.map((e) => e.key));
  });
});
