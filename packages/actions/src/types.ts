/**
 * Public shapes of @platesmith/actions. Units inside: N, mm, N/mm (= kN/m), N·mm.
 * Loads positive downward; M positive sagging; V positive upward on the left face of the part
 * right of the cut (dM/dx = V); deflection positive downward; reactions positive upward.
 */

/** One characteristic action on the girder. */
export interface ActionSpec {
  kind: 'permanent' | 'variable';
  /** 'udl' over the whole girder, 'partial-udl' from `from` to `to`, 'point' at `at` */
  load: 'udl' | 'partial-udl' | 'point';
  /** characteristic value: N/mm for 'udl' / 'partial-udl', N for 'point'; downward positive */
  value: number;
  /** mm from the left end ('point') */
  at?: number;
  /** mm from the left end ('partial-udl') */
  from?: number;
  /** mm from the left end ('partial-udl') */
  to?: number;
  /** stiff bearing length of a point load, mm (EN 1993-1-5 6.3); default 100 */
  ss?: number;
  /** EN 1990 combination factors; each overrides the category's value */
  psi0?: number;
  psi1?: number;
  psi2?: number;
  /** EN 1990 Table A1.1 row: 'A'…'H', 'snow', 'snow-high-altitude', 'wind', 'temperature'; Table A2.1 (road bridges): 'road-TS', 'road-UDL', 'road-footway', 'road-single-axle', 'bridge-wind', 'bridge-temperature' */
  category?: string;
  /** traffic group (EN 1991-2 4.5, e.g. 'gr1a'): the actions of one group are one variable action, leading together */
  group?: string;
  name?: string;
}

/** EN 1990 Table A1.2(B) partial factors (recommended 1.35, 1.00, 1.50, 0.85); Table A2.4(B) for road bridges adds γQ = 1.35 for road traffic. */
export interface CombinationFactors {
  gammaGsup: number;
  gammaGinf: number;
  gammaQ: number;
  /** γQ of road traffic (Annex A2 only; recommended 1.35) */
  gammaQTraffic?: number;
  /** reduction factor ξ of eq. 6.10b, applied to γG,sup only */
  xi: number;
}

export interface DeflectionLimitSpec {
  name: string;
  /** limit = span / ratio */
  ratio: number;
  combination: 'characteristic' | 'frequent' | 'quasi-permanent';
  /** 'all' = permanent (with self-weight) and variable actions; 'variable' = variable actions only */
  include: 'all' | 'variable';
}

export interface BeamProblem {
  /** span lengths, mm (each ≥ 1000) */
  spans: number[];
  actions: ActionSpec[];
  /** EN 1990 6.4.3.2(3): eq. 6.10, or the less favourable of 6.10a and 6.10b */
  combination: '6.10' | '6.10ab';
  /** EN 1990 Annex A1 (buildings, default) or A2 for road bridges (Table A2.4(B) factors, traffic groups) */
  annex?: 'A1' | 'A2-road';
  factors?: Partial<CombinationFactors>;
  /** default: total L/250 and variable L/360, characteristic (common practice, no source) */
  deflection?: DeflectionLimitSpec[];
  /** grid stations per span; default 40 */
  gridDivisions?: number;
  /** further stations, mm from the left end (e.g. stiffener positions) */
  extraStations?: number[];
}

/** Design effects from the user's own global analysis (pass-through). */
export interface EnvelopeProblem {
  /** stations x (mm) with coexisting MEd (N·mm) and VEd (N); several entries may share an x */
  envelope: { x: number; MEd: number; VEd: number }[];
  /** girder length, mm */
  length: number;
  /** support positions, mm; default [0, length] */
  supports?: number[];
  /** design reactions (N); default estimated from the envelope (see analyseEnvelope) */
  reactions?: { x: number; R: number }[];
  /** design concentrated forces (N) with stiff bearing length ss (mm) */
  forces?: { x: number; F: number; ss: number }[];
}

/** One combination of actions, with the label a user sees. */
export interface Combination {
  label: string;
  limitState: 'ULS' | 'SLS';
  equation: '6.10' | '6.10a' | '6.10b' | 'characteristic' | 'frequent' | 'quasi-permanent';
  /** factor on all permanent actions (and on the self-weight g) */
  gammaG: number;
  /** factor on each variable action, in the order of the variable actions in `actions` */
  factors: number[];
  /** index among the variable actions of the leading one, or null */
  leading: number | null;
}

/** SLS data of one deflection limit; values are A + g·B per point (g = self-weight, N/mm). */
export interface SlsData {
  name: string;
  ratio: number;
  x: Float64Array;
  /** per point 4 numbers: bendA, shearA, bendB, shearB — pattern of the largest downward deflection */
  down: Float64Array;
  /** same for the largest upward deflection */
  up: Float64Array;
}

/**
 * Result of `analyse` / `analyseEnvelope`: plain data (typed arrays), safe to send to a worker
 * thread. Every design quantity is stored as A + g·B so `designEffects(analysis, g)` can add
 * the girder's self-weight g without a new analysis.
 */
export interface Analysis {
  kind: 'beam' | 'envelope';
  /** support positions, mm */
  supports: number[];
  /** girder length, mm */
  length: number;
  spans: number[];
  /** ULS combination labels, index = combination number */
  combinations: string[];
  /** station positions (mm) and sides (−1 left limit, 0 continuous, +1 right limit), sorted */
  stationX: Float64Array;
  stationSide: Int8Array;
  /** factor on g per ULS combination */
  gammaG: Float64Array;
  /**
   * per combination c, station k, target t (0 max M, 1 min M, 2 max V, 3 min V):
   * A[(c·nK + k)·8 + 2t] = M without g (N·mm), […+1] = coexisting V without g (N)
   */
  A: Float64Array;
  /** M and V of g = 1 N/mm at each station (N·mm, N) */
  Mg: Float64Array;
  Vg: Float64Array;
  /** positions (mm) of the reactions reported (the supports, or the user's reactions) */
  reactionX: Float64Array;
  /** reactions: RA[c·nR + r] without g (largest over the patterns), Rg[r] of g = 1 N/mm */
  RA: Float64Array;
  Rg: Float64Array;
  forces: { x: number; F: number; ss: number }[];
  sls: SlsData[];
}

/** Structurally identical to the check library's Effects. */
export interface DesignEffects {
  /** per station the max-M, min-M and max-|V| entries with coexisting values (duplicates merged) */
  stations: { x: number; MEd: number; VEd: number }[];
  forces: { x: number; F: number; ss: number }[];
  /** max design reaction per support */
  reactions: { x: number; R: number }[];
  /**
   * bend = E·I·δ_bending(x) (N·mm³), shear = G·Av·δ_shear(x) (N·mm) for the limit's SLS
   * combination; the check library divides by its own E·I and G·Av. Shear deformation:
   * δ_s·G·Av = M(x) − (linear interpolation of the span's support moments), with the support
   * moments of the shear-rigid analysis (approximation).
   */
  sls: { name: string; ratio: number; points: { x: number; bend: number; shear: number }[] }[];
}

export interface EffectsSummary {
  reactions: { x: number; R: number }[];
  stations: { x: number; MEd: number; VEd: number }[];
  /** MEdMax, MEdMin in N·mm; VEdMax = largest |VEd| in N */
  envelope: { MEdMax: number; MEdMin: number; VEdMax: number };
  /** combination labels */
  governing: { MEdMax: string; MEdMin: string; VEdMax: string };
}
