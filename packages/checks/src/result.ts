import type { CheckId, CheckResult, CheckValue } from './types.js';
import { PASS_LIMIT } from './tolerances.js';

/** A check that does not apply, with its reason (never silently left out). */
export function notApplicable(id: CheckId, clause: string, reason: string, values: Record<string, CheckValue> = {}): CheckResult {
  return { id, clause, applies: false, reason, utilisation: 0, passes: true, at: null, values };
}

/** An applicable check. passes is utilisation ≤ PASS_LIMIT (1 with an allowance for round-off). */
export function verdict(id: CheckId, clause: string, utilisation: number, at: number | null, values: Record<string, CheckValue>): CheckResult {
  const u = Number.isFinite(utilisation) ? utilisation : Number.POSITIVE_INFINITY;
  return { id, clause, applies: true, utilisation: u, passes: u <= PASS_LIMIT, at, values };
}

/**
 * Whether utilisation u governs over the worst found so far (null: none yet) when a check picks its
 * governing station or case: the larger governs, and a value that is not a number governs and stays
 * (it fails the check, wherever it comes: a plain u > worst would skip it unless it came first).
 */
export function governs(u: number, worst: number | null | undefined): boolean {
  if (worst === null || worst === undefined) return true;
  if (Number.isNaN(worst)) return false;
  return Number.isNaN(u) || u > worst;
}
