import type { CheckContext, CheckResult, Effects } from '../types.js';
// PLACEHOLDER — being written (shear, shear buckling, interaction, stiffeners, end post).
export function shearChecks(_ctx: CheckContext, _e: Effects): CheckResult[] {
  return [];
}
