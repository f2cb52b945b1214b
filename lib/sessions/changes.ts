import 'server-only';
import { recordAudit } from '@/db/queries/railways';
import type { Session } from '@/db/schema';
import type { Member } from '@/lib/auth';
import { AppError } from '@/lib/errors';
import { snapshotOf } from '@/lib/sessions/timetable';
import type { TimetableChange } from '@/lib/sessions/types';
import type { Run } from '@/lib/runs/schema';

/** Timetables of cancelled sessions stay as they were; reopen the session as a draft to change it. */
export function assertTimetableEditable(session: Session): void {
  if (session.status === 'cancelled') {
    throw new AppError('bad_request', 'This session is cancelled. Reopen it as a draft to change its timetable.');
  }
}

/** The answer to a change: the re-checked session, plus what the change made. */
export function changeAnswer(sessionId: string, extra: Omit<Partial<TimetableChange>, 'runs'> & { runId?: string } = {}): TimetableChange {
  const snapshot = snapshotOf(sessionId);
  const { runId, ...rest } = extra;
  const run: Run | undefined = runId ? snapshot.runs.find((r) => r.id === runId) : undefined;
  return { ...snapshot, ...rest, ...(run ? { run } : {}) };
}

export function auditRunChange(member: Member, action: string, entityId: string | null, detail?: Record<string, unknown>): void {
  recordAudit({ railwayId: member.railwayId, userId: member.user.id, action, entity: 'run', entityId, detail });
}
