import type { Page } from '@playwright/test';
import { DEMO_RAILWAY, VIEWPORTS, expect, screenshotBoth, test } from './fixtures';
import { TimetablePage } from './pages/timetable-page';

const SESSION = 'December running evening';

/** The page itself never scrolls sideways; a wide drawing scrolls inside its own region. */
async function expectNoPageOverflow(page: Page) {
  const width = page.viewportSize()!.width;
  expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(width);
}

test('the garden layout’s overview draws every block and link and marks its reversing loop, at laptop and phone widths', async ({ page, signInAs, railwayPage }) => {
  await signInAs('planner');
  await railwayPage.openFromList(DEMO_RAILWAY);
  await railwayPage.openTab('Layouts');
  await page.getByTestId('layout-list').getByRole('link', { name: /Quillon garden line/ }).click();
  await expect(page.getByTestId('layout-name')).toHaveText('Quillon garden line (IIm)');

  const diagram = page.getByTestId('track-diagram');
  // The demo's garden line (lib/demo/demo-railway.ts): six blocks and six rail joints, two of them the
  // balloon loop's ends meeting the orchard loop's far end.
  const blocks = diagram.getByTestId('diagram-block');
  await expect(blocks).toHaveCount(6);
  await expect(diagram.getByTestId('diagram-link')).toHaveCount(6);
  for (const name of ['Quillon halt', 'Bramble cutting', 'Pond viaduct', 'Orchard loop', 'Shed siding', 'Orchard balloon']) {
    await expect(blocks.filter({ hasText: name })).toHaveCount(1);
  }
  // The balloon turns trains round: it is the one reversing section, drawn hatched, and a link turns back onto the line.
  const reversing = diagram.locator('[data-testid="diagram-block"][data-reversing-section="true"]');
  await expect(reversing).toHaveCount(1);
  await expect(reversing).toContainText('Orchard balloon');
  expect(await diagram.locator('[data-testid="diagram-link"][data-shape="loop"]').count()).toBeGreaterThan(0);
  // The drawing's accessible name says the same in words.
  await expect(diagram.getByRole('img', { name: /^Track diagram of Quillon garden line \(IIm\) 6 blocks and 6 links; reversing section: Orchard balloon/ })).toBeVisible();

  for (const size of Object.values(VIEWPORTS)) {
    await page.setViewportSize(size);
    await expect(blocks.first()).toBeVisible();
    await expectNoPageOverflow(page);
  }
  await screenshotBoth(page, 'layout-overview-diagram');
});

test('in Add a run, picking two blocks on the diagram fills the route between them', async ({ page, signInAs, railwayPage }) => {
  await signInAs('planner');
  await railwayPage.openFromList(DEMO_RAILWAY);
  const timetable = new TimetablePage(page);
  await timetable.openFromSessions(page.url(), SESSION);
  const runForm = page.getByTestId('run-form');
  await runForm.getByLabel('Train').selectOption({ label: 'Wrenhollow stopper' });
  // The form carries on from the stopper's last run: start afresh.
  await page.getByTestId('route-preview').getByRole('button', { name: 'Clear' }).click();
  await expect(page.getByTestId('route-preview')).toHaveText(/No blocks picked yet/);

  await runForm.getByTestId('route-diagram-toggle').click();
  const diagram = runForm.getByTestId('track-diagram');
  await expect(diagram.getByTestId('diagram-block')).toHaveCount(13);
  await diagram.getByRole('button', { name: 'Pick Larkholm yard road 1' }).click();
  await diagram.getByRole('button', { name: 'Pick Fernwick platform 1' }).click();
  // The shortest way from the yard to the terminus (the indoor branch's blocks in line order).
  await expect(page.getByTestId('route-preview')).toContainText('Larkholm yard road 1 → Larkholm yard lead → Wrenhollow east → Mossgate approach');
  await expect(page.getByTestId('route-preview')).toContainText('Fernwick approach → Fernwick platform 1');
  // The picked blocks are numbered on the drawing and pressed, like the block buttons under it.
  await expect(diagram.getByRole('button', { name: /^Picked 1: Larkholm yard road 1/ })).toHaveAttribute('aria-pressed', 'true');
  await expect(diagram.getByRole('button', { name: /^Picked 2: Fernwick platform 1/ })).toHaveAttribute('aria-pressed', 'true');
  await expect(runForm.getByRole('button', { name: '1. Larkholm yard road 1' })).toHaveAttribute('aria-pressed', 'true');
  await diagram.scrollIntoViewIfNeeded();
  await screenshotBoth(page, 'builder-route-diagram');
});

test('the builder’s Track view shows a train in its first block at its departure time', async ({ page, signInAs, railwayPage }) => {
  await signInAs('planner');
  await railwayPage.openFromList(DEMO_RAILWAY);
  const timetable = new TimetablePage(page);
  await timetable.openFromSessions(page.url(), SESSION);
  await page.getByRole('tab', { name: 'Track' }).click();
  const view = page.getByTestId('track-view');
  await expect(view).toBeVisible();
  // The demo's first run: the stopper leaves Mossgate loop's passing road at 06:20 fast.
  const at = view.getByLabel('At (fast clock)');
  await at.fill('06:20');
  await at.press('Enter');
  await expect(view.getByRole('img', { name: /Where the trains are at 06:20 fast/ })).toBeVisible();
  const block = view.getByTestId('diagram-block').filter({ hasText: 'Mossgate loop, passing road' });
  await expect(block.locator('[data-testid="diagram-train"][data-label="Wrenhollow stopper"]')).toHaveCount(1);
  await expect(view.locator('[data-testid="train-position"][data-train="Wrenhollow stopper"]')).toContainText(/(stands|runs) in Mossgate loop, passing road/);
  // Later on the fast clock the stopper is somewhere else: the drawing follows the time.
  await at.fill('06:40');
  await at.press('Enter');
  await expect(block.locator('[data-testid="diagram-train"][data-label="Wrenhollow stopper"]')).toHaveCount(0);
  await at.fill('06:20');
  await at.press('Enter');
  for (const size of Object.values(VIEWPORTS)) {
    await page.setViewportSize(size);
    await expect(block.locator('[data-testid="diagram-train"]').first()).toBeAttached();
    await expectNoPageOverflow(page);
  }
  await screenshotBoth(page, 'builder-track');
});
