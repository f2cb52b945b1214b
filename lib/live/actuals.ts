// Folding stored reports into what is known of each run. Plain code (no server imports) so that
// unit tests and client components can use it.
import type { ReportValues } from '@/db/queries/live';
import type { ReportKind, StopReason } from '@/db/enums';
import type { RunActuals } from '@/lib/planning';

export type ReportRecord = Omit<ReportValues, 'byUserId'>;

export type KnownRun = Omit<RunActuals, 'stops'> & { stops: { fromS: number; toS: number | null; reason: StopReason | null }[] };

/**
 * Reports in the order they were made → what is known of each run. A departure after a stop means
 * the train moves again (the stop ends); a correction replaces the time of the latest report of its
 * kind; a withdrawal takes it back. A second plain departure or stop is ignored (a double press).
 */
export function foldReports(reports: readonly ReportRecord[]): Map<string, KnownRun> {
  const known = new Map<string, KnownRun>();
  for (const r of reports) {
    let run = known.get(r.runId);
    if (!run) known.set(r.runId, (run = { stops: [] }));
    const open = run.stops.at(-1)?.toS === null ? run.stops.at(-1)! : null;
    switch (r.kind) {
      case 'departed':
        if (r.withdrawn) {
          run.departS = undefined;
          run.stops = [];
        } else if (r.correction || run.departS === undefined) run.departS = r.sessionS;
        else if (open) open.toS = Math.max(open.fromS, r.sessionS);
        break;
      case 'arrived':
        run.arriveS = r.withdrawn ? undefined : r.sessionS;
        if (!r.withdrawn && open) open.toS = Math.max(open.fromS, r.sessionS);
        break;
      case 'stopped': {
        const last = run.stops.at(-1);
        if (r.withdrawn) run.stops.pop();
        else if (r.correction && last) last.fromS = r.sessionS;
        else if (!open) run.stops.push({ fromS: r.sessionS, toS: null, reason: r.reason });
        break;
      }
    }
  }
  return known;
}

/**
 * Why a report does not fit what is known of the run, or null. A withdrawal needs something to
 * withdraw; a typed time corrects the report of its kind, or, when there is none yet, is a report
 * made afterwards at that time (checked like one made now).
 */
export function reportRefusal(run: KnownRun | undefined, kind: ReportKind, how: 'now' | 'typed' | 'withdraw'): string | null {
  const departed = run?.departS !== undefined;
  const arrived = run?.arriveS !== undefined;
  const standing = run?.stops.at(-1)?.toS === null;
  const exists = kind === 'departed' ? departed : kind === 'arrived' ? arrived : Boolean(run?.stops.length);
  if (how === 'withdraw') return exists ? null : `There is no “${kind}” report to withdraw.`;
  if (how === 'typed' && exists) return null;
  if (kind === 'departed' && departed && !standing) return arrived ? 'This run has already arrived.' : 'This run has already departed.';
  if (kind === 'arrived' && !departed) return 'Report the departure first.';
  if (kind === 'arrived' && arrived) return 'This run has already arrived.';
  if (kind === 'stopped' && !departed) return 'Report the departure first.';
  if (kind === 'stopped' && arrived) return 'This run has already arrived.';
  if (kind === 'stopped' && standing) return 'This train is already reported stopped.';
  return null;
}
