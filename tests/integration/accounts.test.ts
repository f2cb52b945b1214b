import bcrypt from 'bcryptjs';
import { eq } from 'drizzle-orm';
import { beforeEach, describe, expect, it } from 'vitest';
import { requestPasswordReset, resetPassword } from '@/app/(auth)/reset-password/actions';
import { requestSignInLink } from '@/app/(auth)/sign-in/actions';
import { signUp } from '@/app/(auth)/sign-up/actions';
import { getDb } from '@/db';
import { getUserByEmail } from '@/db/queries/users';
import { authTokens, outbox, users } from '@/db/schema';
import { authOptions } from '@/lib/auth-options';
import { issueAuthToken, spendAuthToken } from '@/lib/tokens';
import { signInAs } from './caller';
import { formData, makeWorld } from './world';

type Authorize = (credentials: Record<string, string>) => Promise<{ id: string } | null>;
function provider(id: string): Authorize {
  // CredentialsProvider keeps the options it was given (our id and authorize) under `options`.
  const providers = authOptions.providers as unknown as { options: { id: string; authorize: Authorize } }[];
  const found = providers.find((p) => p.options.id === id);
  if (!found) throw new Error(`no provider ${id}`);
  return found.options.authorize;
}

beforeEach(() => signInAs(null));

describe('sign-up', () => {
  it('creates an account whose password then signs in, stored only as a bcrypt hash', async () => {
    const state = await signUp(null, formData({ name: 'Ada', email: 'Ada@Test.Example', password: 'correct horse battery' }));
    expect(state).toMatchObject({ ok: true });
    const user = getUserByEmail('ada@test.example');
    expect(user?.passwordHash).toMatch(/^\$2[aby]\$10\$/); // bcrypt modular crypt format, cost 10
    expect(user?.passwordHash).not.toContain('correct horse');
    expect(await provider('password')({ email: 'ada@test.example', password: 'correct horse battery' })).toMatchObject({ id: user!.id });
    expect(await provider('password')({ email: 'ada@test.example', password: 'wrong password!!' })).toBeNull();
  });

  it('refuses bad input with a message per field and writes nothing', async () => {
    const before = getDb().select().from(users).all().length;
    const state = await signUp(null, formData({ name: '', email: 'not-an-address', password: 'short' }));
    expect(state).toMatchObject({ ok: false, status: 400 });
    if (state && !state.ok) {
      expect(state.fieldErrors?.name).toBe('Enter your name.');
      expect(state.fieldErrors?.email).toMatch(/valid e-mail/);
      expect(state.fieldErrors?.password).toBe('Use at least 10 characters.');
    }
    expect(getDb().select().from(users).all().length).toBe(before);
  });

  it('refuses a second account for the same address', async () => {
    await signUp(null, formData({ name: 'Bo', email: 'bo@test.example', password: 'long enough pw' }));
    const again = await signUp(null, formData({ name: 'Bo2', email: 'BO@test.example', password: 'long enough pw' }));
    expect(again).toMatchObject({ ok: false, status: 409 });
    expect(getDb().select().from(users).where(eq(users.email, 'bo@test.example')).all()).toHaveLength(1);
  });
});

describe('one-time tokens', () => {
  it('a sign-in link works once', async () => {
    const { operator } = makeWorld();
    const token = issueAuthToken(operator.id, 'sign-in');
    expect(await provider('link')({ token })).toMatchObject({ id: operator.id });
    expect(await provider('link')({ token })).toBeNull();
  });

  it('an expired, forged or wrong-purpose token is refused', () => {
    const { operator } = makeWorld();
    const token = issueAuthToken(operator.id, 'sign-in');
    expect(spendAuthToken(token, 'reset-password')).toBeNull();
    expect(spendAuthToken(`${token.slice(0, -2)}xx`, 'sign-in')).toBeNull();
    getDb().update(authTokens).set({ expiresAt: new Date(Date.now() - 1000) }).run();
    expect(spendAuthToken(token, 'sign-in')).toBeNull();
  });

  it('the sign-in link request answers the same for unknown addresses and only mails real ones', async () => {
    const { host } = makeWorld();
    const before = getDb().select().from(outbox).all().length;
    const unknown = await requestSignInLink(null, formData({ email: 'nobody@test.example' }));
    expect(unknown).toMatchObject({ ok: true });
    expect(getDb().select().from(outbox).all().length).toBe(before);
    const known = await requestSignInLink(null, formData({ email: host.email }));
    expect(known).toMatchObject({ ok: true });
    const mail = getDb().select().from(outbox).where(eq(outbox.toAddress, host.email)).all();
    expect(mail).toHaveLength(1);
    expect(mail[0]!.text).toMatch(/http:\/\/127\.0\.0\.1:3999\/sign-in\/link\?token=[A-Za-z0-9_-]{43}/);
  });

  it('a password reset link sets a new password once, and the old one stops working', async () => {
    const { planner } = makeWorld();
    await requestPasswordReset(null, formData({ email: planner.email }));
    const mail = getDb().select().from(outbox).where(eq(outbox.toAddress, planner.email)).get();
    const token = /token=([A-Za-z0-9_-]+)/.exec(mail!.text)![1]!;
    const mismatch = await resetPassword(null, formData({ token, password: 'new password 1', confirm: 'new password 2' }));
    expect(mismatch).toMatchObject({ ok: false, status: 400, fieldErrors: { confirm: 'The two passwords differ.' } });
    expect(await resetPassword(null, formData({ token, password: 'new password 1', confirm: 'new password 1' }))).toMatchObject({ ok: true });
    expect(bcrypt.compareSync('new password 1', getUserByEmail(planner.email)!.passwordHash!)).toBe(true);
    const reused = await resetPassword(null, formData({ token, password: 'new password 3', confirm: 'new password 3' }));
    expect(reused).toMatchObject({ ok: false, status: 400 });
    expect(bcrypt.compareSync('new password 1', getUserByEmail(planner.email)!.passwordHash!)).toBe(true);
  });
});
