import { describe, expect, test } from 'vitest';
import { fc, test as prop } from '@fast-check/vitest';
import { defaultOptions, girderMass, grossProps, iyOfPlates, material, panelsOf, plastic, plateStackMel, prepare, type Section } from '../src/index.js';
import { expectClose } from '../../../test/helpers/close.js';

function sym(hw: number, tw: number, bf: number, tf: number): Section {
  return {
    hw,
    tw,
    top: { b: bf, t: tf },
    bot: { b: bf, t: tf },
    stiffeners: null,
    endPost: 'rigid',
    grade: { web: 'S355', top: 'S355', bot: 'S355', stiffener: 'S355' },
  };
}

describe('gross properties of a doubly symmetric welded I (elementary mechanics, common practice, no source)', () => {
  // Closed forms: Iy = 2[bf tf³/12 + bf tf ((hw + tf)/2)²] + tw hw³/12; Wpl,y = bf tf (hw + tf) + tw hw²/4.
  test.for([
    [1400, 12, 450, 30],
    [800, 8, 250, 15],
    [2400, 20, 700, 50],
  ] as const)('hw %i tw %i bf %i tf %i', ([hw, tw, bf, tf]) => {
    const s = sym(hw, tw, bf, tf);
    const g = grossProps(s, material(s, { fySource: 'product' }));
    const Iy = 2 * ((bf * tf ** 3) / 12 + bf * tf * ((hw + tf) / 2) ** 2) + (tw * hw ** 3) / 12;
    const Wpl = bf * tf * (hw + tf) + (tw * hw * hw) / 4;
    expectClose(g.Iy, Iy, 1e-12, 'Iy');
    expectClose(g.zElastic, hw / 2 + tf, 1e-12, 'elastic NA at mid-depth');
    expectClose(g.zPlastic, hw / 2 + tf, 1e-12, 'plastic NA at mid-depth');
    const m = material(s, { fySource: 'product' });
    // each plate at its own fy: flange and web may fall in different thickness bands
    const Mpl = bf * tf * (hw + tf) * m.fyTop + ((tw * hw * hw) / 4) * m.fyw;
    expectClose(g.Mpl, Mpl, 1e-12, 'Mpl with per-plate fy');
    if (m.fyTop === m.fyw) expectClose(g.Mpl / m.fyw, Wpl, 1e-12, 'Wpl,y');
    expectClose(g.Iw, ((tf * bf ** 3) / 12 / 2) * (hw + tf) ** 2, 1e-12, 'Iw = If hs²/2');
  });

  prop.prop([fc.integer({ min: 300, max: 3000 }), fc.integer({ min: 6, max: 30 }), fc.integer({ min: 150, max: 900 }), fc.integer({ min: 10, max: 80 })])(
    'plastic NA splits the force in halves and Mpl ≥ Mel (shape factor ≥ 1)',
    (hw, tw, bf, tf) => {
      const s = { ...sym(hw, tw, bf, tf), bot: { b: Math.max(tw + 20, bf / 2), t: tf } };
      const m = material(s, { fySource: 'product' });
      const g = grossProps(s, m);
      expect(g.Mpl).toBeGreaterThanOrEqual(g.Mel * (1 - 1e-12));
      expect(g.zPlastic).toBeGreaterThan(0);
      expect(g.zPlastic).toBeLessThan(g.h);
    },
  );
});

describe('plastic() on a single rectangle', () => {
  test('Mp = fy b h²/4 (handbook closed form)', () => {
    const r = plastic([{ z0: 0, z1: 200, b: 10, fy: 355 }]);
    expect(r.zp).toBeCloseTo(100, 9);
    expectClose(r.Mp, (355 * 10 * 200 * 200) / 4, 1e-12, 'Mp');
  });
});

describe('panels and mass', () => {
  test('equal panels between supports; stiffeners at multiples of a from each support', () => {
    const { panels, stiffenerXs } = panelsOf([0, 24000], 6000);
    expect(stiffenerXs).toEqual([6000, 12000, 18000]);
    expect(panels.map((p) => [p.x0, p.x1, p.atEnd])).toEqual([
      [0, 6000, true],
      [6000, 12000, false],
      [12000, 18000, false],
      [18000, 24000, true],
    ]);
    const two = panelsOf([0, 20000, 45000], null);
    expect(two.panels.map((p) => [p.a, p.atEnd])).toEqual([
      [20000, true],
      [25000, true],
    ]);
  });

  test('mass of plates by hand: ρ = 7850 kg/m³', () => {
    const s = sym(1400, 12, 450, 30);
    const ctx = prepare(s, defaultOptions(24000));
    const m = girderMass(s, 24000, [0, 24000], ctx.bearing);
    expectClose(m.web, 1400 * 12 * 24000 * 7850e-9, 1e-12, 'web');
    expectClose(m.topFlange, 450 * 30 * 24000 * 7850e-9, 1e-12, 'flange');
    expect(m.perMetre).toBeCloseTo(m.total / 24, 9);
  });
});

describe('closed forms on plain numbers the search bounds with (consistency with grossProps)', () => {
  const plates = [fc.integer({ min: 300, max: 2600 }), fc.constantFrom(6, 10, 15, 25), fc.integer({ min: 120, max: 800 }), fc.constantFrom(8, 12, 25, 50, 60), fc.integer({ min: 120, max: 800 }), fc.constantFrom(8, 12, 25, 50, 60)] as const;
  const sectionOf = (hw: number, tw: number, bt: number, tt: number, bb: number, tb: number): Section => ({
    hw,
    tw,
    top: { b: bt, t: tt },
    bot: { b: bb, t: tb },
    stiffeners: null,
    endPost: 'rigid',
    grade: { web: 'S355', top: 'S460', bot: 'S355', stiffener: 'S355' },
  });
  prop.prop([...plates], { numRuns: 300 })('plateStackMel equals grossProps(·).Mel, each plate at its own fy (hybrid grades, thickness bands)', (hw, tw, bt, tt, bb, tb) => {
    const s = sectionOf(hw, tw, bt, tt, bb, tb);
    const m = material(s, defaultOptions(10000));
    const g = grossProps(s, m);
    const M = plateStackMel({ hw, tw, fyw: m.fyw }, { b: bt, t: tt, fy: m.fyTop }, { b: bb, t: tb, fy: m.fyBot });
    expect(Math.abs(M - g.Mel)).toBeLessThanOrEqual(1e-12 * g.Mel);
  });
  prop.prop([...plates], { numRuns: 300 })('iyOfPlates equals grossProps(·).Iy', (hw, tw, bt, tt, bb, tb) => {
    const s = sectionOf(hw, tw, bt, tt, bb, tb);
    const g = grossProps(s, material(s, defaultOptions(10000)));
    expect(Math.abs(iyOfPlates(hw, tw, bt, tt, bb, tb) - g.Iy)).toBeLessThanOrEqual(1e-12 * g.Iy);
  });
});
