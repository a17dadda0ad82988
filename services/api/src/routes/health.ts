import type { FastifyPluginAsyncZod } from 'fastify-type-provider-zod';
import { ProblemDetailsJson } from '../problem-json.js';
import { z } from 'zod';
import { ApiError } from '../errors.js';

export const healthRoutes: FastifyPluginAsyncZod = async (app) => {
  app.get(
    '/health',
    { schema: { tags: ['service'], summary: 'Liveness: the process answers', response: { 200: z.object({ status: z.literal('ok') }) } } },
    async () => ({ status: 'ok' as const }),
  );
  app.get(
    '/ready',
    {
      schema: {
        tags: ['service'],
        summary: 'Readiness: the search worker pool answered a ping',
        response: { 200: z.object({ status: z.literal('ready'), threads: z.number(), activeSearches: z.number() }), 503: ProblemDetailsJson },
      },
    },
    async () => {
      try {
        await app.engine.ping(AbortSignal.timeout(5000));
      } catch (e) {
        throw new ApiError('NOT_READY', 'the search worker pool did not answer a ping within 5 s', { retryAfter: 5, cause: e });
      }
      return { status: 'ready' as const, threads: app.engine.threads, activeSearches: app.engine.active() };
    },
  );
};
