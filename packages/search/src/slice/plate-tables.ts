/**
 * Per web plate tables, made when first asked for and shared by every run and set of plates on the
 * plate: the quantities of its layouts, the torsion of its flats, patch loading (6.4 and the 7.2
 * floor) per top flange and panel count, Mel,Rd, and the bearing flats the sizing can return.
 */
import { bearingPairCount, flatTorsion, patchBendingMelNeed, patchEta2s, plateStackMel } from '@platesmith/checks';
import { fy } from '@platesmith/catalogue';
import { bearingCandidatesOf, bearingFloorOfCandidates, defaultBearing, type BearingFlat } from '../core.js';
import { buildSection, flangeMass, webPartsWith, type WebParts } from '../objective.js';
import type { FlangeOption, WebConfig } from '../space.js';
import type { Plate, Plates, SliceState } from './state.js';

/** The quantities of layout j of a plate, made when first asked for. */
export function partOf(s: SliceState, plate: Plate, j: number): WebParts {
  let hit = plate.parts[j];
  if (!hit) {
    const w = s.webs.at(plate.layouts[j]!);
    hit = w.load
      ? webPartsWith(w, s.L, s.stiffCountLoaded.get(w.panels) ?? 0, s.Lmax, s.prep.loadXs, s.prep.restraintPair)
      : webPartsWith(w, s.L, s.stiffCount.get(w.panels) ?? 0, s.Lmax, [], s.prep.restraintPair);
    plate.parts[j] = hit;
  }
  return hit;
}

/** The torsional requirement of intermediate flats (EN 1993-1-5 9.2.1(8)) reads the flat alone: once per flat. */
export function flatFailsTorsion(s: SliceState, w: WebConfig): boolean {
  if (!w.flat || w.panels === 0) return false;
  let byFlat = s.torsionFails.get(w.grade);
  if (!byFlat) s.torsionFails.set(w.grade, (byFlat = new Map()));
  let fails = byFlat.get(w.flat);
  if (fails === undefined) {
    const t = flatTorsion(w.flat.b, w.flat.t, fy(w.grade, w.flat.t, s.prep.fySource), s.o.E);
    fails = t.limit / t.ItOverIp > 1 + 1e-9;
    byFlat.set(w.flat, fails);
  }
  return fails;
}

/**
 * Patch loading on a plate under top flange option ti with n panels: the largest η2 (6.4, exact),
 * and the least Mel,Rd with which the 7.2 floor passes (patchBendingMelNeed; a table per plate,
 * NaN until computed). Returns the tables' key.
 */
export function patchTables(s: SliceState, plate: Plate, ti: number, n: number): number {
  const slots = s.panelSlots.size;
  const table = (plate.patch ??= new Float64Array(s.nFlange * slots).fill(Number.NaN));
  const need = (plate.patchNeed ??= new Float64Array(s.nFlange * slots));
  const key = ti * slots + s.slotOf[n]!;
  if (Number.isNaN(table[key]!)) {
    const etas = patchEta2s(s.forces, plate.w, s.flanges[ti]!, s.panelsByCount.get(n)!, s.o.E, s.o.factors.gammaM1);
    let u = 0;
    for (const e of etas) u = Math.max(u, e);
    table[key] = u;
    need[key] = s.anySag ? patchBendingMelNeed(etas, s.sagAtForces, 1 + 1e-9) : 0;
  }
  return key;
}

/** The patch-loading utilisation (6.4) of a plate under top flange option ti with n panels. */
export function patchOf(s: SliceState, plate: Plate, ti: number, n: number): number {
  const key = patchTables(s, plate, ti, n);
  return plate.patch![key]!;
}

/**
 * Patch loading of top option ti on a plate, over its panel counts: the least Mel,Rd the 7.2 floor
 * needs on the counts that pass 6.4; −1 when none passes 6.4, −2 when none that does leaves room
 * for the floor. Once per plate and option (the runs of every bottom thickness share it).
 */
export function rowPatchNeed(s: SliceState, plate: Plate, ti: number): number {
  const memo = (plate.rowNeed ??= new Float64Array(s.nFlange).fill(Number.NaN));
  let need = memo[ti]!;
  if (Number.isNaN(need)) {
    need = Infinity;
    let any = false;
    for (const np of plate.panelCounts) {
      const key = patchTables(s, plate, ti, np);
      if (plate.patch![key]! <= 1 + 1e-9) {
        any = true;
        need = Math.min(need, plate.patchNeed![key]!);
      }
    }
    if (need === Infinity) need = any ? -2 : -1;
    memo[ti] = need;
  }
  return need;
}

/** Mel,Rd of the plates' gross section: grossProps(·).Mel of the same three rectangles at the plates' own fy, over γM0 (to round-off). */
export function melRd(s: SliceState, w: WebConfig, T: FlangeOption, B: FlangeOption): number {
  return plateStackMel(w, T, B) / s.o.factors.gammaM0;
}

/** melRd of a set of plates, kept on it. */
export function melRdOf(s: SliceState, ps: Plates): number {
  if (ps.MelRd === 0) ps.MelRd = melRd(s, ps.plate.w, ps.T, ps.B);
  return ps.MelRd;
}

/**
 * Whether a panel count passes the patch-loading bounds on these plates: 6.4 and the 7.2 floor
 * (from the plate's tables), for a layout without load-bearing stiffeners (with them every force
 * stands on a pair: no patch loading, so the caller does not ask).
 */
export function panelOk(s: SliceState, ps: Plates, np: number): boolean {
  if (s.forces.length === 0) return true;
  // the plate's tables hold the per-flange work; only Mel,Rd is the pair's own (kept on it)
  const key = patchTables(s, ps.plate, ps.ti, np);
  if (!(ps.plate.patch![key]! <= 1 + 1e-9)) return false;
  // the 7.2 floor: Mel,Rd at least its need (a hair of margin: only a clear failure drops it)
  const need = ps.plate.patchNeed![key]!;
  return !(need > 0) || melRdOf(s, ps) >= need * (1 - 1e-9);
}

/**
 * The bearing floor of a set of plates under a largest support reaction R: null when nothing of
 * the bearing stock fits the flanges (the sizing keeps the section's default), 'none' when some
 * fits but none can carry R (every layout of these plates fails), else the least of each term
 * over what can (bearingCandidates), per end post.
 */
export function bearingFloorFor(s: SliceState, plate: Plate, minB: number, R: number): BearingFlat | null | 'none' {
  if (R === 0) {
    let hit = plate.fit.get(minB);
    if (hit === undefined) {
      const f = bearingFloorOfCandidates(bearingCandidatesOf(s.prep, plate.w.grade), minB, plate.w.tw, 0);
      hit = f === 'none' ? null : f;
      plate.fit.set(minB, hit);
    }
    return hit;
  }
  return bearingFloorOfCandidates(bearingCandidatesOf(s.prep, plate.w.grade), minB, plate.w.tw, R);
}

/** The least bearing stiffeners a layout's sizing can return: the plates' bearing floor (bearingFloorFor), or the section's default when nothing of the stock fits. */
export function bearingFloorOf(s: SliceState, ps: Plates, j: number): BearingFlat {
  if (ps.fit) return ps.fit;
  const w = s.webs.at(ps.plate.layouts[j]!);
  return defaultBearing(s.prep, buildSection(w, partOf(s, ps.plate, j), ps.T, ps.B));
}

/** The least bs·ts (mm²) the sizing can return on a web of thickness tw (an option of the bearing stock, or a default of resolveBearing). */
export function bearingAreaFloor(s: SliceState, grade: WebConfig['grade'], tw: number): number {
  let a = Math.min(bearingCandidatesOf(s.prep, grade).minArea, 40 * tw);
  for (const f of s.sp.flats) a = Math.min(a, f.b * Math.max(f.t, tw));
  return a;
}

/** The least single bearing flats with this end post (one double-sided pair over each support, and the rigid end post's outer pairs). */
export function bearingFlatCount(s: SliceState, ep: WebConfig['endPost']): number {
  return bearingPairCount(ep, s.supports.length, 1) * 2;
}

/** The masses of a group's flange options, kg (widths ascending, so masses ascending). */
export function groupMass(s: SliceState, gi: number): Float64Array {
  return (s.massOfGroup[gi] ??= Float64Array.from(s.groups[gi]!.options, (f) => flangeMass(f, s.L)));
}

