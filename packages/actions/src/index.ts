/**
 * @platesmith/actions — EN 1990 combinations and beam analysis into design effects.
 * Units: N, mm, N/mm (= kN/m), N·mm. Loads positive downward; M positive sagging; V positive
 * upward on the left face of the part right of the cut (dM/dx = V); deflection positive
 * downward; reactions positive upward.
 */
export type {
  ActionSpec,
  Analysis,
  BeamProblem,
  Combination,
  CombinationFactors,
  DeflectionLimitSpec,
  DesignEffects,
  EffectsSummary,
  EnvelopeProblem,
  SlsData,
} from './types.js';
export { analyse, analyseEnvelope, designEffects, designReaction, summarise, combinationsFor, ANALYSIS_WORK_CAP } from './analyse.js';
export { continuousBeam, type BeamLoad, type BeamSolution, type PointLoad, type DistributedLoad, type Side } from './beam.js';
export { ulsCombinations, slsCombinations, type VariableInfo } from './combinations.js';
export { psiFor, TABLE_A1_1, TABLE_A2_1, isRoadTraffic, PSI_CATEGORIES, type PsiFactors } from './psi.js';
export { RECOMMENDED_FACTORS, RECOMMENDED_FACTORS_A2_ROAD, DEFAULT_DEFLECTION_LIMITS, MIN_SPAN, DEFAULT_SS, DEFAULT_GRID } from './validate.js';
