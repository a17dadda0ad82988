export { LIMITS, bounded } from './limits.js';
export { mm, Grade, Plate, Web, Stiffeners, Bearing, GradeSpec, SectionJson } from './section.js';
export { FactorsJson, RestraintJson, CheckOptionsJson } from './options.js';
export { SpanMm, EffectJson, SlsUdlJson, CheckEffectsInput } from './check-input.js';
export { toSection, fromSection, toCheckOptions, resolveOptions, sectionAssumptions, toCheckEffects, assertStockThickness, BEARING_SIZING_NOTE, type Assumption } from './convert.js';
export { parseWith, formatIssues, pathString, MAX_LISTED_ISSUES, type FieldIssue, type Parsed } from './parse.js';
export { VALUE_UNITS, unitOf, roundPublished, publishCheck, publishVerdict, type PublishedCheck, type PublishedVerdict } from './output.js';
export { kN, kNm, toN, toNmm, fromN, fromNmm, convertValue, type ValueUnit } from './units.js';
export { CAUTION, SCOPE } from './caution.js';
export { publishRecord, parseRecordRequest, RecordTitleJson, inputHash, TOOL_VERSION, EDITIONS, TITLE_FIELDS, type RecordData, type RecordTitle, type RecordAction, type RecordRequest } from './record.js';
export { ActionJson, DeflectionLimitJson, EnvelopeJson, ProblemJson, ProblemFields, BeamProblemFields } from './problem.js';
export { GridJson, SpaceJson, CostJson } from './space.js';
export {
  CheckProblemInput,
  SearchInput,
  supportsOf,
  toAnalysis,
  selfWeight,
  toCheckProblem,
  checkProblemsFor,
  problemAssumptions,
  runCheckJob,
  toSpace,
  toCost,
  toSearchTask,
  DEFAULT_SPACE_CAP,
  type CheckJob,
} from './problem-convert.js';
export { publishSearch, publishPoint, searchMessage, edgeNote, type PublishedSearch, type PublishedPoint, type PublishedMiss, type PublishedLimit, type SearchAbort } from './search-output.js';
export {
  PublishedCheckJson,
  AssumptionJson,
  PublishedVerdictJson,
  PublishedPointJson,
  LimitJson,
  PublishedMissJson,
  SearchStatsJson,
  PublishedSearchJson,
  EffectsSummaryJson,
} from './api-output.js';
