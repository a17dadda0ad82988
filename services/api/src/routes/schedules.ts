import { ProblemDetailsJson } from '@platesmith/schema';
import { ScheduleJson, ScheduleProgressJson, ScheduleResultJson } from '@platesmith/schedule';
import type { FastifyPluginAsyncZod } from 'fastify-type-provider-zod';
import { z } from 'zod';
import { ApiError } from '../errors.js';
import { TERMINAL, type JobManager } from '../jobs/manager.js';
import type { JobRecord, JobState } from '../jobs/store.js';

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
    links: z.object({ self: z.string(), events: z.string(), result: z.string() }),
  })
  .meta({ id: 'ScheduleJob', description: 'status and progress of a schedule job' });
export type JobStatusJson = z.output<typeof JobStatusJson>;

export function statusOf(j: JobRecord): JobStatusJson {
  const self = `/v1/schedules/${j.id}`;
  return {
    id: j.id,
    status: j.status,
    name: j.input.name ?? null,
    marks: j.input.girders.length,
    createdAt: j.createdAt,
    startedAt: j.startedAt,
    finishedAt: j.finishedAt,
    progress: j.progress,
    error: j.error,
    links: { self, events: `${self}/events`, result: `${self}/result` },
  };
}

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

export const scheduleRoutes: FastifyPluginAsyncZod<{ jobs: JobManager }> = async (app, { jobs }) => {
  const store = jobs.store;
  const load = async (id: string): Promise<JobRecord> => {
    const j = await store.get(id);
    if (!j) throw new ApiError('JOB_NOT_FOUND', `no schedule job ${id}`);
    return j;
  };

  app.post(
    '/v1/schedules',
    {
      schema: {
        tags: ['schedules'],
        summary: 'Submit a girder schedule as a job (202; poll Location or follow its events)',
        description: 'Each mark is the defaults merged with its own fields (its own win; space and options merged one level deep), searched, and checked as adopted when a section is given. A mark whose input is invalid fails alone with its field issues.',
        body: ScheduleJson,
        response: { 202: JobStatusJson, 400: ProblemDetailsJson, 422: ProblemDetailsJson, 503: ProblemDetailsJson },
      },
    },
    async (req, reply) => {
      const job = await jobs.submit(req.body);
      return reply.code(202).header('location', `/v1/schedules/${job.id}`).header('retry-after', '1').send(statusOf(job));
    },
  );

  app.get(
    '/v1/schedules',
    {
      schema: {
        tags: ['schedules'],
        summary: 'List schedule jobs, newest first',
        querystring: z.object({ status: z.enum(States).optional(), limit: z.coerce.number().int().min(1).max(500).default(50) }),
        response: { 200: z.object({ jobs: z.array(JobStatusJson) }), 400: ProblemDetailsJson },
      },
    },
    async (req) => {
      const q: { limit: number; status?: JobState } = { limit: req.query.limit };
      if (req.query.status) q.status = req.query.status;
      return { jobs: (await store.list(q)).map(statusOf) };
    },
  );

  app.get(
    '/v1/schedules/:id',
    { schema: { tags: ['schedules'], summary: 'Status and progress of a schedule job', params: Params, response: { 200: JobStatusJson, 404: ProblemDetailsJson } } },
    async (req, reply) => {
      const j = await load(req.params.id);
      if (!TERMINAL.has(j.status)) void reply.header('retry-after', '1');
      return statusOf(j);
    },
  );

  app.get(
    '/v1/schedules/:id/result',
    {
      schema: { tags: ['schedules'], summary: 'Result of a finished schedule job', params: Params, response: { 200: ScheduleResultJson, 404: ProblemDetailsJson, 409: ProblemDetailsJson } },
    },
    async (req) => {
      const j = await load(req.params.id);
      if (j.status !== 'done' || !j.result) {
        throw new ApiError('JOB_NOT_FINISHED', `schedule job ${j.id} is ${j.status}`, { extra: { jobStatus: j.status }, ...(TERMINAL.has(j.status) ? {} : { retryAfter: 1 }) });
      }
      return j.result;
    },
  );

  app.delete(
    '/v1/schedules/:id',
    {
      schema: {
        tags: ['schedules'],
        summary: 'Cancel a queued or running job (200, its final status); delete a finished one (204)',
        params: Params,
        response: { 200: JobStatusJson, 204: z.null(), 404: ProblemDetailsJson },
      },
    },
    async (req, reply) => {
      const j = await load(req.params.id);
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
        tags: ['schedules'],
        summary: 'Server-Sent Events of a job: snapshot (the status now), progress (each change), done (the final status)',
        description: 'text/event-stream. Each event\'s data is a ScheduleJob status as JSON. The stream ends after done.',
        params: Params,
        response: { 404: ProblemDetailsJson, 406: ProblemDetailsJson },
      },
      preHandler: async (req) => {
        const accept = req.headers.accept;
        if (accept && !/text\/event-stream|text\/\*|\*\/\*/.test(accept)) throw new ApiError('NOT_ACCEPTABLE', 'this route only produces text/event-stream');
        await load((req.params as { id: string }).id);
      },
    },
    async (req, reply) => {
      const id = req.params.id;
      const q = queue<{ type: 'progress' | 'done'; job: JobRecord }>();
      const unsubscribe = jobs.subscribe(id, (e) => q.push(e));
      reply.raw.on('close', () => q.close());
      async function* events() {
        try {
          const snap = await store.get(id);
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
