import { DEMO, DEMO_PASSWORD, DEMO_RAILWAY, expect, test } from './fixtures';

// Checked on the production build (`next start`), as served to a browser.
test('every page carries the security headers, with a CSP that forbids eval and framing', async ({ request }) => {
  for (const path of ['/', '/sign-in', '/sign-up', '/railways', '/api/health', '/no-such-page']) {
    const response = await request.get(path, { maxRedirects: 0 });
    const headers = response.headers();
    const csp = headers['content-security-policy'] ?? '';
    expect(csp, path).toContain("frame-ancestors 'none'"); // CSP Level 2 §7.7.3
    expect(csp, path).toContain("default-src 'self'");
    expect(csp, path).not.toContain('unsafe-eval');
    expect(headers['x-content-type-options'], path).toBe('nosniff'); // Fetch standard, X-Content-Type-Options
    expect(headers['referrer-policy'], path).toBe('strict-origin-when-cross-origin'); // Referrer Policy (W3C)
    expect(headers['x-powered-by'], path).toBeUndefined();
  }
});

test('the session cookie is HttpOnly and SameSite=Lax, and expires', async ({ page, context }) => {
  await page.goto('/sign-in');
  await page.getByLabel('E-mail address', { exact: true }).fill(DEMO.planner);
  await page.getByLabel('Password').fill(DEMO_PASSWORD);
  await page.getByRole('button', { name: 'Sign in', exact: true }).click();
  await expect(page).toHaveURL(/\/railways$/);
  const cookie = (await context.cookies()).find((c) => c.name.endsWith('next-auth.session-token'));
  expect(cookie).toBeDefined();
  expect(cookie!.httpOnly).toBe(true);
  expect(cookie!.sameSite).toBe('Lax');
  // Over plain http (this test server) it cannot be Secure; next-auth sets Secure and the
  // __Secure- prefix whenever NEXTAUTH_URL is https.
  const days = (cookie!.expires * 1000 - Date.now()) / 86_400_000;
  expect(days).toBeGreaterThan(6.9);
  expect(days).toBeLessThanOrEqual(7.01);
});

test('finding 7: sign-in never sends the browser to another site', async ({ page, baseURL }) => {
  // Both spellings were confirmed live: a backslash, and a tab that the URL parser strips.
  for (const hostile of ['/%5Cevil.example/phish', '/%09/evil.example/phish']) {
    await page.context().clearCookies();
    await page.goto(`/sign-in?callbackUrl=${hostile}`);
    await page.getByLabel('E-mail address', { exact: true }).fill(DEMO.planner);
    await page.getByLabel('Password').fill(DEMO_PASSWORD);
    await page.getByRole('button', { name: 'Sign in', exact: true }).click();
    await expect(page).toHaveURL(/\/railways$/);
    expect(new URL(page.url()).origin, hostile).toBe(new URL(baseURL!).origin);
  }
});

test('issue 13 point 10: signed out, /my-runs lands back on /my-runs after sign-in', async ({ page }) => {
  await page.goto('/my-runs');
  await expect(page).toHaveURL(/\/sign-in\?callbackUrl=%2Fmy-runs$/);
  await page.getByLabel('E-mail address', { exact: true }).fill(DEMO.operator);
  await page.getByLabel('Password').fill(DEMO_PASSWORD);
  await page.getByRole('button', { name: 'Sign in', exact: true }).click();
  await expect(page).toHaveURL(/\/my-runs$/);
});

const directive = (csp: string, name: string) => csp.split(';').map((d) => d.trim()).find((d) => d.startsWith(`${name} `)) ?? '';

test('finding 14: pages get a fresh script nonce and no script unsafe-inline; the track-plan image keeps its own policy; the calendar tab loads without a CSP violation', async ({ page, request, signInAs, railwayPage }) => {
  const first = await request.get('/sign-in');
  const second = await request.get('/sign-in');
  const nonceOf = (csp: string) => /'nonce-([A-Za-z0-9+/=]+)'/.exec(directive(csp, 'script-src'))?.[1];
  const csp = first.headers()['content-security-policy'] ?? '';
  expect(directive(csp, 'script-src')).not.toContain('unsafe-inline'); // CSP Level 3 §6.1.1.1: a nonce source disables it anyway, so it must not be there to rely on
  expect(nonceOf(csp)?.length ?? 0).toBeGreaterThanOrEqual(16);
  expect(nonceOf(second.headers()['content-security-policy'] ?? '')).not.toBe(nonceOf(csp)); // a nonce is used once (CSP Level 3 §7.1)
  // Every script of the page carries the nonce.
  const html = await first.text();
  const scripts = [...html.matchAll(/<script\b[^>]*>/g)].map((m) => m[0]);
  expect(scripts.length).toBeGreaterThan(0);
  for (const tag of scripts) expect(tag, tag).toContain(`nonce="${nonceOf(csp)}"`);

  const violations: string[] = [];
  page.on('console', (message) => {
    if (/Content Security Policy/i.test(message.text())) violations.push(message.text());
  });
  await signInAs('planner');
  await railwayPage.openFromList(DEMO_RAILWAY);
  const railwayUrl = page.url();
  await page.goto(`${railwayUrl}/sessions`);
  await page.getByRole('link', { name: 'December running evening', exact: true }).first().click(); // the earliest: the seeded one
  await expect(page.getByTestId('train-graph')).toBeVisible();
  await page.getByRole('tab', { name: 'Calendar' }).click();
  await expect(page.getByTestId('calendar-view').locator('.fc-event').first()).toBeVisible();
  // The calendar's stylesheet carries its icon font as a data: URL; ask the browser to load it.
  const iconFont = await page.evaluate(async () => {
    const faces = await document.fonts.load('16px fcicons');
    return faces.length;
  });
  expect(iconFont).toBeGreaterThan(0);
  expect(violations).toEqual([]);

  // The track-plan file route answers with its own policy, not the pages' one: upload one through
  // the page (a same-origin multipart POST) and ask for it.
  await page.goto(`${railwayUrl}/layouts`);
  await page.locator(`a[href^="${new URL(railwayUrl).pathname}/layouts/"]`).first().click();
  await expect(page.getByTestId('layout-name')).toBeVisible();
  const png = Buffer.from('89504e470d0a1a0a0000000d49484452000000010000000108060000001f15c4890000000d4944415478da63f8cfc0f01f0005000201a1b6a1bd0000000049454e44ae426082', 'hex');
  await page.getByLabel('Track plan image').setInputFiles({ name: 'plan.png', mimeType: 'image/png', buffer: png });
  const src = await page.getByTestId('track-plan-image').getAttribute('src');
  const image = await page.request.get(src!);
  expect(image.status()).toBe(200);
  expect(image.headers()['content-security-policy']).toBe("default-src 'none'");
});

test('an action posted from another origin is refused with 403, not 500', async ({ request }) => {
  const foreign: Record<string, string>[] = [{ origin: 'http://evil.example' }, { origin: 'http://127.0.0.1:1' }, { 'sec-fetch-site': 'cross-site' }];
  for (const headers of foreign) {
    const response = await request.post('/sign-in', {
      headers: { 'next-action': '7f00000000000000000000000000000000000000', 'content-type': 'text/plain;charset=UTF-8', ...headers },
      data: '[]',
      maxRedirects: 0,
    });
    expect(response.status(), JSON.stringify(headers)).toBe(403);
  }
});

test('session and layout pages under a loading skeleton answer 404 for a made-up id or another railway’s session', async ({ page, signInAs, railwayPage }) => {
  await signInAs('planner');
  await railwayPage.openFromList(DEMO_RAILWAY);
  const railwayUrl = page.url();
  await page.goto(`${railwayUrl}/sessions`);
  await page.getByRole('link', { name: 'December running evening', exact: true }).first().click(); // the earliest: the seeded one
  await expect(page.getByTestId('train-graph')).toBeVisible();
  const sessionPath = new URL(page.url()).pathname;
  const sessionId = sessionPath.split('/').pop()!;
  const status = async (path: string) => (await page.request.get(path, { maxRedirects: 0 })).status();
  expect(await status(sessionPath)).toBe(200);
  expect(await status(`${railwayUrl}/sessions/no-such-session`)).toBe(404);
  expect(await status(`${railwayUrl}/sessions/no-such-session/settings`)).toBe(404);
  expect(await status(`${railwayUrl}/sessions/no-such-session/invitations`)).toBe(404);
  expect(await status(`${railwayUrl}/layouts/no-such-layout`)).toBe(404);
  expect(await status('/railways/no-such-railway')).toBe(404);
  // Another railway's session: the planner starts a railway of their own and asks for the demo session there.
  await page.goto('/railways');
  await page.getByLabel('Railway name').fill('Loft test line');
  await page.getByRole('button', { name: 'Create railway' }).click();
  await expect(page.getByTestId('railway-name')).toHaveText('Loft test line');
  const ownUrl = page.url();
  expect(await status(`${ownUrl}/sessions/${sessionId}`)).toBe(404);
});
