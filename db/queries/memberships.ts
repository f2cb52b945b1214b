import 'server-only';
import { and, asc, eq, gt, inArray, ne, or, lte, sql } from 'drizzle-orm';
import { getDb, preparedStatements, writeTransaction } from '@/db';
import {
  crewAssignments,
  invitations,
  memberInvitations,
  memberships,
  railways,
  runs,
  sessions,
  trains,
  users,
  type Role,
} from '@/db/schema';

// requireMember reads it on every request for railway data, so it is built and compiled once.
const membershipStatement = preparedStatements((db) => ({
  membership: db
    .select()
    .from(memberships)
    .where(and(eq(memberships.railwayId, sql.placeholder('railwayId')), eq(memberships.userId, sql.placeholder('userId'))))
    .prepare(),
}));

/** The caller's membership of one railway, or undefined. */
export function getMembership(railwayId: string, userId: string) {
  return membershipStatement().membership.get({ railwayId, userId });
}

/** Every railway the user belongs to, with their role there. */
export function listRailwaysOfUser(userId: string) {
  return getDb()
    .select({ id: railways.id, name: railways.name, timeZone: railways.timeZone, role: memberships.role })
    .from(memberships)
    .innerJoin(railways, eq(railways.id, memberships.railwayId))
    .where(eq(memberships.userId, userId))
    .orderBy(asc(railways.name))
    .all();
}

/** The members of one railway with their names and roles. */
export function listMembers(railwayId: string) {
  return getDb()
    .select({
      userId: users.id,
      name: users.name,
      email: users.email,
      role: memberships.role,
      joinedAt: memberships.createdAt,
      hasPassword: users.passwordHash,
    })
    .from(memberships)
    .innerJoin(users, eq(users.id, memberships.userId))
    .where(eq(memberships.railwayId, railwayId))
    .orderBy(asc(users.name))
    .all()
    .map(({ hasPassword, ...m }) => ({ ...m, hasPassword: hasPassword !== null }));
}

/** Adds a member (or leaves an existing membership as it is); returns whether it was new. */
export function addMember(railwayId: string, userId: string, role: Role): boolean {
  const result = getDb()
    .insert(memberships)
    .values({ railwayId, userId, role })
    .onConflictDoNothing()
    .run();
  return result.changes > 0;
}

export function setMemberRole(railwayId: string, userId: string, role: Role): boolean {
  return (
    getDb()
      .update(memberships)
      .set({ role })
      .where(and(eq(memberships.railwayId, railwayId), eq(memberships.userId, userId)))
      .run().changes > 0
  );
}

export function countHosts(railwayId: string): number {
  return getDb()
    .select({ userId: memberships.userId })
    .from(memberships)
    .where(and(eq(memberships.railwayId, railwayId), eq(memberships.role, 'host')))
    .all().length;
}

/**
 * The runs a member operates in this railway's sessions that are still to be run (not ended, not
 * cancelled), by session and departure: removing the member would leave them without an operator.
 */
export function listRunsStillOperatedBy(railwayId: string, userId: string, now = new Date()) {
  return getDb()
    .select({
      runId: runs.id,
      departS: runs.departS,
      trainName: trains.name,
      sessionTitle: sessions.title,
      clockRatio: sessions.clockRatio,
      fastStart: sessions.fastStart,
    })
    .from(runs)
    .innerJoin(sessions, eq(sessions.id, runs.sessionId))
    .innerJoin(trains, eq(trains.id, runs.trainId))
    .where(
      and(
        eq(sessions.railwayId, railwayId),
        eq(runs.operatorId, userId),
        ne(sessions.status, 'cancelled'),
        gt(sessions.endsAt, now),
      ),
    )
    .orderBy(asc(sessions.startsAt), asc(runs.departS))
    .all();
}

/**
 * Takes a member off a railway in one transaction: the membership, their invitations to its
 * sessions (so their reply links find nothing and no update is mailed to them), their crew duties
 * and any open offer of membership go; in sessions that are over or cancelled their runs keep no
 * operator (version raised), so every timetable stays editable. Returns whether they were a member.
 */
export function detachMember(railwayId: string, userId: string, now = new Date()): { removed: boolean; unassignedRuns: number } {
  return writeTransaction((tx) => {
    const user = tx.select({ email: users.email }).from(users).where(eq(users.id, userId)).get();
    const deleted = tx
      .delete(memberships)
      .where(and(eq(memberships.railwayId, railwayId), eq(memberships.userId, userId)))
      .run().changes;
    if (!deleted || !user) return { removed: false, unassignedRuns: 0 };
    const railwaySessions = tx.select({ id: sessions.id }).from(sessions).where(eq(sessions.railwayId, railwayId));
    tx.delete(invitations).where(and(eq(invitations.userId, userId), inArray(invitations.sessionId, railwaySessions))).run();
    tx.delete(crewAssignments).where(and(eq(crewAssignments.userId, userId), inArray(crewAssignments.sessionId, railwaySessions))).run();
    tx.delete(memberInvitations).where(and(eq(memberInvitations.railwayId, railwayId), eq(memberInvitations.email, user.email))).run();
    const finished = tx
      .select({ id: sessions.id })
      .from(sessions)
      .where(and(eq(sessions.railwayId, railwayId), or(eq(sessions.status, 'cancelled'), lte(sessions.endsAt, now))));
    const unassignedRuns = tx
      .update(runs)
      .set({ operatorId: null, version: sql`${runs.version} + 1` })
      .where(and(eq(runs.operatorId, userId), inArray(runs.sessionId, finished)))
      .run().changes;
    return { removed: true, unassignedRuns };
  });
}
