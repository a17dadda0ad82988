import { monitorEventLoopDelay } from 'node:perf_hooks';
import helmet from '@fastify/helmet';
import underPressure from '@fastify/under-pressure';
import type { FastifyReply, FastifyRequest } from 'fastify';
import fp from 'fastify-plugin';
import { ApiError } from '../errors.js';
import { problemBase, sendProblem } from './problem.js';

export interface GuardOptions {
  /** event-loop delay past which requests (and /health) answer 503 OVERLOADED, ms (default 1000) */
  maxEventLoopDelayMs?: number;
  /** Host header values accepted (host or host:port, case-insensitive); unset: any */
  allowedHosts?: readonly string[];
}

declare module 'fastify' {
  interface FastifyRequest {
    /** what the request's one log line carries besides method, path, status and time */
    logExtra?: Record<string, unknown>;
  }
}

/**
 * The service's guards (issue 16): security headers (helmet), an event-loop lag guard
 * (under-pressure: 503 OVERLOADED with Retry-After, /health included, so a wedged loop shows),
 * the Host allow-list (DNS rebinding against a local instance), 405 for a known path with
 * another method, and one log line per request.
 */
export const guardPlugin = fp<GuardOptions>(
  async (app, opts) => {
    // the API serves JSON and one HTML report without scripts; the docs page needs its own
    // scripts and styles, which @fastify/swagger-ui's staticCSP allows for its routes
    await app.register(helmet, { global: true });

    // under-pressure's delay is a mean over each second (a lagging loop); the health check adds the
    // longest single hold of the last quarter second, so that one wedging hold shows too
    const maxDelay = opts.maxEventLoopDelayMs ?? 1000;
    const holds = monitorEventLoopDelay({ resolution: 20 });
    holds.enable();
    app.addHook('onClose', async () => holds.disable());
    await app.register(underPressure, {
      maxEventLoopDelay: maxDelay,
      healthCheck: async () => {
        const longest = holds.max / 1e6;
        holds.reset();
        return longest <= maxDelay;
      },
      healthCheckInterval: 250,
      retryAfter: 5,
      pressureHandler: (req: FastifyRequest, reply: FastifyReply, type: string, value: number | undefined) => {
        const why = type === 'healthCheck' ? `the event loop was held past ${maxDelay} ms` : `${type}${value !== undefined ? ` ${Math.round(value)}` : ''}`;
        void sendProblem(reply, {
          body: problemBase('OVERLOADED', `the service is overloaded (${why}); retry after Retry-After seconds`, req),
          retryAfter: 5,
          internal: false,
        });
      },
    });

    const hosts = opts.allowedHosts?.map((h) => h.trim().toLowerCase()).filter((h) => h !== '');
    if (hosts && hosts.length > 0) {
      const allowed = new Set(hosts);
      app.addHook('onRequest', async (req) => {
        const host = String(req.headers.host ?? '').toLowerCase();
        const bare = host.replace(/:\d+$/, '');
        if (!allowed.has(host) && !allowed.has(bare)) throw new ApiError('HOST_NOT_ALLOWED', `the Host ${host.slice(0, 100) || '(none)'} is not one this service answers for`);
      });
    }

    // one line per request, at info (503s at warn: load shedding is expected, not a fault)
    app.addHook('onResponse', async (req, reply) => {
      const line = { method: req.method, path: req.url.split('?')[0]!.slice(0, 200), status: reply.statusCode, ms: Math.round(reply.elapsedTime * 10) / 10, ...req.logExtra };
      if (reply.statusCode === 503) req.log.warn(line, 'request');
      else req.log.info(line, 'request');
    });
  },
  { name: 'platesmith-guard', dependencies: ['platesmith-problem'] },
);

/**
 * The routes' paths and methods (collected as they are added), to answer 405 with Allow for a
 * known path asked with another method.
 */
export function methodIndex() {
  const routes: { re: RegExp; method: string }[] = [];
  return {
    add(url: string, method: string | string[]) {
      const re = new RegExp('^' + url.replace(/[.*+?^${}()|[\]\\]/g, '\\$&').replace(/:[^/]+/g, '[^/]+') + '/?$');
      for (const m of Array.isArray(method) ? method : [method]) routes.push({ re, method: m });
    },
    allowed(path: string): string[] {
      return [...new Set(routes.filter((r) => r.re.test(path)).map((r) => r.method))];
    },
  };
}
