import { z } from 'zod';

/** RFC 9457 problem details, with the field issues of a validation failure (the service's own HTTP type). */
export const ProblemDetailsJson = z
  .object({
    type: z.string().meta({ description: 'URI naming the problem type (see the errors table)' }),
    title: z.string(),
    status: z.number().int(),
    detail: z.string(),
    instance: z.string().meta({ description: 'the request path' }),
    code: z.string().meta({ description: 'stable error code' }),
    requestId: z.string(),
    field: z.string().optional().meta({ description: 'offending field (domain errors)' }),
    hint: z.string().optional().meta({ description: 'what to do next' }),
    errors: z
      .array(z.object({ path: z.string(), pointer: z.string().meta({ description: 'JSON pointer into the body, e.g. #/spans/0' }), message: z.string() }))
      .optional()
      .meta({ description: 'the field issues (at most the first 100; issueCount says how many there were)' }),
    issueCount: z.number().int().optional().meta({ description: 'how many field issues the request had, when more than errors lists' }),
    jobStatus: z.enum(['queued', 'running', 'done', 'failed', 'cancelled']).optional().meta({ description: 'the job\'s status (JOB_NOT_FINISHED)' }),
    budgetMs: z.number().int().optional().meta({ description: 'the time budget the work ran out of, ms (TIME_BUDGET_EXCEEDED)' }),
    limit: z.number().int().optional().meta({ description: 'the requests a minute allowed, per key or per address (RATE_LIMITED)' }),
    quota: z.number().int().optional().meta({ description: 'the schedule jobs a key may have queued or running at once (JOB_QUOTA_EXCEEDED)' }),
  })
  .meta({ id: 'ProblemDetails', description: 'RFC 9457 problem details (application/problem+json)' });
export type ProblemDetailsJson = z.output<typeof ProblemDetailsJson>;
