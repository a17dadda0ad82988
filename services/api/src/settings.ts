import type { ApiOptions } from './app.js';
import { redisOptions } from './queue/names.js';

/**
 * The service's settings from the environment, each with its default (README, team service;
 * DEVELOPERS). A value that is not what its name says stops the start with a message naming it.
 */
export const SETTINGS = [
  { name: 'PLATESMITH_THREADS', what: 'worker threads', default: 'the cores' },
  { name: 'PLATESMITH_MAX_ACTIVE', what: 'checks, analyses and searches on the workers at once before 503 POOL_SATURATED', default: '4 per thread' },
  { name: 'PLATESMITH_BUDGET_MS', what: 'default time budget of a synchronous /v1 POST, ms', default: '30000' },
  { name: 'PLATESMITH_MAX_BUDGET_MS', what: 'greatest budgetMs a request may ask for, ms', default: '300000' },
  { name: 'PLATESMITH_MAX_EVENT_LOOP_DELAY_MS', what: 'event-loop delay past which requests and /health answer 503 OVERLOADED, ms', default: '1000' },
  { name: 'PLATESMITH_REQUEST_TIMEOUT_MS', what: 'time to receive a whole request, ms', default: '30000' },
  { name: 'PLATESMITH_HEADERS_TIMEOUT_MS', what: 'time to receive a request\'s headers, ms', default: '10000' },
  { name: 'PLATESMITH_KEEP_ALIVE_TIMEOUT_MS', what: 'idle keep-alive connection kept, ms', default: '5000' },
  { name: 'PLATESMITH_MAX_CONNECTIONS', what: 'open connections at once', default: '1024' },
  { name: 'PLATESMITH_QUEUE', what: 'the queue backend: jobs in Redis, marks run by platesmith worker processes (redis://host:port[/db])', default: 'unset: embedded (SQLite, this process)' },
  { name: 'PLATESMITH_QUEUE_PREFIX', what: 'prefix of the queue backend\'s Redis keys (several services on one Redis)', default: 'platesmith' },
  { name: 'PLATESMITH_ALLOWED_HOSTS', what: 'Host header values answered, comma-separated (host or host:port); others get 421', default: 'unset: any' },
] as const;

function int(env: NodeJS.ProcessEnv, name: string, min: number, max: number): number | undefined {
  const v = env[name];
  if (v === undefined || v === '') return undefined;
  if (!/^[0-9]{1,10}$/.test(v) || Number(v) < min || Number(v) > max) throw new Error(`${name} must be a whole number from ${min} to ${max}, got '${v.slice(0, 40)}'`);
  return Number(v);
}

/** ApiOptions from the environment (only what is set; buildApp holds the defaults). */
export function optionsFromEnv(env: NodeJS.ProcessEnv = process.env): ApiOptions {
  const o: ApiOptions = {};
  const set = <K extends keyof ApiOptions>(k: K, v: ApiOptions[K] | undefined) => {
    if (v !== undefined) o[k] = v;
  };
  set('threads', int(env, 'PLATESMITH_THREADS', 1, 256));
  set('maxActiveSearches', int(env, 'PLATESMITH_MAX_ACTIVE', 1, 10_000));
  set('defaultBudgetMs', int(env, 'PLATESMITH_BUDGET_MS', 100, 3_600_000));
  set('maxBudgetMs', int(env, 'PLATESMITH_MAX_BUDGET_MS', 100, 3_600_000));
  set('maxEventLoopDelayMs', int(env, 'PLATESMITH_MAX_EVENT_LOOP_DELAY_MS', 10, 600_000));
  set('requestTimeoutMs', int(env, 'PLATESMITH_REQUEST_TIMEOUT_MS', 1000, 3_600_000));
  set('headersTimeoutMs', int(env, 'PLATESMITH_HEADERS_TIMEOUT_MS', 1000, 3_600_000));
  set('keepAliveTimeoutMs', int(env, 'PLATESMITH_KEEP_ALIVE_TIMEOUT_MS', 100, 3_600_000));
  set('maxConnections', int(env, 'PLATESMITH_MAX_CONNECTIONS', 1, 1_000_000));
  const queue = env['PLATESMITH_QUEUE']?.trim();
  if (queue) {
    redisOptions(queue);
    const prefix = env['PLATESMITH_QUEUE_PREFIX']?.trim();
    if (prefix && !/^[A-Za-z0-9_.-]{1,40}$/.test(prefix)) throw new Error(`PLATESMITH_QUEUE_PREFIX must be 1 to 40 letters, digits, '_', '.' or '-', got '${prefix.slice(0, 40)}'`);
    o.queue = { url: queue, ...(prefix ? { prefix } : {}) };
  }
  const hosts = env['PLATESMITH_ALLOWED_HOSTS'];
  if (hosts !== undefined && hosts.trim() !== '') o.allowedHosts = hosts.split(',').map((h) => h.trim()).filter((h) => h !== '');
  if (o.defaultBudgetMs !== undefined && o.maxBudgetMs !== undefined && o.defaultBudgetMs > o.maxBudgetMs) throw new Error('PLATESMITH_BUDGET_MS must not exceed PLATESMITH_MAX_BUDGET_MS');
  return o;
}
