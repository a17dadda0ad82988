/**
 * Why an answer is not lighter. "Governing" is the highest utilisation of a point, often a detail
 * no load changes; an engineer asks what stops the girder being lighter. For each Pareto point
 * this judges its one-step lighter neighbours in the space (a thinner web, thinner or narrower
 * flanges, fewer or lighter stiffeners, stiffeners on one side) with `check`'s own computation —
 * the neighbour's own self-weight and parts — and says what rules each one out: the check that
 * fails it and by how much, that it passes but is no lighter (cheaper) overall, or that it is not
 * in the space. It also names the space's limits a point sits on (its largest web depth, thickest
 * flange…): the space may be too small there. When nothing passes and the search kept no failed
 * candidate (every one was dropped by a bound), the strongest candidates of the space are judged,
 * so that the nearest misses are always there.
 *
 * A neighbour that passes and is lighter (cheaper) at no greater depth would contradict the
 * search's exactness; the exactness tests hold that it never happens.
 */
import { DomainError, fy } from '@platesmith/catalogue';
import { checkGirder, girderSelfWeight, type CheckId, type GirderVerdict, type Section } from '@platesmith/checks';
import { settle, type Evaluated, type Prepared } from './core.js';
import type { SearchResult } from './search.js';
import { buildSection, flangeMass, webParts } from './objective.js';
import { loadOptions, type FlangeOption, type WebConfig } from './space.js';

export type LimitMove = 'web-thickness' | 'flange-thickness' | 'top-flange-thickness' | 'bottom-flange-thickness' | 'flange-width' | 'top-flange-width' | 'bottom-flange-width' | 'fewer-panels' | 'lighter-flats' | 'one-side' | 'no-load-stiffeners' | 'lighter-load-flats';

/** What rules out one lighter neighbour of a point. */
export interface Limit {
  move: LimitMove;
  /** the change in words, mm: e.g. "web thickness 10 → 8" */
  change: string;
  /**
   * fails: a check fails it; not-lighter: it passes but weighs (costs) no less overall, e.g. its
   * bearing stiffeners are heavier; outside-space: the space's rules or depth limits exclude it;
   * passes: it passes and is lighter — which the search's exactness rules out (a test holds it never appears)
   */
  outcome: 'fails' | 'not-lighter' | 'outside-space' | 'passes';
  /** the failing check with the highest utilisation (outcome fails) */
  check?: CheckId;
  clause?: string;
  utilisation?: number;
  /** the neighbour's objective value (outcome not-lighter), kg or cost units */
  value?: number;
  /** why it is outside the space (outcome outside-space) */
  reason?: string;
}

/** A space field a point sits at the extreme of (largest web depth, thickest flange, widest flange, most panels). */
export type SpaceEdge = 'webDepth' | 'webThickness' | 'flangeThickness' | 'flangeWidth' | 'panels';

export interface Explained {
  limitedBy: Limit[];
  edge: SpaceEdge[];
}

/** Each point's limits and edges, in the order of `points`. */
export function explainPoints(prep: Prepared, points: readonly Evaluated[]): Explained[] {
  return points.map((e) => ({ limitedBy: limitsOf(prep, e), edge: edgesOf(prep, e) }));
}

/** The space's fields at whose largest value the point sits. */
export function edgesOf(prep: Prepared, e: Evaluated): SpaceEdge[] {
  const sp = prep.p.space;
  const s = e.section;
  const out: SpaceEdge[] = [];
  if (s.hw >= Math.max(...sp.hw)) out.push('webDepth');
  if (s.tw >= Math.max(...sp.tw)) out.push('webThickness');
  if (Math.max(s.top.t, s.bot.t) >= Math.max(...sp.tf)) out.push('flangeThickness');
  if (Math.max(s.top.b, s.bot.b) >= Math.max(...sp.bf)) out.push('flangeWidth');
  const w = prep.webs.at(e.key[0]);
  if (w.panels > 0 && w.panels >= Math.max(...sp.panels)) out.push('panels');
  return out;
}

const below = (values: readonly number[], v: number): number | undefined => {
  let best: number | undefined;
  for (const x of values) if (x < v && (best === undefined || x > best)) best = x;
  return best;
};

interface Neighbour {
  move: LimitMove;
  change: string;
  w?: WebConfig;
  T?: FlangeOption;
  B?: FlangeOption;
  /** set when the neighbour is not in the space */
  reason?: string;
}

/** The one-step lighter neighbours of a point that differ in one kind of plate. */
function neighboursOf(prep: Prepared, e: Evaluated): Neighbour[] {
  const sp = prep.p.space;
  const [wi, ti, bi] = e.key;
  const w = prep.webs.at(wi);
  const T = prep.flanges[ti]!;
  const B = prep.flanges[bi]!;
  const out: Neighbour[] = [];
  const option = (f: FlangeOption, t: number, b: number) => prep.flanges.find((o) => o.grade === f.grade && o.t === t && o.b === b);
  const tw = below(sp.tw, w.tw);
  if (tw !== undefined) {
    const n: Neighbour = { move: 'web-thickness', change: `web thickness ${w.tw} → ${tw}`, w: { ...w, tw, fyw: fy(w.grade, tw, prep.fySource) } };
    if (sp.rules.tfMaxOverTw !== undefined && Math.max(T.t, B.t) > sp.rules.tfMaxOverTw * tw) n.reason = `flange thickness over ${sp.rules.tfMaxOverTw} × the web's (rules.tfMaxOverTw)`;
    out.push(n);
  }
  const flangeMove = (which: 'both' | 'top' | 'bottom', kind: 'thickness' | 'width') => {
    const fs = which === 'both' ? [T] : which === 'top' ? [T] : [B];
    const f = fs[0]!;
    const v = kind === 'thickness' ? below(sp.tf, f.t) : below(sp.bf, f.b);
    if (v === undefined) return;
    const t = kind === 'thickness' ? v : f.t;
    const b = kind === 'width' ? v : f.b;
    const name = which === 'both' ? 'flange' : `${which} flange`;
    const move = (which === 'both' ? `flange-${kind}` : `${which}-flange-${kind}`) as LimitMove;
    const n: Neighbour = { move, change: `${name} ${kind} ${kind === 'thickness' ? f.t : f.b} → ${v}` };
    const o = option(f, t, b);
    if (!o) n.reason = `${b}×${t} is not a flange of the space (rules.bfOverTfMin / bfOverTfMax)`;
    else {
      n.T = which === 'bottom' ? T : o;
      n.B = which === 'top' ? B : o;
    }
    out.push(n);
  };
  for (const kind of ['thickness', 'width'] as const) {
    if (sp.symmetric) flangeMove('both', kind);
    else {
      flangeMove('top', kind);
      flangeMove('bottom', kind);
    }
  }
  if (w.panels > 0 && w.flat) {
    const fewer = below(sp.panels, w.panels);
    if (fewer !== undefined) out.push({ move: 'fewer-panels', change: fewer === 0 ? `${w.panels} panels → no intermediate stiffeners` : `${w.panels} → ${fewer} panels`, w: fewer === 0 ? { ...w, panels: 0, flat: null, sides: 2 } : { ...w, panels: fewer } });
    let lighter: WebConfig['flat'] = null;
    for (const f of sp.flats) if (f.b * f.t < w.flat.b * w.flat.t && !(sp.rules.stiffenerAtLeastWeb && f.t < w.tw) && (!lighter || f.b * f.t > lighter.b * lighter.t)) lighter = f;
    if (lighter) out.push({ move: 'lighter-flats', change: `stiffener flats ${w.flat.b}×${w.flat.t} → ${lighter.b}×${lighter.t}`, w: { ...w, flat: lighter } });
    if (w.sides === 2 && sp.sides.includes(1)) out.push({ move: 'one-side', change: 'stiffeners on both sides → one side', w: { ...w, sides: 1 } });
  }
  if (w.load && prep.loadXs.length > 0) {
    if (loadOptions(sp).includes(null)) out.push({ move: 'no-load-stiffeners', change: `load-bearing stiffeners ${w.load.b}×${w.load.t} → none (patch loading)`, w: { ...w, load: null } });
    let lighter: WebConfig['load'] = null;
    for (const f of loadOptions(sp)) if (f && f.b * f.t < w.load.b * w.load.t && !(sp.rules.stiffenerAtLeastWeb && f.t < w.tw) && (!lighter || f.b * f.t > lighter.b * lighter.t)) lighter = f;
    if (lighter) out.push({ move: 'lighter-load-flats', change: `load-bearing stiffener flats ${w.load.b}×${w.load.t} → ${lighter.b}×${lighter.t}`, w: { ...w, load: lighter } });
  }
  return out;
}

/** What rules out each one-step lighter neighbour of point e. */
export function limitsOf(prep: Prepared, e: Evaluated): Limit[] {
  const sp = prep.p.space;
  const [wi, ti, bi] = e.key;
  const base = { w: prep.webs.at(wi), T: prep.flanges[ti]!, B: prep.flanges[bi]! };
  return neighboursOf(prep, e).map((n) => {
    const w = n.w ?? base.w;
    const T = n.T ?? base.T;
    const B = n.B ?? base.B;
    const head = { move: n.move, change: n.change };
    if (n.reason) return { ...head, outcome: 'outside-space' as const, reason: n.reason };
    const depth = w.hw + T.t + B.t;
    if (depth < sp.minDepth) return { ...head, outcome: 'outside-space' as const, reason: `overall depth ${depth} mm below minDepth ${sp.minDepth} mm` };
    let judged: ReturnType<typeof judge>;
    try {
      judged = judge(prep, w, T, B);
    } catch (err) {
      // a neighbour the check library cannot take as a section (e.g. a flange not wider than the web): not a girder of the space
      if (err instanceof DomainError) return { ...head, outcome: 'outside-space' as const, reason: err.message };
      throw err;
    }
    const { verdict, value } = judged;
    if (!verdict.passes) {
      const g = worstFailure(verdict);
      return { ...head, outcome: 'fails' as const, check: g.id, clause: g.clause, utilisation: g.utilisation };
    }
    return { ...head, outcome: value >= e.value ? ('not-lighter' as const) : ('passes' as const), value };
  });
}

function worstFailure(v: GirderVerdict): GirderVerdict['governing'] {
  let worst = v.governing;
  for (const c of v.checks) if (!c.passes && (worst.passes || c.utilisation > worst.utilisation)) worst = c;
  return worst;
}

/** `check`'s verdict on a candidate (its own self-weight; bearing stiffeners sized by the check) and its objective value. */
function judge(prep: Prepared, w: WebConfig, T: FlangeOption, B: FlangeOption): { section: Section; verdict: GirderVerdict; value: number; mass: number } {
  const parts = webParts(w, prep.L, prep.supports, prep.Lmax, prep.forceXs, prep.restraintPair);
  const section = buildSection(w, parts, T, B);
  const verdict = checkGirder(section, prep.p.load.effects(girderSelfWeight(section, prep.supports)), prep.p.options);
  const plates = parts.webMass + parts.stiffMass + (flangeMass(T, prep.L) + flangeMass(B, prep.L));
  const { mass, value } = settle(prep, w, parts, T, B, plates, verdict, prep.p.options.weldThroats[0]!);
  return { section: { ...section, bearing: verdict.bearing }, verdict, value, mass };
}

/** How many of the space's strongest candidates are judged when no failed candidate was kept. */
const STRONGEST = 4;

/**
 * The nearest misses when the search kept none: the strongest candidates of the space (deepest
 * web that fits the depth limit, thickest web, heaviest flanges, the most and heaviest stiffeners,
 * and the same without stiffeners), judged by `check`, lowest governing utilisation first. Empty
 * only when no candidate of the space meets its depth limits.
 */
export function strongestMisses(prep: Prepared): Evaluated[] {
  const sp = prep.p.space;
  const { webs, plateStarts, flanges } = prep;
  const out: Evaluated[] = [];
  // web plates deepest first (then thickest), up to the first whose deepest pair of flanges fits the depth limits
  const plates: number[] = [];
  for (let p = 0; p + 1 < plateStarts.length; p++) plates.push(p);
  plates.sort((a, b) => {
    const wa = webs.at(plateStarts[a]!);
    const wb = webs.at(plateStarts[b]!);
    return wb.hw - wa.hw || wb.tw - wa.tw || a - b;
  });
  for (const p of plates) {
    const first = plateStarts[p]!;
    const w0 = webs.at(first);
    // the heaviest flange that keeps the depth within the limits (thinner ones where the thickest does not fit)
    const fits = flanges.filter((f) => w0.hw + 2 * f.t <= sp.maxDepth && w0.hw + 2 * f.t >= sp.minDepth && (sp.rules.tfMaxOverTw === undefined || f.t <= sp.rules.tfMaxOverTw * w0.tw));
    if (fits.length === 0) continue;
    const f = fits.reduce((a, x) => (x.A > a.A || (x.A === a.A && x.fy > a.fy) ? x : a));
    const fi = flanges.indexOf(f);
    // its layouts: the most panels with the heaviest flats on both sides, and none
    let most = -1;
    let none = -1;
    for (let i = first; i < plateStarts[p + 1]!; i++) {
      const w = webs.at(i);
      if (w.panels === 0 && none < 0) none = i;
      if (w.panels > 0 && w.flat) {
        const m = most < 0 ? null : webs.at(most);
        const kg = w.panels * w.sides * w.flat.b * w.flat.t;
        if (!m || kg > m.panels * m.sides * m.flat!.b * m.flat!.t) most = i;
      }
    }
    for (const i of [most, none]) {
      if (i < 0) continue;
      const w = webs.at(i);
      const { section, verdict, mass, value } = judge(prep, w, f, f);
      out.push({ key: [i, fi, fi], section, depth: w.hw + 2 * f.t, mass, value, verdict });
    }
    if (out.length >= STRONGEST) break;
  }
  return out.sort((a, b) => a.verdict.governing.utilisation - b.verdict.governing.utilisation).slice(0, STRONGEST);
}

/** What a search's answer gains from explainPoints and strongestMisses, to be joined to it (explained). */
export interface Explanation {
  points: Explained[];
  /** the strongest candidates judged, when the answer had no point and no near miss; else empty */
  misses: Evaluated[];
}

/** explainPoints over some points of an answer, and strongestMisses when asked for (the answer has neither points nor near misses: needsMisses). */
export function explanationOf(prep: Prepared, points: readonly Evaluated[], misses: boolean): Explanation {
  return { points: explainPoints(prep, points), misses: misses ? strongestMisses(prep) : [] };
}

/** Whether an answer needs strongestMisses: no point and no near miss. */
export function needsMisses(r: Pick<SearchResult, 'pareto' | 'nearMisses'>): boolean {
  return r.pareto.length === 0 && r.nearMisses.length === 0;
}

/** The answer with each Pareto point's limitedBy and edge (the lightest is one of them) and its near misses filled in. */
export function explained(r: SearchResult, x: Explanation): SearchResult {
  const pareto = r.pareto.map((e, i) => ({ ...e, limitedBy: x.points[i]!.limitedBy, edge: x.points[i]!.edge }));
  return { ...r, pareto, lightest: pareto.length > 0 ? pareto[pareto.length - 1]! : null, nearMisses: r.nearMisses.length > 0 ? r.nearMisses : x.misses };
}
