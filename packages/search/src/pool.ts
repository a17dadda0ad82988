import { randomUUID } from 'node:crypto';
import { availableParallelism } from 'node:os';
import { Piscina } from 'piscina';
import { mergeSlices, type SearchResult } from './search.js';
import { explained, needsMisses, type Explanation } from './limits.js';
import { assertSpace, flangeGroups, spaceSize, webPlateCounts } from './space.js';
import type { SearchTask } from './task.js';
import { zeroPrunes, type SliceResult } from './core.js';
import type { WorkerMessage } from './worker.js';
import { createSharedStairs, depthGrid } from './shared-bound.js';
import { warmUpTasks } from './warm-up.js';
import { FairTaskQueue, inFlow, type Flow } from './fair-queue.js';

export { FairTaskQueue, inFlow, type Flow } from './fair-queue.js';

/**
 * The worker pool for searches: created once per process and reused. Runs from TypeScript
 * source (tsx loader, source export condition) or from the build, whichever this file is.
 */
export interface SearchPool {
  piscina: Piscina;
  threads: number;
  close(): Promise<void>;
}

export interface SearchPoolOptions {
  threads?: number;
  maxQueue?: number;
  onError?: (e: unknown) => void;
  /**
   * the worker module (default this package's worker): a module whose default export handles
   * this package's WorkerMessage and may handle more kinds (the application's worker, a test's
   * fixture worker). A .ts file runs with the TypeScript loader.
   */
  filename?: string | URL;
}

export function createSearchPool(opts: SearchPoolOptions = {}): SearchPool {
  const own = import.meta.url.endsWith('.ts') ? './worker.ts' : './worker.js';
  const filename = new URL(opts.filename ?? own, import.meta.url).href;
  const fromSource = filename.endsWith('.ts');
  const threads = Math.max(1, opts.threads ?? availableParallelism());
  const piscina = new Piscina({
    filename,
    minThreads: threads,
    maxThreads: threads,
    maxQueue: opts.maxQueue ?? threads * 64,
    // taken in turns by owner and flow (a request, a schedule job), not first-in first-out
    taskQueue: new FairTaskQueue(),
    // a task taken from the queue when no worker was free goes back to its place (the front),
    // not to the tail: the queue's turns would otherwise be lost at every finished task
    stricterFIFO: true,
    // from source the workers need the TypeScript loader; from the build they need nothing, and
    // inheriting the parent's loader flags (e.g. a TypeScript bench script) makes them 2× slower
    execArgv: fromSource ? ['--conditions=@platesmith/source', '--import', 'tsx'] : [],
  });
  // a worker that fails to load while the pool is idle emits 'error': never leave it unhandled
  piscina.on('error', (e: unknown) => opts.onError?.(e));
  return { piscina, threads, close: () => piscina.destroy() };
}

/** Resolves when a worker answers (fails fast when the worker module cannot load). */
export async function pingPool(pool: SearchPool, signal?: AbortSignal): Promise<void> {
  await pool.piscina.run({ kind: 'ping' } satisfies WorkerMessage, signal ? { signal } : {});
}

/**
 * The exact search on the pool: one slice per thread, each taking a fixed share of the runs of
 * flange pairs of every web plate (a run keeps every stiffener layout of its plates, which share
 * checks), each worker returns its slice's exact front, and the fronts are merged. While they run
 * the workers share a staircase of feasible values by depth (shared-bound.ts) so that one
 * worker's light sections prune the others' nodes at once.
 */
export interface PoolSearchOptions {
  /** aborts at once (the client went away): the workers are stopped and the search rejects */
  signal?: AbortSignal;
  /**
   * stops the search cooperatively (a time budget): each worker returns the verified points it
   * has found so far, and the answer is `aborted`
   */
  stop?: AbortSignal;
  /** after `stop`, how long the workers may take to return before they are aborted, ms (default 2000) */
  stopGraceMs?: number;
  onSlice?: (done: number, total: number) => void;
  /**
   * the work done, a few times a second while the slices run: candidates settled (judged, or ruled
   * out by a bound or the rules) out of the candidates the slices hold
   */
  onProgress?: (settled: number, size: number) => void;
  /** each Pareto point with what rules out its lighter neighbours, and the nearest misses always present (limits.ts), judged on the workers */
  explain?: boolean;
  /** whose search this is: its tasks take turns on the pool's queue with other flows' (FairTaskQueue) */
  flow?: Flow;
}

/** How often the pool reads the slices' progress, ms. */
const PROGRESS_MS = 250;

export async function searchOnPool(pool: SearchPool, task: SearchTask, o: PoolSearchOptions = {}): Promise<SearchResult> {
  const onSlice = o.onSlice;
  const t0 = performance.now();
  assertSpace(task.space);
  // plates as contiguous runs of web indices (webConfigs order), counted without building them: a short message
  const fySource = task.options.fySource;
  const groups = flangeGroups(task.space, fySource);
  const counts = webPlateCounts(task.space, fySource);
  const plates: [number, number][] = [];
  let n = 0;
  for (const c of counts) {
    if (c > 0) plates.push([n, c]);
    n += c;
  }
  // every slice gets every plate and takes its own share of their runs (SlicePart): a fine,
  // fixed deal, so that each worker has about its share of the light runs near the front
  const nSlices = Math.max(1, pool.threads);
  const shared = createSharedStairs(depthGrid(task.space, groups));
  const searchId = randomUUID();
  // the stop flag the workers poll (only when a stop is asked for: a search without one runs as
  // before); past the grace the slices still running are aborted outright
  const stopFlag = new SharedArrayBuffer(4);
  const late = new AbortController();
  const runSignal = o.signal ? AbortSignal.any([o.signal, late.signal]) : late.signal;
  let grace: ReturnType<typeof setTimeout> | undefined;
  const onStop = (): void => {
    Atomics.store(new Int32Array(stopFlag), 0, 1);
    grace = setTimeout(() => late.abort(new DOMException('the search did not stop within its grace', 'AbortError')), o.stopGraceMs ?? 2000);
  };
  if (o.stop?.aborted) onStop();
  else o.stop?.addEventListener('abort', onStop, { once: true });
  let done = 0;
  // the slices write (settled, size) pairs here; read a few times a second for onProgress
  const progressBuf = o.onProgress ? new SharedArrayBuffer(16 * nSlices) : undefined;
  let lastSettled = -1;
  const readProgress = (): void => {
    const v = new Float64Array(progressBuf!);
    let settled = 0;
    let size = 0;
    for (let k = 0; k < nSlices; k++) {
      settled += v[2 * k]!;
      size += v[2 * k + 1]!;
    }
    if (size > 0 && settled !== lastSettled) {
      lastSettled = settled;
      o.onProgress!(settled, size);
    }
  };
  const ticker = progressBuf ? setInterval(readProgress, PROGRESS_MS) : undefined;
  try {
    const settled = await Promise.allSettled(
      Array.from({ length: nSlices }, (_, slot) =>
        (pool.piscina.run(inFlow({ kind: 'slice', task, runs: plates, shared, searchId, ...(o.stop ? { stop: stopFlag } : {}), ...(progressBuf ? { progress: progressBuf } : {}), ...(nSlices > 1 ? { part: { slot, of: nSlices } } : {}) } satisfies WorkerMessage, o.flow), { signal: runSignal }) as Promise<SliceResult>).then((r) => {
          onSlice?.(++done, nSlices);
          return r;
        }),
      ),
    );
    if (o.signal?.aborted) throw o.signal.reason;
    if (progressBuf) readProgress();
    const results: SliceResult[] = [];
    for (const s of settled) {
      if (s.status === 'fulfilled') results.push(s.value);
      // a slice aborted after its grace: its points are lost, the answer is incomplete
      else if (late.signal.aborted) results.push({ front: [], nearMisses: [], spaceSize: 0, fullEvaluations: 0, pruned: zeroPrunes(), failedBy: {}, complete: false });
      else throw s.reason;
    }
    const merged = mergeSlices(results, performance.now() - t0, pool.threads, n, spaceSize(task.space));
    if (!o.explain) return merged;
    // the points dealt round-robin to the workers (deeper points have heavier plates, not more work)
    const parts = Array.from({ length: Math.max(1, Math.min(pool.threads, merged.pareto.length)) }, (_, k) => merged.pareto.filter((_, i) => i % pool.threads === k));
    const misses = needsMisses(merged);
    const answers = await Promise.all(
      parts.map((points, k) => pool.piscina.run(inFlow({ kind: 'explain', task, searchId, points, misses: misses && k === 0 } satisfies WorkerMessage, o.flow), o.signal ? { signal: o.signal } : {}) as Promise<Explanation>),
    );
    const explainedPoints: Explanation['points'] = new Array(merged.pareto.length);
    answers.forEach((a, k) => a.points.forEach((x, j) => (explainedPoints[j * pool.threads + k] = x)));
    return { ...explained(merged, { points: explainedPoints, misses: answers[0]!.misses }), stats: { ...merged.stats, wallMs: performance.now() - t0 } };
  } finally {
    clearInterval(ticker);
    clearTimeout(grace);
    o.stop?.removeEventListener('abort', onStop);
  }
}

/**
 * Runs the warm-up searches (warm-up.ts) on the pool, `rounds` times each, so that the first real
 * search does not pay for the workers' compilation. Resolves with the time taken, ms. A long-lived
 * service calls it once after start; searches that arrive meanwhile queue behind it.
 */
export async function warmPool(pool: SearchPool, rounds = 3, signal?: AbortSignal): Promise<number> {
  const t0 = performance.now();
  const tasks = warmUpTasks();
  for (let r = 0; r < rounds; r++) for (const t of tasks) await searchOnPool(pool, t, signal ? { signal } : {});
  return performance.now() - t0;
}

