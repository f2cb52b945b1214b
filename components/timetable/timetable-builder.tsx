'use client';

import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import dynamic from 'next/dynamic';
import { useCallback, useMemo, useState } from 'react';
import type { Finding } from '@/lib/planning';
import { clashingRuns, highlightOf, type Highlight } from '@/lib/sessions/highlight';
import { fastLabel, viewLengthS, type SessionClock } from '@/lib/sessions/time-labels';
import type { BuilderLayout, BuilderRun, BuilderSnapshot, SessionStatus } from '@/lib/sessions/types';
import { CheckSummary, StatusForm } from '@/components/sessions/session-form';
import { Button } from '@/components/ui/button';
import { Card, Notice } from '@/components/ui/card';
import { CrewLoad } from './crew-load';
import { FindingsPanel, findingKey } from './findings-panel';
import { LoadCharts } from './load-charts';
import { PrintView } from './print-view';
import { RetimeDialog } from './retime-dialog';
import { RunForm } from './run-form';
import { PALETTE } from './run-names';
import { RunTable } from './run-table';
import { TrainGraph } from './train-graph';
import { useTimetable } from './use-timetable';

// FullCalendar measures the page as it renders, so it is drawn in the browser only.
const CalendarView = dynamic(() => import('./calendar-view').then((m) => m.CalendarView), {
  ssr: false,
  loading: () => <p className="p-4 text-sm text-muted">Loading the calendar…</p>,
});

type View = 'graph' | 'calendar' | 'load' | 'print';
const VIEWS: { id: View; label: string }[] = [
  { id: 'graph', label: 'Train graph' },
  { id: 'calendar', label: 'Calendar' },
  { id: 'load', label: 'Load' },
  { id: 'print', label: 'Print' },
];

type Props = {
  sessionId: string;
  initial: BuilderSnapshot;
  layout: BuilderLayout;
  canEdit: boolean;
  dateLabel: string;
  /** The session's status as the page last rendered it (a status change re-renders the page). */
  status?: { railwayId: string; version: number; status: SessionStatus; title: string };
};

export function TimetableBuilder(props: Props) {
  const [client] = useState(() => new QueryClient({ defaultOptions: { queries: { refetchOnWindowFocus: false, retry: 1 } } }));
  return (
    <QueryClientProvider client={client}>
      <Builder {...props} />
    </QueryClientProvider>
  );
}

function Builder({ sessionId, initial, layout, canEdit, dateLabel, status }: Props) {
  const t = useTimetable(sessionId, initial);
  const { snapshot } = t;
  const { session, runs, findings, load } = snapshot;
  const clock: SessionClock = useMemo(
    () => ({ ratio: session.clockRatio, fastStart: session.fastStart, startsAtMs: session.startsAtMs, timeZone: session.timeZone }),
    [session.clockRatio, session.fastStart, session.startsAtMs, session.timeZone],
  );
  const lengthS = viewLengthS((session.endsAtMs - session.startsAtMs) / 1000, runs);
  const editable = canEdit && session.status !== 'cancelled';

  const [view, setView] = useState<View>('graph');
  const [colorBy, setColorBy] = useState<'cab' | 'operator'>('cab');
  const [selected, setSelected] = useState<{ finding?: Finding; runId?: string }>({});
  const [retimeOpen, setRetimeOpen] = useState(false);

  const trainName = useCallback((id: string) => layout.trains.find((tr) => tr.id === id)?.name ?? 'Unknown train', [layout.trains]);
  const runLabel = useCallback(
    (runId: string) => {
      const run = runs.find((r) => r.id === runId);
      return run ? `${trainName(run.trainId)} (${fastLabel(run.departS, clock)})` : 'a run';
    },
    [runs, trainName, clock],
  );
  const colorOf = useCallback(
    (run: BuilderRun) => {
      const list = colorBy === 'cab' ? layout.cabs.map((c) => c.id) : layout.operators.map((o) => o.id);
      const key = colorBy === 'cab' ? run.cabId : run.operatorId;
      const i = key ? list.indexOf(key) : -1;
      return i < 0 ? '#7d868a' : PALETTE[i % PALETTE.length]!;
    },
    [colorBy, layout.cabs, layout.operators],
  );
  const calendarLabel = useCallback(
    (run: BuilderRun) => {
      const who = colorBy === 'cab' ? layout.cabs.find((c) => c.id === run.cabId)?.name : layout.operators.find((o) => o.id === run.operatorId)?.name ?? 'no operator';
      return `${trainName(run.trainId)} · ${who}`;
    },
    [colorBy, layout.cabs, layout.operators, trainName],
  );

  const counts = useMemo(
    () => ({ errors: findings.filter((f) => f.severity === 'error').length, warnings: findings.filter((f) => f.severity === 'warning').length }),
    [findings],
  );
  const clashing = useMemo(() => clashingRuns(findings, runs, layout), [findings, runs, layout]);
  const highlight: Highlight | undefined = useMemo(() => {
    if (selected.finding) return highlightOf(selected.finding, runs, layout);
    const run = selected.runId ? runs.find((r) => r.id === selected.runId) : undefined;
    if (!run) return undefined;
    return { runIds: new Set([run.id]), blockIds: new Set(), cabIds: new Set([run.cabId]), fromS: run.departS, toS: run.arriveS };
  }, [selected, runs, layout]);

  const move = (run: BuilderRun, departS: number) =>
    void t.change({ type: 'patch', run, body: { version: run.version, departS }, label: runLabel(run.id) });
  const selectRun = (runId: string) => setSelected((s) => (s.runId === runId && !s.finding ? {} : { runId }));

  const lastDepart = runs.reduce((m, r) => Math.max(m, r.departS), -Infinity);
  const suggestedDepart = fastLabel(Number.isFinite(lastDepart) ? lastDepart + 600 / session.clockRatio : 0, clock);
  const colors = colorBy === 'cab' ? layout.cabs : layout.operators.filter((o) => runs.some((r) => r.operatorId === o.id));

  return (
    <div className="space-y-4" data-testid="timetable-builder">
      <div className="no-print flex flex-wrap items-center justify-between gap-3">
        <div role="tablist" aria-label="Views" className="flex flex-wrap gap-1 rounded-plate bg-sunken p-1">
          {VIEWS.map((v) => (
            <button
              key={v.id}
              role="tab"
              type="button"
              aria-selected={view === v.id}
              onClick={() => setView(v.id)}
              className={`rounded-plate px-3 py-1.5 text-sm font-semibold ${view === v.id ? 'bg-surface text-ink shadow-sm' : 'text-muted hover:text-ink'}`}
            >
              {v.label}
            </button>
          ))}
        </div>
        {view === 'graph' || view === 'calendar' ? (
          <label className="flex items-center gap-2 text-sm">
            Colour by
            <select value={colorBy} onChange={(e) => setColorBy(e.target.value as 'cab' | 'operator')} className="rounded-plate border border-line bg-surface px-2 py-1">
              <option value="cab">cab</option>
              <option value="operator">operator</option>
            </select>
          </label>
        ) : null}
      </div>

      {t.error ? (
        <div className="no-print">
          <Notice tone="bad">
            {t.error}{' '}
            <button type="button" className="underline" onClick={t.clearError}>Dismiss</button>
          </Notice>
        </div>
      ) : null}
      {session.status === 'cancelled' && canEdit ? (
        <div className="no-print"><Notice tone="warn">This session is cancelled, so its timetable is read-only. Reopen it as a draft in Settings to change it.</Notice></div>
      ) : null}

      <div className="grid gap-4 lg:grid-cols-[minmax(0,1fr)_22rem]">
        <div className="min-w-0 space-y-4">
          <section className="rounded-plate border border-line bg-surface p-3 shadow-sm sm:p-4" aria-label="View">
            {view === 'graph' ? (
              <TrainGraph
                layout={layout}
                runs={runs}
                findings={findings}
                clock={clock}
                sessionLengthS={lengthS}
                clashing={clashing}
                highlight={highlight}
                colorOf={colorOf}
                trainName={trainName}
                canEdit={editable}
                onSelectRun={selectRun}
                onMoveRun={move}
              />
            ) : null}
            {view === 'calendar' ? (
              <CalendarView
                runs={runs}
                clock={clock}
                endsAtMs={session.endsAtMs}
                clashing={clashing}
                highlight={highlight}
                colorOf={colorOf}
                label={calendarLabel}
                canEdit={editable}
                onSelectRun={selectRun}
                onMoveRun={move}
              />
            ) : null}
            {view === 'load' ? <LoadCharts load={load} findings={findings} clock={clock} lengthS={lengthS} highlight={highlight} derate={session.derate} /> : null}
            {view === 'print' ? <PrintView title={session.title} dateLabel={dateLabel} runs={runs} layout={layout} clock={clock} clashing={clashing} /> : null}
            {(view === 'graph' || view === 'calendar') && colors.length ? (
              <ul className="mt-3 flex flex-wrap gap-3 text-xs" aria-label="Colours">
                {colors.map((c, i) => (
                  <li key={c.id} className="flex items-center gap-1">
                    <span className="inline-block h-3 w-3 rounded-sm" style={{ background: colorBy === 'cab' ? PALETTE[i % PALETTE.length] : PALETTE[layout.operators.findIndex((o) => o.id === c.id) % PALETTE.length] }} />
                    {c.name}
                  </li>
                ))}
                <li className="flex items-center gap-1"><span className="inline-block h-3 w-3 rounded-sm border-2 border-signal" /> clashing run</li>
              </ul>
            ) : null}
          </section>

          <div className="no-print space-y-4">
            <Card title={`Runs (${runs.length})`}>
              <RunTable
                runs={runs}
                layout={layout}
                clock={clock}
                clashing={clashing}
                highlighted={highlight?.runIds ?? new Set()}
                canEdit={editable}
                actions={{
                  onPatch: (run, body) => void t.change({ type: 'patch', run, body: { ...body, version: run.version }, label: runLabel(run.id) }),
                  onDelete: (run) => void t.change({ type: 'delete', run, label: runLabel(run.id) }),
                  onSeries: (run, everyFastMin, count) => void t.change({ type: 'series', run, everyFastMin, count, label: runLabel(run.id) }),
                  onSelect: selectRun,
                }}
              />
            </Card>
            <div className="lg:hidden">
              <CrewLoad runs={runs} layout={layout} ratio={session.clockRatio} />
            </div>
            {editable ? (
              <Card title="Add a run">
                {layout.trains.length && layout.cabs.length && layout.blocks.length > 1 ? (
                  <RunForm
                    layout={layout}
                    suggestedDepart={suggestedDepart}
                    pending={t.pending}
                    onSubmit={async (body, label) => Boolean(await t.change({ type: 'create', body, label }))}
                  />
                ) : (
                  <p className="text-sm text-muted">This layout needs at least two blocks, a cab and a train before runs can be added.</p>
                )}
              </Card>
            ) : null}
          </div>
        </div>

        <aside className={`no-print space-y-4 self-start lg:sticky lg:top-4 lg:order-none ${canEdit ? 'order-first' : ''}`}>
          {canEdit && status?.status === 'draft' ? (
            <section className="rounded-plate border border-brass/40 bg-brass-soft p-4 text-sm" aria-label="Publishing" data-testid="publish-panel">
              <p className="mb-2">This timetable is a <strong>draft</strong>: invited operators cannot see it yet.</p>
              <div className="mb-3">
                <CheckSummary check={counts} />
              </div>
              <StatusForm key={status.version} railwayId={status.railwayId} session={{ id: sessionId, version: status.version, status: status.status, title: status.title }} check={counts} compact />
            </section>
          ) : null}
          <FindingsPanel
            findings={findings}
            totals={snapshot.totals}
            truncated={snapshot.truncated}
            clock={clock}
            selectedKey={selected.finding ? findingKey(selected.finding) : undefined}
            onSelect={(f) => setSelected(f ? { finding: f } : {})}
            onRepair={() => setRetimeOpen(true)}
            canEdit={editable}
            checking={t.pending}
            checkMs={snapshot.checkMs}
            roundTripMs={t.lastRoundTripMs}
            revision={t.revision}
          />
          <div className="hidden lg:block">
            <CrewLoad runs={runs} layout={layout} ratio={session.clockRatio} />
          </div>
        </aside>
      </div>

      {retimeOpen ? (
        <RetimeDialog
          sessionId={sessionId}
          clock={clock}
          runLabel={runLabel}
          pending={t.pending}
          onClose={() => setRetimeOpen(false)}
          onApply={async (moves) => {
            const done = await t.change({ type: 'retime', moves, label: 'repair' });
            if (done) setRetimeOpen(false);
          }}
        />
      ) : null}

      {t.undoable ? (
        <div className="no-print fixed inset-x-2 bottom-3 z-40 mx-auto flex max-w-xl items-center justify-between gap-3 rounded-plate border border-line bg-ink px-4 py-3 text-sm text-paper shadow-lg" role="status" data-testid="undo-bar">
          <span>{t.undoable.label}.</span>
          <span className="flex gap-2">
            <Button type="button" variant="secondary" onClick={t.undo} data-testid="undo">Undo</Button>
            <button type="button" className="px-2 text-paper/80 hover:text-paper" onClick={t.dismissUndo} aria-label="Dismiss">×</button>
          </span>
        </div>
      ) : null}
    </div>
  );
}
