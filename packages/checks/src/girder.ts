import { prepare } from './context.js';
import { bendingChecks } from './en1993-1-1/bending-family.js';
import { shearChecks } from './en1993-1-5/shear-family.js';
import type { CheckOptions, CheckResult, Effects, GirderVerdict, Section } from './types.js';

/** The order in which checks are reported (DESIGN.md check ids). */
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

/**
 * Every check of the library for one section under the design effects given.
 * `governing` is the applicable check of highest utilisation (the first failing one wins ties).
 */
export function checkGirder(section: Section, effects: Effects, options: CheckOptions): GirderVerdict {
  const ctx = prepare(section, options);
  const all: CheckResult[] = [...bendingChecks(ctx, effects), ...shearChecks(ctx, effects)];
  const rank = new Map<string, number>(CHECK_ORDER.map((id, i) => [id, i]));
  all.sort((p, q) => rank.get(p.id)! - rank.get(q.id)!);
  let governing = all[0]!;
  for (const c of all) {
    if (!c.applies) continue;
    if (!governing.applies || c.utilisation > governing.utilisation) governing = c;
  }
  return { passes: all.every((c) => c.passes), governing, checks: all };
}
