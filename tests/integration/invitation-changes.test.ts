import { eq } from 'drizzle-orm';
import ICAL from 'ical.js';
import { simpleParser } from 'mailparser';
import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { PATCH } from '@/app/api/sessions/[sessionId]/runs/[runId]/route';
import { remindCrew, sendNotices, setReplyDeadline } from '@/app/(app)/railways/[railwayId]/sessions/[sessionId]/invitations/actions';
import { getDb } from '@/db';
import { getRailwaySession, listSessionInvitations } from '@/db/queries/invitation-records';
import * as t from '@/db/schema';
import { personalFeed } from '@/lib/calendar/feeds';
import { resetEnvCache } from '@/lib/env';
import { formatInZone } from '@/lib/time-zone';
import { isLate } from '@/lib/invitations/reply';
import { sessionStandings } from '@/lib/invitations/send';
import { startLocalMailServer } from '@/lib/mail/local-server';
import { deliverDueMail } from '@/lib/mail/outbox';
import { closeTransport } from '@/lib/mail/transport';
import { inviteEveryone, makeSessionWorld } from './authz/invitations';
import { signInAs } from './caller';
import { formData, makeWorld } from './world';

process.env.NEXTAUTH_SECRET = 'invitation-changes-test-secret-0123456789';

let server: Awaited<ReturnType<typeof startLocalMailServer>>;
beforeAll(async () => {
  resetEnvCache();
  server = await startLocalMailServer(0);
});
beforeEach(() => {
  process.env.LOCAL_SMTP_ACTUAL_PORT = String(server.port);
});
afterAll(async () => {
  closeTransport();
  await new Promise<void>((resolve) => server.close(() => resolve()));
});

const db = () => getDb();
const caughtFor = (address: string) =>
  db()
    .select()
    .from(t.caughtMail)
    .all()
    .filter((m) => m.toAddresses.includes(`,${address},`))
    .sort((a, b) => a.receivedAt.getTime() - b.receivedAt.getTime());

async function deliverAll() {
  for (let i = 0; i < 20; i++) {
    const r = await deliverDueMail(50);
    if (r.sent === 0 && r.failed === 0) return;
  }
}

/** The mail as a calendar client reads it: the text part, and the VEVENT of its text/calendar part, parsed by ical.js. */
async function read(raw: string) {
  const parsed = await simpleParser(raw);
  const ics = parsed.attachments.find((a) => a.contentType === 'text/calendar')!.content.toString('utf8');
  const vcal = new ICAL.Component(ICAL.parse(ics));
  const event = vcal.getFirstSubcomponent('vevent')!;
  return {
    subject: parsed.subject ?? '',
    text: parsed.text ?? '',
    method: vcal.getFirstPropertyValue('method'),
    uid: String(event.getFirstPropertyValue('uid')),
    sequence: Number(event.getFirstPropertyValue('sequence')),
    stamp: (event.getFirstPropertyValue('dtstamp') as ICAL.Time).toJSDate(),
    start: (event.getFirstPropertyValue('dtstart') as ICAL.Time).toJSDate(),
  };
}

const ctx = <P>(params: P) => ({ params: Promise.resolve(params) });
async function patchRun(sessionId: string, runId: string, body: Record<string, unknown>) {
  const version = db().select().from(t.runs).where(eq(t.runs.id, runId)).get()!.version;
  const res = await PATCH(
    new Request(`http://127.0.0.1:3999/api/sessions/${sessionId}/runs/${runId}`, {
      method: 'PATCH',
      headers: { 'content-type': 'application/json' },
      body: JSON.stringify({ version, ...body }),
    }),
    ctx({ sessionId, runId }),
  );
  expect(res.status).toBe(200);
}

/** The world's session with the operator, planner and host invited and their invitations sent and delivered. */
async function invitedAndSent() {
  const w = makeWorld();
  const s = makeSessionWorld(w);
  inviteEveryone(w, s.session.id);
  signInAs(w.host);
  expect(await sendNotices(w.railway.id, s.session.id, null, formData({ kind: 'pending' }))).toMatchObject({ ok: true, message: '3 invitations queued.' });
  await deliverAll();
  return { w, ...s };
}

function standings(railwayId: string, sessionId: string) {
  const session = getRailwaySession(railwayId, sessionId)!;
  const invitations = listSessionInvitations(sessionId);
  const map = sessionStandings(session, invitations);
  return new Map(invitations.map((i) => [i.email, map.get(i.id)!]));
}

describe('changes after the invitations', () => {
  it('nothing changed: no one is affected and "update" sends nothing', async () => {
    const { w, session } = await invitedAndSent();
    expect([...standings(w.railway.id, session.id).values()].map((s) => s.affected)).toEqual([false, false, false]);
    expect(await sendNotices(w.railway.id, session.id, null, formData({ kind: 'update' }))).toMatchObject({ ok: true, message: 'Nothing to send: every update was already queued.' });
  });

  it('moving, re-cabbing and handing over runs affects exactly the people whose runs changed; the update says what changed, with a higher SEQUENCE', async () => {
    const { w, session, runs, cabs } = await invitedAndSent();
    signInAs(w.planner);
    // The operator's first run (06:20 fast) leaves 600 real s later: 4 × 600 s = 40 fast min → 07:00 (ratio 4, fast start 06:00).
    await patchRun(session.id, runs[0]!.id, { departS: runs[0]!.departS + 600 });
    // The planner's 07:00 run goes to cab B; the operator's 07:40 run is handed to the planner.
    await patchRun(session.id, runs[1]!.id, { cabId: cabs.cabB.id });
    await patchRun(session.id, runs[2]!.id, { operatorId: w.planner.id });

    const now = standings(w.railway.id, session.id);
    const op = now.get(w.operator.email)!;
    const planner = now.get(w.planner.email)!;
    expect(op.affected).toBe(true);
    expect(op.changes.map((c) => c.kind).sort()).toEqual(['run-changed', 'run-removed']);
    expect(planner.affected).toBe(true);
    expect(planner.changes.map((c) => c.kind).sort()).toEqual(['run-added', 'run-changed']);
    expect(now.get(w.host.email)!.affected).toBe(false); // no runs, session unchanged

    signInAs(w.host);
    expect(await sendNotices(w.railway.id, session.id, null, formData({ kind: 'update' }))).toMatchObject({ ok: true, message: '2 updates queued.' });
    expect(await sendNotices(w.railway.id, session.id, null, formData({ kind: 'update' }))).toMatchObject({ ok: true, message: 'Nothing to send: every update was already queued.' });
    await deliverAll();

    expect(caughtFor(w.host.email)).toHaveLength(1); // the invitation only
    const [opFirst, opUpdate] = await Promise.all(caughtFor(w.operator.email).map((m) => read(m.raw)));
    expect(opUpdate!.subject).toMatch(/^Updated: Test running evening/);
    expect(opUpdate!.method).toBe('REQUEST'); // RFC 5546 3.2.2: an update is a REQUEST from the organizer
    expect(opUpdate!.uid).toBe(opFirst!.uid); // RFC 5546 2.1.4 / RFC 5545 3.8.4.7: the same UID names the same event
    // RFC 5545 3.8.7.4: the organizer raises SEQUENCE with a significant revision; RFC 5546 2.1.4: a
    // receiver takes the higher SEQUENCE as the newer version of the event.
    expect(opFirst!.sequence).toBe(0);
    expect(opUpdate!.sequence).toBe(1);
    expect(opUpdate!.stamp.getTime()).toBeGreaterThanOrEqual(opFirst!.stamp.getTime()); // RFC 5545 3.8.7.2: DTSTAMP when the message was made
    expect(opUpdate!.text).toContain('What changed for you:');
    expect(opUpdate!.text).toMatch(/- Your run with Local at 06:20 fast: now 07:00–07:04 fast \(\d\d:\d\d–\d\d:\d\d real\), was 06:20–06:24 fast\./);
    expect(opUpdate!.text).toMatch(/- No longer yours: Local on Cab A, 07:40–07:44 fast/);
    expect(opUpdate!.text).toContain('Your runs (1):');

    const planned = await Promise.all(caughtFor(w.planner.email).map((m) => read(m.raw)));
    expect(planned).toHaveLength(2);
    expect(planned[1]!.sequence).toBe(1);
    expect(planned[1]!.text).toMatch(/- Your run with Freight at 07:00 fast: cab now Cab B \(was Cab A\)\./);
    expect(planned[1]!.text).toMatch(/- New run for you: Local on Cab A, 07:40–07:44 fast/);
    // The operator's calendar feed carries the same UID with the SEQUENCE they now hold, not the session's 0
    // (RFC 5546 2.1.4: a lower SEQUENCE would read as an older copy of the event).
    const feed = new ICAL.Component(ICAL.parse(personalFeed({ id: w.operator.id, name: w.operator.name })));
    const feedEvent = feed.getAllSubcomponents('vevent').find((e) => String(e.getFirstPropertyValue('uid')) === opUpdate!.uid)!;
    expect(Number(feedEvent.getFirstPropertyValue('sequence'))).toBe(1);
    // What the person now holds is the new baseline: nothing more to send.
    expect([...standings(w.railway.id, session.id).values()].some((s) => s.affected)).toBe(false);
  });

  it('a new session time affects everyone sent before; each update is above what that person holds', async () => {
    const { w, session, runs } = await invitedAndSent();
    signInAs(w.planner);
    await patchRun(session.id, runs[0]!.id, { departS: runs[0]!.departS + 600 });
    signInAs(w.host);
    await sendNotices(w.railway.id, session.id, null, formData({ kind: 'update' }));
    // The session page raises the session's SEQUENCE when the start moves (RFC 5546 2.1.4).
    const startsAt = new Date(session.startsAt.getTime() + 3600_000);
    db().update(t.sessions).set({ sequence: 1, startsAt, endsAt: new Date(session.endsAt.getTime() + 3600_000) }).where(eq(t.sessions.id, session.id)).run();
    const now = standings(w.railway.id, session.id);
    expect([...now.values()].every((s) => s.affected)).toBe(true);
    expect(now.get(w.host.email)!.changes.map((c) => c.kind)).toEqual(['session-time']); // real times moved, runs did not
    expect(await sendNotices(w.railway.id, session.id, null, formData({ kind: 'update' }))).toMatchObject({ ok: true, message: '3 updates queued.' });
    await deliverAll();
    const last = async (email: string) => read(caughtFor(email).at(-1)!.raw);
    const op = await last(w.operator.email);
    const host = await last(w.host.email);
    expect(op.sequence).toBe(2); // held 1 from the first update: must go above it (RFC 5546 2.1.4)
    expect(host.sequence).toBe(1); // held 0: the session's new number
    expect(op.start.getTime()).toBe(startsAt.getTime()); // DTSTART moved (RFC 5545 3.8.2.4)
    expect(host.text).toMatch(/- The session's time changed: now .*; it was /);
    expect(host.text).not.toContain('Your run with');
  });
});

describe('reminders, the reply deadline and notes with replies', () => {
  it('reminds only those sent an invitation who have not replied, at most once a day, and records when', async () => {
    const { w, session } = await invitedAndSent();
    const inv = (email: string) => listSessionInvitations(session.id).find((i) => i.email === email)!;
    // The operator answers through their link; the planner and host stay silent.
    const { signReplyToken } = await import('@/lib/invitations/reply-token');
    const { replyByToken } = await import('@/app/(public)/reply/actions');
    const token = signReplyToken({ railwayId: w.railway.id, invitationId: inv(w.operator.email).id, nonce: 0, expiresAt: session.endsAt.getTime() });
    expect(await replyByToken(null, formData({ token, reply: 'accepted' }))).toMatchObject({ ok: true });

    expect(await remindCrew(w.railway.id, session.id, null, formData({}))).toMatchObject({ ok: true, message: '2 reminders queued.' });
    expect(await remindCrew(w.railway.id, session.id, null, formData({}))).toMatchObject({ ok: true, message: 'No reminder sent. 2 people reminded in the last day left out.' });
    expect(inv(w.planner.email).remindedAt).not.toBeNull();
    expect(inv(w.planner.email).reminderCount).toBe(1);
    expect(inv(w.operator.email).remindedAt).toBeNull();
    await deliverAll();
    const reminder = await simpleParser(caughtFor(w.planner.email).at(-1)!.raw);
    expect(reminder.subject).toMatch(/^Reminder, please reply: Test running evening/);
    expect(reminder.text).toMatch(/Accept: http:\/\/127\.0\.0\.1:3999\/reply\?token=/);
    // No calendar part: the event the person holds is unchanged, so no new SEQUENCE (RFC 5546 2.1.4).
    expect(reminder.attachments.filter((a) => a.contentType === 'text/calendar')).toHaveLength(0);
    expect(caughtFor(w.operator.email)).toHaveLength(1);
    // A day later the gap has passed: the two are due again (the service takes the time it is given).
    const { remindAwaitingReply } = await import('@/lib/invitations/send');
    const later = new Date(Date.now() + 21 * 3600_000);
    expect(remindAwaitingReply({ railwayId: w.railway.id, sessionId: session.id, host: w.host, now: later })).toEqual({ queued: 2, tooSoon: 0 });
    expect(inv(w.planner.email).reminderCount).toBe(2);
  });

  it('the deadline is set in the session’s zone, said in the e-mail, and a reply after it counts and is marked late', async () => {
    const { w, session } = await invitedAndSent();
    // Bad input changes nothing: a malformed value, a time past the start, a time already gone.
    expect(await setReplyDeadline(w.railway.id, session.id, null, formData({ replyBy: 'tomorrow' }))).toMatchObject({ ok: false, status: 400 });
    const afterStart = new Date(session.startsAt.getTime() + 3600_000).toISOString().slice(0, 16);
    expect(await setReplyDeadline(w.railway.id, session.id, null, formData({ replyBy: afterStart }))).toMatchObject({ ok: false, status: 400, fieldErrors: { replyBy: expect.stringMatching(/start/) } });
    expect(await setReplyDeadline(w.railway.id, session.id, null, formData({ replyBy: '2001-01-01T10:00' }))).toMatchObject({ ok: false, status: 400 });
    expect(getRailwaySession(w.railway.id, session.id)!.replyBy).toBeNull();
    // The world's session is in UTC: a day before the start on the wall clock is that instant.
    const dayBefore = new Date(session.startsAt.getTime() - 86_400_000);
    expect(await setReplyDeadline(w.railway.id, session.id, null, formData({ replyBy: dayBefore.toISOString().slice(0, 16) }))).toMatchObject({ ok: true });
    expect(getRailwaySession(w.railway.id, session.id)!.replyBy!.getTime()).toBe(dayBefore.getTime());
    await remindCrew(w.railway.id, session.id, null, formData({}));
    await deliverAll();
    const reminder = await simpleParser(caughtFor(w.operator.email).at(-1)!.raw);
    expect(reminder.text).toContain(`Please reply by ${formatInZone(dayBefore, 'UTC')} (UTC).`);

    const { recordReply } = await import('@/lib/invitations/reply');
    const { signReplyToken } = await import('@/lib/invitations/reply-token');
    const inv = listSessionInvitations(session.id).find((i) => i.email === w.operator.email)!;
    const token = signReplyToken({ railwayId: w.railway.id, invitationId: inv.id, nonce: inv.replyNonce, expiresAt: session.endsAt.getTime() });
    const late = recordReply(token, 'declined', new Date(dayBefore.getTime() + 60_000), 'Sorry, work trip.');
    expect(late).toMatchObject({ reply: 'declined', late: true });
    const after = listSessionInvitations(session.id).find((i) => i.id === inv.id)!;
    expect(after.reply).toBe('declined');
    expect(isLate(getRailwaySession(w.railway.id, session.id)!.replyBy, after.respondedAt)).toBe(true);
    expect(after.comment).toBe('Sorry, work trip.');
    // Clearing the deadline: nothing is late any more.
    expect(await setReplyDeadline(w.railway.id, session.id, null, formData({ replyBy: '' }))).toMatchObject({ ok: true, message: 'Reply deadline removed.' });
    expect(isLate(getRailwaySession(w.railway.id, session.id)!.replyBy, after.respondedAt)).toBe(false);
  });

  it('a note with a reply is bounded and cleaned, and stays out of what other operators read', async () => {
    const { w, session } = await invitedAndSent();
    const { replyByToken } = await import('@/app/(public)/reply/actions');
    const { signReplyToken } = await import('@/lib/invitations/reply-token');
    const inv = () => listSessionInvitations(session.id).find((i) => i.email === w.operator.email)!;
    const tokenNow = () => signReplyToken({ railwayId: w.railway.id, invitationId: inv().id, nonce: inv().replyNonce, expiresAt: session.endsAt.getTime() });
    expect(await replyByToken(null, formData({ token: tokenNow(), reply: 'tentative', comment: 'x'.repeat(281) }))).toMatchObject({ ok: false, status: 400 });
    expect(inv().reply).toBe('needs-action'); // refused input changes nothing
    expect(await replyByToken(null, formData({ token: tokenNow(), reply: 'tentative', comment: ' Late\u0007 train\r\nhome ' }))).toMatchObject({ ok: true });
    expect(inv().comment).toBe('Late train\nhome');
    // Another operator's view of the session (their runs page, the calendar file) never carries the note.
    const other = w.makeUser('another-operator');
    const { addMember } = await import('@/db/queries/memberships');
    addMember(w.railway.id, other.id, 'operator');
    db().insert(t.invitations).values({ sessionId: session.id, userId: other.id, email: other.email }).run();
    signInAs(other);
    const { loadMyRuns } = await import('@/lib/invitations/my-runs');
    expect(JSON.stringify(await loadMyRuns(other.id))).not.toContain('Late train');
    const { GET } = await import('@/app/api/sessions/[sessionId]/calendar.ics/route');
    expect(await (await GET(new Request('http://test/api'), { params: Promise.resolve({ sessionId: session.id }) })).text()).not.toContain('Late train');
  });
});
