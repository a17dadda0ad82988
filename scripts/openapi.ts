// `pnpm openapi`: writes docs/openapi.json, the OpenAPI document the service serves at /openapi.json.
// `pnpm openapi --check`: exits 1 when the file is not what the service generates (the suite's
// test does the same). `pnpm openapi --examples`: first records the document's examples
// (services/api/src/openapi-examples.json) by sending the bundled demo and example files to a
// service built here, then writes the document with them.
import { spawnSync } from 'node:child_process';
import { readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';

const root = join(import.meta.dirname, '..');
const DOC = join(root, 'docs', 'openapi.json');
const EXAMPLES = join(root, 'services', 'api', 'src', 'openapi-examples.json');
const args = process.argv.slice(2);

if (args.includes('--examples')) {
  const { recordExamples } = await import('./openapi-examples.js');
  writeFileSync(EXAMPLES, JSON.stringify(await recordExamples(root), null, 2) + '\n');
  process.stdout.write(`recorded ${EXAMPLES.slice(root.length + 1)}\n`);
  // the app has the old examples imported: the document is written by a fresh process
  const r = spawnSync(process.execPath, [...process.execArgv, process.argv[1]!], { stdio: 'inherit' });
  process.exit(r.status ?? 1);
}

const { generateOpenApi } = await import('../services/api/src/index.js');
const now = await generateOpenApi();
if (args.includes('--check')) {
  const before = readFileSync(DOC, 'utf8');
  if (before !== now) {
    process.stderr.write('docs/openapi.json is not the generated document: run pnpm openapi and commit it\n');
    process.exit(1);
  }
  process.stdout.write('docs/openapi.json is up to date\n');
} else {
  writeFileSync(DOC, now);
  process.stdout.write('wrote docs/openapi.json\n');
}
