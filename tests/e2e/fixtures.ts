import { execFileSync } from 'node:child_process';
import fs from 'node:fs';
import { test as base, expect, type Page } from '@playwright/test';
import { RailwayPage } from './pages/railway-page';
import { SignInPage } from './pages/sign-in-page';

export const DEMO_PASSWORD = 'demo-railway';
export const DEMO = {
  host: 'host@fishplate.example',
  planner: 'planner@fishplate.example',
  operator: 'operator@fishplate.example',
} as const;
export const DEMO_RAILWAY = 'Kestrel Vale Railway Circle';

export const VIEWPORTS = { laptop: { width: 1280, height: 800 }, phone: { width: 390, height: 844 } } as const;

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

export const test = base.extend<{
  signInPage: SignInPage;
  railwayPage: RailwayPage;
  signInAs: (role: keyof typeof DEMO) => Promise<void>;
}>({
  signInPage: async ({ page }, use) => use(new SignInPage(page)),
  railwayPage: async ({ page }, use) => use(new RailwayPage(page)),
  signInAs: async ({ page }, use) => {
    await use(async (role) => {
      const signIn = new SignInPage(page);
      await signIn.goto();
      await signIn.signIn(DEMO[role], DEMO_PASSWORD);
      await expect(page).toHaveURL(/\/railways$/);
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
