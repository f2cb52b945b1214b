import { DEMO_RAILWAY, VIEWPORTS, expect, screenshotBoth, test } from './fixtures';
import { TimetablePage } from './pages/timetable-page';

const SESSION = 'December running evening';

test('publishing a timetable with errors asks first, and cancelling asks and sits apart from Publish', async ({ page, signInAs, railwayPage }) => {
  await signInAs('planner');
  await railwayPage.openFromList(DEMO_RAILWAY);
  const railwayUrl = page.url();
  // A draft copy of the demo session carries its deliberate clashes (tests/integration/demo-seed.test.ts lists
  // them: 17 errors); the panel, the dialog and the status page must all give the same count.
  await new TimetablePage(page).duplicateFromSessions(railwayUrl, SESSION, '2031-02-14');

  // The builder shows the draft's status and Publish where the findings are.
  const panel = page.getByTestId('publish-panel');
  await expect(panel).toBeVisible();
  const summary = panel.getByTestId('check-summary');
  await expect(summary).toHaveText(/The checker finds \d+ errors and \d+ warnings?\./);
  const errors = Number(/(\d+) errors/.exec((await summary.textContent()) ?? '')?.[1]);
  expect(errors).toBe(17);
  await screenshotBoth(page, 'publish-panel');
  const publish = panel.getByRole('button', { name: 'Publish…' });
  // On a phone the panel comes first, above the views: Publish and the count are in sight without scrolling.
  await page.setViewportSize(VIEWPORTS.phone);
  await page.evaluate(() => window.scrollTo(0, 0));
  await expect(publish).toBeInViewport();
  await expect(summary).toBeInViewport();
  await page.setViewportSize(VIEWPORTS.laptop);
  await publish.click();
  const dialog = page.getByRole('alertdialog');
  await expect(dialog).toContainText(`Publish with ${errors} errors?`);
  // The safe choice has the focus; Escape closes the dialog and gives the focus back (WAI-ARIA APG, alert dialog pattern).
  await expect(dialog.getByRole('button', { name: 'Not yet' })).toBeFocused();
  await screenshotBoth(page, 'publish-confirm');
  await page.keyboard.press('Escape');
  await expect(dialog).toBeHidden();
  await expect(publish).toBeFocused();
  await expect(page.getByTestId('session-title')).toContainText('draft');

  await publish.click();
  await page.getByRole('alertdialog').getByRole('button', { name: `Publish with ${errors} errors` }).click();
  await expect(page.getByTestId('session-title')).toContainText('published');
  await expect(page.getByTestId('publish-panel')).toBeHidden();

  // Settings: the status panel counts the findings; Cancel session asks and is not next to Publish.
  await page.getByRole('link', { name: 'Settings and status' }).click();
  const status = page.getByTestId('status-form');
  await expect(page.getByTestId('check-summary')).toHaveText(new RegExp(`\\b${errors} errors`));
  const cancel = status.getByRole('button', { name: 'Cancel session…' });
  await cancel.click();
  const confirm = page.getByRole('alertdialog');
  await expect(confirm).toContainText(`Cancel ${SESSION}?`);
  await expect(confirm.getByRole('button', { name: 'Keep the session' })).toBeFocused();
  await screenshotBoth(page, 'cancel-confirm');
  await confirm.getByRole('button', { name: 'Keep the session' }).click();
  await expect(confirm).toBeHidden();
  await expect(cancel).toBeFocused();
  await cancel.click();
  await page.getByRole('alertdialog').getByRole('button', { name: 'Cancel the session' }).click();
  await expect(status.getByRole('button', { name: 'Reopen as draft' })).toBeVisible();
  await screenshotBoth(page, 'session-status');
});
