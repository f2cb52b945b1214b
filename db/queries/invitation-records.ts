import 'server-only';
import { and, asc, desc, eq, inArray, sql } from 'drizzle-orm';
import { getDb, writeTransaction } from '@/db';
import { invitations, outbox, railways, sessions, users, type ReplyState } from '@/db/schema';

/** Runs `fn` in one write transaction on the process's one connection (so every query inside joins it). */
export function runInTransaction<T>(fn: () => T): T {
  return writeTransaction(() => fn());
}

/** One session of one railway, or undefined (another railway's id reads as missing). */
export function getRailwaySession(railwayId: string, sessionId: string) {
  return getDb()
    .select()
    .from(sessions)
    .where(and(eq(sessions.id, sessionId), eq(sessions.railwayId, railwayId)))
    .get();
}

/** The railway a session belongs to, for handlers addressed by session id alone. */
export function findSessionRailwayId(sessionId: string): string | undefined {
  return getDb().select({ railwayId: sessions.railwayId }).from(sessions).where(eq(sessions.id, sessionId)).get()?.railwayId;
}

export type InvitationMail = {
  outboxId: string;
  status: 'queued' | 'sending' | 'sent' | 'failed';
  calendarMethod: string | null;
  attempts: number;
  lastError: string | null;
  sentAt: Date | null;
  createdAt: Date;
};

/**
 * A session's invitations with the invitee's name and the latest e-mail queued for each (none: the
 * invitation exists but nothing was sent yet), by name.
 */
export function listSessionInvitations(sessionId: string) {
  const db = getDb();
  const rows = db
    .select({
      id: invitations.id,
      userId: invitations.userId,
      email: invitations.email,
      name: users.name,
      reply: invitations.reply,
      respondedAt: invitations.respondedAt,
      replyNonce: invitations.replyNonce,
      sentSequence: invitations.sentSequence,
      sentSnapshot: invitations.sentSnapshot,
      remindedAt: invitations.remindedAt,
      reminderCount: invitations.reminderCount,
      comment: invitations.comment,
      createdAt: invitations.createdAt,
    })
    .from(invitations)
    .innerJoin(users, eq(users.id, invitations.userId))
    .where(eq(invitations.sessionId, sessionId))
    .orderBy(asc(users.name), asc(invitations.email))
    .all();
  const ids = rows.map((r) => r.id);
  const latest = new Map<string, InvitationMail>();
  const mailCount = new Map<string, number>();
  if (ids.length) {
    const mail = db
      .select({
        invitationId: outbox.invitationId,
        outboxId: outbox.id,
        status: outbox.status,
        calendarMethod: outbox.calendarMethod,
        attempts: outbox.attempts,
        lastError: outbox.lastError,
        sentAt: outbox.sentAt,
        createdAt: outbox.createdAt,
      })
      .from(outbox)
      .where(inArray(outbox.invitationId, ids))
      .orderBy(desc(outbox.createdAt), desc(sql`rowid`))
      .all();
    for (const { invitationId, ...m } of mail) {
      if (!invitationId) continue;
      if (!latest.has(invitationId)) latest.set(invitationId, m);
      mailCount.set(invitationId, (mailCount.get(invitationId) ?? 0) + 1);
    }
  }
  return rows.map((r) => ({ ...r, mail: latest.get(r.id) ?? null, mailCount: mailCount.get(r.id) ?? 0 }));
}

/** One invitation with its session and railway, for replies and resends. */
export function getInvitationWithSession(invitationId: string) {
  return getDb()
    .select({
      invitation: invitations,
      session: sessions,
      railwayName: railways.name,
      inviteeName: users.name,
    })
    .from(invitations)
    .innerJoin(sessions, eq(sessions.id, invitations.sessionId))
    .innerJoin(railways, eq(railways.id, sessions.railwayId))
    .innerJoin(users, eq(users.id, invitations.userId))
    .where(eq(invitations.id, invitationId))
    .get();
}

/** Adds invitations for users not invited yet; returns the new rows (existing ones are left alone). */
export function insertInvitations(sessionId: string, invitees: { userId: string; email: string }[]) {
  if (invitees.length === 0) return [];
  return getDb()
    .insert(invitations)
    .values(invitees.map((i) => ({ sessionId, userId: i.userId, email: i.email })))
    .onConflictDoNothing({ target: [invitations.sessionId, invitations.userId] })
    .returning()
    .all();
}

/**
 * Records a reply if the invitation's reply nonce is still `expectedNonce` (null: whatever it is,
 * for a signed-in member replying on their own page), raising the nonce in the same statement so
 * that two requests with one link cannot both count; `comment` replaces the note with the reply
 * (undefined leaves it). Returns the updated row, or undefined.
 */
export function updateInvitationReply(invitationId: string, expectedNonce: number | null, reply: ReplyState, now = new Date(), comment?: string) {
  const where = [eq(invitations.id, invitationId)];
  if (expectedNonce !== null) where.push(eq(invitations.replyNonce, expectedNonce));
  return getDb()
    .update(invitations)
    .set({ reply, respondedAt: now, replyNonce: sql`${invitations.replyNonce} + 1`, ...(comment === undefined ? {} : { comment }) })
    .where(and(...where))
    .returning()
    .get();
}

/**
 * Notes the SEQUENCE last queued to each invitation and, for an invitation or update, what it told
 * the person (null: leave the stored snapshot, as a cancellation does).
 */
export function markInvitationsQueued(entries: { id: string; sequence: number; told: string | null }[]): void {
  const db = getDb();
  for (const entry of entries) {
    db.update(invitations)
      .set(entry.told === null ? { sentSequence: entry.sequence } : { sentSequence: entry.sequence, sentSnapshot: entry.told })
      .where(eq(invitations.id, entry.id))
      .run();
  }
}

/** Notes a reminder sent to these invitations now. */
export function markInvitationsReminded(invitationIds: string[], now: Date): void {
  if (invitationIds.length === 0) return;
  getDb()
    .update(invitations)
    .set({ remindedAt: now, reminderCount: sql`${invitations.reminderCount} + 1` })
    .where(inArray(invitations.id, invitationIds))
    .run();
}

/** Sets or clears a session's reply deadline. */
export function setSessionReplyBy(railwayId: string, sessionId: string, replyBy: Date | null): void {
  getDb().update(sessions).set({ replyBy }).where(and(eq(sessions.id, sessionId), eq(sessions.railwayId, railwayId))).run();
}

/** Puts a failed invitation e-mail back in the queue, due now; returns whether it was failed. */
export function requeueFailedInvitationMail(outboxId: string, invitationId: string): boolean {
  return (
    getDb()
      .update(outbox)
      .set({ status: 'queued', nextAttemptAt: new Date(), attempts: 0 })
      .where(and(eq(outbox.id, outboxId), eq(outbox.invitationId, invitationId), eq(outbox.status, 'failed')))
      .run().changes > 0
  );
}
