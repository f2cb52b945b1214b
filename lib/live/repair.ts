import 'server-only';
import { addRepairs } from '@/db/queries/live';
import type { Session } from '@/db/schema';
import type { Member } from '@/lib/auth';
import { conflict, forbidden } from '@/lib/errors';
import { buildLiveState } from '@/lib/live/state';
import type { RepairInput } from '@/lib/validations/live';

/** Seconds two proposals may differ by and still be the same repair (the clock moves between look and click). */
const SAME_WITHIN_S = 90;

export function assertHost(member: Member): void {
  if (member.role !== 'host') throw forbidden('repair the running session (the host does)');
}

/**
 * Applies the host's repair: the moves it was shown, checked against the repair as it stands now
 * (the same runs, each within SAME_WITHIN_S, or 409 with the current one). Only runs not yet
 * departed move; their planned times stay as they were, the repair is stored beside them.
 */
export function applyRepair(session: Session, member: Member, input: RepairInput, nowMs = Date.now()) {
  assertHost(member);
  const state = buildLiveState(session.id, nowMs);
  const current = new Map(state.repair.map((m) => [m.runId, m]));
  const seen = new Set(input.moves.map((m) => m.runId));
  const same =
    seen.size === input.moves.length &&
    seen.size === current.size &&
    input.moves.every((m) => {
      const now = current.get(m.runId);
      return now !== undefined && Math.abs(now.delayS - m.delayS) <= SAME_WITHIN_S;
    });
  if (!same) throw conflict({ repair: state.repair });
  const moves = state.repair.map((m) => ({ runId: m.runId, delayS: m.delayS }));
  const trainOf = new Map(state.runs.map((r) => [r.id, r.trainId]));
  const trains = new Set(moves.map((m) => trainOf.get(m.runId)));
  const summary = `${member.user.name} repaired the timetable: ${moves.length} run${moves.length === 1 ? '' : 's'} of ${trains.size} train${trains.size === 1 ? '' : 's'} moved`;
  const live = addRepairs(session.id, state.seq, new Date(nowMs), member.user.id, moves, summary);
  // Something happened while it was worked out: the host looks again.
  if (!live) throw conflict({ repair: buildLiveState(session.id).repair });
  return live;
}
