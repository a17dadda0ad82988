import { readFileSync } from 'node:fs';
import { expect, test } from 'vitest';
import { CLAUSES_PATH, renderClauses } from './clauses.js';

// docs/clauses.md is generated from the check registry; the suite compares, it never rewrites it
test('docs/clauses.md is the registry\'s clause index (else run `pnpm docs:clauses` and commit it)', () => {
  const committed = readFileSync(CLAUSES_PATH, 'utf8');
  expect(committed === renderClauses(), 'docs/clauses.md is out of date: run `pnpm docs:clauses` and commit the result').toBe(true);
});
