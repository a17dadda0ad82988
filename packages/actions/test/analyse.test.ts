/**
 * Behaviour of analyse / designEffects / summarise / analyseEnvelope. Values derived here with
 * the same formulas are regression values, not validation (see test/validation/ for published
 * sources). Closed forms (5wL⁴/384, wL²/8) are handbook results, from memory.
 */
import { describe, expect, test } from 'vitest';
import { analyse, analyseEnvelope, combinationsFor, designEffects, summarise, type BeamProblem } from '@platesmith/actions';

const rel = (a: number, b: number) => Math.abs(a / b - 1);

describe('stations', () => {
  const p: BeamProblem = {
    spans: [10000, 8000],
    actions: [
      { kind: 'permanent', load: 'udl', value: 5 },
      { kind: 'variable', load: 'point', value: 80e3, at: 3000, category: 'B' },
      { kind: 'permanent', load: 'point', value: 20e3, at: 10000 },
      { kind: 'variable', load: 'partial-udl', value: 10, from: 12000, to: 15000, category: 'B' },
    ],
    combination: '6.10',
    gridDivisions: 4,
    extraStations: [7777],
  };
  const a = analyse(p);
  const xs = [...a.stationX];
  const sides = [...a.stationSide];
  const at = (x: number) => xs.map((v, i) => (v === x ? sides[i] : null)).filter((s) => s !== null);
  test('ends one-sided, supports and point loads both sides, partial-UDL ends, grid and extra stations', () => {
    expect.soft(at(0)).toEqual([1]);
    expect.soft(at(18000)).toEqual([-1]);
    expect.soft(at(10000)).toEqual([-1, 1]);
    expect.soft(at(3000)).toEqual([-1, 1]);
    for (const x of [12000, 15000, 7777, 2500, 5000, 7500, 14000, 16000]) expect.soft(at(x), `station ${x}`).toEqual([0]);
    expect.soft(xs.every((x, i) => i === 0 || x >= xs[i - 1]!)).toBe(true);
  });
  test('across the variable point load the max-M pattern keeps M and V drops by 1.5·P (combination 6.10 G sup + Q1 lead)', () => {
    const nK = a.stationX.length;
    const kL = xs.findIndex((x, i) => x === 3000 && sides[i] === -1);
    const kR = xs.findIndex((x, i) => x === 3000 && sides[i] === 1);
    expect(a.combinations[0]).toBe('6.10 G sup + Q1 (B) lead');
    const [ML, VL] = [a.A[kL * 8]!, a.A[kL * 8 + 1]!];
    const [MR, VR] = [a.A[kR * 8]!, a.A[kR * 8 + 1]!];
    expect.soft(rel(ML, MR)).toBeLessThan(1e-12);
    expect.soft(rel(VL - VR, 1.5 * 80e3)).toBeLessThan(1e-9);
    expect.soft(kL + 1).toBe(kR);
    expect.soft(nK).toBe(xs.length);
  });
  test('forces: point loads away from supports, design value max over ULS, ss default 100 mm', () => {
    const e = designEffects(a, 0);
    expect(e.forces).toEqual([{ x: 3000, F: 1.5 * 80e3, ss: 100 }]);
  });
});

describe('forces', () => {
  test('coincident permanent and variable point loads: F = 1.35·G + 1.5·Q, smallest ss', () => {
    const a = analyse({
      spans: [12000],
      actions: [
        { kind: 'permanent', load: 'point', value: 50e3, at: 4000, ss: 120 },
        { kind: 'variable', load: 'point', value: 80e3, at: 4000, ss: 80, category: 'B' },
        { kind: 'variable', load: 'point', value: -30e3, at: 8000, ss: 80, category: 'wind' },
      ],
      combination: '6.10',
    });
    expect(designEffects(a, 3).forces).toEqual([{ x: 4000, F: 1.35 * 50e3 + 1.5 * 80e3, ss: 80 }]);
  });
});

describe('SLS deflection demands (simple span; closed forms 5wL⁴/384 and wL²/8, from memory)', () => {
  const L = 10000;
  const p: BeamProblem = {
    spans: [L],
    actions: [
      { kind: 'permanent', load: 'udl', value: 5 },
      { kind: 'variable', load: 'udl', value: 8, category: 'B' },
      { kind: 'variable', load: 'udl', value: -3, category: 'wind' },
    ],
    combination: '6.10',
    deflection: [
      { name: 'total', ratio: 250, combination: 'characteristic', include: 'all' },
      { name: 'variable', ratio: 360, combination: 'characteristic', include: 'variable' },
      { name: 'frequent', ratio: 300, combination: 'frequent', include: 'all' },
    ],
  };
  const e = designEffects(analyse(p), 1.2);
  const mid = (i: number) => e.sls[i]!.points.filter((q) => q.x === L / 2);
  test('total: G + g + Q (wind favourable → 0); bend = 5wL⁴/384, shear = wL²/8', () => {
    const [down] = mid(0);
    const w = 5 + 1.2 + 8;
    expect.soft(rel(down!.bend, (5 * w * L ** 4) / 384)).toBeLessThan(1e-12);
    expect.soft(rel(down!.shear, (w * L * L) / 8)).toBeLessThan(1e-12);
    expect.soft(mid(0).length).toBe(1); // no uplift under G + g
  });
  test('variable only: Q down, and wind uplift reported as a second point', () => {
    const [down, up] = mid(1);
    expect.soft(rel(down!.bend, (5 * 8 * L ** 4) / 384)).toBeLessThan(1e-12);
    expect.soft(rel(up!.bend, (5 * -3 * L ** 4) / 384)).toBeLessThan(1e-12);
    expect.soft(e.sls[1]!.ratio).toBe(360);
  });
  test('frequent: G + g + ψ1·Q (ψ1 = 0.5, category B)', () => {
    const [down] = mid(2);
    expect(rel(down!.bend, (5 * (5 + 1.2 + 0.5 * 8) * L ** 4) / 384)).toBeLessThan(1e-12);
  });
  test('default limits: total L/250 and variable L/360, characteristic', () => {
    const d = designEffects(analyse({ ...p, deflection: undefined }), 0);
    expect(d.sls.map((s) => [s.name, s.ratio])).toEqual([
      ['total', 250],
      ['variable', 360],
    ]);
  });
});

describe('6.10a / 6.10b (regression values derived from the same formulas)', () => {
  const base: BeamProblem = {
    spans: [5700],
    actions: [
      { kind: 'permanent', load: 'udl', value: 9.557 },
      { kind: 'variable', load: 'udl', value: 6.25, category: 'B', name: 'Q' },
    ],
    combination: '6.10ab',
  };
  const k = (5700 * 5700) / 8;
  test('light permanent load: 6.10b ξ·γG,sup·G + γQ·Q governs', () => {
    const s = summarise(analyse(base), 0);
    expect.soft(rel(s.envelope.MEdMax / k, 0.85 * 1.35 * 9.557 + 1.5 * 6.25)).toBeLessThan(1e-12);
    expect.soft(s.governing.MEdMax).toBe('6.10b ξ·G sup + Q lead');
  });
  test('the governing combination changes with g: heavy self-weight makes 6.10a govern', () => {
    const s = summarise(analyse(base), 30);
    expect.soft(rel(s.envelope.MEdMax / k, 1.35 * (9.557 + 30) + 1.5 * 0.7 * 6.25)).toBeLessThan(1e-12);
    expect.soft(s.governing.MEdMax).toBe('6.10a G sup + ψ0·Q');
  });
  test('ξ = 1 makes 6.10b equal to 6.10', () => {
    const s = summarise(analyse({ ...base, factors: { xi: 1 } }), 0);
    const s610 = summarise(analyse({ ...base, combination: '6.10' }), 0);
    expect(rel(s.envelope.MEdMax, s610.envelope.MEdMax)).toBeLessThan(1e-12);
  });
  test('combination labels', () => {
    expect(combinationsFor(base).uls.map((c) => c.label)).toEqual([
      '6.10a G sup + ψ0·Q',
      '6.10b ξ·G sup + Q lead',
      '6.10a G inf + ψ0·Q',
      '6.10b G inf + Q lead',
    ]);
    expect(combinationsFor({ ...base, combination: '6.10' }).uls.map((c) => c.label)).toEqual(['6.10 G sup + Q lead', '6.10 G inf + Q lead']);
  });
  test('every factor is overridable', () => {
    const c = combinationsFor({ ...base, combination: '6.10', factors: { gammaGsup: 1.2, gammaGinf: 0.9, gammaQ: 1.4 } }).uls;
    expect(c.map((x) => [x.gammaG, ...x.factors])).toEqual([
      [1.2, 1.4],
      [0.9, 1.4],
    ]);
    const psi = combinationsFor({ ...base, actions: [base.actions[0]!, { ...base.actions[1]!, psi0: 0.5 }] }).uls;
    expect(psi[0]!.factors[0]).toBeCloseTo(1.5 * 0.5, 12);
  });
});

describe('analyseEnvelope', () => {
  const env = [
    { x: 24000, MEd: 0, VEd: -900e3 },
    { x: 0, MEd: 0, VEd: 1000e3 },
    { x: 12000, MEd: 5000e6, VEd: 50e3 },
    { x: 12000, MEd: 4500e6, VEd: 200e3 },
  ];
  test('pass-through: sorted by x, every entry kept, g has no effect', () => {
    const a = analyseEnvelope({ envelope: env, length: 24000 });
    const e = designEffects(a, 50);
    expect(e.stations).toEqual([
      { x: 0, MEd: 0, VEd: 1000e3 },
      { x: 12000, MEd: 5000e6, VEd: 50e3 },
      { x: 12000, MEd: 4500e6, VEd: 200e3 },
      { x: 24000, MEd: 0, VEd: -900e3 },
    ]);
    expect(e.reactions).toEqual([
      { x: 0, R: 1000e3 },
      { x: 24000, R: 900e3 },
    ]);
    expect(e.sls).toEqual([]);
    expect(summarise(a, 0).governing.MEdMax).toBe('user envelope');
  });
  test('given reactions and forces pass through', () => {
    const a = analyseEnvelope({ envelope: env, length: 24000, reactions: [{ x: 0, R: 1.1e6 }], forces: [{ x: 6000, F: 3e5, ss: 150 }] });
    const e = designEffects(a, 0);
    expect(e.reactions).toEqual([{ x: 0, R: 1.1e6 }]);
    expect(e.forces).toEqual([{ x: 6000, F: 3e5, ss: 150 }]);
  });
  test('interior support reaction estimated as V right − V left', () => {
    const a = analyseEnvelope({
      envelope: [
        { x: 0, MEd: 0, VEd: 400e3 },
        { x: 20000, MEd: -3000e6, VEd: -600e3 },
        { x: 20000, MEd: -3000e6, VEd: 650e3 },
        { x: 40000, MEd: 0, VEd: -400e3 },
      ],
      length: 40000,
      supports: [0, 20000, 40000],
    });
    expect(designEffects(a, 0).reactions.map((r) => r.R)).toEqual([400e3, 1250e3, 400e3]);
  });
  test('no entry at a support and no reactions given: DomainError REACTION_UNKNOWN', () => {
    expect(() => analyseEnvelope({ envelope: [{ x: 100, MEd: 1, VEd: 1 }], length: 24000 })).toThrow(expect.objectContaining({ code: 'REACTION_UNKNOWN' }));
  });
});

describe('points of zero shear are stations', () => {
  test('UDL 10 N/mm + point 50 kN at 2 m on a 10 m span: V = 0 at 4000 mm (statics); g alone: 5000 mm', () => {
    const a = analyse({
      spans: [10000],
      actions: [
        { kind: 'permanent', load: 'udl', value: 10 },
        { kind: 'permanent', load: 'point', value: 50e3, at: 2000 },
      ],
      combination: '6.10',
      gridDivisions: 7, // grid points avoid 4000 and 5000
    });
    const xs = [...a.stationX];
    expect.soft(xs.some((x) => Math.abs(x - 4000) < 1e-9)).toBe(true);
    expect.soft(xs.some((x) => Math.abs(x - 5000) < 1e-9)).toBe(true);
    // the maximum moment is then read exactly: M(4000) = 90 kN·4 m − 10·4²/2 − 50·2 = 180 kNm, ×1.35
    const s = summarise(a, 0);
    expect.soft(rel(s.envelope.MEdMax, 1.35 * 180e6)).toBeLessThan(1e-12);
  });
});

describe('Analysis is plain data', () => {
  test('survives structuredClone (worker threads) and designEffects does not change it', () => {
    const a = analyse({
      spans: [12000, 15000],
      actions: [
        { kind: 'permanent', load: 'udl', value: 8 },
        { kind: 'variable', load: 'udl', value: 6, category: 'B' },
        { kind: 'variable', load: 'point', value: 1e5, at: 20000, category: 'E' },
      ],
      combination: '6.10ab',
    });
    const before = designEffects(a, 2.5);
    const b = structuredClone(a);
    expect(designEffects(b, 2.5)).toEqual(before);
    expect(designEffects(a, 2.5)).toEqual(before);
  });
});
