import { findSessionRailwayId } from '@/db/queries/invitation-records';
import { requireMember, requireUser } from '@/lib/auth';
import { sessionCalendarFor } from '@/lib/calendar/feeds';
import { notFound, parseOrThrow } from '@/lib/errors';
import { handler } from '@/lib/http';
import { sessionIdSchema } from '@/lib/validations/invitation';

export const dynamic = 'force-dynamic';

/** The session as an .ics file: hosts and planners get every run, an invited operator their own. */
const getSessionCalendar = handler<{ sessionId: string }>(async (_request, { params }) => {
  const sessionId = parseOrThrow(sessionIdSchema, (await params).sessionId);
  await requireUser();
  const railwayId = findSessionRailwayId(sessionId);
  if (!railwayId) throw notFound('That session');
  const member = await requireMember(railwayId, 'operator', 'download this session');
  const { filename, body } = sessionCalendarFor(member, sessionId);
  return new Response(body, {
    headers: {
      'Content-Type': 'text/calendar; charset=utf-8',
      'Content-Disposition': `attachment; filename="${filename}"`,
      'Cache-Control': 'private, no-store',
    },
  });
});

export { getSessionCalendar as GET };
