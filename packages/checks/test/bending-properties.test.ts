// Property tests of the bending family (regression properties, no external values).
import { expect } from 'vitest';
import { test, fc } from '@fast-check/vitest';
import { effectiveMeff, effectiveSection, rhoInternal, rhoOutstand } from '../src/en1993-1-5/effective-section.js';
import { material } from '../src/section.js';
import { bendingChecks } from '../src/en1993-1-1/bending-family.js';
import { bendingForSign } from '../src/en1993-1-1/bending.js';
import { prepare } from '../src/context.js';
import { defaultOptions } from '../src/options.js';
import type { Effects, Section } from '../src/types.js';

const sec = (hw: number, tw: number, bt: number, tt: number, bb: number, tb: number): Section => ({
  hw, tw, top: { b: bt, t: tt }, bot: { b: bb, t: tb }, stiffeners: null, endPost: 'rigid',
  grade: { web: 'S355', top: 'S355', bot: 'S355', stiffener: 'S355' },
});
const effects = (M: number): Effects => ({ stations: [{ x: 0, MEd: 0, VEd: 1e5 }, { x: 5000, MEd: M, VEd: 0 }], forces: [], reactions: [], sls: [] });
const section = fc.record({
  hw: fc.integer({ min: 300, max: 3000 }),
  tw: fc.integer({ min: 6, max: 30 }),
  bt: fc.integer({ min: 150, max: 900 }),
  tt: fc.integer({ min: 8, max: 80 }),
  bb: fc.integer({ min: 150, max: 900 }),
  tb: fc.integer({ min: 8, max: 80 }),
});

test.prop([fc.double({ min: -3, max: 1, noNaN: true })], { numRuns: 300 })('ρ internal is continuous at the plateau limit (2006 and A1:2017 agree when capped)', (psi) => {
  const l = 0.5 + Math.sqrt(0.085 - 0.055 * psi);
  expect(Math.abs(rhoInternal(l + 1e-9, psi) - 1)).toBeLessThan(1e-7);
  expect(rhoInternal(l - 1e-9, psi)).toBe(1);
  expect(rhoInternal(0.673, psi)).toBe(1);
});

test.prop([fc.double({ min: 0.2, max: 3, noNaN: true })], { numRuns: 300 })('ρ outstand ≤ 1 and continuous at 0.748', (l) => {
  expect(rhoOutstand(l)).toBeLessThanOrEqual(1);
  expect(Math.abs(rhoOutstand(0.748 + 1e-9) - rhoOutstand(0.748))).toBeLessThan(1e-6);
});

test.prop([section, fc.double({ min: 1e8, max: 2e10, noNaN: true })], { numRuns: 300 })('flip: the section upside down under −M gives identical bending results', (p, M) => {
  const a = prepare(sec(p.hw, p.tw, p.bt, p.tt, p.bb, p.tb), defaultOptions(10000));
  const b = prepare(sec(p.hw, p.tw, p.bb, p.tb, p.bt, p.tt), defaultOptions(10000));
  const ra = bendingChecks(a, effects(M)).find((c) => c.id === 'bending')!;
  const rb = bendingChecks(b, effects(-M)).find((c) => c.id === 'bending')!;
  expect(Math.abs(rb.utilisation / ra.utilisation - 1)).toBeLessThan(1e-9);
  expect(rb.values.sectionClass).toBe(ra.values.sectionClass);
  const ca = bendingChecks(a, effects(M)).find((c) => c.id === 'flange-induced-buckling')!;
  const cb = bendingChecks(b, effects(-M)).find((c) => c.id === 'flange-induced-buckling')!;
  expect(Math.abs(cb.utilisation / ca.utilisation - 1)).toBeLessThan(1e-9);
});

test.prop([section, fc.double({ min: 1e8, max: 2e10, noNaN: true })], { numRuns: 300 })('sign symmetry: a symmetric section has the same bending result under M and −M', (p, M) => {
  const ctx = prepare(sec(p.hw, p.tw, p.bt, p.tt, p.bt, p.tt), defaultOptions(10000));
  const up = bendingForSign(ctx, 'top');
  const down = bendingForSign(ctx, 'bot');
  expect(Math.abs(down.McRd / up.McRd - 1)).toBeLessThan(1e-9);
  expect(down.cls.sectionClass).toBe(up.cls.sectionClass);
  const ru = bendingChecks(ctx, effects(M)).find((c) => c.id === 'bending')!;
  const rd = bendingChecks(ctx, effects(-M)).find((c) => c.id === 'bending')!;
  expect(Math.abs(rd.utilisation / ru.utilisation - 1)).toBeLessThan(1e-9);
});

// thickness within one EN 10025-2 band of S355 (16 < t ≤ 40: fy = 345) so fy is equal
test.prop([section, fc.integer({ min: 17, max: 39 }), fc.integer({ min: 1, max: 23 })], { numRuns: 300 })(
  'monotone: a thicker compression flange at equal fy never lowers Mc,Rd within a class',
  (p, t1, dt) => {
    const t2 = Math.min(40, t1 + dt);
    const a = bendingForSign(prepare(sec(p.hw, p.tw, p.bt, t1, p.bb, p.tb), defaultOptions(10000)), 'top');
    const b = bendingForSign(prepare(sec(p.hw, p.tw, p.bt, t2, p.bb, p.tb), defaultOptions(10000)), 'top');
    fc.pre(a.cls.sectionClass === b.cls.sectionClass);
    expect(b.McRd).toBeGreaterThanOrEqual(a.McRd * (1 - 1e-12));
  },
);

// consistency property: the search's allocation-free Meff is the effective section's, to the last bit
test.prop([section, fc.constantFrom('S235', 'S355', 'S460'), fc.constantFrom('top', 'bot'), fc.constantFrom(0, 4, 6.5)], { numRuns: 600 })(
  'effectiveMeff equals effectiveSection(…).Meff exactly, on either side, any grade and weld throat',
  (p, grade, side, throat) => {
    const s: Section = { ...sec(p.hw, p.tw, p.bt, p.tt, p.bb, p.tb), grade: { web: grade, top: grade, bot: grade, stiffener: grade } };
    const m = material(s, defaultOptions(10000));
    expect(Object.is(effectiveMeff(s, m, side, throat), effectiveSection(s, m, side, throat).Meff)).toBe(true);
  },
);
