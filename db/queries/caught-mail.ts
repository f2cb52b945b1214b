import 'server-only';
import { desc, eq, or, sql } from 'drizzle-orm';
import { getDb } from '@/db';
import { caughtMail, memberships, users } from '@/db/schema';

/** Keeps a message the local mail server received; a repeated Message-ID is ignored. */
export function storeCaughtMail(message: {
  messageId: string | null;
  fromAddress: string;
  toAddresses: string;
  subject: string;
  text: string;
  html: string | null;
  raw: string;
}): boolean {
  return getDb().insert(caughtMail).values(message).onConflictDoNothing().run().changes > 0;
}

/**
 * Messages the local server caught that were addressed to members of this railway, newest first.
 * Only used while Fishplate runs its own mail catcher (no SMTP_URL).
 */
export function listCaughtMailForRailway(railwayId: string, limit = 50) {
  const db = getDb();
  const addresses = db
    .select({ email: users.email })
    .from(memberships)
    .innerJoin(users, eq(users.id, memberships.userId))
    .where(eq(memberships.railwayId, railwayId))
    .all()
    .map((r) => r.email);
  if (addresses.length === 0) return [];
  return db
    .select()
    .from(caughtMail)
    .where(or(...addresses.map((a) => sql`instr(${caughtMail.toAddresses}, ${`,${a},`}) > 0`)))
    .orderBy(desc(caughtMail.receivedAt))
    .limit(limit)
    .all();
}
