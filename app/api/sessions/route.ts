import { listRailwaysOfUser } from '@/db/queries/memberships';
import { listRailwaySessions } from '@/db/queries/sessions';
import { requireUser } from '@/lib/auth';
import { parseOrThrow } from '@/lib/errors';
import { handler } from '@/lib/http';
import { listSessionsQuerySchema } from './schema';

export const dynamic = 'force-dynamic';

/** The sessions the caller may see across all their railways, soonest first. */
const listSessions = handler(async (request) => {
  const user = await requireUser();
  const query = parseOrThrow(listSessionsQuerySchema, Object.fromEntries(new URL(request.url).searchParams));
  const sessions = listRailwaysOfUser(user.id).flatMap((railway) =>
    listRailwaySessions(railway.id, { userId: user.id, role: railway.role }, { upcomingOnly: query.upcoming === '1' }).map((s) => ({
      id: s.id,
      railway: { id: railway.id, name: railway.name },
      title: s.title,
      start: s.startsAt.toISOString(),
      end: s.endsAt.toISOString(),
      timeZone: s.timeZone,
      status: s.status,
      layout: s.layoutName,
      runCount: s.runCount,
    })),
  );
  sessions.sort((a, b) => a.start.localeCompare(b.start) || a.id.localeCompare(b.id));
  return Response.json({ sessions });
});

export { listSessions as GET };
