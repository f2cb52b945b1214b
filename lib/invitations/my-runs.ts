import 'server-only';
import { listCrewDuties, listInvitedSessions } from '@/db/queries/crew';
import { loadSessionRows } from '@/db/queries/plan-data';
import { requireMember } from '@/lib/auth';
import { AppError } from '@/lib/errors';
import { runsAssignedTo } from '@/lib/invitations/assignments';

/**
 * The signed-in person's upcoming published sessions (those they are invited to on railways they
 * belong to), soonest first, each with their own runs and duties. Each railway's membership is
 * checked again with requireMember.
 */
export async function loadMyRuns(userId: string, now = new Date()) {
  const sessions = listInvitedSessions(userId, now);
  const out = [];
  for (const entry of sessions) {
    try {
      await requireMember(entry.session.railwayId, 'operator');
    } catch (error) {
      if (error instanceof AppError && error.status === 404) continue;
      throw error;
    }
    const rows = loadSessionRows(entry.session.id);
    if (!rows) continue;
    out.push({
      ...entry,
      runs: runsAssignedTo(rows, userId),
      duties: listCrewDuties(entry.session.id, userId),
      clock: { ratio: entry.session.clockRatio, fastStart: entry.session.fastStart },
    });
  }
  return out;
}

export type MyRunsSession = Awaited<ReturnType<typeof loadMyRuns>>[number];
