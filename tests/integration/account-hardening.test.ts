// Issue 10's account findings, one test (or more) named after each. Each was seen failing on the
// code before its fix.
import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { inviteMember, removeMember, withdrawMemberOffer } from '@/app/(app)/railways/[railwayId]/members/actions';
import { replyByToken } from '@/app/(public)/reply/actions';
import { GET as getPlan, POST as postPlan } from '@/app/api/sessions/[sessionId]/plan/route';
import { PATCH as patchRun } from '@/app/api/sessions/[sessionId]/runs/[runId]/route';
import { replyToMemberOffer } from '@/app/(app)/railways/actions';
import { requestPasswordReset } from '@/app/(auth)/reset-password/actions';
import { requestSignInLink } from '@/app/(auth)/sign-in/actions';
import { getDb } from '@/db';
import { listCaughtMailForRailway } from '@/db/queries/caught-mail';
import { listMemberInvitationsFor } from '@/db/queries/member-invitations';
import { addMember, getMembership } from '@/db/queries/memberships';
import { markEmailVerified } from '@/db/queries/users';
import { eq } from 'drizzle-orm';
import * as t from '@/db/schema';
import { outbox } from '@/db/schema';
import { startLocalMailServer } from '@/lib/mail/local-server';
import { deliverDueMail, enqueueMail } from '@/lib/mail/outbox';
import { maskPersonalLinks, PERSONAL_LINK_MASK } from '@/lib/mail/personal-links';
import { closeTransport } from '@/lib/mail/transport';
import { queueSessionNotices } from '@/lib/invitations/send';
import { signReplyToken } from '@/lib/invitations/reply-token';
import { makeSessionWorld } from './authz/invitations';
import { signInAs } from './caller';
import { formData, makeWorld } from './world';

let server: Awaited<ReturnType<typeof startLocalMailServer>>;

beforeAll(async () => {
  server = await startLocalMailServer(0);
  process.env.LOCAL_SMTP_ACTUAL_PORT = String(server.port);
});

afterAll(async () => {
  closeTransport();
  await new Promise<void>((resolve) => server.close(() => resolve()));
});

beforeEach(() => signInAs(null));

/** Every message's full text, for "no link in it" checks. */
function allMailTo(address: string) {
  return getDb().select().from(outbox).all().filter((m) => m.toAddress === address);
}

describe('finding 1: account takeover through the Mail outbox', () => {
  it("finding 1: a railway's outbox never shows another railway's or personal mail", async () => {
    const w = makeWorld();
    // Our operator is also a member elsewhere, and gets mail from there and personal mail.
    enqueueMail({ railwayId: w.railway.id, dedupeKey: `ours-${w.railway.id}`, kind: 'test', toAddress: w.operator.email, subject: 'From our railway', text: 'ours' });
    enqueueMail({ railwayId: w.otherRailway.id, dedupeKey: `theirs-${w.railway.id}`, kind: 'test', toAddress: w.operator.email, subject: 'From the other railway', text: 'theirs http://x/reply?token=abc' });
    expect(await requestSignInLink(null, formData({ email: w.operator.email }))).toMatchObject({ ok: true });
    expect(await requestPasswordReset(null, formData({ email: w.operator.email }))).toMatchObject({ ok: true });
    expect((await deliverDueMail()).failed).toBe(0);

    const subjects = listCaughtMailForRailway(w.railway.id).map((m) => m.subject);
    expect(subjects).toEqual(['From our railway']);
    expect(listCaughtMailForRailway(w.otherRailway.id).map((m) => m.subject)).toEqual(['From the other railway']);
  });

  it('finding 1: adding an existing account offers membership; it attaches nothing and mails no sign-in link', async () => {
    const w = makeWorld();
    // The "attacker" hosts their own railway and adds our host's address to it.
    signInAs(w.outsider);
    expect(await inviteMember(w.otherRailway.id, null, formData({ email: w.host.email, role: 'operator' }))).toMatchObject({ ok: true });
    expect(getMembership(w.otherRailway.id, w.host.id)).toBeUndefined();
    const mail = allMailTo(w.host.email);
    expect(mail).toHaveLength(1);
    expect(mail[0]!.text).not.toMatch(/token=/);
    expect(mail[0]!.html ?? '').not.toMatch(/token=/);
  });

  it('finding 1: the invited person joins only by accepting, signed in with a proved address; a withdrawn offer cannot be taken', async () => {
    const w = makeWorld();
    const newcomer = w.makeUser('newcomer');
    signInAs(w.host);
    await inviteMember(w.railway.id, null, formData({ email: newcomer.email, role: 'planner' }));
    const [offer] = listMemberInvitationsFor(newcomer.email);
    expect(offer).toMatchObject({ railwayId: w.railway.id, role: 'planner' });
    // Someone else cannot take it, even knowing its id.
    signInAs(w.outsider);
    expect(await replyToMemberOffer(null, formData({ invitationId: offer!.id, reply: 'accept' }))).toMatchObject({ ok: false, status: 404 });
    // The owner, before proving the address: refused.
    signInAs(newcomer);
    expect(await replyToMemberOffer(null, formData({ invitationId: offer!.id, reply: 'accept' }))).toMatchObject({ ok: false, status: 403 });
    markEmailVerified(newcomer.id);
    expect(await replyToMemberOffer(null, formData({ invitationId: offer!.id, reply: 'accept' }))).toMatchObject({ ok: true });
    expect(getMembership(w.railway.id, newcomer.id)?.role).toBe('planner');
    expect(listMemberInvitationsFor(newcomer.email)).toHaveLength(0);

    const other = w.makeUser('other');
    markEmailVerified(other.id);
    signInAs(w.host);
    await inviteMember(w.railway.id, null, formData({ email: other.email, role: 'operator' }));
    expect(await withdrawMemberOffer(w.railway.id, null, formData({ email: other.email }))).toMatchObject({ ok: true });
    signInAs(other);
    expect(listMemberInvitationsFor(other.email)).toHaveLength(0);
    expect(getMembership(w.railway.id, other.id)).toBeUndefined();
  });

  it("finding 1: links that act for the recipient are masked in a railway's outbox view", () => {
    const text = 'Accept: http://127.0.0.1:3999/reply?token=abc.def&reply=accepted\nTimetable: http://127.0.0.1:3999/railways/r1/sessions/s1';
    const masked = maskPersonalLinks(text);
    expect(masked).not.toContain('token=');
    expect(masked).toContain(PERSONAL_LINK_MASK);
    expect(masked).toContain('http://127.0.0.1:3999/railways/r1/sessions/s1');
  });
});

const ctx = <P>(params: P) => ({ params: Promise.resolve(params) });
const url = (path: string) => `http://127.0.0.1:3999${path}`;
const json = (method: string, path: string, body: unknown) =>
  new Request(url(path), { method, headers: { 'content-type': 'application/json', origin: url('') }, body: JSON.stringify(body) });

describe('finding 4: removing a member does not stick', () => {
  it("finding 4: a removed member's reply link re-adds nothing, and an update is mailed only to current invitees", async () => {
    const w = makeWorld();
    const s = makeSessionWorld(w);
    const crew = w.makeUser('crew');
    addMember(w.railway.id, crew.id, 'operator');
    const invitation = getDb().insert(t.invitations).values({ sessionId: s.session.id, userId: crew.id, email: crew.email }).returning().get();
    const host = { id: w.host.id, name: w.host.name, email: w.host.email };
    queueSessionNotices({ railwayId: w.railway.id, sessionId: s.session.id, host, kind: 'pending' });
    expect(allMailTo(crew.email)).toHaveLength(1);
    const token = signReplyToken({ railwayId: w.railway.id, invitationId: invitation.id, nonce: 0, expiresAt: s.session.endsAt.getTime() });

    signInAs(w.host);
    expect(await removeMember(w.railway.id, null, formData({ userId: crew.id }))).toMatchObject({ ok: true });
    expect(getMembership(w.railway.id, crew.id)).toBeUndefined();

    // The old link: refused, and they stay removed.
    signInAs(null);
    expect(await replyByToken(null, formData({ token, reply: 'accepted' }))).toMatchObject({ ok: false, status: 400 });
    expect(getMembership(w.railway.id, crew.id)).toBeUndefined();

    // The session changes; the update goes to those still invited, not to the removed member.
    getDb().update(t.sessions).set({ sequence: s.session.sequence + 1 }).where(eq(t.sessions.id, s.session.id)).run();
    const update = queueSessionNotices({ railwayId: w.railway.id, sessionId: s.session.id, host, kind: 'update' });
    expect(update.queued).toBeGreaterThan(0); // the operator, still invited
    expect(allMailTo(crew.email)).toHaveLength(1);
    expect(getMembership(w.railway.id, crew.id)).toBeUndefined();
  });
});

describe('fault: removing a member who operates runs breaks editing', () => {
  it('fault: removing a member who operates runs still to come is refused, naming the runs; the timetable stays editable', async () => {
    const w = makeWorld();
    const s = makeSessionWorld(w);
    signInAs(w.host);
    const refused = await removeMember(w.railway.id, null, formData({ userId: w.operator.id }));
    expect(refused).toMatchObject({ ok: false, status: 409 });
    if (refused && !refused.ok) expect(refused.error).toMatch(/operates 2 runs .*Test running evening: Local 06:20, Local 07:40/);
    expect(getMembership(w.railway.id, w.operator.id)?.role).toBe('operator');

    // The host gives the runs to the planner; then the removal goes through.
    signInAs(w.planner);
    for (const run of s.runs.filter((r) => r.operatorId === w.operator.id)) {
      const answer = await patchRun(json('PATCH', `/api/sessions/${s.session.id}/runs/${run.id}`, { version: run.version, operatorId: w.planner.id }), ctx({ sessionId: s.session.id, runId: run.id }));
      expect(answer.status).toBe(200);
    }
    signInAs(w.host);
    expect(await removeMember(w.railway.id, null, formData({ userId: w.operator.id }))).toMatchObject({ ok: true });

    // GET the plan, POST it back: the timetable is still editable.
    const plan = await (await getPlan(new Request(url(`/api/sessions/${s.session.id}/plan`)), ctx({ sessionId: s.session.id }))).json();
    const posted = await postPlan(json('POST', `/api/sessions/${s.session.id}/plan`, plan), ctx({ sessionId: s.session.id }));
    expect(posted.status).toBe(200);
  });

  it('fault: in a session already over, a removed member’s runs keep no operator and stay editable', async () => {
    const w = makeWorld();
    const s = makeSessionWorld(w, { startsAt: new Date(Math.floor((Date.now() - 30 * 24 * 3600_000) / 60_000) * 60_000) });
    signInAs(w.host);
    expect(await removeMember(w.railway.id, null, formData({ userId: w.operator.id }))).toMatchObject({ ok: true });
    const runs = getDb().select().from(t.runs).where(eq(t.runs.sessionId, s.session.id)).all();
    expect(runs.filter((r) => r.operatorId === w.operator.id)).toHaveLength(0);
    const plan = await (await getPlan(new Request(url(`/api/sessions/${s.session.id}/plan`)), ctx({ sessionId: s.session.id }))).json();
    const posted = await postPlan(json('POST', `/api/sessions/${s.session.id}/plan`, plan), ctx({ sessionId: s.session.id }));
    expect(posted.status).toBe(200);
  });
});
