import { defineConfig, devices } from '@playwright/test';

const PORT = Number(process.env.E2E_PORT ?? 3210);
const BASE_URL = `http://127.0.0.1:${PORT}`;
const DB = `data/e2e-${PORT}.db`;

export default defineConfig({
  testDir: 'tests/e2e',
  outputDir: `test-results/e2e-${PORT}`,
  fullyParallel: false,
  workers: 1,
  retries: process.env.CI ? 1 : 0,
  // Generous ceilings, not speed targets: the machine is shared and its speed varies threefold, so a
  // test waits for events and these only stop a test that is truly stuck. Speed is measured by the benchmarks.
  timeout: 240_000,
  expect: { timeout: 30_000 },
  reporter: [['list'], ['json', { outputFile: process.env.E2E_JSON ?? 'test-results/e2e-results.json' }]],
  use: {
    baseURL: BASE_URL,
    trace: 'retain-on-failure',
    launchOptions: {
      executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
      args: [
        '--headless',
        '--no-sandbox',
        '--disable-gpu',
        '--disable-quic',
        '--no-first-run',
        '--disable-background-networking',
        '--disable-component-update',
        '--disable-sync',
      ],
    },
  },
  projects: [
    { name: 'laptop', use: { ...devices['Desktop Chrome'], viewport: { width: 1366, height: 800 } } },
  ],
  webServer: {
    // A fresh database with the demo railway, then the production build (`next build` runs first).
    command: `rm -f ${DB} ${DB}-wal ${DB}-shm && npx tsx lib/cli/seed.ts && npx next start -p ${PORT}`,
    url: `${BASE_URL}/api/health`,
    timeout: 300_000,
    reuseExistingServer: false,
    stdout: 'pipe',
    env: {
      DATABASE_URL: DB,
      NEXT_DIST_DIR: process.env.NEXT_DIST_DIR ?? '.next',
      NEXTAUTH_URL: BASE_URL,
      NEXTAUTH_SECRET: 'e2e-secret-not-for-production-0123456789',
      LOCAL_SMTP_PORT: String(PORT + 1),
      FISHPLATE_DEMO: '1',
      NEXT_TELEMETRY_DISABLED: '1',
    },
  },
});
