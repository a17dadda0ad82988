/**
 * @platesmith/schedule — a schedule of girder marks: defaults merged into each mark, each
 * searched (and checked as adopted where a section is given), tonnage totals. Pure: the search
 * itself is passed in (the worker pool lives in the service).
 */
export { ScheduleJson, GirderEntryJson, ScheduleResultJson, ScheduleProgressJson, MarkErrorJson, mergeGirder } from './schema.js';
export {
  runSchedule,
  type ScheduleDeps,
  type ScheduleProgress,
  type ScheduleResult,
  type ScheduleTotals,
  type MarkResult,
  type MarkError,
  type AdoptedCheck,
} from './run.js';
export * from './tender/index.js';
