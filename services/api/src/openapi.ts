import { buildApp } from './app.js';

/** Header of the generated OpenAPI file (JSON has no comments: a leading property says it). */
export const GENERATED_NOTE = 'Generated from the zod schemas by @platesmith/api (generateOpenApi); do not edit by hand. Regenerate it with `pnpm openapi`; the test test/e2e/api-openapi.test.ts fails while it differs.';

/** The OpenAPI 3.1 document of the service, as the committed file holds it (2-space JSON, newline). */
export async function generateOpenApi(): Promise<string> {
  const app = await buildApp({ threads: 1 });
  try {
    await app.ready();
    return JSON.stringify({ 'x-generated': GENERATED_NOTE, ...(app.swagger() as object) }, null, 2) + '\n';
  } finally {
    await app.close();
  }
}
