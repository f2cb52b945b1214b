import 'server-only';
import { loadSessionPlan } from '@/lib/sessions/timetable';
import { storedCheck } from '@/lib/sessions/stored-check';

/** How many errors the engine finds in each stored session (for lists and the dashboard). */
export function errorCounts(sessionIds: readonly string[]): Map<string, number> {
  const counts = new Map<string, number>();
  for (const id of sessionIds) {
    try {
      counts.set(id, storedCheck(loadSessionPlan(id).plan).check.totals.errors);
    } catch {
      // A session that cannot be read (or checked in time) is left out of the count rather than breaking a list.
    }
  }
  return counts;
}

/** Errors and warnings the engine finds in one stored session (for the status panel and publishing). */
export function checkCounts(sessionId: string): { errors: number; warnings: number } {
  return storedCheck(loadSessionPlan(sessionId).plan).check.totals;
}
