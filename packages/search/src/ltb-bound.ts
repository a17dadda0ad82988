import {
  bracket,
  epsilon,
  firstAbove,
  flangeOutstand,
  effectiveMeff,
  zgOf,
  webClass2Limit,
  webClass3Limit,
  ritzTrial,
  chiLT,
  chiValue,
  ltbCurveWelded,
  material,
  ALPHA,
  type BucklingCurve,
  type CheckOptions,
  type Material,
  type Section,
} from '@platesmith/checks';
import type { MomentRange } from './load.js';

/**
 * A lower bound on the utilisation of 'lateral-torsional-buckling' (EN 1993-1-1 6.3.2, as
 * ltbCheck computes it) that holds for every section of a set at once — one flange fixed, the
 * other any of a list of plates — whatever its self-weight in a range. The search uses it to drop
 * every pair with that flange when the bound exceeds 1, without judging any of them.
 *
 * Why it is a bound, term by term (ltbCheck's computation in brackets):
 * - MEd of a segment [max |M| over the segment's points]: at least the largest lower end of the
 *   envelope bounds over the self-weight range (MomentRange), interpolated at the segment ends as
 *   the check interpolates the envelope (a positive combination, so bounds carry over).
 * - Mcr [the Ritz value of the segment's diagram, converged in the number of terms, mcrConverged]:
 *   at most the Ritz value in a two-amplitude subspace of the check's first basis (ritzTrial: fixed
 *   shapes U, Φ of the band's middle diagram), closed form per section (ritzTrialMcr); that value
 *   falls as c² = (∫ m U''Φ)² grows and rises with h = 2zj ∫ m Φ'² (the destabilising load-height
 *   term left out, which can only raise it), both linear in the diagram's point values, so the
 *   least c² and the largest h over the band of diagrams (every point between its bounds) and the
 *   band's largest Mmax bound Mcr = λ·Mmax for every diagram of the range at once.
 * - Section properties (Iz, It, Iw, Mpl, zj, zg, h/b) are those of each plate of the set, by the
 *   closed forms grossProps uses (to round-off; the search's margin on the bound is 1e-6).
 * - Wy fy [Mpl, Mel or Meff by the class]: at most Mpl; where the section is surely Class 3
 *   or 4 for that sign, at most fy of the compression flange times the gross Iy over the distance
 *   from the neutral axis to its extreme fibre (wyFyBound); and where it is surely Class 4 and that
 *   has not shown the member failing, the check's own Meff (class4Meff).
 * - Mb,Rd = χLT(λ̄LT)·Wy fy/γM1 with λ̄LT = √(Wy fy/Mcr) grows with Mcr (χ falls with λ̄) and with
 *   Wy fy for a fixed Mcr (χ·λ̄² grows with λ̄ on both curves used; a test checks it on a fine
 *   grid). Where the reduction may be ignored (MEd/Mcr ≤ λ̄LT,0² possible), Mb,Rd ≤ Wy fy/γM1.
 * Each member's bound is the largest of its segments' (MEd over the largest Mb,Rd it can have
 * there); the set's bound is the least of its members' bounds, so every member fails when the set's
 * bound exceeds 1 even if they fail on different segments.
 * With the modification factor f of 6.3.2.3(2) (ltbModification) χ·λ̄² is not monotone; the bound
 * is then not offered (undefined).
 */
export interface LtbSetBound {
  /**
   * A lower bound on the LTB utilisation of every section built from one fixed flange and any of
   * `others` (plates of one thickness and grade) on the other side: `widest` is that set's section
   * with the widest of them. Only the segments where the fixed flange is in compression are
   * bounded (sagging for a fixed top flange); 0 when that flange is restrained continuously.
   */
  lowerBound(widest: Section, fixedTop: boolean, others: readonly number[], range: MomentRange): number;
  /**
   * lowerBound in two steps: the segments' moment bounds and shapes for a self-weight range (they
   * depend on the range and the side only, so one set serves every flange of a run whose range
   * contains them all), then the bound over a set of sections.
   */
  segments(range: MomentRange, fixedTop: boolean): Segments;
  over(segs: Segments, widest: Section, fixedTop: boolean, others: ArrayLike<number>, stopAt?: number): number;
  /**
   * The bound over explicit sections (one web plate, flanges of one thickness and grade per side,
   * any widths): each section's own properties, as in `over`. With `stopAt`, it may return early
   * with a value ≤ stopAt once the sections seen show the bound is at most that (only whether the
   * bound exceeds stopAt is then known): the strongest sections first make that soonest.
   */
  overSections(segs: Segments, sections: readonly Section[], stopAt?: number): number;
  /**
   * `over` for the members widths[k0 … k1−1] on a section and material the caller keeps (for
   * many sets of one run): the free flange's width of `sec` is set member by member and left at
   * the last; nothing else of it is changed or kept.
   */
  overWidths(segs: Segments, sec: Section, m: Material, fixedTop: boolean, widths: ArrayLike<number>, k0: number, k1: number, stopAt?: number): number;
  /** whether lowerBound can be above 0 with this flange fixed (its compression flange is not restrained continuously) */
  bounds(fixedTop: boolean): boolean;
}

/** The plates of a section as the bound reads them (its grades and fy come from `material` of a full section, or are given). */
export type Plates3 = Pick<Section, 'hw' | 'tw' | 'top' | 'bot'>;

/** Each plate's fy (as `material` gives them for the section's grades and thicknesses). */
export interface PlateStrengths {
  fyTop: number;
  fyBot: number;
  fyw: number;
}

interface Segment {
  top: boolean;
  L: number;
  MEdLo: number;
  /** the band's largest Mmax, least c², least and largest w (ritzTrial) and the trial's stiffness sums */
  MmaxHi: number;
  c2Lo: number;
  wLo: number;
  wHi: number;
  au: number;
  bt: number;
  bw: number;
}

/**
 * The segments of `segments`, most loaded first, packed in one array of numbers (read once per
 * member: one allocation, one stretch of memory, where an object per segment was a cache miss
 * each): [count, then per segment SEG numbers: 1 if the top flange is in compression else 0,
 * MEd,lo, Mmax,hi, c²lo, wlo, whi, E·au/k², G·bt, E·bw/kw²].
 */
export type Segments = readonly number[] & { readonly __segments: true };
const SEG = 9;

export function ltbSetBound(o: CheckOptions): LtbSetBound | undefined {
  if (o.ltbMethod === 'rolled-equivalent' && o.ltbModification) return undefined;
  const rolled = o.ltbMethod === 'rolled-equivalent';
  const lambda0 = rolled ? 0.4 : 0.2;
  const k = o.ltbEnds?.k ?? 1;
  const kw = o.ltbEnds?.kw ?? 1;
  const sup = o.supports;
  const xStart = sup[0]!;
  const xEnd = sup[sup.length - 1]!;
  const cutsOf = (line: CheckOptions['restraint']): number[] | null =>
    line.kind === 'continuous' ? null : [...new Set([...sup, ...line.at.filter((x) => x > xStart && x < xEnd)])].sort((a, b) => a - b);
  const throat = o.weldThroats.length > 0 ? Math.min(...o.weldThroats) : 0;
  const cutsTop = cutsOf(o.restraint);
  const cutsBot = cutsOf(o.restraintBottom);
  /** χLT·Mk, the check's Mb,Rd·γM1 for Wy fy = Mk */
  const reduced = (Mk: number, Mcr: number, curve: BucklingCurve): number => {
    const lambdaLT = Math.sqrt(Mk / Mcr);
    if (lambdaLT <= lambda0) return Mk;
    // chiLTGeneral(λ̄, curve).chiLT is chi(λ̄, curve).chi: chiValue, without its objects
    const chi = rolled ? chiLT({ lambdaLT, alphaLT: ALPHA[curve], lambdaLT0: 0.4, beta: 0.75 }).chiLT : chiValue(lambdaLT, curve);
    return chi * Mk;
  };

  const scratch = stackScratch();
  const gammaM1 = o.factors.gammaM1;
  const plateau = lambda0 * lambda0 * (1 + 1e-9);
  return {
    bounds: (fixedTop) => (fixedTop ? cutsTop : cutsBot) !== null,
    lowerBound(widest, fixedTop, others, range) {
      return this.over(this.segments(range, fixedTop), widest, fixedTop, others);
    },
    segments(range, fixedTop) {
      let globalHi = 0;
      for (let i = 0; i < range.xs.length; i++) globalHi = Math.max(globalHi, range.sagHi[i]!, range.hogHi[i]!);
      const tiny = Math.max(1, 1e-9 * globalHi);
      const segs: Segment[] = [];
      for (const top of [fixedTop]) {
        const cuts = top ? cutsTop : cutsBot;
        if (!cuts) continue;
        const lo = top ? range.sagLo : range.hogLo;
        const hi = top ? range.sagHi : range.hogHi;
        for (let i = 0; i + 1 < cuts.length; i++) {
          const s = segmentBound(range.xs, lo, hi, cuts[i]!, cuts[i + 1]!);
          // the check skips a segment (or a sign) whose moment is at most its round-off threshold
          if (s.MEdLo > tiny * (1 + 1e-9)) segs.push({ top, L: cuts[i + 1]! - cuts[i]!, ...s });
        }
      }
      // most loaded first (the order overPlates tries them in; the bound does not depend on it)
      segs.sort((x, y) => y.MEdLo - x.MEdLo);
      const packed: number[] = [segs.length];
      for (const sg of segs) packed.push(sg.top ? 1 : 0, sg.MEdLo, sg.MmaxHi, sg.c2Lo, sg.wLo, sg.wHi, (o.E * sg.au) / (k * k), o.G * sg.bt, (o.E * sg.bw) / (kw * kw));
      return packed as unknown as Segments;
    },
    over(segs, widest, fixedTop, others, stopAt) {
      // the set's members differ only in the other flange's width: the plates alone, one material
      const { hw, tw, top, bot } = widest;
      // one section, its other flange's width set member by member (nothing keeps it)
      const sec: Section = { ...widest, top: { b: top.b, t: top.t }, bot: { b: bot.b, t: bot.t } };
      const free = fixedTop ? sec.bot : sec.top;
      return overPlates(segs, others.length, (k) => ((free.b = others[k]!), sec), material(widest, o), stopAt);
    },
    overWidths(segs, sec, m, fixedTop, widths, k0, k1, stopAt) {
      const free = fixedTop ? sec.bot : sec.top;
      return overPlates(segs, k1 - k0, (k) => ((free.b = widths[k0 + k]!), sec), m, stopAt);
    },
    overSections(segs, sections, stopAt) {
      if (segs[0] === 0 || sections.length === 0) return 0;
      // one grade and thickness per plate role across the set: one material
      return overPlates(segs, sections.length, (k) => sections[k]!, material(sections[0]!, o), stopAt);
    },
  };

  /**
   * overSections over plates of one material: members 0 … count−1 (member(k) may hand back one
   * object, changed). Each member's own bound is the largest over the segments of MEd,lo·γM1 over
   * the largest Mb,Rd it can have there (a bound on its utilisation: its governing segment is one of
   * them); the set's bound is the least of its members' — every member fails when each fails on
   * some segment, not necessarily the same one. With stopAt, a member stops at the first segment
   * above it (already shown to fail), and the set at the first member not shown to fail.
   */
  function overPlates(segs: Segments, count: number, member: (k: number) => Section, m: Material, stopAt: number | undefined): number {
    if (segs[0] === 0 || count === 0) return 0;
    const limit = stopAt ?? Infinity;
    let hasTop = false;
    let hasBot = false;
    for (let i = 0, q = 1; i < segs[0]!; i++, q += SEG) {
      if (segs[q] === 1) hasTop = true;
      else hasBot = true;
    }
    let least = Infinity;
    // one scratch for every member (nothing keeps it past the member; overPlates is not re-entered)
    const p = scratch;
    for (let k = 0; k < count; k++) {
      const sec = member(k);
      stackProps(sec, m.fyTop, m.fyBot, m.fyw, p);
      const zg = zgOf(o.loadHeight, p.h, p.zShear);
      const curve = ltbCurveWelded(p.h, Math.min(sec.top.b, sec.bot.b));
      const zjTop = hasTop ? zjOf(sec, p, 1) : 0;
      const zjBot = hasBot ? zjOf(sec, p, -1) : 0;
      let MkTop = hasTop ? wyFyBound(sec, p, true, m, throat) : 0;
      let MkBot = hasBot ? wyFyBound(sec, p, false, m, throat) : 0;
      let uk = memberBound(segs, p, zg, curve, zjTop, zjBot, MkTop, MkBot, limit);
      if (!(uk > limit)) {
        // not shown to fail with the modulus bound: where the section is surely Class 4 for a
        // sign, the check's own Meff (a smaller Wy fy can only raise the bound)
        const eTop = hasTop ? class4Meff(sec, p, true, m) : Infinity;
        const eBot = hasBot ? class4Meff(sec, p, false, m) : Infinity;
        if (eTop < MkTop || eBot < MkBot) {
          MkTop = Math.min(MkTop, eTop);
          MkBot = Math.min(MkBot, eBot);
          uk = memberBound(segs, p, zg, curve, zjTop, zjBot, MkTop, MkBot, limit);
        }
      }
      if (Number.isNaN(uk)) return 0;
      least = Math.min(least, uk);
      // a member not shown to fail: the set is not all dead (and the bound is at most stopAt)
      if (stopAt !== undefined && !(least > limit)) return least;
    }
    return least;
  }

  /** One member's bound: the largest over the segments (most loaded first) of MEd,lo·γM1 over its largest Mb,Rd there; stops above `limit`. NaN when some Mb,Rd is not finite. */
  function memberBound(segs: Segments, p: StackProps, _zg: number, curve: BucklingCurve, zjTop: number, zjBot: number, MkTop: number, MkBot: number, limit: number): number {
    let uk = 0;
    const n = segs[0]!;
    for (let i = 0, q = 1; i < n && !(uk > limit); i++, q += SEG) {
      const top = segs[q] === 1;
      const MEdLo = segs[q + 1]!;
      const zj = top ? zjTop : zjBot;
      const c2 = segs[q + 3]!;
      // ritzTrialMcr with the segment's sums hoisted: λ = [ku h + √(ku²h² + 4c² ku kφ)]/(2c²), h = 2zj·w
      const h = 2 * zj * (zj > 0 ? segs[q + 5]! : segs[q + 4]!);
      const ku = segs[q + 6]! * p.Iz;
      const kp = segs[q + 7]! * p.It + segs[q + 8]! * p.Iw;
      // NaN carries through (an Mb,Rd that is not finite makes the bound 0); a hair above the closed form's round-off
      const McrMax = c2 > 0 ? ((segs[q + 2]! * (ku * h + Math.sqrt(ku * ku * h * h + 4 * c2 * ku * kp))) / (2 * c2)) * (1 + 1e-9) : Infinity;
      const Mk = top ? MkTop : MkBot;
      const Mb = MEdLo / McrMax <= plateau ? Mk : reduced(Mk, McrMax, curve);
      if (!(Mb < Infinity)) return Number.NaN;
      uk = Math.max(uk, (MEdLo * gammaM1) / Mb);
    }
    return uk;
  }

  /**
   * The check's Wy fy for a sign where the section is surely Class 4 (beyond the Class 3 limit of
   * the compression flange or of the web by more than round-off): Meff of effectiveSection, the
   * computation bendingForSign makes for Class 4 (same section, material and throat; through
   * effectiveMeff, the same number without its objects), with a hair of margin. Infinity where it
   * is not surely Class 4.
   */
  function class4Meff(sec: Section, p: StackProps, top: boolean, m: Material): number {
    const zc = p.zElastic;
    const zw0 = sec.bot.t;
    const zw1 = sec.bot.t + sec.hw;
    const flange = top ? sec.top : sec.bot;
    const fyF = top ? m.fyTop : m.fyBot;
    let sure = flangeOutstand(flange, sec.tw, fyF, throat).c / flange.t > 14 * epsilon(fyF) * (1 + 1e-9);
    // the check's web is Class 1 when the plastic neutral axis leaves none of it in compression
    const webCompressed = top ? p.zPlastic < zw1 - 1e-9 * sec.hw : p.zPlastic > zw0 + 1e-9 * sec.hw;
    // the check takes the web as Class 1 or 2 wherever it meets Table 5.2's Class 2 limit with the
    // plastic distribution (α, as wyFyBound reads it): only a web surely beyond that limit is
    // classified by its Class 3 limit (without this, a web in Class 2 by α but past the Class 3
    // limit by ψ was taken as Class 4: a mono-symmetric 1200 × 6 web under a 450 × 25 top flange)
    const alpha = Math.min(1, top ? (zw1 - p.zPlastic) / sec.hw : (p.zPlastic - zw0) / sec.hw);
    const beyondClass2 = alpha > 1e-9 && sec.hw / sec.tw > webClass2Limit(epsilon(m.fyw), alpha * (1 - 1e-9)) * (1 + 1e-9);
    if (!sure && webCompressed && beyondClass2 && (top ? zc < zw1 : zc > zw0)) {
      // Table 5.2 Class 3 limit of the web at ψ from the gross section (as classifySection), the
      // largest within a hair of ψ (the limit falls with ψ above −1, rises as ψ falls below, and
      // jumps at −1 from 123.5ε to 124ε)
      const psi = top ? (zw0 - zc) / (zw1 - zc) : (zw1 - zc) / (zw0 - zc);
      const eW = epsilon(m.fyw);
      const l3 = (q: number): number => webClass3Limit(eW, q);
      const d = 1e-9 * Math.max(1, Math.abs(psi));
      let lim = Math.max(l3(psi - d), l3(psi), l3(psi + d));
      if (psi - d <= -1 && psi + d > -1) lim = Math.max(lim, l3(-1), (42 * eW) / (0.67 - 0.33));
      sure = sec.hw / sec.tw > lim * (1 + 1e-9);
    }
    if (!sure) return Infinity;
    return effectiveMeff(sec, m, top ? 'top' : 'bot', throat) * (1 + 1e-12);
  }
}

/**
 * An upper bound on the check's Wy fy (Mc,Rd·γM0) for bending with the top (or bottom) flange in
 * compression: Mpl unless the section is surely Class 3 or 4 (compression flange or web beyond
 * its Class 2 limit by more than round-off), then also at most fy of the compression flange times
 * the gross Iy over the distance to its extreme fibre — Mel is a first yield (at most that
 * fibre's), and the effective section of Class 4 only removes area from the compression zone,
 * which lowers I over that distance (provided the whole flange lies on the compression side of
 * the gross neutral axis; else Mpl).
 */
export function wyFyBound(sec: Plates3, p: StackProps, top: boolean, m: PlateStrengths, throat: number): number {
  const zc = p.zElastic;
  const zw0 = sec.bot.t;
  const zw1 = sec.bot.t + sec.hw;
  if (top ? zc > zw1 : zc < zw0) return p.Mpl;
  const flange = top ? sec.top : sec.bot;
  const fyF = top ? m.fyTop : m.fyBot;
  const c = flangeOutstand(flange, sec.tw, fyF, throat).c;
  let slender = c / flange.t > 10 * epsilon(fyF) * (1 + 1e-9);
  if (!slender) {
    const alpha = Math.min(1, top ? (zw1 - p.zPlastic) / sec.hw : (p.zPlastic - zw0) / sec.hw);
    if (alpha > 1e-9) {
      // α is the check's to round-off: the Class 2 limit of Table 5.2 (classifyWebBendingCompression)
      // falls as α grows on either side of 0.5 and jumps down there (83ε → 82.9ε), so the largest
      // limit of any α within a hair of this one is the limit at α − a hair (at least 83ε at 0.5)
      const a = alpha * (1 - 1e-9);
      const eW = epsilon(m.fyw);
      const lim = webClass2Limit(eW, a);
      slender = sec.hw / sec.tw > lim * (1 + 1e-9);
    }
  }
  if (!slender) return p.Mpl;
  const Wc = p.Iy / (top ? p.h - zc : zc);
  return Math.min(p.Mpl, fyF * Wc);
}

/**
 * The centroid, Iy, h and shear centre of a three-plate I (mm, mm⁴), as grossProps gives them
 * (the shear centre of grossProps' formula; the centroid and Iy of the plate stack): what zg and
 * zj read.
 */
export interface StackProps {
  h: number;
  zElastic: number;
  zPlastic: number;
  Iy: number;
  zShear: number;
  Iz: number;
  It: number;
  Iw: number;
  Mpl: number;
}

/** A StackProps to fill again and again (stackProps' `out`). */
export function stackScratch(): StackProps {
  return { h: 0, zElastic: 0, zPlastic: 0, Iy: 0, zShear: 0, Iz: 0, It: 0, Iw: 0, Mpl: 0 };
}

/** Plastic moment of one plate [lo, hi] at strength f about the plastic neutral axis zp. */
function plasticPart(b: number, f: number, lo: number, hi: number, zp: number): number {
  if (hi <= zp) return b * f * (hi - lo) * (zp - (lo + hi) / 2);
  if (lo >= zp) return b * f * (hi - lo) * ((lo + hi) / 2 - zp);
  return (b * f * ((zp - lo) * (zp - lo) + (hi - zp) * (hi - zp))) / 2;
}

export function stackProps(s: Plates3, fyTop: number, fyBot: number, fyw: number, out: StackProps = stackScratch()): StackProps {
  // three rectangles from the bottom: bottom flange, web, top flange (width, z0, z1, fy)
  const tb = s.bot.t;
  const tt = s.top.t;
  const h = s.hw + tb + tt;
  const b0 = s.bot.b;
  const b1 = s.tw;
  const b2 = s.top.b;
  const z1 = tb;
  const z2 = tb + s.hw;
  const A0 = b0 * tb;
  const A1 = b1 * s.hw;
  const A2 = b2 * tt;
  const zc = (A0 * (tb / 2) + A1 * ((z1 + z2) / 2) + A2 * ((z2 + h) / 2)) / (A0 + A1 + A2);
  const d0 = tb / 2 - zc;
  const d1 = (z1 + z2) / 2 - zc;
  const d2 = (z2 + h) / 2 - zc;
  const Iy = (b0 * tb * tb * tb) / 12 + A0 * d0 * d0 + (b1 * s.hw * s.hw * s.hw) / 12 + A1 * d1 * d1 + (b2 * tt * tt * tt) / 12 + A2 * d2 * d2;
  const hs = s.hw + (tt + tb) / 2;
  const IzTop = (tt * b2 * b2 * b2) / 12;
  const IzBot = (tb * b0 * b0 * b0) / 12;
  // the plastic neutral axis halves the force; Mpl about it (as plastic() in the check library)
  const F0 = A0 * fyBot;
  const F1 = A1 * fyw;
  const F2 = A2 * fyTop;
  const half = (F0 + F1 + F2) / 2;
  let zp: number;
  if (F0 >= half) zp = half / (b0 * fyBot);
  else if (F0 + F1 >= half) zp = z1 + (half - F0) / (b1 * fyw);
  else zp = z2 + (half - F0 - F1) / (b2 * fyTop);
  out.h = h;
  out.zElastic = zc;
  out.zPlastic = zp;
  out.Iy = Iy;
  out.zShear = tb / 2 + (hs * IzTop) / (IzTop + IzBot);
  out.Iz = IzTop + IzBot + (s.hw * s.tw * s.tw * s.tw) / 12;
  out.It = (b2 * tt * tt * tt + b0 * tb * tb * tb + s.hw * s.tw * s.tw * s.tw) / 3;
  out.Iw = (IzTop * IzBot * hs * hs) / (IzTop + IzBot);
  out.Mpl = plasticPart(b0, fyBot, 0, z1, zp) + plasticPart(b1, fyw, z1, z2, zp) + plasticPart(b2, fyTop, z2, h, zp);
  return out;
}

/** wagnerZj of the check library without its temporary objects (sgn +1: top flange in compression). */
export function zjOf(s: Plates3, g: { zElastic: number; h: number; Iy: number; zShear: number }, sgn: 1 | -1): number {
  const zc = g.zElastic;
  const integral = zjTerm(0, s.bot.t, s.bot.b, zc, sgn) + zjTerm(s.bot.t, s.bot.t + s.hw, s.tw, zc, sgn) + zjTerm(s.bot.t + s.hw, g.h, s.top.b, zc, sgn);
  return sgn * (g.zShear - zc) - integral / (2 * g.Iy);
}

/** The value at x of per-x values v over ascending xs, linear between neighbours (the check's interpolation). */
function at(xs: Float64Array, v: Float64Array, x: number): number {
  const [lo, hi, t] = bracket(xs, x);
  return t === 0 ? v[lo]! : v[lo]! + t * (v[hi]! - v[lo]!);
}

/**
 * Bounds of one segment's moment (magnitudes, one sign) over the band: MEd,lo, Mmax,hi, and the
 * least c² and the range of w of ritzTrial's shapes, each point of the diagram anywhere in its band
 * (the check interpolates the envelope at the segment's ends as here: a positive combination, so
 * the bounds carry over).
 */
function segmentBound(xs: Float64Array, lo: Float64Array, hi: Float64Array, x0: number, x1: number): Omit<Segment, 'top' | 'L'> {
  const px: number[] = [0];
  const pl: number[] = [at(xs, lo, x0)];
  const ph: number[] = [at(xs, hi, x0)];
  // the stations strictly inside (x from the segment's start, as the check passes them)
  for (let i = firstAbove(xs, x0); i < xs.length && xs[i]! < x1; i++) {
    px.push(xs[i]! - x0);
    pl.push(lo[i]!);
    ph.push(hi[i]!);
  }
  if (x1 !== x0) {
    px.push(x1 - x0);
    pl.push(at(xs, lo, x1));
    ph.push(at(xs, hi, x1));
  }
  const n = px.length;
  let MEdLo = 0;
  let MmaxHi = 0;
  for (let i = 0; i < n; i++) {
    MEdLo = Math.max(MEdLo, pl[i]!);
    MmaxHi = Math.max(MmaxHi, ph[i]!);
  }
  const L = x1 - x0;
  if (!(L > 0) || n < 2) return { MEdLo, MmaxHi, c2Lo: 0, wLo: 0, wHi: 0, au: 0, bt: 0, bw: 0 };
  const mid = pl.map((v, i) => 0.5 * (v + ph[i]!));
  const t = ritzTrial(px, mid, n, L);
  let cMin = 0;
  let cMax = 0;
  let wLo = 0;
  let wHi = 0;
  for (let i = 0; i < n; i++) {
    const a = t.gc[i]! * pl[i]!;
    const b = t.gc[i]! * ph[i]!;
    cMin += Math.min(a, b);
    cMax += Math.max(a, b);
    const c = t.gw[i]! * pl[i]!;
    const d = t.gw[i]! * ph[i]!;
    wLo += Math.min(c, d);
    wHi += Math.max(c, d);
  }
  // round-off of the sums: widen by a hair of their magnitude
  const slack = 1e-12 * (Math.abs(cMin) + Math.abs(cMax));
  cMin -= slack;
  cMax += slack;
  const c2Lo = cMin > 0 ? cMin * cMin : cMax < 0 ? cMax * cMax : 0;
  const wSlack = 1e-12 * (Math.abs(wLo) + Math.abs(wHi));
  return { MEdLo, MmaxHi, c2Lo, wLo: wLo - wSlack, wHi: wHi + wSlack, au: t.au, bt: t.bt, bw: t.bw };
}

/** One plate's ∫ z(y² + z²) dA about the centroid zc (z positive towards the compression flange: sgn). */
function zjTerm(z0: number, z1: number, b: number, zc: number, sgn: 1 | -1): number {
  const a = sgn * (z0 - zc);
  const c = sgn * (z1 - zc);
  const lo = Math.min(a, c);
  const hi = Math.max(a, c);
  const h2 = hi * hi;
  const l2 = lo * lo;
  return ((b * b * b) / 12) * (hi - lo) * ((lo + hi) / 2) + (b * (h2 * h2 - l2 * l2)) / 4;
}
