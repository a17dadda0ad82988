import { prepareSearch, type Prepared, type SliceResult } from './core.js';
import { searchSlice, type SlicePart } from './slice/best-first.js';
import { problemOf, type SearchTask } from './task.js';
import { SharedStairs, type SharedStairsData } from './shared-bound.js';

/**
 * Worker-thread entry (piscina): a plain message in, a plain SliceResult out. Domain failures
 * are returned as data; anything thrown here fails only this task.
 */
export interface SliceMessage {
  kind: 'slice';
  task: SearchTask;
  /** the web configurations of the slice: explicit indices, or runs [first index, count] */
  webIdx?: number[];
  runs?: [number, number][];
  /** the staircase shared by the workers of one search (absent: this slice prunes on its own) */
  shared?: SharedStairsData;
  /** this slice's share of the runs of its plates (SlicePart) */
  part?: SlicePart;
  /** the same for every slice of one search: lets a worker prepare the search once */
  searchId?: string;
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
  const runs: [number, number][] = [...(msg.runs ?? [])];
  for (const wi of msg.webIdx ?? []) runs.push([wi, 1]);
  return searchSlice(preparedFor(msg), runs, undefined, msg.shared ? new SharedStairs(msg.shared) : undefined, msg.part);
}

/** The last searches prepared in this worker (a search's slices all carry its id). */
const prepared = new Map<string, Prepared>();
function preparedFor(msg: SliceMessage): Prepared {
  if (msg.searchId === undefined) return prepareSearch(problemOf(msg.task));
  let hit = prepared.get(msg.searchId);
  if (!hit) {
    hit = prepareSearch(problemOf(msg.task));
    prepared.set(msg.searchId, hit);
    while (prepared.size > 2) prepared.delete(prepared.keys().next().value!);
  }
  return hit;
}
