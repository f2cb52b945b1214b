import 'server-only';
import { desc, eq, sql } from 'drizzle-orm';
import { getDb } from '@/db';
import { caughtMail, outbox } from '@/db/schema';

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

/** What a list of caught mail shows of each message. */
const LISTED = {
  id: caughtMail.id,
  toAddresses: caughtMail.toAddresses,
  subject: caughtMail.subject,
  text: caughtMail.text,
  receivedAt: caughtMail.receivedAt,
};

/**
 * Messages the local server caught that this railway sent, newest first: matched by the stable
 * Message-ID of this railway's own outbox rows, never by recipient — so another railway's mail to a
 * shared member, and personal mail (sign-in links, password resets), never show here. Only used
 * while Fishplate runs its own mail catcher (no SMTP_URL).
 */
export function listCaughtMailForRailway(railwayId: string, limit = 50) {
  return getDb()
    .select(LISTED)
    .from(caughtMail)
    .innerJoin(outbox, eq(caughtMail.messageId, sql`'<' || ${outbox.id} || '@fishplate.local>'`))
    .where(eq(outbox.railwayId, railwayId))
    .orderBy(desc(caughtMail.receivedAt))
    .limit(limit)
    .all();
}

/** Messages the local server caught for one address, newest first (the owner's own view). */
export function listCaughtMailTo(email: string, limit = 50) {
  return getDb()
    .select(LISTED)
    .from(caughtMail)
    .where(sql`instr(${caughtMail.toAddresses}, ${`,${email.toLowerCase()},`}) > 0`)
    .orderBy(desc(caughtMail.receivedAt))
    .limit(limit)
    .all();
}
