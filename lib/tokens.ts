import 'server-only';
import crypto from 'node:crypto';
import { consumeAuthToken, consumeAuthTokenRow, insertAuthToken } from '@/db/queries/users';

const TTL_MS = { 'sign-in': 15 * 60_000, 'reset-password': 60 * 60_000, 'sign-up': 24 * 60 * 60_000 } as const;

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

/** Issues the link that finishes a sign-up; the password hash and name wait in the token's row. */
export function issueSignUpToken(userId: string, pendingPasswordHash: string, pendingName: string): string {
  const token = crypto.randomBytes(32).toString('base64url');
  insertAuthToken({
    userId,
    purpose: 'sign-up',
    tokenHash: hashToken(token),
    expiresAt: new Date(Date.now() + TTL_MS['sign-up']),
    pendingPasswordHash,
    pendingName,
  });
  return token;
}

/** Spends a sign-up token: the user id with the password hash and name chosen, or null. */
export function spendSignUpToken(token: string): { userId: string; passwordHash: string; name: string } | null {
  if (!/^[A-Za-z0-9_-]{20,100}$/.test(token)) return null;
  const row = consumeAuthTokenRow(hashToken(token), 'sign-up');
  if (!row?.pendingPasswordHash || !row.pendingName) return null;
  return { userId: row.userId, passwordHash: row.pendingPasswordHash, name: row.pendingName };
}
