import { plateListCsv, scheduleReport } from '@platesmith/report';
import { type FieldIssue } from '@platesmith/schema';
import { ProblemDetailsJson } from '../problem-json.js';
import { parseScheduleCsv, ScheduleJson, ScheduleProgressJson, ScheduleResultJson, ScheduleRunResultJson, TenderOptionsJson, type ScheduleRunResult } from '@platesmith/schedule';
import type { FastifyRequest } from 'fastify';
import type { FastifyPluginAsyncZod } from 'fastify-type-provider-zod';
import { z } from 'zod';
import { ApiError, RequestInvalid } from '../errors.js';
import type { Jobs } from '../jobs/jobs.js';
import { TERMINAL } from '../jobs/manager.js';
import type { JobState, JobSummary } from '../jobs/store.js';

const States = ['queued', 'running', 'done', 'failed', 'cancelled'] as const;

export const JobStatusJson = z
  .object({
    id: z.string(),
    status: z.enum(States),
    name: z.string().nullable(),
    marks: z.number().meta({ description: 'marks in the schedule' }),
    createdAt: z.string().meta({ description: 'ISO 8601' }),
    startedAt: z.string().nullable(),
    finishedAt: z.string().nullable(),
    progress: ScheduleProgressJson.nullable(),
    error: z.object({ code: z.string(), message: z.string() }).nullable(),
    resumed: z.number().meta({ description: 'times the job was taken up again after the service stopped while it ran; its finished marks were kept, -' }),
    links: z.object({ self: z.string(), events: z.string(), result: z.string(), marks: z.string(), report: z.string() }),
  })
  .meta({ id: 'ScheduleJob', description: 'status and progress of a schedule job' });
export type JobStatusJson = z.output<typeof JobStatusJson>;

export function statusOf(j: JobSummary): JobStatusJson {
  const self = `/v1/schedules/${j.id}`;
  return {
    id: j.id,
    status: j.status,
    name: j.name,
    marks: j.marks,
    createdAt: j.createdAt,
    startedAt: j.startedAt,
    finishedAt: j.finishedAt,
    progress: j.progress,
    error: j.error,
    resumed: j.resumed ?? 0,
    links: { self, events: `${self}/events`, result: `${self}/result`, marks: `${self}/marks`, report: `${self}/report` },
  };
}

/** A CSV issue as a field issue of the request (RFC 7111 fragment `#row=N` as its pointer). */
function csvIssue(i: { row: number; column: string | null; message: string }): FieldIssue {
  const shape = i.row <= 1 || /unknown column|more cells than|not readable/.test(i.message);
  return { path: i.column ? `row ${i.row}, column ${i.column}` : `row ${i.row}`, pointer: `#row=${i.row}`, message: i.message, code: 'csv', kind: shape ? 'shape' : 'value' };
}

/** The HTML report of a finished schedule result (report package; no engineering here). */
export const reportOf = scheduleReport;

const Params = z.object({ id: z.string().min(1).max(100) });

/** A small async queue: events pushed by the job manager, pulled by the SSE stream. */
function queue<T>() {
  const items: T[] = [];
  let wake: (() => void) | null = null;
  let closed = false;
  return {
    push(v: T) {
      items.push(v);
      wake?.();
    },
    close() {
      closed = true;
      wake?.();
    },
    async next(): Promise<T | undefined> {
      while (items.length === 0 && !closed) await new Promise<void>((r) => (wake = r));
      wake = null;
      return items.shift();
    },
  };
}

export const scheduleRoutes: FastifyPluginAsyncZod<{ jobs: Jobs }> = async (app, { jobs }) => {
  const store = jobs.store;
  // with keys on, a job is shown to the key that created it only: to any other it does not exist
  const load = async (id: string, req: FastifyRequest): Promise<JobSummary> => {
    const j = await store.get(id);
    if (!j || (req.keyId !== null && j.owner !== req.keyId)) throw new ApiError('JOB_NOT_FOUND', `no schedule job ${id}`);
    return j;
  };
  const finished = async (id: string, req: FastifyRequest): Promise<JobSummary & { result: ScheduleRunResult }> => {
    const j = await load(id, req);
    const result = j.status === 'done' ? await store.result(id) : null;
    if (!result) {
      throw new ApiError('JOB_NOT_FINISHED', `schedule job ${j.id} is ${j.status}`, { extra: { jobStatus: j.status }, ...(TERMINAL.has(j.status) ? {} : { retryAfter: 1 }) });
    }
    return { ...j, result };
  };

  // a CSV schedule (one row per mark, see the schedule package's CSV.md) becomes the JSON body;
  // its row-and-column issues answer 400 (not a schedule) or 422 (a value), as the JSON ones do
  app.addContentTypeParser(['text/csv', 'application/csv'], { parseAs: 'string' }, (_req, body, done) => {
    const c = parseScheduleCsv(String(body));
    if (!c.ok) return done(new RequestInvalid(c.issues.map(csvIssue)), undefined);
    done(null, { defaults: c.value.defaults, girders: c.value.girders });
  });

  app.post(
    '/v1/schedules',
    {
      schema: {
        operationId: 'submitSchedule',
        tags: ['schedules'],
        summary: 'Submit a girder schedule as a job (202; poll Location or follow its events)',
        description:
          'Each mark is the defaults merged with its own fields (its own win; space and options merged one level deep), searched, and checked as adopted when a section is given. A mark whose input is invalid fails alone with its field issues. The body is JSON (Schedule) or, with content-type text/csv, one CSV row per mark (columns in the schedule package\'s CSV.md; issues name the row and column). `baseline` (the records of a previous result) makes every mark compared with it; `tender` asks for rates and rationalisation. The query parameters apply to either form where the body does not say.',
        body: ScheduleJson,
        consumes: ['application/json', 'text/csv'],
        querystring: z.object({
          name: z.string().max(200).optional().meta({ description: 'name of the schedule (when the body has none, e.g. CSV)' }),
          rationalise: z.coerce.number().int().min(1).max(50).optional().meta({ description: 'rationalise to at most K distinct sections (when the body has no tender.rationalise)' }),
          massTolerance: z.coerce.number().min(0).max(1).optional().meta({ description: 'relative tolerance of the lightest mass in the comparison, - (default 0.01)' }),
        }),
        response: { 202: JobStatusJson, 400: ProblemDetailsJson, 413: ProblemDetailsJson, 415: ProblemDetailsJson, 422: ProblemDetailsJson, 429: ProblemDetailsJson, 503: ProblemDetailsJson },
        errors: ['JOBS_SATURATED'],
        answerHeaders: {
          202: {
            Location: { description: 'the job (getSchedule)', required: true },
            'Retry-After': { description: 'seconds before the first poll of Location', required: true },
          },
        },
      },
    },
    async (req, reply) => {
      const input: ScheduleJson = { ...req.body };
      const q = req.query;
      if (input.name === undefined && q.name !== undefined) input.name = q.name;
      if (q.rationalise !== undefined && input.tender?.rationalise === undefined) {
        input.tender = TenderOptionsJson.parse({ ...input.tender, rationalise: q.rationalise });
      }
      if (q.massTolerance !== undefined && input.compare === undefined) input.compare = { massTolerance: q.massTolerance };
      const job = await jobs.submit(input, req.keyId);
      return reply.code(202).header('location', `/v1/schedules/${job.id}`).header('retry-after', '1').send(statusOf(job));
    },
  );

  app.get(
    '/v1/schedules',
    {
      schema: {
        operationId: 'listSchedules',
        tags: ['schedules'],
        summary: 'List schedule jobs, newest first',
        querystring: z.object({ status: z.enum(States).optional(), limit: z.coerce.number().int().min(1).max(500).default(50) }),
        response: { 200: z.object({ jobs: z.array(JobStatusJson) }), 400: ProblemDetailsJson },
      },
    },
    async (req) => {
      const q: { limit: number; status?: JobState; owner?: string } = { limit: req.query.limit };
      if (req.query.status) q.status = req.query.status;
      if (req.keyId !== null) q.owner = req.keyId;
      return { jobs: (await store.list(q)).map(statusOf) };
    },
  );

  app.get(
    '/v1/schedules/:id',
    {
      schema: {
        operationId: 'getSchedule',
        tags: ['schedules'],
        summary: 'Status and progress of a schedule job',
        params: Params,
        response: { 200: JobStatusJson, 404: ProblemDetailsJson },
        errors: ['JOB_NOT_FOUND'],
        answerHeaders: { 200: { 'Retry-After': { description: 'seconds before the next poll, while the job is queued or running', required: false } } },
      },
    },
    async (req, reply) => {
      const j = await load(req.params.id, req);
      if (!TERMINAL.has(j.status)) void reply.header('retry-after', '1');
      return statusOf(j);
    },
  );

  app.get(
    '/v1/schedules/:id/result',
    {
      schema: {
        operationId: 'getScheduleResult',
        tags: ['schedules'],
        summary: 'Result of a finished schedule job: marks, totals, records (the baseline of a later run), comparison with the baseline, tonnage, plate list, rationalisation',
        params: Params,
        response: { 200: ScheduleRunResultJson, 404: ProblemDetailsJson, 409: ProblemDetailsJson },
        errors: ['JOB_NOT_FOUND', 'JOB_NOT_FINISHED'],
      },
    },
    async (req) => (await finished(req.params.id, req)).result,
  );

  app.get(
    '/v1/schedules/:id/marks',
    {
      schema: {
        operationId: 'getScheduleMarks',
        tags: ['schedules'],
        summary: 'The marks of a job finished so far (each stored as it finishes), in schedule order',
        params: Params,
        response: { 200: z.object({ id: z.string(), status: z.enum(States), marksTotal: z.number(), marks: ScheduleResultJson.shape.marks }), 404: ProblemDetailsJson },
        errors: ['JOB_NOT_FOUND'],
      },
    },
    async (req) => {
      const j = await load(req.params.id, req);
      return { id: j.id, status: j.status, marksTotal: j.marks, marks: (await store.marks(j.id)).map((m) => m.mark) };
    },
  );

  app.get(
    '/v1/schedules/:id/report',
    {
      schema: {
        operationId: 'getScheduleReport',
        tags: ['schedules'],
        summary: 'HTML report of a finished schedule job (text/html: one self-contained file, SVG charts, no script)',
        params: Params,
        response: {
          200: { description: 'the report: one self-contained HTML file', content: { 'text/html': { schema: z.string() } } },
          404: ProblemDetailsJson,
          409: ProblemDetailsJson,
        },
        errors: ['JOB_NOT_FOUND', 'JOB_NOT_FINISHED'],
      },
    },
    async (req, reply) => {
      const j = await finished(req.params.id, req);
      const input = await store.input(j.id);
      const html = reportOf(j.result, { subtitle: `schedule job ${j.id}`, ...(input ? { schedule: input } : {}), ...(j.finishedAt ? { generatedAt: j.finishedAt } : {}) });
      // a string with a non-JSON type is sent as it is (no response schema for 200)
      return reply.type('text/html; charset=utf-8').send(html as never);
    },
  );

  app.get(
    '/v1/schedules/:id/plates.csv',
    {
      schema: {
        operationId: 'getSchedulePlates',
        tags: ['schedules'],
        summary: 'The plate list of a finished schedule job as CSV (product, grade, thickness_mm, width_mm, length_mm, count, unit_mass_kg, mass_kg, marks, parts)',
        params: Params,
        response: { 200: { description: 'the plate list, one row per plate size and grade', content: { 'text/csv': { schema: z.string() } } }, 404: ProblemDetailsJson, 409: ProblemDetailsJson },
        errors: ['JOB_NOT_FOUND', 'JOB_NOT_FINISHED'],
      },
    },
    async (req, reply) => {
      const j = await finished(req.params.id, req);
      return reply.type('text/csv; charset=utf-8').send(plateListCsv(j.result.tender.tonnage?.plates ?? []) as never);
    },
  );

  app.delete(
    '/v1/schedules/:id',
    {
      schema: {
        operationId: 'cancelSchedule',
        tags: ['schedules'],
        summary: 'Cancel a queued or running job (200, its final status); delete a finished one (204)',
        params: Params,
        response: { 200: JobStatusJson, 204: z.null(), 404: ProblemDetailsJson },
        errors: ['JOB_NOT_FOUND'],
      },
    },
    async (req, reply) => {
      const j = await load(req.params.id, req);
      if (TERMINAL.has(j.status)) {
        await jobs.delete(j.id);
        return reply.code(204).send(null);
      }
      const after = await jobs.cancel(j.id);
      return statusOf(after ?? j);
    },
  );

  app.get(
    '/v1/schedules/:id/events',
    {
      sse: { kind: 'manual', heartbeat: true },
      schema: {
        operationId: 'followSchedule',
        tags: ['schedules'],
        summary: 'Server-Sent Events of a job: snapshot (the status now), progress (each change), done (the final status)',
        description: 'text/event-stream. Each event\'s data is a ScheduleJob status as JSON. The stream ends after done.',
        params: Params,
        response: {
          200: { description: 'the event stream (ends after done)', content: { 'text/event-stream': { schema: z.string() } } },
          404: ProblemDetailsJson,
          406: ProblemDetailsJson,
        },
        errors: ['JOB_NOT_FOUND', 'NOT_ACCEPTABLE'],
      },
      preHandler: async (req) => {
        const accept = req.headers.accept;
        if (accept && !/text\/event-stream|text\/\*|\*\/\*/.test(accept)) throw new ApiError('NOT_ACCEPTABLE', 'this route only produces text/event-stream');
        await load((req.params as { id: string }).id, req);
      },
    },
    async (req, reply) => {
      const id = req.params.id;
      const q = queue<{ type: 'progress' | 'done'; job: JobSummary }>();
      const unsubscribe = jobs.subscribe(id, (e) => q.push(e));
      reply.raw.on('close', () => q.close());
      async function* events() {
        try {
          // the store may fail meanwhile (busy, full): the stream ends, the client reconnects
          const snap = await store.get(id).catch((err: unknown) => void req.log.warn({ err }, 'job store read failed; the event stream ends'));
          if (!snap) return;
          let n = 0;
          yield { id: String(n++), event: 'snapshot', data: statusOf(snap) };
          if (TERMINAL.has(snap.status)) {
            yield { id: String(n++), event: 'done', data: statusOf(snap) };
            return;
          }
          for (let e = await q.next(); e; e = await q.next()) {
            yield { id: String(n++), event: e.type, data: statusOf(e.job) };
            if (e.type === 'done') return;
          }
        } finally {
          unsubscribe();
        }
      }
      await reply.sse.send(events());
    },
  );
};
