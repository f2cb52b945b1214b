import 'server-only';
import { getServerSession } from 'next-auth';
import { cache } from 'react';
import { getUserById, isSessionEnded } from '@/db/queries/users';
import { authOptions } from '@/lib/auth-options';

export type CurrentUser = { id: string; email: string; name: string };

/**
 * The signed-in user for this request, or null. The user row is read again on every request, so
 * that a deleted account's cookie grants nothing, nor one signed before a password reset or "sign out
 * everywhere" (its session version is behind), nor one that was signed out and replayed.
 */
export const currentUser = cache(async (): Promise<CurrentUser | null> => {
  const session = await getServerSession(authOptions);
  const id = session?.user?.id;
  if (!id) return null;
  const user = getUserById(id);
  if (!user || session.user.sessionVersion !== user.sessionVersion) return null;
  if (!session.user.sessionId || isSessionEnded(session.user.sessionId)) return null;
  return { id: user.id, email: user.email, name: user.name };
});
