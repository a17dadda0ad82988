import type { FastifyPluginAsyncZod } from 'fastify-type-provider-zod';
import { z } from 'zod';
import { ApiError } from '../errors.js';

/**
 * Test-only route (buildApp({ testHooks: true })): sends the worker's deliberate 'crash' message
 * through the real pool, to prove a failing worker fails its request alone. Not in the OpenAPI.
 */
export const testHookRoutes: FastifyPluginAsyncZod = async (app) => {
  app.post('/_test/crash', { schema: { hide: true, body: z.strictObject({ how: z.enum(['throw', 'exit']) }) } }, async (req) => {
    try {
      await app.searcher.pool.piscina.run({ kind: 'crash', how: req.body.how });
    } catch (e) {
      throw new ApiError('WORKER_FAILED', 'a search worker failed; the pool replaces it, retry the request', { cause: e });
    }
    return { crashed: false };
  });
};
