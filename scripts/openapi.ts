// `pnpm openapi`: regenerates docs/openapi.json from the zod schemas (the test
// test/e2e/api-openapi.test.ts fails while the committed file differs from this output).
import { writeFileSync } from 'node:fs';
import { generateOpenApi } from '../services/api/src/index.js';

const file = new URL('../docs/openapi.json', import.meta.url);
writeFileSync(file, await generateOpenApi());
process.stdout.write('docs/openapi.json regenerated\n');
