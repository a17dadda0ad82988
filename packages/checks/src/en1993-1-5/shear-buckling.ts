import { compressionSide, epsilon, flangeAndPlasticMoments } from '../section.js';
import { perSide } from '../context.js';
import type { CheckContext, EndPost, Panel, Station } from '../types.js';
import { PANEL_EDGE_MM } from '../tolerances.js';

/**
 * EN 1993-1-5:2006 (+AC:2009) Section 5 and Annex A.3: shear buckling resistance of webs
 * without longitudinal stiffeners. Internal units: N, mm, MPa (N/mm²), N·mm.
 * Pure functions on plain numbers first, then the per-panel evaluation on a CheckContext.
 */

/**
 * Annex A.3(1), eq. A.5 with kτst = 0 (no longitudinal stiffeners).
 * a: panel length between rigid transverse stiffeners, mm; hw: clear web depth, mm.
 * a/hw ≥ 1: kτ = 5.34 + 4.00 (hw/a)²; a/hw < 1: kτ = 4.00 + 5.34 (hw/a)².
 * a = Infinity gives 5.34 (stiffeners at supports only, a → ∞).
 */
export function kTau(a: number, hw: number): number {
  const r = hw / a;
  return a >= hw ? 5.34 + 4 * r * r : 4 + 5.34 * r * r;
}

/**
 * 5.3(3), eq. 5.6: λ̄w = hw / (37.4 tw ε √kτ) for webs with transverse stiffeners
 * (hw, tw in mm; ε = √(235/fyw) of the web, fyw in MPa).
 */
export function lambdaW(hw: number, tw: number, epsW: number, kTauValue: number): number {
  return hw / (37.4 * tw * epsW * Math.sqrt(kTauValue));
}

/** 5.3(3), eq. 5.5: λ̄w = hw / (86.4 tw ε), transverse stiffeners at supports only. */
export function lambdaWSupportsOnly(hw: number, tw: number, epsW: number): number {
  return hw / (86.4 * tw * epsW);
}

/**
 * 5.3(1), Table 5.1: factor χw for the contribution of the web.
 * λ̄w < 0.83/η: χw = η (both columns);
 * 0.83/η ≤ λ̄w < 1.08: χw = 0.83/λ̄w (both columns);
 * λ̄w ≥ 1.08: rigid end post 1.37/(0.7 + λ̄w), non-rigid end post 0.83/λ̄w.
 * eta: 5.1(2) η (national annex; 1.20 recommended up to S460).
 */
export function chiW(lambda: number, eta: number, endPost: EndPost): number {
  if (lambda < 0.83 / eta) return eta;
  if (lambda < 1.08 || endPost === 'non-rigid') return 0.83 / lambda;
  return 1.37 / (0.7 + lambda);
}

/** 5.2(1), eq. 5.2: Vbw,Rd = χw fyw hw tw / (√3 γM1), N (fyw MPa, hw, tw mm). */
export function vbwRd(chiWValue: number, fyw: number, hw: number, tw: number, gammaM1: number): number {
  return (chiWValue * fyw * hw * tw) / (Math.sqrt(3) * gammaM1);
}

/** 5.2(1), eq. 5.1 upper limit: η fyw hw tw / (√3 γM1), N. */
export function vbRdCap(eta: number, fyw: number, hw: number, tw: number, gammaM1: number): number {
  return (eta * fyw * hw * tw) / (Math.sqrt(3) * gammaM1);
}

/**
 * 5.4(1), the length c of the flange plastic hinges (eq. following 5.8):
 * c = a (0.25 + 1.6 bf tf² fyf / (tw hw² fyw)). a, bf, tf, tw, hw in mm; fyf, fyw in MPa. Returns mm.
 */
export function flangeC(a: number, bf: number, tf: number, fyf: number, tw: number, hw: number, fyw: number): number {
  return a * (0.25 + (1.6 * bf * tf * tf * fyf) / (tw * hw * hw * fyw));
}

/**
 * 5.4(1), eq. 5.8: Vbf,Rd = bf tf² fyf / (c γM1) · (1 − (MEd/Mf,Rd)²), N; zero when |MEd| ≥ Mf,Rd.
 * bf (already limited to 15 ε tf each side of the web), tf, c in mm; fyf MPa; MEd, MfRd N·mm.
 */
export function vbfRd(bf: number, tf: number, fyf: number, c: number, MEd: number, MfRd: number, gammaM1: number): number {
  const r = Math.abs(MEd) / MfRd;
  if (!(r < 1)) return 0;
  return ((bf * tf * tf * fyf) / (c * gammaM1)) * (1 - r * r);
}

/** 5.2(1), eq. 5.1: Vb,Rd = min(Vbw,Rd + Vbf,Rd, η fyw hw tw / (√3 γM1)), N. */
export function vbRd(VbwRdValue: number, VbfRdValue: number, cap: number): number {
  return Math.min(VbwRdValue + VbfRdValue, cap);
}

/**
 * 5.1(2): shear buckling must be verified when hw/tw exceeds 72ε/η (no intermediate stiffeners)
 * or 31ε√kτ/η (stiffened web). Returns the limit of hw/tw.
 */
export function shearBucklingLimit(epsW: number, eta: number, kTauValue: number | null): number {
  return kTauValue === null ? (72 * epsW) / eta : (31 * epsW * Math.sqrt(kTauValue)) / eta;
}

/**
 * 5.4(1): the flange giving the least axial resistance (gross Af·fyf compared), its width limited to
 * 15 ε tf on each side of the web, bf ≤ tw + 30 ε tf, with ε of that flange (our reading of E-11:
 * the limit concerns the flange plate, so its own fy). Returns bf (mm), tf (mm), fyf (MPa).
 */
export function weakerFlange(
  top: { b: number; t: number; fy: number },
  bot: { b: number; t: number; fy: number },
  tw: number,
): { bf: number; tf: number; fyf: number; side: 'top' | 'bot' } {
  const side = top.b * top.t * top.fy <= bot.b * bot.t * bot.fy ? 'top' : 'bot';
  const f = side === 'top' ? top : bot;
  const bf = Math.min(f.b, tw + 30 * epsilon(f.fy) * f.t);
  return { bf, tf: f.t, fyf: f.fy, side };
}

/** Web-panel data that does not depend on the effects: kτ, λ̄w, χw, Vbw,Rd, the Vb,Rd cap. */
export interface PanelShear {
  panel: Panel;
  /** kτ used (5.34 for a web with stiffeners at supports only) */
  kTau: number;
  lambdaW: number;
  chiW: number;
  endPost: EndPost;
  VbwRd: number;
  cap: number;
  /** hw/tw above which 5.1(2) requires the shear buckling check */
  limit: number;
  needed: boolean;
}

/**
 * Panel resistances of the context's web. Without intermediate stiffeners λ̄w = hw/(86.4 tw ε)
 * (5.3(3), a → ∞) and the trigger 72ε/η; with them λ̄w by eq. 5.6 with kτ(a) and 31ε√kτ/η.
 * Table 5.1 non-rigid column only for panels next to an end support of a girder with a non-rigid
 * end post; interior panels and panels at intermediate supports use the rigid column (the web
 * continues beyond the boundary and anchors the tension field).
 */
export function panelShear(ctx: CheckContext): PanelShear[] {
  const { s, o, m } = ctx;
  const stiffened = s.stiffeners !== null;
  return ctx.panels.map((panel) => {
    const k = stiffened ? kTau(panel.a, s.hw) : 5.34;
    const lw = stiffened ? lambdaW(s.hw, s.tw, m.epsW, k) : lambdaWSupportsOnly(s.hw, s.tw, m.epsW);
    const endPost: EndPost = panel.atEnd && s.endPost === 'non-rigid' ? 'non-rigid' : 'rigid';
    const cw = chiW(lw, o.eta, endPost);
    const limit = shearBucklingLimit(m.epsW, o.eta, stiffened ? k : null);
    return {
      panel,
      kTau: k,
      lambdaW: lw,
      chiW: cw,
      endPost,
      VbwRd: vbwRd(cw, m.fyw, s.hw, s.tw, o.factors.gammaM1),
      cap: vbRdCap(o.eta, m.fyw, s.hw, s.tw, o.factors.gammaM1),
      limit,
      needed: s.hw / s.tw > limit,
    };
  });
}

/**
 * Stations that act on a panel: those with x0 ≤ x ≤ x1 (a station on a stiffener belongs to both
 * panels). A panel holding no station is given the nearest stations on each side, so that it is
 * never left unchecked.
 */
export function stationsIn(stations: readonly Station[], x0: number, x1: number): Station[] {
  const inside = stations.filter((st) => st.x >= x0 - PANEL_EDGE_MM && st.x <= x1 + PANEL_EDGE_MM);
  if (inside.length > 0 || stations.length === 0) return inside;
  let left = -Infinity;
  let right = Infinity;
  for (const st of stations) {
    if (st.x < x0 && st.x > left) left = st.x;
    if (st.x > x1 && st.x < right) right = st.x;
  }
  return stations.filter((st) => st.x === left || st.x === right);
}

/** The throat used when the flange outstand is measured from the weld toe: the smallest on offer (largest c, conservative). */
export function classificationThroat(weldThroats: readonly number[]): number {
  return weldThroats.length > 0 ? Math.min(...weldThroats) : 0;
}

/**
 * Mf,Rd and Mpl,Rd (5.4(1), 7.1(1)) for the compression flange of MEd's sign; at MEd = 0, where no
 * flange is in compression, the smaller of the two sides (conservative, and symmetric under a flip).
 */
export function momentsAt(ctx: CheckContext, MEd: number): { MfRd: number; MplRd: number } {
  if (MEd !== 0) return momentsFor(ctx, compressionSide(MEd));
  const t = momentsFor(ctx, 'top');
  const b = momentsFor(ctx, 'bot');
  return { MfRd: Math.min(t.MfRd, b.MfRd), MplRd: Math.min(t.MplRd, b.MplRd) };
}

/** Mf,Rd and Mpl,Rd depend only on the section and the compression side: once per context. */
const momentsFor = perSide((ctx, side) => flangeAndPlasticMoments(ctx.s, ctx.m, side, classificationThroat(ctx.o.weldThroats), ctx.o.factors.gammaM0));

/** One station judged in one panel by 5.5(1): η3 = VEd / Vb,Rd. */
export interface StationShear {
  station: Station;
  /** the moment Vbf,Rd was taken at (the panel's largest), N·mm */
  MEdVbf: number;
  VbfRd: number;
  VbRd: number;
  MfRd: number;
  c: number;
  utilisation: number;
}

/**
 * The moment 5.4(1) reads for a panel: the largest MEd within it (the conservative reading used in
 * practice, common practice, no source — MEd at the station itself is zero at a simple support
 * and would give the full flange contribution there). Of the panel's stations (its boundaries
 * included; the diagram is linear between stations, so its extremes are at stations), the one
 * with the largest |MEd|/Mf,Rd of its own sign: the least Vbf,Rd.
 */
export function panelMomentForVbf(ctx: CheckContext, stations: readonly Station[]): number {
  let M = 0;
  let worst = -1;
  for (const st of stations) {
    const r = Math.abs(st.MEd) / momentsAt(ctx, st.MEd).MfRd;
    if (r > worst || Number.isNaN(r)) {
      worst = r;
      M = st.MEd;
    }
  }
  return M;
}

/** 5.4 and 5.5 at one station of a panel: Vbf,Rd with MEdVbf, the panel's largest MEd (panelMomentForVbf). */
export function stationShear(ctx: CheckContext, ps: PanelShear, st: Station, MEdVbf: number = st.MEd): StationShear {
  const { s, o, m } = ctx;
  const { MfRd } = momentsAt(ctx, MEdVbf);
  const f = weakerFlange({ b: s.top.b, t: s.top.t, fy: m.fyTop }, { b: s.bot.b, t: s.bot.t, fy: m.fyBot }, s.tw);
  const c = flangeC(ps.panel.a, f.bf, f.tf, f.fyf, s.tw, s.hw, m.fyw);
  const Vbf = vbfRd(f.bf, f.tf, f.fyf, c, MEdVbf, MfRd, o.factors.gammaM1);
  const Vb = vbRd(ps.VbwRd, Vbf, ps.cap);
  return { station: st, MEdVbf, VbfRd: Vbf, VbRd: Vb, MfRd, c, utilisation: Math.abs(st.VEd) / Vb };
}
