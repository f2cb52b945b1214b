// Issue 10, finding 11: sessions end. The real lib/current-user.ts is used here (the other
// integration tests replace it); only next-auth's reading of the cookie is stood in for, with the
// session next-auth would decode from it — built by our own jwt and session callbacks.
import type { Session } from 'next-auth';
import type { JWT } from 'next-auth/jwt';
import { beforeEach, describe, expect, it, vi } from 'vitest';
import { resetPassword } from '@/app/(auth)/reset-password/actions';
import { signOutEverywhere } from '@/app/(app)/railways/actions';
import { authOptions } from '@/lib/auth-options';
import { issueAuthToken, spendAuthToken } from '@/lib/tokens';
import { signInAs } from './caller';
import { formData, makeWorld } from './world';

const cookie: { session: Session | null } = { session: null };
vi.mock('next-auth', async (original) => ({ ...(await original<typeof import('next-auth')>()), getServerSession: async () => cookie.session }));

type Authorize = (c: Record<string, string>) => Promise<{ id: string; email: string; name: string; sessionVersion?: number } | null>;
const linkSignIn = () =>
  (authOptions.providers as unknown as { options: { id: string; authorize: Authorize } }[]).find((p) => p.options.id === 'link')!.options.authorize;

/** Signs in with a sign-in link and returns what the cookie would then carry (token and session). */
async function signedInCookie(userId: string) {
  const user = await linkSignIn()({ token: issueAuthToken(userId, 'sign-in') });
  const token = (await authOptions.callbacks!.jwt!({ token: { sub: undefined } as JWT, user: user!, account: null, trigger: 'signIn' } as never)) as JWT;
  const session = (await authOptions.callbacks!.session!({ session: { user: {}, expires: '' } as Session, token, user: user! } as never)) as Session;
  return { token, session };
}

async function realCurrentUser(session: Session | null) {
  cookie.session = session;
  const { currentUser } = await vi.importActual<typeof import('@/lib/current-user')>('@/lib/current-user');
  return currentUser();
}

beforeEach(() => signInAs(null));

describe('finding 11: sessions cannot be ended', () => {
  it('finding 11: a password reset ends every earlier session and every outstanding sign-in or reset link', async () => {
    const { operator } = makeWorld();
    const laptop = await signedInCookie(operator.id);
    const phone = await signedInCookie(operator.id);
    expect(await realCurrentUser(laptop.session)).toMatchObject({ id: operator.id });
    const pendingLink = issueAuthToken(operator.id, 'sign-in');
    const otherReset = issueAuthToken(operator.id, 'reset-password');

    const reset = issueAuthToken(operator.id, 'reset-password');
    expect(await resetPassword(null, formData({ token: reset, password: 'a brand new password', confirm: 'a brand new password' }))).toMatchObject({ ok: true });

    expect(await realCurrentUser(laptop.session)).toBeNull();
    expect(await realCurrentUser(phone.session)).toBeNull();
    expect(spendAuthToken(pendingLink, 'sign-in')).toBeNull();
    expect(spendAuthToken(otherReset, 'reset-password')).toBeNull();
    // A session signed in after the reset works.
    expect(await realCurrentUser((await signedInCookie(operator.id)).session)).toMatchObject({ id: operator.id });
  });

  it('finding 11: a cookie replayed after sign-out grants nothing; other sessions go on', async () => {
    const { planner } = makeWorld();
    const laptop = await signedInCookie(planner.id);
    const phone = await signedInCookie(planner.id);
    await authOptions.events!.signOut!({ token: laptop.token, session: laptop.session } as never);
    expect(await realCurrentUser(laptop.session)).toBeNull();
    expect(await realCurrentUser(phone.session)).toMatchObject({ id: planner.id });
  });

  it('finding 11: "sign out everywhere" ends every session of the account and its outstanding links', async () => {
    const { host } = makeWorld();
    const laptop = await signedInCookie(host.id);
    const pendingLink = issueAuthToken(host.id, 'sign-in');
    signInAs(host);
    await expect(signOutEverywhere(null, formData({}))).rejects.toMatchObject({ digest: expect.stringMatching(/^NEXT_REDIRECT/) });
    expect(await realCurrentUser(laptop.session)).toBeNull();
    expect(spendAuthToken(pendingLink, 'sign-in')).toBeNull();
  });
});
