import { expect, screenshotBoth, test, VIEWPORTS } from './fixtures';

test('an operator on a phone sees their next session, their runs, cab and train, and answers', async ({ page, signInAs }) => {
  await page.setViewportSize(VIEWPORTS.phone);
  await signInAs('operator');
  await page.getByRole('link', { name: 'My runs' }).click();
  await expect(page.getByRole('heading', { name: 'My runs', level: 1 })).toBeVisible();
  const next = page.getByTestId('my-session').first();
  await expect(next).toContainText('Next session');
  await expect(next).toContainText('December running evening');
  // Juno drives the stopper four times on cab 1 and once on cab 3 (demo seed).
  const runs = next.getByTestId('my-run');
  await expect(runs).toHaveCount(5);
  await expect(runs.first().getByTestId('my-run-train')).toHaveText('Wrenhollow stopper');
  await expect(runs.first().getByTestId('my-run-cab')).toHaveText('Cab 1');
  await expect(runs.first().getByTestId('my-run-fast')).toContainText('06:20');
  await expect(runs.first()).toContainText('After me on Cab 1');
  // No horizontal scrolling on a phone.
  expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(VIEWPORTS.phone.width);

  const maybe = next.getByTestId('my-reply').getByRole('button', { name: 'Maybe' });
  await maybe.click();
  await expect(maybe).toHaveAttribute('aria-pressed', 'true');
  await expect(page.getByTestId('feed-url')).toHaveValue(/\/api\/calendar\/[A-Za-z0-9_-]{16,}$/);
  await screenshotBoth(page, 'my-runs-operator');

  await next.getByRole('link', { name: 'Crew card (print)' }).click();
  await expect(page.getByTestId('crew-card-run')).toHaveCount(5);
  await screenshotBoth(page, 'my-runs-crew-card');
});

test('the calendar feed URL answers without signing in, and a reset stops it', async ({ page, signInAs, request }) => {
  await signInAs('operator');
  await page.goto('/my-runs');
  const url = await page.getByTestId('feed-url').inputValue();
  const before = await request.get(url);
  expect(before.status()).toBe(200);
  expect(before.headers()['content-type']).toBe('text/calendar; charset=utf-8');
  expect(await before.text()).toContain('SUMMARY:December running evening');
  await page.getByRole('button', { name: 'Reset address' }).click();
  await expect(page.getByText('New feed address made.')).toBeVisible();
  expect((await request.get(url)).status()).toBe(404);
  const fresh = await page.getByTestId('feed-url').inputValue();
  expect(fresh).not.toBe(url);
  expect((await request.get(fresh)).status()).toBe(200);
});
