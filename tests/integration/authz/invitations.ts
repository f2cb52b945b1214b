import { getDb } from '@/db';
import * as t from '@/db/schema';
import { formData } from '../world';
import { actionStatus, anyMember, everyone, hostOnly, type AuthzCase, type AuthzExemption, type Expect, type World } from './shared';

const TRACKER = 'app/(app)/railways/[railwayId]/sessions/[sessionId]/invitations/actions.ts';
const MY_RUNS = 'app/(app)/my-runs/actions.ts';

/** Signed-in users of any railway (or none): the action is about the caller alone. */
const anySignedIn: Expect = { anon: 401, outsider: 200, operator: 200, planner: 200, host: 200 };

type SessionOptions = { status?: 'draft' | 'published' | 'cancelled'; startsAt?: Date; hours?: number; title?: string; place?: string; timeZone?: string };

/**
 * A published session on the world's railway: a small layout (three blocks, two cabs, two trains),
 * three runs — two for the operator on cab A, one for the planner between them on the same cab —
 * and an invitation for the operator (not yet sent).
 */
export function makeSessionWorld(w: World, options: SessionOptions = {}) {
  const db = getDb();
  const layout = db.insert(t.layouts).values({ railwayId: w.railway.id, name: 'Test branch', scaleName: 'H0', scaleRatio: 87 }).returning().get();
  const [b1, b2, b3] = ['Yard', 'Main', 'Ærø halt'].map((name, i) =>
    db.insert(t.blocks).values({ layoutId: layout.id, name, lengthMm: 1000, positionMm: i * 1000 }).returning().get(),
  ) as [typeof t.blocks.$inferSelect, typeof t.blocks.$inferSelect, typeof t.blocks.$inferSelect];
  const supply = db.insert(t.supplies).values({ layoutId: layout.id, name: 'Bench supply', volts: 12, amps: 2 }).returning().get();
  const driver = db
    .insert(t.drivers)
    .values({ layoutId: layout.id, supplyId: supply.id, name: 'Driver 1', channels: 2, channelAmps: 1, channelPeakAmps: 2, dropVolts: 2 })
    .returning()
    .get();
  const cabA = db.insert(t.cabs).values({ layoutId: layout.id, driverId: driver.id, name: 'Cab A', channel: 1 }).returning().get();
  const cabB = db.insert(t.cabs).values({ layoutId: layout.id, driverId: driver.id, name: 'Cab B', channel: 2 }).returning().get();
  const locomotive = db
    .insert(t.locomotives)
    .values({ layoutId: layout.id, name: 'Tank engine', runningAmps: 0.3, stallAmps: 0.9, ratedVolts: 12, topSpeedKmh: 80 })
    .returning()
    .get();
  const trainOf = (name: string) => {
    const train = db.insert(t.trains).values({ layoutId: layout.id, name, lengthMm: 300 }).returning().get();
    db.insert(t.trainLocomotives).values({ trainId: train.id, locomotiveId: locomotive.id, position: 0 }).run();
    return train;
  };
  const local = trainOf('Local');
  const freight = trainOf('Freight');
  // Whole minutes, as a host would type them (iCalendar times have whole seconds).
  const startsAt = options.startsAt ?? new Date(Math.floor((Date.now() + 7 * 24 * 3600_000) / 60_000) * 60_000);
  const session = db
    .insert(t.sessions)
    .values({
      railwayId: w.railway.id,
      layoutId: layout.id,
      title: options.title ?? 'Test running evening',
      place: options.place ?? 'Club room',
      description: 'A test session.',
      startsAt,
      endsAt: new Date(startsAt.getTime() + (options.hours ?? 3) * 3600_000),
      timeZone: options.timeZone ?? 'UTC',
      clockRatio: 4,
      fastStart: '06:00',
      headwayS: 30,
      surgeS: 2,
      derate: 0.8,
      status: options.status ?? 'published',
    })
    .returning()
    .get();
  const run = (train: typeof t.blocks.$inferSelect | typeof local, cab: typeof cabA, operatorId: string, departS: number) => {
    const r = db
      .insert(t.runs)
      .values({ sessionId: session.id, trainId: train.id, cabId: cab.id, operatorId, departS, arriveS: departS + 60 })
      .returning()
      .get();
    [b1, b2, b3].forEach((b, position) =>
      db.insert(t.runSteps).values({ runId: r.id, position, blockId: b.id, enterS: position === 0 ? departS - 120 : departS + position * 20, exitS: position === 2 ? departS + 60 + 180 : departS + position * 20 + 25 }).run(),
    );
    return r;
  };
  const runs = [run(local, cabA, w.operator.id, 300), run(freight, cabA, w.planner.id, 900), run(local, cabA, w.operator.id, 1500), run(freight, cabB, w.planner.id, 2000)];
  const invitation = db.insert(t.invitations).values({ sessionId: session.id, userId: w.operator.id, email: w.operator.email }).returning().get();
  db.insert(t.crewAssignments).values({ sessionId: session.id, userId: w.operator.id, duty: 'stand-by', note: 'Covers cab B.' }).run();
  return { layout, session, runs, invitation, cabs: { cabA, cabB }, blocks: [b1, b2, b3] };
}

/** Invitations for every member of the world's railway (the operator's exists already). */
export function inviteEveryone(w: World, sessionId: string) {
  const db = getDb();
  for (const u of [w.host, w.planner]) db.insert(t.invitations).values({ sessionId, userId: u.id, email: u.email }).onConflictDoNothing().run();
  return db.select().from(t.invitations).all().filter((i) => i.sessionId === sessionId);
}

export const INVITATION_CASES: AuthzCase[] = [
  {
    target: `${TRACKER}#inviteCrew`,
    call: async (w) => {
      const { inviteCrew } = await import('@/app/(app)/railways/[railwayId]/sessions/[sessionId]/invitations/actions');
      const { session } = makeSessionWorld(w);
      const data = formData({ guestEmails: 'guest-authz@test.example' });
      data.append('userIds', w.planner.id);
      return actionStatus(() => inviteCrew(w.railway.id, session.id, null, data));
    },
    expect: hostOnly,
  },
  {
    target: `${TRACKER}#sendNotices`,
    call: async (w) => {
      const { sendNotices } = await import('@/app/(app)/railways/[railwayId]/sessions/[sessionId]/invitations/actions');
      const { session } = makeSessionWorld(w);
      return actionStatus(() => sendNotices(w.railway.id, session.id, null, formData({ kind: 'pending' })));
    },
    expect: hostOnly,
  },
  {
    target: `${TRACKER}#resendInvitation`,
    call: async (w) => {
      const { resendInvitation } = await import('@/app/(app)/railways/[railwayId]/sessions/[sessionId]/invitations/actions');
      const { session, invitation } = makeSessionWorld(w);
      return actionStatus(() => resendInvitation(w.railway.id, session.id, null, formData({ invitationId: invitation.id })));
    },
    expect: hostOnly,
  },
  {
    target: `${TRACKER}#remindCrew`,
    call: async (w) => {
      const { remindCrew } = await import('@/app/(app)/railways/[railwayId]/sessions/[sessionId]/invitations/actions');
      const { session } = makeSessionWorld(w);
      return actionStatus(() => remindCrew(w.railway.id, session.id, null, formData({})));
    },
    expect: hostOnly,
  },
  {
    target: `${TRACKER}#setReplyDeadline`,
    call: async (w) => {
      const { setReplyDeadline } = await import('@/app/(app)/railways/[railwayId]/sessions/[sessionId]/invitations/actions');
      const { session } = makeSessionWorld(w);
      return actionStatus(() => setReplyDeadline(w.railway.id, session.id, null, formData({ replyBy: '' })));
    },
    expect: hostOnly,
  },
  {
    // Each member replies to their own invitation; the outsider tries the operator's (404).
    target: `${MY_RUNS}#replyToInvitation`,
    call: async (w) => {
      const { replyToInvitation } = await import('@/app/(app)/my-runs/actions');
      const { session, invitation } = makeSessionWorld(w);
      const all = inviteEveryone(w, session.id);
      const { caller } = await import('../caller');
      const own = all.find((i) => i.userId === caller.user?.id) ?? invitation;
      return actionStatus(() => replyToInvitation(own.id, null, formData({ reply: 'accepted' })));
    },
    expect: anyMember,
  },
  {
    target: `${MY_RUNS}#resetCalendarFeed`,
    call: async () => {
      const { resetCalendarFeed } = await import('@/app/(app)/my-runs/actions');
      return actionStatus(() => resetCalendarFeed(null, formData({})));
    },
    expect: anySignedIn,
  },
  {
    // A reply link works without signing in: every caller gets the same answer.
    target: 'app/(public)/reply/actions.ts#replyByToken',
    call: async (w) => {
      const { replyByToken } = await import('@/app/(public)/reply/actions');
      const { signReplyToken } = await import('@/lib/invitations/reply-token');
      const { session, invitation } = makeSessionWorld(w);
      const token = signReplyToken({ railwayId: w.railway.id, invitationId: invitation.id, nonce: 0, expiresAt: session.endsAt.getTime() });
      return actionStatus(async () => {
        const state = await replyByToken(null, formData({ token, reply: 'tentative' }));
        return state?.ok ? { ok: true } : state;
      });
    },
    expect: everyone,
  },
  {
    target: 'app/api/sessions/[sessionId]/calendar.ics/route.ts#GET',
    call: async (w) => {
      const { GET } = await import('@/app/api/sessions/[sessionId]/calendar.ics/route');
      const { session } = makeSessionWorld(w);
      const response = await GET(new Request('http://test/api'), { params: Promise.resolve({ sessionId: session.id }) });
      return response.status;
    },
    expect: anyMember,
  },
  {
    // The feed is addressed by its secret token alone (calendar apps cannot sign in).
    target: 'app/api/calendar/[token]/route.ts#GET',
    call: async (w) => {
      const { GET } = await import('@/app/api/calendar/[token]/route');
      const { getCalendarToken } = await import('@/db/queries/calendar-feed');
      makeSessionWorld(w);
      const token = getCalendarToken(w.operator.id)!;
      const response = await GET(new Request('http://test/api'), { params: Promise.resolve({ token }) });
      return response.status;
    },
    expect: everyone,
  },
];

export const INVITATION_EXEMPTIONS: AuthzExemption[] = [];
