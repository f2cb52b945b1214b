import 'server-only';
import { and, asc, eq } from 'drizzle-orm';
import { getDb } from '@/db';
import { memberships, railways, users, type Role } from '@/db/schema';

/** The caller's membership of one railway, or undefined. */
export function getMembership(railwayId: string, userId: string) {
  return getDb()
    .select()
    .from(memberships)
    .where(and(eq(memberships.railwayId, railwayId), eq(memberships.userId, userId)))
    .get();
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

export function removeMember(railwayId: string, userId: string): boolean {
  return (
    getDb()
      .delete(memberships)
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
