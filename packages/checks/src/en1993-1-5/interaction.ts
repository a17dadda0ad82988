import { compressionSide, elastic, firstYieldMoment, plastic, rectsEffectiveFlanges } from '../section.js';
import { classifySection } from '../en1993-1-1/classification.js';
import { perSide } from '../context.js';
import type { CheckContext, Station } from '../types.js';
import { classificationThroat, momentsAt, type PanelShear } from './shear-buckling.js';
import { vplRd } from './shear-plastic.js';
import { SAME_POSITION_MM, VANISHING } from '../tolerances.js';

/**
 * Interaction of bending and shear. Units: N, mm, MPa, N·mm.
 * - EN 1993-1-5:2006 7.1(1), eq. 7.1, for webs that need the shear buckling check;
 * - EN 1993-1-1:2005 6.2.8(2)–(3) (reduced web yield strength) for webs that do not.
 */

/**
 * 7.1(1), eq. 7.1: η̄1 + (1 − Mf,Rd/Mpl,Rd)(2η̄3 − 1)² ≤ 1, required when η̄3 > 0.5 and
 * η̄1 ≥ Mf,Rd/Mpl,Rd. η̄1 = MEd/Mpl,Rd, η̄3 = VEd/Vbw,Rd (E-10: Vbw,Rd, not Vb,Rd). Returns the
 * left-hand side (0 when not required).
 */
export function interaction71(eta1: number, eta3: number, MfRd: number, MplRd: number): { required: boolean; value: number } {
  const ratio = MfRd / MplRd;
  const required = eta3 > 0.5 && eta1 >= ratio;
  return { required, value: required ? eta1 + (1 - ratio) * (2 * eta3 - 1) ** 2 : 0 };
}

/** EN 1993-1-1 6.2.8(3): ρ = (2 VEd/Vpl,Rd − 1)² when VEd > 0.5 Vpl,Rd, else 0 (capped at 1). */
export function rho628(VEd: number, VplRd: number): number {
  const r = Math.abs(VEd) / VplRd;
  return r > 0.5 ? Math.min(1, (2 * r - 1) ** 2) : 0;
}

/** One station's bending–shear verdict. */
export interface StationInteraction {
  station: Station;
  clause: 'EN 1993-1-5 7.1' | 'EN 1993-1-1 6.2.8';
  required: boolean;
  utilisation: number;
  MfRd: number;
  MplRd: number;
  eta1: number;
  eta3: number;
  rho: number;
  MVRd: number;
}

/**
 * 7.1 at a station whose panel needs the shear buckling check. 7.1(5): not verified within hw/2 of
 * a support (every support carries a bearing stiffener). Mpl,Rd: effective compression flange with
 * the full web, per plate fy (7.1(1)); Mf,Rd: effective flanges only.
 */
export function stationInteraction71(ctx: CheckContext, ps: PanelShear, st: Station): StationInteraction {
  const { s, o, m } = ctx;
  const { MfRd, MplRd } = momentsAt(ctx, st.MEd);
  const eta1 = Math.abs(st.MEd) / MplRd;
  const eta3 = Math.abs(st.VEd) / ps.VbwRd;
  // strictly inside hw/2 of a support is exempt; the section at hw/2 itself is checked
  const nearSupport = o.supports.some((x) => Math.abs(st.x - x) < s.hw / 2 - SAME_POSITION_MM);
  const r = interaction71(eta1, eta3, MfRd, MplRd);
  const required = r.required && !nearSupport;
  return { station: st, clause: 'EN 1993-1-5 7.1', required, utilisation: required ? r.value : 0, MfRd, MplRd, eta1, eta3, rho: 0, MVRd: MplRd };
}

/**
 * EN 1993-1-1 6.2.8 at a station of a web that needs no shear buckling check: where VEd > 0.5 Vpl,Rd
 * the web (the shear area) is taken at (1 − ρ) fyw and the plastic moment of the section with the
 * effective compression flange is recomputed: utilisation |MEd|/MV,Rd. Class 1–2: plastic, the web at
 * (1 − ρ) fyw; Class 3–4 (a Class 4 flange; such stocky webs are never Class 4): first yield with the
 * web thickness (1 − ρ) tw, 6.2.8(3).
 */
export function stationInteraction628(ctx: CheckContext, st: Station): StationInteraction {
  const { s, o, m } = ctx;
  const side = compressionSide(st.MEd);
  const throat = classificationThroat(o.weldThroats);
  const { MfRd, MplRd } = momentsAt(ctx, st.MEd);
  const Vpl = vplRd(s.hw, s.tw, m.fyw, o.eta, o.factors.gammaM0);
  const rho = rho628(st.VEd, Vpl);
  const required = rho > 0;
  let MVRd = MplRd;
  if (required) {
    const rs = rectsEffectiveFlanges(s, m, side, throat, true);
    if (classOf(ctx, side) <= 2) {
      // a tiny positive strength keeps the plastic neutral-axis search defined when ρ = 1
      rs[1] = { ...rs[1]!, fy: Math.max((1 - rho) * m.fyw, VANISHING) };
      MVRd = plastic(rs).Mp / o.factors.gammaM0;
    } else {
      // 6.2.8(3) with the class's elastic basis: first yield of the section with the effective
      // compression flange and the web thinned to (1 − ρ) tw (same fy), the usual reading
      rs[1] = { ...rs[1]!, b: Math.max((1 - rho) * s.tw, VANISHING) };
      const el = elastic(rs);
      MVRd = firstYieldMoment(rs, el.z, el.I) / o.factors.gammaM0;
    }
  }
  const eta1 = Math.abs(st.MEd) / MplRd;
  return {
    station: st,
    clause: 'EN 1993-1-1 6.2.8',
    required,
    utilisation: required ? Math.abs(st.MEd) / MVRd : 0,
    MfRd,
    MplRd,
    eta1,
    eta3: Math.abs(st.VEd) / Vpl,
    rho,
    MVRd,
  };
}

/** Section class for a compression side, once per context. */
const classOf = perSide((ctx, side) => classifySection(ctx, side).sectionClass);
