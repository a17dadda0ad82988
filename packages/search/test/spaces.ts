import { fc } from '@fast-check/vitest';
import { FLAT_BARS, type GradeName } from '@platesmith/catalogue';
import type { FabricationRules, SpaceSpec } from '../src/index.js';

/**
 * The one builder of the search's property tests' spaces: small plate lists, and around them every
 * setting of SpaceSpec that changes which candidates exist or which bounds the search may use —
 * the fabrication rules (tf ≤ k·tw, bf/tf limits, flats at least as thick as the web), hybrid
 * girders (web and flange grades drawn apart, S460 flanges on an S275 web among them),
 * load-bearing stiffeners under the concentrated forces (none, offered, or the only choice),
 * stiffener pairs at the lateral restraints, and the
 * least and greatest overall depth. The rule values are drawn where they bite on these lists
 * (common practice, no source, for the kind of values engineers set).
 */
export interface SpaceDraw {
  hw: number[];
  tw: number[];
  bf: number[];
  tf: number[];
  symmetric: boolean;
  panels: number[];
  flats: (typeof FLAT_BARS)[number][];
  sides: (1 | 2)[];
  endPosts: ('rigid' | 'non-rigid')[];
  /** load-bearing stiffener choices under the concentrated forces (null: none) */
  loadStiffeners: ((typeof FLAT_BARS)[number] | null)[];
  /** stiffener pairs at the lateral restraints on every candidate (null: none) */
  restraintStiffener: (typeof FLAT_BARS)[number] | null;
  webGrades: GradeName[];
  flangeGrades: GradeName[];
  minDepth: number;
  maxDepth: number;
  rules: FabricationRules;
}

/** The plate lists a test draws from (each a list to take 1 to `max` values of, or a fixed list). */
export interface PlateLists {
  hw: readonly number[];
  tw: readonly number[];
  bf: readonly number[];
  tf: readonly number[];
  panels: readonly number[];
  /** how many values of each list at most (bf: see bfCount) */
  max?: number;
  /** how many flange widths: [least, most] */
  bfCount?: readonly [number, number];
  symmetric?: boolean;
  sides?: readonly (1 | 2)[];
  endPosts?: readonly ('rigid' | 'non-rigid')[];
  flats?: readonly (typeof FLAT_BARS)[number][];
  /** how many flats at most */
  flatCount?: number;
  /** how many web grades at most (2 unless given) */
  webGradeCount?: number;
  /** how many flange grades at most (2 unless given) */
  flangeGradeCount?: number;
  /** the rules' arbitrary (rulesArb unless given) */
  rules?: fc.Arbitrary<FabricationRules>;
  /** the load-bearing stiffener choices (loadArb unless given) */
  loadStiffeners?: readonly ((typeof FLAT_BARS)[number] | null)[];
  /** the restraint stiffener pair (drawn unless given; null: none) */
  restraintStiffener?: (typeof FLAT_BARS)[number] | null;
}

/** The lists of the general exactness tests. */
export const SMALL_LISTS: PlateLists = {
  hw: [500, 700, 900, 1100, 1300, 1500],
  tw: [6, 8, 10, 12, 15],
  bf: [150, 200, 250, 300, 400, 500],
  tf: [10, 12, 15, 20, 25, 30, 45],
  panels: [0, 2, 3, 5],
};

const pick = <T,>(xs: readonly T[], max: number) => fc.subarray([...xs], { minLength: 1, maxLength: Math.min(max, xs.length) });

/** Fabrication rules: each off, or at a value that excludes some plates of the lists above. */
export const rulesArb: fc.Arbitrary<FabricationRules> = fc.record({
  tfMaxOverTw: fc.constantFrom(undefined, undefined, 1.5, 2, 3),
  bfOverTfMin: fc.constantFrom(undefined, undefined, 8, 12),
  bfOverTfMax: fc.constantFrom(undefined, undefined, 20, 30),
  stiffenerAtLeastWeb: fc.constantFrom(undefined, false, true),
});

/**
 * Load-bearing stiffeners under the concentrated forces: mostly none (today's girders), else
 * offered beside none, or the only choice; the flats from narrow (fail torsion or strut under a
 * large force) to wide (may not fit a narrow flange's outstand).
 */
export const loadArb: fc.Arbitrary<((typeof FLAT_BARS)[number] | null)[]> = fc.oneof(
  { weight: 3, arbitrary: fc.constant([null] as ((typeof FLAT_BARS)[number] | null)[]) },
  { weight: 2, arbitrary: fc.subarray([...FLAT_BARS].filter((_, i) => i % 2 === 1), { minLength: 1, maxLength: 2 }).map((fs) => [null, ...fs]) },
  { weight: 1, arbitrary: fc.constantFrom(...FLAT_BARS).map((f): ((typeof FLAT_BARS)[number] | null)[] => [f]) },
);

/** A space over `lists`, with rules, grades, load-bearing stiffener choices and depth limits drawn as well. */
export function spaceArb(lists: PlateLists): fc.Arbitrary<SpaceDraw> {
  const max = lists.max ?? 3;
  const [bfMin, bfMax] = lists.bfCount ?? [1, max];
  return fc.record({
    hw: pick(lists.hw, max),
    tw: pick(lists.tw, max),
    bf: fc.subarray([...lists.bf], { minLength: bfMin, maxLength: Math.min(bfMax, lists.bf.length) }),
    tf: pick(lists.tf, max),
    symmetric: lists.symmetric === undefined ? fc.boolean() : fc.constant(lists.symmetric),
    panels: pick(lists.panels, max),
    flats: lists.flats ? fc.constant([...lists.flats]) : fc.subarray([...FLAT_BARS].slice(0, 6), { minLength: 1, maxLength: lists.flatCount ?? 2 }),
    sides: lists.sides ? fc.constant([...lists.sides]) : fc.subarray([1, 2] as (1 | 2)[], { minLength: 1 }),
    endPosts: lists.endPosts ? fc.constant([...lists.endPosts]) : fc.subarray(['rigid', 'non-rigid'] as ('rigid' | 'non-rigid')[], { minLength: 1 }),
    loadStiffeners: lists.loadStiffeners ? fc.constant([...lists.loadStiffeners]) : loadArb,
    // a pair at each lateral restraint on one draw in three (a flat that passes its torsion, and one that may not)
    restraintStiffener: lists.restraintStiffener !== undefined ? fc.constant(lists.restraintStiffener) : fc.constantFrom(null, null, null, null, FLAT_BARS[1]!, FLAT_BARS[6]!),
    // web and flange grades drawn apart: a hybrid girder when they differ (S460 flanges on an S275 web among them)
    webGrades: fc.subarray(['S275', 'S355'] as GradeName[], { minLength: 1, maxLength: lists.webGradeCount ?? 2 }),
    flangeGrades: fc.subarray(['S275', 'S355', 'S460'] as GradeName[], { minLength: 1, maxLength: lists.flangeGradeCount ?? 2 }),
    // least overall depths within the lists' range, so that some runs fall below them
    minDepth: fc.constantFrom(0, 0, 800, 1200),
    maxDepth: fc.constantFrom(Infinity, Infinity, 1200, 1400),
    rules: lists.rules ?? rulesArb,
  });
}

/** The SpaceSpec of a draw (fresh arrays: the search and brute force never share a list). */
export function spaceOf(d: SpaceDraw): SpaceSpec {
  return {
    hw: [...d.hw],
    tw: [...d.tw],
    bf: [...d.bf],
    tf: [...d.tf],
    symmetric: d.symmetric,
    panels: [...d.panels],
    flats: [...d.flats],
    sides: [...d.sides],
    endPosts: [...d.endPosts],
    loadStiffeners: [...d.loadStiffeners],
    restraintStiffener: d.restraintStiffener,
    webGrades: [...d.webGrades],
    flangeGrades: [...d.flangeGrades],
    minDepth: d.minDepth,
    maxDepth: d.maxDepth,
    rules: { ...d.rules },
  };
}
