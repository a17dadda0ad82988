import { isDomainError, type DomainErrorData } from '@platesmith/catalogue';
import type { EffectsSummaryJson, ProblemJson, SearchInput } from '@platesmith/schema';
import type { Explanation, SearchTask, SliceResult } from '@platesmith/search';
import runSearchMessage, { type WorkerMessage as SearchMessage } from '@platesmith/search/worker';
import { checkSection, effectsOf, searchTaskOf, type CheckRequest, type CheckResponse } from './requests.js';

/**
 * The application's worker thread (piscina): the search's slices, and the heavy part of every
 * request (analysis, checks) so that none of it runs on the service's event loop. Messages in
 * and out are plain objects; a domain error comes back as data (a class instance does not
 * survive the thread boundary) and is thrown again on the main thread.
 */
export type RequestMessage =
  | { kind: 'check'; input: CheckRequest }
  | { kind: 'effects'; input: ProblemJson }
  | { kind: 'search-task'; input: SearchInput; spaceCap: number };

export type AppMessage = SearchMessage | RequestMessage;

export type Answer<T> = { ok: true; value: T } | { ok: false; domain: DomainErrorData };

export interface Answers {
  check: Answer<CheckResponse>;
  effects: Answer<EffectsSummaryJson>;
  'search-task': Answer<SearchTask>;
}

function answer<T>(f: () => T): Answer<T> {
  try {
    return { ok: true, value: f() };
  } catch (e) {
    if (isDomainError(e)) return { ok: false, domain: e.toJSON() };
    throw e;
  }
}

export default function run(msg: AppMessage): Answers[keyof Answers] | SliceResult | Explanation | 'pong' {
  switch (msg.kind) {
    case 'check':
      return answer(() => checkSection(msg.input));
    case 'effects':
      return answer(() => effectsOf(msg.input));
    case 'search-task':
      return answer(() => searchTaskOf(msg.input, msg.spaceCap));
    default:
      return runSearchMessage(msg);
  }
}
