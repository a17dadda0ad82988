import { withBearing, prepare } from './context.js';
import { sizeBearing } from './bearing-sizing.js';
import { bendingChecks } from './en1993-1-1/bending-family.js';
import { shearChecks } from './en1993-1-5/shear-family.js';
import type { CheckOptions, CheckResult, Effects, GirderVerdict, Section } from './types.js';

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
  const all: CheckResult[] = [...bendingChecks(ctx, effects), ...shearChecks(ctx, effects)];
  all.sort((p, q) => RANK.get(p.id)! - RANK.get(q.id)!);
  let governing = all[0]!;
  for (const c of all) {
    if (!c.applies) continue;
    if (!governing.applies || c.utilisation > governing.utilisation) governing = c;
  }
  return { passes: all.every((c) => c.passes), governing, checks: all, bearing: ctx.bearing, bearingSized: sized };
}
