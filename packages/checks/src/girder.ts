import { withBearing, prepare } from './context.js';
import { sizeBearing } from './bearing-sizing.js';
import { bendingChecks, bendingThunks } from './en1993-1-1/bending-family.js';
import { shearChecks, shearThunks } from './en1993-1-5/shear-family.js';
import { BEARING_DEPENDENT, CHECK_ORDER, JUDGE_ORDER } from './registry.js';
import type { BearingStiffener, CheckId, CheckOptions, CheckResult, Effects, GirderVerdict, Section } from './types.js';

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

/** Whether the section passes every check (checkGirder(...).passes, found early). */
export function judgeGirder(section: Section, effects: Effects, options: CheckOptions): boolean {
  return firstFailure(section, effects, options) === null;
}
