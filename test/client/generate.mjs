// Generates the TypeScript types of the API client from docs/openapi.json (openapi-typescript):
// test/client/openapi.d.ts, not committed. `pnpm test` and `pnpm typecheck` run it first, so the
// end-to-end tests that call the service through openapi-fetch are type-checked against the
// document as it is now; a change of the contract that breaks them fails the type-check.
import { writeFileSync } from 'node:fs';
import openapiTS, { astToString } from 'openapi-typescript';

const doc = new URL('../../docs/openapi.json', import.meta.url);
const out = new URL('./openapi.d.ts', import.meta.url);
// a property with a default may be left out of a request: not required in the types (the option's default makes it so)
const ast = await openapiTS(doc, { silent: true, defaultNonNullable: false });
writeFileSync(out, '// Generated from docs/openapi.json by test/client/generate.mjs (openapi-typescript); do not edit, not committed.\n' + astToString(ast));
