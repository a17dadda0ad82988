import { EffectsSummaryJson, ProblemDetailsJson, ProblemJson } from '@platesmith/schema';
import type { FastifyPluginAsyncZod } from 'fastify-type-provider-zod';
import { analyseProblem } from '../domain.js';

export const effectsRoutes: FastifyPluginAsyncZod = async (app) => {
  app.post(
    '/v1/effects',
    {
      schema: {
        operationId: 'analyseEffects',
        tags: ['effects'],
        summary: 'Analyse a problem: reactions, MEd and VEd envelopes of the EN 1990 combinations (without self-weight)',
        body: ProblemJson,
        response: { 200: EffectsSummaryJson, 400: ProblemDetailsJson, 422: ProblemDetailsJson },
        errors: ['UNPROCESSABLE'],
      },
    },
    async (req) => analyseProblem(req.body),
  );
};
