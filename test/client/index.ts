/**
 * The API client of the end-to-end tests: openapi-fetch over the types openapi-typescript
 * generates from docs/openapi.json (test/client/generate.mjs), and every answer checked at run
 * time against the document the service serves (ajv, JSON Schema 2020-12 as OpenAPI 3.1 uses):
 * its status must be one the operation lists, its content type one that status lists, a JSON
 * body must match that schema, and a documented required header must be there. A mismatch
 * throws, so the test that made the call fails naming the operation and the difference.
 */
import { Ajv2020 } from 'ajv/dist/2020.js';
import createClient, { type Middleware } from 'openapi-fetch';
import type { paths } from './openapi.js';

export type { paths };
type Json = Record<string, any>;

/** A documented answer the service did not give as documented. */
export class ContractViolation extends Error {
  override name = 'ContractViolation';
}

const pointer = (...parts: string[]): string => '#/' + parts.map((p) => p.replace(/~/g, '~0').replace(/\//g, '~1')).join('/');

/** Checks answers against one OpenAPI document. */
export class ContractChecker {
  readonly #doc: Json;
  readonly #ajv: Ajv2020;
  readonly #templates: { method: string; template: string; re: RegExp }[] = [];
  /** answers checked, by operationId (a test can require that each was seen) */
  readonly seen = new Map<string, Set<string>>();

  constructor(doc: Json) {
    this.#doc = doc;
    // the document's own keywords (examples, descriptions) are not validation keywords: strict off
    this.#ajv = new Ajv2020({ strict: false, allErrors: true });
    this.#ajv.addSchema(doc, 'openapi.json');
    for (const [template, item] of Object.entries<Json>(doc.paths)) {
      // a route a test adds (/_test/…, e.g. to drive a fixture worker) is not part of the contract:
      // the served document lists it only because the test registered it, so it is not checked
      if (template.startsWith('/_test/')) continue;
      const re = new RegExp('^' + template.replace(/[.*+?^$()|[\]\\]/g, '\\$&').replace(/\{[^}]+\}/g, '[^/]+') + '$');
      for (const method of Object.keys(item)) this.#templates.push({ method, template, re });
    }
  }

  /** The path template of a request path, or undefined when the document has none. */
  templateOf(method: string, pathname: string): string | undefined {
    return this.#templates.find((t) => t.method === method.toLowerCase() && t.re.test(pathname))?.template;
  }

  /** Throws a ContractViolation when the answer is not one the document describes for this operation. */
  check(method: string, template: string, status: number, headers: Headers, body: unknown): void {
    const m = method.toLowerCase();
    const op = this.#doc.paths[template]?.[m];
    const at = `${method.toUpperCase()} ${template} → ${status}`;
    if (!op) throw new ContractViolation(`${at}: no such operation in the document`);
    const r = op.responses[String(status)] ?? op.responses.default;
    if (!r) throw new ContractViolation(`${at}: status not documented (documented: ${Object.keys(op.responses).join(', ')})`);
    const key = String(status) in op.responses ? String(status) : 'default';
    const seen = this.seen.get(op.operationId) ?? new Set<string>();
    seen.add(key);
    this.seen.set(op.operationId, seen);
    for (const [name, h] of Object.entries<Json>(r.headers ?? {})) {
      if (h.required && !headers.has(name)) throw new ContractViolation(`${at}: required header ${name} missing`);
    }
    if (!r.content) {
      if (body !== undefined && body !== '' && body !== null) throw new ContractViolation(`${at}: a body where the document has none`);
      return;
    }
    const type = (headers.get('content-type') ?? '').split(';')[0]!.trim();
    const media = r.content[type];
    if (!media) throw new ContractViolation(`${at}: content-type ${type || '(none)'} not documented (documented: ${Object.keys(r.content).join(', ')})`);
    if (!/json/.test(type)) {
      if (typeof body !== 'string') throw new ContractViolation(`${at}: ${type} should be text`);
      return;
    }
    const ref = 'openapi.json' + pointer('paths', template, m, 'responses', key, 'content', type, 'schema');
    const validate = this.#ajv.getSchema(ref) ?? this.#ajv.compile({ $ref: ref });
    if (!validate(body)) {
      const errs = (validate.errors ?? []).slice(0, 5).map((e) => `${e.instancePath || '(body)'} ${e.message}${e.params ? ' ' + JSON.stringify(e.params) : ''}`);
      throw new ContractViolation(`${at}: body does not match the document: ${errs.join('; ')}`);
    }
  }

  /** An openapi-fetch middleware that checks every answer before the test sees it. */
  middleware(): Middleware {
    return {
      onResponse: async ({ request, response, schemaPath }) => {
        const text = await response.clone().text();
        const type = response.headers.get('content-type') ?? '';
        const body = text === '' ? undefined : /json/.test(type) ? JSON.parse(text) : text;
        this.check(request.method, schemaPath, response.status, response.headers, body);
        return undefined;
      },
    };
  }
}

/** The document the service at baseUrl serves. */
export async function servedDocument(baseUrl: string): Promise<Json> {
  const r = await fetch(`${baseUrl}/openapi.json`);
  if (!r.ok) throw new Error(`GET /openapi.json answered ${r.status}`);
  return (await r.json()) as Json;
}

/** A typed client of the service at baseUrl whose every answer is checked against the document it serves. */
export async function contractClient(baseUrl: string, opts: { headers?: Record<string, string> } = {}) {
  const checker = new ContractChecker(await servedDocument(baseUrl));
  const client = createClient<paths>({ baseUrl, ...(opts.headers ? { headers: opts.headers } : {}) });
  client.use(checker.middleware());
  return { client, checker };
}
