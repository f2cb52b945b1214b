import { DEMO_RAILWAY, expect, screenshotBoth, test, VIEWPORTS } from './fixtures';
import { TimetablePage } from './pages/timetable-page';

const SESSION = 'December running evening';
const TIMING_KINDS = ['block-overlap', 'cab-double-booked', 'operator-double-booked', 'train-double-booked'];

test.describe.configure({ mode: 'serial' });

/**
 * The view panel alone at both sizes, to look at the drawing itself. A clip of a page screenshot rather
 * than an element screenshot: the element form waits for two identical animation frames, which a busy
 * machine may not deliver within the test's time.
 */
async function screenshotView(page: import('@playwright/test').Page, name: string) {
  for (const [label, size] of [['phone', VIEWPORTS.phone], ['laptop', VIEWPORTS.laptop]] as const) {
    await page.setViewportSize(size);
    const view = page.locator('section[aria-label="View"]');
    const box = await view.evaluate((el) => {
      const r = el.getBoundingClientRect();
      return { x: r.left + window.scrollX, y: r.top + window.scrollY, width: r.width, height: r.height };
    });
    if (box.width > 0 && box.height > 0) await page.screenshot({ path: `tests/e2e/screenshots/${name}-view-${label}.png`, clip: box, fullPage: true, animations: 'disabled' });
  }
}

test('a planner sees the seeded clashes, repairs timing, and brings a clash back by moving a run', async ({ page, signInAs, railwayPage }) => {
  await signInAs('planner');
  await railwayPage.openFromList(DEMO_RAILWAY);
  const railwayUrl = page.url();
  const timetable = new TimetablePage(page);
  await timetable.openFromSessions(railwayUrl, SESSION);

  // The three deliberate clashes of the demo session: the goods meets the express below the loop,
  // the railcar shuttle on cab 3 while the goods still holds it, and the stone train overloading cab 1.
  await expect(timetable.finding('block-overlap').first()).toBeVisible();
  await expect(timetable.finding('block-overlap').filter({ hasText: 'Pick-up goods' }).filter({ hasText: 'Fernwick express' }).first()).toBeVisible();
  await expect(timetable.finding('cab-double-booked')).toContainText('Cab 3 is booked for Pick-up goods (06:56 departure) and Railcar shuttle (06:57 departure)');
  await expect(timetable.finding('channel-overload').first()).toContainText('Cab 1 draws up to 1.05 A');
  // Each finding gives its time on the fast and on the real clock.
  await expect(timetable.finding('cab-double-booked')).toContainText(/06:5\d.* fast · \d\d:\d\d.* real/);
  // The same clashes are on the train graph: boxes where the goods and the express meet, and the
  // runs involved marked.
  await expect(timetable.graphClashes.first()).toBeAttached();
  expect(await timetable.graphClashes.count()).toBeGreaterThanOrEqual(3);
  expect(await timetable.clashingGraphRuns.count()).toBeGreaterThanOrEqual(4);
  await screenshotBoth(page, 'timetable-graph');
  await screenshotView(page, 'timetable-graph');

  // Choosing a finding marks its runs on the graph.
  await timetable.finding('cab-double-booked').click();
  await expect(timetable.selectedGraphRuns).toHaveCount(2);
  await expect(page.locator('[data-testid="run-row"].bg-brass-soft')).toHaveCount(2);
  await timetable.finding('cab-double-booked').click();

  await timetable.showView('Calendar');
  await expect(page.getByTestId('calendar-view').locator('.fc-event').first()).toBeVisible();
  expect(await page.locator('.fc-event.fp-clash').count()).toBeGreaterThanOrEqual(4);
  await screenshotBoth(page, 'timetable-calendar');
  await screenshotView(page, 'timetable-calendar');

  await timetable.showView('Load');
  await expect(page.locator('[data-testid="load-chart"][data-overloaded="true"]').first()).toBeVisible();
  // Below the main line board's currents, the heat in its bridge against the package rating, marked
  // where the demo's driver-heat warnings are (the stone train, and the express at the greatest drop).
  const boardHeat = page.locator('[data-testid="load-chart"]').filter({ hasText: 'Main line board' }).getByTestId('heat-chart');
  await expect(boardHeat).toBeVisible();
  await expect(boardHeat).toContainText(/Heat in the bridge: up to [\d.]+ W–[\d.]+ W · package rating [\d.]+ W/);
  await screenshotBoth(page, 'timetable-load');
  await screenshotView(page, 'timetable-load');

  await timetable.showView('Print');
  await expect(page.getByTestId('print-row')).toHaveCount(20);
  await screenshotBoth(page, 'timetable-print');
  await screenshotView(page, 'timetable-print');
  await timetable.showView('Train graph');

  // Repair timing: a diff of old and new departures, applied on confirm.
  const dialog = await timetable.repairTiming();
  await expect(dialog.getByTestId('retime-move').filter({ hasText: 'Pick-up goods' })).toBeVisible();
  await expect(dialog.getByTestId('retime-move').filter({ hasText: 'Railcar shuttle' })).toBeVisible();
  await screenshotBoth(page, 'timetable-repair');
  await dialog.getByTestId('apply-retime').click();
  await expect(dialog).toBeHidden();
  for (const kind of TIMING_KINDS) await expect(timetable.finding(kind)).toHaveCount(0);
  // Block clashes leave the graph (the demo has no train standing where another passes, which a retime would not clear).
  await expect(timetable.graphClashes.and(page.locator('[data-kind="block-overlap"]'))).toHaveCount(0);
  await expect(page.getByTestId('undo-bar')).toContainText('Repaired timing (2 runs moved)');
  // Power overloads are not a timing matter and stay.
  await expect(timetable.finding('channel-overload').first()).toBeVisible();
  await screenshotBoth(page, 'timetable-repaired');
  await screenshotView(page, 'timetable-repaired');
  await page.getByTestId('findings-panel').screenshot({ path: 'tests/e2e/screenshots/timetable-repaired-findings-laptop.png' });

  // Undo puts the clashes back; redo the repair.
  await page.getByTestId('undo').click();
  await expect(timetable.finding('cab-double-booked')).toHaveCount(1);
  await (await timetable.repairTiming()).getByTestId('apply-retime').click();
  await expect(timetable.finding('block-overlap')).toHaveCount(0);

  // Move the goods back onto the express's blocks: the clash comes back, on the panel and the graph.
  const goods = timetable.runRow('Mossgate loop, passing road → Fernwick platform 2');
  await expect(goods).toHaveCount(1);
  const started = Date.now();
  await timetable.setDeparture(goods, '08:08');
  await expect(timetable.finding('block-overlap').first()).toBeVisible();
  const editMs = Date.now() - started;
  await expect(timetable.graphClashes.and(page.locator('[data-kind="block-overlap"]')).first()).toBeAttached();
  await expect(goods).toHaveAttribute('data-clash', 'true');
  test.info().annotations.push({ type: 'edit-to-findings-ms (demo, 20 runs)', description: String(editMs) });
});

test('an operator sees the published timetable read-only', async ({ page, signInAs, railwayPage }) => {
  await signInAs('operator');
  await railwayPage.openFromList(DEMO_RAILWAY);
  const timetable = new TimetablePage(page);
  await timetable.openFromSessions(page.url(), SESSION);
  await expect(timetable.finding('channel-overload').first()).toBeVisible();
  await expect(page.getByTestId('run-depart')).toHaveCount(0);
  await expect(page.getByTestId('repair-timing')).toHaveCount(0);
  await expect(page.getByRole('heading', { name: 'Add a run' })).toHaveCount(0);
  await screenshotBoth(page, 'timetable-operator');
});

test('a planner creates a session and builds runs from an empty timetable', async ({ page, signInAs, railwayPage }) => {
  await signInAs('planner');
  await railwayPage.openFromList(DEMO_RAILWAY);
  await railwayPage.openTab('Sessions');
  await screenshotBoth(page, 'timetable-sessions');
  const form = page.getByTestId('session-form');
  // Other specs may have added layouts to the demo railway: name the one this test builds on.
  await form.getByLabel('Layout').selectOption({ label: 'Kestrel Vale branch (H0)' });
  await form.getByLabel('Title').fill('Spring timetable trial');
  await form.getByLabel('Date').fill('2031-04-12');
  await form.getByRole('button', { name: 'Create and open the builder' }).click();
  await expect(page.getByTestId('session-title')).toContainText('Spring timetable trial');
  await expect(page.getByTestId('no-runs')).toBeVisible();

  const runForm = page.getByTestId('run-form');
  await runForm.getByLabel('Train').selectOption({ label: 'Wrenhollow stopper' });
  await runForm.getByLabel('Departs (fast clock)').fill('06:20');
  await runForm.getByRole('button', { name: 'Larkholm yard road 1' }).click();
  await runForm.getByRole('button', { name: 'Fernwick platform 1' }).click();
  await expect(page.getByTestId('route-preview')).toContainText('Larkholm yard road 1 → Larkholm yard lead → Wrenhollow east');
  await runForm.getByRole('button', { name: 'Add run' }).click();
  await expect(page.getByTestId('run-row')).toHaveCount(1);
  // One run clashes with nothing. On the quad half-H class the least and greatest drops differ by 1 V
  // (SLRS007B: 2.6 V typical, 3.6 V worst at 1 A), so a voltage warning may stand; no error does.
  await expect(page.getByTestId('findings-panel')).toBeVisible();
  await expect(page.locator('[data-testid="finding"][data-severity="error"]')).toHaveCount(0);

  // A series every 40 fast minutes, then a second train against it on the same cab: a clash.
  const row = page.getByTestId('run-row').first();
  await row.getByRole('button', { name: 'Series' }).click();
  await page.getByTestId('series-form').getByRole('button', { name: 'Make series' }).click();
  await expect(page.getByTestId('run-row')).toHaveCount(4);
  await runForm.getByLabel('Train').selectOption({ label: 'Pick-up goods' });
  await runForm.getByLabel('Departs (fast clock)').fill('06:22');
  await runForm.getByRole('button', { name: 'Fernwick platform 2' }).click();
  await runForm.getByRole('button', { name: 'Larkholm yard road 2' }).click();
  await runForm.getByRole('button', { name: 'Add run' }).click();
  await expect(page.getByTestId('run-row')).toHaveCount(5);
  await expect(page.locator('[data-testid="finding"][data-kind="cab-double-booked"]')).toHaveCount(1);
  // Several block clashes make a group folded to its heading and count.
  await expect(page.locator('[data-testid="finding-group"][data-kind="block-overlap"]')).toBeVisible();
  await expect(page.locator('[data-testid="finding"][data-kind="block-overlap"]').first()).toBeAttached();

  // Delete with undo.
  const goods = page.getByTestId('run-row').filter({ hasText: 'Pick-up goods' });
  await goods.getByRole('button', { name: /Delete/ }).click();
  await expect(page.getByTestId('run-row')).toHaveCount(4);
  await expect(page.locator('[data-testid="finding"][data-kind="cab-double-booked"]')).toHaveCount(0);
  await page.getByTestId('undo').click();
  await expect(page.getByTestId('run-row')).toHaveCount(5);
  await screenshotBoth(page, 'timetable-new-session');
});
