import { CheckRequest, parseCheckRequest, type CheckRequest as CheckRequestT } from '@platesmith/app';
import { PublishedVerdictJson } from '@platesmith/schema';
import type { FastifyPluginAsyncZod } from 'fastify-type-provider-zod';
import { budgetQuery, type BudgetLimits } from '../budget.js';
import { ProblemDetailsJson } from '../problem-json.js';
import { requestFlow, requestSignal } from '../signal.js';
import { withParser } from '../validate.js';

const Body = withParser(CheckRequest, parseCheckRequest);

export const checkRoutes: FastifyPluginAsyncZod<{ budget: BudgetLimits }> = async (app, { budget }) => {
  app.post(
    '/v1/checks',
    {
      schema: {
        operationId: 'checkSection',
        tags: ['checks'],
        summary: 'Check one section (EN 1993-1-1, -1-5, -1-8) under design effects or for a problem',
        description: 'A body with "effects" is a section under design effects at stations (kNm, kN, mm); any other body is a problem (spans mm, actions kN/m or kN, or an envelope) with the section, whose self-weight is added. A failing check is a 200 answer with passes: false. The analysis and the checks run on a worker thread within budgetMs.',
        querystring: budgetQuery(budget, 'analysis and checks'),
        body: Body,
        response: { 200: PublishedVerdictJson, 400: ProblemDetailsJson, 422: ProblemDetailsJson, 503: ProblemDetailsJson },
        errors: ['UNPROCESSABLE'],
      },
    },
    async (req, reply) => app.engine.check(req.body as CheckRequestT, { signal: requestSignal(reply, app.shutdownSignal), flow: requestFlow(req), budgetMs: req.query.budgetMs ?? budget.defaultMs }),
  );
};
