import Database from 'better-sqlite3';
import { DEMO, VIEWPORTS, expect, screenshotBoth, test } from './fixtures';
import { demoSessionIds, InvitationTrackerPage } from './pages/invitation-tracker-page';

type Snapshot = { runs: { id: string; version: number; operatorId: string | null; departS: number }[] };

/** The demo operator's user id, from the e2e database. */
function operatorId(): string {
  const db = new Database(`data/e2e-${process.env.E2E_PORT ?? 3210}.db`, { readonly: true, fileMustExist: true });
  try {
    return (db.prepare('select id from users where email = ?').get(DEMO.operator) as { id: string }).id;
  } finally {
    db.close();
  }
}

test('after a run moves, the host sees who is affected, previews the update and sends it; reminders and the reply deadline', async ({ page, signInAs }) => {
  const { railwayId, sessionId } = demoSessionIds();
  const tracker = new InvitationTrackerPage(page);
  await signInAs('host');
  await tracker.goto(railwayId, sessionId);
  // The demo's invitations are not sent yet (another test may have sent them already).
  const sendPending = page.getByRole('button', { name: /^Send \d+ invitations? not sent yet$/ });
  if (await sendPending.isVisible()) {
    await sendPending.click();
    await expect(page.getByText(/invitations? queued\./)).toBeVisible();
  }
  await expect(tracker.count('not-sent-yet')).toHaveText('0');

  // Juno (the demo operator) has runs; move the first of them ten real minutes later through the timetable API.
  const snapshot: Snapshot = await (await page.request.get(`/api/sessions/${sessionId}/runs`)).json();
  const juno = operatorId();
  const run = snapshot.runs.filter((r) => r.operatorId === juno).sort((a, b) => a.departS - b.departS)[0]!;
  const moved = await page.request.patch(`/api/sessions/${sessionId}/runs/${run.id}`, { data: { version: run.version, departS: run.departS + 600 } });
  expect(moved.status()).toBe(200);

  await tracker.goto(railwayId, sessionId);
  await expect(tracker.row(DEMO.operator).getByTestId('changed-since')).toContainText('1 run moved');
  await expect(page.getByTestId('affected-count')).toContainText('Juno Carraway');
  await page.setViewportSize(VIEWPORTS.phone);
  await expect(tracker.row(DEMO.operator).getByTestId('changed-since')).toBeVisible();
  await expect(page.getByRole('button', { name: /^Review and send update to \d+$/ })).toBeVisible();
  await page.setViewportSize(VIEWPORTS.laptop);
  await screenshotBoth(page, 'invitations-tracker-changed');

  await page.getByRole('button', { name: /^Review and send update to \d+$/ }).click();
  const dialog = page.getByRole('alertdialog');
  await expect(dialog.getByTestId('update-preview')).toContainText(/Your run with .* fast: now .* fast \(.* real\), was .* fast\./);
  await screenshotBoth(page, 'invitations-update-dialog');
  await dialog.getByRole('button', { name: /^Send update to \d+$/ }).click();
  await expect(page.getByText(/^\d+ updates? queued\.$/)).toBeVisible();
  await expect(tracker.row(DEMO.operator).getByTestId('changed-since')).toHaveCount(0);

  // Reminders go to those who have not replied, once a day each; the tracker says when.
  const remind = page.getByTestId('remind');
  await remind.getByRole('button', { name: /^Remind \d+ who ha(s|ve) not replied$/ }).click();
  await expect(remind.getByText(/^\d+ reminders? queued\./)).toBeVisible();
  // Juno accepted (in the invitations test, or not at all when run alone): reminded only if still silent.
  await expect(page.getByTestId('reminded').first()).toContainText('reminded');
  await expect(remind.getByRole('button', { name: 'Reminders sent' })).toBeDisabled();

  // A deadline after the session's start is refused; one before it is saved and shown.
  const deadline = page.getByTestId('reply-deadline-form');
  await deadline.getByLabel('Reply by').fill('2099-01-01T10:00');
  await deadline.getByRole('button', { name: 'Save deadline' }).click();
  await expect(deadline.getByText('Choose a time no later than the session’s start.')).toBeVisible();
  const tomorrow = new Date(Date.now() + 86_400_000);
  const local = `${tomorrow.toISOString().slice(0, 10)}T12:00`;
  await deadline.getByLabel('Reply by').fill(local);
  await deadline.getByRole('button', { name: 'Save deadline' }).click();
  await expect(deadline.getByText('Reply deadline saved. E-mails from now on say it.')).toBeVisible();
  await expect(page.getByTestId('deadline-now')).toContainText('Replies wanted by');
  await screenshotBoth(page, 'invitations-tracker-reminded');

  // Put the run back where the demo has it, so that later tests see the demo's findings.
  const now: Snapshot = await (await page.request.get(`/api/sessions/${sessionId}/runs`)).json();
  const back = await page.request.patch(`/api/sessions/${sessionId}/runs/${run.id}`, { data: { version: now.runs.find((r) => r.id === run.id)!.version, departS: run.departS } });
  expect(back.status()).toBe(200);
});

test('session settings say "Saved." after saving', async ({ page, signInAs }) => {
  const { railwayId, sessionId } = demoSessionIds();
  await signInAs('host');
  await page.goto(`/railways/${railwayId}/sessions/${sessionId}/settings`);
  const form = page.getByTestId('session-form');
  const place = await form.getByLabel('Place').inputValue();
  await form.getByRole('button', { name: 'Save settings' }).click();
  await expect(form.getByText(/^Saved\./)).toBeVisible();
  // A second save works too: the form sends the session's new version (a stale one would answer "changed by someone else").
  await Promise.all([page.waitForResponse((r) => r.request().method() === 'POST'), form.getByRole('button', { name: 'Save settings' }).click()]);
  await expect(form.getByText(/^Saved\./)).toBeVisible();
  await page.reload();
  await expect(page.getByTestId('session-form').getByLabel('Place')).toHaveValue(place);
});

test('issue 13 point 4: an operator who declines but still has runs shows on the tracker and under Needs attention, at both sizes', async ({ page, signInAs }) => {
  const { railwayId, sessionId } = demoSessionIds();
  await signInAs('operator');
  await page.goto('/my-runs');
  const decline = page.getByTestId('my-session').first().getByTestId('my-reply').getByRole('button', { name: 'Decline' });
  await decline.click();
  await expect(decline).toHaveAttribute('aria-pressed', 'true');

  await page.context().clearCookies();
  await signInAs('host');
  const tracker = new InvitationTrackerPage(page);
  await tracker.goto(railwayId, sessionId);
  // Juno keeps the five runs of the demo timetable (lib/demo/demo-railway.ts).
  const row = tracker.row(DEMO.operator);
  await expect(row.getByTestId('reply')).toHaveText('declined, still has runs');
  await expect(row).toContainText('5 runs to hand to someone else');
  await page.goto(`/railways/${railwayId}`);
  const item = page.getByTestId('attention').getByRole('listitem').filter({ hasText: 'declined, still has runs' });
  await expect(item).toContainText('Juno Carraway');
  await expect(item.getByRole('link')).toHaveAttribute('href', `/railways/${railwayId}/sessions/${sessionId}`);
  for (const size of Object.values(VIEWPORTS)) {
    await page.setViewportSize(size);
    await expect(item).toBeInViewport();
    await tracker.goto(railwayId, sessionId);
    await row.getByTestId('reply').scrollIntoViewIfNeeded();
    await expect(row.getByTestId('reply')).toBeInViewport();
    // The table of invitees fits its card: the reply and the row's Send button are not cut off at the side.
    const table = page.getByTestId('invitation-table').locator('xpath=..');
    expect(await table.evaluate((el) => el.scrollWidth - el.clientWidth)).toBeLessThanOrEqual(0);
    expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(size.width);
    await page.goto(`/railways/${railwayId}`);
  }
  await screenshotBoth(page, 'overview-declined');

  // Juno accepts again, as the later tests expect of the demo.
  await page.context().clearCookies();
  await signInAs('operator');
  await page.goto('/my-runs');
  const accept = page.getByTestId('my-session').first().getByTestId('my-reply').getByRole('button', { name: 'Accept' });
  await accept.click();
  await expect(accept).toHaveAttribute('aria-pressed', 'true');
});
