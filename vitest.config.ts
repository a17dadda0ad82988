import { defineConfig } from 'vitest/config';

// Tests run on TypeScript source: the custom export condition maps each workspace
// package to its src/index.ts, so no build step stands between an edit and a test.
export default defineConfig({
  ssr: { resolve: { conditions: ['@platesmith/source'] } },
  resolve: { conditions: ['@platesmith/source'] },
  test: {
    include: ['packages/*/test/**/*.test.ts', 'services/*/test/**/*.test.ts', 'test/**/*.test.ts'],
    setupFiles: ['./test/setup/no-console.ts'],
    testTimeout: 60_000,
    // a server's workers start in its beforeAll: on a loaded 2-core host that takes seconds
    hookTimeout: 60_000,
  },
});
