import 'server-only';
import { and, desc, eq, inArray, lte, sql } from 'drizzle-orm';
import { getDb, writeTransaction } from '@/db';
import { outbox, type OutboxMessage } from '@/db/schema';

export type NewOutboxMessage = {
  railwayId: string | null;
  invitationId?: string | null;
  dedupeKey: string;
  kind: string;
  toAddress: string;
  subject: string;
  text: string;
  html?: string | null;
  calendarMethod?: string | null;
  calendar?: string | null;
};

/** Queues a message; a second message with the same dedupe key is ignored. Returns whether queued. */
export function enqueueMail(message: NewOutboxMessage): boolean {
  return getDb().insert(outbox).values(message).onConflictDoNothing({ target: outbox.dedupeKey }).run().changes > 0;
}

/**
 * Claims up to `limit` messages that are due, marking them `sending` in the same statement so that
 * two workers never take the same one.
 */
export function claimDueMail(limit: number, now = new Date()): OutboxMessage[] {
  return writeTransaction((tx) => {
    const due = tx
      .select({ id: outbox.id })
      .from(outbox)
      .where(and(eq(outbox.status, 'queued'), lte(outbox.nextAttemptAt, now)))
      .orderBy(outbox.createdAt)
      .limit(limit)
      .all()
      .map((r) => r.id);
    if (due.length === 0) return [];
    return tx
      .update(outbox)
      .set({ status: 'sending', attempts: sql`${outbox.attempts} + 1` })
      .where(inArray(outbox.id, due))
      .returning()
      .all();
  });
}

export function markMailSent(id: string): void {
  getDb().update(outbox).set({ status: 'sent', sentAt: new Date(), lastError: null }).where(eq(outbox.id, id)).run();
}

/** Records a failed attempt: back to the queue at `retryAt`, or `failed` when retries are spent. */
export function markMailFailed(id: string, error: string, retryAt: Date | null): void {
  getDb()
    .update(outbox)
    .set(
      retryAt
        ? { status: 'queued', lastError: error, nextAttemptAt: retryAt }
        : { status: 'failed', lastError: error },
    )
    .where(eq(outbox.id, id))
    .run();
}

/** After a restart, messages left `sending` go back to the queue (they carry a stable Message-ID). */
export function requeueInterruptedMail(): number {
  return getDb().update(outbox).set({ status: 'queued' }).where(eq(outbox.status, 'sending')).run().changes;
}

/** A railway's outgoing messages, newest first. */
export function listOutbox(railwayId: string, limit = 100) {
  return getDb()
    .select({
      id: outbox.id,
      kind: outbox.kind,
      toAddress: outbox.toAddress,
      subject: outbox.subject,
      status: outbox.status,
      attempts: outbox.attempts,
      lastError: outbox.lastError,
      createdAt: outbox.createdAt,
      sentAt: outbox.sentAt,
    })
    .from(outbox)
    .where(eq(outbox.railwayId, railwayId))
    .orderBy(desc(outbox.createdAt))
    .limit(limit)
    .all();
}
