import { DEMO, DEMO_RAILWAY, expect, screenshotBoth, test } from './fixtures';
import { demoSessionIds, InvitationReplyPage, InvitationTrackerPage } from './pages/invitation-tracker-page';

test('the host invites the crew, a reply link from the mail outbox is accepted, and the tracker shows it', async ({ page, signInAs, railwayPage }) => {
  const { railwayId, sessionId } = demoSessionIds();
  const tracker = new InvitationTrackerPage(page);
  await signInAs('host');
  await tracker.goto(railwayId, sessionId);
  // The demo seed lists six operators as invited, but no e-mail was ever written for them.
  await expect(tracker.rows()).toHaveCount(6);
  await expect(tracker.row(DEMO.operator)).toContainText('not sent yet');
  await expect(tracker.count('not-sent-yet')).toHaveText('6');
  await screenshotBoth(page, 'invitations-tracker-before');

  await page.getByRole('button', { name: 'Send 6 invitations not sent yet' }).click();
  await expect(page.getByText('6 invitations queued.')).toBeVisible();

  // Invite the planner and a guest typed by address, from the same page.
  const form = page.getByTestId('invite-form');
  await form.getByLabel(/Milo Ferrand/).check();
  await form.getByLabel('Guests (e-mail addresses)').fill('guest-driver@example.org');
  await form.getByRole('button', { name: /Invite and e-mail/ }).click();
  await expect(form.getByText('Invited 2 people; 2 e-mails queued.')).toBeVisible();
  await expect(tracker.rows()).toHaveCount(8);
  // The worker sends within a second or two; the tracker refreshes itself.
  await expect(tracker.row(DEMO.operator).getByText('sent', { exact: true })).toBeVisible({ timeout: 20_000 });
  await expect(tracker.count('not-sent-yet')).toHaveText('0');

  // The invitation as caught by the local mail server, with its reply links.
  await railwayPage.openTab('Mail outbox');
  const mail = page.getByTestId('caught-mail').locator('li', { hasText: `to ${DEMO.operator}` }).filter({ hasText: 'Invitation: December running evening' });
  await expect(mail).toHaveCount(1, { timeout: 20_000 });
  await mail.locator('summary').click();
  await expect(mail).toContainText('Your runs (5):');
  await screenshotBoth(page, 'invitations-mail');
  await mail.getByRole('link', { name: /answer=accepted/ }).click();
  await new InvitationReplyPage(page).confirm('Accept');
  await screenshotBoth(page, 'invitations-reply');

  await tracker.goto(railwayId, sessionId);
  await expect(tracker.row(DEMO.operator).getByTestId('rsvp')).toHaveText('accepted');
  await expect(tracker.count('accepted')).toHaveText('3'); // two accepted in the seed, plus this one
  await screenshotBoth(page, 'invitations-tracker-after');
  await expect(page.getByTestId('railway-name')).toHaveText(DEMO_RAILWAY);
});

test('the tracker is for hosts only', async ({ page, signInAs }) => {
  const { railwayId, sessionId } = demoSessionIds();
  await signInAs('planner');
  await page.goto(`/railways/${railwayId}/sessions/${sessionId}/invitations`);
  await expect(page.getByRole('heading', { name: 'Not open to your role' })).toBeVisible();
});
