/**
 * A mark without a section, when its search returned a nearest miss: the failure reason in words,
 * the flagged estimate line (nearest miss × quantity) and what the tonnage covers. Regression of
 * the tender rules on invented data (no engineering value asserted; masses are the invented miss's).
 * The estimate is quantity × the miss's mass: hand arithmetic (common practice, no source).
 */
import { expect, test } from 'vitest';
import type { PublishedSearch } from '@platesmith/schema';
import { failureReason, finishSchedule, nearMissesText, ScheduleJson, type MarkResult } from '@platesmith/schedule';

const section = { web: { depth: 1000, thickness: 10 }, topFlange: { width: 300, thickness: 20 }, bottomFlange: { width: 300, thickness: 20 }, stiffeners: null, endPost: 'rigid' as const, grade: 'S355' };
const governing = { id: 'bending', clause: 'EN 1993-1-1 6.2.5', applies: true, utilisation: 1.31, passes: false, at: 6000, values: {}, units: {} };
const stats = { spaceSize: 1, fullEvaluations: 1, pruned: { depth: 0, rules: 0, shear: 0, bending: 0, flangeInducedBuckling: 0, deflection: 0, patchLoading: 0, patchBending: 0, lateralTorsional: 0, bearing: 0, sameFlanges: 0, webOnly: 0, incumbent: 0 }, failedBy: {}, wallMs: 1, workers: 1, webConfigurations: 1 };
const withMiss: PublishedSearch = {
  objective: 'mass',
  status: 'infeasible',
  message: 'infeasible: no section passes every check',
  pareto: [],
  lightest: null,
  nearMisses: [{ depth: 1040, mass: 1234.5, section, governing, failing: ['bending', 'lateral-torsional-buckling'] }],
  stats,
  assumptions: [],
  caution: '',
  scope: '',
};

test('the nearest miss in words, and the estimate line it gives', async () => {
  expect(nearMissesText(withMiss)).toBe('nearest miss 1,235 kg at h = 1040 mm (web 1000×10, flanges 300×20 / 300×20) fails bending, lateral-torsional-buckling');
  expect(nearMissesText({ ...withMiss, nearMisses: [] })).toBe('the search returned no nearest miss (every candidate was ruled out by a bound before any was judged)');
  const m: MarkResult = { mark: 'Y', quantity: 3, status: 'failed', search: withMiss, adopted: null, error: { code: 'NO_FEASIBLE_SECTION', message: 'mark Y: …' } };
  expect(failureReason(m)).toBe(`no feasible section: ${nearMissesText(withMiss)} (NO_FEASIBLE_SECTION)`);

  const schedule = ScheduleJson.parse({ defaults: { spans: [12000], actions: [{ kind: 'permanent', load: 'udl', value: 10 }] }, girders: [{ mark: 'Y', quantity: 3 }, { mark: 'Z', quantity: 1, spans: ['x'] }] });
  const z: MarkResult = { mark: 'Z', quantity: 1, status: 'failed', search: null, adopted: null, error: { code: 'INVALID_INPUT', message: 'mark Z: the input is invalid' } };
  const r = await finishSchedule(schedule, [m, z]);
  expect(r.tender.tonnage).toBeNull();
  expect(r.tender.leftOut).toEqual([
    { mark: 'Y', quantity: 3, reason: 'no section in its space passes every check (and none adopted)' },
    { mark: 'Z', quantity: 1, reason: 'the mark failed: mark Z: the input is invalid' },
  ]);
  expect(r.tender.estimates).toEqual([
    { mark: 'Y', quantity: 3, massPerGirder: 1234.5, mass: 3703.5, failing: ['bending', 'lateral-torsional-buckling'], flag: 'ESTIMATE, not a design: the nearest miss (fails bending, lateral-torsional-buckling) × 3' },
  ]);
  // Z could not be run: nothing to estimate, and the totals say they are short by it
  expect(r.tender.coverage).toEqual({ marks: 0, girders: 0, tonnage: 0, excludedMarks: 2, excludedGirders: 4, estimated: 3703.5, totalWithEstimates: 3703.5, short: ['Z'] });
});
