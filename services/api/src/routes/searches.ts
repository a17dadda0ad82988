import { PublishedSearchJson, SearchInput } from '@platesmith/schema';
import type { FastifyPluginAsyncZod } from 'fastify-type-provider-zod';
import { budgetQuery, type BudgetLimits } from '../budget.js';
import { ProblemDetailsJson } from '../problem-json.js';
import { requestFlow, requestSignal } from '../signal.js';

export const searchRoutes: FastifyPluginAsyncZod<{ budget: BudgetLimits; spaceCap: number }> = async (app, { budget, spaceCap }) => {
  app.post(
    '/v1/searches',
    {
      schema: {
        operationId: 'searchGirders',
        tags: ['searches'],
        summary: 'Exact search of the plate space: the Pareto set of overall depth against mass or cost',
        description: `Synchronous, within budgetMs (the analysis included). The space may hold at most ${spaceCap.toExponential(0)} candidates (422 SPACE_TOO_LARGE names the size and the cap). The answer's status says how it ended: exact (the whole space searched), infeasible (nothing passes: an empty pareto and the nearest misses), or aborted (the budget ran out: every point returned passes every check, but the set may be incomplete). 503 is load shedding only (POOL_SATURATED, with Retry-After).`,
        querystring: budgetQuery(budget, 'search'),
        body: SearchInput,
        response: { 200: PublishedSearchJson, 400: ProblemDetailsJson, 422: ProblemDetailsJson, 503: ProblemDetailsJson },
        errors: ['UNPROCESSABLE', 'POOL_SATURATED', 'TIME_BUDGET_EXCEEDED', 'WORKER_FAILED'],
      },
    },
    async (req, reply) => {
      const budgetMs = req.query.budgetMs ?? budget.defaultMs;
      const result = await app.engine.search(req.body, { signal: requestSignal(reply, app.shutdownSignal), flow: requestFlow(req), budgetMs });
      // on the request's one log line
      req.logExtra = { ...req.logExtra, search: { status: result.status, ...result.stats, paretoPoints: result.pareto.length, lightestMass: result.lightest?.mass ?? null } };
      return result;
    },
  );
};
