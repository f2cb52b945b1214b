import { and, desc, eq, sql } from 'drizzle-orm';
import ICAL from 'ical.js';
import { beforeAll, describe, expect, it, vi } from 'vitest';
import { getDb } from '@/db';
import { getRailwaySession, listSessionInvitations } from '@/db/queries/invitation-records';
import * as t from '@/db/schema';
import { resetEnvCache } from '@/lib/env';
import { verifyReplyToken, replyExpiry } from '@/lib/invitations/reply-token';
import {
  inviteToSession,
  queueInvitationAgain,
  queueSessionNotices,
  remindable,
  remindAwaitingReply,
  requestSequence,
  saveReplyDeadline,
  sessionStandings,
  standingOf,
} from '@/lib/invitations/send';
import { REMINDER_GAP_MS } from '@/lib/validations/invitation';
import { inviteEveryone, makeSessionWorld } from './authz/invitations';
import { makeWorld } from './world';

// The invitation service (lib/invitations/send.ts) as the outbox and the audit log record it: what is
// queued to whom, with which iTIP METHOD and SEQUENCE (RFC 5546 2.1.4, 3.2.2, 3.2.5; RFC 5545 3.8.7.4),
// which links, and what the host is told. Nothing is sent here: the outbox rows are the result.

process.env.NEXTAUTH_SECRET = 'invitation-queue-test-secret-0123456789';
beforeAll(() => resetEnvCache());

const db = () => getDb();
const BASE = 'http://127.0.0.1:3999'; // NEXTAUTH_URL in tests/integration/setup.ts

function world(options: Parameters<typeof makeSessionWorld>[1] = {}) {
  const w = makeWorld();
  const s = makeSessionWorld(w, options);
  inviteEveryone(w, s.session.id);
  const inv = (userId: string) => listSessionInvitations(s.session.id).find((i) => i.userId === userId)!;
  const send = (kind: 'pending' | 'update' | 'cancel', now?: Date) => queueSessionNotices({ railwayId: w.railway.id, sessionId: s.session.id, host: w.host, kind, now });
  const mailOf = (invitationId: string) => db().select().from(t.outbox).where(eq(t.outbox.invitationId, invitationId)).orderBy(desc(t.outbox.createdAt), desc(sql`rowid`)).all();
  const current = () => getRailwaySession(w.railway.id, s.session.id)!;
  const audit = (action: string) =>
    db()
      .select()
      .from(t.auditLog)
      .where(and(eq(t.auditLog.railwayId, w.railway.id), eq(t.auditLog.action, action)))
      .orderBy(sql`rowid`)
      .all();
  return { w, ...s, inv, send, mailOf, current, audit };
}

/** The calendar part as a calendar client reads it (ical.js). */
function calendarOf(ics: string | null) {
  const vcal = new ICAL.Component(ICAL.parse(ics!));
  const event = vcal.getFirstSubcomponent('vevent')!;
  return { method: vcal.getFirstPropertyValue('method'), sequence: Number(event.getFirstPropertyValue('sequence')), status: event.getFirstPropertyValue('status') };
}

const caught = (fn: () => unknown) => {
  try {
    fn();
  } catch (error) {
    return error as { status: number; message: string; extra: unknown };
  }
  throw new Error('expected a refusal');
};

describe('what each invitee stands to be told', () => {
  it('someone never sent anything is not affected, whatever the session’s SEQUENCE', () => {
    const { w, session, inv } = world();
    const row = inv(w.operator.id);
    const raised = { ...session, sequence: 1 };
    const runs = sessionStandings(session, [row]).get(row.id)!.told.runs;
    expect(runs.map((r) => r.trainName)).toEqual(['Local', 'Local']);
    expect(standingOf(raised, row, [])).toEqual({ told: expect.objectContaining({ runs: [] }), changes: [], affected: false });
    // Inconsistent rows read the same way: no mail counted, or no SEQUENCE noted, is "never sent".
    expect(standingOf(raised, { ...row, mailCount: 1, sentSequence: null }, []).affected).toBe(false);
    expect(standingOf(raised, { ...row, mailCount: 0, sentSequence: 0 }, []).affected).toBe(false);
    // Sent SEQUENCE 0 before snapshots were kept: affected once the session's SEQUENCE is above it.
    expect(standingOf(raised, { ...row, mailCount: 1, sentSequence: 0, sentSnapshot: null }, [])).toMatchObject({ changes: [], affected: true });
    expect(standingOf(session, { ...row, mailCount: 1, sentSequence: 0, sentSnapshot: null }, [])).toMatchObject({ changes: [], affected: false });
  });

  it('the SEQUENCE a REQUEST carries: the session’s for a first invitation, above what they hold for an update, never less (RFC 5546 2.1.4)', () => {
    const { w, session, inv } = world();
    const row = inv(w.operator.id);
    const standing = (affected: boolean) => ({ ...standingOf(session, row, []), affected });
    const seq = (sessionSequence: number, sentSequence: number | null, affected: boolean) =>
      requestSequence({ ...session, sequence: sessionSequence }, { ...row, sentSequence }, standing(affected));
    expect(seq(0, null, true)).toBe(0);
    expect(seq(2, null, false)).toBe(2);
    expect(seq(2, 1, false)).toBe(2);
    expect(seq(0, 3, false)).toBe(3);
    expect(seq(0, 3, true)).toBe(4);
    expect(seq(5, 1, true)).toBe(5);
  });

  it('standings use the runs they are given, and load the session’s own otherwise; an unknown session is 404', () => {
    const { w, session, inv } = world();
    const row = inv(w.operator.id);
    expect(sessionStandings(session, [row], []).get(row.id)!.told.runs).toEqual([]);
    expect(sessionStandings(session, [row]).get(row.id)!.told.runs).toHaveLength(2);
    expect(caught(() => sessionStandings({ ...session, id: 'no-such-session' }, [row]))).toMatchObject({ status: 404, message: 'That session was not found.' });
  });
});

describe('queueing the invitations', () => {
  it('one REQUEST per invitee with their own runs and duties, the host’s name, working reply links and the app’s links', () => {
    const { w, session, inv, send, mailOf, audit } = world();
    const now = new Date();
    expect(send('pending', now)).toEqual({ queued: 3, skipped: 0 });
    const op = inv(w.operator.id);
    const [mail] = mailOf(op.id);
    expect(mail).toMatchObject({
      kind: 'session-invitation',
      dedupeKey: `invitation:${op.id}:0:REQUEST`,
      toAddress: w.operator.email,
      calendarMethod: 'REQUEST',
      subject: expect.stringMatching(/^Invitation: Test running evening \(/),
    });
    expect(calendarOf(mail!.calendar)).toMatchObject({ method: 'REQUEST', sequence: 0 });
    expect(mail!.text).toContain(`${w.host.name} invites you to an operating session.`);
    expect(mail!.text).toContain('- stand-by: Covers cab B.');
    expect(mail!.text).toContain(`Published timetable: ${BASE}/railways/${w.railway.id}/sessions/${session.id}`);
    expect(mail!.text).toContain(`Your runs on your phone: ${BASE}/my-runs`);
    // Each button's link carries the same signed token and its own reply (PARTSTAT, RFC 5545 3.2.12).
    const links = [...mail!.text.matchAll(/^(Accept|Maybe|Decline): (\S+)$/gm)].map((m) => new URL(m[2]!));
    expect(links.map((u) => [u.origin + u.pathname, u.searchParams.get('reply')])).toEqual([
      [`${BASE}/reply`, 'accepted'],
      [`${BASE}/reply`, 'tentative'],
      [`${BASE}/reply`, 'declined'],
    ]);
    const check = verifyReplyToken(links[0]!.searchParams.get('token')!);
    expect(check).toEqual({ ok: true, claim: { railwayId: w.railway.id, invitationId: op.id, nonce: 0, expiresAt: replyExpiry(session.endsAt, now.getTime()) } });
    // The planner's mail has the planner's runs and none of the operator's duties.
    const planner = mailOf(inv(w.planner.id).id)[0]!;
    expect(planner.text).not.toContain('stand-by');
    expect(planner.text).toContain('Your runs (2):');
    expect(inv(w.operator.id)).toMatchObject({ mailCount: 1, sentSequence: 0 });
    expect(audit('send-pending')).toEqual([expect.objectContaining({ userId: w.host.id, entity: 'session', entityId: session.id, detail: { queued: 3, skipped: 0 } })]);
  });

  it('an invitation and a reminder are each marked with their kind in the outbox', async () => {
    // Imported afresh here: the kinds are module-level values, and a mutation test switches its change
    // on only after the test file's own imports have run.
    vi.resetModules();
    const fresh = await import('@/lib/invitations/send');
    const { w, session, inv, mailOf } = world();
    fresh.queueSessionNotices({ railwayId: w.railway.id, sessionId: session.id, host: w.host, kind: 'pending' });
    fresh.remindAwaitingReply({ railwayId: w.railway.id, sessionId: session.id, host: w.host });
    const op = inv(w.operator.id);
    expect(mailOf(op.id).map((m) => m.kind)).toEqual(['session-invitation']);
    expect(db().select().from(t.outbox).where(eq(t.outbox.dedupeKey, `reminder:${op.id}:1`)).get()!.kind).toBe('session-reminder');
  });

  it('"pending" goes only to those never sent anything', () => {
    const { w, session, send, mailOf } = world();
    send('pending');
    const late = w.makeUser('late');
    db().insert(t.invitations).values({ sessionId: session.id, userId: late.id, email: late.email }).run();
    expect(send('pending')).toEqual({ queued: 1, skipped: 0 });
    expect(mailOf(listSessionInvitations(session.id).find((i) => i.userId === late.id)!.id)).toHaveLength(1);
  });

  it('sending one again: a fresh copy with the SEQUENCE the person holds, not an update', () => {
    const { w, session, inv, send, mailOf } = world();
    send('pending');
    const op = inv(w.operator.id);
    expect(queueInvitationAgain({ railwayId: w.railway.id, sessionId: session.id, host: w.host, invitationId: op.id })).toEqual({ requeued: false, queued: 1 });
    const [again] = mailOf(op.id);
    expect(again).toMatchObject({ dedupeKey: `invitation:${op.id}:0:REQUEST:resend-1`, subject: expect.stringMatching(/^Invitation: /) });
    expect(calendarOf(again!.calendar)).toMatchObject({ method: 'REQUEST', sequence: 0 });
    expect(caught(() => queueInvitationAgain({ railwayId: w.railway.id, sessionId: session.id, host: w.host, invitationId: 'no-such-invitation' }))).toMatchObject({
      status: 404,
      message: 'That invitation was not found.',
    });
  });

  it('a cancellation goes to everyone sent something, with a SEQUENCE above the last they hold, and leaves what they were told alone (RFC 5546 3.2.5)', () => {
    const { w, session, runs, inv, send, mailOf, audit } = world();
    send('pending');
    const never = w.makeUser('never-sent');
    db().insert(t.invitations).values({ sessionId: session.id, userId: never.id, email: never.email }).run();
    expect(caught(() => send('cancel'))).toMatchObject({ status: 400, message: 'Only a cancelled session sends a cancellation notice.' });
    // The operator's run moves; their update carries SEQUENCE 1.
    db().update(t.runs).set({ departS: runs[0]!.departS + 600, arriveS: runs[0]!.arriveS + 600 }).where(eq(t.runs.id, runs[0]!.id)).run();
    expect(send('update')).toEqual({ queued: 1, skipped: 0 });
    expect(calendarOf(mailOf(inv(w.operator.id).id)[0]!.calendar).sequence).toBe(1);
    const toldBefore = inv(w.operator.id).sentSnapshot;
    // Cancelled, with the session's SEQUENCE raised (the session page does this); another run moves too.
    db().update(t.runs).set({ departS: runs[2]!.departS + 600, arriveS: runs[2]!.arriveS + 600 }).where(eq(t.runs.id, runs[2]!.id)).run();
    db().update(t.sessions).set({ status: 'cancelled', sequence: 1 }).where(eq(t.sessions.id, session.id)).run();
    expect(send('cancel')).toEqual({ queued: 3, skipped: 0 });
    const op = calendarOf(mailOf(inv(w.operator.id).id)[0]!.calendar);
    expect(op).toEqual({ method: 'CANCEL', sequence: 2, status: 'CANCELLED' }); // held 1
    expect(calendarOf(mailOf(inv(w.host.id).id)[0]!.calendar)).toMatchObject({ method: 'CANCEL', sequence: 1 }); // held 0
    expect(mailOf(inv(never.id).id)).toEqual([]);
    expect(inv(w.operator.id)).toMatchObject({ sentSequence: 2, sentSnapshot: toldBefore });
    // Pressing "send" again queues nothing twice.
    expect(send('cancel')).toEqual({ queued: 0, skipped: 3 });
    expect(audit('send-cancel').map((a) => a.detail)).toEqual([{ queued: 3, skipped: 0 }, { queued: 0, skipped: 3 }]);
    // One cancellation again, to someone sent one; none to someone never sent anything.
    const opId = inv(w.operator.id).id;
    expect(queueInvitationAgain({ railwayId: w.railway.id, sessionId: session.id, host: w.host, invitationId: opId })).toEqual({ requeued: false, queued: 1 });
    expect(mailOf(opId)[0]).toMatchObject({ calendarMethod: 'CANCEL', dedupeKey: `invitation:${opId}:1:CANCEL:resend-3` });
    expect(caught(() => queueInvitationAgain({ railwayId: w.railway.id, sessionId: session.id, host: w.host, invitationId: inv(never.id).id }))).toMatchObject({
      status: 400,
      message: 'Nothing was sent to this person, so there is nothing to cancel.',
    });
  });

  it('refuses a session that is not published and running ahead, or not found', () => {
    const { w, session, send } = world();
    expect(caught(() => queueSessionNotices({ railwayId: w.otherRailway.id, sessionId: session.id, host: w.host, kind: 'pending' }))).toMatchObject({
      status: 404,
      message: 'That session was not found.',
    });
    // Over when its end is reached, not after (common practice: an event ending now is over).
    expect(caught(() => send('pending', session.endsAt))).toMatchObject({ status: 400, message: 'This session is over; there is nothing to invite to.' });
    expect(send('pending', new Date(session.endsAt.getTime() - 1))).toEqual({ queued: 3, skipped: 0 });
    db().update(t.sessions).set({ status: 'draft' }).where(eq(t.sessions.id, session.id)).run();
    expect(caught(() => send('pending'))).toMatchObject({ status: 400, message: 'Publish the session before inviting the crew.' });
    db().update(t.sessions).set({ status: 'cancelled' }).where(eq(t.sessions.id, session.id)).run();
    expect(caught(() => send('pending'))).toMatchObject({
      status: 400,
      message: 'This session is cancelled: send the cancellation notice instead of invitations.',
    });
  });
});

describe('inviting people', () => {
  it('members by id and guests by address: a member’s or known user’s address is that person, a new address a new account named by its local part', () => {
    const w = makeWorld();
    const { session } = makeSessionWorld(w); // the operator is invited already
    const result = inviteToSession({
      railwayId: w.railway.id,
      sessionId: session.id,
      host: w.host,
      userIds: [w.planner.id, w.operator.id],
      guestEmails: ['fresh-guest@example.org', w.host.email, w.outsider.email],
    });
    expect(result).toEqual({ invited: 4, alreadyInvited: 1, queued: 4 });
    const rows = listSessionInvitations(session.id);
    expect(rows.map((r) => r.userId).sort()).toEqual(
      [w.operator.id, w.planner.id, w.host.id, w.outsider.id, db().select().from(t.users).where(eq(t.users.email, 'fresh-guest@example.org')).get()!.id].sort(),
    );
    expect(rows.find((r) => r.email === 'fresh-guest@example.org')!.name).toBe('fresh-guest');
    expect(rows.filter((r) => r.mailCount === 1).map((r) => r.userId)).not.toContain(w.operator.id);
    const [entry] = db().select().from(t.auditLog).where(and(eq(t.auditLog.railwayId, w.railway.id), eq(t.auditLog.action, 'invite'))).all();
    expect(entry).toMatchObject({ userId: w.host.id, entity: 'session', entityId: session.id, detail: { invited: 4, alreadyInvited: 1, newAccounts: 1 } });
  });

  it('refuses someone who is not a member, naming the field', () => {
    const w = makeWorld();
    const { session } = makeSessionWorld(w);
    expect(caught(() => inviteToSession({ railwayId: w.railway.id, sessionId: session.id, host: w.host, userIds: [w.outsider.id], guestEmails: [] }))).toMatchObject({
      status: 400,
      message: 'Some of the people picked are not members of this railway.',
      extra: { issues: [{ path: 'userIds', message: 'Pick members of this railway only.' }] },
    });
    expect(listSessionInvitations(session.id)).toHaveLength(1);
  });
});

describe('reminders and the reply deadline', () => {
  it('a reminder may go to someone sent an invitation, with no reply, not reminded within the gap (20 h)', () => {
    const now = new Date('2026-12-10T12:00:00Z');
    const row = (reply: string, mailCount: number, remindedAgoMs: number | null) => ({ reply, mailCount, remindedAt: remindedAgoMs === null ? null : new Date(now.getTime() - remindedAgoMs) });
    const list = [row('accepted', 1, null), row('needs-action', 0, null), row('needs-action', 1, null), row('needs-action', 1, REMINDER_GAP_MS), row('needs-action', 1, REMINDER_GAP_MS - 1)];
    expect(remindable(list, now)).toEqual([list[2], list[3]]);
  });

  it('queues a plain reminder per person due, counts those reminded too recently, and records it', () => {
    const { w, session, inv, send, audit } = world();
    send('pending');
    const never = w.makeUser('never-sent');
    db().insert(t.invitations).values({ sessionId: session.id, userId: never.id, email: never.email }).run();
    const remind = (now?: Date) => remindAwaitingReply({ railwayId: w.railway.id, sessionId: session.id, host: w.host, now });
    expect(remind()).toEqual({ queued: 3, tooSoon: 0 });
    const op = inv(w.operator.id);
    const [reminder] = db().select().from(t.outbox).where(eq(t.outbox.dedupeKey, `reminder:${op.id}:1`)).all();
    expect(reminder).toMatchObject({ kind: 'session-reminder', invitationId: null, calendar: null, toAddress: w.operator.email });
    expect(remind()).toEqual({ queued: 0, tooSoon: 3 });
    expect(audit('remind').map((a) => [a.userId, a.entity, a.entityId, a.detail])).toEqual([
      [w.host.id, 'session', session.id, { queued: 3, skipped: 0, tooSoon: 0 }],
      [w.host.id, 'session', session.id, { queued: 0, skipped: 0, tooSoon: 3 }],
    ]);
  });

  it('a deadline must lie ahead and no later than the start; it is read in the session’s zone, and cleared with nothing', () => {
    // Europe/Berlin goes from CET to CEST at 02:00 on 28 March 2027 (EU summer time, last Sunday of
    // March; IANA tz database): 02:30 that night does not exist there.
    const { w, session, current, audit } = world({ startsAt: new Date('2027-04-02T16:00:00Z'), timeZone: 'Europe/Berlin' });
    const save = (replyBy: string, now?: Date) => saveReplyDeadline({ railwayId: w.railway.id, sessionId: session.id, host: w.host, replyBy, now });
    const field = (message: string) => ({ status: 400, message, extra: { issues: [{ path: 'replyBy', message }] } });
    expect(caught(() => save('2027-03-28T02:30'))).toMatchObject(field('That time does not exist in Europe/Berlin (the clocks skip it).'));
    // 18:00 CEST (UTC+2) is the start, 16:00Z.
    expect(caught(() => save('2027-04-02T18:01'))).toMatchObject(field('Choose a time no later than the session’s start.'));
    expect(caught(() => save('2027-03-30T10:00', new Date('2027-03-30T08:00:00Z')))).toMatchObject(field('Choose a time that is still ahead.'));
    expect(current().replyBy).toBeNull();
    expect(save('2027-03-30T10:00', new Date('2027-03-30T07:59:59.999Z'))).toEqual({ replyBy: new Date('2027-03-30T08:00:00Z') });
    expect(save('2027-04-02T18:00')).toEqual({ replyBy: new Date('2027-04-02T16:00:00Z') });
    expect(current().replyBy).toEqual(new Date('2027-04-02T16:00:00Z'));
    expect(save('')).toEqual({ replyBy: null });
    expect(current().replyBy).toBeNull();
    expect(audit('reply-deadline').map((a) => [a.userId, a.entity, a.entityId, a.detail])).toEqual([
      [w.host.id, 'session', session.id, { replyBy: '2027-03-30T08:00:00.000Z' }],
      [w.host.id, 'session', session.id, { replyBy: '2027-04-02T16:00:00.000Z' }],
      [w.host.id, 'session', session.id, { replyBy: null }],
    ]);
  });
});
