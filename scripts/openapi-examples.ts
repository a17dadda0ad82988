// The OpenAPI document's examples, recorded from a service built here: each request example is a
// bundled demo or example file (or a girder of the demo project), each response example is what
// the service answered to it (arrays of whole results cut to their first entries, said in the
// example's description). Run by `pnpm openapi --examples`; the test suite checks the request
// examples are still the files and the linter checks every example against its schema.
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { buildApp } from '../services/api/src/index.js';
import type { OperationExamples } from '../services/api/src/contract.js';

type Json = Record<string, any>;
type FastifyInstance = Awaited<ReturnType<typeof buildApp>>;
interface Demo {
  project: string;
  defaults: Json;
  girders: Json[];
}

/** A girder of the demo project as a search request: the defaults, then its own fields (options merged one level), less its mark and description. */
export function demoGirderRequest(demo: Demo, mark: string): Json {
  const g = demo.girders.find((x) => x.mark === mark);
  if (!g) throw new Error(`no girder ${mark} in the demo`);
  const { mark: _m, description: _d, ...fields } = g;
  return { ...demo.defaults, ...fields, options: { ...demo.defaults.options, ...(fields.options ?? {}) } };
}

export const FILES = {
  checkDemo: 'examples/check-demo.json',
  problemDemo: 'examples/problem-demo.json',
  searchDemo: 'examples/search-demo.json',
  demoProject: 'demo/kestrel-quay.json',
  schedule: 'demo/schedule-harbour-sheds.json',
} as const;
export const DEMO_MARK = 'KQ-G1';

export function readJson(root: string, file: string): Json {
  return JSON.parse(readFileSync(join(root, file), 'utf8')) as Json;
}

/** The first n entries of an array, and how many there were. */
function cut<T>(a: T[], n: number): { kept: T[]; of: number } {
  return { kept: a.slice(0, n), of: a.length };
}

async function call(app: FastifyInstance, method: 'GET' | 'POST' | 'DELETE', url: string, body?: unknown, headers: Record<string, string> = {}): Promise<{ status: number; body: any }> {
  const r = await app.inject({ method, url, ...(body !== undefined ? { payload: body as object, headers: { 'content-type': 'application/json', ...headers } } : { headers }) });
  const type = String(r.headers['content-type'] ?? '');
  const answer: any = /json/.test(type) ? r.json() : r.body;
  return { status: r.statusCode, body: answer };
}

function expectStatus(r: { status: number; body: unknown }, status: number, what: string): void {
  if (r.status !== status) throw new Error(`${what}: expected ${status}, got ${r.status}: ${JSON.stringify(r.body).slice(0, 500)}`);
}

export async function recordExamples(root: string): Promise<Record<string, OperationExamples>> {
  const checkDemo = readJson(root, FILES.checkDemo);
  const demo = readJson(root, FILES.demoProject) as Demo;
  const schedule = readJson(root, FILES.schedule);
  const search = demoGirderRequest(demo, DEMO_MARK);
  const problem = readJson(root, FILES.problemDemo);
  const searchDemo = readJson(root, FILES.searchDemo);
  const girder = demo.girders.find((g) => g.mark === DEMO_MARK)!;
  const demoNote = `girder ${DEMO_MARK} of the invented demo project (${FILES.demoProject}): ${girder.description}`;
  const out: Record<string, OperationExamples> = {};

  const app = await buildApp({ threads: 1 });
  // one more service whose limits are 0: its searches and submissions answer 503 at once, and its jobs stay queued
  const full = await buildApp({ threads: 1, maxActiveSearches: 0, maxQueuedJobs: 0 });
  const idle = await buildApp({ threads: 1, jobConcurrency: 0 });
  try {
    for (const a of [app, full, idle]) await a.ready();

    // checkSection
    const check = await call(app, 'POST', '/v1/checks', checkDemo);
    expectStatus(check, 200, 'check');
    const checkShape = await call(app, 'POST', '/v1/checks', { ...checkDemo, span: '24 m' });
    expectStatus(checkShape, 400, 'check with a text span');
    const checkValue = await call(app, 'POST', '/v1/checks', { ...checkDemo, span: 24 });
    expectStatus(checkValue, 422, 'check with a span in m');
    out.checkSection = {
      request: { 'application/json': { checkDemo: { summary: `the bundled example (${FILES.checkDemo}): a section under design effects`, value: checkDemo } } },
      responses: {
        '200': { checkDemo: { summary: 'the answer to the bundled example', value: check.body } },
        '400': { textSpan: { summary: 'the bundled example with "span": "24 m"', value: checkShape.body } },
        '422': { spanInMetres: { summary: 'the bundled example with "span": 24 (lengths are in mm)', value: checkValue.body } },
      },
    };

    // analyseEffects
    const effects = await call(app, 'POST', '/v1/effects', problem);
    expectStatus(effects, 200, 'effects');
    const effectsBad = await call(app, 'POST', '/v1/effects', { ...problem, spans: [20, 25] });
    expectStatus(effectsBad, 422, 'effects with spans in m');
    out.analyseEffects = {
      request: { 'application/json': { problemDemo: { summary: `the bundled example (${FILES.problemDemo}): a two-span floor girder`, value: problem } } },
      responses: {
        '200': { problemDemo: { summary: 'the analysis of the bundled example', value: effects.body } },
        '422': { spanInMetres: { summary: 'the bundled example with "spans": [20, 25] (lengths are in mm)', value: effectsBad.body } },
      },
    };

    // searchGirders
    const found = await call(app, 'POST', '/v1/searches', search);
    expectStatus(found, 200, 'search');
    const pareto = cut(found.body.pareto as Json[], 2);
    const searchBusy = await call(full, 'POST', '/v1/searches', search);
    expectStatus(searchBusy, 503, 'search on a saturated pool');
    out.searchGirders = {
      request: {
        'application/json': {
          demoGirder: { summary: demoNote, value: search },
          searchDemo: { summary: `the bundled example (${FILES.searchDemo}): a 12 m floor girder over the default plate stock`, value: searchDemo },
        },
      },
      responses: {
        '200': {
          demoGirder: {
            summary: `the search of ${DEMO_MARK}`,
            description: `The answer with the first ${pareto.kept.length} of its ${pareto.of} Pareto points (the rest cut for length).`,
            value: { ...found.body, pareto: pareto.kept },
          },
        },
        '422': { spanInMetres: { summary: `${DEMO_MARK} with "spans": [20] (lengths are in mm)`, value: (await call(app, 'POST', '/v1/searches', { ...search, spans: [20] })).body } },
        '503': { poolSaturated: { summary: 'every search slot in use', value: searchBusy.body } },
      },
    };

    // schedules: one job run to the end, one left queued (cancelled), one refused
    const submitted = await call(app, 'POST', '/v1/schedules', schedule);
    expectStatus(submitted, 202, 'schedule');
    const id = String(submitted.body.id);
    let status = submitted.body as Json;
    for (let i = 0; status.status !== 'done' && i < 600; i++) {
      await new Promise((r) => setTimeout(r, 100));
      status = (await call(app, 'GET', `/v1/schedules/${id}`)).body as Json;
    }
    if (status.status !== 'done') throw new Error(`the schedule job ended ${status.status}`);
    const list = await call(app, 'GET', '/v1/schedules?limit=10');
    const marks = await call(app, 'GET', `/v1/schedules/${id}/marks`);
    const result = await call(app, 'GET', `/v1/schedules/${id}/result`);
    const report = await call(app, 'GET', `/v1/schedules/${id}/report`);
    const events = await call(app, 'GET', `/v1/schedules/${id}/events`, undefined, { accept: 'text/event-stream' });
    const missing = await call(app, 'GET', '/v1/schedules/no-such-job');
    const plates = await call(app, 'GET', `/v1/schedules/${id}/plates.csv`);
    expectStatus(plates, 200, 'plate list');
    const firstMark = String(schedule.girders[0].mark);
    const markRecord = await call(app, 'GET', `/v1/schedules/${id}/marks/${encodeURIComponent(firstMark)}/record`);
    expectStatus(markRecord, 200, 'record of a mark');
    const noMark = await call(app, 'GET', `/v1/schedules/${id}/marks/NO-SUCH-MARK/record`);
    expectStatus(noMark, 404, 'record of an unknown mark');
    const record = await call(app, 'POST', '/v1/records', checkDemo);
    expectStatus(record, 200, 'record');
    const queued = await call(idle, 'POST', '/v1/schedules', schedule);
    const notYet = await call(idle, 'GET', `/v1/schedules/${String(queued.body.id)}/result`);
    expectStatus(notYet, 409, 'result of a queued job');
    const cancelled = await call(idle, 'DELETE', `/v1/schedules/${String(queued.body.id)}`);
    expectStatus(cancelled, 200, 'cancel a queued job');
    const refused = await call(full, 'POST', '/v1/schedules', schedule);
    expectStatus(refused, 503, 'schedule on a full queue');
    const scheduleNote = `the bundled demonstration schedule (${FILES.schedule})`;
    const notFound = { noSuchJob: { summary: 'an unknown job id', value: missing.body } };
    const html = String(report.body);
    const markCut = (m: Json): Json => (Array.isArray(m.search?.pareto) ? { ...m, search: { ...m.search, pareto: m.search.pareto.slice(0, 1) } } : m);
    const marksBody = marks.body as Json;
    const resultBody = result.body as Json;
    out.submitSchedule = {
      request: { 'application/json': { harbourSheds: { summary: scheduleNote, value: schedule } } },
      responses: {
        '202': { harbourSheds: { summary: 'the job as submitted', value: submitted.body } },
        '503': { queueFull: { summary: 'the job queue is full', value: refused.body } },
      },
    };
    out.listSchedules = { responses: { '200': { oneJob: { summary: 'the jobs of the service, newest first', value: list.body } } } };
    out.getSchedule = { responses: { '200': { done: { summary: `the job of ${scheduleNote}, finished`, value: status } }, '404': notFound } };
    out.getScheduleMarks = {
      responses: {
        '200': {
          done: {
            summary: `the marks of ${scheduleNote}`,
            description: `Its first 2 of ${(marksBody.marks as Json[]).length} marks, each search with its first Pareto point only (the rest cut for length).`,
            value: { ...marksBody, marks: (marksBody.marks as Json[]).slice(0, 2).map(markCut) },
          },
        },
        '404': notFound,
      },
    };
    out.getScheduleResult = {
      responses: {
        '200': {
          done: {
            summary: `the result of ${scheduleNote}`,
            description: `Its first 2 of ${(resultBody.marks as Json[]).length} marks, each search with its first Pareto point only (the rest cut for length).`,
            value: { ...resultBody, marks: (resultBody.marks as Json[]).slice(0, 2).map(markCut) },
          },
        },
        '404': notFound,
        '409': { queued: { summary: 'a job still queued (Retry-After: 1)', value: notYet.body } },
      },
    };
    out.getScheduleReport = {
      responses: {
        '200': { done: { summary: `the report of ${scheduleNote}`, description: `Its first 300 of ${html.length} characters.`, value: html.slice(0, 300) } },
        '404': notFound,
      },
    };
    const recordHtml = String(record.body);
    const markHtml = String(markRecord.body);
    out.recordGirder = {
      request: { 'application/json': { checkDemo: { summary: `the bundled example (${FILES.checkDemo}), without a title block`, value: checkDemo } } },
      responses: {
        '200': { checkDemo: { summary: 'the record of the bundled example (text/html)', description: `Its first 300 of ${recordHtml.length} characters.`, value: recordHtml.slice(0, 300) } },
      },
    };
    out.getSchedulePlates = {
      responses: { '200': { done: { summary: `the plate list of ${scheduleNote}`, value: String(plates.body) } }, '404': notFound },
    };
    out.getMarkRecord = {
      responses: {
        '200': { done: { summary: `the record of mark ${firstMark} of ${scheduleNote} (text/html)`, description: `Its first 300 of ${markHtml.length} characters.`, value: markHtml.slice(0, 300) } },
        '404': { noSuchMark: { summary: 'a mark the schedule does not have', value: noMark.body } },
      },
    };
    out.followSchedule = {
      responses: {
        '200': { done: { summary: 'the events of a finished job: its snapshot, then done', value: String(events.body) } },
        '404': notFound,
      },
    };
    out.cancelSchedule = { responses: { '200': { queued: { summary: 'a queued job, cancelled', value: cancelled.body } }, '404': notFound } };
    out.getHealth = { responses: { '200': { ok: { summary: 'the process answers', value: (await call(app, 'GET', '/health')).body } } } };
    out.getReadiness = { responses: { '200': { ready: { summary: 'the worker pool answered', value: (await call(app, 'GET', '/ready')).body } } } };
    // the service's own gauges (the process's figures, prom-client's defaults, left out of the example)
    const metrics = String((await call(app, 'GET', '/metrics')).body).split('\n').filter((l) => /^(# (HELP|TYPE) )?platesmith_(?!process_)/.test(l)).join('\n') + '\n';
    out.getMetrics = { responses: { '200': { embedded: { summary: 'the embedded backend after the schedule above (the process\'s own figures left out)', value: metrics } } } };
  } finally {
    await Promise.all([app.close(), full.close(), idle.close()]);
  }
  return out;
}
