import { DEMO_RAILWAY, VIEWPORTS, expect, screenshotBoth, test } from './fixtures';
import { TimetablePage } from './pages/timetable-page';

const SESSION = 'December running evening';

test.describe('a new railway', () => {
  // The browser's zone, as a visitor in New Zealand would have it (IANA tz database name).
  test.use({ timezoneId: 'Pacific/Auckland' });

  test('starts in the browser’s time zone and shows the next step', async ({ page, signInAs }) => {
    await signInAs('planner');
    await expect(page.getByLabel('Time zone')).toHaveValue('Pacific/Auckland');
    await page.getByLabel('Railway name').fill('Tin Shed Circle');
    await page.getByRole('button', { name: 'Create railway' }).click();
    await expect(page.getByTestId('railway-name')).toHaveText('Tin Shed Circle');
    await expect(page.getByText('Host · Pacific/Auckland')).toBeVisible();
    const next = page.getByTestId('next-step');
    await expect(next).toHaveText('Next: Add a layout: its name and scale');
    await page.setViewportSize(VIEWPORTS.phone);
    await expect(next).toBeInViewport();
    await page.setViewportSize(VIEWPORTS.laptop);
    await screenshotBoth(page, 'overview-new-railway');
    await next.click();
    await expect(page).toHaveURL(/\/layouts$/);
    await expect(page.getByRole('heading', { level: 1, name: 'Layouts' })).toBeAttached();
  });
});

test('every railway page has one main landmark and its own h1', async ({ page, signInAs, railwayPage }) => {
  await signInAs('host');
  await railwayPage.openFromList(DEMO_RAILWAY);
  const railwayUrl = page.url();
  const headings: string[] = [];
  for (const path of ['', '/sessions', '/layouts', '/members', '/mail']) {
    await page.goto(`${railwayUrl}${path}`);
    await expect(page.getByRole('main')).toHaveCount(1);
    const h1 = page.getByRole('heading', { level: 1 });
    await expect(h1).toHaveCount(1);
    headings.push((await h1.textContent())!.trim());
  }
  await page.goto(`${railwayUrl}/sessions`);
  await page.getByRole('link', { name: SESSION }).first().click();
  await expect(page.getByRole('heading', { level: 1 })).toContainText(SESSION);
  expect(new Set(headings).size).toBe(headings.length);
  expect(headings).not.toContain(DEMO_RAILWAY);
});

test('Needs attention names each session by title and date, links to it, and leaves cancelled sessions out', async ({ page, signInAs, railwayPage }) => {
  await signInAs('planner');
  await railwayPage.openFromList(DEMO_RAILWAY);
  const railwayUrl = page.url();
  // A second session with the same title: a draft copy on another date.
  await new TimetablePage(page).duplicateFromSessions(railwayUrl, SESSION, '2031-03-08');
  const copyUrl = page.url();

  await page.goto(railwayUrl);
  const items = page.getByTestId('attention').getByRole('listitem');
  const texts = await items.allTextContents();
  expect(texts.length).toBeGreaterThanOrEqual(3);
  expect(new Set(texts).size).toBe(texts.length);
  await expect(items.filter({ hasText: /Sat,? 8 Mar 2031/ }).first()).toBeVisible();
  for (const item of await items.all()) await expect(item.getByRole('link')).toHaveCount(1);
  // On a phone the items read whole: the list fits the width and its links are there to tap.
  await page.setViewportSize(VIEWPORTS.phone);
  await expect(items.first().getByRole('link')).toBeVisible();
  expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(VIEWPORTS.phone.width);
  await page.setViewportSize(VIEWPORTS.laptop);
  await screenshotBoth(page, 'overview-attention');
  // Other tests leave drafts of their own; the copy is the draft of this date.
  await items.filter({ hasText: 'still a draft' }).filter({ hasText: /Sat,? 8 Mar 2031/ }).getByRole('link').click();
  await expect(page).toHaveURL(copyUrl);

  // Cancelled: gone from Upcoming and from Needs attention on the overview, listed apart on Sessions.
  await page.getByRole('link', { name: 'Settings and status' }).click();
  await page.getByRole('button', { name: 'Cancel session…' }).click();
  await page.getByRole('alertdialog').getByRole('button', { name: 'Cancel the session' }).click();
  await expect(page.getByTestId('status-form').getByRole('button', { name: 'Reopen as draft' })).toBeVisible();
  await page.goto(railwayUrl);
  await expect(page.getByTestId('attention')).not.toContainText('8 Mar 2031');
  // Other tests leave sessions of their own in the shared database: the cancelled copy is gone from Upcoming,
  // and the demo session is there once.
  await expect(page.getByTestId('upcoming-sessions')).not.toContainText('8 Mar 2031');
  await expect(page.getByTestId('upcoming-sessions').getByRole('listitem').filter({ hasText: SESSION })).toHaveCount(1);
  await page.goto(`${railwayUrl}/sessions`);
  await expect(page.getByRole('heading', { name: 'Cancelled' })).toBeVisible();
});
