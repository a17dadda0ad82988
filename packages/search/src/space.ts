import { DomainError, FLAT_BARS, fy, type FlatBar, type FySource, type GradeName } from '@platesmith/catalogue';
import type { EndPost } from '@platesmith/checks';

/**
 * The discrete design space (internal, mm). Every list is what can actually be bought or is
 * allowed; the search is exact over the Cartesian product, less the candidates the user's
 * fabrication rules exclude.
 */
export interface SpaceSpec {
  hw: number[];
  tw: number[];
  bf: number[];
  tf: number[];
  /** top and bottom flange equal (grade, thickness, width) */
  symmetric: boolean;
  /** numbers of equal panels in the longest span; 0 = no intermediate stiffeners */
  panels: number[];
  flats: FlatBar[];
  sides: (1 | 2)[];
  /**
   * load-bearing stiffeners under the concentrated forces (EN 1993-1-5 9.4): the choices, each a
   * double-sided pair of this flat under every force, or null (none: the forces enter the web
   * unstiffened). Absent: [null], today's girders.
   */
  loadStiffeners?: (FlatBar | null)[] | undefined;
  /**
   * a pair of these flats on every candidate at each lateral restraint inside the girder (the
   * options' restraint positions of either flange), carrying the restraint force (EN 1993-1-1
   * 5.3.3): one choice for the space, not a layout choice. Absent or null: none.
   */
  restraintStiffener?: FlatBar | null | undefined;
  endPosts: EndPost[];
  webGrades: GradeName[];
  flangeGrades: GradeName[];
  /** overall depth h = hw + tf,top + tf,bot limits, mm */
  minDepth: number;
  maxDepth: number;
  rules: FabricationRules;
}

/** Fabrication rules the user switches on (common practice, no source). */
export interface FabricationRules {
  /** tf ≤ k · tw */
  tfMaxOverTw?: number | undefined;
  /** bf/tf range */
  bfOverTfMin?: number | undefined;
  bfOverTfMax?: number | undefined;
  /** stiffener flats at least as thick as the web */
  stiffenerAtLeastWeb?: boolean | undefined;
}

/** One web configuration: everything but the flanges. */
export interface WebConfig {
  hw: number;
  tw: number;
  grade: GradeName;
  fyw: number;
  /** 0 = no intermediate stiffeners */
  panels: number;
  flat: FlatBar | null;
  sides: 1 | 2;
  endPost: EndPost;
  /** load-bearing stiffener flats under every concentrated force (a pair each), or null (absent: none) */
  load?: FlatBar | null | undefined;
}

/** One flange option: grade, thickness, width, and the fy that goes with the thickness. */
export interface FlangeOption {
  grade: GradeName;
  t: number;
  b: number;
  fy: number;
  /** area, mm² */
  A: number;
}

export function defaultSpace(): SpaceSpec {
  const range = (a: number, b: number, s: number) => Array.from({ length: Math.floor((b - a) / s) + 1 }, (_, i) => a + i * s);
  return {
    hw: range(800, 2400, 50),
    tw: [8, 10, 12, 15, 20],
    bf: range(250, 700, 25),
    tf: [15, 20, 25, 30, 35, 40, 50],
    symmetric: true,
    panels: [0, ...range(2, 16, 1)],
    flats: [...FLAT_BARS],
    sides: [2],
    loadStiffeners: [null],
    endPosts: ['rigid', 'non-rigid'],
    webGrades: ['S355'],
    flangeGrades: ['S355'],
    minDepth: 0,
    maxDepth: Number.POSITIVE_INFINITY,
    rules: {},
  };
}

export function webConfigs(sp: SpaceSpec, fySource: FySource): WebConfig[] {
  const out: WebConfig[] = [];
  for (const grade of sp.webGrades)
    for (const hw of sp.hw)
      for (const tw of sp.tw) {
        const fyw = fy(grade, tw, fySource, 'space.webThickness');
        for (const endPost of sp.endPosts)
          for (const load of loadChoices(sp, tw))
            for (const panels of sp.panels) {
              if (panels === 0) {
                out.push({ hw, tw, grade, fyw, panels: 0, flat: null, sides: 2, endPost, load });
                continue;
              }
              for (const flat of sp.flats) {
                if (sp.rules.stiffenerAtLeastWeb && flat.t < tw) continue;
                for (const sides of sp.sides) out.push({ hw, tw, grade, fyw, panels, flat, sides, endPost, load });
              }
            }
      }
  return out;
}

/**
 * The web configurations of a space as webConfigs lists them — the same objects' values at the
 * same indices — without building them all: a space's default stock gives ~10^6 of them (tens of
 * MB per worker), of which a search reads a few thousand. Each web plate (grade, hw, tw) lists
 * the same layout pattern (end post × load-bearing stiffeners × panels × flats × sides, the flats filtered by the web
 * thickness only under stiffenerAtLeastWeb); `at(i)` finds the plate by bisection and makes the
 * configuration.
 */
export class WebTable {
  readonly length: number;
  /** first index of each plate, ascending, then length */
  readonly plateStarts: Int32Array;
  private readonly plates: { grade: GradeName; hw: number; tw: number; fyw: number; pattern: readonly Layout[] }[] = [];
  constructor(sp: SpaceSpec, fySource: FySource) {
    const patterns = new Map<number, Layout[]>();
    const patternFor = (tw: number): Layout[] => {
      const key = sp.rules.stiffenerAtLeastWeb ? tw : -1;
      let hit = patterns.get(key);
      if (!hit) {
        hit = [];
        for (const endPost of sp.endPosts)
          for (const load of loadChoices(sp, tw))
            for (const panels of sp.panels) {
              if (panels === 0) {
                hit.push({ panels: 0, flat: null, sides: 2, endPost, load });
                continue;
              }
              for (const flat of sp.flats) {
                if (sp.rules.stiffenerAtLeastWeb && flat.t < tw) continue;
                for (const sides of sp.sides) hit.push({ panels, flat, sides, endPost, load });
              }
            }
        patterns.set(key, hit);
      }
      return hit;
    };
    const starts: number[] = [];
    let n = 0;
    for (const grade of sp.webGrades)
      for (const hw of sp.hw)
        for (const tw of sp.tw) {
          const fyw = fy(grade, tw, fySource, 'space.webThickness');
          const pattern = patternFor(tw);
          if (pattern.length === 0) continue;
          starts.push(n);
          this.plates.push({ grade, hw, tw, fyw, pattern });
          n += pattern.length;
        }
    starts.push(n);
    this.length = n;
    this.plateStarts = Int32Array.from(starts);
  }
  at(i: number): WebConfig {
    const s = this.plateStarts;
    const lo = lastAtOrBelow(s, i);
    const p = this.plates[lo];
    const l = p?.pattern[i - s[lo]!];
    if (!p || !l || i < 0) throw new RangeError(`web configuration ${i} is outside the space (0 … ${this.length - 1})`);
    return { hw: p.hw, tw: p.tw, grade: p.grade, fyw: p.fyw, panels: l.panels, flat: l.flat, sides: l.sides, endPost: l.endPost, load: l.load };
  }
}

/** Index of the last of the ascending values that is ≤ x (0 when none is). */
export function lastAtOrBelow(values: Int32Array, x: number): number {
  let lo = 0;
  let hi = values.length - 1;
  while (lo < hi) {
    const mid = (lo + hi + 1) >> 1;
    if (values[mid]! <= x) lo = mid;
    else hi = mid - 1;
  }
  return lo;
}

interface Layout {
  panels: number;
  flat: FlatBar | null;
  sides: 1 | 2;
  endPost: EndPost;
  load: FlatBar | null;
}

/** The space's load-bearing stiffener choices ([null] when it does not list them). */
export function loadOptions(sp: SpaceSpec): (FlatBar | null)[] {
  return sp.loadStiffeners ?? [null];
}

/** The load-bearing stiffener choices on a web of thickness tw (flats filtered as the intermediate ones under stiffenerAtLeastWeb; none is always a choice where listed). */
export function loadChoices(sp: SpaceSpec, tw: number): (FlatBar | null)[] {
  return loadOptions(sp).filter((f) => f === null || !(sp.rules.stiffenerAtLeastWeb && f.t < tw));
}

/**
 * The number of web configurations of each web plate (grade, hw, tw), in the order webConfigs
 * lists them, without building them. Validates the web thicknesses as webConfigs does.
 */
export function webPlateCounts(sp: SpaceSpec, fySource: FySource): number[] {
  const out: number[] = [];
  for (const grade of sp.webGrades)
    for (const _hw of sp.hw)
      for (const tw of sp.tw) {
        fy(grade, tw, fySource, 'space.webThickness');
        let per = 0;
        for (const _ep of sp.endPosts)
          for (const panels of sp.panels) {
            if (panels === 0) per += 1;
            else per += sp.flats.filter((f) => !(sp.rules.stiffenerAtLeastWeb && f.t < tw)).length * sp.sides.length;
          }
        out.push(per * loadChoices(sp, tw).length);
      }
  return out;
}

/** Flange options grouped by (grade, thickness), widths ascending. */
export interface FlangeGroup {
  grade: GradeName;
  t: number;
  fy: number;
  options: FlangeOption[];
}

export function flangeGroups(sp: SpaceSpec, fySource: FySource): FlangeGroup[] {
  const out: FlangeGroup[] = [];
  const bfs = [...sp.bf].sort((a, b) => a - b);
  for (const grade of sp.flangeGrades)
    for (const t of [...sp.tf].sort((a, b) => a - b)) {
      const f = fy(grade, t, fySource, 'space.flangeThickness');
      const options = bfs
        .filter((b) => (sp.rules.bfOverTfMin === undefined || b / t >= sp.rules.bfOverTfMin) && (sp.rules.bfOverTfMax === undefined || b / t <= sp.rules.bfOverTfMax))
        .map((b) => ({ grade, t, b, fy: f, A: b * t }));
      if (options.length > 0) out.push({ grade, t, fy: f, options });
    }
  return out;
}

/** Number of candidates in the space before rules and bounds (the figure a user is shown). */
export function spaceSize(sp: SpaceSpec): number {
  const stiffLayouts = sp.panels.reduce((n, p) => n + (p === 0 ? 1 : sp.flats.length * sp.sides.length), 0);
  const webs = sp.webGrades.length * sp.hw.length * sp.tw.length * sp.endPosts.length * loadOptions(sp).length * stiffLayouts;
  const flanges = sp.flangeGrades.length * sp.tf.length * sp.bf.length;
  return webs * (sp.symmetric ? flanges : flanges * flanges);
}

export function assertSpace(sp: SpaceSpec): void {
  const lists: [string, unknown[]][] = [
    ['space.webDepth', sp.hw],
    ['space.webThickness', sp.tw],
    ['space.flangeWidth', sp.bf],
    ['space.flangeThickness', sp.tf],
    ['space.panels', sp.panels],
    ['space.endPost', sp.endPosts],
    ['space.loadStiffeners', loadOptions(sp)],
    ['space.grade', sp.webGrades],
    ['space.flangeGrade', sp.flangeGrades],
  ];
  for (const [field, l] of lists) {
    if (l.length === 0) throw new DomainError('EMPTY_SPACE', `${field} is empty`, 'give at least one value', field);
  }
  if (sp.panels.some((p) => p > 0) && sp.flats.length === 0) {
    throw new DomainError('EMPTY_SPACE', 'stiffened layouts are asked for but the flat-bar stock is empty', 'give flats or set panels to 0', 'space.flats');
  }
}
