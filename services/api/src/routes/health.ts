import type { FastifyPluginAsyncZod } from 'fastify-type-provider-zod';
import { ProblemDetailsJson } from '../problem-json.js';
import { z } from 'zod';
import { ApiError } from '../errors.js';

export const healthRoutes: FastifyPluginAsyncZod = async (app) => {
  app.get(
    '/health',
    { schema: { operationId: 'getHealth', tags: ['service'], summary: 'Liveness: the process answers', response: { 200: z.object({ status: z.literal('ok') }) } } },
    async () => ({ status: 'ok' as const }),
  );
  app.get(
    '/ready',
    {
      schema: {
        operationId: 'getReadiness',
        tags: ['service'],
        summary: 'Readiness: the search worker pool answered a ping and the job store is usable: SQLite, or Redis on the queue backend (503 NOT_READY names the cause)',
        response: {
          200: z.object({
            status: z.literal('ready'),
            threads: z.number(),
            activeSearches: z.number(),
            jobs: z.enum(['embedded', 'redis']).meta({ description: 'where schedule jobs run: embedded (this process, SQLite) or redis (the queue, PLATESMITH_QUEUE)' }),
          }),
          503: ProblemDetailsJson,
        },
        errors: ['NOT_READY'],
      },
    },
    async () => {
      const store = app.jobs.store.health();
      if (!store.ok) throw new ApiError('NOT_READY', `the job store is unusable: ${store.cause}`, { retryAfter: 30 });
      try {
        await app.engine.ping(AbortSignal.timeout(5000));
      } catch (e) {
        throw new ApiError('NOT_READY', 'the search worker pool did not answer a ping within 5 s', { retryAfter: 5, cause: e });
      }
      return { status: 'ready' as const, threads: app.engine.threads, activeSearches: app.engine.active(), jobs: app.jobs.backend };
    },
  );
};
