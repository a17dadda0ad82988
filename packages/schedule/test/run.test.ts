/**
 * Schedule runner with a stub search (regression of the merge, the failing-alone rule and the
 * totals; no engineering value is asserted: the stub returns a fixed, invented result).
 */
import { expect, test } from 'vitest';
import { mergeGirder, runSchedule, ScheduleJson, type ScheduleProgress } from '@platesmith/schedule';
import type { SearchResult } from '@platesmith/search';

const PROBLEM = { spans: [12000], actions: [{ kind: 'permanent', load: 'udl', value: 10 }] };
const empty: SearchResult = { status: 'infeasible', pareto: [], lightest: null, nearMisses: [], stats: { spaceSize: 1, fullEvaluations: 0, pruned: { depth: 0, rules: 0, shear: 0, bending: 0, flangeInducedBuckling: 0, deflection: 0, patchLoading: 0, patchBending: 0, lateralTorsional: 0, bearing: 0, sameFlanges: 0, webOnly: 0, incumbent: 0 }, failedBy: {}, wallMs: 0, workers: 1, webConfigurations: 1 } };

test('girder fields win; space and options merge one level deep', () => {
  const m = mergeGirder({ spans: [1], space: { a: 1, b: 1 }, options: { eta: 1 }, combination: '6.10' }, { mark: 'G', quantity: 1, spans: [2], space: { b: 2 }, options: { eta: 1.2 } });
  expect(m).toEqual({ spans: [2], space: { a: 1, b: 2 }, options: { eta: 1.2 }, combination: '6.10' });
});

test('a bad mark fails alone with its field issues; progress counts every mark; cancel rejects', async () => {
  const s = ScheduleJson.parse({ defaults: PROBLEM, girders: [{ mark: 'A', quantity: 2 }, { mark: 'B', quantity: 1, spans: ['12 m'] }, { mark: 'C', quantity: 3 }] });
  const seen: ScheduleProgress[] = [];
  const r = await runSchedule(s, { search: async () => empty, onProgress: (p) => seen.push(p) });
  // the stub finds no section: A and C fail as marks without a section (their search kept), B on its input
  expect(r.marks.map((m) => [m.status, m.error?.code])).toEqual([
    ['failed', 'NO_FEASIBLE_SECTION'],
    ['failed', 'INVALID_INPUT'],
    ['failed', 'NO_FEASIBLE_SECTION'],
  ]);
  expect(r.marks[0]!.search).not.toBeNull();
  expect(r.marks[0]!.error!.message).toBe('mark A: no section in its space passes every check; the search returned no nearest miss (every candidate was ruled out by a bound before any was judged)');
  expect(r.marks[1]!.error?.issues?.map((i) => i.path)).toContain('spans[0]');
  expect(r.totals).toMatchObject({ marks: 3, marksFailed: 3, girders: 6, tonnage: 0, marksWithoutFeasible: ['A', 'C'], girdersWithoutFeasible: 5 });
  expect(seen.map((p) => p.marksDone)).toEqual([0, 1, 2, 3]);
  expect(seen.at(-1)!.currentMark).toBeNull();
  const ac = new AbortController();
  ac.abort(new Error('stop'));
  await expect(runSchedule(s, { search: async () => empty }, ac.signal)).rejects.toThrow('stop');
});
