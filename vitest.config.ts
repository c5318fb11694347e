import { defineConfig } from 'vitest/config';

// Unit tests (pure src/lib) run in parallel; API and browser tests share one MariaDB and one
// app server started by scripts/test.mjs, so they run one file at a time.
export default defineConfig({
  test: {
    projects: [
      { test: { name: 'unit', include: ['tests/unit/**/*.test.ts'], environment: 'node' } },
      {
        test: {
          name: 'api',
          include: ['tests/api/**/*.test.ts', 'tests/db/**/*.test.ts'],
          fileParallelism: false,
          testTimeout: 30_000,
          hookTimeout: 60_000,
        },
      },
      {
        test: {
          name: 'e2e',
          include: ['tests/e2e/**/*.test.ts'],
          fileParallelism: false,
          testTimeout: 60_000,
          hookTimeout: 60_000,
        },
      },
    ],
  },
});
