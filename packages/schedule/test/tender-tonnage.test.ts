/**
 * Tonnage and plate list.
 * Sources: plate mass per m² from a published supplier data sheet (Ashmore & Allen, "Technical
 * data — Sheet gauges, metric equivalents, weight kg/m²", ashmoreandallen.co.uk/data.htm),
 * which tabulates plate weight at the trade density 7.85 kg/dm³ (EN 10029:2010 calculates plate
 * mass with 7.85 kg/dm³ — from memory). Counts and hand sums: common practice, no source.
 * Mass per girder against the check library's girderMass: a consistency (regression) check, not validation.
 */
import { describe, expect, test } from 'vitest';
import { test as prop, fc } from '@fast-check/vitest';
import { girderMass, resolveBearing, material } from '@platesmith/checks';
import { toSection, type SectionJson } from '@platesmith/schema';
import { pieceMass, tenderGirder, tonnage, type TenderGirder } from '../src/tender/index.js';

const rel = (a: number, b: number) => Math.abs(a / b - 1);

const G1: SectionJson = {
  web: { depth: 1400, thickness: 12 },
  topFlange: { width: 450, thickness: 30 },
  bottomFlange: { width: 450, thickness: 30 },
  stiffeners: { spacing: 2500, width: 120, thickness: 12, sides: 2 },
  endPost: 'rigid',
  bearing: { width: 200, thickness: 20, spacing: 140 },
  grade: 'S355',
};

describe('plate mass per m² (supplier data sheet, weight kg/m² column)', () => {
  // published to 3–4 significant figures for gauge thicknesses given to 0.01 mm: 0.5 % covers the rounding of both
  test.for([
    [6.35, 49.8],
    [4.06, 31.9],
    [3.25, 25.5],
    [2.03, 15.9],
    [1.02, 7.97],
  ] as const)('t = %s mm weighs %s kg/m²', ([t, published]) => {
    const m = pieceMass(t, 1000, 1000);
    expect(rel(m, published), `t ${t}: ${m} kg vs ${published}`).toBeLessThan(0.005);
  });
});

describe('tonnage of a two-mark schedule (hand arithmetic, common practice, no source)', () => {
  const g1 = tenderGirder('G1', 3, G1, [0, 20000]);
  const g2: TenderGirder = { mark: 'G2', quantity: 2, length: 12000, section: { ...G1, web: { depth: 1200, thickness: 12 }, stiffeners: null }, stiffenerPositions: 0, bearingFlats: 4 };
  const t = tonnage([g1, g2], { S355: 1.5 });

  test('stiffener positions as the check library lays panels: a = 2500 mm on 20 m → 7 positions, 14 flats', () => {
    expect(g1.stiffenerPositions).toBe(7);
    // rigid end post: two double-sided pairs at each end = 8 flats
    expect(g1.bearingFlats).toBe(8);
  });

  test('plate list lines and counts', () => {
    const line = (kind: string, th: number, w: number, L: number) => t.plates.find((p) => p.kind === kind && p.thickness === th && p.width === w && p.length === L);
    // flanges 450×30 are the same plate for both flanges: 2 per girder
    expect.soft(line('plate', 30, 450, 20000)?.count).toBe(6);
    expect.soft(line('plate', 30, 450, 12000)?.count).toBe(4);
    expect.soft(line('plate', 12, 1400, 20000)?.count).toBe(3);
    expect.soft(line('plate', 12, 1200, 12000)?.count).toBe(2);
    expect.soft(line('flat', 12, 120, 1400)?.count).toBe(42);
    expect.soft(line('flat', 20, 200, 1400)?.count).toBe(24);
    expect.soft(line('flat', 20, 200, 1200)?.count).toBe(8);
    expect.soft(t.plates).toHaveLength(7);
    expect.soft(line('plate', 30, 450, 20000)?.parts).toEqual(['flange']);
  });

  test('mass of G1: 7850 kg/m³ × plate volumes', () => {
    const k = 7.85e-6; // kg/mm³
    const web = 1400 * 12 * 20000 * k; // 2637.6 kg
    const fl = 2 * 450 * 30 * 20000 * k; // 4239 kg
    const st = 14 * 120 * 12 * 1400 * k; // 221.56 kg
    const br = 8 * 200 * 20 * 1400 * k; // 351.68 kg
    const m = t.byMark[0]!;
    expect.soft(rel(m.perGirder.web, 2637.6)).toBeLessThan(1e-12);
    expect.soft(rel(m.perGirder.topFlange + m.perGirder.bottomFlange, 4239)).toBeLessThan(1e-12);
    expect.soft(rel(m.perGirder.total, web + fl + st + br)).toBeLessThan(1e-12);
    expect.soft(rel(m.total, 3 * (web + fl + st + br))).toBeLessThan(1e-12);
    expect.soft(rel(m.perMetre, (web + fl + st + br) / 20)).toBeLessThan(1e-12);
  });

  test('totals by grade and thickness add up to the total; cost = rate × mass', () => {
    const sumG = t.byGrade.reduce((s, g) => s + g.mass, 0);
    const sumT = t.byThickness.reduce((s, g) => s + g.mass, 0);
    const sumP = t.plates.reduce((s, p) => s + p.mass, 0);
    for (const v of [sumG, sumT, sumP]) expect.soft(rel(v, t.total)).toBeLessThan(1e-12);
    expect.soft(t.girders).toBe(5);
    expect.soft(rel(t.cost!, 1.5 * t.total)).toBeLessThan(1e-12);
    expect.soft(t.missingRates).toEqual([]);
    expect.soft(t.byThickness.map((b) => `${b.kind} ${b.thickness}`)).toEqual(['plate 12', 'plate 30', 'flat 12', 'flat 20']);
  });

  test('a missing rate gives no cost and names the grade', () => {
    const h = tonnage([{ ...g2, section: { ...g2.section, grade: { web: 'S355', flanges: 'S460' } } }], { S355: 1 });
    expect.soft(h.cost).toBeNull();
    expect.soft(h.missingRates).toEqual(['S460']);
    expect.soft(h.byMark[0]!.cost).toBeNull();
    expect.soft(tonnage([g2]).cost).toBeNull();
  });

  test('impossible input is a DomainError with a field', () => {
    expect(() => tonnage([{ ...g2, quantity: 1.5 }])).toThrow(/quantity/);
    expect(() => tonnage([g2, g2])).toThrow(/twice/);
    expect(() => tonnage([{ ...g2, length: 0 }])).toThrow(/length/);
  });
});

describe('mass per girder equals the check library girderMass (consistency, regression)', () => {
  const plate = fc.constantFrom(8, 10, 12, 15, 20, 25, 30, 40);
  prop.prop(
    [
      fc.record({
        hw: fc.integer({ min: 40, max: 300 }).map((v) => v * 10),
        tw: plate,
        bt: fc.integer({ min: 20, max: 80 }).map((v) => v * 10),
        tt: plate,
        bb: fc.integer({ min: 20, max: 80 }).map((v) => v * 10),
        tb: plate,
        stiff: fc.option(fc.record({ a: fc.integer({ min: 5, max: 60 }).map((v) => v * 100), bs: fc.constantFrom(80, 100, 120, 150), ts: plate, sides: fc.constantFrom(1 as const, 2 as const) })),
        endPost: fc.constantFrom('rigid' as const, 'non-rigid' as const),
        spans: fc.array(fc.integer({ min: 40, max: 300 }).map((v) => v * 100), { minLength: 1, maxLength: 3 }),
        bearing: fc.boolean(),
        // load-bearing pairs under forces at fractions of the girder (one may fall on an intermediate stiffener), restraint pairs likewise
        loads: fc.option(fc.array(fc.constantFrom(0.25, 1 / 3, 0.5, 0.6), { minLength: 1, maxLength: 3 })),
        restraints: fc.option(fc.array(fc.constantFrom(0.2, 0.5, 0.75), { minLength: 1, maxLength: 2 })),
      }),
    ],
    { numRuns: 200 },
  )('random sections and spans', (r) => {
    const section: SectionJson = {
      web: { depth: r.hw, thickness: r.tw },
      topFlange: { width: r.bt, thickness: r.tt },
      bottomFlange: { width: r.bb, thickness: r.tb },
      stiffeners: r.stiff ? { spacing: r.stiff.a, width: r.stiff.bs, thickness: r.stiff.ts, sides: r.stiff.sides } : null,
      endPost: r.endPost,
      ...(r.bearing ? { bearing: { width: 160, thickness: 15, spacing: 150 } } : {}),
      grade: 'S355',
    };
    const supports = [0];
    for (const s of r.spans) supports.push(supports[supports.length - 1]! + s);
    const Lg = supports[supports.length - 1]!;
    if (r.loads) section.loadStiffeners = { width: 200, thickness: 20, at: r.loads.map((f) => Math.round(f * Lg)) };
    if (r.restraints) section.restraintStiffeners = { width: 100, thickness: 10, at: r.restraints.map((f) => Math.round(f * Lg)) };
    const s = toSection(section);
    const ref = girderMass(s, supports[supports.length - 1]!, supports, resolveBearing(s, material(s, { fySource: 'product' }).fyStiff));
    const t = tonnage([tenderGirder('X', 1, section, supports)]);
    expect(rel(t.byMark[0]!.perGirder.total, ref.total)).toBeLessThan(1e-12);
    expect(rel(t.byMark[0]!.perGirder.stiffeners + 1e-9, ref.stiffeners + 1e-9)).toBeLessThan(1e-9);
  });
});
