import { jsonSchemaTransform, jsonSchemaTransformObject } from 'fastify-type-provider-zod';
import { ERROR_CODES, type ErrorCode } from './errors.js';
import EXAMPLES from './openapi-examples.json' with { type: 'json' };

/**
 * The OpenAPI document as a contract a client generator can use. The zod schemas give the shapes
 * (fastify-type-provider-zod); this module adds what is HTTP, the same for every route, once:
 *
 * - every error response an operation can give, from its `errors` codes (route schema) and the
 *   codes any operation can answer, as application/problem+json with the codes in its
 *   description, and Retry-After where the service sets it;
 * - the success responses' descriptions (from the schema's description) and headers;
 * - request and response examples by operationId (openapi-examples.json, recorded from the
 *   bundled demo and example files by `pnpm openapi --examples`);
 * - one component per shape: an "…Input" schema identical to its output twin is merged into it,
 *   and components no operation reaches are left out.
 */

declare module 'fastify' {
  interface FastifySchema {
    /** The service's error codes this operation answers beyond those of every operation (ALWAYS) and of every JSON body (BODY). */
    errors?: readonly ErrorCode[];
    /** Headers of its success answers, by status: name → what it holds, and whether every such answer has it. */
    answerHeaders?: Record<number, Record<string, { description: string; required: boolean }>>;
  }
}

/** Codes any operation can answer: the service closing (onRequest hook) and an unexpected failure. */
export const ALWAYS: readonly ErrorCode[] = ['SHUTTING_DOWN', 'INTERNAL'];
/**
 * Codes the framework answers for any operation before its handler runs: the Host allow-list (421,
 * when configured), the event-loop guard (503, /health included), and Node's HTTP parser (408 for a
 * request not received in time, 431 for headers over its limit). 404 NOT_FOUND and 405
 * METHOD_NOT_ALLOWED are router answers too, but never to a documented operation: they answer a
 * path or method the document does not list.
 */
export const ROUTER: readonly ErrorCode[] = ['HOST_NOT_ALLOWED', 'OVERLOADED', 'REQUEST_TIMEOUT', 'HEADERS_TOO_LARGE'];
/** Codes the router answers for any operation with path parameters: one over its length limit (414). */
export const PATH_PARAMS: readonly ErrorCode[] = ['URI_TOO_LONG'];
/** Codes of any operation that takes a JSON body (content-type parser, body limit, schema). */
export const BODY: readonly ErrorCode[] = ['INVALID_JSON', 'EMPTY_BODY', 'BODY_TOO_LARGE', 'UNSUPPORTED_MEDIA_TYPE', 'INVALID_REQUEST', 'INVALID_VALUE'];
/** Codes of any operation with path or query parameters (their schema). */
export const PARAMS: readonly ErrorCode[] = ['INVALID_REQUEST', 'INVALID_VALUE'];
/** Codes whose answer carries Retry-After (always, or only sometimes: JOB_NOT_FINISHED while the job is queued or running). */
const RETRY_AFTER: Partial<Record<ErrorCode, 'always' | 'sometimes'>> = {
  POOL_SATURATED: 'always',
  OVERLOADED: 'always',
  JOBS_SATURATED: 'always',
  SHUTTING_DOWN: 'always',
  NOT_READY: 'always',
  JOB_NOT_FINISHED: 'sometimes',
  PRINT_FAILED: 'always',
};

const SCHEMAS = '#/components/schemas/';
const PROBLEM_REF = { $ref: `${SCHEMAS}ProblemDetails` };
const METHODS = ['get', 'put', 'post', 'delete', 'patch', 'head', 'options'] as const;

type Json = Record<string, any>;
interface MediaExample {
  summary: string;
  description?: string;
  value: unknown;
}
/** Examples of one operation: the request body's by media type, each response's by status. */
export interface OperationExamples {
  request?: Record<string, Record<string, MediaExample>>;
  responses: Record<string, Record<string, MediaExample>>;
}
export const OPERATION_EXAMPLES = EXAMPLES as unknown as Record<string, OperationExamples>;

/** Per route (fastify-swagger's `transform`): zod → JSON Schema, and the route's error codes kept for the document. */
export const routeTransform: typeof jsonSchemaTransform = (input) => {
  const out = jsonSchemaTransform(input);
  const s = out.schema as Json | undefined;
  if (s && 'errors' in s) {
    s['x-error-codes'] = s.errors;
    delete s.errors;
  }
  if (s && 'answerHeaders' in s) {
    s['x-answer-headers'] = s.answerHeaders;
    delete s.answerHeaders;
  }
  return out;
};

/** The whole document (fastify-swagger's `transformObject`). */
export const documentTransform: typeof jsonSchemaTransformObject = (input) => {
  const doc = jsonSchemaTransformObject(input) as Json;
  for (const [, op] of operations(doc)) finishOperation(doc, op);
  mergeInputTwins(doc);
  dropUnreachable(doc);
  renameLoneInputs(doc);
  return doc as ReturnType<typeof jsonSchemaTransformObject>;
};

export function* operations(doc: Json): Generator<[string, Json, string]> {
  for (const [path, item] of Object.entries<Json>(doc.paths ?? {})) {
    for (const m of METHODS) if (item[m]) yield [path, item[m], m];
  }
}

function finishOperation(doc: Json, op: Json): void {
  const declared: ErrorCode[] = op['x-error-codes'] ?? [];
  const answerHeaders: Json = op['x-answer-headers'] ?? {};
  delete op['x-error-codes'];
  delete op['x-answer-headers'];
  const codes = new Set<ErrorCode>([
    ...declared,
    ...ALWAYS,
    ...ROUTER,
    ...(op.requestBody ? BODY : []),
    ...(op.parameters?.length ? PARAMS : []),
    ...(op.parameters?.some((p: Json) => p.in === 'path') ? PATH_PARAMS : []),
  ]);
  const responses: Json = {};
  for (const [status, r] of Object.entries<Json>(op.responses ?? {})) {
    if (Number(status) >= 400) {
      // a status the route lists without a code for it: every code of that status may come
      if (![...codes].some((c) => String(ERROR_CODES[c].status) === status)) for (const [c, e] of Object.entries(ERROR_CODES)) if (String(e.status) === status) codes.add(c as ErrorCode);
      continue;
    }
    responses[status] = finishSuccess(doc, r, op.summary ?? 'the answer');
    if (answerHeaders[status]) {
      responses[status].headers = Object.fromEntries(
        Object.entries<Json>(answerHeaders[status]).map(([name, h]) => [name, { description: h.description, required: h.required, schema: name === 'Retry-After' ? { type: 'integer', minimum: 0 } : { type: 'string' } }]),
      );
    }
  }
  const byStatus = new Map<number, ErrorCode[]>();
  for (const c of Object.keys(ERROR_CODES) as ErrorCode[]) if (codes.has(c)) byStatus.set(ERROR_CODES[c].status, [...(byStatus.get(ERROR_CODES[c].status) ?? []), c]);
  for (const [status, cs] of [...byStatus].sort((a, b) => a[0] - b[0])) {
    const r: Json = {
      description: cs.map((c) => `\`${c}\`: ${ERROR_CODES[c].when}`).join('; '),
      content: { 'application/problem+json': { schema: PROBLEM_REF } },
    };
    const retry = cs.map((c) => RETRY_AFTER[c]).filter(Boolean);
    if (retry.length) {
      r.headers = {
        'Retry-After': {
          description: retry.length === cs.length && retry.every((x) => x === 'always') ? 'seconds to wait before retrying' : 'seconds to wait before retrying (' + cs.filter((c) => RETRY_AFTER[c]).join(', ') + (cs.some((c) => RETRY_AFTER[c] === 'sometimes') ? ' while the job is queued or running' : '') + ')',
          required: retry.length === cs.length && retry.every((x) => x === 'always'),
          schema: { type: 'integer', minimum: 0 },
        },
      };
    }
    responses[String(status)] = r;
  }
  op.responses = responses;
  // a non-JSON request body (e.g. text/csv) is text: fastify-swagger gave it the JSON body's schema
  // (one object shared by every media type, so replaced, not edited)
  const body: Json = op.requestBody?.content ?? {};
  for (const media of Object.keys(body)) if (!/json/.test(media)) body[media] = { schema: { type: 'string' } };
  addExamples(op);
}

function finishSuccess(doc: Json, r: Json, summary: string): Json {
  if (r.description === 'Default Response') {
    const ref: string | undefined = Object.values<Json>(r.content ?? {})[0]?.schema?.$ref;
    const target = ref?.startsWith(SCHEMAS) ? doc.components?.schemas?.[ref.slice(SCHEMAS.length)] : undefined;
    r.description = target?.description ?? (r.content ? summary : 'no content');
  }
  return r;
}

function addExamples(op: Json): void {
  const ex = op.operationId ? OPERATION_EXAMPLES[op.operationId] : undefined;
  if (!ex) return;
  for (const [media, examples] of Object.entries(ex.request ?? {})) {
    const m = op.requestBody?.content?.[media];
    if (m) m.examples = examples;
  }
  for (const [status, examples] of Object.entries(ex.responses)) {
    const content: Json | undefined = op.responses[status]?.content;
    if (!content) continue;
    const [media] = Object.keys(content);
    content[media!].examples = examples;
  }
}

/** Every value of the document whose key is $ref, rewritten by f. */
function rewriteRefs(v: unknown, f: (ref: string) => string): void {
  if (Array.isArray(v)) v.forEach((x) => rewriteRefs(x, f));
  else if (v && typeof v === 'object') {
    for (const [k, x] of Object.entries(v as Json)) {
      if (k === '$ref' && typeof x === 'string') (v as Json)[k] = f(x);
      else rewriteRefs(x, f);
    }
  }
}

/**
 * fastify-type-provider-zod emits every registered schema twice, as read ("…Input") and as written;
 * where the two are the same shape, once the twins they refer to are merged too, one name stays.
 */
export function mergeInputTwins(doc: Json): void {
  const schemas: Json = doc.components?.schemas ?? {};
  const merged = new Set<string>();
  for (let changed = true; changed; ) {
    changed = false;
    for (const name of Object.keys(schemas)) {
      if (!name.endsWith('Input') || merged.has(name)) continue;
      const twin = name.slice(0, -'Input'.length);
      if (!(twin in schemas)) continue;
      const a = structuredClone(schemas[name]);
      // the twin itself and every twin merged so far count as equal names
      rewriteRefs(a, (ref) => {
        const n = ref.slice(SCHEMAS.length);
        return n === name || merged.has(n) ? SCHEMAS + n.slice(0, -'Input'.length) : ref;
      });
      if (JSON.stringify(a) === JSON.stringify(schemas[twin])) {
        merged.add(name);
        changed = true;
      }
    }
  }
  rewriteRefs(doc, (ref) => {
    const n = ref.slice(SCHEMAS.length);
    return ref.startsWith(SCHEMAS) && merged.has(n) ? SCHEMAS + n.slice(0, -'Input'.length) : ref;
  });
  for (const n of merged) delete schemas[n];
}

/** Components no path reaches (schemas registered by the packages for other uses) are left out. */
export function dropUnreachable(doc: Json): void {
  const schemas: Json = doc.components?.schemas ?? {};
  const seen = new Set<string>();
  const visit = (v: unknown): void => {
    if (Array.isArray(v)) v.forEach(visit);
    else if (v && typeof v === 'object') {
      for (const [k, x] of Object.entries(v as Json)) {
        if (k === '$ref' && typeof x === 'string' && x.startsWith(SCHEMAS)) {
          const n = x.slice(SCHEMAS.length);
          if (!seen.has(n)) {
            seen.add(n);
            visit(schemas[n]);
          }
        } else visit(x);
      }
    }
  };
  visit(doc.paths);
  for (const n of Object.keys(schemas)) if (!seen.has(n)) delete schemas[n];
}

/** An "…Input" schema whose written twin no path reaches takes the plain name (the request bodies). */
export function renameLoneInputs(doc: Json): void {
  const schemas: Json = doc.components?.schemas ?? {};
  const renamed = new Map<string, string>();
  for (const name of Object.keys(schemas)) {
    const plain = name.slice(0, -'Input'.length);
    if (name.endsWith('Input') && !(plain in schemas)) renamed.set(name, plain);
  }
  rewriteRefs(doc, (ref) => {
    const to = ref.startsWith(SCHEMAS) ? renamed.get(ref.slice(SCHEMAS.length)) : undefined;
    return to ? SCHEMAS + to : ref;
  });
  const out: Json = {};
  for (const [name, v] of Object.entries(schemas)) out[renamed.get(name) ?? name] = v;
  doc.components.schemas = Object.fromEntries(Object.entries(out).sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0)));
}
