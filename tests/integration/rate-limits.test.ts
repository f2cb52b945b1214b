import { describe, expect, it } from 'vitest';
import { requestPasswordReset } from '@/app/(auth)/reset-password/actions';
import { requestSignInLink } from '@/app/(auth)/sign-in/actions';
import { signUp } from '@/app/(auth)/sign-up/actions';
import { authOptions } from '@/lib/auth-options';
import { AppError, toResponse } from '@/lib/errors';
import { rateLimit } from '@/lib/rate-limit';
import { formData, makeWorld } from './world';

describe('abuse limits', () => {
  it('the sign-in link form answers 429 after five requests for one address', async () => {
    const { host } = makeWorld();
    for (let i = 0; i < 5; i++) expect(await requestSignInLink(null, formData({ email: host.email }))).toMatchObject({ ok: true });
    const sixth = await requestSignInLink(null, formData({ email: host.email }));
    expect(sixth).toMatchObject({ ok: false, status: 429 });
    if (sixth && !sixth.ok) expect(sixth.error).toMatch(/Try again in \d+ s/);
  });

  it('password reset requests are limited per address', async () => {
    const { planner } = makeWorld();
    for (let i = 0; i < 5; i++) await requestPasswordReset(null, formData({ email: planner.email }));
    expect(await requestPasswordReset(null, formData({ email: planner.email }))).toMatchObject({ ok: false, status: 429 });
  });

  it('sign-ups are limited per address of the caller', async () => {
    let last;
    for (let i = 0; i < 11; i++) {
      last = await signUp(null, formData({ name: 'Many', email: `many-${i}-${Date.now()}@test.example`, password: 'long enough pass' }));
    }
    expect(last).toMatchObject({ ok: false, status: 429 });
  });

  it('password sign-in stops checking after ten tries for one address', async () => {
    const { operator } = makeWorld();
    const providers = authOptions.providers as unknown as { options: { id: string; authorize: (c: Record<string, string>) => Promise<unknown> } }[];
    const authorize = providers.find((p) => p.options.id === 'password')!.options.authorize;
    for (let i = 0; i < 10; i++) expect(await authorize({ email: operator.email, password: 'guess-number-' + i })).toBeNull();
    await expect(authorize({ email: operator.email, password: 'guess-eleven' })).rejects.toThrow(/Too many attempts/);
  });

  it('a limited call answers 429 with Retry-After (RFC 6585 §4; RFC 9110 §10.2.3)', async () => {
    const now = 1_000_000;
    rateLimit('unit', 1, 60_000, now);
    try {
      rateLimit('unit', 1, 60_000, now + 15_000);
      expect.unreachable();
    } catch (error) {
      expect(error).toBeInstanceOf(AppError);
      const response = toResponse(error);
      expect(response.status).toBe(429);
      expect(response.headers.get('Retry-After')).toBe('45');
    }
    // A new window starts after the old one ends.
    expect(() => rateLimit('unit', 1, 60_000, now + 60_001)).not.toThrow();
  });
});
