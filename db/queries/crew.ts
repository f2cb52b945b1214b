import 'server-only';
import { and, asc, eq, gte, inArray } from 'drizzle-orm';
import { getDb } from '@/db';
import { crewAssignments, invitations, memberships, railways, sessions, users } from '@/db/schema';

/**
 * The published sessions a user is invited to, on railways they are still a member of, that end
 * after `from`, soonest first, with their invitation.
 */
export function listInvitedSessions(userId: string, from: Date, statuses: ('published' | 'cancelled')[] = ['published']) {
  return getDb()
    .select({
      session: sessions,
      railwayName: railways.name,
      role: memberships.role,
      invitationId: invitations.id,
      reply: invitations.reply,
      respondedAt: invitations.respondedAt,
      sentSequence: invitations.sentSequence,
    })
    .from(invitations)
    .innerJoin(sessions, eq(sessions.id, invitations.sessionId))
    .innerJoin(railways, eq(railways.id, sessions.railwayId))
    .innerJoin(memberships, and(eq(memberships.railwayId, sessions.railwayId), eq(memberships.userId, userId)))
    .where(and(eq(invitations.userId, userId), inArray(sessions.status, statuses), gte(sessions.endsAt, from)))
    .orderBy(asc(sessions.startsAt))
    .all();
}

/** A session's crew duties (driver, stand-by, yard …), with names, for everyone or one user. */
export function listCrewDuties(sessionId: string, userId?: string) {
  const where = [eq(crewAssignments.sessionId, sessionId)];
  if (userId) where.push(eq(crewAssignments.userId, userId));
  return getDb()
    .select({ userId: crewAssignments.userId, name: users.name, duty: crewAssignments.duty, note: crewAssignments.note })
    .from(crewAssignments)
    .innerJoin(users, eq(users.id, crewAssignments.userId))
    .where(and(...where))
    .orderBy(asc(users.name), asc(crewAssignments.duty))
    .all();
}

/** The user's invitation to one session, if any. */
export function getInvitationOf(sessionId: string, userId: string) {
  return getDb()
    .select()
    .from(invitations)
    .where(and(eq(invitations.sessionId, sessionId), eq(invitations.userId, userId)))
    .get();
}
