/**
 * @platesmith/api — the HTTP service: Fastify app factory, error codes, job store, OpenAPI.
 */
export { buildApp, type ApiOptions } from './app.js';
export { startServer } from './server.js';
export { SETTINGS, optionsFromEnv } from './settings.js';
export { ERROR_CODES, ApiError, RequestInvalid, problemType, type ErrorCode } from './errors.js';
export { MemoryJobStore, TERMINAL, summaryOf, type JobStore, type JobRecord, type JobSummary, type JobPatch, type JobState, type StoreHealth } from './jobs/store.js';
export { JobManager, JOB_DEFAULTS, type JobEvent, type ScheduleWork, type JobManagerOptions, type Turn } from './jobs/manager.js';
export { FairGate } from './jobs/fair.js';
export { ApiKeys, parseKeys, MIN_KEY_LENGTH } from './keys.js';
export { settingsFromEnv, parseDuration } from './team-settings.js';
export { DEFAULT_RATE_LIMIT, AUTH_FAILURES_PER_MINUTE } from './plugins/access.js';
export { generateOpenApi, GENERATED_NOTE } from './openapi.js';
export { API_DESCRIPTION, API_VERSION } from './plugins/docs.js';
export { ProblemDetailsJson } from './problem-json.js';
export { JobStatusJson, statusOf } from './routes/schedules.js';
export { SqliteJobStore, openJobStore, JOB_STORE_VERSION, DEFAULT_DB_PATH, DEFAULT_BUSY_TIMEOUT_MS } from './jobs/sqlite.js';
export type { Jobs } from './jobs/jobs.js';
export { RedisJobStore } from './queue/redis-store.js';
export { QueueJobs } from './queue/backend.js';
export { QueueWorker } from './queue/worker.js';
export { startWorker } from './queue/run-worker.js';
export { marksQueue, redisOptions, type QueueConfig } from './queue/names.js';
