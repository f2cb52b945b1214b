import type { Browser, Page } from '@playwright/test';
import { DEMO, DEMO_PASSWORD, VIEWPORTS, expect, screenshotBoth, test } from './fixtures';
import { SignInPage } from './pages/sign-in-page';

// The session day with several people at once: the host's board on a laptop, two operators on
// phones. Every wait is for something on the page (an event arriving), never a fixed sleep.

async function signedIn(browser: Browser, email: string, viewport: { width: number; height: number }): Promise<Page> {
  const context = await browser.newContext({ viewport });
  const page = await context.newPage();
  const signIn = new SignInPage(page);
  await signIn.goto();
  await signIn.signIn(email, DEMO_PASSWORD);
  await expect(page).toHaveURL(/\/railways$/);
  return page;
}

/** Only the event stream is cut; the polling requests to the same route still go through. */
async function cutStream(page: Page) {
  await page.route('**/api/sessions/*/live*', async (route) => {
    if ((route.request().headers()['accept'] ?? '').includes('text/event-stream')) await route.abort('connectionreset');
    else await route.continue();
  });
}

test('the session day: clock, reports from phones, the board follows, a delay makes a clash, the host repairs', async ({ browser }) => {
  const host = await signedIn(browser, DEMO.host, VIEWPORTS.laptop);
  const { sessions } = await (await host.request.get('/api/sessions')).json();
  const demo = sessions.find((s: { title: string }) => s.title === 'December running evening');
  expect(demo).toBeTruthy();
  const boardUrl = `/railways/${demo.railway.id}/sessions/${demo.id}/live`;
  await host.goto(boardUrl);
  await expect(host.getByTestId('live-mode')).toHaveText('Live');

  // The host starts the clock, sets it to 06:30 and pauses for a break.
  await host.getByRole('button', { name: 'Start clock' }).click();
  await expect(host.getByTestId('clock-state')).toHaveText('running');
  await host.getByLabel('Set the clock to (HH:MM)').fill('06:30');
  await host.getByRole('button', { name: 'Set', exact: true }).click();
  await host.getByRole('button', { name: 'Pause' }).click();
  await expect(host.getByTestId('clock-state')).toHaveText('paused');
  await expect(host.getByTestId('fast-clock')).toHaveText('06:30');

  const juno = await signedIn(browser, DEMO.operator, VIEWPORTS.phone);
  const priya = await signedIn(browser, 'priya@fishplate.example', VIEWPORTS.phone);
  for (const phone of [juno, priya]) {
    await phone.goto('/my-runs');
    await expect(phone.getByTestId('live-mode')).toHaveText('Live');
    await expect(phone.getByTestId('fast-clock')).toHaveText('06:30');
  }
  // Juno's next run is the stopper at 06:20 (the demo timetable): due, ten fast minutes late now.
  const junoNext = juno.getByTestId('my-next-run');
  await expect(junoNext).toContainText('Wrenhollow stopper');
  await expect(junoNext.getByTestId('my-depart')).toHaveText('06:30');
  const priyaNext = priya.getByTestId('my-next-run');
  await expect(priyaNext).toContainText('Fernwick express');
  await expect(priyaNext.getByTestId('my-depart')).toHaveText('06:32');
  await screenshotBoth(juno, 'live-my-runs');

  await junoNext.getByRole('button', { name: 'Departed' }).click();
  // The board and the other phone follow without a reload.
  await expect(host.getByTestId('late-run').filter({ hasText: 'Wrenhollow stopper' })).toContainText('+10 min');
  // The late stopper now meets the express on the blocks they share (one finding per block).
  await expect(host.getByTestId('new-clash').first()).toContainText('Fernwick express');
  expect(await host.getByTestId('new-clash').count()).toBeGreaterThan(0);
  await expect(priya.getByTestId('my-late')).toContainText('Wrenhollow stopper +10 min');
  await expect(junoNext).toContainText('Under way');
  await screenshotBoth(host, 'live-board');

  // The host repairs the runs not yet departed, with one confirmation; the express moves.
  await host.getByRole('button', { name: /^Repair: move/ }).click();
  await host.getByRole('button', { name: 'Apply repair' }).click();
  await expect(host.getByTestId('new-clash')).toHaveCount(0);
  await expect(priyaNext.getByTestId('my-depart')).not.toHaveText('06:32');
  const moved = await priyaNext.getByTestId('my-depart').textContent();
  expect(moved! > '06:32').toBe(true);

  // A reload mid-session keeps the clock and the state.
  await host.reload();
  await expect(host.getByTestId('fast-clock')).toHaveText('06:30');
  await expect(host.getByTestId('clock-state')).toHaveText('paused');
  await expect(host.getByTestId('late-run').filter({ hasText: 'Wrenhollow stopper' })).toContainText('+10 min');

  // Priya's stream is cut: her page polls the same route and still catches up.
  await cutStream(priya);
  await priya.reload();
  await expect(priya.getByTestId('live-mode')).toHaveText('Polling (stream cut)');
  await junoNext.getByRole('button', { name: 'Arrived' }).click();
  await expect(priya.getByTestId('my-latest')).toContainText('Wrenhollow stopper arrived');
  await priya.unroute('**/api/sessions/*/live*');
  await expect(priya.getByTestId('live-mode')).toHaveText('Live');

  // The host puts a wrong report right from the board: the stopper really left at 06:28, and its
  // arrival was pressed too soon. Juno's phone follows, and the run's history names who did what.
  const correct = host.getByTestId('correct-reports');
  await correct.getByLabel('Run', { exact: true }).selectOption({ label: 'Wrenhollow stopper · planned 06:20' });
  await correct.getByLabel('Departure at (fast HH:MM)').fill('06:28');
  await correct.getByTestId('correction-row').filter({ hasText: 'Departure' }).getByRole('button', { name: 'Set time' }).click();
  await expect(correct.getByTestId('report-history')).toContainText('06:28 departed — corrected by Hazel Brightwater');
  await expect(host.getByTestId('live-feed')).toContainText('(corrected by Hazel Brightwater)');
  await correct.getByTestId('correction-row').filter({ hasText: 'Arrival' }).getByRole('button', { name: 'Withdraw' }).click();
  await expect(correct.getByTestId('report-history')).toContainText('arrived — withdrawn by Hazel Brightwater');
  await expect(correct.getByTestId('correction-row').filter({ hasText: 'Arrival' })).toHaveCount(0);
  await expect(junoNext).toContainText('Under way');
  await expect(junoNext).toContainText('Wrenhollow stopper');
  // 06:28 against the planned 06:20: eight fast minutes late now, not ten. (The run takes under three fast
  // minutes, so at 06:30 it is not yet due at the other end: the departure sets the lateness.)
  await expect(host.getByTestId('late-run').filter({ hasText: 'Wrenhollow stopper' })).toContainText('+8 min');
  await screenshotBoth(host, 'live-board-correct');
  await juno.getByTestId('my-corrections').locator('summary').click();
  await expect(juno.getByTestId('my-corrections').getByTestId('report-history')).toContainText('withdrawn by Hazel Brightwater');
  await screenshotBoth(juno, 'live-my-runs-correct');
  const corrected = await junoNext.getAttribute('data-run-id');
  await junoNext.getByRole('button', { name: 'Arrived' }).click();
  await expect(junoNext).not.toHaveAttribute('data-run-id', corrected!);

  // The host resumes; every screen runs the same clock.
  await host.getByRole('button', { name: 'Resume' }).click();
  await expect(juno.getByTestId('clock-state')).toHaveText('running');

  // The session-day settings: a longer stand and a wider punctuality margin, used by the report.
  await host.goto(`/railways/${demo.railway.id}/sessions/${demo.id}/settings`);
  await host.getByLabel('Least stand between runs (real s)').fill('4000');
  await host.getByRole('button', { name: 'Save settings' }).click();
  await expect(host.getByText('Use 0 to 3600.')).toBeVisible();
  await host.getByLabel('Least stand between runs (real s)').fill('90');
  await host.getByLabel('Punctual within (fast min)').fill('5');
  await host.getByRole('button', { name: 'Save settings' }).click();
  // Saved, the form is drawn afresh at the new version (the refusal's message goes with it).
  await expect(host.getByText('Use 0 to 3600.')).toHaveCount(0);
  await host.reload();
  await expect(host.getByLabel('Least stand between runs (real s)')).toHaveValue('90');
  await expect(host.getByLabel('Punctual within (fast min)')).toHaveValue('5');
  await screenshotBoth(host, 'session-settings-day');

  await host.goto(`/railways/${demo.railway.id}/sessions/${demo.id}/report`);
  await expect(host.getByTestId('punctuality')).toContainText('within 5 fast minutes');
  // The train graph puts planned (every run) and actual (the runs that ran) over each other.
  expect(await host.getByTestId('planned-line').count()).toBeGreaterThan(await host.getByTestId('actual-line').count());
  expect(await host.getByTestId('actual-line').count()).toBeGreaterThan(0);
  await expect(host.getByTestId('punctuality')).toContainText('departed runs');
  await expect(host.getByTestId('delays-began')).toContainText('fast min');
  await screenshotBoth(host, 'live-report');
});
