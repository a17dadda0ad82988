import { Writable } from 'node:stream';
import { pino } from 'pino';
import { buildApp, type ApiOptions } from '../src/index.js';
import type { FastifyInstance } from 'fastify';
import { ContractChecker } from '../../../test/client/index.js';

/**
 * A real server on 127.0.0.1, port 0, with its pino lines collected (no console output). Every
 * answer to post() and get() on a documented path is checked against the OpenAPI document the
 * server serves (test/client: status, content type, body schema, required headers); a mismatch
 * throws, so the test fails on a broken contract.
 */
export interface Running {
  app: FastifyInstance;
  url: string;
  logs: Record<string, unknown>[];
  post(path: string, body: unknown, headers?: Record<string, string>): Promise<{ status: number; headers: Headers; body: any }>;
  get(path: string, headers?: Record<string, string>): Promise<{ status: number; headers: Headers; body: any }>;
  close(): Promise<void>;
}

/** buildApp's options, and routes a test adds before the server listens (e.g. to drive a fixture worker). */
export async function start(opts: ApiOptions & { routes?: (app: FastifyInstance) => void } = {}): Promise<Running> {
  const logs: Record<string, unknown>[] = [];
  const sink = new Writable({
    write(chunk, _enc, cb) {
      for (const line of String(chunk).split('\n')) if (line) logs.push(JSON.parse(line));
      cb();
    },
  });
  const { routes, ...apiOpts } = opts;
  // the lag guard only where a test asks for it: on a loaded host a test process may stall past 1 s
  const app = await buildApp({ loggerInstance: pino({ level: 'info' }, sink), maxEventLoopDelayMs: 60_000, ...apiOpts });
  routes?.(app);
  const url = await app.listen({ host: '127.0.0.1', port: 0 });
  // the document as served, asked with a Host the service answers for (with an allow-list, the
  // test's own 127.0.0.1 gets 421 and a problem body, not the document)
  const served = await app.inject({ method: 'GET', url: '/openapi.json', headers: { host: apiOpts.allowedHosts?.[0] ?? new URL(url).host } });
  if (served.statusCode !== 200) throw new Error(`GET /openapi.json answered ${served.statusCode}: ${served.body.slice(0, 200)}`);
  const contract = new ContractChecker(served.json() as Record<string, unknown>);
  const read = async (method: string, path: string, r: Response) => {
    const text = await r.text();
    let body: unknown = text;
    try {
      body = JSON.parse(text);
    } catch {
      /* not JSON: keep the text */
    }
    const template = contract.templateOf(method, new URL(path, url).pathname);
    if (template) contract.check(method, template, r.status, r.headers, text === '' ? undefined : body);
    return { status: r.status, headers: r.headers, body };
  };
  return {
    app,
    url,
    logs,
    post: async (path, body, headers = {}) =>
      read('POST', path, await fetch(url + path, { method: 'POST', headers: { 'content-type': 'application/json', ...headers }, body: typeof body === 'string' ? body : JSON.stringify(body) })),
    get: async (path, headers = {}) => read('GET', path, await fetch(url + path, { headers })),
    close: () => app.close(),
  };
}

/** A 12 m simply supported girder, permanent 10 kN/m and imposed (category B) 15 kN/m. */
export const PROBLEM = {
  spans: [12000],
  actions: [
    { kind: 'permanent', load: 'udl', value: 10 },
    { kind: 'variable', load: 'udl', value: 15, category: 'B' },
  ],
  // the fixture's meaning from before issue 17 pinned: a missing restraint is now "at the supports only"
  options: { restraint: 'continuous' },
};

/** A small space (54 candidates): answers in well under a second. */
export const TINY_SPACE = { webDepth: [700, 800, 900], webThickness: [8, 10], flangeWidth: [200, 250, 300], flangeThickness: [12, 15, 20], panels: [0], endPost: 'rigid' };

export const SECTION = {
  web: { depth: 800, thickness: 10 },
  topFlange: { width: 250, thickness: 15 },
  bottomFlange: { width: 250, thickness: 15 },
};
