import 'server-only';
import { getServerSession } from 'next-auth';
import { cache } from 'react';
import { getUserById } from '@/db/queries/users';
import { authOptions } from '@/lib/auth-options';

export type CurrentUser = { id: string; email: string; name: string };

/**
 * The signed-in user for this request, or null. The user row is read again so that a deleted
 * account's still-valid cookie grants nothing.
 */
export const currentUser = cache(async (): Promise<CurrentUser | null> => {
  const session = await getServerSession(authOptions);
  const id = session?.user?.id;
  if (!id) return null;
  const user = getUserById(id);
  return user ? { id: user.id, email: user.email, name: user.name } : null;
});
