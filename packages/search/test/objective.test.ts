import { describe, expect } from 'vitest';
import { fc, test } from '@fast-check/vitest';
import { STEEL_KG_PER_MM3, type GradeName } from '@platesmith/catalogue';
import { costFloor, costOf, DEFAULT_COST, materialRateFloor, platesSurface, type CostModel } from '../src/index.js';
import { webPartsWith } from '../src/objective.js';
import type { FlangeOption, WebConfig } from '../src/space.js';

/**
 * The objective's cost and the floor the search prices candidates with before their checks.
 * Cost function: Jármai K., Farkas J., "Cost calculation and optimisation of welded steel
 * structures", J. Constr. Steel Res. 50 (1999) 115–135 (constants from memory, as in objective.ts).
 */

const grades: GradeName[] = ['S235', 'S275', 'S355', 'S420', 'S460'];

const candidateArb = fc.record({
  hw: fc.integer({ min: 400, max: 2400 }),
  tw: fc.constantFrom(6, 8, 10, 12, 15, 20),
  webGrade: fc.constantFrom(...grades),
  topGrade: fc.constantFrom(...grades),
  botGrade: fc.constantFrom(...grades),
  bt: fc.integer({ min: 150, max: 800 }),
  tt: fc.constantFrom(10, 15, 20, 30, 40, 50, 60),
  bb: fc.integer({ min: 150, max: 800 }),
  tb: fc.constantFrom(10, 15, 20, 30, 40, 50, 60),
  panels: fc.constantFrom(0, 2, 4, 6),
  flat: fc.constantFrom({ b: 100, t: 10 }, { b: 150, t: 15 }),
  sides: fc.constantFrom(1 as const, 2 as const),
  L: fc.constantFrom(8000, 16000, 30000),
  bearingBs: fc.constantFrom(80, 120, 200),
  bearingTs: fc.constantFrom(10, 15, 25),
  bearingFlats: fc.constantFrom(4, 8, 10),
  aw: fc.constantFrom(3, 4, 5, 6, 8, 10),
  awLess: fc.constantFrom(0, 1, 2),
  painted: fc.boolean(),
  kfOverKm: fc.constantFrom(0, 0.5, 1, 2),
  thickFactor: fc.constantFrom(0.95, 1, 1.1),
});

type Candidate = typeof candidateArb extends fc.Arbitrary<infer T> ? T : never;

function candidate(c: Candidate) {
  const cm: CostModel = { ...DEFAULT_COST, painted: c.painted, kfOverKm: c.kfOverKm, thickFactor: c.thickFactor };
  const w: WebConfig = { hw: c.hw, tw: c.tw, grade: c.webGrade, fyw: 355, panels: c.panels, flat: c.panels ? c.flat : null, sides: c.sides, endPost: 'rigid' };
  const T: FlangeOption = { grade: c.topGrade, t: c.tt, b: c.bt, fy: 355, A: c.bt * c.tt };
  const B: FlangeOption = { grade: c.botGrade, t: c.tb, b: c.bb, fy: 355, A: c.bb * c.tb };
  const parts = webPartsWith(w, c.L, c.panels ? c.panels - 1 : 0, c.L);
  const bearingKg = c.bearingFlats * c.bearingBs * c.bearingTs * c.hw * STEEL_KG_PER_MM3;
  return { cm, w, T, B, parts, bearingKg };
}

describe('costFloor', () => {
  test.prop([candidateArb], { numRuns: 500 })(
    'is never above costOf of a candidate of at least its mass, surface and throat, with rates of the given grades',
    (c) => {
      const { cm, w, T, B, parts, bearingKg } = candidate(c);
      const exact = costOf(cm, w, parts, T, B, bearingKg, c.bearingFlats, c.bearingBs, c.bearingTs, c.L, c.aw);
      // the floor as the search takes it: mass of the plates and bearing flats summed in another order
      const kg = bearingKg + parts.stiffMass + T.A * c.L * STEEL_KG_PER_MM3 + B.A * c.L * STEEL_KG_PER_MM3 + parts.webMass;
      const rate = materialRateFloor(cm, [w.grade, T.grade, B.grade]);
      const floor = costFloor(cm, rate, kg, platesSurface(w, T, B, c.L), Math.max(1, c.aw - c.awLess), c.L);
      expect(floor).toBeLessThanOrEqual(exact.cost);
    },
  );

  test.prop([candidateArb], { numRuns: 300 })('is tight for an unstiffened girder of the cheapest grade at its own throat', (c) => {
    const { cm, w, T, B, parts } = candidate({ ...c, panels: 0, webGrade: 'S235', topGrade: 'S235', botGrade: 'S235', tt: 20, tb: 20, tw: 10, thickFactor: 1 });
    const exact = costOf(cm, w, parts, T, B, 0, 0, 0, 0, c.L, c.aw);
    const kg = parts.webMass + T.A * c.L * STEEL_KG_PER_MM3 + B.A * c.L * STEEL_KG_PER_MM3;
    const floor = costFloor(cm, materialRateFloor(cm, ['S235']), kg, platesSurface(w, T, B, c.L), c.aw, c.L);
    expect(floor).toBeLessThanOrEqual(exact.cost);
    expect(floor).toBeGreaterThan(exact.cost * (1 - 1e-9));
  });
});

describe('costOf by hand (Farkas–Jármai cost function, closed form)', () => {
  test('an unstiffened 1000 × 10 web with 300 × 20 flanges, 10 m, SAW throat 5, painted', () => {
    const cm: CostModel = { ...DEFAULT_COST, km: 1, kfOverKm: 1, thetaD: 2, thetaSp: 1, thetaP: 2, painted: true };
    const w: WebConfig = { hw: 1000, tw: 10, grade: 'S355', fyw: 355, panels: 0, flat: null, sides: 2, endPost: 'rigid' };
    const F: FlangeOption = { grade: 'S355', t: 20, b: 300, fy: 355, A: 6000 };
    const L = 10000;
    const parts = webPartsWith(w, L, 0, L);
    // M = (1000·10 + 2·300·20) mm² × 10 m × 7850 kg/m³ = 22 000 mm² × 1e4 mm × 7.85e-6 kg/mm³ = 1727 kg
    const M = 1727;
    // T1 = Θd √(κ M) = 2 √(3 · 1727); T2 = C2(SAW) aw² 4L = 0.2349e-3 · 25 · 40 000; T3 = 0.3 T2
    const T1 = 2 * Math.sqrt(3 * M);
    const T2 = 0.2349e-3 * 25 * 40000;
    // As = L (2 bf + 2 (bf − tw) + 4 tf + 2 hw) = 1e4 (600 + 580 + 80 + 2000) = 3.26e7 mm²
    const As = 3.26e7;
    const Tsp = 1 * 3e-6 * As;
    const Tp = 2 * (3e-6 + 4.15e-6) * As;
    const K = M + (T1 + T2 + 0.3 * T2 + Tsp + Tp); // km = 1, kf = kf/km · km = 1, S355 rate factor 1
    const r = costOf(cm, w, parts, F, F, 0, 0, 0, 0, L, 5);
    expect(Math.abs(r.cost / K - 1)).toBeLessThan(1e-12);
    expect(Math.abs(platesSurface(w, F, F, L) / As - 1)).toBeLessThan(1e-15);
  });
});
