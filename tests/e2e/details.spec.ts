import { DEMO_RAILWAY, VIEWPORTS, expect, screenshotBoth, test } from './fixtures';
import { TimetablePage } from './pages/timetable-page';

const SESSION = 'December running evening';

test('the crew card fits a phone, says stand times are real, and tells a host without runs so', async ({ page, signInAs, railwayPage }) => {
  await page.setViewportSize(VIEWPORTS.phone);
  await signInAs('operator');
  await page.goto('/my-runs');
  await page.getByTestId('my-session').first().getByRole('link', { name: 'Crew card (print)' }).click();
  const list = page.getByTestId('crew-card-list');
  await expect(list).toBeVisible();
  const first = list.getByRole('listitem').first();
  await expect(first).toContainText('Route:');
  await expect(first).toContainText(/Stand: \d+ (min|s)( \d+ s)? real before/);
  await expect(first).toContainText('Cab before / after:');
  expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(VIEWPORTS.phone.width);
  const cardUrl = page.url();
  await screenshotBoth(page, 'crew-card');

  // The host has no runs in the demo session: the same link explains instead of "not found".
  await page.context().clearCookies();
  await signInAs('host');
  await page.goto(cardUrl);
  await expect(page.getByTestId('no-runs')).toContainText('You have no runs in this session');

  // The railway's tabs all read whole on a phone (they wrap instead of scrolling out of view).
  await railwayPage.openFromList(DEMO_RAILWAY);
  const mail = railwayPage.tab('Mail outbox');
  await expect(mail).toBeInViewport({ ratio: 1 });
  await expect(mail).toHaveText('Mail outbox');
});

test('issue 13 point 13: an operator’s builder page on a phone starts with their timetable, not the planner’s counts and files', async ({ page, signInAs, railwayPage }) => {
  await page.setViewportSize(VIEWPORTS.phone);
  await signInAs('operator');
  await railwayPage.openFromList(DEMO_RAILWAY);
  await new TimetablePage(page).openFromSessions(page.url(), SESSION);
  await expect(page.getByRole('link', { name: 'Plan (JSON)' })).toHaveCount(0);
  await expect(page.getByTestId('publish-panel')).toHaveCount(0);
  // The views come first; the findings wait folded in the sheet at the bottom.
  await expect(page.getByRole('tab', { name: 'Train graph' })).toBeInViewport();
  await expect(page.getByTestId('findings-sheet-toggle')).toHaveAttribute('aria-expanded', 'false');
  await expect(page.getByTestId('findings-panel')).toBeHidden();
  expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(VIEWPORTS.phone.width);
  await screenshotBoth(page, 'builder-operator');
});

test('the load charts have evenly spaced ticks, the favicon is served, and cab colours are our own', async ({ page, signInAs, railwayPage, request }) => {
  const icon = await request.get('/icon.svg');
  expect(icon.status()).toBe(200);
  expect(icon.headers()['content-type']).toContain('image/svg+xml');
  await signInAs('planner');
  await expect(page.locator('link[rel="icon"]')).toHaveAttribute('href', /icon\.svg/);
  await railwayPage.openFromList(DEMO_RAILWAY);
  const timetable = new TimetablePage(page);
  await timetable.openFromSessions(page.url(), SESSION);
  // Cab 1 is drawn in verdigris, the first of Fishplate's cab colours.
  await expect(page.getByRole('list', { name: 'Colours' }).getByRole('listitem').first().locator('span').first()).toHaveCSS('background-color', 'rgb(29, 111, 99)');
  await timetable.showView('Load');
  const charts = page.locator('[data-ticks]');
  for (const size of Object.values(VIEWPORTS)) {
    await page.setViewportSize(size);
    await expect(charts.first()).toBeVisible();
    for (const ticks of await charts.evaluateAll((els) => els.map((el) => el.getAttribute('data-ticks')!.split(' ').map(Number)))) {
      const steps = ticks.slice(1).map((t, i) => Math.round((t - ticks[i]!) * 1e6));
      expect(new Set(steps).size).toBe(1);
    }
  }
});
