import { describe, expect, it } from 'vitest';
import { replyExpiry, signReplyToken, verifyReplyToken } from '@/lib/invitations/reply-token';

const DAY_MS = 24 * 3600_000;
const NOW = Date.parse('2026-12-01T20:00:00Z');
const claim = { railwayId: 'railway-1', invitationId: 'invitation-1', nonce: 3 };

describe('reply links expire', () => {
  it('is good up to the instant before its expiry and refused from that instant on', () => {
    // RFC 7519 4.1.4 (the "exp" claim): "the current date/time MUST be before the expiration
    // date/time" — the same rule for our signed claim: at the expiry instant it is already expired.
    const token = signReplyToken({ ...claim, expiresAt: NOW });
    expect(verifyReplyToken(token, NOW - 1)).toEqual({ ok: true, claim: { ...claim, expiresAt: NOW } });
    expect(verifyReplyToken(token, NOW)).toEqual({ ok: false, reason: 'expired' });
    expect(verifyReplyToken(token, NOW + 1)).toEqual({ ok: false, reason: 'expired' });
  });

  it('lives until the session ends, and at least one day from sending', () => {
    // A session three days away: the link works until it ends.
    const later = new Date(NOW + 3 * DAY_MS);
    expect(replyExpiry(later, NOW)).toBe(later.getTime());
    // A session ending in an hour (an invitation sent on the evening): still a whole day to answer.
    expect(replyExpiry(new Date(NOW + 3600_000), NOW)).toBe(NOW + DAY_MS);
    // One that has already ended: a day from now too, never a link that is dead on arrival.
    expect(replyExpiry(new Date(NOW - DAY_MS), NOW)).toBe(NOW + DAY_MS);
  });
});
