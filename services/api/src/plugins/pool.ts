import { createSearchPool, pingPool, searchOnPool, warmPool, type SearchPool } from '@platesmith/search/pool';
import { isDomainError } from '@platesmith/catalogue';
import type { SearchResult, SearchTask } from '@platesmith/search';
import fp from 'fastify-plugin';
import { ApiError } from '../errors.js';

export interface PoolOptions {
  /** worker threads (default: the cores) */
  threads?: number;
  /** searches in flight at once before 503 (default 4 per thread) */
  maxActiveSearches?: number;
  /** how long the boot ping may take, ms (default 60 000) */
  bootPingMs?: number;
  /** after the boot ping, run small invented searches in the background so the first user's search finds the workers compiled (default off) */
  warmUp?: boolean;
}

/** The search service of this process: the one piscina pool, an admission gate, errors mapped. */
export interface Searcher {
  pool: SearchPool;
  /** searches now in flight */
  active(): number;
  /**
   * Runs one search. `budget` (when given) is the time-budget signal and `client` the
   * disconnect signal; both abort the workers. Throws ApiError or DomainError.
   */
  run(task: SearchTask, signals: { client?: AbortSignal; budget?: AbortSignal; budgetMs?: number }): Promise<SearchResult>;
}

declare module 'fastify' {
  interface FastifyInstance {
    searcher: Searcher;
  }
}

export const poolPlugin = fp<PoolOptions>(
  async (app, opts) => {
    const pool = createSearchPool({ ...(opts.threads !== undefined ? { threads: opts.threads } : {}), onError: (e) => app.log.error({ err: e }, 'search pool error') });
    const max = opts.maxActiveSearches ?? pool.threads * 4;
    let active = 0;
    // a shutdown stops the searches in flight (503 SHUTTING_DOWN), or their requests would hold the close past its grace
    const closing = new AbortController();
    app.addHook('preClose', async () => closing.abort());
    const searcher: Searcher = {
      pool,
      active: () => active,
      async run(task, { client, budget, budgetMs }) {
        if (active >= max) throw new ApiError('POOL_SATURATED', `${active} searches are in flight (the limit is ${max})`, { retryAfter: 1 });
        const signals = [client, budget, closing.signal].filter((s): s is AbortSignal => s !== undefined);
        active++;
        try {
          return await searchOnPool(pool, task, signals.length ? AbortSignal.any(signals) : undefined);
        } catch (e) {
          if (isDomainError(e)) throw e;
          if (closing.signal.aborted) throw new ApiError('SHUTTING_DOWN', 'the service is shutting down; the search was stopped', { retryAfter: 5 });
          if (budget?.aborted) throw new ApiError('TIME_BUDGET_EXCEEDED', `the search was aborted at its time budget of ${budgetMs} ms; narrow the space or raise budgetMs`, { extra: { budgetMs } });
          if (client?.aborted) throw new ApiError('INTERNAL', 'the client went away; the search was aborted', { cause: e });
          if (e instanceof Error && /queue is at limit/i.test(e.message)) throw new ApiError('POOL_SATURATED', 'the search queue is full', { retryAfter: 1 });
          throw new ApiError('WORKER_FAILED', 'a search worker failed; the pool replaces it, retry the request', { cause: e });
        } finally {
          active--;
        }
      },
    };
    app.decorate('searcher', searcher);
    // fail fast when the worker module cannot load (a missing build, a bad loader)
    const warming = new AbortController();
    app.addHook('onReady', async () => {
      await pingPool(pool, AbortSignal.timeout(opts.bootPingMs ?? 60_000));
      if (opts.warmUp) {
        // not awaited: the service is ready at once, and searches that arrive meanwhile queue behind it
        warmPool(pool, 2, warming.signal).then(
          (ms) => app.log.info({ ms: Math.round(ms) }, 'search workers warmed up'),
          (err: unknown) => {
            if (!warming.signal.aborted) app.log.warn({ err }, 'search warm-up failed (searches still work, the first is slower)');
          },
        );
      }
    });
    app.addHook('onClose', async () => {
      warming.abort();
      await pool.close();
    });
  },
  { name: 'platesmith-pool' },
);

export { pingPool };
