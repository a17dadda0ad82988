/**
 * EN 1993-1-1:2005 6.2.6: plastic shear resistance of a welded I-section web.
 * Units: hw, tw mm; fyw MPa; result N.
 */

/** 6.2.6(3)(d): shear area Av = η hw tw for welded I-sections loaded parallel to the web, mm². */
export function shearArea(hw: number, tw: number, eta: number): number {
  return eta * hw * tw;
}

/** 6.2.6(2), eq. 6.18: Vpl,Rd = Av (fyw/√3) / γM0, N. */
export function vplRd(hw: number, tw: number, fyw: number, eta: number, gammaM0: number): number {
  return (shearArea(hw, tw, eta) * fyw) / (Math.sqrt(3) * gammaM0);
}
