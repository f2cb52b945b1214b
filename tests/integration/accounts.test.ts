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
import { inviteMember } from '@/app/(app)/railways/[railwayId]/members/actions';
import { replyToMemberOffer } from '@/app/(app)/railways/actions';
import { listMemberInvitationsFor } from '@/db/queries/member-invitations';
import { getMembership } from '@/db/queries/memberships';
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
  it('creates an account whose password then signs in, stored only as a bcrypt hash (once the e-mailed link confirms it: issue 10, finding 8)', async () => {
    const state = await signUp(null, formData({ name: 'Ada', email: 'Ada@Test.Example', password: 'correct horse battery' }));
    expect(state).toMatchObject({ ok: true });
    await confirmFromMail('ada@test.example');
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

  it('makes no second account for the same address (and, issue 10 finding 9, answers as for a new one)', async () => {
    await signUp(null, formData({ name: 'Bo', email: 'bo@test.example', password: 'long enough pw' }));
    await confirmFromMail('bo@test.example');
    const again = await signUp(null, formData({ name: 'Bo2', email: 'BO@test.example', password: 'another long pw' }));
    expect(again).toMatchObject({ ok: true });
    expect(getDb().select().from(users).where(eq(users.email, 'bo@test.example')).all()).toHaveLength(1);
    expect(await provider('password')({ email: 'bo@test.example', password: 'long enough pw' })).not.toBeNull();
  });
});

/** Follows the latest sign-up link mailed to this address, as its owner would. */
async function confirmFromMail(address: string) {
  const mail = getDb().select().from(outbox).all().filter((m) => m.toAddress === address && m.kind === 'sign-up').at(-1);
  const token = /token=([A-Za-z0-9_-]+)/.exec(mail?.text ?? '')?.[1];
  expect(token).toBeTruthy();
  return provider('sign-up')({ token: token! });
}

describe('issue 10, findings 8 and 9: sign-up proves the address', () => {
  it("finding 8: an account registered in someone else's name collects nothing: no password works until the address's owner confirms", async () => {
    const w = makeWorld();
    // The attacker signs up first with the victim's address and their own password.
    expect(await signUp(null, formData({ name: 'Not Victor', email: 'victor@test.example', password: 'attacker password' }))).toMatchObject({ ok: true });
    expect(await provider('password')({ email: 'victor@test.example', password: 'attacker password' })).toBeNull();
    // A host offers the address membership: nothing attaches to an unproved account.
    signInAs(w.host);
    await inviteMember(w.railway.id, null, formData({ email: 'victor@test.example', role: 'operator' }));
    const victim = getUserByEmail('victor@test.example')!;
    expect(victim.emailVerifiedAt).toBeNull();
    signInAs({ id: victim.id, email: victim.email, name: victim.name });
    const [offer] = listMemberInvitationsFor(victim.email);
    expect(await replyToMemberOffer(null, formData({ invitationId: offer!.id, reply: 'accept' }))).toMatchObject({ ok: false, status: 403 });
    expect(getMembership(w.railway.id, victim.id)).toBeUndefined();
    // The real owner signs up and confirms from their mailbox: their password, not the attacker's.
    signInAs(null);
    await signUp(null, formData({ name: 'Victor', email: 'victor@test.example', password: 'victors own password' }));
    const mails = getDb().select().from(outbox).all().filter((m) => m.toAddress === 'victor@test.example' && m.kind === 'sign-up');
    expect(mails).toHaveLength(2);
    const ownToken = /token=([A-Za-z0-9_-]+)/.exec(mails[1]!.text)![1]!;
    expect(await provider('sign-up')({ token: ownToken })).toMatchObject({ id: victim.id });
    expect(await provider('password')({ email: 'victor@test.example', password: 'victors own password' })).toMatchObject({ id: victim.id });
    expect(await provider('password')({ email: 'victor@test.example', password: 'attacker password' })).toBeNull();
  });

  it('finding 9: sign-up answers the same whether or not the address has an account', async () => {
    const { host } = makeWorld();
    getDb().update(users).set({ passwordHash: await bcrypt.hash('the host password', 4) }).where(eq(users.id, host.id)).run();
    const known = await signUp(null, formData({ name: 'Someone', email: host.email, password: 'any long password' }));
    const unknown = await signUp(null, formData({ name: 'Someone', email: 'brand-new@test.example', password: 'any long password' }));
    expect(known).toMatchObject({ ok: true });
    expect(unknown).toMatchObject({ ok: true });
    expect(known && known.ok && known.message?.replace(host.email, 'X')).toBe(unknown && unknown.ok && unknown.message?.replace('brand-new@test.example', 'X'));
    // The owner hears of it; their password is unchanged.
    expect(getDb().select().from(outbox).all().some((m) => m.toAddress === host.email && m.kind === 'sign-up-exists')).toBe(true);
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
