import { availableParallelism } from 'node:os';
import { Piscina } from 'piscina';
import { prepareSearch } from './core.js';
import { mergeSlices, type SearchResult } from './search.js';
import { assertSpace, spaceSize } from './space.js';
import { problemOf, type SearchTask } from './task.js';
import type { SliceResult } from './core.js';
import type { WorkerMessage } from './worker.js';

/**
 * The worker pool for searches: created once per process and reused. Runs from TypeScript
 * source (tsx loader, source export condition) or from the build, whichever this file is.
 */
export interface SearchPool {
  piscina: Piscina;
  threads: number;
  close(): Promise<void>;
}

export function createSearchPool(opts: { threads?: number; maxQueue?: number; onError?: (e: unknown) => void } = {}): SearchPool {
  const fromSource = import.meta.url.endsWith('.ts');
  const threads = Math.max(1, opts.threads ?? availableParallelism());
  const piscina = new Piscina({
    filename: new URL(fromSource ? './worker.ts' : './worker.js', import.meta.url).href,
    minThreads: threads,
    maxThreads: threads,
    maxQueue: opts.maxQueue ?? threads * 64,
    ...(fromSource ? { execArgv: ['--conditions=@platesmith/source', '--import', 'tsx'] } : {}),
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
 * The exact search on the pool: the web configurations are cut into contiguous slices (a few per
 * thread, for balance), each worker returns its slice's exact front, and the fronts are merged.
 */
export async function searchOnPool(pool: SearchPool, task: SearchTask, signal?: AbortSignal, onSlice?: (done: number, total: number) => void): Promise<SearchResult> {
  const t0 = performance.now();
  assertSpace(task.space);
  const prep = prepareSearch(problemOf(task));
  const n = prep.webs.length;
  // contiguous runs of the web list keep the layouts of one web plate together (they share
  // failures of layout-free checks); several slices per thread let the pool balance the load
  const nSlices = Math.max(1, Math.min(n, pool.threads * 6));
  const slices: number[][] = [];
  for (let k = 0; k < nSlices; k++) {
    const a = Math.floor((k * n) / nSlices);
    const b = Math.floor(((k + 1) * n) / nSlices);
    if (b > a) slices.push(Array.from({ length: b - a }, (_, i) => a + i));
  }
  let done = 0;
  const results = await Promise.all(
    slices.map((webIdx) =>
      (pool.piscina.run({ kind: 'slice', task, webIdx } satisfies WorkerMessage, signal ? { signal } : {}) as Promise<SliceResult>).then((r) => {
        onSlice?.(++done, slices.length);
        return r;
      }),
    ),
  );
  return mergeSlices(results, performance.now() - t0, pool.threads, n, spaceSize(task.space));
}
