/**
 * @platesmith/schedule — a schedule of girder marks: defaults merged into each mark, each
 * searched (and checked as adopted where a section is given), tonnage totals. Pure: the search
 * itself is passed in (the worker pool lives in the service).
 */
export {
  ScheduleJson,
  GirderEntryJson,
  ScheduleResultJson,
  ScheduleProgressJson,
  MarkErrorJson,
  MarkRecordJson,
  BaselineJson,
  TenderOptionsJson,
  ScheduleRunResultJson,
  mergeGirder,
  checkFieldsOf,
} from './schema.js';
export {
  runSchedule,
  type ScheduleDeps,
  type ScheduleProgress,
  type ScheduleResult,
  type ScheduleTotals,
  type MarkResult,
  type MarkError,
  type AdoptedCheck,
  totalsOf,
} from './run.js';
export {
  finishSchedule,
  compareRun,
  baselineRecords,
  recordOf,
  sectionPassesFor,
  RESULT_FORMAT,
  RESULT_VERSION,
  type ScheduleRunResult,
  type ScheduleComparison,
  type ScheduleTender,
  type RationalisationOutcome,
} from './finish.js';
export { parseSchedule, parseScheduleText, type ScheduleParsed, type ScheduleInputIssue } from './input.js';
export * from './tender/index.js';
