import 'server-only';
import crypto from 'node:crypto';
import { env } from '@/lib/env';

/** What a reply link proves: this invitation, on this railway, at this reply count, until then. */
export type ReplyClaim = { railwayId: string; invitationId: string; nonce: number; expiresAt: number };

const DEV_SECRET = 'fishplate-development-only-reply-secret';

function secret(): string {
  const configured = env().NEXTAUTH_SECRET;
  if (configured) return configured;
  // env() already refuses to start in production without a secret.
  return DEV_SECRET;
}

function sign(payload: string): Buffer {
  return crypto.createHmac('sha256', secret()).update(`fishplate-rsvp\n${payload}`).digest();
}

/**
 * A reply link's token: the claim in base64url, a dot, and an HMAC-SHA256 of it under
 * NEXTAUTH_SECRET. The reply is not part of it — the same token carries accept, maybe and decline —
 * but the invitation's reply nonce is, and it goes up with every reply, so a link works once per
 * reply change.
 */
export function signReplyToken(claim: ReplyClaim): string {
  const payload = [claim.railwayId, claim.invitationId, String(claim.nonce), String(claim.expiresAt)].join('\n');
  return `${Buffer.from(payload).toString('base64url')}.${sign(payload).toString('base64url')}`;
}

export type ReplyTokenCheck =
  | { ok: true; claim: ReplyClaim }
  | { ok: false; reason: 'malformed' | 'forged' | 'expired' };

/** Checks a token's signature and expiry (not yet whether its nonce is still current). */
export function verifyReplyToken(token: string, now = Date.now()): ReplyTokenCheck {
  const match = /^([A-Za-z0-9_-]{10,600})\.([A-Za-z0-9_-]{43})$/.exec(token);
  if (!match) return { ok: false, reason: 'malformed' };
  const payload = Buffer.from(match[1]!, 'base64url').toString('utf8');
  const given = Buffer.from(match[2]!, 'base64url');
  const expected = sign(payload);
  if (given.length !== expected.length || !crypto.timingSafeEqual(given, expected)) return { ok: false, reason: 'forged' };
  const parts = payload.split('\n');
  if (parts.length !== 4) return { ok: false, reason: 'malformed' };
  const [railwayId, invitationId, nonceText, expiresText] = parts as [string, string, string, string];
  const nonce = Number(nonceText);
  const expiresAt = Number(expiresText);
  if (!railwayId || !invitationId || !Number.isSafeInteger(nonce) || !Number.isSafeInteger(expiresAt)) {
    return { ok: false, reason: 'malformed' };
  }
  if (expiresAt <= now) return { ok: false, reason: 'expired' };
  return { ok: true, claim: { railwayId, invitationId, nonce, expiresAt } };
}

/** The invitation id a token claims, unchecked — only for keying the rate limit. */
export function claimedInvitationId(token: string): string {
  const head = token.split('.')[0] ?? '';
  try {
    return Buffer.from(head.slice(0, 600), 'base64url').toString('utf8').split('\n')[1]?.slice(0, 100) ?? 'unknown';
  } catch {
    return 'unknown';
  }
}

/**
 * How long reply links stay good: until the session ends (there is nothing to reply to after
 * that), and at least a day from sending so a link sent late still works that evening.
 */
export function replyExpiry(sessionEndsAt: Date, now = Date.now()): number {
  return Math.max(sessionEndsAt.getTime(), now + 24 * 3600_000);
}
