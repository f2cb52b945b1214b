import { DEMO_RAILWAY, expect, screenshotBoth, test } from './fixtures';

test('signed out, the railway pages send you to sign in', async ({ page }) => {
  await page.goto('/railways');
  await expect(page).toHaveURL(/\/sign-in\?callbackUrl=%2Frailways/);
});

test('the host sees the whole railway, members and the mail outbox', async ({ page, signInAs, railwayPage }) => {
  await signInAs('host');
  await railwayPage.openFromList(DEMO_RAILWAY);
  await expect(page.getByTestId('upcoming-sessions')).toContainText('December running evening');
  await screenshotBoth(page, 'dashboard-host');
  await railwayPage.openTab('Members');
  await expect(page.getByTestId('member-row')).toHaveCount(8);
  await expect(page.getByRole('heading', { name: 'Add a member' })).toBeVisible();
  await screenshotBoth(page, 'members-host');
  await railwayPage.openTab('Mail outbox');
  await expect(page.getByRole('heading', { name: 'Delivery status' })).toBeVisible();
});

test('the planner sees sessions and members but may not open the mail outbox', async ({ page, signInAs, railwayPage }) => {
  await signInAs('planner');
  await railwayPage.openFromList(DEMO_RAILWAY);
  await expect(page.getByText('Planner ·')).toBeVisible();
  await expect(railwayPage.tab('Mail outbox')).toHaveCount(0);
  await railwayPage.openTab('Members');
  await expect(page.getByRole('heading', { name: 'Add a member' })).toHaveCount(0);
  await page.goto(page.url().replace(/\/members$/, '/mail'));
  await expect(page.getByRole('heading', { name: 'Not open to your role' })).toBeVisible();
});

test('the operator sees the session they are invited to, and no one’s e-mail addresses', async ({ page, signInAs, railwayPage }) => {
  await signInAs('operator');
  await railwayPage.openFromList(DEMO_RAILWAY);
  await expect(page.getByTestId('upcoming-sessions')).toContainText('December running evening');
  await screenshotBoth(page, 'dashboard-operator');
  await railwayPage.openTab('Members');
  await expect(page.getByTestId('member-list')).not.toContainText('@fishplate.example');
  await page.goto(page.url().replace(/\/members$/, '/mail'));
  await expect(page.getByRole('heading', { name: 'Not open to your role' })).toBeVisible();
});

test('another railway’s address is a not-found page', async ({ page, signInAs }) => {
  await signInAs('host');
  await page.goto('/railways/00000000-0000-4000-8000-000000000000');
  await expect(page.getByText('does not exist, or it belongs to a railway you are not a member of')).toBeVisible();
});
