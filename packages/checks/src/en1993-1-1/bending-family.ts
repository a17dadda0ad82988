import type { CheckContext, CheckResult, Effects } from '../types.js';
// PLACEHOLDER — being written (classification, bending, FIB, patch, LTB, deflection, weld).
export function bendingChecks(_ctx: CheckContext, _e: Effects): CheckResult[] {
  return [];
}
