import { vbRdCap } from './shear-buckling.js';
import { vplRd } from './shear-plastic.js';

/**
 * Cheap bounds for the search, from EN 1993-1-1 6.2.6 (Vpl,Rd = η fyw hw tw/(√3 γM0)) and the
 * upper limit of EN 1993-1-5 5.2(1) eq. 5.1 (Vb,Rd ≤ η fyw hw tw/(√3 γM1)).
 *
 * 'shear' applies to every section, so VEd ≤ Vpl,Rd always binds: hw·tw ≥ √3 γM0 VEd/(η fyw).
 * 'shear-buckling' binds only where 5.1(2) requires it; pass `bucklingApplies = true` only when the
 * caller knows it does (then the lesser of Vpl,Rd and the eq. 5.1 cap binds). fyw must be the
 * largest web yield strength the caller's candidates can have (thickness bands make fy fall with
 * thickness). Both bounds are written with the checks' own vplRd and vbRdCap.
 * Units: VEd N, fyw MPa, hw and tw mm; areas mm².
 */
export function minWebAreaForShear(
  VEd: number,
  fyw: number,
  eta: number,
  gammaM0: number,
  gammaM1: number,
  bucklingApplies = false,
): number {
  // the resistance of a web of unit area (1 mm × 1 mm), from the checks' own functions
  const perMm2 = bucklingApplies ? Math.min(vplRd(1, 1, fyw, eta, gammaM0), vbRdCap(eta, fyw, 1, 1, gammaM1)) : vplRd(1, 1, fyw, eta, gammaM0);
  return Math.abs(VEd) / perMm2;
}

/**
 * The largest |VEd| any flanges could make this web carry through 'shear' and 'shear-buckling', N:
 * Vpl,Rd (flanges add nothing to it), or also the eq. 5.1 cap when shear buckling is known to apply.
 */
export function webShearCapacityBound(
  hw: number,
  tw: number,
  fyw: number,
  eta: number,
  gammaM0: number,
  gammaM1: number,
  bucklingApplies = false,
): number {
  const vpl = vplRd(hw, tw, fyw, eta, gammaM0);
  return bucklingApplies ? Math.min(vpl, vbRdCap(eta, fyw, hw, tw, gammaM1)) : vpl;
}
