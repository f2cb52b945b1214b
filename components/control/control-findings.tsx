'use client';

import Link from 'next/link';
import { keepPreviousData, useQuery } from '@tanstack/react-query';
import { Badge } from '@/components/ui/card';
import { timetableKeys } from '@/components/timetable/query-keys';
import { apiCall } from '@/lib/client/api';
import type { ControlFinding } from '@/lib/control/schedule';
import { spanLabel, type SessionClock } from '@/lib/sessions/time-labels';

type Answer = { wired: false; message: string } | { wired: true; findings: ControlFinding[]; errors: number; warnings: number };

const KIND_LABELS: Record<ControlFinding['kind'], string> = {
  'control-left-out': 'Left out of the control schedule',
  'control-reversing-stop': 'Stops in a reversing section',
  'interlock-shoot-through': 'Both direction inputs high',
  'interlock-dead-time': 'Direction changed while driving',
  'interlock-break-before-make': 'Relay switched under current',
  'interlock-two-cabs': 'Block fed by two cabs',
};
const SHOWN = 12;

/**
 * The control schedule's findings beside the timetable's: interlocks and runs the schedule leaves
 * out, checked again after each change to the timetable (`revision`).
 */
export function ControlFindings({ sessionId, revision, clock, controlHref }: { sessionId: string; revision: number; clock: SessionClock; controlHref: string }) {
  const query = useQuery({
    queryKey: timetableKeys.control(sessionId, revision),
    queryFn: () => apiCall<Answer>('GET', `/api/sessions/${sessionId}/control/findings`),
    placeholderData: keepPreviousData,
    staleTime: 60_000,
  });
  const answer = query.data;
  return (
    <section className="rounded-plate border border-line bg-surface p-4 shadow-sm" aria-labelledby="control-findings-title" data-testid="control-findings-panel">
      <header className="mb-2 flex flex-wrap items-center justify-between gap-2">
        <h2 id="control-findings-title" className="font-display text-lg font-bold">Control interlocks</h2>
        {answer?.wired ? (
          <span className="flex gap-2 text-xs">
            <Badge tone={answer.errors ? 'bad' : 'good'}>{answer.errors} error{answer.errors === 1 ? '' : 's'}</Badge>
            <Badge tone={answer.warnings ? 'warn' : 'neutral'}>{answer.warnings} warning{answer.warnings === 1 ? '' : 's'}</Badge>
          </span>
        ) : null}
      </header>
      {query.isError ? <p className="text-sm text-signal">The control schedule could not be checked: {query.error.message}</p> : null}
      {!answer && !query.isError ? <p className="text-sm text-muted">Checking the control schedule…</p> : null}
      {answer && !answer.wired ? <p className="text-sm text-muted">{answer.message}</p> : null}
      {answer?.wired && answer.findings.length === 0 ? <p className="text-sm text-muted">Every run is scheduled and every interlock holds.</p> : null}
      {answer?.wired && answer.findings.length > 0 ? (
        <ol className="space-y-2 text-sm" data-testid="control-finding-list">
          {answer.findings.slice(0, SHOWN).map((f, i) => (
            <li key={`${f.kind}-${i}`} className="rounded-plate border border-line p-2" data-testid="control-finding" data-kind={f.kind}>
              <span className="mb-1 flex items-center gap-2">
                <Badge tone={f.severity === 'error' ? 'bad' : 'warn'}>{f.severity}</Badge>
                <span className="font-semibold">{KIND_LABELS[f.kind]}</span>
              </span>
              <span className="block">{f.message}</span>
              <span className="mt-1 block text-xs text-muted">{spanLabel(f.fromS, f.toS, clock)}</span>
            </li>
          ))}
        </ol>
      ) : null}
      <p className="mt-2 text-sm">
        {answer?.wired && answer.findings.length > SHOWN ? `${answer.findings.length - SHOWN} more in the ` : ''}
        <Link href={controlHref} className="font-semibold text-verdigris hover:underline">Control view</Link>
      </p>
    </section>
  );
}
