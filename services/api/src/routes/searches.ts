import { ProblemDetailsJson, PublishedSearchJson, SearchInput } from '@platesmith/schema';
import type { FastifyPluginAsyncZod } from 'fastify-type-provider-zod';
import { z } from 'zod';
import { searchPlates } from '../domain.js';
import { clientGone } from '../signal.js';

export interface SearchRouteOptions {
  defaultBudgetMs: number;
  maxBudgetMs: number;
  spaceCap: number;
}

export const searchRoutes: FastifyPluginAsyncZod<SearchRouteOptions> = async (app, opts) => {
  const Query = z.object({
    budgetMs: z.coerce
      .number({ error: 'budgetMs must be a number of ms' })
      .int()
      .min(100)
      .max(opts.maxBudgetMs)
      .optional()
      .meta({ description: `time budget of the search, ms (default ${opts.defaultBudgetMs}, at most ${opts.maxBudgetMs}); past it the search is aborted with 503 TIME_BUDGET_EXCEEDED` }),
  });
  app.post(
    '/v1/searches',
    {
      schema: {
        operationId: 'searchGirders',
        tags: ['searches'],
        summary: 'Exact search of the plate space: the Pareto set of overall depth against mass or cost',
        description: `Synchronous. The space may hold at most ${opts.spaceCap.toExponential(0)} candidates (422 SPACE_TOO_LARGE names the size and the cap). No feasible section is a 200 answer with an empty pareto and the nearest misses.`,
        querystring: Query,
        body: SearchInput,
        response: { 200: PublishedSearchJson, 400: ProblemDetailsJson, 422: ProblemDetailsJson, 503: ProblemDetailsJson },
        errors: ['UNPROCESSABLE', 'POOL_SATURATED', 'TIME_BUDGET_EXCEEDED', 'WORKER_FAILED'],
      },
    },
    async (req, reply) => {
      const budgetMs = req.query.budgetMs ?? opts.defaultBudgetMs;
      const budget = AbortSignal.timeout(budgetMs);
      const client = clientGone(reply);
      const result = await searchPlates(req.body, (task) => app.searcher.run(task, { client, budget, budgetMs }), opts.spaceCap);
      req.log.info({ search: { ...result.stats, paretoPoints: result.pareto.length, lightestMass: result.lightest?.mass ?? null } }, 'search statistics');
      return result;
    },
  );
};
