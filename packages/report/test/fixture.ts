import type { ReportInput } from '../src/index.js';

/** A small plain-data report (regression fixture; numbers illustrative, not engineering results). */
export function sampleReport(): ReportInput {
  const L = 20000;
  const x = Array.from({ length: 41 }, (_, i) => (L * i) / 40);
  const w = 60; // kN/m
  return {
    title: 'Schedule <A&B> report',
    subtitle: 'illustrative schedule',
    generatedAt: '2026-01-01',
    marks: [
      {
        mark: 'G1',
        quantity: 4,
        pareto: [
          { depth: 1100, mass: 6100, governing: 'bending' },
          { depth: 1300, mass: 5400, governing: 'shear-buckling' },
          { depth: 1500, mass: 5100, governing: 'deflection' },
          { depth: 1700, mass: 5050, governing: 'shear-buckling' },
        ],
        lightest: { depth: 1700, mass: 5050, governing: 'shear-buckling' },
        utilisation: {
          of: 'adopted',
          passes: false,
          checks: [
            { id: 'bending', utilisation: 0.91, passes: true },
            { id: 'shear-buckling', utilisation: 1.04, passes: false },
            { id: 'deflection', utilisation: 0.77, passes: true },
          ],
        },
        envelope: {
          x,
          MEd: x.map((v) => (w * v * (L - v)) / 2 / 1e6),
          VEd: x.map((v) => (w * (L / 2 - v)) / 1000),
          McRd: 3600,
          MbRd: 3300,
          VbRd: 700,
        },
      },
      {
        mark: 'G2 "end"',
        quantity: 2,
        pareto: [
          { depth: 900, mass: 2300 },
          { depth: 1000, mass: 2150 },
        ],
        lightest: { depth: 1000, mass: 2150 },
      },
    ],
    tonnage: {
      total: 4 * 5050 + 2 * 2150,
      girders: 6,
      byGrade: [{ grade: 'S355', mass: 24500, cost: null }],
      byThickness: [{ thickness: 12, kind: 'plate', mass: 24500 }],
      byMark: [
        { mark: 'G1', quantity: 4, length: 20000, perGirder: { total: 5050 }, perMetre: 252.5, total: 20200, cost: null },
        { mark: 'G2 "end"', quantity: 2, length: 10000, perGirder: { total: 2150 }, perMetre: 215, total: 4300, cost: null },
      ],
      plates: [{ kind: 'plate', grade: 'S355', thickness: 12, width: 1600, length: 20000, count: 4, mass: 12057.6, marks: ['G1'] }],
      cost: null,
    },
    rationalisation: {
      objective: 'mass',
      unrationalised: 24500,
      byK: [
        { K: 1, feasible: false, reason: 'no choice of 1 section fits every mark' },
        { K: 2, feasible: true, total: 24500, penalty: 0, penaltyRatio: 0, sections: ['a', 'b'] },
      ],
    },
  };
}
