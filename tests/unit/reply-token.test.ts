import crypto from 'node:crypto';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { resetEnvCache } from '@/lib/env';
import { claimedInvitationId, replyExpiry, signReplyToken, verifyReplyToken } from '@/lib/invitations/reply-token';

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

describe('reply link tokens (HMAC-SHA256, RFC 2104 / FIPS 180-4, in base64url, RFC 4648 §5)', () => {
  const SECRET = 'a-test-secret-of-thirty-two-chars';
  beforeEach(() => {
    vi.stubEnv('NEXTAUTH_SECRET', SECRET);
    resetEnvCache();
  });
  afterEach(() => {
    vi.unstubAllEnvs();
    resetEnvCache();
  });

  // Recomputed here with Node's own HMAC, independently of the code under test.
  const hmac = (payload: string, secret = SECRET) =>
    crypto.createHmac('sha256', secret).update(`fishplate-rsvp\n${payload}`).digest('base64url');
  const tokenOf = (payload: string, secret = SECRET) => `${Buffer.from(payload).toString('base64url')}.${hmac(payload, secret)}`;
  const EXPIRES = NOW + DAY_MS;
  const PAYLOAD = `railway-1\ninvitation-1\n3\n${EXPIRES}`;

  it('is the claim lines in base64url, a dot, and the 43-character MAC of them under the secret', () => {
    const token = signReplyToken({ ...claim, expiresAt: EXPIRES });
    expect(token).toBe(tokenOf(PAYLOAD));
    expect(token.split('.')[1]).toHaveLength(43); // 32 bytes of SHA-256, unpadded base64url
    expect(verifyReplyToken(token, NOW)).toEqual({ ok: true, claim: { ...claim, expiresAt: EXPIRES } });
  });

  it('a token made under another secret, or with its claim changed, is forged', () => {
    expect(verifyReplyToken(tokenOf(PAYLOAD, 'another-secret-of-thirty-two-chars'), NOW)).toEqual({ ok: false, reason: 'forged' });
    const [, mac] = tokenOf(PAYLOAD).split('.');
    const changed = `${Buffer.from(PAYLOAD.replace('invitation-1', 'invitation-2')).toString('base64url')}.${mac}`;
    expect(verifyReplyToken(changed, NOW)).toEqual({ ok: false, reason: 'forged' });
  });

  it('anything not shaped as a token is malformed before any MAC is computed', () => {
    const token = tokenOf(PAYLOAD);
    for (const bad of ['', token.slice(0, -1), `${token}A`, `${token}.x`, ` ${token}`, `${token.split('.')[0]}!.${token.split('.')[1]}`, `abc.${hmac('abc')}`]) {
      expect(verifyReplyToken(bad, NOW), bad).toEqual({ ok: false, reason: 'malformed' });
    }
    // 600 base64url characters of claim at most (450 bytes), 10 at least.
    const tail = `\ninvitation-1\n3\n${EXPIRES}`;
    const longest = `${'r'.repeat(450 - tail.length)}${tail}`;
    expect(verifyReplyToken(tokenOf(longest), NOW).ok).toBe(true);
    expect(verifyReplyToken(tokenOf(`r${longest}`), NOW)).toEqual({ ok: false, reason: 'malformed' });
  });

  it('a correctly signed claim without four sound lines is malformed', () => {
    for (const payload of [
      `railway-1\ninvitation-1\n3`,
      `railway-1\ninvitation-1\n3\n${EXPIRES}\nextra`,
      `\ninvitation-1\n3\n${EXPIRES}`,
      `railway-1\n\n3\n${EXPIRES}`,
      `railway-1\ninvitation-1\nthree\n${EXPIRES}`,
      `railway-1\ninvitation-1\n1.5\n${EXPIRES}`,
      `railway-1\ninvitation-1\n3\n1e300`,
      `railway-1\ninvitation-1\n3\nsoon`,
    ]) {
      expect(verifyReplyToken(tokenOf(payload), NOW), payload).toEqual({ ok: false, reason: 'malformed' });
    }
  });

  it('the rate limit keys on the claimed invitation, read without checking', () => {
    expect(claimedInvitationId(tokenOf(PAYLOAD))).toBe('invitation-1');
    expect(claimedInvitationId(tokenOf(`r\n${'i'.repeat(150)}\n1\n1`))).toBe('i'.repeat(100));
    expect(claimedInvitationId('bm8tbmV3bGluZQ.sig')).toBe('unknown'); // "no-newline"
    expect(claimedInvitationId('')).toBe('unknown');
    // Only the first 600 characters of the claim are read (bounded work on input from outside, common
    // practice): an id past them is not found.
    expect(claimedInvitationId(tokenOf(`${'r'.repeat(500)}\ninvitation-1\n1\n1`))).toBe('unknown');
  });
});
