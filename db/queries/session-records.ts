import 'server-only';
import { and, eq, inArray, sql } from 'drizzle-orm';
import { getDb, preparedStatements, writeTransaction } from '@/db';
import { invitations, layouts, runs, runSteps, sessions, type Session, type SessionStatus } from '@/db/schema';

// Every session page and handler asks these (the access check, the builder's crew), so they are built and compiled once.
const statements = preparedStatements((db) => {
  const sessionId = sql.placeholder('sessionId');
  return {
    session: db.select().from(sessions).where(eq(sessions.id, sessionId)).prepare(),
    invited: db
      .select({ id: invitations.id })
      .from(invitations)
      .where(and(eq(invitations.sessionId, sessionId), eq(invitations.userId, sql.placeholder('userId'))))
      .prepare(),
    replies: db.select({ userId: invitations.userId, reply: invitations.reply }).from(invitations).where(eq(invitations.sessionId, sessionId)).prepare(),
  };
});

/** One session by id, whatever railway it belongs to; callers check the railway with requireMember. */
export function getSessionById(sessionId: string): Session | undefined {
  return statements().session.get({ sessionId });
}

/** Whether the user has an invitation to the session. */
export function isInvited(sessionId: string, userId: string): boolean {
  return statements().invited.get({ sessionId, userId }) !== undefined;
}

/** The RSVP of each invitee of a session, by user id. */
export function replyByUser(sessionId: string): Map<string, string> {
  return new Map(statements().replies.all({ sessionId }).map((r) => [r.userId, r.reply]));
}

/** A layout of the railway, or undefined when the id names another railway's layout. */
export function getRailwayLayout(railwayId: string, layoutId: string) {
  return getDb()
    .select()
    .from(layouts)
    .where(and(eq(layouts.id, layoutId), eq(layouts.railwayId, railwayId)))
    .get();
}

export type SessionValues = Pick<
  Session,
  'title' | 'place' | 'description' | 'startsAt' | 'endsAt' | 'clockRatio' | 'fastStart' | 'headwayS' | 'surgeS' | 'derate'
> &
  Partial<Pick<Session, 'standS' | 'punctualFastMin'>>;

/** Creates a draft session on one of the railway's layouts. */
export function insertSession(railwayId: string, layoutId: string, timeZone: string, values: SessionValues): Session {
  return getDb()
    .insert(sessions)
    .values({ ...values, railwayId, layoutId, timeZone, status: 'draft', sequence: 0 })
    .returning()
    .get();
}

/**
 * Applies `change(current)` if the session (of this railway) is still at `version`, bumping the
 * version; returns the saved row, or undefined when it is missing or stale.
 */
function updateAtVersion(
  railwayId: string,
  sessionId: string,
  version: number,
  change: (current: Session) => Partial<typeof sessions.$inferInsert>,
): Session | undefined {
  return writeTransaction((tx) => {
    const current = tx
      .select()
      .from(sessions)
      .where(and(eq(sessions.id, sessionId), eq(sessions.railwayId, railwayId)))
      .get();
    if (!current || current.version !== version) return undefined;
    return tx
      .update(sessions)
      .set({ ...change(current), version: current.version + 1 })
      .where(eq(sessions.id, sessionId))
      .returning()
      .get();
  });
}

/**
 * Saves new settings if the row is still at `version`; raises `sequence` when the start or end
 * moved (RFC 5546 2.1.4: SEQUENCE goes up when DTSTART or DTEND change). Returns the saved row, or
 * undefined when the version is stale.
 */
export function updateSessionSettings(railwayId: string, sessionId: string, version: number, values: SessionValues): Session | undefined {
  return updateAtVersion(railwayId, sessionId, version, (current) => {
    const moved = current.startsAt.getTime() !== values.startsAt.getTime() || current.endsAt.getTime() !== values.endsAt.getTime();
    return { ...values, sequence: current.sequence + (moved ? 1 : 0) };
  });
}

/** Moves a session to a new status if still at `version`, raising `sequence` (RFC 5546 2.1.4 and 3.2.5). */
export function updateSessionStatus(railwayId: string, sessionId: string, version: number, status: SessionStatus): Session | undefined {
  return updateAtVersion(railwayId, sessionId, version, (current) => ({
    status,
    sequence: current.sequence + (current.status === status ? 0 : 1),
  }));
}

/**
 * Copies a session's settings, runs and steps into a new draft starting `shiftMs` later (the runs
 * keep their times from the session's start), in one transaction.
 */
export function copySession(source: Session, shiftMs: number, title: string): Session {
  return writeTransaction((tx) => {
    const { id: _id, createdAt: _c, version: _v, sequence: _s, status: _st, ...rest } = source;
    const copy = tx
      .insert(sessions)
      .values({
        ...rest,
        title,
        startsAt: new Date(source.startsAt.getTime() + shiftMs),
        endsAt: new Date(source.endsAt.getTime() + shiftMs),
        status: 'draft',
        sequence: 0,
      })
      .returning()
      .get();
    const sourceRuns = tx.select().from(runs).where(eq(runs.sessionId, source.id)).all();
    const steps = sourceRuns.length
      ? tx.select().from(runSteps).where(inArray(runSteps.runId, sourceRuns.map((r) => r.id))).all()
      : [];
    for (const run of sourceRuns) {
      const { id: runId, version: _rv, sessionId: _sid, ...runRest } = run;
      const newId = tx.insert(runs).values({ ...runRest, sessionId: copy.id }).returning({ id: runs.id }).get().id;
      const own = steps.filter((s) => s.runId === runId);
      if (own.length) {
        tx.insert(runSteps)
          .values(own.map(({ id: _stepId, runId: _r, ...s }) => ({ ...s, runId: newId })))
          .run();
      }
    }
    return copy;
  });
}
