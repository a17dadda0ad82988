/**
 * EN 1990 Annex A2 (road bridges) in @platesmith/actions, against the standard's own tables:
 * - EN 1990:2002/A1:2005 Annex A2, Table A2.1 (recommended ψ for road bridges): gr1a tandem
 *   system TS ψ0 = ψ1 = 0.75, ψ2 = 0; gr1a UDL ψ0 = ψ1 = 0.40, ψ2 = 0; gr1a pedestrian and
 *   cycle-track loads ψ0 = ψ1 = 0.40, ψ2 = 0; wind (persistent) 0.6 / 0.2 / 0; thermal 0.6 / 0.6 / 0.5.
 * - Table A2.4(B) (set B, STR): γG,sup = 1.35, γG,inf = 1.00, γQ = 1.35 for road traffic,
 *   1.50 for other variable actions, ξ = 0.85; eq. 6.10 or 6.10a/6.10b; a traffic group is one
 *   variable action (EN 1991-2 4.5.1, Table 4.4a).
 * All values from memory (the tables' recommended values); the midspan moments are composed by
 * hand from the handbook closed forms wL²/8 and PL/4 of a simply supported span.
 * The scenario (a 30 m girder's share of a road deck) is invented.
 */
import { describe, expect, test } from 'vitest';
import { RECOMMENDED_FACTORS_A2_ROAD, TABLE_A2_1, analyse, combinationsFor, summarise } from '@platesmith/actions';
import { expectClose } from '../helpers/close.js';

const L = 30000;
const G = 40; // N/mm
const TS = 600e3; // N at midspan (the girder's share of the tandem system, one point for the hand check)
const UDL = 27; // N/mm
const FW = 3; // N/mm, footway at its gr1a combination value
const W = 5; // N/mm, an invented vertical wind effect on the girder, to exercise γQ = 1.50 and ψ0 = 0.6
const problem = {
  spans: [L],
  annex: 'A2-road' as const,
  combination: '6.10' as const,
  actions: [
    { kind: 'permanent' as const, load: 'udl' as const, value: G },
    { kind: 'variable' as const, load: 'point' as const, value: TS, at: L / 2, category: 'road-TS', group: 'gr1a', name: 'TS' },
    { kind: 'variable' as const, load: 'udl' as const, value: UDL, category: 'road-UDL', group: 'gr1a', name: 'UDL' },
    { kind: 'variable' as const, load: 'udl' as const, value: FW, category: 'road-footway', group: 'gr1a', name: 'footway' },
    { kind: 'variable' as const, load: 'udl' as const, value: W, category: 'bridge-wind', name: 'wind' },
  ],
};
const q = (w: number) => (w * L * L) / 8;

describe('EN 1990 Table A2.1 and A2.4(B) (recommended values, from memory)', () => {
  test('ψ of gr1a, wind and thermal actions; γ of set B with road traffic at 1.35', () => {
    expect(TABLE_A2_1['road-TS']).toEqual({ psi0: 0.75, psi1: 0.75, psi2: 0 });
    expect(TABLE_A2_1['road-UDL']).toEqual({ psi0: 0.4, psi1: 0.4, psi2: 0 });
    expect(TABLE_A2_1['road-footway']).toEqual({ psi0: 0.4, psi1: 0.4, psi2: 0 });
    expect(TABLE_A2_1['bridge-wind']).toEqual({ psi0: 0.6, psi1: 0.2, psi2: 0 });
    expect(TABLE_A2_1['bridge-temperature']).toEqual({ psi0: 0.6, psi1: 0.6, psi2: 0.5 });
    expect(RECOMMENDED_FACTORS_A2_ROAD).toEqual({ gammaGsup: 1.35, gammaGinf: 1.0, gammaQ: 1.5, gammaQTraffic: 1.35, xi: 0.85 });
  });
});

describe('A2 combinations of a road girder (eq. 6.10, midspan moment by hand)', () => {
  test('the traffic group leads as one action: 1.35G + 1.35(TS + UDL + footway) + 1.5·0.6·W', () => {
    const uls = combinationsFor(problem).uls;
    const gr1a = uls.find((c) => c.label.includes('TS + UDL + footway lead') && c.label.includes('G sup'))!;
    expect(gr1a.factors).toEqual([1.35, 1.35, 1.35, 1.5 * 0.6]);
    const wind = uls.find((c) => c.label.includes('wind lead') && c.label.includes('G sup'))!;
    expect(wind.factors.map((f) => Math.round(f * 1e6) / 1e6)).toEqual([1.35 * 0.75, 1.35 * 0.4, 1.35 * 0.4, 1.5].map((f) => Math.round(f * 1e6) / 1e6));
    // one combination per leading unit and level of G: the group's three actions never lead apart
    expect(uls.filter((c) => c.label.includes('G sup'))).toHaveLength(2);
  });
  test('design midspan moment = the larger of the two leading cases (0.1 %: the analysis grid)', () => {
    const byGroup = 1.35 * q(G) + 1.35 * ((TS * L) / 4 + q(UDL) + q(FW)) + 1.5 * 0.6 * q(W);
    const byWind = 1.35 * q(G) + 1.35 * (0.75 * ((TS * L) / 4) + 0.4 * q(UDL) + 0.4 * q(FW)) + 1.5 * q(W);
    const s = summarise(analyse(problem), 0);
    expectClose(s.envelope.MEdMax, Math.max(byGroup, byWind), 0.001, 'MEd,max');
    expect(s.governing.MEdMax).toMatch(/TS \+ UDL \+ footway lead/);
  });
  test('Annex A1 (buildings) takes every variable action at γQ = 1.50 (Table A1.2(B)); the group still leads as one', () => {
    const a1 = combinationsFor({ ...problem, annex: 'A1' }).uls;
    expect(a1.find((c) => c.label.includes('TS + UDL + footway lead') && c.label.includes('G sup'))!.factors).toEqual([1.5, 1.5, 1.5, 1.5 * 0.6]);
  });
});
