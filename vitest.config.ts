import { defineConfig } from 'vitest/config';

// API and browser tests share one MariaDB and one app server started by scripts/test.mjs (and one
// test stops the database on purpose), so files run one at a time across all projects; each of those
// files starts from the seeded snapshot (tests/helpers/isolate-file.ts), so their order cannot matter.
export default defineConfig({
  test: {
    fileParallelism: false,
    testTimeout: 30_000,
    hookTimeout: 60_000,
    projects: [
      { extends: true, test: { name: 'unit', include: ['tests/unit/**/*.test.ts'] } },
      { extends: true, test: { name: 'server', include: ['tests/server/**/*.test.ts'] } },
      {
        extends: true,
        test: { name: 'api', include: ['tests/db/**/*.test.ts', 'tests/api/**/*.test.ts'], setupFiles: ['tests/helpers/isolate-file.ts'] },
      },
      // Each fault file runs its own `npm start` (tests/faults/supervised-stack.ts) and breaks it on purpose.
      { extends: true, test: { name: 'faults', include: ['tests/faults/**/*.test.ts'], testTimeout: 90_000, hookTimeout: 360_000 } },
      {
        extends: true,
        test: { name: 'e2e', include: ['tests/e2e/**/*.test.ts'], testTimeout: 60_000, setupFiles: ['tests/helpers/isolate-file.ts'] },
      },
    ],
  },
});
