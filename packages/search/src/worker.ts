import { prepareSearch, type Evaluated, type Prepared, type SliceResult } from './core.js';
import { explanationOf, type Explanation } from './limits.js';
import { searchSlice, type SlicePart } from './slice/best-first.js';
import { watchStop } from './search.js';
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
  /**
   * a stop flag (one Int32, set to 1 by the pool at the search's time budget): the slice then
   * returns the verified points found so far, marked incomplete
   */
  stop?: SharedArrayBuffer;
  /** progress out: Float64 pairs (settled, size) per slot (part.slot, or 0), written as the slice goes */
  progress?: SharedArrayBuffer;
}

export interface PingMessage {
  kind: 'ping';
}

/** Explain some points of a search's answer (limits.ts): their lighter neighbours judged, and the strongest misses when asked. */
export interface ExplainMessage {
  kind: 'explain';
  task: SearchTask;
  searchId?: string;
  points: Evaluated[];
  /** judge the space's strongest candidates (the answer has neither points nor near misses) */
  misses: boolean;
}

export type WorkerMessage = SliceMessage | PingMessage | ExplainMessage;

export default function run(msg: WorkerMessage): SliceResult | Explanation | 'pong' {
  if (msg.kind === 'ping') return 'pong';
  if (msg.kind === 'explain') return explanationOf(preparedFor(msg), msg.points, msg.misses);
  if (msg.kind !== 'slice') throw new Error(`unknown worker message kind ${String((msg as { kind?: unknown }).kind)}`);
  const runs: [number, number][] = [...(msg.runs ?? [])];
  for (const wi of msg.webIdx ?? []) runs.push([wi, 1]);
  const flag = msg.stop ? new Int32Array(msg.stop) : undefined;
  const w = flag ? watchStop(() => Atomics.load(flag, 0) !== 0) : undefined;
  const out = msg.progress ? new Float64Array(msg.progress) : undefined;
  const slot = 2 * (msg.part?.slot ?? 0);
  const report = out
    ? (settled: number, size: number) => {
        out[slot] = settled;
        out[slot + 1] = size;
      }
    : undefined;
  const r = searchSlice(preparedFor(msg), runs, w?.signal, msg.shared ? new SharedStairs(msg.shared) : undefined, msg.part, report);
  return w?.cut() ? { ...r, complete: false } : r;
}

/** The last searches prepared in this worker (a search's slices all carry its id). */
const prepared = new Map<string, Prepared>();
function preparedFor(msg: SliceMessage | ExplainMessage): Prepared {
  if (msg.searchId === undefined) return prepareSearch(problemOf(msg.task));
  let hit = prepared.get(msg.searchId);
  if (!hit) {
    hit = prepareSearch(problemOf(msg.task));
    prepared.set(msg.searchId, hit);
    while (prepared.size > 2) prepared.delete(prepared.keys().next().value!);
  }
  return hit;
}
