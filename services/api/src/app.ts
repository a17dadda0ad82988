import { randomUUID } from 'node:crypto';
import { fastifySSE } from '@fastify/sse';
import { DEFAULT_SPACE_CAP } from '@platesmith/schema';
import { searchOnPool } from '@platesmith/search/pool';
import Fastify, { type FastifyBaseLogger, type FastifyInstance, type FastifyServerOptions } from 'fastify';
import { ApiError } from './errors.js';
import { runScheduleJob } from './domain.js';
import { JobManager } from './jobs/manager.js';
import { MemoryJobStore, type JobStore } from './jobs/store.js';
import { docsPlugin } from './plugins/docs.js';
import { poolPlugin } from './plugins/pool.js';
import { problemPlugin } from './plugins/problem.js';
import { checkRoutes } from './routes/checks.js';
import { effectsRoutes } from './routes/effects.js';
import { healthRoutes } from './routes/health.js';
import { recordRoutes } from './routes/records.js';
import { scheduleRoutes } from './routes/schedules.js';
import { searchRoutes } from './routes/searches.js';
import { testHookRoutes } from './routes/test-hooks.js';
import { zodValidator } from './validate.js';

export interface ApiOptions {
  /** fastify's logger option (pino options or true/false); default false */
  logger?: FastifyServerOptions['logger'];
  /** a pino logger to use instead (e.g. one writing to a test stream) */
  loggerInstance?: FastifyBaseLogger;
  /** request body limit, bytes (default 1 MiB) */
  bodyLimit?: number;
  /** search worker threads (default: the cores) */
  threads?: number;
  /** warm the search workers up in the background once ready (default off; the server turns it on) */
  warmUp?: boolean;
  /** synchronous searches in flight before 503 POOL_SATURATED (default 4 per thread) */
  maxActiveSearches?: number;
  /** default and greatest time budget of a synchronous search, ms (30 000 and 300 000) */
  defaultBudgetMs?: number;
  maxBudgetMs?: number;
  /** cap on the candidates of one space (default DEFAULT_SPACE_CAP) */
  spaceCap?: number;
  /** where schedule jobs live (default in memory) */
  jobStore?: JobStore;
  /** schedule jobs run at once (1) and queued before 503 (100) */
  jobConcurrency?: number;
  maxQueuedJobs?: number;
  /** adds the internal test routes (worker crash); never in production */
  testHooks?: boolean;
}

declare module 'fastify' {
  interface FastifyInstance {
    jobs: JobManager;
  }
}

/** The service as a Fastify instance, not listening (server.ts listens; tests build their own). */
export async function buildApp(opts: ApiOptions = {}): Promise<FastifyInstance> {
  const app = Fastify({
    ...(opts.loggerInstance ? { loggerInstance: opts.loggerInstance } : { logger: opts.logger ?? false }),
    bodyLimit: opts.bodyLimit ?? 1024 * 1024,
    genReqId: () => randomUUID(),
    requestIdHeader: 'x-request-id',
    onProtoPoisoning: 'error',
    onConstructorPoisoning: 'error',
    return503OnClosing: false,
    routerOptions: { ignoreTrailingSlash: true },
  });
  // JSON only: a text/plain body is 415, not a string handed to the schema
  app.removeContentTypeParser('text/plain');
  app.setValidatorCompiler(zodValidator);
  // results are plain JSON built by the publish functions; their zod schemas document them
  app.setSerializerCompiler(() => (data) => JSON.stringify(data));

  let closing = false;
  app.addHook('onRequest', async (req, reply) => {
    void reply.header('x-request-id', String(req.id));
    if (closing) throw new ApiError('SHUTTING_DOWN', 'the service is shutting down', { retryAfter: 5 });
  });
  // keep-alive sockets would hold the close open (a request finished while closing answers "connection: close")
  app.addHook('onSend', async (_req, reply, payload) => {
    if (closing) void reply.header('connection', 'close');
    return payload;
  });

  await app.register(problemPlugin);
  await app.register(docsPlugin);
  await app.register(fastifySSE, { heartbeatInterval: 15_000 });
  await app.register(poolPlugin, {
    ...(opts.threads !== undefined ? { threads: opts.threads } : {}),
    ...(opts.maxActiveSearches !== undefined ? { maxActiveSearches: opts.maxActiveSearches } : {}),
    ...(opts.warmUp !== undefined ? { warmUp: opts.warmUp } : {}),
  });

  const spaceCap = opts.spaceCap ?? DEFAULT_SPACE_CAP;
  // schedules search on the same pool, one job at a time, outside the synchronous searches' gate
  const jobs = new JobManager(
    opts.jobStore ?? new MemoryJobStore(),
    (input, signal, onProgress) => runScheduleJob(input, (task, s) => searchOnPool(app.searcher.pool, task, s), signal, onProgress, spaceCap),
    {
      ...(opts.jobConcurrency !== undefined ? { concurrency: opts.jobConcurrency } : {}),
      ...(opts.maxQueuedJobs !== undefined ? { maxQueued: opts.maxQueuedJobs } : {}),
      onFailure: (id, err) => app.log.error({ err, jobId: id }, 'schedule job failed'),
    },
  );
  app.decorate('jobs', jobs);
  app.addHook('preClose', async () => {
    closing = true;
    await jobs.shutdown();
  });
  app.addHook('onClose', async () => {
    await jobs.store.close();
  });

  await app.register(healthRoutes);
  await app.register(checkRoutes);
  await app.register(effectsRoutes);
  await app.register(searchRoutes, { defaultBudgetMs: opts.defaultBudgetMs ?? 30_000, maxBudgetMs: opts.maxBudgetMs ?? 300_000, spaceCap });
  await app.register(scheduleRoutes, { jobs });
  await app.register(recordRoutes, { jobs });
  if (opts.testHooks) await app.register(testHookRoutes);
  return app;
}

