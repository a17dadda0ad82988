import { afterEach, beforeEach, vi } from 'vitest';
import fc from 'fast-check';

// Stable property-test names and replayable failures.
fc.configureGlobal({ seed: 20261201 });

// A stray console.* in library code is a defect: domain packages return values and
// warnings, they never log. Fail the test that printed.
const methods = ['log', 'info', 'warn', 'error', 'debug'] as const;
let calls: string[] = [];
beforeEach(() => {
  calls = [];
  for (const m of methods) {
    vi.spyOn(console, m).mockImplementation((...args: unknown[]) => {
      calls.push(`console.${m}: ${args.map(String).join(' ')}`);
    });
  }
});
afterEach(() => {
  vi.restoreAllMocks();
  if (calls.length > 0) throw new Error(`stray console output:\n${calls.join('\n')}`);
});
