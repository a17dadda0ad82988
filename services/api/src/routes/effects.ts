import { EffectsSummaryJson, ProblemJson } from '@platesmith/schema';
import type { FastifyPluginAsyncZod } from 'fastify-type-provider-zod';
import { budgetQuery, type BudgetLimits } from '../budget.js';
import { ProblemDetailsJson } from '../problem-json.js';
import { requestFlow, requestSignal } from '../signal.js';

export const effectsRoutes: FastifyPluginAsyncZod<{ budget: BudgetLimits }> = async (app, { budget }) => {
  app.post(
    '/v1/effects',
    {
      schema: {
        operationId: 'analyseEffects',
        tags: ['effects'],
        summary: 'Analyse a problem: reactions, MEd and VEd envelopes of the EN 1990 combinations (without self-weight)',
        description: 'The analysis runs on a worker thread within budgetMs.',
        querystring: budgetQuery(budget, 'analysis'),
        body: ProblemJson,
        response: { 200: EffectsSummaryJson, 400: ProblemDetailsJson, 422: ProblemDetailsJson, 503: ProblemDetailsJson },
        errors: ['UNPROCESSABLE'],
      },
    },
    async (req, reply) => app.engine.effects(req.body, { signal: requestSignal(reply, app.shutdownSignal), flow: requestFlow(req), budgetMs: req.query.budgetMs ?? budget.defaultMs }),
  );
};
