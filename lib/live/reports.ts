import 'server-only';
import { addReport, listRunReportsWithReporter } from '@/db/queries/live';
import { recordAudit } from '@/db/queries/railways';
import type { Session } from '@/db/schema';
import type { Member } from '@/lib/auth';
import { AppError, forbidden, notFound } from '@/lib/errors';
import { formatFast } from '@/lib/planning';
import { foldReports, reportRefusal } from '@/lib/live/actuals';
import { fastClockOf, readClockNow } from '@/lib/live/clock';
import { repairTotals } from '@/lib/live/state';
import { departureFromFastTime, loadSessionPlan } from '@/lib/sessions/timetable';
import type { RunReportHistory } from '@/lib/live/types';
import type { ReportInput } from '@/lib/validations/live';

/** A session keeps at most this many reports (20 runs × a few presses is typical; 200 runs at most). */
export const MAX_REPORTS = 5000;

/**
 * Records that a run departed, arrived or stopped, now on the shared clock (or, as a correction,
 * at a typed fast time; or withdrawn). The run's operator, a planner or the host may report; only
 * the run's operator or the host may correct or withdraw. The clock must have started.
 */
export function makeReport(session: Session, member: Member, runId: string, input: ReportInput, nowMs = Date.now()) {
  const { rows, plan } = loadSessionPlan(session.id);
  const run = plan.runs.find((r) => r.id === runId);
  if (!run) throw notFound('That run');
  const own = run.operatorId === member.user.id;
  if (member.role === 'operator' && !own) throw forbidden('report for a run that is not yours');
  const correcting = input.fast !== undefined || input.withdraw === true;
  if (correcting && !own && member.role !== 'host') throw forbidden('correct a report (the run’s operator or the host can)');

  const clock = fastClockOf(session);
  const reading = readClockNow(session, nowMs);
  if (reading.state === 'not-started') throw new AppError('bad_request', 'The session’s clock has not started yet.');
  const sessionS = input.fast !== undefined ? departureFromFastTime(input.fast, clock) : reading.sessionS;

  const train = rows.trains.find((t) => t.id === run.trainId)?.name ?? 'A train';
  const inForceDepart = run.departS + (repairTotals(session.id).get(run.id) ?? 0);
  const lateMin = Math.round(((sessionS - inForceDepart) * clock.ratio) / 60);
  const verb = input.kind === 'stopped' ? `stopped — ${input.reason ?? 'needs help'}` : input.kind;
  const lateness = input.kind === 'departed' && !input.withdraw ? (lateMin > 0 ? `, ${lateMin} fast min late` : lateMin < 0 ? `, ${-lateMin} fast min early` : ', on time') : '';
  const summary = input.withdraw
    ? `${train}: “${input.kind}” withdrawn by ${member.user.name}`
    : `${train} ${verb} at ${formatFast(sessionS, clock)}${lateness}${correcting ? ` (corrected by ${member.user.name})` : ''}`;

  const added = addReport(
    session.id,
    new Date(nowMs),
    {
      runId,
      kind: input.kind,
      reason: input.reason ?? null,
      sessionS,
      correction: correcting,
      withdrawn: input.withdraw === true,
      byUserId: member.user.id,
    },
    summary,
    (stored) => {
      if (stored.length >= MAX_REPORTS) throw new AppError('bad_request', `This session already has ${MAX_REPORTS} reports.`);
      const refusal = reportRefusal(foldReports(stored.filter((r) => r.runId === runId)).get(runId), input.kind, input.withdraw ? 'withdraw' : input.fast !== undefined ? 'typed' : 'now');
      if (refusal) throw new AppError('bad_request', refusal, { issues: [{ path: 'kind', message: refusal }] });
    },
  );
  // Corrections and withdrawals change what others reported: the railway's audit keeps who did it.
  if (correcting) {
    recordAudit({
      railwayId: session.railwayId,
      userId: member.user.id,
      action: input.withdraw ? 'report-withdraw' : 'report-correct',
      entity: 'run',
      entityId: runId,
      detail: { sessionId: session.id, kind: input.kind, ...(input.fast !== undefined ? { fast: input.fast } : {}), reportId: added.report.id },
    });
  }
  return added;
}

/** A run's report history shows at most this many rows (MAX_REPORTS bounds the whole session). */
export const MAX_RUN_HISTORY = 200;

/**
 * Who reported what for one run, corrections and withdrawals included, oldest first: the run's
 * operator, a planner or the host may read it.
 */
export function runReportHistory(session: Session, member: Member, runId: string): RunReportHistory {
  const { plan } = loadSessionPlan(session.id);
  const run = plan.runs.find((r) => r.id === runId);
  if (!run) throw notFound('That run');
  if (member.role === 'operator' && run.operatorId !== member.user.id) throw forbidden('read the reports of a run that is not yours');
  const clock = fastClockOf(session);
  return {
    runId,
    reports: listRunReportsWithReporter(session.id, runId, MAX_RUN_HISTORY).map((r) => ({
      id: r.id,
      kind: r.kind,
      reason: r.reason,
      fast: formatFast(r.sessionS, clock),
      reportedAt: r.reportedAt.toISOString(),
      by: r.by ?? 'a former member',
      correction: r.correction,
      withdrawn: r.withdrawn,
    })),
  };
}
