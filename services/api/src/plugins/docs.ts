import swagger from '@fastify/swagger';
import swaggerUi from '@fastify/swagger-ui';
import { CAUTION, SCOPE } from '@platesmith/schema';
import fp from 'fastify-plugin';
import { documentTransform, routeTransform } from '../contract.js';
import { ERROR_CODES } from '../errors.js';

export const API_VERSION = '0.1.0';

export const API_DESCRIPTION = [
  'Exact discrete search for the lightest welded steel plate girders to Eurocode 3 (EN 1993-1-1, -1-5, -1-8; actions to EN 1990), and checks of a given section.',
  '',
  `**Caution.** ${CAUTION}`,
  '',
  `**Scope.** ${SCOPE}`,
  '',
  'Units: lengths mm (span too: 24000 for 24 m), forces kN, distributed loads kN/m, moments kNm, stresses MPa, mass kg (tonnage t).',
  '',
  'Errors are RFC 9457 application/problem+json with a stable `code`: ' + Object.keys(ERROR_CODES).join(', ') + '; domain errors (422 UNPROCESSABLE) carry the code, field and hint of the engineering packages.',
].join('\n');

type Operation = { responses?: Record<string, unknown>; security?: unknown[] };
type OpenApiDoc = { paths?: Record<string, Record<string, Operation>>; components?: Record<string, Record<string, unknown>> };

const PROBLEM = { description: 'problem details (RFC 9457)', content: { 'application/problem+json': { schema: { $ref: '#/components/schemas/ProblemDetails' } } } };

/**
 * Declares the bearer scheme: every /v1 operation may need `Authorization: Bearer <key>` (when
 * the service runs with PLATESMITH_API_KEYS or _FILE; without keys the empty requirement holds)
 * and may answer 401 UNAUTHORIZED and 429 RATE_LIMITED; so may /metrics; /health, /ready and the docs are open.
 */
export function withBearer(doc: OpenApiDoc): OpenApiDoc {
  const components = { ...doc.components, securitySchemes: { ...doc.components?.['securitySchemes'], bearerAuth: { type: 'http', scheme: 'bearer', description: 'an API key of the service (PLATESMITH_API_KEYS or PLATESMITH_API_KEYS_FILE); required on /v1 when the service runs with keys' } } };
  const paths: NonNullable<OpenApiDoc['paths']> = {};
  for (const [path, ops] of Object.entries(doc.paths ?? {})) {
    if (!path.startsWith('/v1') && path !== '/metrics') {
      paths[path] = ops;
      continue;
    }
    paths[path] = Object.fromEntries(
      Object.entries(ops).map(([method, op]) => [method, { ...op, security: [{ bearerAuth: [] }, {}], responses: { ...op.responses, 401: op.responses?.['401'] ?? PROBLEM, 429: op.responses?.['429'] ?? PROBLEM } }]),
    );
  }
  return { ...doc, components, paths };
}

/** OpenAPI 3.1 generated from the zod schemas, at /openapi.json, and a readable page at /docs. */
export const docsPlugin = fp(
  async (app) => {
    await app.register(swagger, {
      openapi: {
        openapi: '3.1.0',
        info: { title: 'Platesmith API', version: API_VERSION, description: API_DESCRIPTION },
        // open: no authentication until bearer keys are configured
        security: [],
        servers: [{ url: 'http://127.0.0.1:8080', description: 'the service on its default local address (HOST 127.0.0.1, PORT 8080)' }],
        tags: [
          { name: 'checks', description: 'one section checked' },
          { name: 'effects', description: 'analysis of a problem' },
          { name: 'searches', description: 'the lightest sections of a plate space' },
          { name: 'schedules', description: 'girder schedules run as jobs' },
          { name: 'service', description: 'health and readiness' },
        ],
      },
      transform: routeTransform,
      transformObject: (doc) => withBearer(documentTransform(doc) as OpenApiDoc) as ReturnType<typeof documentTransform>,
    });
    await app.register(swaggerUi, { routePrefix: '/docs', staticCSP: true, uiConfig: { docExpansion: 'list', deepLinking: false } });
    app.get('/openapi.json', { schema: { hide: true } }, async () => app.swagger());
  },
  { name: 'platesmith-docs' },
);
