import { DomainError, PLATE_THICKNESSES, WELD_THROATS, type GradeName } from '@platesmith/catalogue';
import { FACTOR_SETS, defaultOptions, type CheckOptions, type Effects, type Section } from '@platesmith/checks';
import type { CheckOptionsJson } from './options.js';
import type { SectionJson } from './section.js';
import type { CheckEffectsInput } from './check-input.js';
import { LIMITS } from './limits.js';
import { toN, toNmm } from './units.js';

/** The positions (mm) of the lateral restraints of either flange given as positions (supports and continuous restraints excluded later). */
export function restraintPositions(o: Pick<CheckOptions, 'restraint' | 'restraintBottom'>): number[] {
  return [...new Set([...(o.restraint.kind === 'at' ? o.restraint.at : []), ...(o.restraintBottom.kind === 'at' ? o.restraintBottom.at : [])])].sort((a, b) => a - b);
}

/**
 * Public section JSON (mm) → internal Section. `forceXs`: the positions of the concentrated
 * forces (mm), where load-bearing stiffeners stand when the section has them without `at`;
 * `restraintXs`: the lateral restraints' positions, where restraint stiffeners stand likewise.
 */
export function toSection(j: SectionJson, forceXs: readonly number[] = [], restraintXs: readonly number[] = []): Section {
  const g = j.grade ?? 'S355';
  const grade =
    typeof g === 'string'
      ? { web: g, top: g, bot: g, stiffener: g }
      : { web: g.web, top: g.flanges, bot: g.flanges, stiffener: g.stiffeners ?? g.web };
  return {
    hw: j.web.depth,
    tw: j.web.thickness,
    top: { b: j.topFlange.width, t: j.topFlange.thickness },
    bot: { b: j.bottomFlange.width, t: j.bottomFlange.thickness },
    stiffeners: j.stiffeners ? { a: j.stiffeners.spacing, bs: j.stiffeners.width, ts: j.stiffeners.thickness, sides: j.stiffeners.sides } : null,
    endPost: j.endPost ?? 'rigid',
    bearing: j.bearing
      ? { bs: j.bearing.width, ts: j.bearing.thickness, e: j.bearing.spacing ?? Math.max(50, Math.floor((0.1 * j.web.depth) / 10) * 10 + 10), ...(j.bearing.pairs !== undefined && j.bearing.pairs !== 1 ? { pairs: j.bearing.pairs } : {}) }
      : undefined,
    ...(j.loadStiffeners ? { loadStiffeners: { bs: j.loadStiffeners.width, ts: j.loadStiffeners.thickness, xs: [...(j.loadStiffeners.at ?? forceXs)] } } : {}),
    ...(j.restraintStiffeners ? { restraintStiffeners: { bs: j.restraintStiffeners.width, ts: j.restraintStiffeners.thickness, xs: [...(j.restraintStiffeners.at ?? restraintXs)] } } : {}),
    grade: grade as Section['grade'] & { web: GradeName },
  };
}

/** Internal Section → public section JSON (mm). */
export function fromSection(s: Section): SectionJson {
  const same = s.grade.web === s.grade.top && s.grade.top === s.grade.bot && s.grade.stiffener === s.grade.web;
  return {
    web: { depth: s.hw, thickness: s.tw },
    topFlange: { width: s.top.b, thickness: s.top.t },
    bottomFlange: { width: s.bot.b, thickness: s.bot.t },
    stiffeners: s.stiffeners ? { spacing: s.stiffeners.a, width: s.stiffeners.bs, thickness: s.stiffeners.ts, sides: s.stiffeners.sides } : null,
    endPost: s.endPost,
    ...(s.bearing ? { bearing: { width: s.bearing.bs, thickness: s.bearing.ts, spacing: s.bearing.e, ...((s.bearing.pairs ?? 1) !== 1 ? { pairs: s.bearing.pairs } : {}) } } : {}),
    ...(s.loadStiffeners ? { loadStiffeners: { width: s.loadStiffeners.bs, thickness: s.loadStiffeners.ts, at: [...s.loadStiffeners.xs] } } : {}),
    ...(s.restraintStiffeners ? { restraintStiffeners: { width: s.restraintStiffeners.bs, thickness: s.restraintStiffeners.ts, at: [...s.restraintStiffeners.xs] } } : {}),
    grade: same ? s.grade.web : { web: s.grade.web, flanges: s.grade.top, stiffeners: s.grade.stiffener },
  };
}

/** Restraint positions from the JSON form, mm. */
function restraint(j: NonNullable<CheckOptionsJson['restraint']>, L: number, field: string): CheckOptions['restraint'] {
  if (j === 'continuous') return { kind: 'continuous' };
  if (j === 'supports') return { kind: 'at', at: [] };
  if ('spacing' in j) {
    // counted before the array is built (issue 16: a spacing of 0.01 mm was millions of stations)
    if (L / j.spacing > LIMITS.restraints) {
      throw new DomainError('TOO_MANY_STATIONS', `${field}.spacing = ${j.spacing} mm gives about ${Math.floor(L / j.spacing)} restraints over ${L} mm, over the limit of ${LIMITS.restraints}`, 'give the restraint spacing in mm (e.g. 3000)', `${field}.spacing`, { count: Math.floor(L / j.spacing), limit: LIMITS.restraints });
    }
    const at: number[] = [];
    for (let x = 0; x < L - 1e-6; x += j.spacing) at.push(x);
    at.push(L);
    return { kind: 'at', at };
  }
  return { kind: 'at', at: [...j.at].sort((a, b) => a - b) };
}

/**
 * One value the answer used without the input giving it: the field (its path in the request),
 * the value applied, and what it means for the result. Listed in every answer, so a checking
 * engineer sees the defaults without reading the code.
 */
export interface Assumption {
  field: string;
  value: string | number | boolean | number[];
  note: string;
}

/**
 * The check options of a request with every default applied (pure), and the list of the
 * defaults it applied. No default removes or weakens a check: a flange whose restraint is not
 * given is restrained laterally at the supports only.
 */
export function resolveOptions(j: CheckOptionsJson, supports: number[]): { options: CheckOptions; assumptions: Assumption[] } {
  const L = supports[supports.length - 1]!;
  const out: Assumption[] = [];
  const pick = <T,>(given: T | undefined, fallback: T, field: string, value: Assumption['value'], note: string): T => {
    if (given !== undefined) return given;
    out.push({ field: `options.${field}`, value, note });
    return fallback;
  };
  const factors = pick(j.factors, 'buildings' as const, 'factors', 'buildings', 'partial factors of EN 1993-1-1 for buildings: γM0 = 1.0, γM1 = 1.0, γM2 = 1.25 — not the bridge set (EN 1993-2: γM1 = 1.1); give "bridges" for a bridge');
  const top = pick(j.restraint, 'supports' as const, 'restraint', 'supports', 'top flange restrained laterally at the supports only: lateral-torsional buckling is checked over each span under sagging; give the bracing positions to shorten the segments');
  const bot = pick(j.bottomRestraint, 'supports' as const, 'bottomRestraint', 'supports', 'bottom flange restrained laterally at the supports only: lateral-torsional buckling is checked over each span under hogging');
  const loadHeight = pick(j.loadHeight, 'top-flange' as const, 'loadHeight', 'top-flange', 'gravity loads act at the top flange, above the shear centre (destabilising for lateral-torsional buckling)');
  const fySource = pick(j.fySource, 'product' as const, 'fySource', 'product', 'fy and fu by the thickness bands of the product standards (EN 10025-2/-4), not EN 1993-1-1 Table 3.1');
  const eta = pick(j.eta, 1.2, 'eta', 1.2, 'η of EN 1993-1-5 5.1(2), recommended value up to S460');
  const kFib = pick(j.kFib, 'auto' as const, 'kFib', 'auto', 'EN 1993-1-5 8(1): k = 0.4 where the plastic moment resistance is used, else 0.55');
  const ltbMethod = pick(j.ltbMethod, 'general' as const, 'ltbMethod', 'general', 'χLT by EN 1993-1-1 6.3.2.2 (general case, welded: curves c/d)');
  const ltbModification = pick(j.ltbModification, false, 'ltbModification', false, 'no modification factor f of 6.3.2.3(2)');
  const ends = pick(j.ltbEnds, { k: 1, kw: 1 }, 'ltbEnds', 'fork', 'each lateral-torsional buckling segment has fork ends: k = kw = 1 (free to rotate laterally and to warp)');
  const weldThroats = j.weldThroats ? [...j.weldThroats].sort((a, b) => a - b) : [...WELD_THROATS];
  if (!j.weldThroats) out.push({ field: 'options.weldThroats', value: [...WELD_THROATS], note: 'web-to-flange fillet throats chosen from this range, mm (the smallest that passes)' });
  const supportBearingLength = pick(j.supportBearingLength, 100, 'supportBearingLength', 100, 'stiff bearing length at the supports, mm');
  const snipe = pick(j.snipe, 20, 'snipe', 20, 'corner snipe of stiffeners at the web-to-flange welds, mm (reduces the bearing area)');
  const options = defaultOptions(L, {
    factors: typeof factors === 'string' ? FACTOR_SETS[factors] : factors,
    eta,
    fySource,
    kFib,
    supports,
    restraint: restraint(top, L, 'options.restraint'),
    restraintBottom: restraint(bot, L, 'options.bottomRestraint'),
    loadHeight,
    ltbMethod,
    ltbModification,
    ...(ends.k !== 1 || ends.kw !== 1 ? { ltbEnds: { k: ends.k, kw: ends.kw } } : {}),
    weldThroats,
    supportBearingLength,
    snipe,
  });
  return { options, assumptions: out };
}

export function toCheckOptions(j: CheckOptionsJson, supports: number[]): CheckOptions {
  return resolveOptions(j, supports).options;
}

/** What the tool does when bearing stiffeners are not given (checks' sizeBearing). */
export const BEARING_SIZING_NOTE =
  'bearing stiffeners sized by the tool: the lightest pair of stock flats that passes end post (9.3.1), bearing stiffener (9.4) and torsion (9.2.1(8)); when none does, the least steel of flats and plates of the plate stock, 1 to 3 pairs side by side over each support, within the flange outstand, that passes them';

/** The defaults a section of the request took (end post, grade, stiffeners, bearing stiffeners). */
export function sectionAssumptions(j: SectionJson, field = 'section'): Assumption[] {
  const out: Assumption[] = [];
  if (j.endPost === undefined) out.push({ field: `${field}.endPost`, value: 'rigid', note: 'rigid end posts (EN 1993-1-5 5.3, 9.3.1): two double-sided stiffeners at each end support' });
  if (j.grade === undefined) out.push({ field: `${field}.grade`, value: 'S355', note: 'every plate S355' });
  if (j.stiffeners === undefined) out.push({ field: `${field}.stiffeners`, value: 'none', note: 'no intermediate transverse stiffeners (bearing stiffeners at the supports only)' });
  if (j.bearing === undefined) out.push({ field: `${field}.bearing`, value: 'sized', note: BEARING_SIZING_NOTE });
  if (j.restraintStiffeners && j.restraintStiffeners.at === undefined) out.push({ field: `${field}.restraintStiffeners.at`, value: 'at every lateral restraint', note: 'a stiffener pair at each lateral restraint of either flange inside the girder, carrying the restraint force (EN 1993-1-1 5.3.3(4))' });
  if (j.loadStiffeners && j.loadStiffeners.at === undefined) out.push({ field: `${field}.loadStiffeners.at`, value: 'under every concentrated force', note: 'a load-bearing stiffener pair under each concentrated force (EN 1993-1-5 9.4), fitted to the loaded flange' });
  return out;
}

/**
 * Raw-effects check input → internal. Reactions default to the largest |VEd| given at each
 * support station. SLS demands from a UDL on the simply supported span:
 * E·I·δ(x) = w x (L³ − 2 L x² + x³)/24 and G·Av·δs(x) = w x (L − x)/2 (handbook closed forms).
 */
export function toCheckEffects(inp: CheckEffectsInput): { section: Section; effects: Effects; options: CheckOptions; assumptions: Assumption[] } {
  const L = inp.span;
  const { options, assumptions } = resolveOptions(inp.options, [0, L]);
  const stations = inp.effects.map((e) => ({ x: e.x, MEd: toNmm(e.M), VEd: toN(e.V) }));
  const forces = inp.effects.filter((e) => e.F !== undefined && e.F > 0).map((e) => ({ x: e.x, F: toN(e.F!), ss: e.ss ?? 0 }));
  const section = toSection(inp.section, forces.map((f) => f.x), restraintPositions(options));
  const reactions =
    inp.reactions?.map((r) => ({ x: r.x, R: toN(r.R) })) ??
    [0, L].map((x) => ({ x, R: Math.max(0, ...stations.filter((s) => Math.abs(s.x - x) < 1e-6).map((s) => Math.abs(s.VEd))) }));
  const n = 40;
  const sls = (inp.sls ?? []).map((d) => ({
    name: d.name,
    ratio: d.ratio,
    points: Array.from({ length: n + 1 }, (_, i) => {
      const x = (L * i) / n;
      return { x, bend: (d.udl * x * (L ** 3 - 2 * L * x * x + x ** 3)) / 24, shear: (d.udl * x * (L - x)) / 2 };
    }),
  }));
  if (inp.reactions === undefined) assumptions.push({ field: 'reactions', value: 'from VEd', note: 'support reactions taken as the largest |VEd| given at each support station' });
  return { section, effects: { stations, forces, reactions, sls }, options, assumptions: [...assumptions, ...sectionAssumptions(inp.section)] };
}

/** A flange thinner than any stock plate is almost always a typo; the caller decides to enforce it. */
export function assertStockThickness(t: number, field: string, stock: readonly number[] = PLATE_THICKNESSES): void {
  if (t < stock[0]!) {
    throw new DomainError('THINNER_THAN_STOCK', `${field} = ${t} mm is thinner than any stock plate (${stock[0]} mm)`, 'check the thickness (mm) or give your own plate stock', field, { t });
  }
}
