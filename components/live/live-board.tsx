'use client';

import { useState } from 'react';
import { Badge } from '@/components/ui/card';
import { Button } from '@/components/ui/button';
import type { LiveRun, LiveState } from '@/lib/live/types';
import { ClockControls } from './clock-controls';
import { CorrectReports } from './correct-reports';
import { fastMinutes } from '@/lib/sessions/time-labels';
import { blockAt, delayLabel, fastAt, isUnderWay, namesOf, notDeparted, reportedRuns } from './live-format';
import { ReportButtons } from './report-buttons';
import { postLive, useClockReading, useLiveSession, type LiveMode } from './use-live-session';

const MODE_LABEL: Record<LiveMode, string> = { connecting: 'Connecting…', live: 'Live', polling: 'Polling (stream cut)' };
const STOP_WORD = { stalled: 'stalled', derailed: 'derailed', blocked: 'blocked' } as const;

/** The big screen by the layout: the fast clock, what runs now and next, the blocks, delays and what they cause. */
export function LiveBoard({ sessionId, initial, canControl, isHost }: { sessionId: string; initial: LiveState; canControl: boolean; isHost: boolean }) {
  const { state, mode, feed, offsetMs, accept } = useLiveSession(sessionId, initial);
  const reading = useClockReading(state, offsetMs);
  const clock = state.clock.clock;
  const names = namesOf(state);
  const nowS = reading.sessionS;
  const started = reading.state !== 'not-started';
  const train = (r: LiveRun) => names.train.get(r.trainId) ?? 'Train';
  const operator = (r: LiveRun) => (r.operatorId ? (names.operator.get(r.operatorId) ?? 'someone') : 'no operator');

  const underWay = state.runs.filter(isUnderWay);
  const next = state.runs.filter(notDeparted).sort((a, b) => a.departS - b.departS).slice(0, 8);
  const late = state.runs.filter((r) => r.status !== 'arrived' && fastMinutes(Math.max(r.departDelayS, r.arriveDelayS), clock) >= 1);
  const inBlock = new Map<string, LiveRun[]>();
  if (started) {
    for (const run of state.runs) {
      if (run.status === 'arrived') continue;
      const block = blockAt(run, nowS);
      if (block) inBlock.set(block, [...(inBlock.get(block) ?? []), run]);
    }
  }

  return (
    <div className="space-y-4" data-testid="live-board">
      <header className="flex flex-col gap-3 rounded-plate border border-line bg-surface p-4 lg:flex-row lg:items-center lg:justify-between">
        <div>
          <p className="text-sm font-semibold uppercase tracking-widest text-brass">Live board · {state.session.title}</p>
          <p className="font-display text-7xl font-bold leading-none tabular-nums sm:text-8xl" data-testid="fast-clock" aria-live="off">
            {fastAt(nowS, clock)}
          </p>
          <p className="mt-1 text-sm text-muted">
            Fast clock {clock.ratio}:1 ·{' '}
            <span data-testid="clock-state">{reading.state === 'not-started' ? 'not started' : reading.state}</span> ·{' '}
            <span data-testid="live-mode" className={mode === 'live' ? 'text-verdigris' : 'text-amber'}>{MODE_LABEL[mode]}</span>
          </p>
        </div>
        {canControl ? <ClockControls state={state} accept={accept} /> : null}
      </header>

      <div className="grid gap-4 xl:grid-cols-3">
        <section className="rounded-plate border border-line bg-surface p-4 xl:col-span-2" aria-labelledby="cabs-h">
          <h2 id="cabs-h" className="font-display text-2xl font-bold">Cabs</h2>
          <ul className="mt-3 grid gap-3 md:grid-cols-2" data-testid="cab-list">
            {state.names.cabs.map((cab) => {
              const run = underWay.find((r) => r.cabId === cab.id);
              const upcoming = next.find((r) => r.cabId === cab.id);
              return (
                <li key={cab.id} className="rounded-plate border border-line p-3" data-testid="cab-row">
                  <p className="text-sm font-semibold uppercase tracking-wider text-muted">{cab.name}</p>
                  {run ? (
                    <div className="space-y-1">
                      <p className="text-2xl font-bold">
                        {train(run)} {run.status === 'stopped' ? <Badge tone="bad">stopped{run.actual.stop?.reason ? ` — ${STOP_WORD[run.actual.stop.reason]}` : ''}</Badge> : null}
                      </p>
                      <p className="text-lg">
                        {operator(run)} · in {names.block.get(blockAt(run, nowS) ?? '') ?? 'transit'} · arrives {fastAt(run.arriveS, clock)}{' '}
                        <span className="text-muted">(in {Math.max(0, fastMinutes(run.arriveS - nowS, clock))} fast min)</span>
                      </p>
                      {isHost ? <ReportButtons sessionId={sessionId} run={run} trainName={train(run)} accept={accept} /> : null}
                    </div>
                  ) : (
                    <p className="text-lg text-muted">{upcoming ? `Next: ${train(upcoming)} at ${fastAt(upcoming.departS, clock)}` : 'Nothing more'}</p>
                  )}
                </li>
              );
            })}
          </ul>
        </section>

        <section className="rounded-plate border border-line bg-surface p-4" aria-labelledby="next-h">
          <h2 id="next-h" className="font-display text-2xl font-bold">Next departures</h2>
          <ol className="mt-3 divide-y divide-line" data-testid="next-departures">
            {next.map((run) => (
              <li key={run.id} className="py-2" data-testid="departure-row" data-run-id={run.id}>
                <p className="flex items-baseline gap-2 text-xl">
                  <span className="font-bold tabular-nums" data-testid="departure-time">{fastAt(run.departS, clock)}</span>
                  {Math.abs(run.departS - run.plannedDepartS) >= 1 ? (
                    <span className="text-base text-muted line-through" title="Planned">{fastAt(run.plannedDepartS, clock)}</span>
                  ) : null}
                  <span className="font-semibold">{train(run)}</span>
                  {run.status === 'due' ? <Badge tone="warn">due</Badge> : null}
                </p>
                <p className="text-sm text-muted">
                  {names.cab.get(run.cabId)} · {operator(run)}
                  {run.heldBy ? ` · waits for ${train(state.runs.find((r) => r.id === run.heldBy)!)}` : ''}
                </p>
                {isHost ? <ReportButtons sessionId={sessionId} run={run} trainName={train(run)} accept={accept} /> : null}
              </li>
            ))}
            {next.length === 0 ? <li className="py-2 text-muted">No more departures.</li> : null}
          </ol>
        </section>
      </div>

      <section className="rounded-plate border border-line bg-surface p-4" aria-labelledby="blocks-h">
        <h2 id="blocks-h" className="font-display text-2xl font-bold">Blocks</h2>
        <ol className="mt-3 flex flex-wrap gap-2" data-testid="block-strip">
          {state.names.blocks.map((block) => {
            const here = inBlock.get(block.id) ?? [];
            const tone = here.length > 1 ? 'border-signal bg-signal-soft text-signal' : here.length ? 'border-verdigris bg-verdigris-soft text-verdigris-strong' : 'border-line text-muted';
            return (
              <li key={block.id} className={`min-w-28 flex-1 rounded-plate border-2 px-3 py-2 ${tone}`} data-testid="block-cell">
                <p className="text-xs font-semibold uppercase tracking-wider">{block.name}</p>
                <p className="text-lg font-bold">{here.length ? here.map(train).join(' + ') : '—'}</p>
              </li>
            );
          })}
        </ol>
      </section>

      <div className="grid gap-4 lg:grid-cols-3">
        <section className="rounded-plate border border-line bg-surface p-4" aria-labelledby="late-h">
          <h2 id="late-h" className="font-display text-2xl font-bold">Running late</h2>
          <ul className="mt-2 space-y-1 text-lg" data-testid="late-runs">
            {late.map((run) => (
              <li key={run.id} className="flex justify-between gap-2" data-testid="late-run">
                <span>{train(run)} <span className="text-sm text-muted">{fastAt(run.plannedDepartS, clock)}</span></span>
                <span className="font-bold text-signal">{delayLabel(Math.max(run.departDelayS, run.arriveDelayS), clock)}</span>
              </li>
            ))}
            {late.length === 0 ? <li className="text-muted">Everything on time.</li> : null}
          </ul>
        </section>

        <section className="rounded-plate border border-line bg-surface p-4" aria-labelledby="clash-h">
          <h2 id="clash-h" className="font-display text-2xl font-bold">Clashes from delays</h2>
          <ul className="mt-2 space-y-2" data-testid="new-clashes">
            {state.newFindings.map((f) => (
              <li key={`${f.kind}-${f.ids.join('-')}`} className="rounded-plate bg-signal-soft px-3 py-2 text-signal" data-testid="new-clash">{f.message}</li>
            ))}
            {state.newFindings.length === 0 ? <li className="text-muted">None.</li> : null}
          </ul>
          {isHost && state.repair.length ? <RepairPanel state={state} accept={accept} trainName={(id) => train(state.runs.find((r) => r.id === id)!)} /> : null}
        </section>

        {isHost ? (
          <section className="rounded-plate border border-line bg-surface p-4" aria-labelledby="correct-h">
            <h2 id="correct-h" className="font-display text-2xl font-bold">Correct a report</h2>
            <CorrectReports state={state} accept={accept} runs={reportedRuns(state.runs)} trainName={train} />
          </section>
        ) : null}

        <section className="rounded-plate border border-line bg-surface p-4" aria-labelledby="feed-h">
          <h2 id="feed-h" className="font-display text-2xl font-bold">Latest</h2>
          <ul className="mt-2 space-y-1 text-sm" data-testid="live-feed">
            {feed.map((item) => <li key={item.seq}>{item.summary}</li>)}
            {feed.length === 0 ? <li className="text-muted">Reports appear here as they come in.</li> : null}
          </ul>
        </section>
      </div>
    </div>
  );
}

/** The engine's repair for the runs not yet departed; one confirmation applies it. */
function RepairPanel({ state, accept, trainName }: { state: LiveState; accept: (s: LiveState) => void; trainName: (runId: string) => string }) {
  const [confirming, setConfirming] = useState(false);
  const [error, setError] = useState<string | null>(null);
  const clock = state.clock.clock;
  const apply = async () => {
    setError(await postLive(`/api/sessions/${state.session.id}/repair`, { moves: state.repair.map((m) => ({ runId: m.runId, delayS: m.delayS })) }, accept));
    setConfirming(false);
  };
  return (
    <div className="mt-3 space-y-2 border-t border-line pt-3" data-testid="repair-panel">
      {!confirming ? (
        <Button onClick={() => setConfirming(true)}>Repair: move {state.repair.length} run{state.repair.length === 1 ? '' : 's'} not yet departed</Button>
      ) : (
        <>
          <ul className="text-sm">
            {state.repair.map((m) => (
              <li key={m.runId}>{trainName(m.runId)} → {fastAt(m.newDepartS, clock)} (+{fastMinutes(m.delayS, clock)} fast min)</li>
            ))}
          </ul>
          <div className="flex gap-2">
            <Button onClick={apply}>Apply repair</Button>
            <Button variant="secondary" onClick={() => setConfirming(false)}>Cancel</Button>
          </div>
        </>
      )}
      {error ? <p className="text-sm text-signal" role="alert">{error}</p> : null}
    </div>
  );
}
