import { execFileSync } from 'node:child_process';
import fs from 'node:fs';
import { test as base, expect, type BrowserContext, type Page } from '@playwright/test';
import { RailwayPage } from './pages/railway-page';
import { SignInPage } from './pages/sign-in-page';

export const DEMO_PASSWORD = 'demo-railway';
export const DEMO = {
  host: 'host@fishplate.example',
  planner: 'planner@fishplate.example',
  operator: 'operator@fishplate.example',
} as const;
export const DEMO_RAILWAY = 'Kestrel Vale Railway Circle';

export const VIEWPORTS = { laptop: { width: 1366, height: 800 }, phone: { width: 390, height: 844 } } as const;

/** Saves a screenshot of the page at laptop and phone sizes into tests/e2e/screenshots/. */
export async function screenshotBoth(page: Page, name: string) {
  fs.mkdirSync('tests/e2e/screenshots', { recursive: true });
  const original = page.viewportSize();
  for (const [label, size] of Object.entries(VIEWPORTS)) {
    await page.setViewportSize(size);
    await page.waitForTimeout(150);
    await page.screenshot({ path: `tests/e2e/screenshots/${name}-${label}.png`, fullPage: true });
  }
  if (original) await page.setViewportSize(original);
}

type Role = keyof typeof DEMO;
type StorageState = Awaited<ReturnType<BrowserContext['storageState']>>;

/** Signs in through the form and waits for Railways. */
async function signInThroughForm(page: Page, role: Role) {
  const signIn = new SignInPage(page);
  await signIn.goto();
  await signIn.signIn(DEMO[role], DEMO_PASSWORD);
  await expect(page).toHaveURL(/\/railways$/);
}

export const test = base.extend<
  {
    signInPage: SignInPage;
    railwayPage: RailwayPage;
    /** Signs the page in as a demo role: once per worker through the form, then from the stored session. */
    signInAs: (role: Role) => Promise<void>;
  },
  { roleSessions: Map<Role, StorageState> }
>({
  // One stored session (Playwright's storage state: the session cookie) per role per worker.
  // eslint-disable-next-line no-empty-pattern -- Playwright reads a fixture's dependencies from this pattern
  roleSessions: [async ({}, use) => use(new Map()), { scope: 'worker' }],
  signInPage: async ({ page }, use) => use(new SignInPage(page)),
  railwayPage: async ({ page }, use) => use(new RailwayPage(page)),
  signInAs: async ({ page, roleSessions }, use) => {
    await use(async (role) => {
      const stored = roleSessions.get(role);
      if (stored) {
        await page.context().addCookies(stored.cookies);
        await page.goto('/railways');
        // A test may have ended that session (sign out everywhere, a reset): then sign in afresh.
        if (new URL(page.url()).pathname === '/railways') return;
        await page.context().clearCookies();
      }
      await signInThroughForm(page, role);
      roleSessions.set(role, await page.context().storageState());
    });
  },
});

/**
 * What the local mail catcher kept for one address, read the way a developer does on the server
 * (`npm run mail:read -- ADDRESS`): sign-in and reset mail is shown to no one in the app.
 */
export function readOwnMail(address: string): string {
  return execFileSync('npx', ['tsx', '--conditions', 'react-server', 'lib/cli/mail-read.ts', address, '10'], {
    env: { ...process.env, DATABASE_URL: `data/e2e-${process.env.E2E_PORT ?? 3210}.db` },
    encoding: 'utf8',
  });
}

export { expect };
