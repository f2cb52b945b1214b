import 'server-only';
import { notFound, redirect } from 'next/navigation';
import { getSessionById } from '@/db/queries/session-records';
import type { Role } from '@/db/schema';
import { requireMember, type Member } from '@/lib/auth';
import { operatorMaySee } from '@/lib/auth/sessions';
import { AppError } from '@/lib/errors';
import { roleAtLeast } from '@/lib/roles';

/**
 * requireMember for pages: no session redirects to sign-in, another railway is a 404 page, and a
 * lower role gets `{ denied }` so the page can say what the role allows instead.
 */
export async function memberForPage(
  railwayId: string,
  minimumRole: Role,
  returnTo: string,
): Promise<{ member: Member; denied?: undefined } | { member?: undefined; denied: true }> {
  try {
    return { member: await requireMember(railwayId, minimumRole) };
  } catch (error) {
    if (error instanceof AppError && error.status === 401) {
      redirect(`/sign-in?callbackUrl=${encodeURIComponent(returnTo)}`);
    }
    if (error instanceof AppError && error.status === 403) return { denied: true };
    if (error instanceof AppError && error.status === 404) notFound();
    throw error;
  }
}

/**
 * The session a page shows, for a member the page has already let in: another railway's session,
 * an unknown id, or one an operator may not see (operatorMaySee) is a 404 page.
 */
export function sessionForPage(member: Member, sessionId: string) {
  const session = getSessionById(sessionId);
  if (!session || session.railwayId !== member.railwayId) notFound();
  if (!roleAtLeast(member.role, 'planner') && !operatorMaySee(session, member.user.id)) notFound();
  return session;
}
