import { eq } from 'drizzle-orm';
import { beforeAll, describe, expect, it } from 'vitest';
import { getDb } from '@/db';
import { addMember } from '@/db/queries/memberships';
import { getRailwaySession } from '@/db/queries/invitation-records';
import * as t from '@/db/schema';
import { resetEnvCache } from '@/lib/env';
import { crewStatus } from '@/lib/invitations/crew-status';
import { loadMyRuns } from '@/lib/invitations/my-runs';
import { queueSessionNotices } from '@/lib/invitations/send';
import { inviteEveryone, makeSessionWorld } from './authz/invitations';
import { signInAs } from './caller';
import { makeWorld } from './world';

// The crew at a glance (Needs attention) and a person's own runs (My runs), read from a real
// database. Common practice: the counts are what the host acts on, so each is checked by value.

process.env.NEXTAUTH_SECRET = 'crew-status-test-secret-0123456789';
beforeAll(() => resetEnvCache());

const db = () => getDb();
const setReply = (invitationId: string, reply: 'accepted' | 'declined' | 'tentative') =>
  db().update(t.invitations).set({ reply, respondedAt: new Date() }).where(eq(t.invitations.id, invitationId)).run();

/** The world's session with its three members invited and sent their invitations (queued in the outbox). */
function sentToEveryone() {
  const w = makeWorld();
  const s = makeSessionWorld(w);
  const invited = inviteEveryone(w, s.session.id);
  expect(queueSessionNotices({ railwayId: w.railway.id, sessionId: s.session.id, host: w.host, kind: 'pending' })).toEqual({ queued: 3, skipped: 0 });
  const of = (userId: string) => invited.find((i) => i.userId === userId)!;
  return { w, ...s, of };
}

describe('the crew at a glance', () => {
  it('no invitations: nothing to report, not even a deadline that has passed', () => {
    const w = makeWorld();
    const { session } = makeSessionWorld(w);
    db().delete(t.invitations).where(eq(t.invitations.sessionId, session.id)).run();
    const now = new Date();
    const status = crewStatus({ ...session, replyBy: new Date(now.getTime() - 60_000) }, now);
    expect(status).toEqual({ declinedWithRuns: [], affected: 0, noReply: 0, pastDeadline: false });
  });

  it('names who declined but still has runs, and counts those affected by changes and those who have not replied', () => {
    const { w, session, runs, of } = sentToEveryone();
    // Two more members: one sent an invitation (no reply yet), one invited but not sent anything.
    const sentLate = w.makeUser('sent-late');
    const notSent = w.makeUser('not-sent');
    for (const u of [sentLate, notSent]) addMember(w.railway.id, u.id, 'operator');
    const lateInvitation = db().insert(t.invitations).values({ sessionId: session.id, userId: sentLate.id, email: sentLate.email }).returning().get();
    queueSessionNotices({ railwayId: w.railway.id, sessionId: session.id, host: w.host, kind: 'pending' });
    db().insert(t.invitations).values({ sessionId: session.id, userId: notSent.id, email: notSent.email }).run();
    // The planner's last run is taken off them (no operator yet): it belongs to no one, and the planner is affected.
    db().update(t.runs).set({ operatorId: null }).where(eq(t.runs.id, runs[3]!.id)).run();

    setReply(of(w.operator.id).id, 'declined'); // declined, still drives two runs
    setReply(of(w.host.id).id, 'declined'); // declined, drives nothing
    setReply(lateInvitation.id, 'tentative');
    const current = getRailwaySession(w.railway.id, session.id)!;
    expect(crewStatus(current)).toEqual({ declinedWithRuns: [w.operator.name], affected: 1, noReply: 1, pastDeadline: false });

    // The sent-late member had not replied after all; the operator's first run moves by ten real minutes.
    db().update(t.invitations).set({ reply: 'needs-action', respondedAt: null }).where(eq(t.invitations.id, lateInvitation.id)).run();
    db().update(t.runs).set({ departS: runs[0]!.departS + 600, arriveS: runs[0]!.arriveS + 600 }).where(eq(t.runs.id, runs[0]!.id)).run();
    expect(crewStatus(current)).toEqual({ declinedWithRuns: [w.operator.name], affected: 2, noReply: 2, pastDeadline: false });
  });

  it('the reply deadline has passed only strictly after it', () => {
    const { w, session } = sentToEveryone();
    const current = getRailwaySession(w.railway.id, session.id)!;
    const deadline = new Date(session.startsAt.getTime() - 3600_000);
    const at = (ms: number) => crewStatus({ ...current, replyBy: deadline }, new Date(deadline.getTime() + ms)).pastDeadline;
    expect(at(-1)).toBe(false);
    expect(at(0)).toBe(false);
    expect(at(1)).toBe(true);
    expect(crewStatus({ ...current, replyBy: null }, new Date(session.endsAt.getTime())).pastDeadline).toBe(false);
  });
});

describe('my runs', () => {
  it('each upcoming session I am invited to, soonest first, with my runs, my duties and the fast clock', async () => {
    const w = makeWorld();
    const later = makeSessionWorld(w, { startsAt: new Date(Math.floor((Date.now() + 9 * 86_400_000) / 60_000) * 60_000), title: 'Later evening' });
    const sooner = makeSessionWorld(w, { startsAt: new Date(Math.floor((Date.now() + 2 * 86_400_000) / 60_000) * 60_000), title: 'Sooner evening' });
    signInAs(w.operator);
    const mine = await loadMyRuns(w.operator.id);
    expect(mine.map((m) => m.session.title)).toEqual(['Sooner evening', 'Later evening']);
    const [first] = mine;
    expect(first).toMatchObject({
      session: { id: sooner.session.id },
      railwayName: 'Test railway',
      role: 'operator',
      invitationId: sooner.invitation.id,
      reply: 'needs-action',
      respondedAt: null,
      sentSequence: null,
      duties: [{ userId: w.operator.id, name: w.operator.name, duty: 'stand-by', note: 'Covers cab B.' }],
      clock: { ratio: 4, fastStart: '06:00' },
    });
    // The operator's two runs on cab A: 300 and 1500 real seconds in, × 4 = 20 and 100 fast minutes after 06:00.
    expect(first!.runs.map((r) => [r.runId, r.trainName, r.cabName, r.fastDepart, r.fastArrive])).toEqual([
      [sooner.runs[0]!.id, 'Local', 'Cab A', '06:20', '06:24'],
      [sooner.runs[2]!.id, 'Local', 'Cab A', '07:40', '07:44'],
    ]);
    expect(mine[1]!.runs.map((r) => r.runId)).toEqual([later.runs[0]!.id, later.runs[2]!.id]);
    // Someone with no runs and no duties still sees the session they are invited to.
    db().insert(t.invitations).values({ sessionId: sooner.session.id, userId: w.host.id, email: w.host.email }).run();
    signInAs(w.host);
    const hosts = await loadMyRuns(w.host.id);
    expect(hosts.map((m) => [m.session.id, m.runs, m.duties])).toEqual([[sooner.session.id, [], []]]);
  });

  it('each railway’s membership is checked again: a caller who is not a member sees nothing, one signed out is refused', async () => {
    const w = makeWorld();
    makeSessionWorld(w);
    signInAs(w.outsider);
    expect(await loadMyRuns(w.operator.id)).toEqual([]);
    signInAs(null);
    await expect(loadMyRuns(w.operator.id)).rejects.toMatchObject({ status: 401, message: 'Sign in to continue.' });
  });
});
