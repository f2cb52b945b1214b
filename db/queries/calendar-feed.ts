import 'server-only';
import crypto from 'node:crypto';
import { eq } from 'drizzle-orm';
import { getDb } from '@/db';
import { users } from '@/db/schema';

/** The user a personal feed token belongs to, or undefined (a reset token matches no one). */
export function getUserByCalendarToken(token: string) {
  return getDb().select({ id: users.id, name: users.name, email: users.email }).from(users).where(eq(users.calendarToken, token)).get();
}

export function getCalendarToken(userId: string): string | undefined {
  return getDb().select({ token: users.calendarToken }).from(users).where(eq(users.id, userId)).get()?.token;
}

/** Gives the user a new feed token; the old URL stops working with this statement. */
export function resetCalendarToken(userId: string): string {
  const token = crypto.randomBytes(24).toString('base64url');
  getDb().update(users).set({ calendarToken: token }).where(eq(users.id, userId)).run();
  return token;
}
