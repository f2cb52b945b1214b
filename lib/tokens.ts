import 'server-only';
import crypto from 'node:crypto';
import { insertAuthToken, consumeAuthToken } from '@/db/queries/users';

const TTL_MS = { 'sign-in': 15 * 60_000, 'reset-password': 60 * 60_000 } as const;

function hashToken(token: string): string {
  return crypto.createHash('sha256').update(token).digest('hex');
}

/** Issues a one-time token for a sign-in link or a password reset; only its hash is stored. */
export function issueAuthToken(userId: string, purpose: 'sign-in' | 'reset-password'): string {
  const token = crypto.randomBytes(32).toString('base64url');
  insertAuthToken({
    userId,
    purpose,
    tokenHash: hashToken(token),
    expiresAt: new Date(Date.now() + TTL_MS[purpose]),
  });
  return token;
}

/** Spends a one-time token; returns its user id, or null when it is unknown, used or expired. */
export function spendAuthToken(token: string, purpose: 'sign-in' | 'reset-password'): string | null {
  if (!/^[A-Za-z0-9_-]{20,100}$/.test(token)) return null;
  return consumeAuthToken(hashToken(token), purpose);
}
