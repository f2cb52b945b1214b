import { describe, expect, it, vi } from 'vitest';
import { countStates, deliveryOf, needsCancel } from '@/lib/invitations/tracker';

// The host's tracker: where each invitation's latest e-mail is, who still needs the cancellation,
// and the tiles' counts. Common practice (an outbox row's state as the mail worker leaves it);
// METHOD:CANCEL is the iTIP method that removes the event from the invitee's calendar (RFC 5546 3.2.5).

type Tracked = Parameters<typeof deliveryOf>[0];
const inv = (over: Partial<Tracked> = {}): Tracked => ({ reply: 'needs-action', sentSequence: null, mailCount: 0, mail: null, ...over });
const mail = (status: 'queued' | 'sending' | 'sent' | 'failed', lastError: string | null = null, calendarMethod: string | null = 'REQUEST') => ({
  status,
  lastError,
  calendarMethod,
});

describe('an invitation’s delivery', () => {
  it('no outbox row is not sent yet; then queued, retrying after an error, sent or failed', () => {
    expect(deliveryOf(inv())).toBe('not-sent');
    expect(deliveryOf(inv({ mail: mail('queued') }))).toBe('queued');
    expect(deliveryOf(inv({ mail: mail('sending') }))).toBe('queued');
    expect(deliveryOf(inv({ mail: mail('queued', 'connection refused') }))).toBe('retrying');
    expect(deliveryOf(inv({ mail: mail('sending', 'timed out') }))).toBe('retrying');
    expect(deliveryOf(inv({ mail: mail('sent') }))).toBe('sent');
    expect(deliveryOf(inv({ mail: mail('sent', 'an earlier attempt failed') }))).toBe('sent');
    expect(deliveryOf(inv({ mail: mail('failed', '550 no such user') }))).toBe('failed');
    expect(deliveryOf(inv({ mail: mail('failed') }))).toBe('failed');
  });

  it('the labels the tracker shows for each delivery state and reply', async () => {
    // Imported here, not at the top: these are module-level values, and a mutation test switches its
    // change on only once the file's own imports have run.
    vi.resetModules();
    const { DELIVERY_LABELS, REPLY_LABELS } = await import('@/lib/invitations/tracker');
    expect(DELIVERY_LABELS).toEqual({ 'not-sent': 'not sent yet', queued: 'queued', retrying: 'retrying', sent: 'sent', failed: 'failed' });
    // The reply states are iTIP's PARTSTAT values (RFC 5545 3.2.12), shown in plain words.
    expect(REPLY_LABELS).toEqual({ 'needs-action': 'no reply yet', accepted: 'accepted', tentative: 'maybe', declined: 'declined' });
  });
});

describe('who still needs the cancellation', () => {
  it('only in a cancelled session, only someone sent something, and not once the CANCEL is their latest mail', () => {
    const cancelled = { status: 'cancelled' as const };
    expect(needsCancel(inv({ mailCount: 1, mail: mail('sent') }), cancelled)).toBe(true);
    expect(needsCancel(inv({ mailCount: 2, mail: mail('failed', 'x', 'CANCEL') }), cancelled)).toBe(false);
    expect(needsCancel(inv({ mailCount: 0 }), cancelled)).toBe(false);
    expect(needsCancel(inv({ mailCount: 1, mail: mail('sent') }), { status: 'published' })).toBe(false);
    expect(needsCancel(inv({ mailCount: 1, mail: mail('sent') }), { status: 'draft' })).toBe(false);
    // A reminder has no calendar part (no METHOD): the person still holds the event.
    expect(needsCancel(inv({ mailCount: 1, mail: mail('sent', null, null) }), cancelled)).toBe(true);
  });
});

describe('the tracker’s tiles', () => {
  it('counts each delivery state and each reply, and the total', () => {
    expect(countStates([])).toEqual({
      delivery: { 'not-sent': 0, queued: 0, retrying: 0, sent: 0, failed: 0 },
      replies: { 'needs-action': 0, accepted: 0, tentative: 0, declined: 0 },
      total: 0,
    });
    expect(
      countStates([
        inv(),
        inv({ reply: 'accepted', mailCount: 1, mail: mail('sent') }),
        inv({ reply: 'accepted', mailCount: 1, mail: mail('sent') }),
        inv({ reply: 'declined', mailCount: 1, mail: mail('failed', 'x') }),
        inv({ reply: 'tentative', mailCount: 1, mail: mail('queued', 'x') }),
        inv({ mailCount: 1, mail: mail('queued') }),
      ]),
    ).toEqual({
      delivery: { 'not-sent': 1, queued: 1, retrying: 1, sent: 2, failed: 1 },
      replies: { 'needs-action': 2, accepted: 2, tentative: 1, declined: 1 },
      total: 6,
    });
  });
});
