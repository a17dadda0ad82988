import { isEngineError, type EngineErrorCode } from '@platesmith/app';
import { isDomainError } from '@platesmith/catalogue';
import { MAX_LISTED_ISSUES } from '@platesmith/schema';
import type { ProblemDetailsJson } from '../problem-json.js';
import type { FastifyError, FastifyReply, FastifyRequest } from 'fastify';
import fp from 'fastify-plugin';
import { ApiError, ERROR_CODES, problemType, RequestInvalid, type ErrorCode } from '../errors.js';
import { methodIndex } from './guard.js';

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

export function problemBase(code: ErrorCode, detail: string, req: FastifyRequest): ProblemDetailsJson {
  const e = ERROR_CODES[code];
  return { type: problemType(code), title: e.title, status: e.status, detail, instance: req.url.split('?')[0]!, code, requestId: String(req.id) };
}

/** Any error → RFC 9457 problem details. Never a stack trace; a 500 says only that it happened. */
export function toProblem(err: unknown, req: FastifyRequest): Mapped {
  if (err instanceof RequestInvalid) {
    // at most MAX_LISTED_ISSUES issues listed, and how many there were (an error never amplifies its input)
    const listed = err.issues.slice(0, MAX_LISTED_ISSUES).map((i) => ({ path: i.path, pointer: i.pointer, message: i.message }));
    const body: ProblemDetailsJson = { ...problemBase(err.code, `${err.issues.length} field(s) rejected: ${err.message}`, req), errors: listed };
    if (err.issues.length > listed.length) body.issueCount = err.issues.length;
    return { body, internal: false };
  }
  if (err instanceof ApiError) {
    // a 500, and a job store that is full, corrupt or failing (a fault an operator must see and
    // repair, logged at error with its cause), unlike load shedding (503s at warn, no stack)
    const out: Mapped = { body: { ...problemBase(err.code, err.message, req), ...err.extra }, internal: ERROR_CODES[err.code].status === 500 || err.code === 'STORE_UNAVAILABLE' };
    if (err.retryAfter !== undefined) out.retryAfter = err.retryAfter;
    else if (ERROR_CODES[err.code].status === 503) out.retryAfter = 1;
    return out;
  }
  if (isEngineError(err)) {
    const code = ENGINE_CODES[err.code];
    const out: Mapped = { body: { ...problemBase(code, err.message, req), ...(err.budgetMs !== undefined ? { budgetMs: err.budgetMs } : {}) }, internal: err.code === 'WORKER_FAILED' };
    // every 503 says when to come back
    if (ERROR_CODES[code].status === 503) out.retryAfter = err.retryAfter ?? 1;
    return out;
  }
  if (isDomainError(err)) {
    const body: ProblemDetailsJson = { ...problemBase('UNPROCESSABLE', err.message, req), code: err.code, hint: err.hint };
    if (err.field !== undefined) {
      body.field = err.field;
      body.errors = [{ path: err.field, pointer: '#/' + err.field.replace(/\[(\d+)\]/g, '.$1').split('.').map((p) => p.replace(/~/g, '~0').replace(/\//g, '~1')).join('/'), message: err.message }];
    }
    return { body, internal: false };
  }
  const fe = err as Partial<FastifyError> & { statusCode?: number };
  const known = fe.code ? FASTIFY_CODES[fe.code] : undefined;
  if (known) return { body: problemBase(known, known === 'BODY_TOO_LARGE' ? 'the request body is over the size limit' : String(fe.message), req), internal: false };
  if (fe instanceof SyntaxError || (typeof fe.statusCode === 'number' && fe.statusCode === 400 && /JSON|prototype/i.test(String(fe.message)))) {
    return { body: problemBase('INVALID_JSON', String(fe.message), req), internal: false };
  }
  if (typeof fe.statusCode === 'number' && fe.statusCode >= 400 && fe.statusCode < 500) {
    return { body: { ...problemBase('INVALID_REQUEST', String(fe.message), req), status: fe.statusCode }, internal: false };
  }
  return { body: problemBase('INTERNAL', 'an internal error occurred; it is logged under this request id', req), internal: true };
}

export function sendProblem(reply: FastifyReply, m: Mapped): FastifyReply {
  if (m.retryAfter !== undefined) void reply.header('retry-after', String(m.retryAfter));
  return reply.code(m.body.status).type('application/problem+json').send(m.body);
}

/**
 * Error handler and not-found handler: every error leaves as application/problem+json. A 500's
 * error is logged with its stack at error level; any other rejection only puts its code on the
 * request's one log line (guard.ts). A known path asked with another method is 405 with Allow.
 */
export const problemPlugin = fp(
  async (app) => {
    const methods = methodIndex();
    app.addHook('onRoute', (r) => methods.add(r.url, r.method));
    app.setErrorHandler((err, req, reply) => {
      const m = toProblem(err, req);
      if (m.internal) req.log.error({ err }, 'request failed');
      req.logExtra = { ...req.logExtra, code: m.body.code };
      return sendProblem(reply, m);
    });
    app.setNotFoundHandler((req, reply) => {
      const path = req.url.split('?')[0]!;
      const allow = methods.allowed(path).filter((m) => m !== req.method);
      req.logExtra = { ...req.logExtra, code: allow.length ? 'METHOD_NOT_ALLOWED' : 'NOT_FOUND' };
      if (allow.length > 0) {
        void reply.header('allow', allow.join(', '));
        return sendProblem(reply, { body: problemBase('METHOD_NOT_ALLOWED', `${req.method} is not allowed on ${path.slice(0, 200)}; allowed: ${allow.join(', ')}`, req), internal: false });
      }
      return sendProblem(reply, { body: problemBase('NOT_FOUND', `no route ${req.method} ${path.slice(0, 200)}`, req), internal: false });
    });
  },
  { name: 'platesmith-problem' },
);

/** Fastify's router errors (a malformed or over-long URL) as problem+json too. */
export function frameworkError(err: { code?: string; message: string }, req: FastifyRequest, reply: FastifyReply): void {
  const code: ErrorCode = err.code === 'FST_ERR_MAX_PARAM_LENGTH' ? 'URI_TOO_LONG' : 'INVALID_REQUEST';
  req.logExtra = { ...req.logExtra, code };
  void sendProblem(reply, { body: problemBase(code, code === 'URI_TOO_LONG' ? 'a path parameter of the URL is over the length limit' : 'the URL is malformed', req), internal: false });
}

/**
 * Errors of the HTTP parser before any request exists (a header too large, a request or its
 * headers too slow, a malformed request line): a problem+json written on the socket, then closed.
 */
export function clientError(err: Error & { code?: string }, socket: import('node:stream').Duplex): void {
  if (!socket.writable) return void socket.destroy();
  const [status, title] =
    err.code === 'HPE_HEADER_OVERFLOW' ? [431, 'Request header fields too large'] : err.code === 'ERR_HTTP_REQUEST_TIMEOUT' ? [408, 'Request timeout'] : [400, 'Bad request'];
  const body = JSON.stringify({ type: `urn:platesmith:problem:${status === 400 ? 'invalid-request' : status === 408 ? 'request-timeout' : 'headers-too-large'}`, title, status, detail: title.toLowerCase(), instance: '', code: status === 400 ? 'INVALID_REQUEST' : status === 408 ? 'REQUEST_TIMEOUT' : 'HEADERS_TOO_LARGE', requestId: '' });
  socket.end(`HTTP/1.1 ${status} ${title}\r\ncontent-type: application/problem+json\r\ncontent-length: ${Buffer.byteLength(body)}\r\nconnection: close\r\n\r\n${body}`);
}
