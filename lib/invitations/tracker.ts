import type { ReplyState, SessionStatus } from '@/db/enums';

export type Delivery = 'not-sent' | 'queued' | 'retrying' | 'sent' | 'failed';

export const DELIVERY_LABELS: Record<Delivery, string> = {
  'not-sent': 'not sent yet',
  queued: 'queued',
  retrying: 'retrying',
  sent: 'sent',
  failed: 'failed',
};

export const REPLY_LABELS: Record<ReplyState, string> = {
  'needs-action': 'no reply yet',
  accepted: 'accepted',
  tentative: 'maybe',
  declined: 'declined',
};

type TrackedInvitation = {
  reply: ReplyState;
  sentSequence: number | null;
  mailCount: number;
  mail: { status: 'queued' | 'sending' | 'sent' | 'failed'; lastError: string | null; calendarMethod: string | null } | null;
};

/** Where an invitation's latest e-mail is. No outbox row means nothing was sent yet. */
export function deliveryOf(inv: TrackedInvitation): Delivery {
  if (!inv.mail) return 'not-sent';
  if (inv.mail.status === 'failed') return 'failed';
  if (inv.mail.status === 'sent') return 'sent';
  return inv.mail.lastError ? 'retrying' : 'queued';
}

/** True when the person was sent something but not yet the cancellation. */
export function needsCancel(inv: TrackedInvitation, session: { status: SessionStatus }): boolean {
  return session.status === 'cancelled' && inv.mailCount > 0 && inv.mail?.calendarMethod !== 'CANCEL';
}

/** Counts per delivery state and per reply, for the tracker's tiles. */
export function countStates(invitations: TrackedInvitation[]) {
  const delivery: Record<Delivery, number> = { 'not-sent': 0, queued: 0, retrying: 0, sent: 0, failed: 0 };
  const replies: Record<ReplyState, number> = { 'needs-action': 0, accepted: 0, tentative: 0, declined: 0 };
  for (const inv of invitations) {
    delivery[deliveryOf(inv)] += 1;
    replies[inv.reply] += 1;
  }
  return { delivery, replies, total: invitations.length };
}
