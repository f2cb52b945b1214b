import { DEMO, DEMO_PASSWORD, expect, test } from './fixtures';

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
