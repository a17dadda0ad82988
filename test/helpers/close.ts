import { expect } from 'vitest';

/**
 * Relative-tolerance assertion for published values (vitest's toBeCloseTo is absolute decimal
 * digits, useless for 1.2e9 N·mm). `tol` is relative (0.005 = 0.5 %); the reason for it belongs
 * in the test beside the call. Uses expect.soft so one example reports every miss at once.
 */
export function expectClose(actual: number, expected: number, tol: number, what: string): void {
  const rel = expected === 0 ? Math.abs(actual) : Math.abs(actual / expected - 1);
  expect.soft(rel, `${what}: got ${actual}, published ${expected} (rel. tol ${tol})`).toBeLessThanOrEqual(tol);
}
