import { DomainError } from '@platesmith/catalogue';
import {
  caseEIdelta,
  caseM,
  caseReactions,
  caseShear,
  caseV,
  distribute,
  emptySpanLoads,
  locate,
  solveCase,
  supportsOf,
  type BeamLoad,
  type Side,
  type SolvedCase,
} from './beam.js';
import { slsCombinations, ulsCombinations, type VariableInfo } from './combinations.js';
import type { Analysis, BeamProblem, Combination, DesignEffects, EffectsSummary, EnvelopeProblem, SlsData } from './types.js';
import { finite, lengthMm, resolveProblem, type ResolvedAction, type ResolvedProblem } from './validate.js';

/** Stations closer than this (mm) are one station. */
const TOL = 1e-6;

function toBeamLoad(a: ResolvedAction): BeamLoad {
  if (a.load === 'point') return { type: 'point', P: a.value, at: a.at };
  return { type: 'udl', w: a.value, from: a.from, to: a.to };
}

function variablesOf(rp: ResolvedProblem): VariableInfo[] {
  const vars = rp.actions.filter((a) => a.kind === 'variable');
  // Annex A2: a traffic group's actions lead together; road traffic at its own γQ
  const first = new Map<string, number>();
  return vars.map((a, j) => {
    const unit = a.group !== undefined ? (first.get(a.group) ?? (first.set(a.group, j), j)) : j;
    const gammaQ = rp.annex === 'A2-road' && a.traffic ? rp.factors.gammaQTraffic : undefined;
    return { name: a.name, psi: a.psi, unit, ...(gammaQ !== undefined ? { gammaQ } : {}) };
  });
}

/**
 * The combinations `analyse` uses for a problem, with the labels reported as governing:
 * ULS per EN 1990 6.4.3.2 (eq. 6.10 or 6.10a/6.10b), SLS per deflection limit (6.5.3).
 */
export function combinationsFor(p: BeamProblem): { uls: Combination[]; sls: { name: string; combinations: Combination[] }[] } {
  const rp = resolveProblem(p);
  const vars = variablesOf(rp);
  return {
    uls: ulsCombinations(vars, rp.combination, rp.factors),
    sls: rp.deflection.map((d) => ({ name: d.name, combinations: slsCombinations(vars, d.combination, d.include) })),
  };
}

/**
 * Cap on the derived work of one analysis: stations × ULS combinations × load patterns (each
 * variable action on each span). At about 50 ns a unit on this machine, 2·10^7 is about a second;
 * the largest problems of the demo and the benchmarks are under 10^5.
 */
export const ANALYSIS_WORK_CAP = 2e7;

/**
 * Counts an analysis's derived work before any array is built (issue 16: 20 spans × 400 grid
 * divisions × 40 variable actions held the service for 24 s). Stations are counted from their
 * sources (supports, point loads both sides, the grid, partial-load ends, extra stations and
 * about one zero-shear point per combination and span).
 */
function assertAnalysisWork(rp: ResolvedProblem, combinations: number, variables: number): void {
  const n = rp.spans.length;
  let points = 0;
  let partials = 0;
  for (const a of rp.actions) {
    if (a.load === 'point') points++;
    else if (a.load === 'partial-udl') partials++;
  }
  const stations = 2 * (n + 1) + 2 * points + n * (rp.grid - 1) + 2 * partials + rp.extra.length + (combinations + 1) * n;
  const patterns = Math.max(1, variables * n);
  const work = stations * combinations * patterns;
  if (work > ANALYSIS_WORK_CAP) {
    const field = patterns >= stations ? 'actions' : rp.extra.length > n * rp.grid ? 'extraStations' : 'gridDivisions';
    throw new DomainError(
      'ANALYSIS_TOO_LARGE',
      `the analysis would take about ${stations} stations × ${combinations} combinations × ${patterns} load patterns = ${work.toExponential(2)}, over the cap of ${ANALYSIS_WORK_CAP.toExponential(0)}`,
      'use fewer grid divisions, variable actions, spans, restraints or stiffener panels, or give the design effects as an envelope',
      field,
      { stations, combinations, patterns, work, cap: ANALYSIS_WORK_CAP },
    );
  }
}

interface Part {
  /** index among the variable actions */
  j: number;
  /** span carrying this part */
  s: number;
  sc: SolvedCase;
}

/**
 * Analyse a single span or a continuous beam (uniform EI, pinned supports) under the actions,
 * combine per EN 1990 and store every design quantity as A + g·B (g = girder self-weight,
 * characteristic, N/mm, permanent) for `designEffects`.
 *
 * Pattern loading: each variable action's part on each span is present or absent on its own;
 * at each station a part is taken only where it is unfavourable for the quantity sought (max M,
 * min M, max V, min V), with the coexisting value from the same parts. This is exact over all
 * span-by-span patterns. Permanent actions are never patterned (single source).
 *
 * SLS: per deflection limit and point, the parts that deflect the point downward (for the
 * largest downward demand) or upward (largest upward demand) are taken, judged by the bending
 * term alone; the shear term of the same parts coexists (for slender webs the bending term
 * dominates; the choice is then exact for bending).
 *
 * Stations: supports and point loads (both sides), partial-UDL ends, `gridDivisions` per span
 * (default 40), `extraStations`, and the points of zero shear of each combination's
 * midspan-sagging pattern and of the self-weight alone (the zero-shear point with a given g
 * lies between them; the grid bounds the error).
 *
 * Throws DomainError (code, field, hint) on impossible input.
 */
export function analyse(p: BeamProblem): Analysis {
  const rp = resolveProblem(p);
  const { spans, length } = rp;
  const n = spans.length;
  const x0 = supportsOf(spans);
  const vars = rp.actions.filter((a) => a.kind === 'variable');
  const uls = ulsCombinations(variablesOf(rp), rp.combination, rp.factors);
  assertAnalysisWork(rp, uls.length, vars.length);

  // ---- unit load cases
  const caseG = solveCase(spans, distribute(spans, rp.actions.filter((a) => a.kind === 'permanent').map(toBeamLoad)));
  const caseg = solveCase(spans, distribute(spans, [{ type: 'udl', w: 1, from: 0, to: length }]));
  const parts: Part[] = [];
  vars.forEach((a, j) => {
    const all = distribute(spans, [toBeamLoad(a)]);
    for (let s = 0; s < n; s++) {
      const sl = all[s]!;
      if (sl.P.length === 0 && sl.w.length === 0) continue;
      const only = spans.map((_, t) => (t === s ? sl : emptySpanLoads()));
      parts.push({ j, s, sc: solveCase(spans, only) });
    }
  });
  const nP = parts.length;

  // ---- stations
  const disc: number[] = [...x0];
  for (const a of rp.actions) if (a.load === 'point') disc.push(a.at);
  const cont: number[] = [];
  for (let s = 0; s < n; s++) for (let i = 1; i < rp.grid; i++) cont.push(x0[s]! + (spans[s]! * i) / rp.grid);
  for (const a of rp.actions) if (a.load === 'partial-udl') cont.push(a.from, a.to);
  // element by element: a spread of a long list overflows the call stack (issue 16)
  for (const x of rp.extra) cont.push(x);

  // zero shear of each ULS combination's midspan-sagging pattern, and of g alone
  for (let s = 0; s < n; s++) {
    const L = spans[s]!;
    const bps = [0, L];
    const sl = [caseG.spanLoads[s]!, ...parts.filter((q) => q.s === s).map((q) => q.sc.spanLoads[s]!)];
    for (const l of sl) for (const xs of [l.a, l.c, l.d]) for (const x of xs) bps.push(x);
    const u = [...new Set(bps)].sort((a, b) => a - b);
    const roots = (Vf: (xl: number, side: Side) => number): void => {
      for (let i = 0; i + 1 < u.length; i++) {
        const pp = u[i]!;
        const qq = u[i + 1]!;
        const vp = Vf(pp, 1);
        const vq = Vf(qq, -1);
        if ((vp > 0 && vq < 0) || (vp < 0 && vq > 0)) cont.push(x0[s]! + pp + ((qq - pp) * vp) / (vp - vq));
      }
    };
    roots((xl, side) => caseV(caseg, spans, s, xl, side));
    const mid = L / 2;
    const sel = parts.map((q) => caseM(q.sc, spans, s, mid) > 0);
    for (const c of uls) {
      roots((xl, side) => {
        let V = c.gammaG * caseV(caseG, spans, s, xl, side);
        for (let q = 0; q < nP; q++) if (sel[q]) V += c.factors[parts[q]!.j]! * caseV(parts[q]!.sc, spans, s, xl, side);
        return V;
      });
    }
  }

  const discU = [...new Set(disc)].sort((a, b) => a - b);
  const st: { x: number; side: Side }[] = [];
  for (const x of discU) {
    if (x <= 0) st.push({ x: 0, side: 1 });
    else if (x >= length) st.push({ x: length, side: -1 });
    else st.push({ x, side: -1 }, { x, side: 1 });
  }
  cont.sort((a, b) => a - b);
  let di = 0;
  let last = -Infinity;
  for (const x of cont) {
    if (!(x > 0 && x < length)) continue;
    while (di < discU.length && discU[di]! < x - TOL) di++;
    if (di < discU.length && Math.abs(discU[di]! - x) <= TOL) continue;
    if (di > 0 && Math.abs(discU[di - 1]! - x) <= TOL) continue;
    if (x - last <= TOL) continue;
    st.push({ x, side: 0 });
    last = x;
  }
  st.sort((a, b) => a.x - b.x || a.side - b.side);
  const nK = st.length;
  const stationX = new Float64Array(nK);
  const stationSide = new Int8Array(nK);
  const loc: [number, number][] = [];
  st.forEach((t, k) => {
    stationX[k] = t.x;
    stationSide[k] = t.side;
    loc.push(locate(spans, x0, t.x, t.side));
  });

  // ---- unit effects at stations
  const MG = new Float64Array(nK);
  const VG = new Float64Array(nK);
  const Mg = new Float64Array(nK);
  const Vg = new Float64Array(nK);
  const MP = new Float64Array(nP * nK);
  const VP = new Float64Array(nP * nK);
  for (let k = 0; k < nK; k++) {
    const [s, xl] = loc[k]!;
    const side = st[k]!.side;
    MG[k] = caseM(caseG, spans, s, xl);
    VG[k] = caseV(caseG, spans, s, xl, side);
    Mg[k] = caseM(caseg, spans, s, xl);
    Vg[k] = caseV(caseg, spans, s, xl, side);
    for (let q = 0; q < nP; q++) {
      MP[q * nK + k] = caseM(parts[q]!.sc, spans, s, xl);
      VP[q * nK + k] = caseV(parts[q]!.sc, spans, s, xl, side);
    }
  }

  // ---- ULS: A per combination, station, target
  const nC = uls.length;
  const gammaG = new Float64Array(nC);
  const A = new Float64Array(nC * nK * 8);
  for (let c = 0; c < nC; c++) {
    const cb = uls[c]!;
    gammaG[c] = cb.gammaG;
    for (let k = 0; k < nK; k++) {
      const m0 = cb.gammaG * MG[k]!;
      const v0 = cb.gammaG * VG[k]!;
      const acc = [m0, v0, m0, v0, m0, v0, m0, v0];
      for (let q = 0; q < nP; q++) {
        const f = cb.factors[parts[q]!.j]!;
        if (f === 0) continue;
        const m = MP[q * nK + k]!;
        const v = VP[q * nK + k]!;
        if (m > 0) {
          acc[0]! += f * m;
          acc[1]! += f * v;
        } else if (m < 0) {
          acc[2]! += f * m;
          acc[3]! += f * v;
        }
        if (v > 0) {
          acc[4]! += f * m;
          acc[5]! += f * v;
        } else if (v < 0) {
          acc[6]! += f * m;
          acc[7]! += f * v;
        }
      }
      A.set(acc, (c * nK + k) * 8);
    }
  }

  // ---- reactions
  const nR = n + 1;
  const RG = caseReactions(caseG, spans);
  const Rg = caseReactions(caseg, spans);
  const RP = parts.map((q) => caseReactions(q.sc, spans));
  const RA = new Float64Array(nC * nR);
  for (let c = 0; c < nC; c++) {
    const cb = uls[c]!;
    for (let r = 0; r < nR; r++) {
      let R = cb.gammaG * RG[r]!;
      for (let q = 0; q < nP; q++) R += cb.factors[parts[q]!.j]! * Math.max(0, RP[q]![r]!);
      RA[c * nR + r] = R;
    }
  }

  // ---- concentrated forces (point loads away from supports), design value max over ULS
  const forces: { x: number; F: number; ss: number }[] = [];
  const pts = rp.actions.filter((a) => a.load === 'point' && !x0.includes(a.at));
  const xs = [...new Set(pts.map((a) => a.at))].sort((a, b) => a - b);
  for (const x of xs) {
    const here = pts.filter((a) => a.at === x);
    let F = -Infinity;
    for (const cb of uls) {
      let Fc = 0;
      for (const a of here) {
        if (a.kind === 'permanent') Fc += cb.gammaG * a.value;
        else Fc += cb.factors[vars.indexOf(a)]! * Math.max(0, a.value);
      }
      F = Math.max(F, Fc);
    }
    if (F > 0) forces.push({ x, F, ss: Math.min(...here.map((a) => a.ss)) });
  }

  // ---- SLS deflection demands at each distinct station x
  const px: number[] = [];
  const ploc: [number, number][] = [];
  for (let k = 0; k < nK; k++) {
    if (k > 0 && stationX[k] === stationX[k - 1]) continue;
    px.push(stationX[k]!);
    ploc.push(loc[k]!);
  }
  const nQp = px.length;
  const BG = new Float64Array(nQp);
  const SG = new Float64Array(nQp);
  const Bg = new Float64Array(nQp);
  const Sg = new Float64Array(nQp);
  const BP = new Float64Array(nP * nQp);
  const SP = new Float64Array(nP * nQp);
  for (let i = 0; i < nQp; i++) {
    const [s, xl] = ploc[i]!;
    BG[i] = caseEIdelta(caseG, spans, s, xl);
    SG[i] = caseShear(caseG, s, xl);
    Bg[i] = caseEIdelta(caseg, spans, s, xl);
    Sg[i] = caseShear(caseg, s, xl);
    for (let q = 0; q < nP; q++) {
      BP[q * nQp + i] = caseEIdelta(parts[q]!.sc, spans, s, xl);
      SP[q * nQp + i] = caseShear(parts[q]!.sc, s, xl);
    }
  }
  const varInfo = variablesOf(rp);
  const sls: SlsData[] = rp.deflection.map((d) => {
    const combos = slsCombinations(varInfo, d.combination, d.include);
    const gG = combos[0]!.gammaG;
    const down = new Float64Array(nQp * 4);
    const up = new Float64Array(nQp * 4);
    for (let i = 0; i < nQp; i++) {
      let bD = -Infinity;
      let sD = 0;
      let bU = Infinity;
      let sU = 0;
      for (const cb of combos) {
        let b1 = gG * BG[i]!;
        let s1 = gG * SG[i]!;
        let b2 = b1;
        let s2 = s1;
        for (let q = 0; q < nP; q++) {
          const f = cb.factors[parts[q]!.j]!;
          const b = BP[q * nQp + i]!;
          if (f === 0) continue;
          if (b > 0) {
            b1 += f * b;
            s1 += f * SP[q * nQp + i]!;
          } else if (b < 0) {
            b2 += f * b;
            s2 += f * SP[q * nQp + i]!;
          }
        }
        if (b1 > bD) {
          bD = b1;
          sD = s1;
        }
        if (b2 < bU) {
          bU = b2;
          sU = s2;
        }
      }
      down.set([bD, sD, gG * Bg[i]!, gG * Sg[i]!], i * 4);
      up.set([bU, sU, gG * Bg[i]!, gG * Sg[i]!], i * 4);
    }
    return { name: d.name, ratio: d.ratio, x: Float64Array.from(px), down, up };
  });

  return {
    kind: 'beam',
    supports: x0,
    length,
    spans: [...spans],
    combinations: uls.map((c) => c.label),
    stationX,
    stationSide,
    gammaG,
    A,
    Mg,
    Vg,
    reactionX: Float64Array.from(x0),
    RA,
    Rg,
    forces,
    sls,
  };
}

/**
 * Wrap design effects from the user's own global analysis (bridges, girders with other
 * supports or loads): the stations pass through unchanged (sorted by x, validated), no
 * self-weight is added (the user's effects include it: g has no effect), no SLS demands.
 * Reactions default to an estimate from the envelope at each support: at an end support the
 * largest |VEd| there; at an interior support max VEd − min VEd of the entries there when both
 * signs are given, else 2·max|VEd| (an upper bound). Give `reactions` for the real values.
 */
export function analyseEnvelope(p: EnvelopeProblem): Analysis {
  if (p === null || typeof p !== 'object') throw new DomainError('BAD_PROBLEM', 'the problem must be an object', 'see EnvelopeProblem');
  const length = lengthMm(p.length, 'length');
  const supports = (p.supports ?? [0, length]).map((x, i) => finite(x, `supports[${i}]`, 'mm'));
  if (supports.length < 1 || supports.some((x, i) => x < 0 || x > length || (i > 0 && x <= supports[i - 1]!))) {
    throw new DomainError('BAD_SUPPORTS', 'supports must be ascending positions within the girder (mm)', 'give support positions in mm from the left end, e.g. [0, 24000]', 'supports');
  }
  if (!Array.isArray(p.envelope) || p.envelope.length === 0) {
    throw new DomainError('BAD_ENVELOPE', 'envelope must be a non-empty list of stations', 'give stations { x (mm), MEd (N·mm), VEd (N) }', 'envelope');
  }
  const env = p.envelope.map((e, i) => {
    const x = finite(e?.x, `envelope[${i}].x`, 'mm');
    if (x < 0 || x > length) {
      throw new DomainError('OUTSIDE_BEAM', `envelope[${i}].x = ${x} mm is outside the girder (0 to ${length} mm)`, 'positions are in mm from the left end', `envelope[${i}].x`, { value: x, length });
    }
    return { x, MEd: finite(e.MEd, `envelope[${i}].MEd`, 'N·mm'), VEd: finite(e.VEd, `envelope[${i}].VEd`, 'N') };
  });
  env.sort((a, b) => a.x - b.x); // stable: entries at one x keep the user's order
  const nK = env.length;
  const A = new Float64Array(nK * 8);
  env.forEach((e, k) => {
    for (let t = 0; t < 4; t++) {
      A[k * 8 + 2 * t] = e.MEd;
      A[k * 8 + 2 * t + 1] = e.VEd;
    }
  });
  let reactions: { x: number; R: number }[];
  if (p.reactions !== undefined) {
    reactions = p.reactions.map((r, i) => {
      const x = finite(r?.x, `reactions[${i}].x`, 'mm');
      if (x < 0 || x > length) throw new DomainError('OUTSIDE_BEAM', `reactions[${i}].x is outside the girder`, 'positions are in mm from the left end', `reactions[${i}].x`, { value: x });
      return { x, R: finite(r.R, `reactions[${i}].R`, 'N') };
    });
  } else {
    reactions = supports.map((xs, i) => {
      const here = env.filter((e) => Math.abs(e.x - xs) <= TOL);
      if (here.length === 0) {
        throw new DomainError('REACTION_UNKNOWN', `no envelope entry at the support x = ${xs} mm to estimate its reaction`, 'give reactions, or envelope entries at every support', 'reactions', { x: xs });
      }
      const vmax = Math.max(...here.map((e) => e.VEd));
      const vmin = Math.min(...here.map((e) => e.VEd));
      const amax = Math.max(...here.map((e) => Math.abs(e.VEd)));
      const end = i === 0 ? xs <= TOL : i === supports.length - 1 ? xs >= length - TOL : false;
      const R = end ? amax : vmax > 0 && vmin < 0 ? vmax - vmin : 2 * amax;
      return { x: xs, R };
    });
  }
  const forces = (p.forces ?? []).map((f, i) => {
    const x = finite(f?.x, `forces[${i}].x`, 'mm');
    if (x < 0 || x > length) throw new DomainError('OUTSIDE_BEAM', `forces[${i}].x is outside the girder`, 'positions are in mm from the left end', `forces[${i}].x`, { value: x });
    const ss = finite(f.ss, `forces[${i}].ss`, 'mm');
    if (ss < 0) throw new DomainError('BAD_BEARING_LENGTH', `forces[${i}].ss must not be negative`, 'give the stiff bearing length in mm', `forces[${i}].ss`);
    return { x, F: finite(f.F, `forces[${i}].F`, 'N'), ss };
  });
  forces.sort((a, b) => a.x - b.x);
  const spans: number[] = [];
  for (let i = 1; i < supports.length; i++) spans.push(supports[i]! - supports[i - 1]!);
  return {
    kind: 'envelope',
    supports,
    length,
    spans,
    combinations: ['user envelope'],
    stationX: Float64Array.from(env.map((e) => e.x)),
    stationSide: new Int8Array(nK),
    gammaG: new Float64Array(1),
    A,
    Mg: new Float64Array(nK),
    Vg: new Float64Array(nK),
    reactionX: Float64Array.from(reactions.map((r) => r.x)),
    RA: Float64Array.from(reactions.map((r) => r.R)),
    Rg: new Float64Array(reactions.length),
    forces,
    sls: [],
  };
}

interface Evaluated {
  effects: DesignEffects;
  /** combination index of each station entry */
  combo: number[];
}

function evaluate(a: Analysis, g: number, track: boolean): Evaluated {
  if (typeof g !== 'number' || !Number.isFinite(g)) {
    throw new DomainError('NOT_FINITE', `self-weight g must be a finite number (N/mm), got ${String(g)}`, 'give the girder self-weight in N/mm (= kN/m)', 'g', { value: g });
  }
  const nK = a.stationX.length;
  const nC = a.gammaG.length;
  const A = a.A;
  const stations: { x: number; MEd: number; VEd: number }[] = [];
  const combo: number[] = [];
  for (let k = 0; k < nK; k++) {
    const mg = g * a.Mg[k]!;
    const vg = g * a.Vg[k]!;
    let M0 = -Infinity;
    let V0 = 0;
    let c0 = 0;
    let M1 = Infinity;
    let V1 = 0;
    let c1 = 0;
    let M2 = 0;
    let V2 = 0;
    let aV2 = -1;
    let c2 = 0;
    for (let c = 0; c < nC; c++) {
      const gg = a.gammaG[c]!;
      const b = (c * nK + k) * 8;
      const m0 = A[b]! + gg * mg;
      if (m0 > M0) {
        M0 = m0;
        V0 = A[b + 1]! + gg * vg;
        c0 = c;
      }
      const m1 = A[b + 2]! + gg * mg;
      if (m1 < M1) {
        M1 = m1;
        V1 = A[b + 3]! + gg * vg;
        c1 = c;
      }
      const v2 = A[b + 5]! + gg * vg;
      if (Math.abs(v2) > aV2) {
        V2 = v2;
        aV2 = Math.abs(v2);
        M2 = A[b + 4]! + gg * mg;
        c2 = c;
      }
      const v3 = A[b + 7]! + gg * vg;
      if (Math.abs(v3) > aV2) {
        V2 = v3;
        aV2 = Math.abs(v3);
        M2 = A[b + 6]! + gg * mg;
        c2 = c;
      }
    }
    const x = a.stationX[k]!;
    stations.push({ x, MEd: M0, VEd: V0 });
    if (track) combo.push(c0);
    if (M1 !== M0 || V1 !== V0) {
      stations.push({ x, MEd: M1, VEd: V1 });
      if (track) combo.push(c1);
    }
    if ((M2 !== M0 || V2 !== V0) && (M2 !== M1 || V2 !== V1)) {
      stations.push({ x, MEd: M2, VEd: V2 });
      if (track) combo.push(c2);
    }
  }
  const nR = a.reactionX.length;
  const reactions: { x: number; R: number }[] = [];
  for (let r = 0; r < nR; r++) reactions.push({ x: a.reactionX[r]!, R: designReaction(a, r, g) });
  const sls: DesignEffects['sls'] = [];
  for (const d of a.sls) {
    const points: { x: number; bend: number; shear: number }[] = [];
    const np = d.x.length;
    for (let i = 0; i < np; i++) {
      const o = i * 4;
      const bD = d.down[o]! + g * d.down[o + 2]!;
      const sD = d.down[o + 1]! + g * d.down[o + 3]!;
      points.push({ x: d.x[i]!, bend: bD, shear: sD });
      const bU = d.up[o]! + g * d.up[o + 2]!;
      if (bU < 0 && bU < bD) points.push({ x: d.x[i]!, bend: bU, shear: d.up[o + 1]! + g * d.up[o + 3]! });
    }
    sls.push({ name: d.name, ratio: d.ratio, points });
  }
  const forces = a.forces.map((f) => ({ x: f.x, F: f.F, ss: f.ss }));
  return { effects: { stations, forces, reactions, sls }, combo };
}

/** The design reaction at support r (N, upward positive) with self-weight g: the largest over the ULS combinations, as designEffects gives it. */
export function designReaction(a: Analysis, r: number, g: number): number {
  const nR = a.reactionX.length;
  const nC = a.gammaG.length;
  let R = -Infinity;
  const rg = g * a.Rg[r]!;
  for (let c = 0; c < nC; c++) {
    const v = a.RA[c * nR + r]! + a.gammaG[c]! * rg;
    if (v > R) R = v;
  }
  return R;
}

/**
 * Design effects with the girder's self-weight g (N/mm, characteristic, permanent) added by
 * superposition; only then reduced across combinations (the governing one can change with g).
 * Per station: the max-M, min-M and max-|V| entries with their coexisting values (equal
 * entries merged); reactions: max design reaction per support; SLS: per limit and point the
 * largest downward demand and, where uplift can occur, the largest upward one.
 */
export function designEffects(a: Analysis, g: number): DesignEffects {
  return evaluate(a, g, false).effects;
}

/** Design effects plus the envelope extremes and the labels of the combinations that govern them. */
export function summarise(a: Analysis, g: number): EffectsSummary {
  const { effects, combo } = evaluate(a, g, true);
  let iMax = 0;
  let iMin = 0;
  let iV = 0;
  effects.stations.forEach((s, i) => {
    if (s.MEd > effects.stations[iMax]!.MEd) iMax = i;
    if (s.MEd < effects.stations[iMin]!.MEd) iMin = i;
    if (Math.abs(s.VEd) > Math.abs(effects.stations[iV]!.VEd)) iV = i;
  });
  const st = effects.stations;
  const label = (i: number): string => a.combinations[combo[i]!] ?? '';
  return {
    reactions: effects.reactions,
    stations: st,
    envelope: { MEdMax: st[iMax]!.MEd, MEdMin: st[iMin]!.MEd, VEdMax: Math.abs(st[iV]!.VEd) },
    governing: { MEdMax: label(iMax), MEdMin: label(iMin), VEdMax: label(iV) },
  };
}
