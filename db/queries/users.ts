import 'server-only';
import { and, eq, gt, isNull } from 'drizzle-orm';
import { getDb } from '@/db';
import { authTokens, users, type User } from '@/db/schema';

/** Finds a user by e-mail address (addresses are stored lower-case). */
export function getUserByEmail(email: string): User | undefined {
  return getDb().select().from(users).where(eq(users.email, email.toLowerCase())).get();
}

/** Finds a user by id. */
export function getUserById(id: string): User | undefined {
  return getDb().select().from(users).where(eq(users.id, id)).get();
}

/** Creates a user; the e-mail must not be taken (callers check first). */
export function createUser(input: { email: string; name: string; passwordHash: string | null }): User {
  return getDb()
    .insert(users)
    .values({ email: input.email.toLowerCase(), name: input.name, passwordHash: input.passwordHash })
    .returning()
    .get();
}

/** Sets a user's password hash. */
export function setPasswordHash(userId: string, passwordHash: string): void {
  getDb().update(users).set({ passwordHash }).where(eq(users.id, userId)).run();
}

/** Marks the address as verified (someone followed a link sent to it). */
export function markEmailVerified(userId: string): void {
  getDb()
    .update(users)
    .set({ emailVerifiedAt: new Date() })
    .where(and(eq(users.id, userId), isNull(users.emailVerifiedAt)))
    .run();
}

/** Stores the hash of a one-time token. */
export function insertAuthToken(input: {
  userId: string;
  purpose: 'sign-in' | 'reset-password';
  tokenHash: string;
  expiresAt: Date;
}): void {
  getDb().insert(authTokens).values(input).run();
}

/**
 * Uses a one-time token: marks it used and returns its user id, in one statement so that two
 * requests racing with the same token cannot both succeed. Expired or used tokens return null.
 */
export function consumeAuthToken(tokenHash: string, purpose: 'sign-in' | 'reset-password'): string | null {
  const row = getDb()
    .update(authTokens)
    .set({ usedAt: new Date() })
    .where(
      and(
        eq(authTokens.tokenHash, tokenHash),
        eq(authTokens.purpose, purpose),
        isNull(authTokens.usedAt),
        gt(authTokens.expiresAt, new Date()),
      ),
    )
    .returning({ userId: authTokens.userId })
    .get();
  return row?.userId ?? null;
}
