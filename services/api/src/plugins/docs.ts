import swagger from '@fastify/swagger';
import swaggerUi from '@fastify/swagger-ui';
import { CAUTION, SCOPE } from '@platesmith/schema';
import fp from 'fastify-plugin';
import { jsonSchemaTransform, jsonSchemaTransformObject } from 'fastify-type-provider-zod';
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

/** OpenAPI 3.1 generated from the zod schemas, at /openapi.json, and a readable page at /docs. */
export const docsPlugin = fp(
  async (app) => {
    await app.register(swagger, {
      openapi: {
        openapi: '3.1.0',
        info: { title: 'Platesmith API', version: API_VERSION, description: API_DESCRIPTION },
        tags: [
          { name: 'checks', description: 'one section checked' },
          { name: 'effects', description: 'analysis of a problem' },
          { name: 'searches', description: 'the lightest sections of a plate space' },
          { name: 'schedules', description: 'girder schedules run as jobs' },
          { name: 'service', description: 'health and readiness' },
        ],
      },
      transform: jsonSchemaTransform,
      transformObject: jsonSchemaTransformObject,
    });
    await app.register(swaggerUi, { routePrefix: '/docs', staticCSP: true, uiConfig: { docExpansion: 'list', deepLinking: false } });
    app.get('/openapi.json', { schema: { hide: true } }, async () => app.swagger());
  },
  { name: 'platesmith-docs' },
);
