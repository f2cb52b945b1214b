import 'server-only';
import { and, eq, gt, isNull, lte, sql } from 'drizzle-orm';
import { getDb, preparedStatements, writeTransaction } from '@/db';
import { authTokens, endedSessions, users, type User } from '@/db/schema';

/** Finds a user by e-mail address (addresses are stored lower-case). */
export function getUserByEmail(email: string): User | undefined {
  return getDb().select().from(users).where(eq(users.email, email.toLowerCase())).get();
}

// Read on every signed-in request (lib/current-user.ts), so built and compiled once.
const everyRequest = preparedStatements((db) => ({
  userById: db.select().from(users).where(eq(users.id, sql.placeholder('id'))).prepare(),
  endedSession: db.select({ id: endedSessions.sessionId }).from(endedSessions).where(eq(endedSessions.sessionId, sql.placeholder('sessionId'))).prepare(),
}));

/** Finds a user by id. */
export function getUserById(id: string): User | undefined {
  return everyRequest().userById.get({ id });
}

/** Creates a user; the e-mail must not be taken (callers check first). */
export function insertUser(input: { email: string; name: string; passwordHash: string | null }): User {
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
  purpose: AuthTokenPurpose;
  tokenHash: string;
  expiresAt: Date;
  pendingPasswordHash?: string | null;
  pendingName?: string | null;
}): void {
  getDb().insert(authTokens).values(input).run();
}

/**
 * Uses a one-time token: marks it used and returns its user id, in one statement so that two
 * requests racing with the same token cannot both succeed. Expired or used tokens return null.
 */
export function consumeAuthToken(tokenHash: string, purpose: AuthTokenPurpose): string | null {
  return consumeAuthTokenRow(tokenHash, purpose)?.userId ?? null;
}

export type AuthTokenPurpose = 'sign-in' | 'reset-password' | 'sign-up';

/** As consumeAuthToken, with what a sign-up token carries. */
export function consumeAuthTokenRow(tokenHash: string, purpose: AuthTokenPurpose) {
  return getDb()
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
    .returning({ userId: authTokens.userId, pendingPasswordHash: authTokens.pendingPasswordHash, pendingName: authTokens.pendingName })
    .get();
}

/** Applies a confirmed sign-up: the password and name chosen, and the address proved. */
export function completeSignUp(userId: string, passwordHash: string, name: string): void {
  getDb().update(users).set({ passwordHash, name, emailVerifiedAt: new Date() }).where(eq(users.id, userId)).run();
}

/**
 * Ends every session of a user and every sign-in or reset link not used yet: the session version
 * goes up (cookies carry the one they were signed with) and outstanding tokens count as used.
 */
export function endAllSessions(userId: string, now = new Date()): void {
  writeTransaction((tx) => {
    tx.update(users).set({ sessionVersion: sql`${users.sessionVersion} + 1` }).where(eq(users.id, userId)).run();
    tx.update(authTokens).set({ usedAt: now }).where(and(eq(authTokens.userId, userId), isNull(authTokens.usedAt))).run();
  });
}

/** Records that one session was signed out, until its cookie would have expired anyway. */
export function endSession(sessionId: string, userId: string, expiresAt: Date, now = new Date()): void {
  const db = getDb();
  db.delete(endedSessions).where(lte(endedSessions.expiresAt, now)).run();
  if (!getUserById(userId)) return;
  db.insert(endedSessions).values({ sessionId, userId, expiresAt }).onConflictDoNothing().run();
}

/** Whether this session was signed out. */
export function isSessionEnded(sessionId: string): boolean {
  return Boolean(everyRequest().endedSession.get({ sessionId }));
}
