import type { Evaluated, SearchResult } from '@platesmith/search';
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
}

export interface PublishedMiss {
  depth: number;
  mass: number;
  section: SectionJson;
  governing: PublishedCheck;
  failing: string[];
}

export interface PublishedSearch {
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
  };
}

export function publishSearch(r: SearchResult, objective: 'mass' | 'cost', length: number, assumptions: readonly Assumption[] = []): PublishedSearch {
  return {
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
