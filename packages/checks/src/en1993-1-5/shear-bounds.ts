import { vplRd } from './shear-plastic.js';

/**
 * Cheap bounds for the search, from EN 1993-1-1 6.2.6 (Vpl,Rd = η fyw hw tw/(√3 γM0)) and the
 * upper limit of EN 1993-1-5 5.2(1) eq. 5.1 (Vb,Rd ≤ η fyw hw tw/(√3 γM1)).
 *
 * 'shear' applies to every section, so VEd ≤ Vpl,Rd always binds: hw·tw ≥ √3 γM0 VEd/(η fyw).
 * 'shear-buckling' binds only where 5.1(2) requires it; pass `bucklingApplies = true` only when the
 * caller knows it does (then γ = max(γM0, γM1)). fyw must be the largest web yield strength the
 * caller's candidates can have (thickness bands make fy fall with thickness).
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
  const gamma = bucklingApplies ? Math.max(gammaM0, gammaM1) : gammaM0;
  return (Math.sqrt(3) * gamma * Math.abs(VEd)) / (eta * fyw);
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
  return bucklingApplies ? Math.min(vpl, (eta * fyw * hw * tw) / (Math.sqrt(3) * gammaM1)) : vpl;
}
