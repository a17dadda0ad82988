import { createEngine, type Engine } from '@platesmith/app';
import type { ApiOptions } from '../../services/api/src/index.js';
import { QueueWorker, type QueueWorkerOptions } from '../../services/api/src/queue/worker.js';
import { start, type Running } from '../../services/api/test/harness.js';
import { HAVE_REDIS, NO_REDIS, sharedRedis, testPrefix, type RedisServer } from './redis.js';

/**
 * The two job backends the schedule and job tests run on: `embedded` (this process's pool, the
 * store the test gives) and `redis` (the queue backend on a Redis of the test's own or CI's, with
 * one worker of its own in this process, its own engine and key prefix).
 */
export type Backend = 'embedded' | 'redis';
export const BACKENDS: Backend[] = HAVE_REDIS ? ['embedded', 'redis'] : ['embedded'];
/** the name of a backend's describe block (says when the queue's is skipped) */
export const backendName = HAVE_REDIS ? '%s backend' : `%s backend (queue backend ${NO_REDIS})`;

let redis: Promise<RedisServer> | undefined;
/** one Redis per test file (CI's when it started one), stopped by `stopRedis` in the file's afterAll */
export const fileRedis = (): Promise<RedisServer> => (redis ??= sharedRedis());
export async function stopRedis(): Promise<void> {
  if (redis) await (await redis).stop();
  redis = undefined;
}

export interface OnBackend extends Running {
  backend: Backend;
  worker: QueueWorker | null;
  prefix: string | null;
}

/** The service on `backend`; on redis, with `workers` QueueWorkers in this process (each its own engine of one thread). */
export async function startOn(backend: Backend, opts: ApiOptions & { workers?: number; worker?: Partial<QueueWorkerOptions> } = {}): Promise<OnBackend> {
  const { workers = 1, worker: wopts, ...api } = opts;
  if (backend === 'embedded') return { ...(await start(api)), backend, worker: null, prefix: null };
  const r = await fileRedis();
  const prefix = testPrefix();
  const { jobStore: _unused, ...rest } = api;
  const srv = await start({ ...rest, queue: { url: r.url, prefix } });
  const engines: Engine[] = [];
  const ws: QueueWorker[] = [];
  for (let i = 0; i < workers; i++) {
    const engine = createEngine({ threads: 1 });
    engines.push(engine);
    const w = new QueueWorker({ url: r.url, prefix, engine, ...wopts });
    await w.start();
    ws.push(w);
  }
  return {
    ...srv,
    backend,
    worker: ws[0] ?? null,
    prefix,
    close: async () => {
      await Promise.all(ws.map((w) => w.close(500)));
      await srv.close();
      await Promise.all(engines.map((e) => e.close()));
    },
  };
}
