import 'server-only';
import { and, asc, count, eq, gte, inArray } from 'drizzle-orm';
import { getDb } from '@/db';
import { invitations, layouts, runs, sessions, type Role } from '@/db/schema';

/**
 * Sessions of one railway the caller may see, soonest first: everything for hosts and planners;
 * for operators only published sessions they are invited to.
 */
export function listRailwaySessions(railwayId: string, viewer: { userId: string; role: Role }, options: { upcomingOnly?: boolean } = {}) {
  const db = getDb();
  const conditions = [eq(sessions.railwayId, railwayId)];
  if (options.upcomingOnly) conditions.push(gte(sessions.endsAt, new Date()));
  if (viewer.role === 'operator') {
    conditions.push(eq(sessions.status, 'published'));
    const invited = db
      .select({ id: invitations.sessionId })
      .from(invitations)
      .where(eq(invitations.userId, viewer.userId));
    conditions.push(inArray(sessions.id, invited));
  }
  const rows = db
    .select({
      id: sessions.id,
      title: sessions.title,
      startsAt: sessions.startsAt,
      endsAt: sessions.endsAt,
      timeZone: sessions.timeZone,
      status: sessions.status,
      layoutName: layouts.name,
    })
    .from(sessions)
    .innerJoin(layouts, eq(layouts.id, sessions.layoutId))
    .where(and(...conditions))
    .orderBy(asc(sessions.startsAt))
    .all();
  const ids = rows.map((r) => r.id);
  const runCounts = new Map(
    ids.length
      ? db
          .select({ sessionId: runs.sessionId, n: count() })
          .from(runs)
          .where(inArray(runs.sessionId, ids))
          .groupBy(runs.sessionId)
          .all()
          .map((r) => [r.sessionId, r.n])
      : [],
  );
  return rows.map((r) => ({ ...r, runCount: runCounts.get(r.id) ?? 0 }));
}

