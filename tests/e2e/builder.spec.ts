import { DEMO_RAILWAY, expect, screenshotBoth, test, VIEWPORTS } from './fixtures';
import { TimetablePage } from './pages/timetable-page';

const SESSION = 'December running evening';

test.describe.configure({ mode: 'serial' });

/** Issue 13, items 8 and 14: the builder's findings, tabs, dialog, graph height and add-run form. */
test('the builder: grouped findings in sentence case beside a full-height graph, tabs by arrow keys, the repair dialog by keyboard', async ({ page, signInAs, railwayPage }) => {
  await signInAs('planner');
  await railwayPage.openFromList(DEMO_RAILWAY);
  const timetable = new TimetablePage(page);
  await timetable.openFromSessions(page.url(), SESSION);

  // Findings are grouped by kind with a count; a long group starts folded, a short one open.
  await expect(timetable.findingGroup('cab-double-booked')).toHaveAttribute('open');
  await expect(timetable.findingGroup('cab-double-booked').getByTestId('finding-group-count')).toHaveText('1');
  const peaks = timetable.findingGroup('channel-peak-overload');
  await expect(peaks.getByTestId('finding-group-count')).toHaveText('6');
  await expect(peaks).not.toHaveAttribute('open');
  await expect(timetable.finding('channel-peak-overload').first()).toBeHidden();
  // The demo has no train standing where another passes (its timetable keeps the whole session's occupancy).
  await expect(timetable.findingGroup('block-occupied')).toHaveCount(0);
  // Sentence case: every message starts with a capital letter.
  const firstLetters = await page.locator('[data-testid="finding"] > span:first-child').evaluateAll((els) => els.map((el) => (el.textContent ?? '').charAt(0)));
  expect(firstLetters.length).toBeGreaterThan(10);
  for (const letter of firstLetters) expect(letter).toBe(letter.toUpperCase());

  // The graph takes most of the window: at 1366 × 800 it is far taller than a strip.
  const svg = timetable.graph.locator('svg[role="img"]');
  const tall = Number(await svg.getAttribute('height'));
  expect(tall).toBeGreaterThanOrEqual(500);
  // Resized by keyboard: two steps down make it 80 px taller, Home makes it the least height.
  const handle = page.getByRole('separator', { name: 'Train graph height' });
  await handle.focus();
  await handle.press('ArrowDown');
  await handle.press('ArrowDown');
  await expect(handle).toHaveAttribute('aria-valuenow', String(tall + 80));
  await expect(svg).toHaveAttribute('height', String(tall + 80));
  await handle.press('Home');
  await expect(handle).toHaveAttribute('aria-valuenow', '240');
  await expect(svg).toHaveAttribute('height', '240');
  // The height is kept for the next visit.
  await page.reload();
  await expect(page.getByRole('separator', { name: 'Train graph height' })).toHaveAttribute('aria-valuenow', '240');
  await page.evaluate(() => window.localStorage.clear());
  await page.reload();
  await expect(svg).toHaveAttribute('height', String(tall));

  // The findings stay in sight while the planner works further down the page.
  const lastRun = timetable.runRow('Pick-up goods').last();
  await lastRun.scrollIntoViewIfNeeded();
  await expect(lastRun).toBeInViewport();
  await expect(page.getByRole('heading', { name: 'Findings' })).toBeInViewport();
  await page.screenshot({ path: 'tests/e2e/screenshots/builder-scrolled-laptop.png' });
  await page.evaluate(() => window.scrollTo(0, 0));

  // View tabs: the arrow keys move between them and choose the view.
  const graphTab = page.getByRole('tab', { name: 'Train graph' });
  await graphTab.focus();
  await graphTab.press('ArrowRight');
  const calendarTab = page.getByRole('tab', { name: 'Calendar' });
  await expect(calendarTab).toBeFocused();
  await expect(calendarTab).toHaveAttribute('aria-selected', 'true');
  await expect(page.getByTestId('calendar-view')).toBeVisible();
  await calendarTab.press('ArrowLeft');
  await expect(graphTab).toBeFocused();
  await expect(graphTab).toHaveAttribute('aria-selected', 'true');
  await expect(timetable.graph).toBeVisible();

  // The repair dialog: the focus stays inside, Escape closes it, and the focus returns to its button.
  const repair = page.getByTestId('repair-timing');
  await repair.focus();
  await repair.press('Enter');
  const dialog = page.getByRole('dialog', { name: 'Repair timing' });
  await expect(dialog).toBeVisible();
  await expect(dialog.getByTestId('retime-move').first()).toBeVisible();
  for (let i = 0; i < 6; i++) {
    await page.keyboard.press('Tab');
    expect(await dialog.evaluate((el) => el.contains(document.activeElement))).toBe(true);
  }
  await page.keyboard.press('Escape');
  await expect(dialog).toBeHidden();
  await expect(repair).toBeFocused();

  await page.evaluate(() => window.scrollTo(0, 0));
  await screenshotBoth(page, 'builder');
});

test('a long group of findings folds and lists its first 20: a draft copy where three trains run late all evening and stand where others pass', async ({ page, signInAs, railwayPage }) => {
  await signInAs('planner');
  await railwayPage.openFromList(DEMO_RAILWAY);
  const timetable = new TimetablePage(page);
  await timetable.duplicateFromSessions(page.url(), SESSION, '2031-06-07');
  const sessionId = /\/sessions\/([^/?#]+)/.exec(page.url())![1]!;
  // Every run of the express, the goods and the stone train later by 30, 20 and 40 real minutes: each
  // train keeps its own order, so it now stands in platforms, yard roads and loop roads when others come in.
  const plan = await (await page.request.get(`/api/sessions/${sessionId}/plan`)).json();
  const lateByName: Record<string, number> = { 'Fernwick express': 1800, 'Pick-up goods': 1200, 'Double-headed stone train': 2400 };
  const lateBy = new Map<string, number>(plan.trains.map((t: { id: string; name: string }) => [t.id, lateByName[t.name] ?? 0]));
  type Step = { enterS: number; exitS: number };
  const runs = plan.runs.map((r: { trainId: string; departS: number; arriveS: number; steps: Step[] }) => {
    const d = lateBy.get(r.trainId) ?? 0;
    return { ...r, departS: r.departS + d, arriveS: r.arriveS + d, steps: r.steps.map((s) => ({ ...s, enterS: s.enterS + d, exitS: s.exitS + d })) };
  });
  expect((await page.request.post(`/api/sessions/${sessionId}/plan`, { data: { ...plan, runs } })).ok()).toBe(true);
  await page.reload();
  await expect(timetable.graph).toBeVisible();

  const occupied = timetable.findingGroup('block-occupied');
  const count = Number(await occupied.getByTestId('finding-group-count').textContent());
  expect(count).toBeGreaterThan(20);
  await expect(occupied).not.toHaveAttribute('open');
  await expect(timetable.finding('block-occupied').first()).toBeHidden();
  await occupied.locator('summary').click();
  await expect(timetable.finding('block-occupied').first()).toBeVisible();
  // A long group lists its first 20 until asked for the rest.
  await expect(timetable.finding('block-occupied')).toHaveCount(20);
  await occupied.getByRole('button', { name: `Show all ${count}` }).click();
  await expect(timetable.finding('block-occupied')).toHaveCount(count);
  // A standing train is named with the run it waits for or follows, by train and departure.
  await expect(timetable.finding('block-occupied').first()).toContainText(/stands in block .+, (before|after) .+ \(\d\d:\d\d departure\)/);
  // Trains standing in a block another train comes into are boxed on the graph like other clashes.
  expect(await page.locator('[data-testid="graph-clash"][data-kind="block-occupied"]').count()).toBeGreaterThan(0);
  await screenshotBoth(page, 'builder-long-group');
  // The copy is cancelled again: other tests count the sessions of the demo's title that are coming up.
  await page.getByRole('link', { name: 'Settings and status' }).click();
  await page.getByRole('button', { name: 'Cancel session…' }).click();
  await page.getByRole('alertdialog').getByRole('button', { name: 'Cancel the session' }).click();
  await expect(page.getByTestId('status-form').getByRole('button', { name: 'Reopen as draft' })).toBeVisible();
});

test('on a phone the findings are a sheet that folds to one line', async ({ page, signInAs, railwayPage }) => {
  await signInAs('planner');
  await railwayPage.openFromList(DEMO_RAILWAY);
  const timetable = new TimetablePage(page);
  await timetable.openFromSessions(page.url(), SESSION);
  await page.setViewportSize(VIEWPORTS.phone);
  const toggle = page.getByTestId('findings-sheet-toggle');
  await expect(toggle).toBeVisible();
  await expect(toggle).toHaveAttribute('aria-expanded', 'false');
  await expect(toggle).toContainText(/Findings: \d+ errors?, \d+ warnings?/);
  await expect(page.getByTestId('findings-panel')).toBeHidden();
  await toggle.click();
  await expect(toggle).toHaveAttribute('aria-expanded', 'true');
  await expect(timetable.finding('cab-double-booked')).toBeVisible();
  await page.screenshot({ path: 'tests/e2e/screenshots/builder-findings-sheet-phone.png' });
  // Choosing a finding folds the sheet, so the graph shows what it marks.
  await timetable.finding('cab-double-booked').click();
  await expect(toggle).toHaveAttribute('aria-expanded', 'false');
  await expect(timetable.selectedGraphRuns).toHaveCount(2);
  await page.screenshot({ path: 'tests/e2e/screenshots/builder-phone.png' });
  await page.setViewportSize(VIEWPORTS.laptop);
});

test('adding a run carries on: the form offers the same train from where it stopped, after it', async ({ page, signInAs, railwayPage }) => {
  await signInAs('planner');
  await railwayPage.openFromList(DEMO_RAILWAY);
  await railwayPage.openTab('Sessions');
  const form = page.getByTestId('session-form');
  await form.getByLabel('Layout').selectOption({ label: 'Kestrel Vale branch (H0)' });
  await form.getByLabel('Title').fill('Carry-on trial');
  await form.getByLabel('Date').fill('2031-05-10');
  await form.getByRole('button', { name: 'Create and open the builder' }).click();
  await expect(page.getByTestId('session-title')).toContainText('Carry-on trial');

  const runForm = page.getByTestId('run-form');
  const depart = runForm.getByLabel('Departs (fast clock)');
  await runForm.getByLabel('Train').selectOption({ label: 'Wrenhollow stopper' });
  await runForm.getByLabel('Cab').selectOption({ label: 'Cab 2' });
  await depart.fill('06:20');
  await runForm.getByRole('button', { name: 'Larkholm yard road 1' }).click();
  await runForm.getByRole('button', { name: 'Fernwick platform 1' }).click();
  await runForm.getByRole('button', { name: 'Add run' }).click();
  await expect(page.getByTestId('run-row')).toHaveCount(1);

  // The form stays open with the next run: same train and cab, starting where the train stands,
  // departing after the first run has arrived and stood.
  await expect(page.getByTestId('run-form-status')).toContainText('Added Wrenhollow stopper at 06:20');
  await expect(runForm.getByLabel('Train').locator('option:checked')).toHaveText('Wrenhollow stopper');
  await expect(runForm.getByLabel('Cab').locator('option:checked')).toHaveText('Cab 2');
  await expect(page.getByTestId('route-preview')).toHaveText(/^Fernwick platform 1/);
  const offered = await depart.inputValue();
  expect(offered > '06:20').toBe(true);
  const firstArrival = /arr\. (\d\d:\d\d)/.exec((await page.getByTestId('run-row').first().textContent()) ?? '')?.[1];
  expect(firstArrival).toBeTruthy();
  expect(offered > firstArrival!).toBe(true);

  // Pick where it goes and add: the second run follows on without a clash or a continuity warning.
  await runForm.getByRole('button', { name: 'Larkholm yard road 1' }).click();
  await runForm.getByRole('button', { name: 'Add run' }).click();
  await expect(page.getByTestId('run-row')).toHaveCount(2);
  await expect(page.getByTestId('run-row').nth(1).getByTestId('run-depart')).toHaveValue(offered);
  await expect(page.locator('[data-testid="finding"][data-severity="error"]')).toHaveCount(0);
  await expect(page.locator('[data-testid="finding"][data-kind="train-continuity"]')).toHaveCount(0);
  // From the top: the findings panel is sticky, and a full-page picture draws it where the window last was.
  await page.evaluate(() => window.scrollTo(0, 0));
  await screenshotBoth(page, 'builder-carry-on');
});
