import 'server-only';
import { listSessionInvitations } from '@/db/queries/invitation-records';
import { loadSessionRows } from '@/db/queries/plan-data';
import type { Session } from '@/db/schema';
import { describeRuns } from '@/lib/invitations/assignments';
import { sessionStandings } from '@/lib/invitations/send';

/**
 * A published session's crew at a glance, for Needs attention (hosts and planners only; the caller
 * checks the role): who declined but still has runs, how many invitees are affected by changes since
 * their last e-mail, and how many have not replied (past the deadline, if one is set).
 */
export function crewStatus(session: Session, now = new Date()) {
  const invitations = listSessionInvitations(session.id);
  const rows = loadSessionRows(session.id);
  if (!rows || invitations.length === 0) return { declinedWithRuns: [] as string[], affected: 0, noReply: 0, pastDeadline: false };
  const withRuns = new Set(rows.runs.map((r) => r.operatorId).filter((id): id is string => id !== null));
  const standings = sessionStandings(session, invitations, describeRuns(rows));
  return {
    declinedWithRuns: invitations.filter((i) => i.reply === 'declined' && withRuns.has(i.userId)).map((i) => i.name),
    affected: invitations.filter((i) => standings.get(i.id)?.affected).length,
    noReply: invitations.filter((i) => i.reply === 'needs-action' && i.mailCount > 0).length,
    pastDeadline: session.replyBy !== null && session.replyBy.getTime() < now.getTime(),
  };
}
