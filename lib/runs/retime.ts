import 'server-only';
import { shiftRuns } from '@/db/queries/runs';
import type { Session } from '@/db/schema';
import { AppError } from '@/lib/errors';
import { suggestRetime } from '@/lib/planning';
import { loadSessionPlan, sessionLengthS } from '@/lib/sessions/timetable';
import { auditRunChange, changeAnswer } from '@/lib/sessions/changes';
import type { TimetableChange, RetimeSuggestion } from '@/lib/sessions/types';
import type { RetimeMoves } from '@/lib/runs/schema';
import { editableTimetable, settle } from '@/lib/runs/service';

/** suggestRetime's delays for the stored session, as a diff of departures with the versions they apply to. */
export function retimeSuggestions(sessionId: string): RetimeSuggestion[] {
  const { rows, plan } = loadSessionPlan(sessionId);
  const versionOf = new Map(rows.runs.map((r) => [r.id, r.version]));
  const runOf = new Map(plan.runs.map((r) => [r.id, r]));
  return suggestRetime(plan)
    .map((m) => {
      const run = runOf.get(m.runId)!;
      return { runId: m.runId, version: versionOf.get(m.runId)!, delayS: m.delayS, oldDepartS: run.departS, newDepartS: run.departS + m.delayS };
    })
    .sort((a, b) => a.oldDepartS - b.oldDepartS || a.runId.localeCompare(b.runId));
}

/** Refuses (400) a move that would take any time of a run outside the session's window. */
function assertMovesInWindow(session: Session, moves: RetimeMoves): void {
  const { plan } = loadSessionPlan(session.id);
  const lengthS = sessionLengthS(session);
  const runOf = new Map(plan.runs.map((r) => [r.id, r]));
  moves.forEach((m, i) => {
    const run = runOf.get(m.runId);
    if (!run) return;
    const times = [run.departS, run.arriveS, ...run.steps.flatMap((s) => [s.enterS, s.exitS])].map((t) => t + m.delayS);
    if (times.some((t) => t < 0 || t > lengthS)) {
      const message = `this move takes the run outside the session, 0 to ${lengthS} s after its start`;
      throw new AppError('bad_request', `moves[${i}].delayS: ${message}`, { issues: [{ path: `moves[${i}].delayS`, message }] });
    }
  });
}

/**
 * Shifts runs by the given delays in one transaction (all or nothing: a stale version answers 409
 * with the runs as they are now). The answer carries the moves that take it back.
 */
export async function applyMoves(sessionId: string, moves: RetimeMoves, action: 'retime' | 'undo-retime'): Promise<TimetableChange> {
  const { session, member } = await editableTimetable(sessionId);
  if (new Set(moves.map((m) => m.runId)).size !== moves.length) {
    throw new AppError('bad_request', 'Each run may be moved once per request.');
  }
  assertMovesInWindow(session, moves);
  const shifted = settle(shiftRuns(session.id, moves));
  auditRunChange(member, action, null, { sessionId: session.id, runs: moves.length });
  const undo = shifted.map((r) => ({ runId: r.id, version: r.version, delayS: -moves.find((m) => m.runId === r.id)!.delayS }));
  return changeAnswer(session.id, { undo });
}
