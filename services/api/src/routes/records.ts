import { EngineError } from '@platesmith/app';
import { chromiumPath, htmlToPdf, PdfUnavailable } from '@platesmith/report';
import { checkFieldsOf } from '@platesmith/schedule';
import { parseRecordRequest, parseWith, RecordTitleJson, CheckProblemInput, type RecordRequest, type RecordTitle } from '@platesmith/schema';
import { ProblemDetailsJson } from '../problem-json.js';
import type { FastifyReply, FastifyRequest } from 'fastify';
import type { FastifyPluginAsyncZod } from 'fastify-type-provider-zod';
import { z } from 'zod';
import { ApiError } from '../errors.js';
import type { Jobs } from '../jobs/jobs.js';
import { withParser } from '../validate.js';
import { budgetQuery, type BudgetLimits } from '../budget.js';
import { requestFlow, requestSignal } from '../signal.js';

/** Body of POST /v1/records, as documented (validated by parseRecordRequest: a check body and its title). */
const RecordBody = withParser(
  z
    .looseObject({ title: RecordTitleJson.optional() })
    .meta({ id: 'RecordRequest', description: 'a check body exactly as for POST /v1/checks (CheckRequest: with "effects", or a problem with "section"), plus an optional "title" block (RecordTitle); issues name the check\'s fields' }),
  parseRecordRequest,
);

/** The record: HTML, or the PDF for Accept: application/pdf. */
const RECORD_ANSWER = {
  description: 'the calculation record: one self-contained HTML file, or its PDF (Accept: application/pdf)',
  content: { 'text/html': { schema: z.string() }, 'application/pdf': { schema: z.string().meta({ description: 'the PDF file (binary)' }) } },
};

/** Prints at once; more answer 503 PRINT_FAILED with Retry-After (each print is a chromium process of ~100 MB). */
const MAX_PRINTS = 2;

export const recordRoutes: FastifyPluginAsyncZod<{ jobs: Jobs; budget: BudgetLimits }> = async (app, { jobs, budget }) => {
  let printing = 0;

  /**
   * The record of a check request: the check and the document on a worker (never on the event
   * loop), then HTML, or the PDF when the client asks for it (Accept: application/pdf) printed by
   * a chromium child process. Both within the request's budget; both stopped when the client
   * leaves or the service closes.
   */
  async function answer(req: FastifyRequest, reply: FastifyReply, r: RecordRequest, name: string, budgetMs: number): Promise<FastifyReply> {
    const accept = String(req.headers.accept ?? '');
    const pdfAsked = /application\/pdf/.test(accept);
    // refused before any work
    if (pdfAsked && !chromiumPath()) throw new ApiError('NOT_ACCEPTABLE', 'a PDF needs chromium, which is not installed on this service; ask for text/html');
    const t0 = performance.now();
    const signal = requestSignal(reply, app.shutdownSignal);
    const html = await app.engine.record(r, { signal, flow: requestFlow(req), budgetMs });
    if (!pdfAsked) return reply.type('text/html; charset=utf-8').send(html as never);
    if (printing >= MAX_PRINTS) throw new ApiError('PRINT_FAILED', `${MAX_PRINTS} records are being printed`, { retryAfter: 5 });
    printing++;
    let pdf: Buffer;
    try {
      // what is left of the budget (at least a second: chromium's start alone takes that)
      pdf = await htmlToPdf(html, { timeoutMs: Math.max(1000, budgetMs - (performance.now() - t0)), signal });
    } catch (e) {
      // the client left or the service is closing: chromium was killed (mapped as the engine's cancellations are)
      if (signal.aborted) throw new EngineError('CANCELLED', 'the client went away or the service is closing; the printing was stopped', { cause: e });
      if (e instanceof PdfUnavailable) {
        req.log.error({ err: e }, 'record printing failed');
        throw new ApiError('PRINT_FAILED', 'chromium did not print the record', { retryAfter: 5, cause: e });
      }
      throw e;
    } finally {
      printing--;
    }
    return reply.type('application/pdf').header('content-disposition', `inline; filename="${name.replace(/[^A-Za-z0-9._-]+/g, '_')}.pdf"`).send(pdf as never);
  }

  app.post(
    '/v1/records',
    {
      schema: {
        operationId: 'recordGirder',
        tags: ['records'],
        summary: 'The calculation record of one girder (text/html; application/pdf where chromium is installed)',
        description:
          'Title block, design basis with every default taken, moment and shear diagrams, the section drawn with its properties and class, every check with its clause, formula, values and utilisation, utilisation along the span; the caution and scope on every printed page. Ask for the PDF with Accept: application/pdf (406 where chromium is not installed).',
        querystring: budgetQuery(budget, 'record (its check and document, and the PDF\'s printing)'),
        body: RecordBody,
        response: { 200: RECORD_ANSWER, 400: ProblemDetailsJson, 406: ProblemDetailsJson, 422: ProblemDetailsJson, 500: ProblemDetailsJson, 503: ProblemDetailsJson },
        errors: ['UNPROCESSABLE', 'NOT_ACCEPTABLE', 'PRINT_FAILED', 'POOL_SATURATED', 'TIME_BUDGET_EXCEEDED', 'WORKER_FAILED'],
      },
    },
    async (req, reply) => {
      // the validator has parsed the body with parseRecordRequest: the check, its title and the raw input
      const r = req.body as unknown as RecordRequest;
      return answer(req, reply, r, r.title.mark ?? 'record', req.query.budgetMs ?? budget.defaultMs);
    },
  );

  app.get(
    '/v1/schedules/:id/marks/:mark/record',
    {
      schema: {
        operationId: 'getMarkRecord',
        tags: ['schedules', 'records'],
        summary: 'The calculation record of a finished mark: its adopted section, else its lightest (text/html; application/pdf where chromium is installed)',
        params: z.object({ id: z.string().min(1).max(100), mark: z.string().min(1).max(200) }),
        response: { 200: RECORD_ANSWER, 404: ProblemDetailsJson, 406: ProblemDetailsJson, 409: ProblemDetailsJson, 422: ProblemDetailsJson, 500: ProblemDetailsJson, 503: ProblemDetailsJson },
        errors: ['JOB_NOT_FOUND', 'MARK_NOT_FOUND', 'JOB_NOT_FINISHED', 'NO_SECTION', 'NOT_ACCEPTABLE', 'PRINT_FAILED', 'UNPROCESSABLE', 'POOL_SATURATED', 'TIME_BUDGET_EXCEEDED', 'WORKER_FAILED'],
      },
    },
    async (req, reply) => {
      // with keys on, another key's job does not exist (as on the schedule routes)
      const j = await jobs.store.get(req.params.id);
      const input = j && (req.keyId === null || j.owner === req.keyId) ? await jobs.store.input(j.id) : undefined;
      if (!j || !input) throw new ApiError('JOB_NOT_FOUND', `no schedule job ${req.params.id}`);
      const girder = input.girders.find((g) => g.mark === req.params.mark);
      if (!girder) throw new ApiError('MARK_NOT_FOUND', `schedule job ${j.id} has no mark ${req.params.mark}`);
      const done = (await jobs.store.marks(j.id)).find((m) => m.mark.mark === girder.mark)?.mark;
      if (!done) throw new ApiError('JOB_NOT_FINISHED', `mark ${girder.mark} of schedule job ${j.id} is not finished`, { retryAfter: 1 });
      const section = girder.adopted ?? done.search?.lightest?.section;
      if (!section) throw new ApiError('NO_SECTION', `mark ${girder.mark} has no adopted section and no feasible section to record`);
      const raw = { ...checkFieldsOf(input.defaults, girder), section };
      const parsed = parseWith(CheckProblemInput, raw);
      if (!parsed.ok) throw new ApiError('NO_SECTION', `mark ${girder.mark} has no valid problem to record (${parsed.issues[0]?.message ?? 'invalid'})`);
      const title: Partial<RecordTitle> = { mark: girder.mark };
      if (input.name) title.project = input.name;
      if (j.finishedAt) title.date = j.finishedAt.slice(0, 10);
      return answer(req, reply, { check: parsed.value, raw, title }, girder.mark, budget.defaultMs);
    },
  );
};
