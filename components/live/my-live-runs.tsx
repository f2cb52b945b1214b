'use client';

import Link from 'next/link';
import type { LiveState } from '@/lib/live/types';
import { Badge } from '@/components/ui/card';
import { CorrectReports } from './correct-reports';
import { fastMinutes } from '@/lib/sessions/time-labels';
import { blockAt, delayLabel, fastAt, namesOf, reportedRuns } from './live-format';
import { ReportButtons } from './report-buttons';
import { useClockReading, useLiveSession } from './use-live-session';

/** My runs during the session: the next run on top with a countdown in fast minutes, and the report buttons. */
export function MyLiveRuns({ sessionId, railwayId, userId, initial }: { sessionId: string; railwayId: string; userId: string; initial: LiveState }) {
  const { state, mode, feed, offsetMs, accept } = useLiveSession(sessionId, initial);
  const reading = useClockReading(state, offsetMs);
  const clock = state.clock.clock;
  const names = namesOf(state);
  const nowS = reading.sessionS;
  const mine = state.runs.filter((r) => r.operatorId === userId && r.status !== 'arrived').sort((a, b) => a.departS - b.departS);
  const [current, ...later] = mine;
  const myReported = reportedRuns(state.runs.filter((r) => r.operatorId === userId));
  const late = state.runs
    .filter((r) => r.status !== 'arrived' && fastMinutes(Math.max(r.departDelayS, r.arriveDelayS), clock) >= 1)
    .map((r) => `${names.train.get(r.trainId)} ${delayLabel(Math.max(r.departDelayS, r.arriveDelayS), clock)}`);
  return (
    <section className="space-y-3 rounded-plate border-2 border-verdigris bg-surface p-4" data-testid="my-live-runs" aria-labelledby={`live-${sessionId}`}>
      <div className="flex items-baseline justify-between gap-2">
        <h2 id={`live-${sessionId}`} className="font-display text-lg font-bold">Running now</h2>
        <p className="font-display text-4xl font-bold tabular-nums" data-testid="fast-clock">{fastAt(nowS, clock)}</p>
      </div>
      <p className="text-xs text-muted">
        Clock <span data-testid="clock-state">{reading.state === 'not-started' ? 'not started' : reading.state}</span> ·{' '}
        <span data-testid="live-mode">{mode === 'live' ? 'Live' : mode === 'polling' ? 'Polling (stream cut)' : 'Connecting…'}</span> ·{' '}
        <Link href={`/railways/${railwayId}/sessions/${sessionId}/live`} className="font-semibold text-verdigris hover:underline">Live board</Link>
      </p>
      {late.length ? (
        <p className="rounded-plate bg-signal-soft px-3 py-2 text-sm text-signal" data-testid="my-late">
          Running late: {late.join(' · ')}
        </p>
      ) : null}
      {feed[0] ? <p className="text-sm text-muted" data-testid="my-latest">Latest: {feed[0].summary}</p> : null}
      {current ? (
        <div className="space-y-2 rounded-plate bg-sunken p-3" data-testid="my-next-run" data-run-id={current.id}>
          <p className="text-sm font-semibold uppercase tracking-wider text-brass">
            {current.status === 'running' ? 'Under way' : current.status === 'stopped' ? 'Stopped — help is coming' : 'Your next run'}
          </p>
          <p className="text-2xl font-bold">{names.train.get(current.trainId)}</p>
          <p className="text-lg">
            {names.cab.get(current.cabId)} · departs <span className="font-bold tabular-nums" data-testid="my-depart">{fastAt(current.departS, clock)}</span>
            {Math.abs(current.departS - current.plannedDepartS) >= 1 ? <span className="ml-1 text-muted line-through">{fastAt(current.plannedDepartS, clock)}</span> : null}{' '}
            {delayLabel(current.departDelayS, clock) ? <Badge tone="bad">{delayLabel(current.departDelayS, clock)}</Badge> : null}
          </p>
          <p className="text-lg" data-testid="my-countdown">
            {current.status === 'waiting' || current.status === 'due'
              ? `in ${Math.max(0, fastMinutes(current.departS - nowS, clock))} fast min`
              : `arrives ${fastAt(current.arriveS, clock)} · in ${Math.max(0, fastMinutes(current.arriveS - nowS, clock))} fast min · ${names.block.get(blockAt(current, nowS) ?? '') ?? 'in transit'}`}
          </p>
          <ReportButtons sessionId={sessionId} run={current} trainName={names.train.get(current.trainId) ?? 'train'} accept={accept} large />
        </div>
      ) : (
        <p className="text-muted">No more runs for you this session.</p>
      )}
      {later.length ? (
        <ol className="divide-y divide-line text-sm" aria-label="Later runs" data-testid="my-later-runs">
          {later.map((run) => (
            <li key={run.id} className="flex justify-between gap-2 py-1.5" data-run-id={run.id}>
              <span>
                <span className="font-bold tabular-nums" data-testid="my-depart">{fastAt(run.departS, clock)}</span> {names.train.get(run.trainId)} · {names.cab.get(run.cabId)}
              </span>
              {delayLabel(run.departDelayS, clock) ? <span className="font-semibold text-signal">{delayLabel(run.departDelayS, clock)}</span> : null}
            </li>
          ))}
        </ol>
      ) : null}
      {myReported.length ? (
        <details className="rounded-plate border border-line p-3" data-testid="my-corrections">
          <summary className="cursor-pointer text-sm font-semibold">Correct a report of mine</summary>
          <div className="mt-2">
            <CorrectReports state={state} accept={accept} runs={myReported} trainName={(r) => names.train.get(r.trainId) ?? 'Train'} />
          </div>
        </details>
      ) : null}
    </section>
  );
}
