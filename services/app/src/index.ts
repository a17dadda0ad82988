/**
 * @platesmith/app — the one application layer of the service and the CLI: each request from
 * parsed input to published answer (parse → analyse → check or search task → pool → publish),
 * and the engine that runs the heavy part on worker threads within a request's budget.
 */
export { CheckRequest, parseCheckRequest, checkSection, effectsOf, searchTaskOf, publishSearchOf, type CheckResponse } from './requests.js';
export { createEngine, EngineError, isEngineError, type Engine, type EngineOptions, type EngineErrorCode, type RunOptions } from './engine.js';
export type { AppMessage, RequestMessage, Answer, Answers, FinishedWithoutMarks } from './worker.js';
export type { Flow } from '@platesmith/search/pool';
