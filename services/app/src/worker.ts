import { isDomainError, type DomainErrorData } from '@platesmith/catalogue';
import { renderRecord } from '@platesmith/report';
import { finishSchedule, type MarkResult, type ScheduleJson, type ScheduleRunResult } from '@platesmith/schedule';
import { publishRecord, type EffectsSummaryJson, type ProblemJson, type RecordRequest, type SearchInput } from '@platesmith/schema';
import type { Explanation, SearchTask, SliceResult } from '@platesmith/search';
import runSearchMessage, { type WorkerMessage as SearchMessage } from '@platesmith/search/worker';
import { checkSection, effectsOf, searchTaskOf, type CheckRequest, type CheckResponse } from './requests.js';

/**
 * The application's worker thread (piscina): the search's slices, and the heavy part of every
 * request (analysis, checks, the calculation record, a schedule's finish with its rationalisation)
 * so that none of it runs on the service's event loop. Messages in
 * and out are plain objects; a domain error comes back as data (a class instance does not
 * survive the thread boundary) and is thrown again on the main thread.
 */
export type RequestMessage =
  | { kind: 'check'; input: CheckRequest }
  | { kind: 'effects'; input: ProblemJson }
  | { kind: 'search-task'; input: SearchInput; spaceCap: number }
  | { kind: 'record'; request: RecordRequest }
  | { kind: 'finish'; schedule: ScheduleJson; marks: MarkResult[] };

/** A finished schedule without its marks (the caller holds them: they do not cross the thread twice). */
export type FinishedWithoutMarks = Omit<ScheduleRunResult, 'marks'>;

export type AppMessage = SearchMessage | RequestMessage;

export type Answer<T> = { ok: true; value: T } | { ok: false; domain: DomainErrorData };

export interface Answers {
  check: Answer<CheckResponse>;
  effects: Answer<EffectsSummaryJson>;
  'search-task': Answer<SearchTask>;
  record: Answer<string>;
  finish: Answer<FinishedWithoutMarks>;
}

function answer<T>(f: () => T): Answer<T> {
  try {
    return { ok: true, value: f() };
  } catch (e) {
    if (isDomainError(e)) return { ok: false, domain: e.toJSON() };
    throw e;
  }
}

async function answerAsync<T>(f: () => Promise<T>): Promise<Answer<T>> {
  try {
    return { ok: true, value: await f() };
  } catch (e) {
    if (isDomainError(e)) return { ok: false, domain: e.toJSON() };
    throw e;
  }
}

/** The calculation record as HTML: the check (analysis and every check) and the document, both here. */
function recordHtml(r: RecordRequest): string {
  return renderRecord(publishRecord(r.check, r.raw, r.title));
}

/** A schedule's finish (records, comparison, tonnage, the rationalisation's checks and HiGHS solves) without its marks. */
async function finishWithoutMarks(schedule: ScheduleJson, marks: MarkResult[]): Promise<FinishedWithoutMarks> {
  const { marks: _m, ...rest } = await finishSchedule(schedule, marks);
  return rest;
}

export default function run(msg: AppMessage): Answers[keyof Answers] | Promise<Answers[keyof Answers]> | SliceResult | Explanation | 'pong' {
  switch (msg.kind) {
    case 'check':
      return answer(() => checkSection(msg.input));
    case 'effects':
      return answer(() => effectsOf(msg.input));
    case 'search-task':
      return answer(() => searchTaskOf(msg.input, msg.spaceCap));
    case 'record':
      return answer(() => recordHtml(msg.request));
    case 'finish':
      return answerAsync(() => finishWithoutMarks(msg.schedule, msg.marks));
    default:
      return runSearchMessage(msg);
  }
}
