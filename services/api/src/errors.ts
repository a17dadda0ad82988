import type { FieldIssue } from '@platesmith/schema';

/**
 * The one table of the service's error codes. docs/api.md carries the same table (a test keeps
 * the two in sync). Domain errors from the packages keep their own code (listed in the docs'
 * second table) and are answered with UNPROCESSABLE's status and type.
 */
export const ERROR_CODES = {
  INVALID_JSON: { status: 400, title: 'Malformed JSON', when: 'the body is not valid JSON, or it carries a __proto__ key' },
  EMPTY_BODY: { status: 400, title: 'Empty body', when: 'a JSON content type with an empty body' },
  INVALID_REQUEST: { status: 400, title: 'Request does not match the schema', when: 'wrong types, unknown or missing fields (each field named in errors)' },
  NOT_FOUND: { status: 404, title: 'Not found', when: 'no such route' },
  JOB_NOT_FOUND: { status: 404, title: 'No such schedule job', when: 'the job id is unknown (or was deleted)' },
  MARK_NOT_FOUND: { status: 404, title: 'No such mark', when: 'the schedule job has no girder of that mark' },
  NOT_ACCEPTABLE: { status: 406, title: 'Not acceptable', when: 'the events stream asked for with an Accept that refuses text/event-stream; a PDF asked for where chromium is not installed' },
  NO_SECTION: { status: 409, title: 'No section to record', when: 'the record of a mark that has no adopted section and no feasible section' },
  JOB_NOT_FINISHED: { status: 409, title: 'Schedule not finished', when: 'the result of a job that is queued, running, failed or cancelled; the record of a mark not finished yet' },
  BODY_TOO_LARGE: { status: 413, title: 'Body too large', when: 'the body is over the limit (1 MiB by default)' },
  UNSUPPORTED_MEDIA_TYPE: { status: 415, title: 'Unsupported media type', when: 'a body that is not application/json' },
  INVALID_VALUE: { status: 422, title: 'Request values are not meaningful', when: 'well-formed, but a value is out of range or inconsistent (each field named in errors)' },
  UNPROCESSABLE: { status: 422, title: 'Input outside the scope of the checks', when: 'a domain error from the engineering packages; code, field and hint are the domain error\'s' },
  POOL_SATURATED: { status: 503, title: 'Search workers busy', when: 'too many searches in flight or queued; retry after Retry-After seconds' },
  JOBS_SATURATED: { status: 503, title: 'Schedule queue full', when: 'too many schedule jobs queued; retry after Retry-After seconds' },
  TIME_BUDGET_EXCEEDED: { status: 503, title: 'Search time budget exceeded', when: 'the search ran past its budgetMs and was aborted' },
  SHUTTING_DOWN: { status: 503, title: 'Service shutting down', when: 'the service is closing; retry on another instance' },
  PRINT_FAILED: { status: 503, title: 'PDF printing failed', when: 'chromium did not print the record in time, or too many prints are running; retry after Retry-After seconds, or ask for the HTML' },
  NOT_READY: { status: 503, title: 'Not ready', when: 'the worker pool did not answer a ping' },
  WORKER_FAILED: { status: 500, title: 'Search worker failed', when: 'a worker thread threw or died; the pool replaces it, retry' },
  INTERNAL: { status: 500, title: 'Internal error', when: 'anything else; the full error is in the log under the request id' },
} as const satisfies Record<string, { status: number; title: string; when: string }>;

export type ErrorCode = keyof typeof ERROR_CODES;

/** Problem type URI of a code (RFC 9457 3.1.1: a URI; this one names, it does not resolve). */
export const problemType = (code: ErrorCode): string => `urn:platesmith:problem:${code.toLowerCase().replace(/_/g, '-')}`;

/** An error the service answers as problem+json with its code's status. */
export class ApiError extends Error {
  readonly code: ErrorCode;
  readonly retryAfter: number | undefined;
  readonly extra: Record<string, unknown>;
  constructor(code: ErrorCode, detail: string, opts: { retryAfter?: number; extra?: Record<string, unknown>; cause?: unknown } = {}) {
    super(detail, opts.cause !== undefined ? { cause: opts.cause } : undefined);
    this.name = 'ApiError';
    this.code = code;
    this.retryAfter = opts.retryAfter;
    this.extra = opts.extra ?? {};
  }
}

/** A request that failed its schema: the issues decide 400 (any shape issue) or 422 (values only). */
export class RequestInvalid extends Error {
  readonly issues: FieldIssue[];
  readonly statusCode: number;
  readonly code: 'INVALID_REQUEST' | 'INVALID_VALUE';
  constructor(issues: FieldIssue[]) {
    super(issues.map((i) => `${i.path || '(body)'}: ${i.message}`).join('; '));
    this.name = 'RequestInvalid';
    this.issues = issues;
    this.code = issues.some((i) => i.kind === 'shape') ? 'INVALID_REQUEST' : 'INVALID_VALUE';
    this.statusCode = ERROR_CODES[this.code].status;
  }
}
