// The project's one test command (README, CI): generate the API client's types, type-check, run every vitest test, then print
// the plain closing line "N passed, N failed" counted from vitest's JSON report, with test
// files that failed to load counted as failures (vitest's own summary does not count them).
import { spawnSync } from 'node:child_process';
import { existsSync, mkdirSync, readFileSync, rmSync } from 'node:fs';

const env = { ...process.env, NO_COLOR: '1', FORCE_COLOR: '0' };
const extra = process.argv.slice(2);

// the API client's types, generated from docs/openapi.json, so the type-check sees the contract as it is now
const client = spawnSync(process.execPath, ['test/client/generate.mjs'], { stdio: 'inherit', env });
if (client.status !== 0) console.log('client types: generation failed');
const tsc = spawnSync('pnpm', ['exec', 'tsc', '-p', 'tsconfig.json', '--noEmit'], { stdio: 'inherit', env });
if (tsc.status !== 0) console.log('type-check: failed');

mkdirSync('reports', { recursive: true });
rmSync('reports/vitest.json', { force: true });
const run = spawnSync(
  'pnpm',
  ['exec', 'vitest', 'run', '--reporter=default', '--reporter=json', '--outputFile.json=reports/vitest.json', '--reporter=junit', '--outputFile.junit=reports/junit.xml', ...extra],
  { stdio: 'inherit', env },
);

let passed = 0;
let failed = 0;
let skipped = 0;
if (existsSync('reports/vitest.json')) {
  const r = JSON.parse(readFileSync('reports/vitest.json', 'utf8'));
  const brokenFiles = r.testResults.filter((f) => f.status === 'failed' && f.assertionResults.length === 0).length;
  passed = r.numPassedTests;
  failed = r.numFailedTests + brokenFiles;
  skipped = r.numPendingTests + r.numTodoTests;
} else {
  failed = 1;
}
if (tsc.status !== 0) failed += 1;
if (client.status !== 0) failed += 1;
console.log(`${passed} passed, ${failed} failed, ${skipped} skipped`);
process.exit(run.status === 0 && tsc.status === 0 && client.status === 0 && failed === 0 ? 0 : 1);
