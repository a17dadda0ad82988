import { elastic, firstYieldMoment, flangeEffectiveWidth, flangeOutstand, rects, type FlangeSide, type Rect } from '../section.js';
import type { Material, Section } from '../types.js';
import { EMPTY_RECT_MM, NO_HOLE_MM } from '../tolerances.js';

/**
 * Effective cross-section of a Class 4 welded I-section in bending, EN 1993-1-5:2006 (+AC:2009)
 * 4.3 and 4.4, Tables 4.1 and 4.2. Units: mm, MPa, N·mm.
 */

/** EN 1993-1-5 Table 4.1, internal compression element, for stress ratio ψ = σ2/σ1 (ψ ≥ −3). */
export function kSigmaInternal(psi: number): number {
  if (psi >= 1) return 4.0;
  if (psi > 0) return 8.2 / (1.05 + psi);
  if (psi === 0) return 7.81;
  if (psi > -1) return 7.81 - 6.29 * psi + 9.78 * psi * psi;
  if (psi === -1) return 23.9;
  return 5.98 * (1 - psi) ** 2;
}

/** EN 1993-1-5 Table 4.2, outstand with the larger compression at the free edge, 1 ≥ ψ ≥ −3. */
export function kSigmaOutstand(psi: number): number {
  if (psi >= 1) return 0.43;
  return 0.57 - 0.21 * psi + 0.07 * psi * psi;
}

/** EN 1993-1-5 4.4(2) eq. 4.3: λ̄p = (b̄/t) / (28.4 ε √kσ). */
export function lambdaP(bBar: number, t: number, eps: number, kSigma: number): number {
  return bBar / t / (28.4 * eps * Math.sqrt(kSigma));
}

/**
 * EN 1993-1-5 4.4(2) eq. 4.2, internal element: ρ = (λ̄p − 0.055(3 + ψ))/λ̄p² capped at 1.
 * The 2006 text puts the plateau at λ̄p ≤ 0.673, A1:2017 at 0.5 + √(0.085 − 0.055ψ); the latter
 * is where the formula reaches 1, so with the cap both editions give the same ρ.
 */
export function rhoInternal(lambdaPbar: number, psi: number): number {
  if (lambdaPbar <= 0.5 + Math.sqrt(Math.max(0, 0.085 - 0.055 * psi))) return 1;
  return Math.min(1, (lambdaPbar - 0.055 * (3 + psi)) / (lambdaPbar * lambdaPbar));
}

/** EN 1993-1-5 4.4(2) eq. 4.3, outstand: ρ = 1 for λ̄p ≤ 0.748, else (λ̄p − 0.188)/λ̄p² ≤ 1. */
export function rhoOutstand(lambdaPbar: number): number {
  if (lambdaPbar <= 0.748) return 1;
  return Math.min(1, (lambdaPbar - 0.188) / (lambdaPbar * lambdaPbar));
}

export interface InternalEffectiveWidths {
  kSigma: number;
  lambdaP: number;
  rho: number;
  /** compression width bc = b̄ (ψ ≥ 0) or b̄/(1 − ψ) (ψ < 0), mm */
  bc: number;
  beff: number;
  /** next to the edge with σ1 (the compression flange), mm */
  be1: number;
  /** next to the other edge (ψ ≥ 0) or to the zero-stress line (ψ < 0), mm */
  be2: number;
}

/**
 * EN 1993-1-5 Table 4.1 effective widths of an internal element of width b̄ and thickness t (mm)
 * with stress ratio ψ: ψ = 1: be1 = be2 = beff/2; 1 > ψ ≥ 0: be1 = 2beff/(5 − ψ), be2 = beff − be1;
 * ψ < 0: beff = ρ b̄/(1 − ψ), be1 = 0.4 beff, be2 = 0.6 beff. For ψ < −3 (outside Table 4.1)
 * kσ and ρ are taken at ψ = −3, which is conservative (smaller kσ).
 */
export function internalEffectiveWidths(bBar: number, t: number, eps: number, psi: number): InternalEffectiveWidths {
  const psiK = Math.max(psi, -3);
  const kSigma = kSigmaInternal(psiK);
  const lp = lambdaP(bBar, t, eps, kSigma);
  const rho = rhoInternal(lp, psiK);
  if (psi >= 0) {
    const beff = rho * bBar;
    const be1 = (2 * beff) / (5 - Math.min(psi, 1));
    return { kSigma, lambdaP: lp, rho, bc: bBar, beff, be1, be2: beff - be1 };
  }
  const bc = bBar / (1 - psi);
  const beff = rho * bc;
  return { kSigma, lambdaP: lp, rho, bc, beff, be1: 0.4 * beff, be2: 0.6 * beff };
}

export interface EffectiveSection {
  side: FlangeSide;
  /** compression flange: ρ of its outstands and effective width, mm */
  rhoFlange: number;
  bEffFlange: number;
  /** ψ of the web from effective compression flange + gross web (one step, 4.4(3)) */
  psiWeb: number;
  web: InternalEffectiveWidths;
  /** ineffective zone of the web, z range (mm from the underside), empty when fully effective */
  holeZ0: number;
  holeZ1: number;
  Aeff: number;
  Ieff: number;
  /** elastic neutral axis of the effective section, mm above the underside */
  zEff: number;
  /** Ieff over the larger distance from zEff to an extreme fibre, mm³ */
  Weff: number;
  /** first yield of any plate (own fy) of the effective section, N·mm, no partial factor */
  Meff: number;
  rects: Rect[];
}

/**
 * Effective section for bending of one sign (compression flange `side`), EN 1993-1-5 4.3(3)–(4)
 * and 4.4: (1) the compression flange outstands with kσ = 0.43 (Table 4.2, ψ = 1) on c to the
 * weld toe (throat a, mm); (2) the web with ψ from the section of effective compression flange
 * and gross web — one step, not iterated (4.4(3)); b̄ = hw (the welds are ignored, conservative).
 * The tension flange and the tension zone of the web stay gross.
 */
export function effectiveSection(s: Section, m: Material, side: FlangeSide, throat: number): EffectiveSection {
  const rs = rects(s, m);
  const iF = side === 'top' ? 2 : 0;
  const flange = side === 'top' ? s.top : s.bot;
  const fyF = side === 'top' ? m.fyTop : m.fyBot;
  const fo = flangeOutstand(flange, s.tw, fyF, throat);
  rs[iF] = { ...rs[iF]!, b: fo.bEff };
  const step1 = elastic(rs);
  const zw0 = s.bot.t;
  const zw1 = s.bot.t + s.hw;
  const zCompEdge = side === 'top' ? zw1 : zw0;
  const zOtherEdge = side === 'top' ? zw0 : zw1;
  const psiWeb = (zOtherEdge - step1.z) / (zCompEdge - step1.z);
  const web = internalEffectiveWidths(s.hw, s.tw, m.epsW, psiWeb);
  // the hole starts be1 from the compression edge and ends be2 before the end of bc
  const dir = side === 'top' ? -1 : 1; // from the compression edge into the web
  const d0 = web.be1;
  const d1 = web.bc - web.be2;
  let holeZ0 = 0;
  let holeZ1 = 0;
  const out: Rect[] = [rs[0]!];
  const w = rs[1]!;
  if (d1 - d0 > NO_HOLE_MM) {
    const za = zCompEdge + dir * d0;
    const zb = zCompEdge + dir * d1;
    holeZ0 = Math.min(za, zb);
    holeZ1 = Math.max(za, zb);
    out.push({ ...w, z0: w.z0, z1: holeZ0 }, { ...w, z0: holeZ1, z1: w.z1 });
  } else {
    out.push(w);
  }
  out.push(rs[2]!);
  const parts = out.filter((r) => r.z1 - r.z0 > EMPTY_RECT_MM);
  const el = elastic(parts);
  const h = s.hw + s.top.t + s.bot.t;
  const Weff = el.I / Math.max(el.z, h - el.z);
  return {
    side,
    rhoFlange: fo.rho,
    bEffFlange: fo.bEff,
    psiWeb,
    web,
    holeZ0,
    holeZ1,
    Aeff: el.A,
    Ieff: el.I,
    zEff: el.z,
    Weff,
    Meff: firstYieldMoment(parts, el.z, el.I),
    rects: parts,
  };
}

/** the rectangles effectiveMeff reads: b, z0, z1, fy of up to four (bottom flange, web in one or two parts, top flange) */
const meffRects = new Float64Array(16);

/**
 * effectiveSection(s, m, side, throat).Meff without building the effective section: no objects
 * (the search's LTB set bound asks it ~100 000 times a search, and effectiveSection was the
 * search's largest allocator). The same steps on the same numbers in the same order — effective
 * compression flange, ψ of the web from that section, Table 4.1 widths, the hole, the elastic
 * section of what is left, first yield — so the same value to the last bit (a property test
 * holds the two equal).
 */
export function effectiveMeff(s: Section, m: Material, side: FlangeSide, throat: number): number {
  const top = side === 'top';
  const tb = s.bot.t;
  const zw0 = tb;
  const zw1 = tb + s.hw;
  const h3 = tb + s.hw + s.top.t;
  const bEff = flangeEffectiveWidth(top ? s.top : s.bot, s.tw, top ? m.fyTop : m.fyBot, throat);
  const bBot = top ? s.bot.b : bEff;
  const bTop = top ? bEff : s.top.b;
  // step 1: effective compression flange and gross web (elastic() over the three rectangles)
  let z1 = momentsZ(bBot, 0, tb, s.tw, zw0, zw1, bTop, zw1, h3);
  const zCompEdge = top ? zw1 : zw0;
  const zOtherEdge = top ? zw0 : zw1;
  const psi = (zOtherEdge - z1) / (zCompEdge - z1);
  // internalEffectiveWidths(hw, tw, εw, ψ): be1, bc, be2
  const psiK = Math.max(psi, -3);
  const lp = lambdaP(s.hw, s.tw, m.epsW, kSigmaInternal(psiK));
  const rho = rhoInternal(lp, psiK);
  let bc: number;
  let be1: number;
  let be2: number;
  if (psi >= 0) {
    const beff = rho * s.hw;
    bc = s.hw;
    be1 = (2 * beff) / (5 - Math.min(psi, 1));
    be2 = beff - be1;
  } else {
    bc = s.hw / (1 - psi);
    const beff = rho * bc;
    be1 = 0.4 * beff;
    be2 = 0.6 * beff;
  }
  const dir = top ? -1 : 1;
  const d0 = be1;
  const d1 = bc - be2;
  const r = meffRects;
  let n = putRect(0, bBot, 0, tb, m.fyBot);
  if (d1 - d0 > NO_HOLE_MM) {
    const za = zCompEdge + dir * d0;
    const zb = zCompEdge + dir * d1;
    n = putRect(n, s.tw, zw0, Math.min(za, zb), m.fyw);
    n = putRect(n, s.tw, Math.max(za, zb), zw1, m.fyw);
  } else n = putRect(n, s.tw, zw0, zw1, m.fyw);
  n = putRect(n, bTop, zw1, h3, m.fyTop);
  // elastic(parts): moments about z = 0 in the parts' order
  let A = 0;
  let S = 0;
  let I0 = 0;
  for (let i = 0; i < n; i++) {
    const hh = r[4 * i + 2]! - r[4 * i + 1]!;
    const a = r[4 * i]! * hh;
    const zc = (r[4 * i + 1]! + r[4 * i + 2]!) / 2;
    A += a;
    S += a * zc;
    I0 += (r[4 * i]! * (hh * hh * hh)) / 12 + a * zc * zc;
  }
  z1 = S / A;
  const I = I0 - A * z1 * z1;
  // firstYieldMoment(parts, z, I)
  let M = Infinity;
  for (let i = 0; i < n; i++) {
    const d = Math.max(Math.abs(r[4 * i + 2]! - z1), Math.abs(r[4 * i + 1]! - z1));
    if (d > 0) M = Math.min(M, (r[4 * i + 3]! * I) / d);
  }
  return M;
}

/** Rectangle n of meffRects when effectiveSection keeps it (z1 − z0 > EMPTY_RECT_MM); the count after. */
function putRect(n: number, b: number, lo: number, hi: number, fy: number): number {
  if (!(hi - lo > EMPTY_RECT_MM)) return n;
  meffRects[4 * n] = b;
  meffRects[4 * n + 1] = lo;
  meffRects[4 * n + 2] = hi;
  meffRects[4 * n + 3] = fy;
  return n + 1;
}

/** elastic(rs).z of three rectangles (width, z0, z1 each) in that order: moments() then S / A. */
function momentsZ(b0: number, p0: number, q0: number, b1: number, p1: number, q1: number, b2: number, p2: number, q2: number): number {
  const h0 = q0 - p0;
  const h1 = q1 - p1;
  const h2 = q2 - p2;
  const a0 = b0 * h0;
  const a1 = b1 * h1;
  const a2 = b2 * h2;
  let A = 0;
  let S = 0;
  A += a0;
  S += a0 * ((p0 + q0) / 2);
  A += a1;
  S += a1 * ((p1 + q1) / 2);
  A += a2;
  S += a2 * ((p2 + q2) / 2);
  return S / A;
}
