import { prepareSearch, searchSlice, type SliceResult } from './core.js';
import { problemOf, type SearchTask } from './task.js';

/**
 * Worker-thread entry (piscina): a plain message in, a plain SliceResult out. Domain failures
 * are returned as data; anything thrown here fails only this task.
 */
export interface SliceMessage {
  kind: 'slice';
  task: SearchTask;
  webIdx: number[];
}

export interface PingMessage {
  kind: 'ping';
}

/** Test hook: a deliberately failing task (used to prove the pool survives a crashing worker). */
export interface CrashMessage {
  kind: 'crash';
  how: 'throw' | 'exit';
}

export type WorkerMessage = SliceMessage | PingMessage | CrashMessage;

export default function run(msg: WorkerMessage): SliceResult | 'pong' {
  if (msg.kind === 'ping') return 'pong';
  if (msg.kind === 'crash') {
    if (msg.how === 'exit') process.exit(3);
    throw new Error('deliberate worker failure');
  }
  const prep = prepareSearch(problemOf(msg.task));
  return searchSlice(prep, msg.webIdx);
}
