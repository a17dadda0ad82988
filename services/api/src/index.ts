/**
 * @platesmith/api — the HTTP service: Fastify app factory, error codes, job store, OpenAPI.
 */
export { buildApp, type ApiOptions } from './app.js';
export { startServer } from './server.js';
export { SETTINGS, optionsFromEnv } from './settings.js';
export { ERROR_CODES, ApiError, RequestInvalid, problemType, type ErrorCode } from './errors.js';
export { MemoryJobStore, TERMINAL, type JobStore, type JobRecord, type JobPatch, type JobState } from './jobs/store.js';
export { JobManager, type JobEvent, type ScheduleWork, type JobManagerOptions } from './jobs/manager.js';
export { generateOpenApi, GENERATED_NOTE } from './openapi.js';
export { API_DESCRIPTION, API_VERSION } from './plugins/docs.js';
export { ProblemDetailsJson } from './problem-json.js';
export { JobStatusJson, statusOf } from './routes/schedules.js';
export { SqliteJobStore, openJobStore, JOB_STORE_VERSION, DEFAULT_DB_PATH } from './jobs/sqlite.js';
