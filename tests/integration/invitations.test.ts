import { and, eq } from 'drizzle-orm';
import ICAL from 'ical.js';
import { simpleParser } from 'mailparser';
import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { getDb } from '@/db';
import { listSessionInvitations } from '@/db/queries/invitation-records';
import { requeueInterruptedMail } from '@/db/queries/outbox';
import * as t from '@/db/schema';
import { inviteCrew, resendInvitation, sendNotices } from '@/app/(app)/railways/[railwayId]/sessions/[sessionId]/invitations/actions';
import { resetEnvCache } from '@/lib/env';
import { deliveryOf } from '@/lib/invitations/tracker';
import { startLocalMailServer } from '@/lib/mail/local-server';
import { deliverDueMail } from '@/lib/mail/outbox';
import { closeTransport } from '@/lib/mail/transport';
import { makeSessionWorld } from './authz/invitations';
import { signInAs } from './caller';
import { formData, makeWorld } from './world';

process.env.NEXTAUTH_SECRET = 'invitations-test-secret-0123456789';

let server: Awaited<ReturnType<typeof startLocalMailServer>>;

beforeAll(async () => {
  resetEnvCache();
  server = await startLocalMailServer(0);
  process.env.LOCAL_SMTP_ACTUAL_PORT = String(server.port);
});

afterAll(async () => {
  closeTransport();
  await stopServer(server);
});

/** Stops the mail server as a crash would: refuses new connections and drops open ones. */
function stopServer(s: typeof server): Promise<void> {
  return new Promise((resolve) => {
    s.close(() => resolve());
    for (const connection of (s as unknown as { connections: Set<{ close: () => void }> }).connections) connection.close();
  });
}

const db = () => getDb();
const outboxOf = (invitationId: string) => db().select().from(t.outbox).where(eq(t.outbox.invitationId, invitationId)).all();
const caughtFor = (address: string) => db().select().from(t.caughtMail).all().filter((m) => m.toAddresses.includes(`,${address},`));

async function setup(options: Parameters<typeof makeSessionWorld>[1] = {}) {
  const w = makeWorld();
  const s = makeSessionWorld(w, options);
  signInAs(w.host);
  return { w, ...s };
}

async function deliverAll() {
  for (let i = 0; i < 20; i++) {
    const r = await deliverDueMail(50);
    if (r.sent === 0 && r.failed === 0) return;
  }
}

beforeEach(() => {
  process.env.LOCAL_SMTP_ACTUAL_PORT = String(server.port);
});

describe('inviting the crew', () => {
  it('invites members and a guest in one go and writes one outbox message each, nothing twice', async () => {
    const { w, session, invitation } = await setup();
    const data = formData({ guestEmails: 'Guest.One@Example.org, guest.one@example.org\nsecond-guest@example.org' });
    data.append('userIds', w.planner.id);
    const state = await inviteCrew(w.railway.id, session.id, null, data);
    expect(state).toMatchObject({ ok: true });
    const rows = listSessionInvitations(session.id);
    // The operator was invited by the fixture (not sent yet); planner + two distinct guests are new.
    expect(rows.map((r) => r.email).sort()).toEqual(['guest.one@example.org', w.operator.email, w.planner.email, 'second-guest@example.org'].sort());
    expect(rows.find((r) => r.id === invitation.id)!.mail).toBeNull();
    const guest = db().select().from(t.users).where(eq(t.users.email, 'guest.one@example.org')).get()!;
    expect(guest.passwordHash).toBeNull();
    expect(db().select().from(t.memberships).where(and(eq(t.memberships.userId, guest.id), eq(t.memberships.railwayId, w.railway.id))).get()).toBeUndefined();
    for (const r of rows.filter((r) => r.id !== invitation.id)) {
      const mail = outboxOf(r.id);
      expect(mail).toHaveLength(1);
      expect(mail[0]).toMatchObject({ calendarMethod: 'REQUEST', status: 'queued', dedupeKey: `invitation:${r.id}:0:REQUEST`, toAddress: r.email });
      expect(r.sentSequence).toBe(0);
    }
    // The same people again: no new invitations, no new mail.
    const again = formData({ guestEmails: 'second-guest@example.org' });
    again.append('userIds', w.planner.id);
    expect(await inviteCrew(w.railway.id, session.id, null, again)).toMatchObject({ ok: true });
    expect(db().select().from(t.outbox).all().filter((m) => rows.some((r) => r.id === m.invitationId))).toHaveLength(3);
  });

  it('sends the invitations not sent yet once, however often the host presses the button', async () => {
    const { w, session, invitation } = await setup();
    expect(await sendNotices(w.railway.id, session.id, null, formData({ kind: 'pending' }))).toMatchObject({ ok: true, message: '1 invitation queued.' });
    expect(await sendNotices(w.railway.id, session.id, null, formData({ kind: 'pending' }))).toMatchObject({ ok: true, message: 'Nothing to send: every invitation was already queued.' });
    expect(outboxOf(invitation.id)).toHaveLength(1);
  });

  it('refuses a draft session and writes nothing (one transaction)', async () => {
    const { w, session } = await setup({ status: 'draft' });
    const users = db().select().from(t.users).all().length;
    const state = await inviteCrew(w.railway.id, session.id, null, formData({ guestEmails: 'late@example.org' }));
    expect(state).toMatchObject({ ok: false, status: 400, error: 'Publish the session before inviting the crew.' });
    expect(db().select().from(t.users).all().length).toBe(users);
    expect(listSessionInvitations(session.id)).toHaveLength(1);
  });

  it('refuses bad input with field messages', async () => {
    const { w, session } = await setup();
    expect(await inviteCrew(w.railway.id, session.id, null, formData({ guestEmails: 'not-an-address' }))).toMatchObject({ ok: false, status: 400, fieldErrors: { 'guestEmails[0]': expect.stringMatching(/valid e-mail/) } });
    expect(await inviteCrew(w.railway.id, session.id, null, formData({ guestEmails: '' }))).toMatchObject({ ok: false, status: 400, fieldErrors: { userIds: expect.stringMatching(/at least one/) } });
    const outsiderPick = formData({ guestEmails: '' });
    outsiderPick.append('userIds', w.outsider.id);
    expect(await inviteCrew(w.railway.id, session.id, null, outsiderPick)).toMatchObject({ ok: false, status: 400 });
    expect(await sendNotices(w.railway.id, session.id, null, formData({ kind: 'everything' }))).toMatchObject({ ok: false, status: 400 });
  });

  it('another railway’s session is not found, even for its own host’s id', async () => {
    const { w } = await setup();
    const other = makeSessionWorld({ ...w, railway: w.otherRailway } as typeof w);
    expect(await sendNotices(w.railway.id, other.session.id, null, formData({ kind: 'pending' }))).toMatchObject({ ok: false, status: 404 });
  });
});

describe('the e-mail over real SMTP', () => {
  it('arrives with a text/calendar; method=REQUEST; charset=UTF-8 part and readable text and HTML listing the runs', async () => {
    const { w, session, invitation } = await setup({ title: 'Fahrtag am Ærø-Zweig ✓' });
    await sendNotices(w.railway.id, session.id, null, formData({ kind: 'pending' }));
    await deliverAll();
    const caught = caughtFor(w.operator.email);
    expect(caught).toHaveLength(1);
    const parsed = await simpleParser(caught[0]!.raw);
    expect(parsed.subject).toMatch(/^Invitation: Fahrtag am Ærø-Zweig ✓/);
    // The readable alternative (RFC 6047 2.3–2.5): the person's own runs with fast and real times, cab, train, route.
    expect(parsed.text).toContain('Your runs (2):');
    expect(parsed.text).toMatch(/06:20–06:24 fast \(\d\d:\d\d–\d\d:\d\d real\): Local on Cab A/);
    expect(parsed.text).toContain('Route: Yard → Main → Ærø halt');
    expect(parsed.text).toContain('Stand: 2 min real before departure, 3 min real after arrival');
    expect(parsed.text).toMatch(/Cab after you: planner \d+ \(Freight, 07:00\)/);
    expect(parsed.text).toContain('- stand-by: Covers cab B.');
    expect(parsed.text).toMatch(/Accept: http:\/\/127\.0\.0\.1:3999\/reply\?token=[^&\s]+&reply=accepted/);
    expect(parsed.html).toContain('Your runs (2)');
    // RFC 6047 2.4: Content-Type text/calendar with method matching METHOD and charset UTF-8.
    const calendarPart = /Content-Type: text\/calendar;([^\r\n]*(?:\r\n[ \t][^\r\n]*)*)/i.exec(caught[0]!.raw);
    expect(calendarPart).not.toBeNull();
    const params = calendarPart![1]!.replace(/\r\n[ \t]/g, ' ');
    expect(params).toMatch(/method=REQUEST/i);
    expect(params).toMatch(/charset=utf-8/i);
    const ics = parsed.attachments.find((a) => a.contentType === 'text/calendar');
    expect(ics).toBeDefined();
    const vcal = new ICAL.Component(ICAL.parse(ics!.content.toString('utf8')));
    expect(vcal.getFirstPropertyValue('method')).toBe('REQUEST'); // RFC 6047 2.4: the part's method matches METHOD
    const event = vcal.getFirstSubcomponent('vevent')!;
    expect(event.getFirstPropertyValue('summary')).toBe('Fahrtag am Ærø-Zweig ✓'); // UTF-8 survives (RFC 5545 3.1)
    expect(String(event.getFirstProperty('attendee')!.getFirstValue()).toLowerCase()).toBe(`mailto:${w.operator.email}`);
    expect(deliveryOf(listSessionInvitations(session.id).find((i) => i.id === invitation.id)!)).toBe('sent');
  });

  it('says when the session starts and ends, in the session’s own time zone, in the text, the HTML and the subject', async () => {
    // 17:00 UTC on a January Saturday is 18:00 in Berlin (CET = UTC+1 in winter, IANA tz database "Europe/Berlin").
    const { w, session } = await setup({ startsAt: new Date('2030-01-12T17:00:00Z'), hours: 3, timeZone: 'Europe/Berlin' });
    await sendNotices(w.railway.id, session.id, null, formData({ kind: 'pending' }));
    await deliverAll();
    const parsed = await simpleParser(caughtFor(w.operator.email)[0]!.raw);
    expect(parsed.subject).toMatch(/^Invitation: Test running evening \(Sat,? 12 Jan 2030\)$/);
    expect(parsed.text).toMatch(/^When: Sat,? 12 Jan 2030, 18:00 to 21:00 \(Europe\/Berlin\)$/m);
    expect(parsed.html).toMatch(/When: Sat,? 12 Jan 2030, 18:00 to 21:00 \(Europe\/Berlin\)/);
  });

  it('names both dates when the session runs past midnight', async () => {
    // 22:00 UTC + 4 h in Berlin (UTC+1): 23:00 on the 12th to 03:00 on the 13th.
    const { w, session } = await setup({ startsAt: new Date('2030-01-12T22:00:00Z'), hours: 4, timeZone: 'Europe/Berlin' });
    await sendNotices(w.railway.id, session.id, null, formData({ kind: 'pending' }));
    await deliverAll();
    const parsed = await simpleParser(caughtFor(w.operator.email)[0]!.raw);
    expect(parsed.text).toMatch(/^When: Sat,? 12 Jan 2030, 23:00 to Sun,? 13 Jan 2030, 03:00 \(Europe\/Berlin\)$/m);
  });

  it('an update goes out with SEQUENCE up to everyone sent before, once; a cancellation follows the RFC', async () => {
    const { w, session, invitation } = await setup();
    await sendNotices(w.railway.id, session.id, null, formData({ kind: 'pending' }));
    await deliverAll();
    // The session page raises the sequence when the start changes (RFC 5546 2.1.4).
    db().update(t.sessions).set({ sequence: 1, startsAt: new Date(session.startsAt.getTime() + 3600_000) }).where(eq(t.sessions.id, session.id)).run();
    expect(await sendNotices(w.railway.id, session.id, null, formData({ kind: 'update' }))).toMatchObject({ ok: true, message: '1 update queued.' });
    expect(await sendNotices(w.railway.id, session.id, null, formData({ kind: 'update' }))).toMatchObject({ ok: true, message: 'Nothing to send: every update was already queued.' });
    await deliverAll();
    const [first, update] = caughtFor(w.operator.email).sort((a, b) => a.receivedAt.getTime() - b.receivedAt.getTime());
    const eventOf = async (raw: string) => {
      const parsed = await simpleParser(raw);
      const ics = parsed.attachments.find((a) => a.contentType === 'text/calendar')!.content.toString('utf8');
      const vcal = new ICAL.Component(ICAL.parse(ics));
      return { parsed, vcal, event: vcal.getFirstSubcomponent('vevent')! };
    };
    const a = await eventOf(first!.raw);
    const b = await eventOf(update!.raw);
    expect(b.parsed.subject).toMatch(/^Updated: /);
    expect(b.event.getFirstPropertyValue('uid')).toBe(a.event.getFirstPropertyValue('uid')); // RFC 5546 2.1.4: same UID
    expect(b.event.getFirstPropertyValue('sequence')).toBe(1); // RFC 5546 2.1.4: SEQUENCE raised
    // Cancelled by the session page (status change raises the sequence, RFC 5546 2.1.4).
    db().update(t.sessions).set({ status: 'cancelled', sequence: 2 }).where(eq(t.sessions.id, session.id)).run();
    expect(await sendNotices(w.railway.id, session.id, null, formData({ kind: 'pending' }))).toMatchObject({ ok: false, status: 400 });
    expect(await sendNotices(w.railway.id, session.id, null, formData({ kind: 'cancel' }))).toMatchObject({ ok: true, message: '1 cancellation queued.' });
    expect(await sendNotices(w.railway.id, session.id, null, formData({ kind: 'cancel' }))).toMatchObject({ ok: true, message: 'Nothing to send: every cancellation was already queued.' });
    await deliverAll();
    const mails = caughtFor(w.operator.email).sort((x, y) => x.receivedAt.getTime() - y.receivedAt.getTime());
    expect(mails).toHaveLength(3);
    const c = await eventOf(mails[2]!.raw);
    expect(c.parsed.subject).toMatch(/^Cancelled: /);
    expect(c.vcal.getFirstPropertyValue('method')).toBe('CANCEL'); // RFC 5546 3.2.5
    expect(c.event.getFirstPropertyValue('status')).toBe('CANCELLED'); // RFC 5546 3.2.5
    expect(c.event.getFirstPropertyValue('uid')).toBe(a.event.getFirstPropertyValue('uid')); // RFC 5546 3.2.5: same UID
    expect(c.event.getFirstPropertyValue('sequence')).toBe(2); // RFC 5546 3.2.5: SEQUENCE raised
    expect(/Content-Type: text\/calendar;[^\r\n]*(\r\n[ \t][^\r\n]*)*/i.exec(mails[2]!.raw)![0]).toMatch(/method=CANCEL/i); // RFC 6047 2.4
    expect(c.parsed.text).not.toContain('reply=accepted');
    expect(outboxOf(invitation.id).map((m) => m.calendarMethod)).toEqual(expect.arrayContaining(['REQUEST', 'REQUEST', 'CANCEL']));
  });

  it('a cancellation raises SEQUENCE above the last one sent even if the session’s number was not raised', async () => {
    const { w, session, invitation } = await setup();
    await sendNotices(w.railway.id, session.id, null, formData({ kind: 'pending' }));
    db().update(t.sessions).set({ status: 'cancelled' }).where(eq(t.sessions.id, session.id)).run();
    await sendNotices(w.railway.id, session.id, null, formData({ kind: 'cancel' }));
    const cancel = outboxOf(invitation.id).find((m) => m.calendarMethod === 'CANCEL')!;
    const event = new ICAL.Component(ICAL.parse(cancel.calendar!)).getFirstSubcomponent('vevent')!;
    expect(event.getFirstPropertyValue('sequence')).toBe(1); // RFC 5546 3.2.5: CANCEL raises SEQUENCE
  });

  it('resend retries a failed e-mail as it was, or queues a fresh copy of a sent one', async () => {
    const { w, session, invitation } = await setup();
    await sendNotices(w.railway.id, session.id, null, formData({ kind: 'pending' }));
    const [row] = outboxOf(invitation.id);
    db().update(t.outbox).set({ status: 'failed', lastError: '550 mailbox unavailable', attempts: 8 }).where(eq(t.outbox.id, row!.id)).run();
    expect(deliveryOf(listSessionInvitations(session.id)[0]!)).toBe('failed');
    expect(await resendInvitation(w.railway.id, session.id, null, formData({ invitationId: invitation.id }))).toMatchObject({ ok: true, message: 'Retrying the failed e-mail now.' });
    expect(outboxOf(invitation.id)).toHaveLength(1);
    await deliverAll();
    expect(outboxOf(invitation.id)[0]!.status).toBe('sent');
    expect(await resendInvitation(w.railway.id, session.id, null, formData({ invitationId: invitation.id }))).toMatchObject({ ok: true, message: 'Sent again.' });
    expect(outboxOf(invitation.id)).toHaveLength(2);
    expect(await resendInvitation(w.railway.id, session.id, null, formData({ invitationId: 'nope' }))).toMatchObject({ ok: false, status: 404 });
  });
});

describe('the outbox when the mail server goes down mid-batch', () => {
  it('every invitation arrives exactly once after the server and the app come back', async () => {
    const { w, session } = await setup();
    await deliverAll(); // anything earlier tests left queued
    db().delete(t.caughtMail).run();
    const guests = Array.from({ length: 40 }, (_, i) => `crew-${i}-${session.id.slice(0, 6)}@example.org`);
    expect(await inviteCrew(w.railway.id, session.id, null, formData({ guestEmails: guests.join('\n') }))).toMatchObject({ ok: true });
    const port = server.port;
    const arrived = () => db().select().from(t.caughtMail).all().length;
    // Take the server down once a dozen messages are in.
    const watcher = setInterval(() => {
      if (arrived() >= 12 && server.server.listening) void stopServer(server);
    }, 2);
    const first = await deliverDueMail(5);
    clearInterval(watcher);
    await new Promise((r) => setTimeout(r, 50));
    expect(arrived()).toBeGreaterThanOrEqual(12);
    expect(arrived()).toBeLessThan(40);
    expect(first.failed).toBeGreaterThan(0);
    const waiting = db().select().from(t.outbox).all().filter((m) => guests.includes(m.toAddress) && m.status !== 'sent');
    expect(waiting.length).toBeGreaterThan(0);
    expect(waiting.every((m) => m.status === 'queued' || m.status === 'sending')).toBe(true);
    // The app "restarts": a message it had claimed but not finished goes back to the queue.
    db().update(t.outbox).set({ status: 'sending' }).where(eq(t.outbox.id, waiting[0]!.id)).run();
    closeTransport();
    requeueInterruptedMail();
    // The mail server comes back on the same port; the backoff has passed.
    server = await startLocalMailServer(port);
    db().update(t.outbox).set({ nextAttemptAt: new Date(0) }).where(eq(t.outbox.status, 'queued')).run();
    await deliverAll();
    for (const g of guests) expect(caughtFor(g), g).toHaveLength(1);
    expect(db().select().from(t.outbox).all().filter((m) => guests.includes(m.toAddress)).every((m) => m.status === 'sent')).toBe(true);
  });
});
