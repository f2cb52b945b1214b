import 'server-only';
import {
  claimDueMail,
  enqueueMail,
  markMailFailed,
  markMailSent,
  requeueInterruptedMail,
  type NewOutboxMessage,
} from '@/db/queries/outbox';
import type { OutboxMessage } from '@/db/schema';
import { env } from '@/lib/env';
import { getTransport } from '@/lib/mail/transport';

export { enqueueMail };
export type { NewOutboxMessage };

const MAX_ATTEMPTS = 8;

/** Backoff after the n-th failed attempt: 5 s, 10 s, 20 s … capped at 10 minutes. */
export function retryDelayMs(attempt: number): number {
  return Math.min(5_000 * 2 ** Math.max(0, attempt - 1), 10 * 60_000);
}

async function send(message: OutboxMessage): Promise<void> {
  await getTransport().sendMail({
    from: env().MAIL_FROM,
    to: message.toAddress,
    subject: message.subject,
    text: message.text,
    ...(message.html ? { html: message.html } : {}),
    // A stable Message-ID: a message re-sent after a crash is recognised as the same one.
    messageId: `<${message.id}@fishplate.local>`,
    ...(message.calendar && message.calendarMethod
      ? { icalEvent: { method: message.calendarMethod, content: message.calendar } }
      : {}),
  });
}

/** Sends every message that is due; returns how many were sent and how many failed. */
export async function deliverDueMail(limit = 50): Promise<{ sent: number; failed: number }> {
  let sent = 0;
  let failed = 0;
  for (;;) {
    const batch = claimDueMail(limit);
    if (batch.length === 0) break;
    await Promise.all(
      batch.map(async (message) => {
        try {
          await send(message);
          markMailSent(message.id);
          sent += 1;
        } catch (error) {
          failed += 1;
          const reason = error instanceof Error ? error.message : String(error);
          const retryAt =
            message.attempts >= MAX_ATTEMPTS ? null : new Date(Date.now() + retryDelayMs(message.attempts));
          markMailFailed(message.id, reason, retryAt);
        }
      }),
    );
    if (failed > 0) break;
  }
  return { sent, failed };
}

const globalForWorker = globalThis as unknown as { fishplateOutboxTimer?: NodeJS.Timeout };

/** Starts the in-process outbox worker (once per process). */
export function startOutboxWorker(intervalMs = 1_000): void {
  if (globalForWorker.fishplateOutboxTimer) return;
  requeueInterruptedMail();
  let busy = false;
  globalForWorker.fishplateOutboxTimer = setInterval(() => {
    if (busy) return;
    busy = true;
    deliverDueMail()
      .catch((error) => console.error('outbox worker', error))
      .finally(() => {
        busy = false;
      });
  }, intervalMs);
  globalForWorker.fishplateOutboxTimer.unref();
}
