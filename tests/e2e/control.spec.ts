import { expect, screenshotBoth, test } from './fixtures';
import { demoSessionIds } from './pages/invitation-tracker-page';

test('a planner opens the demo session’s Control view: cab and block timelines, findings, downloads; the wiring sheet prints with the cautions', async ({ page, signInAs }) => {
  test.setTimeout(120_000);
  const { railwayId, sessionId } = demoSessionIds();
  await signInAs('planner');
  await page.goto(`/railways/${railwayId}/sessions/${sessionId}`);
  // The control schedule's findings stand beside the timetable's.
  const controlFindings = page.getByTestId('control-findings-panel');
  await expect(controlFindings.getByTestId('control-finding').first()).toContainText('left out of the control schedule');
  await controlFindings.scrollIntoViewIfNeeded();
  await page.screenshot({ path: 'tests/e2e/screenshots/timetable-control-findings-laptop.png' });
  await page.getByRole('link', { name: 'Control', exact: true }).click();
  await expect(page.getByTestId('control-view')).toBeVisible();
  await expect(page.getByTestId('cab-lane')).toHaveCount(4);
  await expect(page.getByTestId('block-lane')).toHaveCount(13);
  // One stretch at a time, readable: the first hour from the first setting (the stopper leaves at
  // 06:20 in the demo), the running PWM values written on the cab lanes, and a step later.
  const range = page.getByTestId('control-window-range').first();
  await expect(range).toHaveText('06:10–07:10');
  expect(await page.getByTestId('pwm-value').count()).toBeGreaterThan(0);
  await page.getByRole('link', { name: 'Later →' }).first().click();
  await expect(range).toHaveText('07:10–08:10');
  await page.getByRole('link', { name: '← Earlier' }).first().click();
  await expect(range).toHaveText('06:10–07:10');
  await expect(page.getByTestId('control-findings')).toContainText('left out of the control schedule');
  await expect(page.getByTestId('control-downloads')).toContainText('fits the ATmega328P board');
  const zip = page.getByRole('link', { name: 'Firmware (C, Makefile)' }).first();
  const download = page.waitForEvent('download');
  await zip.click();
  expect((await download).suggestedFilename()).toBe('fishplate-cab-board.zip');
  const python = page.waitForEvent('download');
  await page.getByRole('link', { name: 'Python program (gpiozero)' }).click();
  expect((await python).suggestedFilename()).toBe('fishplate-yard-board.py');
  await screenshotBoth(page, 'control-view');
  await page.setViewportSize({ width: 390, height: 844 });
  await expect(page.getByTestId('control-list')).toBeVisible();
  await expect(page.getByTestId('control-list')).toContainText('fed by Cab');

  await page.setViewportSize({ width: 1366, height: 800 });
  await page.getByRole('link', { name: 'Wiring sheet' }).click();
  await expect(page.getByTestId('wiring-sheet')).toContainText('PD6 (6)');
  await expect(page.getByTestId('safety-cautions')).toContainText('shoot-through');
  await screenshotBoth(page, 'wiring-sheet');
});

test('an operator is not shown the Control view', async ({ page, signInAs }) => {
  const { railwayId, sessionId } = demoSessionIds();
  await signInAs('operator');
  await page.goto(`/railways/${railwayId}/sessions/${sessionId}/control`);
  await expect(page.getByText('Not open to your role')).toBeVisible();
  await expect(page.getByTestId('control-view')).toHaveCount(0);
});

test('a planner edits the wiring sheet in a form: pins from the board’s pinout, PWM only on PWM pins, no pin twice, problems shown before saving', async ({ page, signInAs }) => {
  test.setTimeout(120_000);
  const { railwayId, sessionId } = demoSessionIds();
  await signInAs('planner');
  await page.goto(`/railways/${railwayId}/sessions/${sessionId}/control`);
  await page.getByRole('link', { name: 'Wiring sheet' }).click();
  const form = page.getByTestId('wiring-form');
  await expect(form).toBeVisible();
  const cab1 = form.locator('[data-testid="wiring-cab"][data-cab="Cab 1"]');
  const values = async (label: string) =>
    (await cab1.getByLabel(label, { exact: true }).locator('option').evaluateAll((os) => os.map((o) => (o as HTMLOptionElement).value))).filter(Boolean);
  // ATmega328P datasheet 14.3 (alternate port functions): the timer compare outputs OC2B PD3, OC0B PD5,
  // OC0A PD6, OC1A PB1, OC1B PB2, OC2A PB3 are the only pins with hardware PWM.
  expect((await values('PWM output')).sort()).toEqual(['PB1', 'PB2', 'PB3', 'PD3', 'PD5', 'PD6']);
  // PD0/PD1 are the USART's RXD/TXD (same datasheet): never offered.
  const forward = await values('Forward input');
  expect(forward).not.toContain('PD0');
  expect(forward).not.toContain('PD1');
  expect(forward).toHaveLength(20 - 2);
  await expect(cab1.getByLabel('PWM output', { exact: true })).toHaveValue('PD6');
  // Cab 2's PWM pin is taken: offered as in use, and not choosable.
  const pd5 = cab1.getByLabel('PWM output', { exact: true }).locator('option[value="PD5"]');
  await expect(pd5).toHaveText(/PWM of Cab 2/);
  await expect(pd5).toBeDisabled();

  // Moved to the 40-pin-header board, the cab's AVR pins do not exist there: the problems show and saving waits.
  await cab1.getByLabel('Board', { exact: true }).selectOption({ label: 'Yard and terminus board' });
  await expect(cab1.getByTestId('wiring-error').first()).toContainText('40-pin-header Linux board has no pin "PD7"');
  await expect(form.getByTestId('wiring-problems')).toContainText('problems to fix before saving');
  await expect(form.getByRole('button', { name: 'Save wiring sheet' })).toBeDisabled();
  await screenshotBoth(page, 'wiring-form-problems');
  await cab1.getByLabel('Board', { exact: true }).selectOption({ label: 'Cab board' });
  await expect(form.getByTestId('wiring-problems')).toHaveCount(0);

  // A valid change saves and is what the printed sheet shows.
  const lead = form.getByLabel('Connect a block before the head enters (s)');
  await lead.fill('2.5');
  await form.getByRole('button', { name: 'Save wiring sheet' }).click();
  await expect(form.getByRole('status')).toHaveText('Wiring sheet saved.');
  await page.reload();
  await expect(page.getByTestId('wiring-sheet')).toContainText('blocks connect 2.5 s before the head enters');
  await expect(form.getByLabel('Connect a block before the head enters (s)')).toHaveValue('2.5');
  await screenshotBoth(page, 'wiring-form');
  await form.getByLabel('Connect a block before the head enters (s)').fill('2');
  await form.getByRole('button', { name: 'Save wiring sheet' }).click();
  await expect(form.getByRole('status')).toHaveText('Wiring sheet saved.');
});
