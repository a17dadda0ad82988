/**
 * Lateral-torsional buckling in the slice search: the adapters from runs, rows, columns and blocks
 * of flange pairs to the set bound (ltb-bound.ts, a true lower bound on the check's utilisation
 * over every member of a set), and the screen of a set of plates by the check's own computation.
 * A bound drops a set only on a clear failure: above 1 by a margin that covers round-off.
 */
import { bendingForSign, ltbUtilisation, material, prepare, type Material, type Section, type SignBending } from '@platesmith/checks';
import { selfWeightRange } from '../core.js';
import type { Segments } from '../ltb-bound.js';
import { buildSection } from '../objective.js';
import type { FlangeOption } from '../space.js';
import { partOf } from './plate-tables.js';
import type { Plates, RunNode, SliceState } from './state.js';

/** The set bound drops a set only above this (the margin covers the round-off of bound against check). */
const LTB_SET_LIMIT = 1 + 1e-6;

/** Whether the set bound can bite with this flange in compression (a segment to bound, a moment of that sign). */
export function boundsSide(s: SliceState, top: boolean): boolean {
  return s.ltbSet!.bounds(top) && s.signPresent[top ? 'top' : 'bot'];
}

/** A range holding the self-weight of every candidate of the run: its lightest pair bare, its heaviest with the heaviest stiffener layout (the self-weight grows with each flange's area). */
export function runSelfWeights(s: SliceState, c: RunNode): readonly [number, number] {
  const w = c.plate.w;
  const byArea = (os: readonly FlangeOption[]) => [os.reduce((a, b) => (b.A < a.A ? b : a)), os.reduce((a, b) => (b.A > a.A ? b : a))] as const;
  const [tLo, tHi] = byArea(s.groups[c.gt]!.options);
  const [bLo, bHi] = byArea(s.groups[c.gb]!.options);
  return [selfWeightRange(s.prep, w, tLo, bLo)[0], selfWeightRange(s.prep, w, tHi, bHi)[1]];
}

/**
 * The run's LTB segment bounds for one compressed flange, once per run: one envelope range for
 * all its pairs (the self-weight grows with each flange's area, so the lightest and heaviest
 * options of the two groups bound every pair's).
 */
function runSegments(s: SliceState, c: RunNode, top: boolean): Segments {
  let segs = top ? c.segsTop : c.segsBot;
  if (!segs) {
    const range = s.p.load.momentEnvelopeRange!(...runSelfWeights(s, c));
    segs = s.ltbSet!.segments(range, top);
    if (top) c.segsTop = segs;
    else c.segsBot = segs;
  }
  return segs;
}

/** A group's widths, widest first (options are widths ascending). */
function widthsDown(s: SliceState, gi: number): Float64Array {
  return (s.widthsDownOf[gi] ??= Float64Array.from(s.groups[gi]!.options, (f) => f.b).reverse());
}

/**
 * Whether every pair of run c with flange option `fixed` on the top (or the bottom) fails
 * lateral-torsional buckling, whatever the other flange of its group (widths ascending):
 * ltbSetBound over those options, at the self-weights they give. Once per option and run (the
 * columns of a mono-symmetric grid ask it; its rows ask ltbStretchDead).
 */
export function ltbDeadWith(s: SliceState, c: RunNode, top: boolean, fixed: number): boolean {
  if (!boundsSide(s, top)) return false;
  const { groups } = s;
  const own = top ? c.gt : c.gb;
  const memo = top ? (c.ltbTop ??= new Int8Array(groups[own]!.options.length)) : (c.ltbBot ??= new Int8Array(groups[own]!.options.length));
  const slot = fixed - s.groupStart[own]!;
  let known = memo[slot]!;
  if (known === 0) {
    const other = top ? c.gb : c.gt;
    const group = groups[other]!;
    const w = c.plate.w;
    const F = s.flanges[fixed]!;
    const segs = runSegments(s, c, top);
    const part = partOf(s, c.plate, 0);
    const widest = group.options[group.options.length - 1]!;
    const section = top ? buildSection(w, part, F, widest) : buildSection(w, part, widest, F);
    // widest first: as a rule the strongest, so a set that is not all dead is shown so soonest
    const u = s.ltbSet!.over(segs, section, top, widthsDown(s, other), LTB_SET_LIMIT);
    known = u > LTB_SET_LIMIT ? 1 : 2;
    memo[slot] = known;
  }
  return known === 1;
}

/** ltbDeadWith over the other flange's options from … to−1 only (not kept: each stretch is asked once), where boundsSide(top). */
export function ltbStretchDead(s: SliceState, c: RunNode, top: boolean, fixed: number, from: number, to: number): boolean {
  const gi = top ? c.gb : c.gt;
  const n = s.groups[gi]!.options.length;
  const t = (c.ltbSec ??= ltbSecOf(s, c));
  (top ? t.sec.top : t.sec.bot).b = s.flanges[fixed]!.b;
  // widest first, as in ltbDeadWith: widthsDown holds option n−1−k at k
  return s.ltbSet!.overWidths(runSegments(s, c, top), t.sec, t.m, top, widthsDown(s, gi), n - to, n - from, LTB_SET_LIMIT) > LTB_SET_LIMIT;
}

function ltbSecOf(s: SliceState, c: RunNode): { sec: Section; m: Material } {
  const sec = buildSection(c.plate.w, partOf(s, c.plate, 0), s.groups[c.gt]!.options[0]!, s.groups[c.gb]!.options[0]!);
  return { sec, m: material(sec, s.o) };
}

/** Whether the set bound shows pair (T, B) of run c failing LTB (either sign). */
export function ltbPairDead(s: SliceState, c: RunNode, T: FlangeOption, B: FlangeOption): boolean {
  const section = buildSection(c.plate.w, partOf(s, c.plate, 0), T, B);
  for (const top of [true, false]) {
    if (!boundsSide(s, top)) continue;
    if (s.ltbSet!.over(runSegments(s, c, top), section, top, [top ? B.b : T.b], LTB_SET_LIMIT) > LTB_SET_LIMIT) return true;
  }
  return false;
}

/** Whether pairs k … k+m−1 of run c all fail LTB (ltbSetBound over their sections, either sign). */
export function ltbBlockDead(s: SliceState, c: RunNode, k: number, m: number): boolean {
  const part = partOf(s, c.plate, 0);
  const secs: Section[] = [];
  for (let j = k; j < k + m; j++) secs.push(buildSection(c.plate.w, part, s.flanges[c.pairs.ti[j]!]!, s.flanges[c.pairs.bi[j]!]!));
  for (const top of [true, false]) {
    if (!boundsSide(s, top)) continue;
    if (s.ltbSet!.overSections(runSegments(s, c, top), secs) > LTB_SET_LIMIT) return true;
  }
  return false;
}

/** The LTB screen fails a set only above this: the check fails above 1 + 1e-9, and a hair more leaves any round-off doubt to the check itself. */
const LTB_SCREEN_LIMIT = (1 + 1e-9) * (1 + 1e-12);

/**
 * Lateral-torsional buckling alone, from the load model's moment envelope at the plates' own
 * self-weight (ltbUtilisation: the check's own computation, without building the effects): most
 * light plates at shallow depths fail it, and this rejects them before the other checks run.
 */
export function ltbFails(s: SliceState, section: Section, g: number): boolean {
  const ctx = prepare(section, s.o);
  const memo: Partial<Record<'top' | 'bot', SignBending>> = {};
  const u = ltbUtilisation(ctx, s.envelopeOf(g), (side) => (memo[side] ??= bendingForSign(ctx, side)), LTB_SCREEN_LIMIT);
  return !(u <= LTB_SCREEN_LIMIT);
}

/**
 * Whether every layout of a set of plates fails lateral-torsional buckling, whatever its own
 * self-weight: decided here only where the effects do not read the self-weight (the check's own
 * computation, once for all layouts). Otherwise each own self-weight gets the exact screen
 * (ltbFailsAt). The set bound over the plates' self-weight range was used here and is not: on a
 * strongly mono-symmetric section (1200 × 6 web, 450 × 25 over 225 × 25, S275) it came out above
 * the check's own utilisation (1.069 against 0.919: its Class 4 branch ignored the web's Class 2
 * by α, since fixed) and dropped a set that passes (test/regression/ltb-set-bound-mono-symmetric.test.ts).
 * The exact screen was no slower on the reference problems, so it stays.
 */
export function ltbPlatesFail(s: SliceState, ps: Plates, section: Section): boolean {
  return s.p.load.selfWeightFree === true && ltbFails(s, section, ps.gLo);
}

/**
 * ltbFails for a layout of ps at its own self-weight g, once per distinct g of the set (layouts
 * with the same stiffener mass share it): the exact screen where the set bound could not decide.
 * Most sets that get here fail it: the set bound leaves out the destabilising load-height term
 * (see ltb-bound.ts), the exact screen does not. The section's context and its bending
 * resistances are made once per set (the layouts share the plates).
 */
export function ltbFailsAt(s: SliceState, ps: Plates, g: number): boolean {
  const memo = (ps.ltbAt ??= new Map());
  let dead = memo.get(g);
  if (dead === undefined) {
    const c = (ps.ltbCtx ??= { ctx: prepare(ps.section!, s.o), bending: {} });
    const u = ltbUtilisation(c.ctx, s.envelopeOf(g), (side) => (c.bending[side] ??= bendingForSign(c.ctx, side)), LTB_SCREEN_LIMIT);
    dead = !(u <= LTB_SCREEN_LIMIT);
    memo.set(g, dead);
  }
  return dead;
}
