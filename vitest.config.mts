import { fileURLToPath } from 'node:url';
import { defineConfig } from 'vitest/config';

// Under Stryker (npm run test:mutation, which sets STRYKER_MUTATOR_WORKER in its test runners) the
// tests that start child processes are left out: the children load the source from disk, not the
// mutated copy in memory, so they can kill no mutant and only cost time on a 2-core machine.
const childProcessTests = process.env.STRYKER_MUTATOR_WORKER === undefined ? [] : ['tests/integration/crash-and-concurrency.test.ts', 'tests/integration/backup.test.ts'];

export default defineConfig({
  resolve: {
    tsconfigPaths: true,
    alias: { 'server-only': fileURLToPath(new URL('./tests/stubs/empty.ts', import.meta.url)) },
  },
  test: {
    projects: [
      {
        extends: true,
        test: { name: 'unit', include: ['tests/unit/**/*.test.ts'], environment: 'node' },
      },
      {
        extends: true,
        test: {
          name: 'integration',
          include: ['tests/integration/**/*.test.ts'],
          exclude: ['**/node_modules/**', ...childProcessTests],
          environment: 'node',
          setupFiles: ['tests/integration/setup.ts'],
          pool: 'forks',
          fileParallelism: false,
          testTimeout: 30_000,
          hookTimeout: 60_000,
        },
      },
    ],
  },
});
