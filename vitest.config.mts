import { fileURLToPath } from 'node:url';
import { defineConfig, type TestProjectInlineConfiguration } from 'vitest/config';

// Stryker's coverage run instruments every line; the property tests then outlast Vitest's 5 s default.
// Stryker times each mutant out itself (stryker.config.mjs).
const underStryker = process.env.STRYKER_MUTATOR_WORKER !== undefined;

// Under Stryker (npm run test:mutation, which sets STRYKER_MUTATOR_WORKER in its test runners) the
// tests that start child processes are left out: the children load the source from disk, not the
// mutated copy in memory, so they can kill no mutant and only cost time on a 2-core machine.
const childProcessTests = !underStryker ? [] : ['tests/integration/crash-and-concurrency.test.ts', 'tests/integration/backup.test.ts'];

// Pure folders (lib/planning, lib/validations, …; the list is in lib/cli/mutation.mjs) are tested by the
// unit project; their mutation runs (FISHPLATE_MUTATION_UNIT_ONLY=1) leave the integration project out,
// which reaches them only through the app. The engine's run also leaves out the control tests, whose
// random plans take long and test lib/control.
const unitOnly = process.env.FISHPLATE_MUTATION_UNIT_ONLY === '1';
const engineRun = process.env.FISHPLATE_MUTATION_FOLDER === 'planning';
// --property-runs <fraction> (lib/cli/mutation.mjs): every property test runs that fraction of its cases.
const fewerPropertyRuns = underStryker && process.env.FISHPLATE_MUTATION_PROPERTY_RUNS !== undefined;

const unit: TestProjectInlineConfiguration = {
  extends: true,
  test: {
    name: 'unit',
    include: ['tests/unit/**/*.test.ts'],
    exclude: ['**/node_modules/**', ...(engineRun ? ['tests/unit/control/**'] : [])],
    environment: 'node',
    ...(underStryker ? { testTimeout: 120_000, setupFiles: ['tests/shared/mutation-setup.ts'] } : {}),
  },
};

const integration: TestProjectInlineConfiguration = {
  extends: true,
  test: {
    name: 'integration',
    include: ['tests/integration/**/*.test.ts'],
    exclude: ['**/node_modules/**', ...childProcessTests],
    environment: 'node',
    setupFiles: ['tests/integration/setup.ts', ...(underStryker ? ['tests/shared/mutation-setup.ts'] : [])],
    pool: 'forks',
    fileParallelism: false,
    testTimeout: 30_000,
    hookTimeout: 60_000,
  },
};

export default defineConfig({
  resolve: {
    tsconfigPaths: true,
    alias: [
      { find: 'server-only', replacement: fileURLToPath(new URL('./tests/stubs/empty.ts', import.meta.url)) },
      ...(fewerPropertyRuns ? [{ find: /^fast-check$/, replacement: fileURLToPath(new URL('./tests/shared/fast-check-fewer-runs.ts', import.meta.url)) }] : []),
    ],
  },
  test: {
    projects: unitOnly ? [unit] : [unit, integration],
  },
});
