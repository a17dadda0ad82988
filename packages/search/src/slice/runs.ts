/**
 * Runs of flange pairs (one web plate, one pair of flange groups, so one depth): the bounds over a
 * whole run, the bounds of one pair of it (tryPair, shared with the mono-symmetric grid), and the
 * enumeration of a symmetric run, whose pairs are one option used twice in ascending mass.
 */
import { flangeOutstand, iyNeedRange, iyOfPlates, type IyNeedRange } from '@platesmith/checks';
import { selfWeightRange } from '../core.js';
import type { DeflectionAffine } from '../load.js';
import type { FlangeOption } from '../space.js';
import { floorOf, surfaceOf } from './cost-floor.js';
import { ltbBlockDead, ltbPairDead, runSelfWeights } from './ltb.js';
import { bearingFloorFor, panelOk, patchOf } from './plate-tables.js';
import { prunes } from './staircase.js';
import { KG_PER_MM3, type Plates, type RunNode, type SliceState } from './state.js';

/** The most pairs a symmetric run's LTB block bound tries to drop at once. */
const MAX_LTB_BLOCK = 32;

/**
 * Whether every pair of run c fails patch loading (6.4) on every panel count: its widest top
 * option does. η2 never rises as the loaded flange widens with its thickness and fy fixed (ℓy
 * grows with m1, and FRd with ℓy, through either branch of m2; a property test in the check
 * library), so every narrower option of the group fails where the widest does — judged with a
 * hair more than the per-pair test's margin, which covers the round-off of that comparison.
 */
export function runFailsPatch(s: SliceState, c: RunNode): boolean {
  // a layout with load-bearing stiffeners has no patch loading: no bound over every layout
  if (s.forces.length === 0 || s.loadable) return false;
  const widest = s.groupStart[c.gt]! + s.groups[c.gt]!.options.length - 1;
  for (const np of c.plate.panelCounts) if (!(patchOf(s, c.plate, widest, np) > (1 + 1e-9) * (1 + 1e-12))) return false;
  return true;
}

/** The Iy the deflection bound asks over the run's self-weights, and the SLS points that can govern there (iyNeedRange). Once per run. */
export function iyRangeOf(s: SliceState, c: RunNode, da: DeflectionAffine): IyNeedRange {
  if (c.iyRange) return c.iyRange;
  const o = s.o;
  const w = c.plate.w;
  // the points that can govern anywhere on the plate (its lightest to its heaviest pair of
  // flanges), once per plate; a run's range lies within, so those points give its exact answer
  const plate = c.plate;
  if (!plate.iyPoints) {
    const gLo = selfWeightRange(s.prep, w, s.lightestOption, s.lightestOption)[0];
    const gHi = selfWeightRange(s.prep, w, s.heaviestOption, s.heaviestOption)[1];
    plate.iyPoints = iyNeedRange(gLo, gHi, da.bA, da.bB, da.sA, da.sB, da.limit, w.hw * w.tw, o.E, o.G).points;
  }
  const [gLo, gHi] = runSelfWeights(s, c);
  c.iyRange = iyNeedRange(gLo, gHi, da.bA, da.bB, da.sA, da.sB, da.limit, w.hw * w.tw, o.E, o.G, plate.iyPoints);
  return c.iyRange;
}

/** Flange-induced buckling (EN 1993-1-5 8) rules out this flange as the one it limits (largest area `lim`), with any other. */
export function flangeFails(s: SliceState, c: RunNode, f: FlangeOption, lim: number): boolean {
  // only where the flange is fully effective (ρ = 1) is Afc the effective area the bound limits
  return !(lim === Infinity || f.A <= lim || flangeOutstand({ b: f.b, t: f.t }, c.plate.w.tw, f.fy, s.throat0).rho < 1);
}

/**
 * One flange pair of a run, past the bounds that read one flange alone: the bounds that read both
 * (bending, deflection, patch loading with bending, bearing), then a node for its set of plates.
 */
export function tryPair(s: SliceState, c: RunNode, ti: number, bi: number, kg: number): void {
  const { p, o, pruned } = s;
  const { plate, d, Freq } = c;
  const w = plate.w;
  const nL = plate.layouts.length;
  const T = s.flanges[ti]!;
  const B = s.flanges[bi]!;
  if (T.A * T.fy + B.A * B.fy < Freq) {
    pruned.bending += nL;
    return;
  }
  const Iy = iyOfPlates(w.hw, w.tw, T.b, T.t, B.b, B.t) * (1 + 1e-9);
  if (plate.IyReq > 0 && Iy < plate.IyReq) {
    pruned.deflection += nL;
    return;
  }
  // every layout's own self-weight lies in this range: the bounds below hold over all of it
  const [gLo, gHi] = selfWeightRange(s.prep, w, T, B);
  // the deflection bound again, over these plates' range (decided by the run's range when it can be)
  const da = p.load.deflectionAffine;
  if (da) {
    const r = iyRangeOf(s, c, da);
    if (Iy < r.lo || (Iy < r.hi && Iy < iyNeedRange(gLo, gHi, da.bA, da.bB, da.sA, da.sB, da.limit, w.hw * w.tw, o.E, o.G, r.points).lo)) {
      pruned.deflection += nL;
      return;
    }
  }
  // patch loading reads the web, the top flange and the panels: some panel count must pass it
  // (the first that does is enough here; the others are judged when a layout asks)
  const ps: Plates = { plate, ti, bi, T, B, d, gLo, gHi, fit: null, MelRd: 0, k: 0, layoutCalls: 0, panelDead: null };
  if (s.forces.length > 0 && !s.loadable) {
    let any = false;
    let patchFails = false;
    for (const np of plate.panelCounts) {
      if (panelOk(s, ps, np)) {
        any = true;
        break;
      }
      if (patchOf(s, plate, ti, np) > 1 + 1e-9) patchFails = true;
    }
    if (!any) {
      if (patchFails) pruned.patchLoading += nL;
      else pruned.patchBending += nL;
      return;
    }
  }
  // the bearing flats at least as heavy as the sizing needs for the least reaction over the range
  const fit = bearingFloorFor(s, plate, Math.min(T.b, B.b), p.load.reactionFloor ? p.load.reactionFloor(gLo, gHi) : 0);
  if (fit === 'none') {
    pruned.bearing += nL;
    return;
  }
  let layoutKg = Infinity;
  if (fit) {
    for (const [ep, st] of plate.minStiff) layoutKg = Math.min(layoutKg, st + fit[ep].area * w.hw * KG_PER_MM3);
  } else layoutKg = plate.minLayoutKg;
  const lb = floorOf(s, kg + layoutKg, surfaceOf(s, w, T, B));
  if (prunes(s, d, lb)) {
    pruned.incumbent += nL;
    return;
  }
  // the LTB set bound on this pair alone (its rows and columns were not shown dead as sets):
  // far cheaper than the exact screen the plates would get next
  if (s.ltbSet && !s.sp.symmetric && ltbPairDead(s, c, T, B)) {
    pruned.lateralTorsional += nL;
    return;
  }
  ps.fit = fit;
  s.heap.push({ kind: 1, lb, seq: s.seq++, ps });
}

/** Next flange pairs of a symmetric run: cheap bounds, then a node for the first set of plates they leave. */
export function advanceSymmetric(s: SliceState, c: RunNode): void {
  const { pruned, heap, flanges } = s;
  const { plate, pairs, d } = c;
  const nL = plate.layouts.length;
  const n = pairs.kg.length;
  while (c.k < n) {
    const kg = plate.webMass + pairs.kg[c.k]!;
    const floor = floorOf(s, kg + plate.minLayoutKg, 0);
    if (prunes(s, d, floor)) {
      pruned.incumbent += (n - c.k) * nL;
      return;
    }
    if (floor > heap.peekLb()) {
      c.lb = floor;
      heap.push(c);
      return;
    }
    // a block of the next (lightest) pairs that all fail LTB is dropped at once
    if (s.ltbSet && c.block !== 0) {
      const m = Math.min(c.block ?? 1, n - c.k);
      if (ltbBlockDead(s, c, c.k, m)) {
        pruned.lateralTorsional += m * nL;
        c.k += m;
        c.block = Math.min(MAX_LTB_BLOCK, 2 * m);
        continue;
      }
      // heavier pairs resist LTB better as a rule: after a block that is not all dead, one pair
      // at a time; once a single pair is not shown dead, no more tries on this run
      c.block = m > 1 ? 1 : 0;
    }
    const ti = pairs.ti[c.k]!;
    const bi = pairs.bi[c.k]!;
    c.k++;
    if (flangeFails(s, c, flanges[ti]!, c.fibT) || flangeFails(s, c, flanges[bi]!, c.fibB)) {
      pruned.flangeInducedBuckling += nL;
      continue;
    }
    tryPair(s, c, ti, bi, kg);
  }
}
