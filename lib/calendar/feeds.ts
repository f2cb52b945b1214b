import 'server-only';
import { getInvitationOf, listInvitedSessions } from '@/db/queries/crew';
import { getRailwaySession } from '@/db/queries/invitation-records';
import { loadSessionRows } from '@/db/queries/plan-data';
import type { Member } from '@/lib/auth';
import { buildCalendarFile } from '@/lib/calendar/ics';
import { notFound } from '@/lib/errors';
import { describeRuns, runsAssignedTo } from '@/lib/invitations/assignments';
import { absoluteUrl } from '@/lib/mail/account-mail';

function timetableUrl(railwayId: string, sessionId: string) {
  return absoluteUrl(`/railways/${railwayId}/sessions/${sessionId}`);
}

/**
 * A session's calendar file for a member who passed requireMember: hosts and planners get the
 * session and every run; an operator gets it only when the session is published and they are
 * invited (otherwise 404, as if it did not exist), with their own runs.
 */
export function sessionCalendarFor(member: Member, sessionId: string): { filename: string; body: string } {
  const session = getRailwaySession(member.railwayId, sessionId);
  if (!session) throw notFound('That session');
  if (member.role === 'operator') {
    if (session.status !== 'published' || !getInvitationOf(sessionId, member.user.id)) throw notFound('That session');
  }
  const rows = loadSessionRows(sessionId);
  if (!rows) throw notFound('That session');
  const runs = member.role === 'operator' ? runsAssignedTo(rows, member.user.id) : describeRuns(rows);
  const body = buildCalendarFile({
    name: session.title,
    entries: [{ session, runs, url: timetableUrl(session.railwayId, session.id) }],
  });
  const slug = session.title.toLowerCase().replace(/[^a-z0-9]+/g, '-').replace(/^-|-$/g, '') || 'session';
  return { filename: `${slug}.ics`, body };
}

/**
 * A user's personal feed: every session they are invited to on railways they still belong to,
 * from a month back on — published ones with their own runs, cancelled ones marked CANCELLED so
 * subscribed calendars take them off.
 */
export function personalFeed(user: { id: string; name: string }, now = new Date()): string {
  const since = new Date(now.getTime() - 30 * 24 * 3600_000);
  const entries = listInvitedSessions(user.id, since, ['published', 'cancelled']).map(({ session, sentSequence }) => {
    const rows = session.status === 'published' ? loadSessionRows(session.id) : undefined;
    // The same UID as this person's invitations: never a lower SEQUENCE than the last one e-mailed to them
    // (updates raise it per person, RFC 5546 2.1.4), or their calendar would take the feed's copy as older.
    const sequence = Math.max(session.sequence, sentSequence ?? 0);
    return { session: { ...session, sequence }, runs: rows ? runsAssignedTo(rows, user.id) : [], url: timetableUrl(session.railwayId, session.id) };
  });
  return buildCalendarFile({ name: `Fishplate — ${user.name}`, entries, now });
}
