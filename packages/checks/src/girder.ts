import { withBearing, prepare } from './context.js';
import { sizeBearing } from './bearing-sizing.js';
import { bendingChecks, bendingThunks } from './en1993-1-1/bending-family.js';
import { BEARING_DEPENDENT, shearChecks, shearThunks } from './en1993-1-5/shear-family.js';
import type { BearingStiffener, CheckId, CheckOptions, CheckResult, Effects, GirderVerdict, Section } from './types.js';

/** The order in which checks are reported (check ids are a public contract). */
export const CHECK_ORDER = [
  'classification',
  'bending',
  'shear',
  'shear-buckling',
  'bending-shear',
  'flange-induced-buckling',
  'patch-loading',
  'patch-bending',
  'stiffener-stiffness',
  'stiffener-strength',
  'stiffener-torsion',
  'end-post',
  'bearing-stiffener',
  'lateral-torsional-buckling',
  'deflection',
  'web-flange-weld',
] as const;

const RANK = new Map<string, number>(CHECK_ORDER.map((id, i) => [id, i]));

/**
 * Every check of the library for one section under the design effects given.
 * Bearing stiffeners not given with the section are sized first (see sizeBearing).
 * `governing` is the applicable check of highest utilisation (the earlier in CHECK_ORDER wins ties).
 */
export function checkGirder(section: Section, effects: Effects, options: CheckOptions): GirderVerdict {
  const ctx0 = prepare(section, options);
  const sized = section.bearing === undefined;
  const ctx = sized ? withBearing(ctx0, sizeBearing(ctx0, effects)) : ctx0;
  return assembleVerdict([...bendingChecks(ctx, effects), ...shearChecks(ctx, effects)], ctx.bearing, sized);
}

/**
 * The verdict of a section from one result per check id (in any order): results sorted in
 * CHECK_ORDER, `governing` the applicable check of highest utilisation (the earlier wins ties).
 */
export function assembleVerdict(results: readonly CheckResult[], bearing: BearingStiffener, bearingSized: boolean): GirderVerdict {
  const all = [...results].sort((p, q) => RANK.get(p.id)! - RANK.get(q.id)!);
  let governing = all[0]!;
  for (const c of all) {
    if (!c.applies) continue;
    if (!governing.applies || c.utilisation > governing.utilisation) governing = c;
  }
  return { passes: all.every((c) => c.passes), governing, checks: all, bearing, bearingSized };
}

/**
 * The order in which judgeGirder tries checks: those that fail most often for candidates near the
 * optimum, and the cheap ones, first (measured on the reference problems); those that read the
 * bearing stiffeners last, since sizing them costs a few checks of its own.
 */
const JUDGE_ORDER: readonly CheckId[] = [
  'deflection',
  'patch-loading',
  'lateral-torsional-buckling',
  'bending',
  'shear',
  'shear-buckling',
  'flange-induced-buckling',
  'patch-bending',
  'bending-shear',
  'stiffener-stiffness',
  'stiffener-strength',
  'web-flange-weld',
  'classification',
  'stiffener-torsion',
  'end-post',
  'bearing-stiffener',
] as const;

/**
 * The first failing check in JUDGE_ORDER, or null when the section passes every check — the same
 * verdict as checkGirder(...).passes, found by stopping early (the search rejects candidates with
 * it, then asks checkGirder for the full results of those that pass).
 */
export function firstFailure(section: Section, effects: Effects, options: CheckOptions): CheckResult | null {
  return firstFailureAmong(section, effects, options, JUDGE_ORDER);
}

/**
 * The first failing check among `ids` (tried in JUDGE_ORDER), or null when all of them pass. The
 * search runs the checks that do not read the stiffener layout once per set of plates, and the
 * rest once per layout: a candidate passes iff both parts pass (the two parts cover CHECK_ORDER).
 * `known`: results already computed for this very section and effects (by a caller that knows a
 * check reads nothing that differs), used instead of running those checks again.
 */
export function firstFailureAmong(
  section: Section,
  effects: Effects,
  options: CheckOptions,
  ids: readonly CheckId[],
  out?: Judged,
  known?: ReadonlyMap<CheckId, CheckResult>,
): CheckResult | null {
  const ctx0 = prepare(section, options);
  const t0 = { ...bendingThunks(ctx0, effects), ...shearThunks(ctx0, effects) };
  let tb: typeof t0 | null = null;
  let bearing = ctx0.bearing;
  for (const id of ids) {
    let r: CheckResult;
    const given = known?.get(id);
    if (given) r = given;
    else if (BEARING_DEPENDENT.has(id)) {
      if (!tb) {
        const ctx = section.bearing === undefined ? withBearing(ctx0, sizeBearing(ctx0, effects)) : ctx0;
        bearing = ctx.bearing;
        tb = { ...bendingThunks(ctx, effects), ...shearThunks(ctx, effects) };
      }
      r = tb[id]();
    } else r = t0[id]();
    out?.results.push(r);
    if (!r.passes) return r;
  }
  if (out) {
    out.bearing = bearing;
    out.bearingSized = tb !== null && section.bearing === undefined;
  }
  return null;
}

/**
 * What firstFailureAmong judged: every result it computed and, when all passed, the bearing
 * stiffeners the checks used. The results of two calls whose ids cover CHECK_ORDER (the second
 * reading the bearing stiffeners) give the same verdict as checkGirder, through assembleVerdict.
 */
export interface Judged {
  results: CheckResult[];
  bearing?: BearingStiffener;
  bearingSized?: boolean;
}

/** `ids` in the order judgeGirder tries them (for firstFailureAmong). */
export function inJudgeOrder(ids: Iterable<string>): CheckId[] {
  const want = new Set(ids);
  return JUDGE_ORDER.filter((id) => want.has(id));
}

/** Whether the section passes every check (checkGirder(...).passes, found early). */
export function judgeGirder(section: Section, effects: Effects, options: CheckOptions): boolean {
  return firstFailure(section, effects, options) === null;
}
