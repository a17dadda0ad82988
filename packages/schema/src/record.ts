import { createHash } from 'node:crypto';
import { psiFor, summarise } from '@platesmith/actions';
import { STEEL_DENSITY } from '@platesmith/catalogue';
import { checkGirder, grossProps, material, girderMass, type CheckOptions, type GirderVerdict, type Section } from '@platesmith/checks';
import { z } from 'zod';
import { CheckEffectsInput } from './check-input.js';
import { parseWith, type Parsed } from './parse.js';
import { CAUTION, SCOPE } from './caution.js';
import { BEARING_SIZING_NOTE, fromSection, toCheckEffects } from './convert.js';
import { CheckOptionsJson } from './options.js';
import { publishVerdict, roundPublished, type PublishedVerdict } from './output.js';
import { CheckProblemInput, toCheckProblem, runCheckJob } from './problem-convert.js';
import type { SectionJson } from './section.js';
import { fromN, fromNmm } from './units.js';

/** The tool's version printed on every page of a record (kept with the workspace's packages' version). */
export const TOOL_VERSION = '0.1.0';

/** The editions the checks were written to (printed on every page of a record). */
export const EDITIONS = [
  'EN 1990:2002+A1:2005',
  'EN 1993-1-1:2005+A1:2014',
  'EN 1993-1-5:2006+AC:2009',
  'EN 1993-1-8:2005+AC:2009',
  'EN 10025-2:2004',
] as const;

/** Title block of a calculation record: every field as given, null where not given. */
export interface RecordTitle {
  project: string | null;
  mark: string | null;
  revision: string | null;
  preparedBy: string | null;
  checkedBy: string | null;
  date: string | null;
}

export const TITLE_FIELDS = ['project', 'mark', 'revision', 'preparedBy', 'checkedBy', 'date'] as const;

const text = (what: string) => z.string().max(200).meta({ description: what });

/** The title block of a record as the input gives it (`"title"` beside the check input); every field optional. */
export const RecordTitleJson = z
  .strictObject({
    project: text('project name').optional(),
    mark: text('girder mark').optional(),
    revision: text('revision, e.g. "P01" or "C"').optional(),
    preparedBy: text('who prepared the calculation').optional(),
    checkedBy: text('who checked it').optional(),
    date: text('date as it should be printed').optional(),
  })
  .meta({ id: 'RecordTitle', description: 'title block of a calculation record; fields left out print blank' });

export interface RecordRequest {
  check: CheckEffectsInput | CheckProblemInput;
  title: Partial<RecordTitle>;
  /** the check input as given, without the title (hashed on every page) */
  raw: unknown;
}

/**
 * A record request: a check input (raw effects when it has "effects", else a problem with its
 * section) with an optional "title" block. Issues name their fields as for a check.
 */
export function parseRecordRequest(body: unknown): Parsed<RecordRequest> {
  if (body === null || typeof body !== 'object' || Array.isArray(body)) return parseWith(CheckProblemInput, body) as Parsed<never>;
  const { title, ...raw } = body as Record<string, unknown>;
  const t = parseWith(RecordTitleJson.default({}), title);
  if (!t.ok) return { ok: false, issues: t.issues.map((i) => ({ ...i, path: i.path ? `title.${i.path}` : 'title', pointer: `#/title${i.pointer.slice(1)}` })) };
  const isRaw = Object.prototype.hasOwnProperty.call(raw, 'effects');
  const c = isRaw ? parseWith(CheckEffectsInput, raw) : parseWith(CheckProblemInput, raw);
  if (!c.ok) return c;
  return { ok: true, value: { check: c.value, title: t.value, raw } };
}

/** One action of the design basis in public units, with its ψ and where they come from. */
export interface RecordAction {
  name: string;
  kind: 'permanent' | 'variable';
  load: 'udl' | 'partial-udl' | 'point';
  /** kN/m (udl, partial-udl) or kN (point) */
  value: number;
  unit: 'kN/m' | 'kN';
  /** mm */
  at?: number;
  from?: number;
  to?: number;
  category: string | null;
  psi0: number | null;
  psi1: number | null;
  psi2: number | null;
  psiSource: string | null;
}

/**
 * Everything a calculation record of one girder prints, in public units (mm, kN, kNm, MPa, kg):
 * the report package renders it and computes nothing.
 */
export interface RecordData {
  title: RecordTitle;
  tool: { name: 'Platesmith'; version: string };
  editions: readonly string[];
  /** SHA-256 of the canonical JSON of the input (keys sorted), hex */
  inputHash: string;
  basis: {
    /** 'problem': spans and actions analysed here; 'envelope': the user's own analysis; 'effects': design effects given at stations */
    form: 'problem' | 'envelope' | 'effects';
    /** mm */
    length: number;
    spans: number[];
    supports: number[];
    supportsText: string;
    actions: RecordAction[];
    /** e.g. 'EN 1990 eq. 6.10' */
    combination: string | null;
    combinationFactors: { gammaGsup: number; gammaGinf: number; gammaQ: number; xi: number } | null;
    /** labels of the ULS combinations analysed */
    combinations: string[];
    factorSet: string;
    gammaM0: number;
    gammaM1: number;
    gammaM2: number;
    eta: number;
    restraintTop: string;
    restraintBottom: string;
    loadHeight: string;
    ltbMethod: string;
    grades: { web: string; flanges: string; stiffeners: string };
    fySource: string;
    deflectionLimits: { name: string; ratio: number }[];
    /** kN/m; null when the effects were given */
    selfWeight: number | null;
    /** every value the tool took by default, in words */
    assumptions: string[];
  };
  analysis: {
    /** per station x (mm): the envelope of MEd (kNm) and VEd (kN) over the combinations */
    stations: { x: number; MEdMax: number; MEdMin: number; VEdMax: number; VEdMin: number }[];
    /** kNm, kN, with the label of the combination that gives each */
    extremes: { MEdMax: number; MEdMin: number; VEdMax: number; at: { MEdMax: number; MEdMin: number; VEdMax: number }; governing: { MEdMax: string; MEdMin: string; VEdMax: string } | null };
    /** design reactions, kN */
    reactions: { x: number; R: number }[];
    /** concentrated design forces through the top flange, kN, ss mm */
    forces: { x: number; F: number; ss: number }[];
    /** deflection checks: mm */
    deflection: { name: string; delta: number; limit: number; ratio: number; at: number | null; utilisation: number | null }[];
  };
  section: {
    json: SectionJson;
    /** the plates in words */
    plates: string[];
    /** mm, mm², mm⁴, mm⁶, MPa, kNm, kg/m, kg */
    properties: {
      h: number;
      A: number;
      Iy: number;
      Iz: number;
      It: number;
      Iw: number;
      zElastic: number;
      zPlastic: number;
      zShear: number;
      Wel: number;
      fyw: number;
      fyTop: number;
      fyBot: number;
      MplRk: number;
      MelRk: number;
      massPerMetre: number;
      mass: number;
    };
    classes: { sign: string; section: number; flange: number; web: number }[];
    bearing: { width: number; thickness: number; pairs: number; sized: boolean };
  };
  verdict: PublishedVerdict;
  /** utilisation at every station of the checks judged station by station (-) */
  alongSpan: { x: number; bending: number; shear: number }[];
  caution: string;
  scope: string;
}

/** Canonical JSON (object keys sorted) hashed with SHA-256: the same input gives the same hash whatever its key order. */
export function inputHash(input: unknown): string {
  const canon = (v: unknown): unknown => {
    if (Array.isArray(v)) return v.map(canon);
    if (v !== null && typeof v === 'object') return Object.fromEntries(Object.keys(v as object).sort().map((k) => [k, canon((v as Record<string, unknown>)[k])]));
    return v;
  };
  return createHash('sha256').update(JSON.stringify(canon(input))).digest('hex');
}

const r = roundPublished;

function restraintText(j: CheckOptionsJson['restraint'] = 'supports'): string {
  if (j === 'continuous') return 'continuous (no lateral-torsional buckling for the sign that compresses this flange)';
  if (j === 'supports') return 'at the supports only';
  if ('spacing' in j) return `at ${j.spacing} mm spacing from the left end`;
  return `at x = ${j.at.join(', ')} mm`;
}

const LOAD_HEIGHT: Record<string, string> = {
  'top-flange': 'on the top flange (destabilising)',
  'shear-centre': 'at the shear centre',
  'bottom-flange': 'on the bottom flange (stabilising)',
};

/** Words for every option the input left to its default (the raw input is read to tell them apart). */
function defaultsTaken(rawOptions: unknown, parsed: CheckOptionsJson, o: CheckOptions): string[] {
  const given = rawOptions !== null && typeof rawOptions === 'object' ? (rawOptions as Record<string, unknown>) : {};
  const out: string[] = [];
  const say: Record<string, () => string> = {
    factors: () => `partial factors: the "buildings" set (γM0 = ${o.factors.gammaM0}, γM1 = ${o.factors.gammaM1}, γM2 = ${o.factors.gammaM2}; EN 1993-1-1 6.1 recommended values)`,
    eta: () => `η = ${o.eta} (EN 1993-1-5 5.1(2) recommended value up to S460)`,
    fySource: () => 'fy and fu by the thickness bands of the product standard (EN 10025)',
    kFib: () => 'k of EN 1993-1-5 8(1) from the moment resistance used (0.4 plastic, 0.55 elastic)',
    restraint: () => `top flange restraint: ${restraintText(parsed.restraint)}`,
    bottomRestraint: () => `bottom flange restraint: ${restraintText(parsed.bottomRestraint)}`,
    loadHeight: () => `load height: ${LOAD_HEIGHT[parsed.loadHeight ?? 'top-flange'] ?? parsed.loadHeight}`,
    ltbMethod: () => 'lateral-torsional buckling by EN 1993-1-1 6.3.2.2 (general case)',
    ltbModification: () => 'no modification factor f (EN 1993-1-1 6.3.2.3(2))',
    weldThroats: () => `fillet weld throats chosen from ${o.weldThroats.join(', ')} mm`,
    supportBearingLength: () => `stiff bearing length at the supports ss = ${o.supportBearingLength} mm`,
    snipe: () => `stiffener corner snipes ${o.snipe} mm`,
  };
  for (const [k, text] of Object.entries(say)) if (given[k] === undefined) out.push(text());
  return out;
}

function platesInWords(s: SectionJson, grades: { web: string; flanges: string; stiffeners: string }, bearing: { width: number; thickness: number; spacing?: number | undefined; pairs?: number | undefined }): string[] {
  const out = [
    `web plate ${s.web.depth} mm deep × ${s.web.thickness} mm thick, ${grades.web}`,
    `top flange plate ${s.topFlange.width} mm wide × ${s.topFlange.thickness} mm thick, ${grades.flanges}`,
    `bottom flange plate ${s.bottomFlange.width} mm wide × ${s.bottomFlange.thickness} mm thick, ${grades.flanges}`,
  ];
  const st = s.stiffeners;
  out.push(
    st
      ? `intermediate transverse stiffeners: flats ${st.width} mm × ${st.thickness} mm, ${st.sides === 2 ? 'both faces' : 'one face'} of the web, at ${st.spacing} mm, ${grades.stiffeners}`
      : 'no intermediate transverse stiffeners',
  );
  const ls = s.loadStiffeners;
  if (ls) out.push(`load-bearing stiffeners under the concentrated forces: flats ${ls.width} mm × ${ls.thickness} mm on both faces, fitted to the loaded flange, at ${ls.at && ls.at.length > 0 ? ls.at.map((x) => `${x} mm`).join(', ') : 'no position (no concentrated force)'}, ${grades.stiffeners}`);
  const rs = s.restraintStiffeners;
  if (rs) out.push(`stiffeners at the lateral restraints: flats ${rs.width} mm × ${rs.thickness} mm on both faces, at ${rs.at && rs.at.length > 0 ? rs.at.map((x) => `${x} mm`).join(', ') : 'no position (no lateral restraint inside the girder)'}, ${grades.stiffeners}`);
  out.push(
    `bearing stiffeners at the supports: ${(bearing.pairs ?? 1) > 1 ? `${bearing.pairs} pairs side by side over each support of ` : ''}flats ${bearing.width} mm × ${bearing.thickness} mm on both faces${s.endPost === 'rigid' ? `, and one more pair ${bearing.spacing ?? '?'} mm from each end (rigid end post)` : ' (non-rigid end post)'}`,
  );
  return out;
}

interface Built {
  section: Section;
  options: CheckOptions;
  verdict: GirderVerdict;
  stations: { x: number; MEd: number; VEd: number }[];
  reactions: { x: number; R: number }[];
  forces: { x: number; F: number; ss: number }[];
  supports: number[];
  g: number | null;
  governing: { MEdMax: string; MEdMin: string; VEdMax: string } | null;
  combinations: string[];
}

function build(input: CheckEffectsInput | CheckProblemInput): Built {
  if ('effects' in input) {
    const { section, effects, options } = toCheckEffects(input);
    return { section, options, verdict: checkGirder(section, effects, options), stations: effects.stations, reactions: effects.reactions, forces: effects.forces, supports: [0, input.span], g: null, governing: null, combinations: [] };
  }
  const job = toCheckProblem(input);
  const s = summarise(job.analysis, job.g);
  return {
    section: job.section,
    options: job.options,
    verdict: runCheckJob(job),
    stations: job.effects.stations,
    reactions: s.reactions,
    forces: job.effects.forces,
    supports: job.options.supports,
    g: job.analysis.kind === 'envelope' ? null : job.g,
    governing: job.analysis.kind === 'envelope' ? null : s.governing,
    combinations: job.analysis.combinations,
  };
}

/**
 * The calculation record of one girder from a parsed check input (raw effects or a problem):
 * the check itself, the analysis it read, the section's properties and the design basis with
 * every default taken. `raw` is the input as given (for the hash and to tell defaults apart).
 */
export function publishRecord(input: CheckEffectsInput | CheckProblemInput, raw: unknown, title: Partial<RecordTitle> = {}): RecordData {
  const b = build(input);
  const { section, options } = b;
  const rawObj = raw !== null && typeof raw === 'object' ? (raw as Record<string, unknown>) : {};
  const m = material(section, options);
  const gp = grossProps(section, m);
  const L = b.supports[b.supports.length - 1]! - b.supports[0]!;
  const bearing = b.verdict.bearing;
  const mass = girderMass(section, L, b.supports, bearing);
  const verdict = publishVerdict(b.verdict);
  const sj = fromSection({ ...section, bearing });
  const grades = { web: section.grade.web, flanges: section.grade.top === section.grade.bot ? section.grade.top : `${section.grade.top} (top) / ${section.grade.bot} (bottom)`, stiffeners: section.grade.stiffener };

  // envelope per station x
  const byX = new Map<number, { x: number; MEdMax: number; MEdMin: number; VEdMax: number; VEdMin: number }>();
  for (const st of b.stations) {
    const M = fromNmm(st.MEd);
    const V = fromN(st.VEd);
    const e = byX.get(st.x);
    if (!e) byX.set(st.x, { x: st.x, MEdMax: M, MEdMin: M, VEdMax: V, VEdMin: V });
    else {
      e.MEdMax = Math.max(e.MEdMax, M);
      e.MEdMin = Math.min(e.MEdMin, M);
      e.VEdMax = Math.max(e.VEdMax, V);
      e.VEdMin = Math.min(e.VEdMin, V);
    }
  }
  const stations = [...byX.values()].sort((p, q) => p.x - q.x);
  let iMax = 0;
  let iMin = 0;
  let iV = 0;
  stations.forEach((s, i) => {
    if (s.MEdMax > stations[iMax]!.MEdMax) iMax = i;
    if (s.MEdMin < stations[iMin]!.MEdMin) iMin = i;
    if (Math.max(Math.abs(s.VEdMax), Math.abs(s.VEdMin)) > Math.max(Math.abs(stations[iV]!.VEdMax), Math.abs(stations[iV]!.VEdMin))) iV = i;
  });

  // utilisation along the span of the checks judged at each station on their own: bending
  // |MEd|/Mc,Rd of the sign (the bending check's own resistances) and plastic shear |VEd|/Vpl,Rd
  const bend = b.verdict.checks.find((c) => c.id === 'bending');
  const shear = b.verdict.checks.find((c) => c.id === 'shear');
  const McRd = (sign: 'sagging' | 'hogging'): number => {
    const v = bend?.values[`McRd_${sign}`];
    return typeof v === 'number' ? v : Number.NaN;
  };
  const VplRd = typeof shear?.values.VplRd === 'number' ? shear.values.VplRd : Number.NaN;
  const alongSpan = stations.map((s) => {
    const sag = s.MEdMax > 0 ? (s.MEdMax * 1e6) / McRd('sagging') : 0;
    const hog = s.MEdMin < 0 ? (-s.MEdMin * 1e6) / McRd('hogging') : 0;
    const V = Math.max(Math.abs(s.VEdMax), Math.abs(s.VEdMin)) * 1e3;
    return { x: s.x, bending: Math.round(Math.max(sag, hog) * 1e4) / 1e4, shear: Math.round((V / VplRd) * 1e4) / 1e4 };
  });

  const classes = ['sagging', 'hogging']
    .map((sign) => {
      const c = b.verdict.checks.find((k) => k.id === 'classification');
      const v = c?.values ?? {};
      const sec = v[`sectionClass_${sign}`];
      if (typeof sec !== 'number') return null;
      const fl = v[`flangeClass_${sign}`];
      const web = v[`webClass_${sign}`];
      return { sign, section: sec, flange: typeof fl === 'number' ? fl : sec, web: typeof web === 'number' ? web : sec };
    })
    .filter((c): c is NonNullable<typeof c> => c !== null);

  const optionsRaw = rawObj.options;
  const parsedOptions = input.options;
  const assumptions = defaultsTaken(optionsRaw, parsedOptions, options);
  if (section.stiffeners === null) assumptions.push('no intermediate transverse stiffeners: web panels run from support to support');
  if (b.verdict.bearingSized) assumptions.push(`bearing stiffeners not given: sized by the tool (${(bearing.pairs ?? 1) > 1 ? `${bearing.pairs} pairs of ` : ''}${bearing.bs} × ${bearing.ts} mm): ${BEARING_SIZING_NOTE.replace(/^bearing stiffeners sized by the tool: /, '')}`);
  if (!('effects' in input) && input.envelope === undefined) {
    if (input.factors === undefined) assumptions.push('EN 1990 Table A1.2(B) recommended factors γG,sup = 1.35, γG,inf = 1.00, γQ = 1.50, ξ = 0.85');
    if (rawObj.combination === undefined) assumptions.push('combination by EN 1990 eq. 6.10');
    if (input.deflection === undefined) assumptions.push('deflection limits span/250 (total) and span/360 (variable), characteristic combination (common practice)');
    assumptions.push(`self-weight of the web, flanges and intermediate stiffeners added as a permanent action (density ${STEEL_DENSITY} kg/m³)`);
    if ((input.actions ?? []).some((a) => a.load === 'point' && a.ss === undefined)) assumptions.push('stiff bearing length of point loads ss = 100 mm where not given');
  }
  if ('effects' in input) {
    if (input.reactions === undefined) assumptions.push('support reactions taken as the largest |VEd| given at each support');
    if (input.sls === undefined) assumptions.push('no deflection limit checked (no SLS load given)');
  }

  const actions: RecordAction[] = 'effects' in input || input.envelope !== undefined
    ? []
    : (input.actions ?? []).map((a, i) => {
        let psi: { psi0: number | null; psi1: number | null; psi2: number | null } = { psi0: null, psi1: null, psi2: null };
        let psiSource: string | null = null;
        if (a.kind === 'variable') {
          const cat = a.category ? psiFor(a.category, `actions[${i}].category`) : null;
          psi = { psi0: a.psi0 ?? cat?.psi0 ?? null, psi1: a.psi1 ?? cat?.psi1 ?? null, psi2: a.psi2 ?? cat?.psi2 ?? null };
          psiSource = a.category ? `EN 1990 Table A1.1, category ${a.category}${a.psi0 !== undefined || a.psi1 !== undefined || a.psi2 !== undefined ? ' (overridden where given)' : ''}` : 'given';
        }
        const out: RecordAction = {
          name: a.name ?? `${a.kind} ${a.load} ${i + 1}`,
          kind: a.kind,
          load: a.load,
          value: a.value,
          unit: a.load === 'point' ? 'kN' : 'kN/m',
          category: a.category ?? null,
          ...psi,
          psiSource,
        };
        if (a.at !== undefined) out.at = a.at;
        if (a.from !== undefined) out.from = a.from;
        if (a.to !== undefined) out.to = a.to;
        return out;
      });

  const isProblem = !('effects' in input) && input.envelope === undefined;
  const cf = isProblem ? (input as CheckProblemInput).factors : undefined;
  const combo = isProblem ? (input as CheckProblemInput).combination : null;
  const factorSet = typeof parsedOptions.factors === 'string' ? parsedOptions.factors : 'given';

  const deflection = b.verdict.checks
    .filter((c) => c.id === 'deflection' && c.applies)
    .map((c) => ({ name: String(c.values.name ?? ''), delta: r(Number(c.values.delta)), limit: r(Number(c.values.limit)), ratio: Number(c.values.ratio), at: c.at, utilisation: Number.isFinite(c.utilisation) ? Math.round(c.utilisation * 1e4) / 1e4 : null }));

  const fyName = options.fySource === 'product' ? 'EN 10025-2 (product standard thickness bands)' : 'EN 1993-1-1 Table 3.1';
  return {
    title: {
      project: title.project ?? null,
      mark: title.mark ?? null,
      revision: title.revision ?? null,
      preparedBy: title.preparedBy ?? null,
      checkedBy: title.checkedBy ?? null,
      date: title.date ?? null,
    },
    tool: { name: 'Platesmith', version: TOOL_VERSION },
    editions: EDITIONS,
    inputHash: inputHash(raw),
    basis: {
      form: 'effects' in input ? 'effects' : input.envelope !== undefined ? 'envelope' : 'problem',
      length: L,
      spans: b.supports.slice(1).map((x, i) => x - b.supports[i]!),
      supports: b.supports,
      supportsText: b.supports.length === 2 ? 'simply supported at both ends' : `continuous over ${b.supports.length - 2} inner support${b.supports.length > 3 ? 's' : ''}, simply supported ends`,
      actions,
      combination: combo === null ? null : combo === '6.10' ? 'EN 1990 eq. 6.10' : 'EN 1990 the less favourable of eq. 6.10a and 6.10b',
      combinationFactors: isProblem ? { gammaGsup: cf?.gammaGsup ?? 1.35, gammaGinf: cf?.gammaGinf ?? 1.0, gammaQ: cf?.gammaQ ?? 1.5, xi: cf?.xi ?? 0.85 } : null,
      combinations: b.combinations,
      factorSet,
      gammaM0: options.factors.gammaM0,
      gammaM1: options.factors.gammaM1,
      gammaM2: options.factors.gammaM2,
      eta: options.eta,
      restraintTop: restraintText(parsedOptions.restraint),
      restraintBottom: restraintText(parsedOptions.bottomRestraint),
      loadHeight: LOAD_HEIGHT[parsedOptions.loadHeight ?? 'top-flange'] ?? parsedOptions.loadHeight ?? 'top-flange',
      ltbMethod: options.ltbMethod === 'general' ? 'EN 1993-1-1 6.3.2.2 (general case)' : `EN 1993-1-1 6.3.2.3 (rolled sections or equivalent welded)${options.ltbModification ? ' with f' : ''}`,
      grades,
      fySource: fyName,
      // every limit asked for (the deflection check reports the one that governs)
      deflectionLimits:
        'effects' in input
          ? (input.sls ?? []).map((d) => ({ name: d.name, ratio: d.ratio }))
          : input.envelope !== undefined
            ? []
            : (input.deflection ?? [{ name: 'total', ratio: 250 }, { name: 'variable', ratio: 360 }]).map((d) => ({ name: d.name, ratio: d.ratio })),
      selfWeight: b.g === null ? null : r(fromN(b.g) * 1e3),
      assumptions,
    },
    analysis: {
      stations: stations.map((s) => ({ x: r(s.x), MEdMax: r(s.MEdMax), MEdMin: r(s.MEdMin), VEdMax: r(s.VEdMax), VEdMin: r(s.VEdMin) })),
      extremes: {
        MEdMax: r(stations[iMax]!.MEdMax),
        MEdMin: r(stations[iMin]!.MEdMin),
        VEdMax: r(Math.max(Math.abs(stations[iV]!.VEdMax), Math.abs(stations[iV]!.VEdMin))),
        at: { MEdMax: stations[iMax]!.x, MEdMin: stations[iMin]!.x, VEdMax: stations[iV]!.x },
        governing: b.governing,
      },
      reactions: b.reactions.map((x) => ({ x: x.x, R: r(fromN(x.R)) })),
      forces: b.forces.map((f) => ({ x: f.x, F: r(fromN(f.F)), ss: f.ss })),
      deflection,
    },
    section: {
      json: sj,
      plates: platesInWords(sj, grades, sj.bearing ?? { width: bearing.bs, thickness: bearing.ts, spacing: bearing.e, pairs: bearing.pairs }),
      properties: {
        h: gp.h,
        A: r(gp.A),
        Iy: r(gp.Iy),
        Iz: r(gp.Iz),
        It: r(gp.It),
        Iw: r(gp.Iw),
        zElastic: r(gp.zElastic),
        zPlastic: r(gp.zPlastic),
        zShear: r(gp.zShear),
        Wel: r(gp.Iy / Math.max(gp.zElastic, gp.h - gp.zElastic)),
        fyw: m.fyw,
        fyTop: m.fyTop,
        fyBot: m.fyBot,
        MplRk: r(fromNmm(gp.Mpl)),
        MelRk: r(fromNmm(gp.Mel)),
        massPerMetre: r(mass.perMetre),
        mass: r(mass.total),
      },
      classes,
      bearing: { width: bearing.bs, thickness: bearing.ts, pairs: bearing.pairs ?? 1, sized: b.verdict.bearingSized },
    },
    verdict,
    alongSpan,
    caution: CAUTION,
    scope: SCOPE,
  };
}
