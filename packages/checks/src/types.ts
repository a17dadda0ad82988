import type { FySource, GradeName } from '@platesmith/catalogue';
import type { CheckId } from './registry.js';

/**
 * Internal types of the check library. Units throughout: N, mm, N/mm² (MPa), N·mm.
 * The public JSON (kN, kNm, …) is converted once, at the schema boundary.
 */

/** A flange plate: width b and thickness t, mm. */
export interface FlangePlate {
  b: number;
  t: number;
}

/** Intermediate transverse stiffeners: flats of outstand bs × ts (mm) at spacing a (mm), on one or both faces of the web. */
export interface StiffenerLayout {
  a: number;
  bs: number;
  ts: number;
  sides: 1 | 2;
}

/** Bearing stiffeners over supports: double-sided flats bs × ts (mm). A rigid end post has two pairs, e apart (mm). */
export interface BearingStiffener {
  bs: number;
  ts: number;
  /** rigid end post only: distance between the two pairs, mm (EN 1993-1-5 9.3.1(3): e >= 0.1 hw) */
  e: number;
  /**
   * double-sided pairs side by side over each support, acting as one column (default 1); a rigid
   * end post adds its one outer pair e from the bearing group
   */
  pairs?: number | undefined;
}

/**
 * Load-bearing stiffeners under concentrated forces (EN 1993-1-5 9.4): a double-sided pair of flats
 * bs × ts (mm) at each position xs (mm from the left end), fitted to the loaded flange. The public
 * JSON gives bs and ts; the positions are those of the concentrated forces (every one of them).
 */
export interface LoadStiffeners {
  bs: number;
  ts: number;
  xs: number[];
}

/**
 * Stiffeners where a lateral restraint (cross-frame, bracing) attaches (EN 1993-1-1 5.3.3): a
 * double-sided pair of flats bs × ts (mm) at each position xs (mm from the left end).
 */
export interface RestraintStiffeners {
  bs: number;
  ts: number;
  xs: number[];
}

export type EndPost = 'rigid' | 'non-rigid';

export interface SectionGrades {
  web: GradeName;
  top: GradeName;
  bot: GradeName;
  stiffener: GradeName;
}

/** A welded I-girder section, uniform along the girder. hw is the clear web depth between flanges. */
export interface Section {
  hw: number;
  tw: number;
  top: FlangePlate;
  bot: FlangePlate;
  stiffeners: StiffenerLayout | null;
  endPost: EndPost;
  /** bearing stiffeners at supports; resolved by `resolveBearing` when not given */
  bearing?: BearingStiffener | undefined;
  /** load-bearing stiffeners under the concentrated forces (absent or null: none, forces enter the web unstiffened) */
  loadStiffeners?: LoadStiffeners | null | undefined;
  /** stiffeners at lateral restraints, carrying the restraint force (absent or null: none) */
  restraintStiffeners?: RestraintStiffeners | null | undefined;
  grade: SectionGrades;
}

/**
 * Coexisting design effects at a station x (mm from the left end).
 * MEd in N·mm, positive = sagging (top flange in compression). VEd in N (sign kept, magnitude used).
 * Several entries may share an x: one per combination that can govern there.
 */
export interface Station {
  x: number;
  MEd: number;
  VEd: number;
}

/** A transverse force F (N, design) entering through the top flange with stiff bearing length ss (mm), no stiffener under it. */
export interface ConcentratedForce {
  x: number;
  F: number;
  ss: number;
}

/** Design support reaction R (N) at x (mm); carried by the bearing stiffener there. */
export interface Reaction {
  x: number;
  R: number;
}

/**
 * SLS deflection demand for one limit. At each point, the deflection is
 * bend / (E·Iy) + shear / (G·Av): `bend` in N·mm³, `shear` in N·mm, both from the SLS
 * combination of this limit (already including self-weight where it belongs).
 */
export interface SlsDeflection {
  name: string;
  /** limit = L / ratio, where L is the span containing x (or 2 × cantilever length) */
  ratio: number;
  points: { x: number; bend: number; shear: number }[];
}

export interface Effects {
  stations: Station[];
  forces: ConcentratedForce[];
  reactions: Reaction[];
  sls: SlsDeflection[];
}

export interface Factors {
  gammaM0: number;
  gammaM1: number;
  gammaM2: number;
}

export type Restraint = { kind: 'continuous' } | { kind: 'at'; at: number[] };
export type LoadHeight = 'top-flange' | 'shear-centre' | 'bottom-flange';

export interface CheckOptions {
  factors: Factors;
  /** EN 1993-1-5 5.1(2) η; 1.2 up to S460 recommended */
  eta: number;
  fySource: FySource;
  /** EN 1993-1-5 8(1) k: 0.3, 0.4 or 0.55; 'auto' = 0.4 when the plastic moment resistance is used, else 0.55 */
  kFib: number | 'auto';
  /** support positions, mm, ascending; the first is 0 and the last the girder length */
  supports: number[];
  /** lateral restraint of the top flange (compression flange under sagging) */
  restraint: Restraint;
  /** lateral restraint of the bottom flange (compression flange under hogging); default: at the supports only */
  restraintBottom: Restraint;
  loadHeight: LoadHeight;
  /** EN 1993-1-1 6.3.2.2 ('general', default) or 6.3.2.3 ('rolled-equivalent', λLT,0 = 0.4, β = 0.75) */
  ltbMethod: 'general' | 'rolled-equivalent';
  /** EN 1993-1-1 6.3.2.3(2) modification factor f (only with 'rolled-equivalent') */
  ltbModification: boolean;
  /** effective length factors of each lateral-torsional buckling segment (lateral bending k, warping kw); absent: fork ends, k = kw = 1 */
  ltbEnds?: { k: number; kw: number } | undefined;
  /** fillet throat sizes a (mm) to choose from, ascending */
  weldThroats: number[];
  /** MPa */
  E: number;
  /** MPa */
  G: number;
  /** stiff bearing length at supports, mm (for bearing checks) */
  supportBearingLength: number;
  /** corner snipe of stiffeners at the web–flange weld, mm */
  snipe: number;
  /** flats to size bearing stiffeners from when the section does not give them (double-sided) */
  bearingFlats: { b: number; t: number }[];
  /** plate thicknesses (mm) bearing stiffeners may also be cut from when no pair of flats passes; default the catalogue's PLATE_THICKNESSES */
  bearingPlates?: readonly number[] | undefined;
}

/** A check's id (trade words, a public contract): the ids of the registry (registry.ts). */
export type { CheckId };

export type CheckValue = number | string | boolean;

/**
 * One check's verdict (the public check-result contract). Internal units in `values` (N, mm, N·mm, MPa);
 * the schema converts to kN, kNm at the boundary. A check that does not apply has
 * applies: false, a reason, utilisation 0 and passes true.
 */
export interface CheckResult {
  id: CheckId;
  clause: string;
  applies: boolean;
  reason?: string;
  utilisation: number;
  passes: boolean;
  /** x (mm) of the governing station, or null for checks not tied to a station */
  at: number | null;
  values: Record<string, CheckValue>;
}

export interface GirderVerdict {
  passes: boolean;
  governing: CheckResult;
  checks: CheckResult[];
  /** the bearing stiffeners checked: as given, or as sized from options.bearingFlats */
  bearing: BearingStiffener;
  /** true when the bearing stiffeners were sized by the library */
  bearingSized: boolean;
}

/** Strengths and ε of each plate, from its grade and thickness. */
export interface Material {
  fyw: number;
  fyTop: number;
  fyBot: number;
  fyStiff: number;
  /** bearing-stiffener flats (their own thickness band) */
  fyBearing: number;
  /** load-bearing stiffener flats under concentrated forces (their own thickness band; fyStiff when there are none) */
  fyLoad: number;
  /** stiffener flats at lateral restraints (their own thickness band; fyStiff when there are none) */
  fyRestraint: number;
  fuw: number;
  fuTop: number;
  fuBot: number;
  epsW: number;
  epsTop: number;
  epsBot: number;
  epsStiff: number;
}

/**
 * Gross cross-section properties. z is measured upward from the underside of the bottom flange.
 */
export interface GrossProps {
  /** overall depth h = hw + tf,top + tf,bot, mm */
  h: number;
  /** distance between flange centroids, mm */
  hs: number;
  A: number;
  Aw: number;
  /** elastic neutral axis height, mm */
  zElastic: number;
  Iy: number;
  Iz: number;
  /** Saint-Venant torsion constant Σ b t³ / 3, mm⁴ */
  It: number;
  /** warping constant, mm⁶ */
  Iw: number;
  /** shear-centre height above the underside, mm */
  zShear: number;
  /** second moments of the flanges about z, mm⁴ */
  IzTop: number;
  IzBot: number;
  /** plastic neutral axis height (per-plate fy), mm */
  zPlastic: number;
  /** plastic moment Σ fy·|A·z| with each plate at its own fy, N·mm (no partial factor) */
  Mpl: number;
  /** elastic moment at first yield of any plate at its own fy, N·mm, for sagging / hogging (the same gross section; kept per sign for symmetry with effective values) */
  Mel: number;
}

/** A web panel between two rigid transverse boundaries (supports or stiffeners). */
export interface Panel {
  x0: number;
  x1: number;
  a: number;
  /** next to an end support (the end-post type applies) */
  atEnd: boolean;
  /** the boundary at x0 / x1 is a support */
  supportAt0: boolean;
  supportAt1: boolean;
}

/** Everything computed once per section and shared by all check families. */
export interface CheckContext {
  s: Section;
  o: CheckOptions;
  m: Material;
  g: GrossProps;
  /** girder length, mm */
  L: number;
  panels: Panel[];
  /** x (mm) of intermediate stiffeners */
  stiffenerXs: number[];
  /** x (mm) of load-bearing stiffeners (panel boundaries too), ascending; empty when the section has none */
  loadXs: number[];
  bearing: BearingStiffener;
}
