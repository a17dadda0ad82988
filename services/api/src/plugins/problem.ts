import { isEngineError, type EngineErrorCode } from '@platesmith/app';
import { isDomainError } from '@platesmith/catalogue';
import { MAX_LISTED_ISSUES } from '@platesmith/schema';
import type { ProblemDetailsJson } from '../problem-json.js';
import type { FastifyError, FastifyReply, FastifyRequest } from 'fastify';
import fp from 'fastify-plugin';
import { ApiError, ERROR_CODES, problemType, RequestInvalid, type ErrorCode } from '../errors.js';

/** Fastify's own client errors, by their code. */
const FASTIFY_CODES: Record<string, ErrorCode> = {
  FST_ERR_CTP_INVALID_JSON_BODY: 'INVALID_JSON',
  FST_ERR_CTP_EMPTY_JSON_BODY: 'EMPTY_BODY',
  FST_ERR_CTP_BODY_TOO_LARGE: 'BODY_TOO_LARGE',
  FST_ERR_CTP_INVALID_MEDIA_TYPE: 'UNSUPPORTED_MEDIA_TYPE',
  FST_ERR_CTP_INVALID_CONTENT_LENGTH: 'INVALID_JSON',
};

/** The engine's failures, by their code. */
const ENGINE_CODES: Record<EngineErrorCode, ErrorCode> = {
  SATURATED: 'POOL_SATURATED',
  TIME_BUDGET_EXCEEDED: 'TIME_BUDGET_EXCEEDED',
  WORKER_FAILED: 'WORKER_FAILED',
  CANCELLED: 'CANCELLED',
};

interface Mapped {
  body: ProblemDetailsJson;
  retryAfter?: number;
  /** whether the full error belongs in the log at error level */
  internal: boolean;
}

function base(code: ErrorCode, detail: string, req: FastifyRequest): ProblemDetailsJson {
  const e = ERROR_CODES[code];
  return { type: problemType(code), title: e.title, status: e.status, detail, instance: req.url.split('?')[0]!, code, requestId: String(req.id) };
}

/** Any error → RFC 9457 problem details. Never a stack trace; a 500 says only that it happened. */
export function toProblem(err: unknown, req: FastifyRequest): Mapped {
  if (err instanceof RequestInvalid) {
    // at most MAX_LISTED_ISSUES issues listed, and how many there were (an error never amplifies its input)
    const listed = err.issues.slice(0, MAX_LISTED_ISSUES).map((i) => ({ path: i.path, pointer: i.pointer, message: i.message }));
    const body: ProblemDetailsJson = { ...base(err.code, `${err.issues.length} field(s) rejected: ${err.message}`, req), errors: listed };
    if (err.issues.length > listed.length) body.issueCount = err.issues.length;
    return { body, internal: false };
  }
  if (err instanceof ApiError) {
    const out: Mapped = { body: { ...base(err.code, err.message, req), ...err.extra }, internal: ERROR_CODES[err.code].status === 500 };
    if (err.retryAfter !== undefined) out.retryAfter = err.retryAfter;
    else if (ERROR_CODES[err.code].status === 503) out.retryAfter = 1;
    return out;
  }
  if (isEngineError(err)) {
    const code = ENGINE_CODES[err.code];
    const out: Mapped = { body: { ...base(code, err.message, req), ...(err.budgetMs !== undefined ? { budgetMs: err.budgetMs } : {}) }, internal: err.code === 'WORKER_FAILED' };
    // every 503 says when to come back
    if (ERROR_CODES[code].status === 503) out.retryAfter = err.retryAfter ?? 1;
    return out;
  }
  if (isDomainError(err)) {
    const body: ProblemDetailsJson = { ...base('UNPROCESSABLE', err.message, req), code: err.code, hint: err.hint };
    if (err.field !== undefined) {
      body.field = err.field;
      body.errors = [{ path: err.field, pointer: '#/' + err.field.replace(/\[(\d+)\]/g, '.$1').split('.').map((p) => p.replace(/~/g, '~0').replace(/\//g, '~1')).join('/'), message: err.message }];
    }
    return { body, internal: false };
  }
  const fe = err as Partial<FastifyError> & { statusCode?: number };
  const known = fe.code ? FASTIFY_CODES[fe.code] : undefined;
  if (known) return { body: base(known, known === 'BODY_TOO_LARGE' ? 'the request body is over the size limit' : String(fe.message), req), internal: false };
  if (fe instanceof SyntaxError || (typeof fe.statusCode === 'number' && fe.statusCode === 400 && /JSON|prototype/i.test(String(fe.message)))) {
    return { body: base('INVALID_JSON', String(fe.message), req), internal: false };
  }
  if (typeof fe.statusCode === 'number' && fe.statusCode >= 400 && fe.statusCode < 500) {
    return { body: { ...base('INVALID_REQUEST', String(fe.message), req), status: fe.statusCode }, internal: false };
  }
  return { body: base('INTERNAL', 'an internal error occurred; it is logged under this request id', req), internal: true };
}

export function sendProblem(reply: FastifyReply, m: Mapped): FastifyReply {
  if (m.retryAfter !== undefined) void reply.header('retry-after', String(m.retryAfter));
  return reply.code(m.body.status).type('application/problem+json').send(m.body);
}

/** Error handler and not-found handler: every error leaves as application/problem+json. */
export const problemPlugin = fp(
  async (app) => {
    app.setErrorHandler((err, req, reply) => {
      const m = toProblem(err, req);
      if (m.internal) req.log.error({ err }, 'request failed');
      else req.log.info({ code: m.body.code, status: m.body.status }, 'request rejected');
      return sendProblem(reply, m);
    });
    app.setNotFoundHandler((req, reply) => sendProblem(reply, { body: base('NOT_FOUND', `no route ${req.method} ${req.url.split('?')[0]}`, req), internal: false }));
  },
  { name: 'platesmith-problem' },
);
