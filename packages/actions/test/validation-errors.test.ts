/** Impossible input is a DomainError with a stable code, the offending field and a hint. */
import { describe, expect, test } from 'vitest';
import { analyse, analyseEnvelope, continuousBeam, designEffects, psiFor, type BeamProblem } from '@platesmith/actions';

const ok: BeamProblem = {
  spans: [24000],
  actions: [
    { kind: 'permanent', load: 'udl', value: 10 },
    { kind: 'variable', load: 'udl', value: 5, category: 'B' },
    { kind: 'variable', load: 'point', value: 1e5, at: 6000, category: 'E' },
  ],
  combination: '6.10',
};

const err = (code: string, field?: string, hint?: string | RegExp) =>
  expect.objectContaining({
    name: 'DomainError',
    code,
    ...(field !== undefined ? { field } : {}),
    ...(hint !== undefined ? { hint: typeof hint === 'string' ? hint : expect.stringMatching(hint) } : {}),
  });

describe('analyse input validation', () => {
  test.for([
    ['span in metres', { ...ok, spans: [24] }, err('SPAN_IMPLAUSIBLE', 'spans[0]', 'lengths are in mm: did you mean 24000 mm?')],
    ['negative span', { ...ok, spans: [24000, -5000] }, err('SPAN_NOT_POSITIVE', 'spans[1]')],
    ['NaN span', { ...ok, spans: [Number.NaN] }, err('NOT_FINITE', 'spans[0]')],
    ['no spans', { ...ok, spans: [] }, err('BAD_SPANS', 'spans')],
    ['point outside', { ...ok, actions: [ok.actions[0]!, ok.actions[1]!, { ...ok.actions[2]!, at: 25000 }] }, err('OUTSIDE_BEAM', 'actions[2].at')],
    ['point without at', { ...ok, actions: [{ kind: 'permanent', load: 'point', value: 1 }] }, err('NOT_FINITE', 'actions[0].at')],
    ['from >= to', { ...ok, actions: [{ kind: 'permanent', load: 'partial-udl', value: 1, from: 5000, to: 5000 }] }, err('BAD_RANGE', 'actions[0].from')],
    ['NaN value', { ...ok, actions: [{ kind: 'permanent', load: 'udl', value: Number.NaN }] }, err('NOT_FINITE', 'actions[0].value')],
    ['unknown category', { ...ok, actions: [{ kind: 'variable', load: 'udl', value: 1, category: 'Z' }] }, err('UNKNOWN_CATEGORY', 'actions[0].category')],
    ['ψ missing', { ...ok, actions: [{ kind: 'variable', load: 'udl', value: 1, psi0: 0.7 }] }, err('PSI_MISSING', 'actions[0].category')],
    ['ψ > 1', { ...ok, actions: [{ kind: 'variable', load: 'udl', value: 1, category: 'B', psi2: 1.2 }] }, err('PSI_OUT_OF_RANGE', 'actions[0].psi2')],
    ['negative ss', { ...ok, actions: [{ kind: 'permanent', load: 'point', value: 1, at: 100, ss: -1 }] }, err('BAD_BEARING_LENGTH', 'actions[0].ss')],
    ['bad kind', { ...ok, actions: [{ kind: 'accidental', load: 'udl', value: 1 }] }, err('BAD_ACTION_KIND', 'actions[0].kind')],
    ['bad combination', { ...ok, combination: '6.11' }, err('BAD_COMBINATION', 'combination')],
    ['ξ > 1', { ...ok, factors: { xi: 1.2 } }, err('BAD_FACTOR', 'factors.xi')],
    ['bad grid', { ...ok, gridDivisions: 2.5 }, err('BAD_GRID', 'gridDivisions')],
    ['station outside', { ...ok, extraStations: [-1] }, err('OUTSIDE_BEAM', 'extraStations[0]')],
    ['bad deflection ratio', { ...ok, deflection: [{ name: 't', ratio: 0, combination: 'characteristic', include: 'all' }] }, err('BAD_DEFLECTION_LIMIT', 'deflection[0].ratio')],
  ] as [string, unknown, unknown][])('%s', ([, p, e]) => {
    expect(() => analyse(p as BeamProblem)).toThrow(e as Error);
  });

  test('designEffects rejects a non-finite self-weight', () => {
    const a = analyse(ok);
    expect(() => designEffects(a, Number.NaN)).toThrow(err('NOT_FINITE', 'g'));
  });
  test('psiFor rejects an unknown category', () => {
    expect(() => psiFor('office')).toThrow(err('UNKNOWN_CATEGORY'));
  });
  test('continuousBeam rejects loads outside the beam', () => {
    expect(() => continuousBeam([6000], [{ type: 'point', P: 1, at: 7000 }])).toThrow(err('POINT_OUTSIDE_BEAM', 'loads[0].at'));
    expect(() => continuousBeam([6000], [{ type: 'udl', w: 1, from: 3000, to: 2000 }])).toThrow(err('BAD_RANGE', 'loads[0].from'));
  });
  test('analyseEnvelope validates length, supports and stations', () => {
    expect(() => analyseEnvelope({ envelope: [{ x: 0, MEd: 0, VEd: 0 }], length: 30 })).toThrow(err('SPAN_IMPLAUSIBLE', 'length', 'lengths are in mm: did you mean 30000 mm?'));
    expect(() => analyseEnvelope({ envelope: [{ x: 31000, MEd: 0, VEd: 0 }], length: 30000 })).toThrow(err('OUTSIDE_BEAM', 'envelope[0].x'));
    expect(() => analyseEnvelope({ envelope: [{ x: 0, MEd: Number.NaN, VEd: 0 }], length: 30000 })).toThrow(err('NOT_FINITE', 'envelope[0].MEd'));
    expect(() => analyseEnvelope({ envelope: [], length: 30000 })).toThrow(err('BAD_ENVELOPE', 'envelope'));
    expect(() => analyseEnvelope({ envelope: [{ x: 0, MEd: 0, VEd: 0 }], length: 30000, supports: [0, 40000] })).toThrow(err('BAD_SUPPORTS', 'supports'));
  });
});
