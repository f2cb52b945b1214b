// Vitest as Stryker runs it (npm run test:mutation): the unit and integration projects without the
// tests that start child processes. Those children load the source from disk, not Stryker's
// mutated copy in memory, so they can kill no mutant and only cost time on a 2-core machine.
import { defineConfig, mergeConfig } from 'vitest/config';
import base from './vitest.config.mts';

const childProcessTests = ['tests/integration/crash-and-concurrency.test.ts', 'tests/integration/backup.test.ts'];

export default mergeConfig(base, defineConfig({ test: { exclude: ['**/node_modules/**', ...childProcessTests] } }));
