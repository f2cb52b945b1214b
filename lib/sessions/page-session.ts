import 'server-only';
import { notFound } from 'next/navigation';
import { getSessionById, isInvited } from '@/db/queries/session-records';
import type { Member } from '@/lib/auth';
import { roleAtLeast } from '@/lib/roles';

/**
 * The session a page shows, for a member the page has already let in: another railway's session,
 * an unknown id, or one an operator may not see (not published, or not invited) is a 404 page.
 */
export function sessionForPage(member: Member, sessionId: string) {
  const session = getSessionById(sessionId);
  if (!session || session.railwayId !== member.railwayId) notFound();
  if (!roleAtLeast(member.role, 'planner') && !(session.status === 'published' && isInvited(session.id, member.user.id))) notFound();
  return session;
}
