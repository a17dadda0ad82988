/**
 * Regression (issue 21): `cost.gradeFactor` was an exhaustive record, so a cost model naming one
 * grade's rate was rejected unless all five were given, and the OpenAPI document listed the
 * grades as required property names. The grades not given keep the default factors.
 */
import { expect, test } from 'vitest';
import { DEFAULT_COST } from '@platesmith/search';
import { parseWith, SearchInput, toCost } from '@platesmith/schema';

const PROBLEM = {
  spans: [12000],
  actions: [{ kind: 'permanent', load: 'udl', value: 10 }],
  objective: 'cost',
};

test('a cost model with the factor of one grade is accepted; the others keep their defaults', () => {
  const r = parseWith(SearchInput, { ...PROBLEM, cost: { gradeFactor: { S355: 1.05 } } });
  expect(r.ok).toBe(true);
  if (!r.ok) return;
  expect(toCost(r.value.cost).gradeFactor).toEqual({ ...DEFAULT_COST.gradeFactor, S355: 1.05 });
});

test('an unknown grade in gradeFactor is still rejected, naming the field', () => {
  const r = parseWith(SearchInput, { ...PROBLEM, cost: { gradeFactor: { S999: 1 } } });
  expect(r.ok).toBe(false);
  if (r.ok) return;
  // the issue names the field: cost.gradeFactor itself, or the offending key under it (cost.gradeFactor.S999)
  expect(r.issues.map((i) => i.path)).toContainEqual(expect.stringMatching(/^cost\.gradeFactor(\.|$)/));
});
