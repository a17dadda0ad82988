import { DomainError, G_ACC, PLATE_THICKNESSES, STEEL_KG_PER_MM3, fu, fy } from '@platesmith/catalogue';
import type {
  BearingStiffener,
  CheckOptions,
  FlangePlate,
  GrossProps,
  Material,
  Panel,
  Section,
} from './types.js';

/**
 * Cross-section properties of a welded (mono-)symmetric I-section from plate dimensions,
 * by elementary mechanics (no clause). Units: mm, mm², mm⁴, mm⁶, MPa, N·mm.
 * z is measured upward from the underside of the bottom flange.
 */

/** A rectangle of a cross-section stack: from z0 to z1 (mm), width b (mm), yield strength fy (MPa). */
export interface Rect {
  z0: number;
  z1: number;
  b: number;
  fy: number;
}

/** ε = √(235 / fy), EN 1993-1-1 Table 5.2. */
export function epsilon(fyPlate: number): number {
  return Math.sqrt(235 / fyPlate);
}

export function material(s: Section, o: Pick<CheckOptions, 'fySource'>): Material {
  const src = o.fySource;
  const fyw = fy(s.grade.web, s.tw, src, 'section.web.thickness');
  const fyTop = fy(s.grade.top, s.top.t, src, 'section.topFlange.thickness');
  const fyBot = fy(s.grade.bot, s.bot.t, src, 'section.bottomFlange.thickness');
  const tStiff = s.stiffeners?.ts ?? s.bearing?.ts ?? s.tw;
  const fyStiff = fy(s.grade.stiffener, tStiff, src, 'section.stiffeners.thickness');
  const fyBearing = s.bearing ? fy(s.grade.stiffener, s.bearing.ts, src, 'section.bearing.thickness') : fyStiff;
  const fyLoad = s.loadStiffeners ? fy(s.grade.stiffener, s.loadStiffeners.ts, src, 'section.loadStiffeners.thickness') : fyStiff;
  const fyRestraint = s.restraintStiffeners ? fy(s.grade.stiffener, s.restraintStiffeners.ts, src, 'section.restraintStiffeners.thickness') : fyStiff;
  return {
    fyw,
    fyTop,
    fyBot,
    fyStiff,
    fyBearing,
    fyLoad,
    fyRestraint,
    fuw: fu(s.grade.web, s.tw, src),
    fuTop: fu(s.grade.top, s.top.t, src),
    fuBot: fu(s.grade.bot, s.bot.t, src),
    epsW: epsilon(fyw),
    epsTop: epsilon(fyTop),
    epsBot: epsilon(fyBot),
    epsStiff: epsilon(fyStiff),
  };
}

/** The three plates of the section as a stack of rectangles, each at its own fy. */
export function rects(s: Section, m: Material): Rect[] {
  const tb = s.bot.t;
  return [
    { z0: 0, z1: tb, b: s.bot.b, fy: m.fyBot },
    { z0: tb, z1: tb + s.hw, b: s.tw, fy: m.fyw },
    { z0: tb + s.hw, z1: tb + s.hw + s.top.t, b: s.top.b, fy: m.fyTop },
  ];
}

/** Area, first moment about z = 0 and second moment about z = 0 of a rectangle stack. */
function moments(rs: readonly Rect[]): { A: number; S: number; I0: number } {
  let A = 0;
  let S = 0;
  let I0 = 0;
  for (const r of rs) {
    const h = r.z1 - r.z0;
    const a = r.b * h;
    const zc = (r.z0 + r.z1) / 2;
    A += a;
    S += a * zc;
    I0 += (r.b * (h * h * h)) / 12 + a * zc * zc;
  }
  return { A, S, I0 };
}

/** Elastic neutral axis and second moment of area of a rectangle stack. */
export function elastic(rs: readonly Rect[]): { A: number; z: number; I: number } {
  const { A, S, I0 } = moments(rs);
  const z = S / A;
  return { A, z, I: I0 - A * z * z };
}

/**
 * Plastic neutral axis (equal force above and below, each rectangle at its own fy) and the
 * plastic moment Σ fy ∫ |z − zp| dA of a rectangle stack, N·mm.
 */
export function plastic(rs: readonly Rect[]): { zp: number; Mp: number } {
  let total = 0;
  for (const r of rs) total += r.b * (r.z1 - r.z0) * r.fy;
  const half = total / 2;
  // walk up from the bottom until half the force is below
  const sorted = [...rs].sort((p, q) => p.z0 - q.z0);
  let below = 0;
  let zp = sorted[0]?.z0 ?? 0;
  for (const r of sorted) {
    const f = r.b * (r.z1 - r.z0) * r.fy;
    if (below + f >= half) {
      zp = r.z0 + (half - below) / (r.b * r.fy);
      break;
    }
    below += f;
    zp = r.z1;
  }
  let Mp = 0;
  for (const r of rs) {
    if (r.z1 <= zp) Mp += r.b * r.fy * (r.z1 - r.z0) * (zp - (r.z0 + r.z1) / 2);
    else if (r.z0 >= zp) Mp += r.b * r.fy * (r.z1 - r.z0) * ((r.z0 + r.z1) / 2 - zp);
    else Mp += (r.b * r.fy * ((zp - r.z0) ** 2 + (r.z1 - zp) ** 2)) / 2;
  }
  return { zp, Mp };
}

/** Moment at first yield of any rectangle at its own fy, N·mm, for the stack's elastic section. */
export function firstYieldMoment(rs: readonly Rect[], zNa: number, I: number): number {
  let M = Infinity;
  for (const r of rs) {
    const d = Math.max(Math.abs(r.z1 - zNa), Math.abs(r.z0 - zNa));
    if (d > 0) M = Math.min(M, (r.fy * I) / d);
  }
  return M;
}

export function grossProps(s: Section, m: Material): GrossProps {
  const rs = rects(s, m);
  const el = elastic(rs);
  const pl = plastic(rs);
  const h = s.hw + s.top.t + s.bot.t;
  const hs = s.hw + (s.top.t + s.bot.t) / 2;
  const IzTop = (s.top.t * (s.top.b * s.top.b * s.top.b)) / 12;
  const IzBot = (s.bot.t * (s.bot.b * s.bot.b * s.bot.b)) / 12;
  const Iz = IzTop + IzBot + (s.hw * (s.tw * s.tw * s.tw)) / 12;
  const It = (s.top.b * (s.top.t * s.top.t * s.top.t) + s.bot.b * (s.bot.t * s.bot.t * s.bot.t) + s.hw * (s.tw * s.tw * s.tw)) / 3;
  const Iw = (IzTop * IzBot * hs * hs) / (IzTop + IzBot);
  const zShear = s.bot.t / 2 + (hs * IzTop) / (IzTop + IzBot);
  return {
    h,
    hs,
    A: el.A,
    Aw: s.hw * s.tw,
    zElastic: el.z,
    Iy: el.I,
    Iz,
    It,
    Iw,
    zShear,
    IzTop,
    IzBot,
    zPlastic: pl.zp,
    Mpl: pl.Mp,
    Mel: firstYieldMoment(rs, el.z, el.I),
  };
}

/**
 * Compression flange outstand per EN 1993-1-1 Table 5.2 (c measured from the weld toe,
 * c = (bf − tw)/2 − √2·a with a the fillet throat) and its effective width per EN 1993-1-5
 * 4.4(2) eq. 4.3 for an outstand in uniform compression (kσ = 0.43, Table 4.2):
 * λp = (c/t)/(28.4 ε √kσ), ρ = (λp − 0.188)/λp² ≤ 1.
 * Returns c (mm), ρ, and the effective flange width bEff (mm).
 */
export function flangeOutstand(
  flange: FlangePlate,
  tw: number,
  fyFlange: number,
  throat: number,
): { c: number; ratio: number; lambdaP: number; rho: number; bEff: number } {
  const c = outstandC(flange.b, tw, throat);
  const ratio = c / flange.t;
  const lambdaP = outstandLambdaP(ratio, fyFlange);
  const rho = outstandRho(lambdaP);
  const bEff = flange.b - 2 * (1 - rho) * c;
  return { c, ratio, lambdaP, rho, bEff };
}

/** flangeOutstand(…).bEff alone, without its object (the same steps, so the same number). */
export function flangeEffectiveWidth(flange: FlangePlate, tw: number, fyFlange: number, throat: number): number {
  const c = outstandC(flange.b, tw, throat);
  const rho = outstandRho(outstandLambdaP(c / flange.t, fyFlange));
  return flange.b - 2 * (1 - rho) * c;
}

/** c of the outstand to the weld toe, mm */
function outstandC(b: number, tw: number, throat: number): number {
  return Math.max(0, (b - tw) / 2 - Math.SQRT2 * throat);
}
/** λp of the outstand in uniform compression (kσ = 0.43) from c/t */
function outstandLambdaP(ratio: number, fyFlange: number): number {
  return ratio / (28.4 * epsilon(fyFlange) * Math.sqrt(0.43));
}
/** ρ of the outstand, eq. 4.3 */
function outstandRho(lambdaP: number): number {
  return lambdaP > 0.748 ? Math.min(1, (lambdaP - 0.188) / (lambdaP * lambdaP)) : 1;
}

export type FlangeSide = 'top' | 'bot';

/** The flange in compression for a moment of this sign (positive = sagging → top). */
export function compressionSide(MEd: number): FlangeSide {
  return MEd >= 0 ? 'top' : 'bot';
}

/**
 * Rectangles of the section with the compression flange at its effective width
 * (EN 1993-1-5 4.4, outstands), web gross, optionally without the web.
 */
export function rectsEffectiveFlanges(
  s: Section,
  m: Material,
  compression: FlangeSide,
  throat: number,
  withWeb: boolean,
): Rect[] {
  const rs = rects(s, m);
  const idx = compression === 'top' ? 2 : 0;
  const flange = compression === 'top' ? s.top : s.bot;
  const fyF = compression === 'top' ? m.fyTop : m.fyBot;
  const eff = flangeOutstand(flange, s.tw, fyF, throat);
  rs[idx] = { ...rs[idx]!, b: eff.bEff };
  return withWeb ? rs : [rs[0]!, rs[2]!];
}

/**
 * EN 1993-1-5 5.4(1) and 7.1(1): Mf,Rd, the plastic moment resistance of the section made of the
 * effective flanges only, and Mpl,Rd of the effective flanges with the full web (N·mm),
 * for the compression flange given. Each plate at its own fy; divided by γM0.
 */
export function flangeAndPlasticMoments(
  s: Section,
  m: Material,
  compression: FlangeSide,
  throat: number,
  gammaM0: number,
): { MfRd: number; MplRd: number } {
  const MfRd = plastic(rectsEffectiveFlanges(s, m, compression, throat, false)).Mp / gammaM0;
  const MplRd = plastic(rectsEffectiveFlanges(s, m, compression, throat, true)).Mp / gammaM0;
  return { MfRd, MplRd };
}

/** How close (mm) a transverse stiffener may come to another boundary before it is omitted (the one there stands for it). */
const BOUNDARY_MERGE_MM = 1;

/**
 * The positions of load-bearing stiffeners that stand inside the girder: each x of `xs` more than
 * BOUNDARY_MERGE_MM from every support (a force over a support is the bearing stiffener's),
 * ascending, duplicates (within the same margin) once.
 */
export function loadStiffenerPositions(supports: readonly number[], xs: readonly number[]): number[] {
  const out: number[] = [];
  for (const x of [...xs].sort((p, q) => p - q)) {
    if (!(x > supports[0]! && x < supports[supports.length - 1]!)) continue;
    if (supports.some((sx) => Math.abs(sx - x) < BOUNDARY_MERGE_MM)) continue;
    if (out.length > 0 && x - out[out.length - 1]! < BOUNDARY_MERGE_MM) continue;
    out.push(x);
  }
  return out;
}

/**
 * The positions of stiffeners at lateral restraints that stand inside the girder (as
 * loadStiffenerPositions keeps load-bearing ones: away from the supports, ascending, once each).
 * They are not counted as panel boundaries (conservative: a boundary only shortens a panel).
 */
export function restraintStiffenerPositions(supports: readonly number[], xs: readonly number[]): number[] {
  return loadStiffenerPositions(supports, xs);
}

/**
 * Web panels between rigid transverse boundaries: supports, intermediate stiffeners and load-bearing
 * stiffeners. Intermediate stiffeners stand at x0 + k·a within each span, measured from the span's
 * left support; a stiffener closer than 1 mm to the next support is omitted. Load-bearing
 * stiffeners (at `loadXs`, as loadStiffenerPositions keeps them) are further boundaries at their
 * own positions, so the panels between them need not be equal; an intermediate stiffener within
 * 1 mm of one is omitted (the load-bearing pair stands there). Without loadXs the panels are those
 * of the equal spacing alone.
 */
export function panelsOf(supports: readonly number[], a: number | null, loadXs: readonly number[] = []): { panels: Panel[]; stiffenerXs: number[] } {
  const panels: Panel[] = [];
  const stiffenerXs: number[] = [];
  const first = supports[0]!;
  const last = supports[supports.length - 1]!;
  const loads = loadXs.length > 0 ? loadStiffenerPositions(supports, loadXs) : loadXs;
  for (let i = 0; i + 1 < supports.length; i++) {
    const s0 = supports[i]!;
    const s1 = supports[i + 1]!;
    const bounds = [s0];
    const isLoad: boolean[] = [false];
    const inSpan = loads.filter((x) => x > s0 && x < s1);
    let li = 0;
    const addLoadsBelow = (x: number) => {
      while (li < inSpan.length && inSpan[li]! < x) {
        bounds.push(inSpan[li]!);
        isLoad.push(true);
        li++;
      }
    };
    if (a !== null && a > 0) {
      for (let k = 1; s0 + k * a < s1 - 1; k++) {
        const x = s0 + k * a;
        addLoadsBelow(x);
        if (inSpan.some((y) => Math.abs(y - x) < BOUNDARY_MERGE_MM)) continue;
        bounds.push(x);
        isLoad.push(false);
      }
    }
    addLoadsBelow(Infinity);
    bounds.push(s1);
    isLoad.push(false);
    for (let j = 0; j + 1 < bounds.length; j++) {
      const x0 = bounds[j]!;
      const x1 = bounds[j + 1]!;
      if (j > 0 && !isLoad[j]) stiffenerXs.push(x0);
      panels.push({
        x0,
        x1,
        a: x1 - x0,
        atEnd: x0 === first || x1 === last,
        supportAt0: j === 0,
        supportAt1: j + 1 === bounds.length - 1,
      });
    }
  }
  return { panels, stiffenerXs };
}

/**
 * Bearing stiffeners at supports. When the section does not give them: the intermediate
 * stiffener flats if there are any (common practice, no source: one flat size per girder),
 * otherwise an outstand of 80 % of the narrower flange outstand rounded down to 10 mm, as
 * thick as the web or the next stock plate that keeps bs/ts ≤ 10ε (Class 2 outstand,
 * EN 1993-1-1 Table 5.2). A rigid end post's pairs are just over 0.1 hw apart: the next 10 mm
 * above it (EN 1993-1-5 9.3.1(3): e > 0.1 hw).
 */
export function resolveBearing(s: Section, fyStiff: number): BearingStiffener {
  // 9.3.1(3): e > 0.1 hw (strictly): the next 10 mm above
  const e = Math.max(50, Math.floor((0.1 * s.hw) / 10) * 10 + 10);
  if (s.bearing) return s.bearing;
  if (s.stiffeners) return { bs: s.stiffeners.bs, ts: Math.max(s.stiffeners.ts, s.tw), e };
  const outstand = (Math.min(s.top.b, s.bot.b) - s.tw) / 2;
  const bs = Math.max(40, Math.floor((0.8 * outstand) / 10) * 10);
  const tMin = Math.max(s.tw, bs / (10 * epsilon(fyStiff)));
  const ts = PLATE_THICKNESSES.find((t) => t >= tMin) ?? Math.ceil(tMin);
  return { bs, ts, e };
}

export interface MassBreakdown {
  /** kg */
  web: number;
  topFlange: number;
  bottomFlange: number;
  /** stiffeners standing in the span: intermediate and load-bearing (the latter also apart, below) */
  stiffeners: number;
  /** of which load-bearing stiffeners under concentrated forces, kg */
  loadStiffeners: number;
  /** of which stiffeners at lateral restraints, kg */
  restraintStiffeners: number;
  bearing: number;
  total: number;
  /** kg/m of girder length */
  perMetre: number;
}

/**
 * Double-sided bearing-stiffener pairs on a girder: `pairs` side by side over each of its
 * `supports`, and at a rigid end post one more pair e from the end (EN 1993-1-5 9.3.1: the end
 * post's second double-sided stiffener). An integer, so every mass formula multiplies by the same value.
 */
export function bearingPairCount(endPost: 'rigid' | 'non-rigid', supports: number, pairs: number): number {
  return supports * pairs + (endPost === 'rigid' ? 2 : 0);
}

/**
 * Steel mass of the girder of length L (mm): plates, intermediate stiffeners (full web depth,
 * one flat per side), load-bearing stiffeners (a full-depth pair at each position inside the
 * girder, loadStiffenerPositions), stiffener pairs at lateral restraints (restraintStiffenerPositions),
 * bearing stiffeners at every support (double-sided, `bearing.pairs` pairs over each support; one
 * more pair at a rigid end post: bearingPairCount). Density 7850 kg/m³. Welds and snipes are ignored
 * (common practice, no source).
 */
export function girderMass(s: Section, L: number, supports: readonly number[], bearing: BearingStiffener): MassBreakdown {
  const k = STEEL_KG_PER_MM3;
  const web = s.hw * s.tw * L * k;
  const topFlange = s.top.b * s.top.t * L * k;
  const bottomFlange = s.bot.b * s.bot.t * L * k;
  const ls = s.loadStiffeners;
  const loadXs = ls ? loadStiffenerPositions(supports, ls.xs) : [];
  const { stiffenerXs } = panelsOf(supports, s.stiffeners?.a ?? null, loadXs);
  const intermediate = s.stiffeners ? stiffenerXs.length * s.stiffeners.sides * s.stiffeners.bs * s.stiffeners.ts * s.hw * k : 0;
  const loadStiffeners = ls ? loadXs.length * 2 * ls.bs * ls.ts * s.hw * k : 0;
  const rs = s.restraintStiffeners;
  const restraintStiffeners = rs ? restraintStiffenerPositions(supports, rs.xs).length * 2 * rs.bs * rs.ts * s.hw * k : 0;
  const stiffeners = intermediate + loadStiffeners + restraintStiffeners;
  const bearingMass = bearingPairCount(s.endPost, supports.length, bearing.pairs ?? 1) * 2 * bearing.bs * bearing.ts * s.hw * k;
  const total = web + topFlange + bottomFlange + stiffeners + bearingMass;
  return { web, topFlange, bottomFlange, stiffeners, loadStiffeners, restraintStiffeners, bearing: bearingMass, total, perMetre: total / (L / 1000) };
}

/**
 * The self-weight the girder carries, N/mm (= kN/m): web, flanges, intermediate, load-bearing and
 * restraint stiffeners of this section over the girder's length (bearing stiffeners stand over the supports
 * and load no span). The one definition: `check` adds it to a problem's actions and the search judges every
 * candidate with it, so both give a section the same verdict.
 */
export function girderSelfWeight(s: Section, supports: readonly number[]): number {
  const L = supports[supports.length - 1]! - supports[0]!;
  const m = girderMass(s, L, supports, { bs: 0, ts: 0, e: 0 });
  return ((m.web + m.topFlange + m.bottomFlange + m.stiffeners) * G_ACC) / L;
}

/** Validates the geometry a check can be asked about; throws DomainError naming the field. */
export function assertSection(s: Section): void {
  const pos: [string, number][] = [
    ['section.web.depth', s.hw],
    ['section.web.thickness', s.tw],
    ['section.topFlange.width', s.top.b],
    ['section.topFlange.thickness', s.top.t],
    ['section.bottomFlange.width', s.bot.b],
    ['section.bottomFlange.thickness', s.bot.t],
  ];
  if (s.stiffeners) {
    pos.push(['section.stiffeners.spacing', s.stiffeners.a]);
    pos.push(['section.stiffeners.width', s.stiffeners.bs]);
    pos.push(['section.stiffeners.thickness', s.stiffeners.ts]);
  }
  if (s.loadStiffeners) {
    pos.push(['section.loadStiffeners.width', s.loadStiffeners.bs]);
    pos.push(['section.loadStiffeners.thickness', s.loadStiffeners.ts]);
  }
  if (s.restraintStiffeners) {
    pos.push(['section.restraintStiffeners.width', s.restraintStiffeners.bs]);
    pos.push(['section.restraintStiffeners.thickness', s.restraintStiffeners.ts]);
  }
  for (const [field, v] of pos) {
    if (!Number.isFinite(v) || v <= 0) {
      throw new DomainError('BAD_DIMENSION', `${field} must be a positive number of mm, got ${v}`, 'give plate dimensions in mm', field, { value: v });
    }
  }
  if (s.top.b <= s.tw || s.bot.b <= s.tw) {
    throw new DomainError('FLANGE_NARROWER_THAN_WEB', 'a flange is not wider than the web', 'flange width must exceed the web thickness', s.top.b <= s.tw ? 'section.topFlange.width' : 'section.bottomFlange.width');
  }
}

/**
 * Gross Iy (mm⁴) of a welded I from its plates, closed form about the elastic neutral axis
 * (elementary mechanics). Equal to grossProps().Iy up to round-off; the search uses it in bounds.
 */
export function iyOfPlates(hw: number, tw: number, bt: number, tt: number, bb: number, tb: number): number {
  const At = bt * tt;
  const Ab = bb * tb;
  const Aw = hw * tw;
  const zt = tb + hw + tt / 2;
  const zw = tb + hw / 2;
  const zb = tb / 2;
  const A = At + Aw + Ab;
  const z = (At * zt + Aw * zw + Ab * zb) / A;
  return (bt * (tt * tt * tt) + tw * (hw * hw * hw) + bb * (tb * tb * tb)) / 12 + At * (zt - z) ** 2 + Aw * (zw - z) ** 2 + Ab * (zb - z) ** 2;
}

/**
 * Mel (N·mm, no partial factor) of the gross section of a web plate and two flanges, each plate at
 * its own fy: the first yield of any plate's farthest fibre, as grossProps(·).Mel computes it from
 * the same three rectangles (to round-off; a property test keeps them equal). Closed form on plain
 * numbers, for the search's bounds (no rectangles or objects built per call).
 */
export function plateStackMel(w: { hw: number; tw: number; fyw: number }, T: { b: number; t: number; fy: number }, B: { b: number; t: number; fy: number }): number {
  const z1 = B.t;
  const z2 = B.t + w.hw;
  const h = z2 + T.t;
  const A0 = B.b * B.t;
  const A1 = w.tw * w.hw;
  const A2 = T.b * T.t;
  const zc = (A0 * (z1 / 2) + A1 * ((z1 + z2) / 2) + A2 * ((z2 + h) / 2)) / (A0 + A1 + A2);
  const d0 = z1 / 2 - zc;
  const d1 = (z1 + z2) / 2 - zc;
  const d2 = (z2 + h) / 2 - zc;
  const I = (A0 * B.t * B.t) / 12 + A0 * d0 * d0 + (A1 * w.hw * w.hw) / 12 + A1 * d1 * d1 + (A2 * T.t * T.t) / 12 + A2 * d2 * d2;
  return Math.min((B.fy * I) / Math.max(zc, Math.abs(z1 - zc)), (w.fyw * I) / Math.max(Math.abs(z1 - zc), Math.abs(z2 - zc)), (T.fy * I) / Math.max(Math.abs(z2 - zc), h - zc));
}
