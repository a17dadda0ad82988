import type { Evaluated, Limit, SearchResult, SearchStatus, SpaceEdge } from '@platesmith/search';
import { fromSection, type Assumption } from './convert.js';
import { publishCheck, type PublishedCheck } from './output.js';
import type { SectionJson } from './section.js';
import { CAUTION, SCOPE } from './caution.js';

export interface PublishedPoint {
  /** overall depth h = hw + tf,top + tf,bot, mm */
  depth: number;
  /** kg: plates, stiffeners and bearing stiffeners */
  mass: number;
  /** kg/m of girder */
  massPerMetre: number;
  /** the objective's value (kg, or cost units for the cost objective) */
  value: number;
  section: SectionJson;
  governing: PublishedCheck;
  checks: PublishedCheck[];
  /** what rules out each one-step lighter neighbour (single searches) */
  limitedBy?: PublishedLimit[];
  /** the space's fields at whose largest value the point sits (single searches) */
  edge?: SpaceEdge[];
}

export interface PublishedLimit {
  move: Limit['move'];
  change: string;
  outcome: Limit['outcome'];
  check?: string;
  clause?: string;
  utilisation?: number;
  value?: number;
  reason?: string;
}

export interface PublishedMiss {
  depth: number;
  mass: number;
  section: SectionJson;
  governing: PublishedCheck;
  failing: string[];
}

/** Why a search stopped before the end of its space. */
export type SearchAbort = { reason: 'time-budget'; budgetMs: number };

export interface PublishedSearch {
  /** exact: the whole space searched; infeasible: the whole space searched, nothing passes; aborted: stopped early, the points verified but the set possibly incomplete */
  status: SearchStatus;
  /** the status in words, for a reader */
  message: string;
  /** present when status is aborted: why */
  abort?: SearchAbort;
  objective: 'mass' | 'cost';
  pareto: PublishedPoint[];
  lightest: PublishedPoint | null;
  nearMisses: PublishedMiss[];
  stats: SearchResult['stats'];
  /** every default applied to the request */
  assumptions: Assumption[];
  caution: string;
  scope: string;
}

const r3 = (v: number) => Math.round(v * 1000) / 1000;

export function publishPoint(e: Evaluated, length: number): PublishedPoint {
  return {
    depth: e.depth,
    mass: r3(e.mass),
    massPerMetre: r3(e.mass / (length / 1000)),
    value: r3(e.value),
    section: fromSection(e.section),
    governing: publishCheck(e.verdict.governing),
    checks: e.verdict.checks.map(publishCheck),
    ...(e.limitedBy ? { limitedBy: e.limitedBy.map(publishLimit) } : {}),
    ...(e.edge ? { edge: [...e.edge] } : {}),
  };
}

function publishLimit(l: Limit): PublishedLimit {
  return {
    move: l.move,
    change: l.change,
    outcome: l.outcome,
    ...(l.check !== undefined ? { check: l.check } : {}),
    ...(l.clause !== undefined ? { clause: l.clause } : {}),
    ...(l.utilisation !== undefined && Number.isFinite(l.utilisation) ? { utilisation: r3(l.utilisation) } : {}),
    ...(l.value !== undefined ? { value: r3(l.value) } : {}),
    ...(l.reason !== undefined ? { reason: l.reason } : {}),
  };
}

const EDGE_WORDS: Record<SpaceEdge, string> = { webDepth: 'largest web depth', webThickness: 'thickest web', flangeThickness: 'thickest flange', flangeWidth: 'widest flange', panels: 'most panels' };

/** A note when the lightest point sits at the largest value of a space field: the space may be too small there. */
export function edgeNote(r: { lightest: { edge?: readonly SpaceEdge[] | undefined } | null }): string | null {
  const e = r.lightest?.edge;
  if (!e || e.length === 0) return null;
  return `the lightest point is at the space's ${e.map((k) => EDGE_WORDS[k]).join(', ')}: the space may be too small (widen it there to see whether a lighter girder exists)`;
}

/** The status of a search in words: what a reader may and may not conclude from the answer. */
export function searchMessage(r: Pick<SearchResult, 'status' | 'pareto' | 'stats'> & Partial<Pick<SearchResult, 'lightest'>>, abort?: SearchAbort): string {
  const n = r.pareto.length;
  const edge = edgeNote({ lightest: r.lightest ?? null });
  if (r.status === 'exact') return `exact: the whole space of ${r.stats.spaceSize.toExponential(2)} candidates was searched; the ${n} Pareto point(s) are the exact set${edge ? `; ${edge}` : ''}`;
  if (r.status === 'infeasible') return `infeasible: the whole space of ${r.stats.spaceSize.toExponential(2)} candidates was searched and no section passes every check; see the nearest misses`;
  const why = abort?.reason === 'time-budget' ? `at its time budget of ${abort.budgetMs} ms` : 'before the end of its space';
  return `aborted ${why}: each of the ${n} point(s) found passes every check, but the set may be incomplete (a lighter section may exist at some depth); narrow the space or raise the budget for the exact set`;
}

export function publishSearch(r: SearchResult, objective: 'mass' | 'cost', length: number, abort?: SearchAbort, assumptions: readonly Assumption[] = []): PublishedSearch {
  return {
    status: r.status,
    message: searchMessage(r, abort),
    ...(r.status === 'aborted' && abort ? { abort } : {}),
    objective,
    pareto: r.pareto.map((e) => publishPoint(e, length)),
    lightest: r.lightest ? publishPoint(r.lightest, length) : null,
    nearMisses: r.nearMisses.map((e) => ({
      depth: e.depth,
      mass: r3(e.mass),
      section: fromSection(e.section),
      governing: publishCheck(e.verdict.governing),
      failing: e.verdict.checks.filter((c) => !c.passes).map((c) => c.id),
    })),
    stats: { ...r.stats, wallMs: Math.round(r.stats.wallMs * 10) / 10 },
    assumptions: [...assumptions],
    caution: CAUTION,
    scope: SCOPE,
  };
}
