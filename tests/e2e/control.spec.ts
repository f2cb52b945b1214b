import { expect, screenshotBoth, test } from './fixtures';
import { demoSessionIds } from './pages/invitation-tracker-page';

test('a planner opens the demo session’s Control view: cab and block timelines, findings, downloads; the wiring sheet prints with the cautions', async ({ page, signInAs }) => {
  test.setTimeout(120_000);
  const { railwayId, sessionId } = demoSessionIds();
  await signInAs('planner');
  await page.goto(`/railways/${railwayId}/sessions/${sessionId}`);
  await page.getByRole('link', { name: 'Control', exact: true }).click();
  await expect(page.getByTestId('control-view')).toBeVisible();
  await expect(page.getByTestId('cab-lane')).toHaveCount(4);
  await expect(page.getByTestId('block-lane')).toHaveCount(12);
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
