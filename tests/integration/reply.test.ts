import crypto from 'node:crypto';
import { and, eq, sql } from 'drizzle-orm';
import { beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { replyToInvitation } from '@/app/(app)/my-runs/actions';
import { replyByToken } from '@/app/(public)/reply/actions';
import { inviteCrew } from '@/app/(app)/railways/[railwayId]/sessions/[sessionId]/invitations/actions';
import { getDb } from '@/db';
import { listSessionInvitations } from '@/db/queries/invitation-records';
import * as t from '@/db/schema';
import { resetEnvCache } from '@/lib/env';
import { inspectReplyToken, isLate, recordOwnReply, recordReply } from '@/lib/invitations/reply';
import { replyExpiry, signReplyToken, verifyReplyToken } from '@/lib/invitations/reply-token';
import { resetRateLimits } from '@/lib/rate-limit';
import { makeSessionWorld } from './authz/invitations';
import { signInAs } from './caller';
import { formData, makeWorld } from './world';

process.env.NEXTAUTH_SECRET = 'reply-test-secret-0123456789abcdef';

beforeAll(() => resetEnvCache());
beforeEach(() => {
  resetRateLimits();
  signInAs(null); // reply links work without signing in
});

function setup(options: Parameters<typeof makeSessionWorld>[1] = {}) {
  const w = makeWorld();
  const s = makeSessionWorld(w, options);
  const tokenFor = (invitationId = s.invitation.id, over: Partial<Parameters<typeof signReplyToken>[0]> = {}) =>
    signReplyToken({ railwayId: w.railway.id, invitationId, nonce: 0, expiresAt: s.session.endsAt.getTime(), ...over });
  return { w, ...s, tokenFor };
}

const reply = (token: string, choice: string) => replyByToken(null, formData({ token, reply: choice }));

describe('replying with a link, without signing in', () => {
  it('records the reply, which the host’s tracker shows at once', async () => {
    const { session, invitation, tokenFor } = setup();
    const state = await reply(tokenFor(), 'accepted');
    expect(state).toMatchObject({ ok: true, data: { reply: 'accepted', sessionTitle: 'Test running evening' } });
    const row = listSessionInvitations(session.id).find((i) => i.id === invitation.id)!;
    expect(row.reply).toBe('accepted');
    expect(row.respondedAt).toBeInstanceOf(Date);
    expect(row.replyNonce).toBe(1);
  });

  it('opening the link changes nothing (a mail scanner cannot reply for the reader)', () => {
    const { session, invitation, tokenFor } = setup();
    expect(inspectReplyToken(tokenFor())).toMatchObject({ ok: true });
    expect(listSessionInvitations(session.id).find((i) => i.id === invitation.id)).toMatchObject({ reply: 'needs-action', replyNonce: 0 });
  });

  it('a link works once per reply change; the fresh link from the reply page changes it again', async () => {
    const { tokenFor } = setup();
    const token = tokenFor();
    const first = await reply(token, 'accepted');
    expect(first).toMatchObject({ ok: true });
    expect(await reply(token, 'declined')).toMatchObject({ ok: false, status: 409, error: expect.stringMatching(/already used/) });
    expect(await reply(token, 'accepted')).toMatchObject({ ok: false, status: 409 });
    const next = first?.ok ? first.data!.nextToken : '';
    expect(await reply(next, 'tentative')).toMatchObject({ ok: true, data: { reply: 'tentative' } });
    expect(await reply(next, 'declined')).toMatchObject({ ok: false, status: 409 });
  });

  it('refuses a forged token: a changed signature, another secret, or a made-up string', async () => {
    const { tokenFor, invitation, session, w } = setup();
    const token = tokenFor();
    const [payload, sig] = token.split('.') as [string, string];
    const flipped = `${payload}.${sig[0] === 'A' ? 'B' : 'A'}${sig.slice(1)}`;
    expect(await reply(flipped, 'accepted')).toMatchObject({ ok: false, status: 400, error: expect.stringMatching(/not valid/) });
    const claim = [w.railway.id, invitation.id, '0', String(session.endsAt.getTime())].join('\n');
    const otherSecret = crypto.createHmac('sha256', 'some-other-secret-0123456789').update(`fishplate-rsvp\n${claim}`).digest('base64url');
    expect(await reply(`${Buffer.from(claim).toString('base64url')}.${otherSecret}`, 'accepted')).toMatchObject({ ok: false, status: 400 });
    expect(await reply('x'.repeat(40), 'accepted')).toMatchObject({ ok: false, status: 400 });
    expect(listSessionInvitations(session.id)[0]!.reply).toBe('needs-action');
  });

  it('refuses a token reused for another invitation (the id swapped, the signature kept)', async () => {
    const { w, session, tokenFor } = setup();
    const other = getDb().insert(t.invitations).values({ sessionId: session.id, userId: w.planner.id, email: w.planner.email }).returning().get();
    const [, sig] = tokenFor().split('.') as [string, string];
    const swapped = Buffer.from([w.railway.id, other.id, '0', String(session.endsAt.getTime())].join('\n')).toString('base64url');
    expect(await reply(`${swapped}.${sig}`, 'accepted')).toMatchObject({ ok: false, status: 400 });
    expect(getDb().select().from(t.invitations).where(eq(t.invitations.id, other.id)).get()!.reply).toBe('needs-action');
  });

  it('refuses an expired token', async () => {
    const { tokenFor } = setup();
    const expired = tokenFor(undefined, { expiresAt: Date.now() - 1000 });
    expect(verifyReplyToken(expired)).toEqual({ ok: false, reason: 'expired' });
    expect(await reply(expired, 'accepted')).toMatchObject({ ok: false, status: 400, error: 'This reply link has expired.' });
  });

  it('refuses another railway’s token: signed for railway B, pointing at railway A’s invitation', async () => {
    const { w, tokenFor } = setup();
    const crossed = tokenFor(undefined, { railwayId: w.otherRailway.id });
    expect(verifyReplyToken(crossed)).toMatchObject({ ok: true }); // the signature is ours…
    expect(await reply(crossed, 'accepted')).toMatchObject({ ok: false, status: 400 }); // …but the railway does not match
  });

  it('refuses replies to a cancelled session', async () => {
    const { session, tokenFor } = setup();
    getDb().update(t.sessions).set({ status: 'cancelled', sequence: 1 }).where(eq(t.sessions.id, session.id)).run();
    expect(await reply(tokenFor(), 'accepted')).toMatchObject({ ok: false, status: 400 });
  });

  it('refuses a reply that is not accept, maybe or decline', async () => {
    const { tokenFor } = setup();
    expect(await reply(tokenFor(), 'needs-action')).toMatchObject({ ok: false, status: 400, fieldErrors: { reply: expect.any(String) } });
  });

  it('limits attempts per invitation (429 after ten a minute)', async () => {
    const { tokenFor } = setup();
    const stale = tokenFor(undefined, { nonce: 99 });
    for (let i = 0; i < 10; i++) expect(await reply(stale, 'accepted')).toMatchObject({ ok: false, status: 409 });
    expect(await reply(stale, 'accepted')).toMatchObject({ ok: false, status: 429 });
  });

  it('a guest who accepts becomes an operator of the railway; one who declines does not', async () => {
    const { w, session } = setup();
    signInAs(w.host);
    await inviteCrew(w.railway.id, session.id, null, formData({ guestEmails: 'yes-guest@example.org no-guest@example.org' }));
    signInAs(null);
    const rows = listSessionInvitations(session.id);
    const tokenOf = (email: string) =>
      signReplyToken({ railwayId: w.railway.id, invitationId: rows.find((r) => r.email === email)!.id, nonce: 0, expiresAt: session.endsAt.getTime() });
    expect(await reply(tokenOf('yes-guest@example.org'), 'accepted')).toMatchObject({ ok: true, data: { joined: true } });
    expect(await reply(tokenOf('no-guest@example.org'), 'declined')).toMatchObject({ ok: true, data: { joined: false } });
    const roleOf = (email: string) => {
      const user = getDb().select().from(t.users).where(eq(t.users.email, email)).get()!;
      return getDb().select().from(t.memberships).where(and(eq(t.memberships.userId, user.id), eq(t.memberships.railwayId, w.railway.id))).get()?.role;
    };
    expect(roleOf('yes-guest@example.org')).toBe('operator');
    expect(roleOf('no-guest@example.org')).toBeUndefined();
  });

  it('a reply on My runs stops the e-mail’s links (the nonce moved on)', async () => {
    const { w, invitation, tokenFor } = setup();
    const token = tokenFor();
    signInAs(w.operator);
    expect(await replyToInvitation(invitation.id, null, formData({ reply: 'declined' }))).toMatchObject({ ok: true });
    signInAs(null);
    expect(await reply(token, 'accepted')).toMatchObject({ ok: false, status: 409 });
    expect(getDb().select().from(t.invitations).where(eq(t.invitations.id, invitation.id)).get()!.reply).toBe('declined');
  });

  it('on My runs nobody can reply to someone else’s invitation', async () => {
    const { w, invitation } = setup();
    signInAs(w.planner);
    expect(await replyToInvitation(invitation.id, null, formData({ reply: 'declined' }))).toMatchObject({ ok: false, status: 404 });
    signInAs(w.operator);
    expect(await replyToInvitation(invitation.id, null, formData({ reply: 'maybe' }))).toMatchObject({ ok: false, status: 400 });
  });
});

describe('the reply service, as it answers and records', () => {
  const REFUSED_LINK = 'This reply link is not valid. Use the buttons in the latest invitation e-mail.';
  const auditOf = (invitationId: string) =>
    getDb().select().from(t.auditLog).where(and(eq(t.auditLog.entity, 'invitation'), eq(t.auditLog.entityId, invitationId))).orderBy(sql`rowid`).all();

  it('a reply is late only strictly after the deadline, and only when both times are known', () => {
    const deadline = new Date('2026-12-10T18:00:00Z');
    expect(isLate(deadline, new Date(deadline.getTime() + 1))).toBe(true);
    expect(isLate(deadline, new Date(deadline.getTime()))).toBe(false);
    expect(isLate(deadline, new Date(deadline.getTime() - 1))).toBe(false);
    expect(isLate(deadline, null)).toBe(false);
    expect(isLate(null, new Date(deadline.getTime() + 1))).toBe(false);
  });

  it('opening a link says exactly what is wrong with it, or what it points at', () => {
    const { w, session, invitation, tokenFor } = setup();
    expect(inspectReplyToken('x'.repeat(40))).toEqual({ ok: false, error: REFUSED_LINK });
    expect(inspectReplyToken(tokenFor(undefined, { expiresAt: Date.now() - 1000 }))).toEqual({ ok: false, error: 'This reply link has expired.' });
    expect(inspectReplyToken(tokenFor(undefined, { railwayId: w.otherRailway.id }))).toEqual({ ok: false, error: REFUSED_LINK });
    expect(inspectReplyToken(tokenFor('no-such-invitation'))).toEqual({ ok: false, error: REFUSED_LINK });
    expect(inspectReplyToken(tokenFor(undefined, { nonce: 1 }))).toEqual({
      ok: false,
      error: 'This reply link was already used. Your reply is recorded; sign in to change it, or use the buttons shown after your last reply.',
      current: 'needs-action',
    });
    expect(inspectReplyToken(tokenFor())).toMatchObject({
      ok: true,
      found: { invitation: { id: invitation.id, replyNonce: 0 }, session: { id: session.id }, railwayName: 'Test railway', inviteeName: w.operator.name },
    });
  });

  it('a reply by link: the result, a fresh token for the next change, and the audit entry', () => {
    const { w, session, invitation, tokenFor } = setup();
    const now = new Date();
    const result = recordReply(tokenFor(), 'tentative', now);
    expect(result).toEqual({ reply: 'tentative', sessionTitle: 'Test running evening', railwayName: 'Test railway', joined: false, nextToken: expect.any(String), late: false });
    expect(verifyReplyToken(result.nextToken, now.getTime())).toEqual({
      ok: true,
      claim: { railwayId: w.railway.id, invitationId: invitation.id, nonce: 1, expiresAt: replyExpiry(session.endsAt, now.getTime()) },
    });
    expect(listSessionInvitations(session.id)[0]!.comment).toBe('');
    recordReply(result.nextToken, 'accepted', now, 'Bringing a cab');
    expect(auditOf(invitation.id).map((a) => [a.railwayId, a.userId, a.action, a.detail])).toEqual([
      [w.railway.id, w.operator.id, 'reply', { reply: 'tentative', via: 'link', joined: false, late: false, comment: false }],
      [w.railway.id, w.operator.id, 'reply', { reply: 'accepted', via: 'link', joined: false, late: false, comment: true }],
    ]);
    getDb().update(t.sessions).set({ status: 'cancelled' }).where(eq(t.sessions.id, session.id)).run();
    expect(() => recordReply(tokenFor(undefined, { nonce: 2 }), 'declined', now)).toThrow(
      expect.objectContaining({ status: 400, message: 'This session is not open for replies (it was cancelled or withdrawn).' }),
    );
  });

  it('a reply on My runs: the result, the audit entry, and refusals', () => {
    const { w, session, invitation } = setup();
    expect(recordOwnReply({ userId: w.operator.id, invitationId: invitation.id, reply: 'declined' })).toEqual({ reply: 'declined' });
    expect(auditOf(invitation.id).map((a) => [a.railwayId, a.userId, a.action, a.detail])).toEqual([
      [w.railway.id, w.operator.id, 'reply', { reply: 'declined', via: 'my-runs' }],
    ]);
    expect(() => recordOwnReply({ userId: w.planner.id, invitationId: invitation.id, reply: 'accepted' })).toThrow(
      expect.objectContaining({ status: 404, message: 'That invitation was not found.' }),
    );
    getDb().update(t.sessions).set({ status: 'cancelled' }).where(eq(t.sessions.id, session.id)).run();
    expect(() => recordOwnReply({ userId: w.operator.id, invitationId: invitation.id, reply: 'accepted' })).toThrow(
      expect.objectContaining({ status: 400, message: 'This session is not open for replies.' }),
    );
  });
});
