import 'server-only';
import { getSessionById, isInvited } from '@/db/queries/session-records';
import type { Session } from '@/db/schema';
import { requireMember, requireUser, type Member } from '@/lib/auth';
import { AppError, notFound } from '@/lib/errors';

/**
 * The gate for one session. `edit` needs a planner or host of the session's railway; `view` lets an
 * operator in only to a published session they are invited to. No session: 401; another railway's
 * session, an unknown id, or one an operator may not see: 404; an operator editing: 403.
 */
export async function requireSession(sessionId: string, need: 'view' | 'edit'): Promise<{ member: Member; session: Session }> {
  const user = await requireUser();
  const session = getSessionById(sessionId);
  if (!session) throw notFound('That session');
  let member: Member;
  try {
    member = await requireMember(session.railwayId, need === 'edit' ? 'planner' : 'operator', 'change this timetable');
  } catch (error) {
    // Neither someone outside the railway nor an operator who may not even see the session should learn
    // that it exists: both get the answer an unknown id gets. (A 403 here is an operator asking to edit.)
    const status = error instanceof AppError ? error.status : undefined;
    if (status === 404 || (status === 403 && !operatorMaySee(session, user.id))) throw notFound('That session');
    throw error;
  }
  if (member.role === 'operator' && !operatorMaySee(session, user.id)) throw notFound('That session');
  return { member, session };
}

/** The one rule for operators: they see a session only when it is published and they are invited to it. */
export function operatorMaySee(session: Pick<Session, 'id' | 'status'>, userId: string): boolean {
  return session.status === 'published' && isInvited(session.id, userId);
}

/** Whether this member may change the session's timetable and settings. */
export function canEdit(member: Member): boolean {
  return member.role === 'planner' || member.role === 'host';
}
