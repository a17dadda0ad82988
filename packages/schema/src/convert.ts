import { DomainError, PLATE_THICKNESSES, type GradeName } from '@platesmith/catalogue';
import { FACTOR_SETS, defaultOptions, type CheckOptions, type Effects, type Section } from '@platesmith/checks';
import type { CheckOptionsJson } from './options.js';
import type { SectionJson } from './section.js';
import type { CheckEffectsInput } from './check-input.js';
import { LIMITS } from './limits.js';
import { toN, toNmm } from './units.js';

/** Public section JSON (mm) → internal Section. */
export function toSection(j: SectionJson): Section {
  const g = j.grade;
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
    endPost: j.endPost,
    bearing: j.bearing ? { bs: j.bearing.width, ts: j.bearing.thickness, e: j.bearing.spacing ?? Math.max(50, Math.floor((0.1 * j.web.depth) / 10) * 10 + 10) } : undefined,
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
    ...(s.bearing ? { bearing: { width: s.bearing.bs, thickness: s.bearing.ts, spacing: s.bearing.e } } : {}),
    grade: same ? s.grade.web : { web: s.grade.web, flanges: s.grade.top, stiffeners: s.grade.stiffener },
  };
}

/** Restraint positions from the JSON form, mm. */
function restraint(j: CheckOptionsJson['restraint'], L: number, field: string): CheckOptions['restraint'] {
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

export function toCheckOptions(j: CheckOptionsJson, supports: number[]): CheckOptions {
  const L = supports[supports.length - 1]!;
  return defaultOptions(L, {
    factors: typeof j.factors === 'string' ? FACTOR_SETS[j.factors] : j.factors,
    eta: j.eta,
    fySource: j.fySource,
    kFib: j.kFib,
    supports,
    restraint: restraint(j.restraint, L, 'options.restraint'),
    restraintBottom: restraint(j.bottomRestraint, L, 'options.bottomRestraint'),
    loadHeight: j.loadHeight,
    ltbMethod: j.ltbMethod,
    ltbModification: j.ltbModification,
    ...(j.weldThroats ? { weldThroats: [...j.weldThroats].sort((a, b) => a - b) } : {}),
    supportBearingLength: j.supportBearingLength,
    snipe: j.snipe,
  });
}

/**
 * Raw-effects check input → internal. Reactions default to the largest |VEd| given at each
 * support station. SLS demands from a UDL on the simply supported span:
 * E·I·δ(x) = w x (L³ − 2 L x² + x³)/24 and G·Av·δs(x) = w x (L − x)/2 (handbook closed forms).
 */
export function toCheckEffects(inp: CheckEffectsInput): { section: Section; effects: Effects; options: CheckOptions } {
  const L = inp.span;
  const section = toSection(inp.section);
  const options = toCheckOptions(inp.options, [0, L]);
  const stations = inp.effects.map((e) => ({ x: e.x, MEd: toNmm(e.M), VEd: toN(e.V) }));
  const forces = inp.effects.filter((e) => e.F !== undefined && e.F > 0).map((e) => ({ x: e.x, F: toN(e.F!), ss: e.ss ?? 0 }));
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
  return { section, effects: { stations, forces, reactions, sls }, options };
}

/** A flange thinner than any stock plate is almost always a typo; the caller decides to enforce it. */
export function assertStockThickness(t: number, field: string, stock: readonly number[] = PLATE_THICKNESSES): void {
  if (t < stock[0]!) {
    throw new DomainError('THINNER_THAN_STOCK', `${field} = ${t} mm is thinner than any stock plate (${stock[0]} mm)`, 'check the thickness (mm) or give your own plate stock', field, { t });
  }
}
