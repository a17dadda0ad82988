import { summarise } from '@platesmith/actions';
import { checkGirder } from '@platesmith/checks';
import {
  CAUTION,
  CheckEffectsInput,
  CheckProblemInput,
  DEFAULT_SPACE_CAP,
  fromN,
  fromNmm,
  parseWith,
  publishSearch,
  publishVerdict,
  runCheckJob,
  SCOPE,
  toAnalysis,
  toCheckEffects,
  toCheckProblem,
  toSearchTask,
  type Assumption,
  type EffectsSummaryJson,
  type Parsed,
  type ProblemJson,
  type PublishedSearch,
  type PublishedVerdict,
  type SearchAbort,
  type SearchInput,
} from '@platesmith/schema';
import type { SearchResult, SearchTask } from '@platesmith/search';
import { z } from 'zod';

/**
 * The requests of the application, each as one function from parsed input to published answer:
 * parse → analyse → check or task → publish. They run wherever they are called (the CLI calls
 * them in its own process; the engine runs them on a worker thread for the HTTP service).
 */

/** Body of a check: raw effects when it has "effects", else a problem. */
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

export type CheckResponse = PublishedVerdict & {
  /** self-weight added to the actions, kN/m (problem form only) */
  selfWeight?: number;
  caution: string;
  scope: string;
};

/** One section checked: under raw effects, or for a problem with its own self-weight added. */
export function checkSection(input: CheckRequest): CheckResponse {
  if ('effects' in input) {
    const { section, effects, options, assumptions } = toCheckEffects(input);
    return { ...publishVerdict(checkGirder(section, effects, options), assumptions), caution: CAUTION, scope: SCOPE };
  }
  const job = toCheckProblem(input);
  return { ...publishVerdict(runCheckJob(job), job.assumptions), selfWeight: Math.round(fromN(job.g) * 1e6) / 1e3, caution: CAUTION, scope: SCOPE };
}

const round3 = (v: number) => Math.round(v * 1000) / 1000;

/** The analysis of a problem in public units (kN, kNm, mm), without self-weight. */
export function effectsOf(p: ProblemJson): EffectsSummaryJson {
  const s = summarise(toAnalysis(p), 0);
  return {
    reactions: s.reactions.map((r) => ({ x: r.x, R: round3(fromN(r.R)) })),
    stations: s.stations.map((st) => ({ x: round3(st.x), MEd: round3(fromNmm(st.MEd)), VEd: round3(fromN(st.VEd)) })),
    envelope: { MEdMax: round3(fromNmm(s.envelope.MEdMax)), MEdMin: round3(fromNmm(s.envelope.MEdMin)), VEdMax: round3(fromN(s.envelope.VEdMax)) },
    governing: s.governing,
    note: 'design values without the girder self-weight (check and search add each section its own)',
    caution: CAUTION,
    scope: SCOPE,
  };
}

/** A search request as the plain task the search workers take (the space checked against the cap, the problem analysed). */
export function searchTaskOf(input: SearchInput, spaceCap = DEFAULT_SPACE_CAP): SearchTask {
  return toSearchTask(input, spaceCap);
}

/** A search result published in the trade's units, with its status and message. */
export function publishSearchOf(r: SearchResult, task: { objective: SearchTask['objective']; analysis: { length: number }; assumptions?: readonly Assumption[] }, abort?: SearchAbort): PublishedSearch {
  return publishSearch(r, task.objective, task.analysis.length, abort, task.assumptions ?? []);
}
