import { checkGirder } from '@platesmith/checks';
import {
  CAUTION,
  CheckEffectsInput,
  CheckProblemInput,
  fromN,
  parseWith,
  publishEffects,
  publishSearch,
  publishVerdict,
  runCheckJob,
  SCOPE,
  toCheckEffects,
  toCheckProblem,
  toSearchTask,
  DEFAULT_SPACE_CAP,
  type Parsed,
  type ProblemJson,
  type PublishedSearch,
  type PublishedVerdict,
  type SearchInput,
} from '@platesmith/schema';
import { runSchedule, type ScheduleJson, type ScheduleProgress, type ScheduleResult } from '@platesmith/schedule';
import type { SearchResult, SearchTask } from '@platesmith/search';
import { z } from 'zod';

/**
 * The one domain call behind each route. Routes validate and map to HTTP; these functions
 * convert, run and publish (all engineering stays in the packages).
 */

/** Body of POST /v1/checks: raw effects when it has "effects", else a problem. */
export const CheckRequest = z.union([CheckEffectsInput, CheckProblemInput]).meta({
  id: 'CheckRequest',
  description: 'a section under design effects given at stations (the body has "effects"), or for a problem (spans and actions, or an envelope; its self-weight is added)',
});
export type CheckRequest = CheckEffectsInput | CheckProblemInput;

/** Dispatches on "effects" so the issues name the fields of the form the client meant. */
export function parseCheckRequest(body: unknown): Parsed<CheckRequest> {
  const raw = typeof body === 'object' && body !== null && !Array.isArray(body) && Object.prototype.hasOwnProperty.call(body, 'effects');
  return raw ? parseWith(CheckEffectsInput, body) : parseWith(CheckProblemInput, body);
}

export type CheckResponse = PublishedVerdict & { selfWeight?: number; caution: string; scope: string };

export function checkSection(input: CheckRequest): CheckResponse {
  if ('effects' in input) {
    const { section, effects, options, assumptions } = toCheckEffects(input);
    return { ...publishVerdict(checkGirder(section, effects, options), assumptions), caution: CAUTION, scope: SCOPE };
  }
  const job = toCheckProblem(input);
  return { ...publishVerdict(runCheckJob(job), job.assumptions), selfWeight: Math.round(fromN(job.g) * 1e6) / 1e3, caution: CAUTION, scope: SCOPE };
}

export const analyseProblem = (p: ProblemJson) => publishEffects(p);

export type SearchFn = (task: SearchTask, signal?: AbortSignal) => Promise<SearchResult>;

export async function searchPlates(input: SearchInput, search: SearchFn, spaceCap = DEFAULT_SPACE_CAP): Promise<PublishedSearch> {
  const task = toSearchTask(input, spaceCap);
  const r = await search(task);
  return publishSearch(r, task.objective, task.analysis.length, task.assumptions);
}

export function runScheduleJob(input: ScheduleJson, search: SearchFn, signal: AbortSignal, onProgress: (p: ScheduleProgress) => void, spaceCap = DEFAULT_SPACE_CAP): Promise<ScheduleResult> {
  return runSchedule(input, { search, onProgress, spaceCap }, signal);
}
