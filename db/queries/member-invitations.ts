import 'server-only';
import { and, asc, eq } from 'drizzle-orm';
import { getDb } from '@/db';
import { memberInvitations, railways, users, type Role } from '@/db/schema';

/** Offers membership to an address, or changes the role of the offer already there. */
export function upsertMemberInvitation(input: { railwayId: string; email: string; role: Role; invitedById: string }) {
  return getDb()
    .insert(memberInvitations)
    .values(input)
    .onConflictDoUpdate({
      target: [memberInvitations.railwayId, memberInvitations.email],
      set: { role: input.role, invitedById: input.invitedById },
    })
    .returning()
    .get();
}

/** A railway's open offers, for its hosts. */
export function listMemberInvitations(railwayId: string) {
  return getDb()
    .select({ id: memberInvitations.id, email: memberInvitations.email, role: memberInvitations.role, createdAt: memberInvitations.createdAt })
    .from(memberInvitations)
    .where(eq(memberInvitations.railwayId, railwayId))
    .orderBy(asc(memberInvitations.email))
    .all();
}

/** The offers made to one address, with the railway's name and who offered. */
export function listMemberInvitationsFor(email: string) {
  return getDb()
    .select({
      id: memberInvitations.id,
      railwayId: memberInvitations.railwayId,
      railwayName: railways.name,
      role: memberInvitations.role,
      invitedBy: users.name,
      createdAt: memberInvitations.createdAt,
    })
    .from(memberInvitations)
    .innerJoin(railways, eq(railways.id, memberInvitations.railwayId))
    .leftJoin(users, eq(users.id, memberInvitations.invitedById))
    .where(eq(memberInvitations.email, email.toLowerCase()))
    .orderBy(asc(railways.name))
    .all();
}

/** Removes one offer made to this address; returns it, or undefined when there was none. */
export function takeMemberInvitation(id: string, email: string) {
  return getDb()
    .delete(memberInvitations)
    .where(and(eq(memberInvitations.id, id), eq(memberInvitations.email, email.toLowerCase())))
    .returning()
    .get();
}

/** Withdraws a railway's offer to an address; returns whether there was one. */
export function withdrawMemberInvitation(railwayId: string, email: string): boolean {
  return (
    getDb()
      .delete(memberInvitations)
      .where(and(eq(memberInvitations.railwayId, railwayId), eq(memberInvitations.email, email.toLowerCase())))
      .run().changes > 0
  );
}
