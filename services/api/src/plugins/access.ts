import rateLimit from '@fastify/rate-limit';
import fp from 'fastify-plugin';
import type { Redis } from 'ioredis';
import { ApiError } from '../errors.js';
import type { ApiKeys } from '../keys.js';

/**
 * Default of PLATESMITH_RATE_LIMIT: requests a minute per key (or per client address without
 * keys). A key's quota of 10 jobs, each polled once a second (the Retry-After of the status
 * route), is 600 a minute: twice that leaves room for submitting and reading results, and still
 * stops a flood (heavy work has its own admission limits).
 */
export const DEFAULT_RATE_LIMIT = 1200;

/** Requests without a valid key one client address may make a minute before 429 (bounds key guessing). */
export const AUTH_FAILURES_PER_MINUTE = 30;

export interface AccessOptions {
  /** the API keys; null or absent: every /v1 route is open */
  keys?: ApiKeys | null;
  /** requests a minute per key, or per client address when keys are off; 0 turns the limit off (default DEFAULT_RATE_LIMIT) */
  rateLimit?: number;
  /** keep the counts in Redis (the queue backend: every API process counts against the same limits) */
  redis?: Redis;
}

declare module 'fastify' {
  interface FastifyRequest {
    /** id of the API key of the request (never the secret); null when keys are off */
    keyId: string | null;
  }
}

// /metrics tells the queue's depth and the jobs' counts: behind the keys too
const guarded = (url: string): boolean => url === '/v1' || url.startsWith('/v1/') || url.startsWith('/v1?') || url === '/metrics' || url.startsWith('/metrics?');

/**
 * Who may call the /v1 routes, and how often. With keys on, every /v1 request needs
 * `Authorization: Bearer <key>` (401 problem+json otherwise; /health, /ready and the docs stay
 * open); the key's id goes into the request's log lines and onto the jobs it creates. Then a
 * fixed window of `rateLimit` requests a minute per key (per client address without keys), with
 * @fastify/rate-limit: 429 RATE_LIMITED with Retry-After past it. Requests with no or a wrong key
 * count per address too: past AUTH_FAILURES_PER_MINUTE they get 429 instead of 401.
 */
export const accessPlugin = fp<AccessOptions>(
  async (app, opts) => {
    const keys = opts.keys ?? null;
    const max = opts.rateLimit ?? DEFAULT_RATE_LIMIT;
    app.decorateRequest('keyId', null);
    // registered even with no limit: its createRateLimit counts failed keys
    await app.register(rateLimit, {
      global: max > 0,
      max: Math.max(1, max),
      timeWindow: 60_000,
      // while Redis is down the limit is not counted (checks and searches still answer; job routes answer 503)
      ...(opts.redis ? { redis: opts.redis, nameSpace: 'platesmith-rate:', skipOnError: true } : {}),
      // runs after the key hook below (a route's hooks run after the instance's): the key when there is one
      keyGenerator: (req) => (req.keyId !== null ? `key:${req.keyId}` : `ip:${req.ip}`),
      allowList: (req) => !guarded(req.url),
      errorResponseBuilder: (_req, ctx) =>
        new ApiError('RATE_LIMITED', `over ${ctx.max} requests a minute; retry in ${ctx.after}`, { retryAfter: Math.max(1, Math.ceil(ctx.ttl / 1000)), extra: { limit: ctx.max } }),
    });
    if (!keys) return;
    // guessing keys: past AUTH_FAILURES_PER_MINUTE failures from one address, 429 instead of 401
    const failure = app.createRateLimit({ max: AUTH_FAILURES_PER_MINUTE, timeWindow: 60_000, keyGenerator: (req) => `auth:${req.ip}` });
    app.addHook('onRequest', async (req, reply) => {
      if (!guarded(req.url)) return;
      const m = /^Bearer[ ]+([^\s]+)[ ]*$/i.exec(req.headers.authorization ?? '');
      const id = m ? keys.identify(m[1]!) : undefined;
      if (id === undefined) {
        const count = await failure(req);
        if (!count.isAllowed && count.isExceeded) {
          throw new ApiError('RATE_LIMITED', `over ${AUTH_FAILURES_PER_MINUTE} requests a minute without a valid key from this address`, { retryAfter: Math.max(1, count.ttlInSeconds), extra: { limit: AUTH_FAILURES_PER_MINUTE } });
        }
        void reply.header('www-authenticate', 'Bearer realm="platesmith"');
        throw new ApiError('UNAUTHORIZED', m ? 'the bearer key is not one of this service\'s keys' : 'this service needs Authorization: Bearer <key> on every /v1 route');
      }
      req.keyId = id;
      // the key's id (never the secret) on every later log line of the request, the completion line too
      req.log = req.log.child({ key: id });
      reply.log = req.log;
    });
  },
  { name: 'platesmith-access' },
);
