export { defaultSpace, spaceSize, assertSpace, webConfigs, WebTable, flangeGroups, type SpaceSpec, type FabricationRules, type WebConfig, type FlangeOption, type FlangeGroup } from './space.js';
export {
  DEFAULT_COST,
  C2,
  costOf,
  costFloor,
  materialRateFloor,
  platesSurface,
  paintMinutesPerMm2,
  assemblyMinutes,
  flangeWeldMinutes,
  surfacePrepMinutes,
  paintingMinutes,
  SUM_ORDER_MARGIN,
  type CostModel,
  type WeldProcess,
} from './objective.js';
export { fixedLoadModel, affineDemandBound, analysisLoadModel, analysisDemandBound, analysisMomentEnvelope, analysisReactionFloor, momentEnvelopeFor, type LoadModel, type DemandBound, type AffineDemand } from './load.js';
export { searchSlice, unitSlot, type OuterBound, type SlicePart } from './slice/best-first.js';
export { prepareSearch, selfWeightRange, better, type SearchProblem, type Objective, type Evaluated, type CandidateKey, type SliceResult, type PruneStats, type Prepared } from './core.js';
export { paretoFront } from './pareto.js';
export { bruteForce } from './brute.js';
export { search, mergeSlices, watchStop, type SearchResult, type SearchStatus } from './search.js';
export { problemOf, stiffenerStations, type SearchTask } from './task.js';
export { explainPoints, explanationOf, explained, limitsOf, edgesOf, strongestMisses, needsMisses, type Limit, type LimitMove, type SpaceEdge, type Explained, type Explanation } from './limits.js';
