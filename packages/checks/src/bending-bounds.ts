/**
 * Cheap analytic bounds for the search, derived from the bending and flange-induced-buckling checks.
 * Units: mm, mm², MPa, N, N·mm.
 */

/**
 * A lower bound on Σ(A_flange · fy_flange) (N, both flanges) for any section that passes 'bending'
 * (and hence lateral-torsional buckling) at |MEd| (N·mm, the largest over the stations).
 *
 * Derivation: 'bending' passes only if |MEd| ≤ Mc,Rd, and Mc,Rd ≤ Mpl,Rd = Mpl/γM0 in every class
 * (Meff ≤ Mel ≤ Mpl; Mb,Rd ≤ Mc,Rd·γM0/γM1 with the same Wy fy). Hence Mpl ≥ γM0 |MEd|.
 * - Symmetric sections (equal flanges of one fy): the plastic neutral axis is at mid-web, so exactly
 *   Mpl = Ff (hw + tf) + fyw tw hw²/4 with Ff = Af fyf of one flange. With tf ≤ tf,max =
 *   min(tfMax, (hMax − hw)/2): Ff ≥ (γM0|MEd| − fyw tw hw²/4)/(hw + tf,max), Σ = 2 Ff.
 * - General sections: every flange fibre is at most h from the plastic neutral axis and the web
 *   contributes at most fyw tw hw²/2 (neutral axis at a web edge), so Mpl ≤ (Ftop + Fbot) h + fyw tw hw²/2
 *   with h ≤ min(hMax, hw + 2 tfMax): Σ ≥ (γM0|MEd| − fyw tw hw²/2)/h.
 * fyfMax (MPa) converts the force to an area: A ≥ bound/fyfMax (see minFlangeAreaForBending).
 */
export function minFlangeForceForBending(p: {
  hw: number;
  tw: number;
  fyw: number;
  MEd: number;
  gammaM0: number;
  hMax: number;
  symmetric: boolean;
  tfMax: number;
  fyfMax: number;
}): number {
  const M = p.gammaM0 * Math.abs(p.MEd);
  if (p.symmetric) {
    const tf = Math.min(p.tfMax, (p.hMax - p.hw) / 2);
    const Ff = (M - (p.fyw * p.tw * p.hw * p.hw) / 4) / (p.hw + tf);
    return Math.max(0, 2 * Ff);
  }
  const h = Math.min(p.hMax, p.hw + 2 * p.tfMax);
  return Math.max(0, (M - (p.fyw * p.tw * p.hw * p.hw) / 2) / h);
}

/** The same bound as a total flange area (mm²): force bound / fyfMax. */
export function minFlangeAreaForBending(p: Parameters<typeof minFlangeForceForBending>[0]): number {
  return minFlangeForceForBending(p) / p.fyfMax;
}

/**
 * The largest effective compression-flange area (mm²) EN 1993-1-5 8(1) eq. 8.1 allows:
 * hw/tw ≤ k (E/fyf) √(Aw/Afc) ⇔ Afc ≤ Aw (k E tw/(fyf hw))², Aw = hw tw; with fyf ≥ fyfMin the
 * bound at fyfMin holds for every flange grade and thickness. k: the largest k the check may use,
 * kFibMax(options.kFib) (0.55 with kFib 'auto').
 * Afc is the effective area: it equals the gross area when the compression flange outstand is not
 * Class 4 in the EN 1993-1-5 sense (ρ = 1 for λ̄p ≤ 0.748, i.e. c/t ≤ 0.748·28.4ε√0.43 ≈ 13.9ε),
 * which is when the search may apply the bound to gross flange areas.
 */
export function maxCompressionFlangeAreaFIB(p: { hw: number; tw: number; fyfMin: number; k: number; E: number }): number {
  const Aw = p.hw * p.tw;
  return Aw * ((p.k * p.E * p.tw) / (p.fyfMin * p.hw)) ** 2;
}
