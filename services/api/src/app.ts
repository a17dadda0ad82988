import { randomUUID } from 'node:crypto';
import { fastifySSE } from '@fastify/sse';
import { DEFAULT_SPACE_CAP } from '@platesmith/schema';
import { runSchedule } from '@platesmith/schedule';
import Fastify, { LogController, type FastifyBaseLogger, type FastifyInstance, type FastifyServerOptions } from 'fastify';
import { ApiError } from './errors.js';
import { embeddedJobs, type Jobs } from './jobs/jobs.js';
import { JobManager, type JobManagerOptions } from './jobs/manager.js';
import type { ApiKeys } from './keys.js';
import { accessPlugin } from './plugins/access.js';
import { MemoryJobStore, type JobStore } from './jobs/store.js';
import { docsPlugin } from './plugins/docs.js';
import { enginePlugin } from './plugins/engine.js';
import { guardPlugin } from './plugins/guard.js';
import { clientError, frameworkError, problemPlugin } from './plugins/problem.js';
import { checkRoutes } from './routes/checks.js';
import { effectsRoutes } from './routes/effects.js';
import { healthRoutes } from './routes/health.js';
import { recordRoutes } from './routes/records.js';
import { scheduleRoutes } from './routes/schedules.js';
import { searchRoutes } from './routes/searches.js';
import { zodValidator } from './validate.js';
import { metricsRoutes } from './metrics.js';
import { QueueJobs } from './queue/backend.js';
import type { QueueConfig } from './queue/names.js';

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
  /** synchronous requests (checks, effects, searches) on the workers before 503 POOL_SATURATED (default 4 per thread) */
  maxActiveSearches?: number;
  /** default and greatest time budget of a synchronous /v1 POST (check, effects, search), ms (30 000 and 300 000) */
  defaultBudgetMs?: number;
  maxBudgetMs?: number;
  /** the worker module of the pool (default the application's worker; tests pass a fixture worker) */
  workerFile?: string | URL;
  /** cap on the candidates of one space (default DEFAULT_SPACE_CAP) */
  spaceCap?: number;
  /** event-loop delay past which requests and /health answer 503 OVERLOADED, ms (default 1000) */
  maxEventLoopDelayMs?: number;
  /** Host header values answered (host or host:port); unset: any */
  allowedHosts?: readonly string[];
  /** receiving a whole request, ms (default 30 000); its headers, ms (default 10 000); an idle keep-alive socket, ms (default 5 000) */
  requestTimeoutMs?: number;
  headersTimeoutMs?: number;
  keepAliveTimeoutMs?: number;
  /** open connections at once (default 1024); more are refused by the socket */
  maxConnections?: number;
  /** where schedule jobs live (default in memory) */
  jobStore?: JobStore;
  /** marks of schedule jobs searched at once (1: each uses every worker) and jobs queued or running before 503 (100) */
  jobConcurrency?: number;
  maxQueuedJobs?: number;
  /** API keys (PLATESMITH_API_KEYS / _FILE); null or absent: /v1 is open */
  keys?: ApiKeys | null;
  /** requests a minute per key, or per client address without keys; 0: no limit (PLATESMITH_RATE_LIMIT, default 1200) */
  rateLimit?: number;
  /** per-key quota, time budgets and retention of schedule jobs (PLATESMITH_JOB_QUOTA, _MARK_BUDGET_MS, _JOB_BUDGET_MS, _JOB_RETENTION) */
  jobs?: Pick<JobManagerOptions, 'quota' | 'markBudgetMs' | 'jobBudgetMs' | 'retentionMs'>;
  /**
   * the queue backend (PLATESMITH_QUEUE=redis://host:port): jobs in Redis, marks run by `platesmith
   * worker` processes on BullMQ, the rate limit's counts in Redis; absent: the embedded backend
   * (jobStore and this process's pool)
   */
  queue?: QueueConfig;
}

declare module 'fastify' {
  interface FastifyInstance {
    jobs: Jobs;
    /** aborts when the service starts closing: in-flight checks, analyses and searches stop */
    shutdownSignal: AbortSignal;
  }
}

/** A client's request id is echoed only when it is this plain and short. */
const REQUEST_ID = /^[A-Za-z0-9._:-]{1,64}$/;

/** The service as a Fastify instance, not listening (server.ts listens; tests build their own). */
export async function buildApp(opts: ApiOptions = {}): Promise<FastifyInstance> {
  const headersTimeout = opts.headersTimeoutMs ?? 10_000;
  const app = Fastify({
    ...(opts.loggerInstance ? { loggerInstance: opts.loggerInstance } : { logger: opts.logger ?? false }),
    bodyLimit: opts.bodyLimit ?? 1024 * 1024,
    // a client's x-request-id is kept only when short and plain (never an 8 kB echo); else a new one
    genReqId: (req) => {
      const given = req.headers['x-request-id'];
      return typeof given === 'string' && REQUEST_ID.test(given) ? given : randomUUID();
    },
    requestIdHeader: false,
    // one line per request (guard.ts), not fastify's two
    logController: new LogController({ disableRequestLogging: true }),
    onProtoPoisoning: 'error',
    onConstructorPoisoning: 'error',
    return503OnClosing: false,
    // the boot ping waits for the workers to load (up to 60 s on a loaded host): past fastify's 10 s default
    pluginTimeout: 90_000,
    routerOptions: { ignoreTrailingSlash: true },
    requestTimeout: opts.requestTimeoutMs ?? 30_000,
    keepAliveTimeout: opts.keepAliveTimeoutMs ?? 5_000,
    // node checks the request and header timeouts on this interval (30 s by default: too coarse)
    http: { headersTimeout, connectionsCheckingInterval: Math.min(1000, headersTimeout) },
    frameworkErrors: frameworkError,
    clientErrorHandler: clientError,
  });
  app.server.maxConnections = opts.maxConnections ?? 1024;
  // JSON only: a text/plain body is 415, not a string handed to the schema
  app.removeContentTypeParser('text/plain');
  app.setValidatorCompiler(zodValidator);
  // results are plain JSON built by the publish functions; their zod schemas document them
  app.setSerializerCompiler(() => (data) => JSON.stringify(data));

  let closing = false;
  const shutdown = new AbortController();
  app.decorate('shutdownSignal', shutdown.signal);
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
  await app.register(guardPlugin, {
    ...(opts.maxEventLoopDelayMs !== undefined ? { maxEventLoopDelayMs: opts.maxEventLoopDelayMs } : {}),
    ...(opts.allowedHosts !== undefined ? { allowedHosts: opts.allowedHosts } : {}),
  });
  // on the queue backend the jobs live in Redis, and so do the rate limit's counts (shared by every API process)
  const queued = opts.queue
    ? new QueueJobs({
        ...opts.queue,
        ...(opts.jobs?.quota !== undefined ? { quota: opts.jobs.quota } : {}),
        ...(opts.jobs?.retentionMs !== undefined ? { retentionMs: opts.jobs.retentionMs } : {}),
        ...(opts.maxQueuedJobs !== undefined ? { maxActive: opts.maxQueuedJobs } : {}),
        onFailure: (id, err) => app.log.error({ err, jobId: id }, 'schedule job: queue failure'),
      })
    : undefined;
  await app.register(accessPlugin, { keys: opts.keys ?? null, ...(opts.rateLimit !== undefined ? { rateLimit: opts.rateLimit } : {}), ...(queued ? { redis: queued.store.redis } : {}) });
  await app.register(docsPlugin);
  await app.register(fastifySSE, { heartbeatInterval: 15_000 });
  const spaceCap = opts.spaceCap ?? DEFAULT_SPACE_CAP;
  await app.register(enginePlugin, {
    spaceCap,
    ...(opts.threads !== undefined ? { threads: opts.threads } : {}),
    ...(opts.maxActiveSearches !== undefined ? { maxActive: opts.maxActiveSearches } : {}),
    ...(opts.warmUp !== undefined ? { warmUp: opts.warmUp } : {}),
    ...(opts.workerFile !== undefined ? { workerFile: opts.workerFile } : {}),
  });

  // schedules search on the same pool, outside the synchronous searches' gate: each mark takes a
  // fair turn (round-robin over keys, then jobs) within the mark's and the job's time budgets, and
  // on the pool its tasks take turns with the synchronous requests' (flows of the pool's queue)
  const jobs: Jobs = queued ?? embeddedJobs(new JobManager(
    opts.jobStore ?? new MemoryJobStore(),
    (input, signal, onProgress, turn) => runSchedule(input, { search: (task) => turn((s, flow) => app.engine.searchTask(task, s, flow)), onProgress, spaceCap }, signal),
    {
      // the finish (records, tonnage, the rationalisation's checks and HiGHS solves) on a worker, in the job's flow and budget
      finish: (input, marks, signal, flow) => app.engine.finish(input, marks, { signal, flow }),
      ...opts.jobs,
      ...(opts.jobConcurrency !== undefined ? { slots: opts.jobConcurrency } : {}),
      ...(opts.maxQueuedJobs !== undefined ? { maxActive: opts.maxQueuedJobs } : {}),
      onFailure: (id, err) => {
        const code = (err as { code?: unknown } | null)?.code;
        if (code === 'STORE_BUSY') app.log.warn({ jobId: id, code }, 'job store busy: a job write was skipped (the next one carries its state)');
        else app.log.error({ err, jobId: id }, 'schedule job failed');
      },
    },
  ));
  app.decorate('jobs', jobs);
  app.addHook('onReady', async () => {
    // (the queue backend: its first connection to Redis, at most 10 s; the service starts either way)
    await jobs.ready;
    const h = jobs.store.health();
    if (!h.ok) app.log.error({ cause: h.cause }, 'the job store is unusable: schedule routes answer 503 STORE_UNAVAILABLE and /ready 503 until it is repaired or replaced (PLATESMITH_DB), or Redis answers (PLATESMITH_QUEUE)');
  });
  app.addHook('preClose', async () => {
    closing = true;
    shutdown.abort(new DOMException('the service is shutting down', 'AbortError'));
    await jobs.shutdown();
  });
  app.addHook('onClose', async () => {
    await jobs.close();
  });

  const budget = { defaultMs: opts.defaultBudgetMs ?? 30_000, maxMs: opts.maxBudgetMs ?? 300_000 };
  await app.register(healthRoutes);
  await app.register(metricsRoutes);
  await app.register(checkRoutes, { budget });
  await app.register(effectsRoutes, { budget });
  await app.register(searchRoutes, { budget, spaceCap });
  await app.register(scheduleRoutes, { jobs });
  await app.register(recordRoutes, { jobs, budget });
  return app;
}

