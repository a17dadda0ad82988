import type { CheckContext, CheckResult, CheckValue, Effects, Restraint } from '../types.js';
import { governs, notApplicable, verdict } from '../result.js';
import { restraintStiffenerPositions } from '../section.js';
import { SAME_POSITION_MM } from '../tolerances.js';
import { heldAt } from '../en1993-1-5/load-stiffener.js';
import { stationsIn } from '../en1993-1-5/shear-buckling.js';
import { flatTorsion, stiffenerSection } from '../en1993-1-5/stiffeners.js';

/**
 * Stiffeners where a lateral restraint (cross-frame, bracing) attaches to the girder: a
 * double-sided pair of flats bs × ts at each position, carrying the restraint's stabilising force
 * (EN 1993-1-1:2005 5.3.3). Units: mm, mm², mm⁴, MPa, N, N·mm.
 *
 * The force: 5.3.3(4)'s local force αm·NEd/100 (the form 5.3.3 gives for one point of a bracing
 * system), with NEd the force of the compression flange held there, MEd/hs, the largest over the
 * two segments of that flange the restraint bounds (between its neighbouring restraints or
 * supports; the whole girder under a continuous restraint), and αm = √(0.5 (1 + 1/m)) with m = 1
 * (one girder per restraint; αm = 1, its largest value). A flange held there only counts under the
 * sign of moment that compresses it (sagging: top, hogging: bottom).
 *
 * The pair carries it as a cantilever of length hw out of the web plane, fixed at the other flange,
 * the force at the held flange (conservative: a cross-frame usually also takes it nearer the
 * flange): M = Fr·hw ≤ fy·W/γM0, W = I/(tw/2 + bs) of the flats with a web strip of 15 ε tw each
 * side (EN 1993-1-5 9.1(2), less where a support is nearer). Also the flats' torsional buckling
 * (EN 1993-1-5 9.2.1(8)) and their fit within the narrower flange's outstand. The pairs are not
 * counted as web panel boundaries (conservative for shear buckling and patch loading).
 */

/** The force of one flange's restraint at x (N) and what it came from; 0 where that flange is not held there or never compressed nearby. */
export function restraintForce(ctx: CheckContext, e: Effects, x: number, side: 'top' | 'bot'): { Fr: number; NEd: number; MEd: number; held: boolean } {
  const { o, g } = ctx;
  const line: Restraint = side === 'top' ? o.restraint : o.restraintBottom;
  const held = heldAt(line, o.supports, x);
  if (!held) return { Fr: 0, NEd: 0, MEd: 0, held };
  const first = o.supports[0]!;
  const last = o.supports[o.supports.length - 1]!;
  let x0 = first;
  let x1 = last;
  if (line.kind === 'at') {
    for (const c of [...o.supports, ...line.at]) {
      if (c < x - SAME_POSITION_MM && c > x0) x0 = c;
      if (c > x + SAME_POSITION_MM && c < x1) x1 = c;
    }
  }
  let MEd = 0;
  for (const st of stationsIn(e.stations, x0, x1)) {
    const m = side === 'top' ? st.MEd : -st.MEd;
    if (m > MEd) MEd = m;
  }
  const NEd = MEd / g.hs;
  const alphaM = 1;
  return { Fr: (alphaM * NEd) / 100, NEd, MEd, held };
}

/** The check at one restraint stiffener x. */
export function restraintStiffenerAt(ctx: CheckContext, e: Effects, x: number) {
  const { s, m, o } = ctx;
  const rs = s.restraintStiffeners!;
  const top = restraintForce(ctx, e, x, 'top');
  const bot = restraintForce(ctx, e, x, 'bot');
  const gov = top.Fr >= bot.Fr ? { ...top, flange: 'top' } : { ...bot, flange: 'bottom' };
  const strip = 15 * m.epsW * s.tw;
  let near = Infinity;
  for (const sx of o.supports) near = Math.min(near, Math.abs(sx - x));
  const w = Math.min(strip, near);
  const sec = stiffenerSection(rs.bs, rs.ts, 2, s.tw, w, w);
  const fyR = Math.min(m.fyw, m.fyRestraint);
  const W = sec.I / (s.tw / 2 + rs.bs);
  const MRd = (W * fyR) / o.factors.gammaM0;
  const M = gov.Fr * s.hw;
  const tor = flatTorsion(rs.bs, rs.ts, m.fyRestraint, o.E);
  const outstand = (Math.min(s.top.b, s.bot.b) - s.tw) / 2;
  const parts: [string, number][] = [
    ['bending', MRd > 0 ? M / MRd : Infinity],
    ['torsion', tor.limit / tor.ItOverIp],
    ['fit', outstand > 0 ? rs.bs / outstand : Infinity],
  ];
  let part = parts[0]!;
  for (const p of parts) if (governs(p[1], part[1])) part = p;
  return { ...gov, held: top.held || bot.held, M, W, MRd, I: sec.I, ItOverIp: tor.ItOverIp, torsionLimit: tor.limit, outstand, part: part[0], utilisation: part[1] };
}

/** 'restraint-stiffener': EN 1993-1-1 5.3.3 at every stiffener pair at a lateral restraint; the worst governs. */
export function restraintStiffenerCheck(ctx: CheckContext, e: Effects): CheckResult {
  const clause = 'EN 1993-1-1 5.3.3';
  const rs = ctx.s.restraintStiffeners;
  if (!rs) return notApplicable('restraint-stiffener', clause, 'no stiffeners at lateral restraints');
  const xs = restraintStiffenerPositions(ctx.o.supports, rs.xs);
  if (xs.length === 0) return notApplicable('restraint-stiffener', clause, 'no lateral restraint inside the girder: no restraint stiffener stands');
  let best: { u: number; at: number; values: Record<string, CheckValue> } | null = null;
  for (const x of xs) {
    const r = restraintStiffenerAt(ctx, e, x);
    if (!governs(r.utilisation, best?.u)) continue;
    best = {
      u: r.utilisation,
      at: x,
      values: {
        part: r.part,
        Fr: r.Fr,
        alphaM: 1,
        NEdFlange: r.NEd,
        MEdFlange: r.MEd,
        flange: r.held ? r.flange : 'none held here',
        forceBasis: 'EN 1993-1-1 5.3.3(4): αm·NEd/100, NEd = MEd/hs of the compression flange held here (largest over its two adjacent segments), αm = 1 (one girder)',
        M: r.M,
        W: r.W,
        MRd: r.MRd,
        I: r.I,
        ItOverIp: r.ItOverIp,
        torsionLimit: r.torsionLimit,
        outstand: r.outstand,
      },
    };
  }
  return verdict('restraint-stiffener', clause, best!.u, best!.at, best!.values);
}
