import type { CheckContext, CheckResult, CheckValue, Effects } from '../types.js';
import { governs, notApplicable, verdict } from '../result.js';
import { stiffenedAt } from './stiffeners.js';

/**
 * Resistance to transverse forces, EN 1993-1-5:2006 (+AC:2009) section 6, eqs. 6.1–6.13.
 * Units: lengths mm, strengths and E MPa, forces N.
 *
 * Load types (Figure 6.1): (a) force through one flange resisted by shear in the web, between
 * stiffeners a apart; (b) force through one flange and directly to the other (both flanges);
 * (c) force through one flange near an unstiffened end, c from the end to the bearing.
 */
export type PatchType = 'a' | 'b' | 'c';

export interface PatchInput {
  type: PatchType;
  hw: number;
  tw: number;
  /** loaded flange: width and thickness, mm */
  bf: number;
  tf: number;
  fyw: number;
  fyf: number;
  /** stiff bearing length, mm (6.3) */
  ss: number;
  /** distance between transverse stiffeners (or the span when unstiffened), mm */
  a: number;
  /** type (c): distance from the unstiffened end to the bearing, mm */
  c?: number;
  E: number;
  gammaM1: number;
}

export interface PatchResult {
  kF: number;
  Fcr: number;
  m1: number;
  m2: number;
  /** λ̄F > 0.5 was assumed and held (m2 kept), or m2 was set to 0 (iteration on λ̄F) */
  m2Branch: 'lambdaF>0.5' | 'lambdaF<=0.5';
  le: number | null;
  ly: number;
  lambdaF: number;
  chiF: number;
  Leff: number;
  FRd: number;
}

/** EN 1993-1-5 6.4(1) Figure 6.1: buckling coefficient kF. */
export function kF(type: PatchType, hw: number, a: number, ss = 0, c = 0): number {
  if (type === 'a') return 6 + 2 * (hw / a) ** 2;
  if (type === 'b') return 3.5 + 2 * (hw / a) ** 2;
  return Math.min(6, 2 + (6 * (ss + c)) / hw);
}

/**
 * FRd = fyw Leff tw / γM1 (6.1, 6.2), Leff = χF ℓy, χF = 0.5/λ̄F ≤ 1 (6.3), λ̄F = √(ℓy tw fyw/Fcr)
 * (6.4), Fcr = 0.9 kF E tw³/hw (6.5), m1 = fyf bf/(fyw tw) (6.8), m2 = 0.02 (hw/tf)² if λ̄F > 0.5
 * else 0 (6.9). ℓy: types (a), (b) eq. 6.10, ℓy = ss + 2tf(1 + √(m1 + m2)) ≤ a; type (c) the least
 * of eqs. 6.10, 6.11 ℓe + tf √(m1/2 + (ℓe/tf)² + m2) and 6.12 ℓe + tf √(m1 + m2), with
 * ℓe = kF E tw²/(2 fyw hw) ≤ ss + c (6.13). The 2006 text of 6.5(3) cites the wrong equation
 * numbers; the least of the three is taken. m2 depends on λ̄F, which depends on ℓy: λ̄F > 0.5 is
 * assumed first and, if that fails, ℓy is recomputed with m2 = 0.
 */
export function patchResistance(p: PatchInput): PatchResult {
  const c = p.c ?? 0;
  const k = kF(p.type, p.hw, p.a, p.ss, c);
  const Fcr = (0.9 * k * p.E * (p.tw * p.tw * p.tw)) / p.hw;
  const m1 = (p.fyf * p.bf) / (p.fyw * p.tw);
  const le = p.type === 'c' ? Math.min((k * p.E * p.tw ** 2) / (2 * p.fyw * p.hw), p.ss + c) : null;
  let m2 = 0.02 * (p.hw / p.tf) ** 2;
  let ly = loadedLength(p, m1, m2, le);
  let lambdaF = Math.sqrt((ly * p.tw * p.fyw) / Fcr);
  let m2Branch: PatchResult['m2Branch'] = 'lambdaF>0.5';
  if (lambdaF <= 0.5) {
    m2 = 0;
    ly = loadedLength(p, m1, 0, le);
    lambdaF = Math.sqrt((ly * p.tw * p.fyw) / Fcr);
    m2Branch = 'lambdaF<=0.5';
  }
  const chiF = Math.min(1, 0.5 / lambdaF);
  const Leff = chiF * ly;
  const FRd = (p.fyw * Leff * p.tw) / p.gammaM1;
  return { kF: k, Fcr, m1, m2, m2Branch, le, ly, lambdaF, chiF, Leff, FRd };
}

/** ℓy: eq. 6.10 (≤ a) for types (a) and (b); for (c) the least of eqs. 6.10–6.12 (6.5(3) as corrected). */
function loadedLength(p: PatchInput, m1: number, m2: number, le: number | null): number {
  const l610 = Math.min(p.ss + 2 * p.tf * (1 + Math.sqrt(m1 + m2)), p.a);
  if (le === null) return l610;
  const l611 = le + p.tf * Math.sqrt(m1 / 2 + (le / p.tf) ** 2 + m2);
  const l612 = le + p.tf * Math.sqrt(m1 + m2);
  return Math.min(l610, l611, l612);
}

/** The web panel (between supports and stiffeners) containing x; its length a. */
export function panelLengthAt(ctx: CheckContext, x: number): number {
  const p = ctx.panels.find((q) => x >= q.x0 && x <= q.x1) ?? ctx.panels[ctx.panels.length - 1]!;
  return p.a;
}

/** Girder-level patch resistance of a force at x through the top flange: load type (a). */
export function patchForForce(ctx: CheckContext, x: number, ss: number): PatchResult {
  const { s, m, o } = ctx;
  return patchResistance({
    type: 'a',
    hw: s.hw,
    tw: s.tw,
    bf: s.top.b,
    tf: s.top.t,
    fyw: m.fyw,
    fyf: m.fyTop,
    ss,
    a: panelLengthAt(ctx, x),
    E: o.E,
    gammaM1: o.factors.gammaM1,
  });
}

/** The reason patch loading (6, 7.2) does not apply when every force stands on a load-bearing stiffener. */
export const ALL_FORCES_STIFFENED = 'every concentrated force stands on a load-bearing stiffener: checked under load-bearing-stiffener (EN 1993-1-5 9.4)';

/** The concentrated forces that enter the web unstiffened (none stands on a load-bearing stiffener). */
export function unstiffenedForces(ctx: CheckContext, e: Effects): Effects['forces'] {
  return ctx.loadXs.length === 0 ? e.forces : e.forces.filter((f) => !stiffenedAt(ctx, f.x));
}

/**
 * 'patch-loading': each concentrated force F (N) entering through the top flange with no stiffener
 * under it, load type (a) with a the length of the panel containing it (the span when the web is
 * unstiffened). utilisation η2 = F/FRd (EN 1993-1-5 6.6), the worst force governs. A force on a
 * load-bearing stiffener is not patch loading (load-bearing-stiffener, 9.4).
 */
export function patchLoadingCheck(ctx: CheckContext, e: Effects): CheckResult {
  const clause = 'EN 1993-1-5 6';
  if (e.forces.length === 0) return notApplicable('patch-loading', clause, 'no concentrated forces enter through a flange without a stiffener');
  const forces = unstiffenedForces(ctx, e);
  if (forces.length === 0) return notApplicable('patch-loading', clause, ALL_FORCES_STIFFENED);
  let best: { u: number; at: number; values: Record<string, CheckValue> } | null = null;
  for (const f of forces) {
    const r = patchForForce(ctx, f.x, f.ss);
    const u = Math.abs(f.F) / r.FRd;
    if (governs(u, best?.u)) {
      best = {
        u,
        at: f.x,
        values: { loadType: 'a', a: panelLengthAt(ctx, f.x), kF: r.kF, Fcr: r.Fcr, m1: r.m1, m2: r.m2, m2Branch: r.m2Branch, ly: r.ly, lambdaF: r.lambdaF, chiF: r.chiF, Leff: r.Leff, FRd: r.FRd, F: Math.abs(f.F) },
      };
    }
  }
  return verdict('patch-loading', clause, best!.u, best!.at, best!.values);
}

/**
 * EN 1993-1-5 7.2(1) eq. 7.2: η2 + 0.8 η1 ≤ 1.4, η2 = FEd/FRd, η1 = MEd/(fy Weff/γM0)
 * (no axial force). Returns the interaction value and its utilisation (value / 1.4).
 */
export function patchBendingInteraction(eta1: number, eta2: number): { value: number; utilisation: number } {
  const value = eta2 + 0.8 * eta1;
  return { value, utilisation: value / 1.4 };
}

/**
 * The largest η2 = F/FRd of the forces on a web, from plain numbers (the same computation as
 * 'patch-loading': load type (a), a the length of the panel containing each force). A bound for
 * the search that is exact: a candidate with a value above 1 fails 'patch-loading'.
 * panels: the web's panels (x0, x1, a), as panelsOf gives them; forces F in N, ss in mm.
 */
export function patchUtilisation(...args: Parameters<typeof patchEta2s>): number {
  let u = 0;
  for (const e of patchEta2s(...args)) u = Math.max(u, e);
  return u;
}

/** η2 = |F|/FRd of each force (as patchUtilisation computes them; its value is their largest). */
export function patchEta2s(
  forces: readonly { x: number; F: number; ss: number }[],
  web: { hw: number; tw: number; fyw: number },
  top: { b: number; t: number; fy: number },
  panels: readonly { x0: number; x1: number; a: number }[],
  E: number,
  gammaM1: number,
): Float64Array {
  const out = new Float64Array(forces.length);
  for (let i = 0; i < forces.length; i++) out[i] = Math.abs(forces[i]!.F) / forceFRd(forces[i]!, web, top, panels, E, gammaM1);
  return out;
}

/**
 * The least MelRd (N·mm) with which patchBendingFloor is at most `limit`, from each force's η2
 * (patchEta2s) and sag (as patchBendingFloor reads them): (η2 + 0.8·M/MelRd)/1.4 ≤ limit for every
 * force with M > 0 is MelRd ≥ 0.8·M/(1.4·limit − η2); Infinity when some η2 alone exceeds 1.4·limit,
 * 0 when no force has a sagging moment. The search compares one number per set of plates with it
 * instead of evaluating the floor.
 */
export function patchBendingMelNeed(eta2: ArrayLike<number>, sag: readonly number[], limit: number): number {
  let need = 0;
  for (let i = 0; i < eta2.length; i++) {
    const M = sag[i] ?? 0;
    if (!(M > 0)) continue;
    const room = 1.4 * limit - eta2[i]!;
    if (!(room > 0)) return Infinity;
    need = Math.max(need, (0.8 * M) / room);
  }
  return need;
}

/** FRd (N) of one force on a web and top flange given as plain numbers, load type (a). */
function forceFRd(
  f: { x: number; ss: number },
  web: { hw: number; tw: number; fyw: number },
  top: { b: number; t: number; fy: number },
  panels: readonly { x0: number; x1: number; a: number }[],
  E: number,
  gammaM1: number,
): number {
  return frdTypeA(web.hw, web.tw, top.b, top.t, web.fyw, top.fy, f.ss, panelAt(panels, f.x).a, E, gammaM1);
}

/**
 * patchResistance(…).FRd for load type (a) from plain numbers, with no objects made (the search
 * asks for it ~10⁶ times): the same operations in the same order, so the same value.
 */
function frdTypeA(hw: number, tw: number, bf: number, tf: number, fyw: number, fyf: number, ss: number, a: number, E: number, gammaM1: number): number {
  const k = 6 + 2 * (hw / a) ** 2;
  const Fcr = (0.9 * k * E * (tw * tw * tw)) / hw;
  const m1 = (fyf * bf) / (fyw * tw);
  let ly = Math.min(ss + 2 * tf * (1 + Math.sqrt(m1 + 0.02 * (hw / tf) ** 2)), a);
  let lambdaF = Math.sqrt((ly * tw * fyw) / Fcr);
  if (lambdaF <= 0.5) {
    ly = Math.min(ss + 2 * tf * (1 + Math.sqrt(m1 + 0)), a);
    lambdaF = Math.sqrt((ly * tw * fyw) / Fcr);
  }
  const chiF = Math.min(1, 0.5 / lambdaF);
  return (fyw * (chiF * ly) * tw) / gammaM1;
}

/** The panel containing x (the last one when none does). */
function panelAt<P extends { x0: number; x1: number }>(panels: readonly P[], x: number): P {
  for (const q of panels) if (x >= q.x0 && x <= q.x1) return q;
  return panels[panels.length - 1]!;
}

/**
 * A bound for the search: a lower bound on the 'patch-bending' utilisation (EN 1993-1-5 7.2,
 * (η2 + 0.8 η1)/1.4) from the exact η2 of each force and a lower bound of η1:
 * sag[i] ≤ the sagging MEd at force i (N·mm; ≤ 0 when the loaded flange may be in tension, which
 * skips the force) and MelRd ≥ the resistance 7.2 uses (Mel,Rd, or Meff,Rd ≤ Mel,Rd for Class 4).
 * A value above 1 means the section fails 'patch-bending'.
 */
export function patchBendingFloor(
  forces: readonly { x: number; F: number; ss: number }[],
  web: { hw: number; tw: number; fyw: number },
  top: { b: number; t: number; fy: number },
  panels: readonly { x0: number; x1: number; a: number }[],
  E: number,
  gammaM1: number,
  sag: readonly number[],
  MelRd: number,
): number {
  let u = 0;
  for (let i = 0; i < forces.length; i++) {
    const f = forces[i]!;
    const M = sag[i] ?? 0;
    if (!(M > 0)) continue;
    u = Math.max(u, patchBendingInteraction(M / MelRd, Math.abs(f.F) / forceFRd(f, web, top, panels, E, gammaM1)).utilisation);
  }
  return u;
}
