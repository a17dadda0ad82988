import type { CheckResult } from './types.js';

/**
 * The check registry: one entry per check of the library, and every ordering, partition and unit
 * map derived from it. Adding a check is one entry here plus its function (and its thunk in the
 * family named by `family`); nothing else keeps a list of check ids.
 *
 * The entries are in report order (the order of `checks` in a verdict; check ids are a public
 * contract). `judge` orders the early-stopping judge (firstFailure): lower first.
 */

/**
 * What a check reads besides the options (national-annex values, supports, restraints):
 * - `web`: the web plate (hw, tw, its grade)
 * - `flanges`: the flange plates (b, t, their grades)
 * - `panels`: the panel layout: intermediate stiffener positions, whether load-bearing stiffeners
 *   stand under the concentrated forces (they are panel boundaries too, and take the forces off
 *   patch loading and the web-to-flange welds) and the end-post type
 * - `flats`: the intermediate stiffener flats (bs, ts, sides)
 * - `loadFlats`: the load-bearing stiffener flats (bs, ts) under the concentrated forces
 * - `restraintFlats`: the stiffener pairs at lateral restraints (bs, ts, positions); not part of
 *   the panel layout, and one choice for a whole search space (not a layout choice)
 * - `bearing`: the bearing stiffeners over the supports (sized from the flats when not given)
 * - `loads`: the design effects (stations, forces, reactions, deflection points)
 */
export type CheckInput = 'web' | 'flanges' | 'panels' | 'flats' | 'loadFlats' | 'restraintFlats' | 'bearing' | 'loads';

/**
 * Unit of a value as the check library reports it (internal units: N, N·mm, N/mm, mm, MPa);
 * '-' a ratio or count; 'text' a value that is not a number (a word or a flag). The schema
 * converts each to the trade's unit at the boundary (N → kN, N·mm → kNm, N/mm = kN/m).
 */
export type ReportedUnit = 'N' | 'Nmm' | 'N/mm' | 'mm' | 'mm2' | 'mm3' | 'mm4' | 'MPa' | '-' | 'text';

/** The family whose thunks compute the check (shared intermediates are computed once per family). */
export type CheckFamily = 'bending' | 'shear';

export interface CheckSpec {
  id: string;
  /** the clause the result names */
  clause: string;
  /** other clauses the result may name instead (a variant or a clause that rules it out) */
  alsoClauses?: readonly string[];
  family: CheckFamily;
  reads: readonly CheckInput[];
  /** rank in the judging order (lower tried first): the checks that fail most often near the optimum, and the cheap ones, first; those that read the bearing stiffeners last, since sizing them costs a few checks of its own */
  judge: number;
  /** where the check is computed: file under packages/checks/src and the exported function */
  file: string;
  fn: string;
  /** the clause-level functions beneath the check (file defaults to the entry's), for the clause index */
  beneath?: readonly { clause: string; fn: string; file?: string }[];
  /** every key the check may put in `values`, with its unit */
  values: Readonly<Record<string, ReportedUnit>>;
  /**
   * For a check that reads bearing or loads in general but fails from the web and its
   * intermediate stiffeners alone in some results: true for such a failed result.
   */
  webOnlyWhen?: (r: CheckResult) => boolean;
}

const perSign = <U extends ReportedUnit>(key: string, unit: U): Record<string, U> => ({ [`${key}_sagging`]: unit, [`${key}_hogging`]: unit });

export const CHECKS = [
  {
    id: 'classification',
    clause: 'EN 1993-1-1 5.5, Table 5.2',
    family: 'bending',
    reads: ['web', 'flanges', 'loads'],
    judge: 130,
    file: 'en1993-1-1/bending-family.ts',
    fn: 'classificationCheck',
    beneath: [
      { clause: 'EN 1993-1-1 Table 5.2 (outstand flanges)', fn: 'classifyOutstand', file: 'en1993-1-1/classification.ts' },
      { clause: 'EN 1993-1-1 Table 5.2 (webs in bending and compression)', fn: 'classifyWebBendingCompression', file: 'en1993-1-1/classification.ts' },
    ],
    values: {
      sectionClass: '-',
      flangeClass: '-',
      webClass: '-',
      cOverTflange: '-',
      cOverTweb: '-',
      alpha: '-',
      psi: '-',
      sign: 'text',
      weldThroatInC: 'mm',
      webC: 'text',
      ...perSign('sectionClass', '-'),
      ...perSign('flangeClass', '-'),
      ...perSign('webClass', '-'),
    },
  },
  {
    id: 'bending',
    clause: 'EN 1993-1-1 6.2.5; EN 1993-1-5 4.3, 4.4',
    family: 'bending',
    reads: ['web', 'flanges', 'loads'],
    judge: 40,
    file: 'en1993-1-1/bending.ts',
    fn: 'bendingCheck',
    beneath: [
      { clause: 'EN 1993-1-1 6.2.5', fn: 'bendingForSign' },
      { clause: 'EN 1993-1-5 4.3, 4.4', fn: 'effectiveSection', file: 'en1993-1-5/effective-section.ts' },
      { clause: 'EN 1993-1-5 4.4(2) eq. 4.3', fn: 'lambdaP', file: 'en1993-1-5/effective-section.ts' },
      { clause: 'EN 1993-1-5 Table 4.1', fn: 'kSigmaInternal', file: 'en1993-1-5/effective-section.ts' },
      { clause: 'EN 1993-1-5 Table 4.2', fn: 'kSigmaOutstand', file: 'en1993-1-5/effective-section.ts' },
    ],
    values: {
      sectionClass: '-',
      sign: 'text',
      McRd: 'Nmm',
      MplRd: 'Nmm',
      MelRd: 'Nmm',
      MeffRd: 'Nmm',
      Weff: 'mm3',
      Aeff: 'mm2',
      Ieff: 'mm4',
      zEff: 'mm',
      rhoFlange: '-',
      psiWeb: '-',
      rhoWeb: '-',
      effectiveWebProcedure: 'text',
      ...perSign('McRd', 'Nmm'),
      ...perSign('sectionClass', '-'),
      MEdMax: 'Nmm',
    },
  },
  {
    id: 'shear',
    clause: 'EN 1993-1-1 6.2.6',
    family: 'shear',
    reads: ['web', 'loads'],
    judge: 50,
    file: 'en1993-1-5/shear-family.ts',
    fn: 'shearCheck',
    beneath: [{ clause: 'EN 1993-1-1 6.2.6(2) eq. 6.18', fn: 'vplRd', file: 'en1993-1-5/shear-plastic.ts' }],
    values: { Av: 'mm2', VplRd: 'N', VEd: 'N' },
  },
  {
    id: 'shear-buckling',
    clause: 'EN 1993-1-5 5.2',
    alsoClauses: ['EN 1993-1-5 5.1(2)'],
    family: 'shear',
    reads: ['web', 'flanges', 'panels', 'loads'],
    judge: 60,
    file: 'en1993-1-5/shear-family.ts',
    fn: 'shearBucklingCheck',
    beneath: [
      { clause: 'EN 1993-1-5 5.1(2)', fn: 'shearBucklingLimit', file: 'en1993-1-5/shear-buckling.ts' },
      { clause: 'EN 1993-1-5 5.2(1) eq. 5.1', fn: 'vbRdCap', file: 'en1993-1-5/shear-buckling.ts' },
      { clause: 'EN 1993-1-5 5.2(1) eq. 5.2', fn: 'vbwRd', file: 'en1993-1-5/shear-buckling.ts' },
      { clause: 'EN 1993-1-5 5.3(3) eq. 5.6', fn: 'lambdaW', file: 'en1993-1-5/shear-buckling.ts' },
      { clause: 'EN 1993-1-5 5.3(1), Table 5.1', fn: 'chiW', file: 'en1993-1-5/shear-buckling.ts' },
      { clause: 'EN 1993-1-5 5.4(1)', fn: 'vbfRd', file: 'en1993-1-5/shear-buckling.ts' },
      { clause: 'EN 1993-1-5 Annex A.3', fn: 'kTau', file: 'en1993-1-5/shear-buckling.ts' },
    ],
    values: {
      kTau: '-',
      lambdaW: '-',
      chiW: '-',
      VbwRd: 'N',
      VbfRd: 'N',
      MEdVbf: 'Nmm',
      VbfReading: 'text',
      VbRd: 'N',
      a: 'mm',
      endPost: 'text',
      c: 'mm',
      MfRd: 'Nmm',
      VEd: 'N',
      MEd: 'Nmm',
      hwOverTw: '-',
      limit: '-',
    },
  },
  {
    id: 'bending-shear',
    clause: 'EN 1993-1-5 7.1',
    alsoClauses: ['EN 1993-1-1 6.2.8'],
    family: 'shear',
    reads: ['web', 'flanges', 'panels', 'loads'],
    judge: 90,
    file: 'en1993-1-5/shear-family.ts',
    fn: 'bendingShearCheck',
    beneath: [
      { clause: 'EN 1993-1-5 7.1(1) eq. 7.1', fn: 'interaction71', file: 'en1993-1-5/interaction.ts' },
      { clause: 'EN 1993-1-1 6.2.8(3)', fn: 'rho628', file: 'en1993-1-5/interaction.ts' },
    ],
    values: { MfRd: 'Nmm', MplRd: 'Nmm', eta1: '-', eta3: '-', rho: '-', MVRd: 'Nmm' },
  },
  {
    id: 'flange-induced-buckling',
    clause: 'EN 1993-1-5 8',
    family: 'bending',
    reads: ['web', 'flanges', 'loads'],
    judge: 70,
    file: 'en1993-1-5/flange-induced.ts',
    fn: 'flangeInducedCheck',
    beneath: [{ clause: 'EN 1993-1-5 8(1) eq. 8.1', fn: 'fibLimit' }],
    values: { ratio: '-', limit: '-', k: '-', kBasis: 'text', Afc: 'mm2', fyf: 'MPa', sign: 'text' },
  },
  {
    id: 'patch-loading',
    clause: 'EN 1993-1-5 6',
    family: 'bending',
    reads: ['web', 'flanges', 'panels', 'loads'],
    judge: 20,
    file: 'en1993-1-5/patch-loading.ts',
    fn: 'patchLoadingCheck',
    beneath: [
      { clause: 'EN 1993-1-5 6.2–6.5', fn: 'patchResistance' },
      { clause: 'EN 1993-1-5 6.4(1), Figure 6.1', fn: 'kF' },
    ],
    values: {
      loadType: 'text',
      a: 'mm',
      kF: '-',
      Fcr: 'N',
      m1: '-',
      m2: '-',
      m2Branch: 'text',
      ly: 'mm',
      lambdaF: '-',
      chiF: '-',
      Leff: 'mm',
      FRd: 'N',
      F: 'N',
    },
  },
  {
    id: 'patch-bending',
    clause: 'EN 1993-1-5 7.2',
    family: 'bending',
    reads: ['web', 'flanges', 'panels', 'loads'],
    judge: 80,
    file: 'en1993-1-1/bending-family.ts',
    fn: 'patchBendingCheck',
    beneath: [{ clause: 'EN 1993-1-5 7.2(1) eq. 7.2', fn: 'patchBendingInteraction', file: 'en1993-1-5/patch-loading.ts' }],
    values: { eta1: '-', eta2: '-', interaction: '-', limit: '-', MEd: 'Nmm', MRdElastic: 'Nmm', FRd: 'N', F: 'N' },
  },
  {
    id: 'stiffener-stiffness',
    clause: 'EN 1993-1-5 9.3.3(3)',
    family: 'shear',
    reads: ['web', 'panels', 'flats'],
    judge: 100,
    file: 'en1993-1-5/shear-family.ts',
    fn: 'stiffenerStiffnessCheck',
    beneath: [{ clause: 'EN 1993-1-5 9.3.3(3) eq. 9.6', fn: 'stiffenerIstMin', file: 'en1993-1-5/stiffeners.ts' }],
    values: { Ist: 'mm4', IstMin: 'mm4', a: 'mm', axis: 'text' },
  },
  {
    id: 'stiffener-strength',
    clause: 'EN 1993-1-5 9.3.3(3)',
    family: 'shear',
    reads: ['web', 'panels', 'flats', 'loads'],
    judge: 110,
    file: 'en1993-1-5/shear-family.ts',
    fn: 'stiffenerStrengthCheck',
    beneath: [
      { clause: 'EN 1993-1-5 9.3.3(3) eq. 9.7', fn: 'stiffenerAxialForce', file: 'en1993-1-5/stiffeners.ts' },
      { clause: 'EN 1993-1-5 9.4(2); EN 1993-1-1 6.3.1', fn: 'strutResistance', file: 'en1993-1-5/stiffeners.ts' },
    ],
    values: { NEd: 'N', NbRd: 'N', eN: 'mm', chi: '-', lambdaBar: '-', VEd: 'N', lambdaWRemoved: '-', A: 'mm2' },
  },
  {
    id: 'load-bearing-stiffener',
    clause: 'EN 1993-1-5 9.4',
    family: 'shear',
    reads: ['web', 'flanges', 'panels', 'loadFlats', 'loads'],
    judge: 105,
    file: 'en1993-1-5/load-stiffener.ts',
    fn: 'loadStiffenerCheck',
    beneath: [
      { clause: 'EN 1993-1-5 9.4(2); EN 1993-1-1 6.3.1', fn: 'loadStiffenerAt' },
      { clause: 'EN 1993-1-5 9.4(2)', fn: 'loadStiffenerLcr' },
      { clause: 'EN 1993-1-8 4.5.3.3', fn: 'loadStiffenerWelds' },
      { clause: 'EN 1993-1-5 9.1(2), Figure 9.1', fn: 'stiffenerSection', file: 'en1993-1-5/stiffeners.ts' },
      { clause: 'EN 1993-1-5 9.3.3(3) eq. 9.7', fn: 'stiffenerAxialForce', file: 'en1993-1-5/stiffeners.ts' },
      { clause: 'EN 1993-1-5 9.2.1(8) eq. 9.3', fn: 'flatTorsion', file: 'en1993-1-5/stiffeners.ts' },
    ],
    values: {
      part: 'text',
      F: 'N',
      VEd: 'N',
      lambdaWRemoved: '-',
      Ntf: 'N',
      NEd: 'N',
      A: 'mm2',
      I: 'mm4',
      Lcr: 'mm',
      LcrBasis: 'text',
      fy: 'MPa',
      lambdaBar: '-',
      chi: '-',
      NbRd: 'N',
      Abearing: 'mm2',
      FbRd: 'N',
      loadPath: 'text',
      weldLength: 'mm',
      FwEd: 'N/mm',
      fvwd: 'MPa',
      throat: 'mm',
      FwRd: 'N/mm',
      ItOverIp: '-',
      torsionLimit: '-',
      IstMin: 'mm4',
      outstand: 'mm',
    },
  },
  {
    id: 'stiffener-torsion',
    clause: 'EN 1993-1-5 9.2.1(8)',
    family: 'shear',
    // panels: `at` is the first intermediate stiffener's position
    reads: ['panels', 'flats', 'bearing'],
    judge: 140,
    file: 'en1993-1-5/shear-family.ts',
    fn: 'stiffenerTorsionCheck',
    beneath: [{ clause: 'EN 1993-1-5 9.2.1(8) eq. 9.3', fn: 'flatTorsion', file: 'en1993-1-5/stiffeners.ts' }],
    values: { ItOverIp: '-', limit: '-', stiffener: 'text' },
    // the intermediate flats' condition reads the flat alone; the bearing flats are sized to fit the flanges
    webOnlyWhen: (r) => r.values['stiffener'] === 'intermediate',
  },
  {
    id: 'end-post',
    clause: 'EN 1993-1-5 9.3.1',
    family: 'shear',
    reads: ['web', 'panels', 'bearing'],
    judge: 150,
    file: 'en1993-1-5/shear-family.ts',
    fn: 'endPostCheck',
    beneath: [{ clause: 'EN 1993-1-5 9.3.1(3)–(4)', fn: 'rigidEndPost', file: 'en1993-1-5/end-post.ts' }],
    values: { e: 'mm', eMin: 'mm', Ast: 'mm2', AstMin: 'mm2', scope: 'text' },
  },
  {
    id: 'bearing-stiffener',
    clause: 'EN 1993-1-5 9.4',
    family: 'shear',
    reads: ['web', 'flanges', 'panels', 'bearing', 'loads'],
    judge: 160,
    file: 'en1993-1-5/shear-family.ts',
    fn: 'bearingStiffenerCheck',
    beneath: [{ clause: 'EN 1993-1-5 9.4', fn: 'bearingStiffenerAt', file: 'en1993-1-5/end-post.ts' }],
    values: { R: 'N', NbRd: 'N', chi: '-', lambdaBar: '-', A: 'mm2', Abearing: 'mm2', FbRd: 'N', pairs: '-', support: 'text' },
  },
  {
    id: 'lateral-torsional-buckling',
    clause: 'EN 1993-1-1 6.3.2',
    family: 'bending',
    reads: ['web', 'flanges', 'loads'],
    judge: 30,
    file: 'en1993-1-1/ltb.ts',
    fn: 'ltbCheck',
    values: {
      x0: 'mm',
      x1: 'mm',
      Lseg: 'mm',
      momentShape: 'text',
      C1: '-',
      zg: 'mm',
      zj: 'mm',
      k: '-',
      kw: '-',
      Mcr: 'Nmm',
      McrMethod: 'text',
      McrTerms: '-',
      McrChange: '-',
      McrConverged: 'text',
      McrUniform: 'Nmm',
      kc: '-',
      McrThreeFactor: 'Nmm',
      C1Table: '-',
      C2Table: '-',
      C3Table: '-',
      lambdaLT: '-',
      lambdaLT0: '-',
      curve: 'text',
      phiLT: '-',
      f: '-',
      chiLT: '-',
      MbRd: 'Nmm',
      MEd: 'Nmm',
      sign: 'text',
      method: 'text',
      reductionIgnored: 'text',
    },
  },
  {
    id: 'deflection',
    clause: 'EN 1990 A1.4.3; EN 1993-1-1 7.2.1',
    family: 'bending',
    reads: ['web', 'flanges', 'loads'],
    judge: 10,
    file: 'sls/deflection.ts',
    fn: 'deflectionCheck',
    beneath: [{ clause: 'EN 1990 A1.4.3', fn: 'deflection' }],
    values: { delta: 'mm', limit: 'mm', name: 'text', ratio: '-', span: 'mm', Iy: 'mm4', Av: 'mm2' },
  },
  {
    id: 'restraint-stiffener',
    clause: 'EN 1993-1-1 5.3.3',
    family: 'bending',
    reads: ['web', 'flanges', 'restraintFlats', 'loads'],
    judge: 125,
    file: 'en1993-1-1/restraint-stiffener.ts',
    fn: 'restraintStiffenerCheck',
    beneath: [
      { clause: 'EN 1993-1-1 5.3.3(4)', fn: 'restraintForce' },
      { clause: 'EN 1993-1-1 6.2.5; EN 1993-1-5 9.1(2), 9.2.1(8)', fn: 'restraintStiffenerAt' },
    ],
    values: {
      part: 'text',
      Fr: 'N',
      alphaM: '-',
      NEdFlange: 'N',
      MEdFlange: 'Nmm',
      flange: 'text',
      forceBasis: 'text',
      M: 'Nmm',
      W: 'mm3',
      MRd: 'Nmm',
      I: 'mm4',
      ItOverIp: '-',
      torsionLimit: '-',
      outstand: 'mm',
    },
  },
  {
    id: 'web-flange-weld',
    clause: 'EN 1993-1-8 4.5.3.3',
    family: 'bending',
    // panels: a force on a load-bearing stiffener does not pass through these welds
    reads: ['web', 'flanges', 'panels', 'loads'],
    judge: 120,
    file: 'en1993-1-8/weld.ts',
    fn: 'weldCheck',
    beneath: [
      { clause: 'EN 1993-1-8 4.5.3.3(3)', fn: 'fvwd' },
      { clause: 'EN 1993-1-8 4.5.3.3(2)', fn: 'fwRd' },
    ],
    values: { throat: 'mm', vEd: 'N/mm', qEd: 'N/mm', FwEd: 'N/mm', fvwd: 'MPa', FwRd: 'N/mm', flange: 'text', aRequired: 'mm' },
  },
] as const satisfies readonly CheckSpec[];

export type CheckId = (typeof CHECKS)[number]['id'];
export type BendingCheckId = Extract<(typeof CHECKS)[number], { family: 'bending' }>['id'];
export type ShearCheckId = Extract<(typeof CHECKS)[number], { family: 'shear' }>['id'];

const SPECS: readonly CheckSpec[] = CHECKS;
const BY_ID: ReadonlyMap<string, CheckSpec> = new Map(SPECS.map((c) => [c.id, c]));

/** The registry entry of a check id. */
export function checkSpec(id: CheckId): CheckSpec {
  return BY_ID.get(id)!;
}

const idsWhere = (keep: (c: CheckSpec) => boolean): CheckId[] => SPECS.filter(keep).map((c) => c.id as CheckId);
const reads = (c: CheckSpec, what: CheckInput): boolean => c.reads.includes(what);

/** The order in which checks are reported (check ids are a public contract). */
export const CHECK_ORDER: readonly CheckId[] = CHECKS.map((c) => c.id);

/** The order in which the early-stopping judge tries checks (by `judge` rank). */
export const JUDGE_ORDER: readonly CheckId[] = [...SPECS].sort((p, q) => p.judge - q.judge).map((c) => c.id as CheckId);

const JUDGE_RANK = new Map<string, number>(JUDGE_ORDER.map((id, i) => [id, i]));

/** `ids` in judging order. */
export function inJudgeOrder(ids: Iterable<string>): CheckId[] {
  const want = new Set(ids);
  return JUDGE_ORDER.filter((id) => want.has(id));
}

/** The position of a check id in JUDGE_ORDER (undefined for an id that is not a check). */
export function judgeRank(id: string): number | undefined {
  return JUDGE_RANK.get(id);
}

export const BENDING_IDS = idsWhere((c) => c.family === 'bending') as BendingCheckId[];
export const SHEAR_IDS = idsWhere((c) => c.family === 'shear') as ShearCheckId[];

/** Checks that read the bearing stiffeners (sized first when the section does not give them). */
export const BEARING_DEPENDENT: ReadonlySet<string> = new Set(idsWhere((c) => reads(c, 'bearing')));

/**
 * Checks that read nothing of the stiffener layout (panels, flats) or the bearing stiffeners, in
 * judging order: with one self-weight for every layout of a set of plates, their verdict is the
 * same for all of those layouts.
 */
export const PLATE_IDS: readonly CheckId[] = inJudgeOrder(idsWhere((c) => !reads(c, 'panels') && !reads(c, 'flats') && !reads(c, 'loadFlats') && !reads(c, 'bearing')));

/**
 * Checks whose failure condemns the web and its stiffener layout on any flanges: they read neither
 * flanges, nor bearing stiffeners, nor loads (which carry the flanges' self-weight).
 */
export const WEB_ONLY: ReadonlySet<string> = new Set(idsWhere((c) => !reads(c, 'flanges') && !reads(c, 'bearing') && !reads(c, 'loads')));

/**
 * The other checks (they read the layout or the bearing stiffeners), judged per layout: the
 * web-only ones first (cheap, and a failure is shared by every flange on the web), then in judging
 * order. PLATE_IDS and LAYOUT_IDS together are CHECK_ORDER.
 */
export const LAYOUT_IDS: readonly CheckId[] = (() => {
  const plate = new Set<string>(PLATE_IDS);
  const rest = JUDGE_ORDER.filter((id) => !plate.has(id));
  return [...rest.filter((id) => WEB_ONLY.has(id)), ...rest.filter((id) => !WEB_ONLY.has(id))];
})();

/**
 * Layout checks that read the panel layout (stiffener positions, load-bearing stiffeners or not,
 * end-post type) but no flats (intermediate or load-bearing) nor the bearing stiffeners: a failure
 * fails every flat and every number of sides with the same panels, load-bearing choice and end
 * post on the same plates, and a pass holds for all of them.
 */
export const PANEL_ONLY: ReadonlySet<string> = new Set(idsWhere((c) => reads(c, 'panels') && !reads(c, 'flats') && !reads(c, 'loadFlats') && !reads(c, 'bearing')));

/**
 * Whether a failed result condemns its web and stiffener layout on every flange: a check of
 * WEB_ONLY, or a result its entry declares web-only (the intermediate flats' torsion, 9.2.1(8)).
 */
export function failsWebOnly(c: CheckResult): boolean {
  if (c.passes) return false;
  if (WEB_ONLY.has(c.id)) return true;
  return BY_ID.get(c.id)?.webOnlyWhen?.(c) ?? false;
}

/** The unit of each value a check reports, by check id. */
export const VALUE_UNITS_BY_CHECK: Readonly<Record<CheckId, Readonly<Record<string, ReportedUnit>>>> = Object.fromEntries(
  SPECS.map((c) => [c.id, c.values]),
) as Record<CheckId, Readonly<Record<string, ReportedUnit>>>;
