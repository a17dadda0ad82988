// Property tests of the search bounds: every section beyond a bound fails the full check.
import { expect } from 'vitest';
import { test, fc } from '@fast-check/vitest';
import { maxCompressionFlangeAreaFIB, minFlangeForceForBending } from '../src/bending-bounds.js';
import { bendingChecks } from '../src/en1993-1-1/bending-family.js';
import { kFibMax } from '../src/en1993-1-5/flange-induced.js';
import { prepare } from '../src/context.js';
import { defaultOptions } from '../src/options.js';
import { flangeOutstand } from '../src/section.js';
import type { GradeName } from '@platesmith/catalogue';
import type { Effects, Section } from '../src/types.js';

const grade = fc.constantFrom<GradeName>('S235', 'S275', 'S355', 'S460');
const effects = (M: number): Effects => ({ stations: [{ x: 0, MEd: 0, VEd: 0 }, { x: 5000, MEd: M, VEd: 0 }], forces: [], reactions: [], sls: [] });
const mk = (hw: number, tw: number, bt: number, tt: number, bb: number, tb: number, g: GradeName): Section => ({
  hw, tw, top: { b: bt, t: tt }, bot: { b: bb, t: tb }, stiffeners: null, endPost: 'rigid', grade: { web: g, top: g, bot: g, stiffener: g },
});

test.prop(
  [fc.integer({ min: 300, max: 3000 }), fc.integer({ min: 6, max: 30 }), fc.integer({ min: 150, max: 900 }), fc.integer({ min: 8, max: 80 }), fc.integer({ min: 150, max: 900 }), fc.integer({ min: 8, max: 80 }), grade, fc.boolean(), fc.double({ min: 1e-3, max: 1, noNaN: true }), fc.integer({ min: 0, max: 40 })],
  { numRuns: 300 },
)('beyond minFlangeForceForBending: bending fails', (hw, tw, bt, tt, bb0, tb0, g, symmetric, over, slack) => {
  const bb = symmetric ? bt : bb0;
  const tb = symmetric ? tt : tb0;
  const ctx = prepare(mk(hw, tw, bt, tt, bb, tb, g), defaultOptions(10000));
  const F = bt * tt * ctx.m.fyTop + bb * tb * ctx.m.fyBot;
  const tfMax = Math.max(tt, tb) + slack;
  const hMax = hw + tt + tb + slack;
  const base = { hw, tw, fyw: ctx.m.fyw, gammaM0: 1, hMax, symmetric, tfMax, fyfMax: Math.max(ctx.m.fyTop, ctx.m.fyBot) };
  // the moment at which the bound equals this section's flange force, then a little beyond it
  const Mstar = symmetric ? (F / 2) * (hw + Math.min(tfMax, (hMax - hw) / 2)) + (ctx.m.fyw * tw * hw * hw) / 4 : F * Math.min(hMax, hw + 2 * tfMax) + (ctx.m.fyw * tw * hw * hw) / 2;
  const MEd = Mstar * (1 + over);
  expect(minFlangeForceForBending({ ...base, MEd })).toBeGreaterThan(F);
  const r = bendingChecks(ctx, effects(MEd)).find((c) => c.id === 'bending')!;
  expect(r.passes).toBe(false);
});

test.prop(
  [fc.integer({ min: 600, max: 3000 }), fc.integer({ min: 6, max: 20 }), fc.integer({ min: 10, max: 80 }), grade, fc.double({ min: 1e-3, max: 1, noNaN: true }), fc.constantFrom<'auto' | number>('auto', 0.3, 0.4, 0.55)],
  { numRuns: 300 },
)('beyond maxCompressionFlangeAreaFIB (k = kFibMax of the option, fyf,min = fyf): flange-induced buckling fails', (hw, tw, tf, g, over, kOpt) => {
  const probe = prepare(mk(hw, tw, 400, tf, 400, tf, g), defaultOptions(10000));
  const fyf = probe.m.fyTop;
  const Amax = maxCompressionFlangeAreaFIB({ hw, tw, fyfMin: fyf, k: kFibMax(kOpt), E: 210000 });
  const bf = Math.ceil((Amax * (1 + over)) / tf);
  fc.pre(bf > tw + 20);
  const ctx = prepare(mk(hw, tw, bf, tf, 300, 20, g), defaultOptions(10000, { kFib: kOpt }));
  fc.pre(ctx.m.fyTop === fyf);
  const eff = flangeOutstand({ b: bf, t: tf }, tw, fyf, 3);
  fc.pre(eff.bEff * tf > Amax);
  const r = bendingChecks(ctx, effects(1e8)).find((c) => c.id === 'flange-induced-buckling')!;
  expect(r.passes).toBe(false);
});
