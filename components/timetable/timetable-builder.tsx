'use client';

import * as Tabs from '@radix-ui/react-tabs';
import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import dynamic from 'next/dynamic';
import { useCallback, useEffect, useMemo, useState, useSyncExternalStore } from 'react';
import type { Finding } from '@/lib/planning';
import { clashingRuns, highlightOf, type Highlight } from '@/lib/sessions/highlight';
import { fastLabel, viewLengthS, type SessionClock } from '@/lib/sessions/time-labels';
import { expandSnapshot, type CompactSnapshot } from '@/lib/sessions/compact';
import type { TimetableLayout, SessionStatus } from '@/lib/sessions/types';
import type { Run } from '@/lib/runs/schema';
import { CheckSummary, StatusForm } from '@/components/sessions/session-form';
import { Button } from '@/components/ui/button';
import { Card, CardSkeleton, Notice } from '@/components/ui/card';
import { CrewLoad } from './crew-load';
import { ControlFindings } from '@/components/control/control-findings';
import { FindingsPanel, findingKey } from './findings-panel';
import { GRAPH_HEIGHT, GraphResizeHandle } from './graph-resize-handle';
import { LoadView } from './load-view';
import { RetimeDialog } from './retime-dialog';
import { RunForm } from './run-form';
import { PALETTE } from './run-names';
import { RunTable } from './run-table';
import { TrainGraph } from './train-graph';
import { useTimetable } from './use-timetable';

// Views other than the train graph load their code when first opened (the calendar and chart
// libraries never reach a builder that does not open them). FullCalendar measures the page as it
// renders, so it is drawn in the browser only.
const CalendarView = dynamic(() => import('./calendar-view').then((m) => m.CalendarView), {
  ssr: false,
  loading: () => <p className="p-4 text-sm text-muted">Loading the calendar…</p>,
});
const TrackView = dynamic(() => import('./track-view').then((m) => m.TrackView), {
  loading: () => <p className="p-4 text-sm text-muted">Loading the track diagram…</p>,
});
const PrintView = dynamic(() => import('./print-view').then((m) => m.PrintView), {
  loading: () => <p className="p-4 text-sm text-muted">Loading the printable timetable…</p>,
});

const noSubscription = () => () => {};

/**
 * False while the server renders and during hydration, true after: the page's HTML carries the frame
 * and the first view (the train graph), and the run list, the findings list and the crew load are
 * drawn in the browser from the same props, which keeps the page's HTML small.
 */
function useDrawnInBrowser(): boolean {
  return useSyncExternalStore(noSubscription, () => true, () => false);
}

type View = 'graph' | 'track' | 'calendar' | 'load' | 'print';
const VIEWS: { id: View; label: string }[] = [
  { id: 'graph', label: 'Train graph' },
  { id: 'calendar', label: 'Calendar' },
  { id: 'track', label: 'Track' },
  { id: 'load', label: 'Load' },
  { id: 'print', label: 'Print' },
];

type Props = {
  sessionId: string;
  /** The session's runs and findings, compact (the page sends them once; see lib/sessions/compact.ts). */
  initial: CompactSnapshot;
  layout: TimetableLayout;
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
  const [expanded] = useState(() => expandSnapshot(initial, layout));
  const t = useTimetable(sessionId, expanded);
  const drawn = useDrawnInBrowser();
  const { snapshot } = t;
  const { session, runs, findings } = snapshot;
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
  // On a phone the findings are a sheet over the bottom of the screen, folded to one line until opened.
  const [sheetOpen, setSheetOpen] = useState(false);
  const graphHeight = useGraphHeight();

  const trainName = useCallback((id: string) => layout.trains.find((tr) => tr.id === id)?.name ?? 'Unknown train', [layout.trains]);
  const runLabel = useCallback(
    (runId: string) => {
      const run = runs.find((r) => r.id === runId);
      return run ? `${trainName(run.trainId)} (${fastLabel(run.departS, clock)})` : 'a run';
    },
    [runs, trainName, clock],
  );
  const colorOf = useCallback(
    (run: Run) => {
      const list = colorBy === 'cab' ? layout.cabs.map((c) => c.id) : layout.operators.map((o) => o.id);
      const key = colorBy === 'cab' ? run.cabId : run.operatorId;
      const i = key ? list.indexOf(key) : -1;
      return i < 0 ? '#7d868a' : PALETTE[i % PALETTE.length]!;
    },
    [colorBy, layout.cabs, layout.operators],
  );
  const calendarLabel = useCallback(
    (run: Run) => {
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

  const move = (run: Run, departS: number) =>
    void t.change({ type: 'patch', run, body: { version: run.version, departS }, label: runLabel(run.id) });
  const selectRun = (runId: string) => setSelected((s) => (s.runId === runId && !s.finding ? {} : { runId }));

  const lastDepart = runs.reduce((m, r) => Math.max(m, r.departS), -Infinity);
  const suggestedDepart = fastLabel(Number.isFinite(lastDepart) ? lastDepart + 600 / session.clockRatio : 0, clock);
  const colors = colorBy === 'cab' ? layout.cabs : layout.operators.filter((o) => runs.some((r) => r.operatorId === o.id));

  const findingsPanel = drawn ? (
    <FindingsPanel
      findings={findings}
      counts={snapshot.counts}
      totals={snapshot.totals}
      truncated={snapshot.truncated}
      clock={clock}
      selectedKey={selected.finding ? findingKey(selected.finding) : undefined}
      onSelect={(f) => {
        setSelected(f ? { finding: f } : {});
        // On a phone, fold the sheet so the views show what the finding marks.
        if (f && window.matchMedia('(max-width: 1023.98px)').matches) setSheetOpen(false);
      }}
      repair={
        <RetimeDialog
          open={retimeOpen}
          onOpenChange={setRetimeOpen}
          sessionId={sessionId}
          clock={clock}
          runLabel={runLabel}
          pending={t.pending}
          onApply={async (moves) => {
            const done = await t.change({ type: 'retime', moves, label: 'repair' });
            if (done) setRetimeOpen(false);
          }}
        >
          <Button type="button" data-testid="repair-timing">Repair timing…</Button>
        </RetimeDialog>
      }
      canEdit={editable}
      checking={t.pending}
      checkMs={snapshot.checkMs}
      roundTripMs={t.lastRoundTripMs}
      revision={t.revision}
    />
  ) : (
    <section className="rounded-plate border border-line bg-surface p-4 shadow-sm" aria-busy="true" aria-label="Findings">
      <h2 className="mb-2 font-display text-lg font-bold">Findings</h2>
      <p className="text-sm">
        {snapshot.totals.errors} error{snapshot.totals.errors === 1 ? '' : 's'}, {snapshot.totals.warnings} warning{snapshot.totals.warnings === 1 ? '' : 's'}
      </p>
      <CardSkeleton lines={3} />
    </section>
  );
  const total = snapshot.totals ?? counts;

  return (
    <Tabs.Root value={view} onValueChange={(v) => setView(v as View)} className="space-y-4 max-lg:pb-16" data-testid="timetable-builder">
      <div className="no-print flex flex-wrap items-center justify-between gap-3">
        <Tabs.List aria-label="Views" className="flex flex-wrap gap-1 rounded-plate bg-sunken p-1">
          {VIEWS.map((v) => (
            <Tabs.Trigger
              key={v.id}
              value={v.id}
              className="rounded-plate px-3 py-1.5 text-sm font-semibold text-muted hover:text-ink focus-visible:outline focus-visible:outline-2 focus-visible:outline-verdigris data-[state=active]:bg-surface data-[state=active]:text-ink data-[state=active]:shadow-sm"
            >
              {v.label}
            </Tabs.Trigger>
          ))}
        </Tabs.List>
        {view === 'graph' || view === 'calendar' || view === 'track' ? (
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
            <Tabs.Content value="graph" className="focus-visible:outline-none">
              <div id="train-graph-area">
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
                  height={graphHeight.px}
                  interactive={drawn}
                />
              </div>
              <GraphResizeHandle height={graphHeight.px} onResize={graphHeight.set} controls="train-graph-area" />
            </Tabs.Content>
            <Tabs.Content value="track" className="focus-visible:outline-none">
              <TrackView
                layout={layout}
                runs={runs}
                clock={clock}
                lengthS={lengthS}
                sessionEndS={(session.endsAtMs - session.startsAtMs) / 1000}
                colorOf={colorOf}
                trainName={trainName}
              />
            </Tabs.Content>
            <Tabs.Content value="calendar" className="focus-visible:outline-none">
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
            </Tabs.Content>
            <Tabs.Content value="load" className="focus-visible:outline-none">
              <LoadView sessionId={sessionId} revision={t.revision} layout={layout} findings={findings} clock={clock} lengthS={lengthS} highlight={highlight} derate={session.derate} />
            </Tabs.Content>
            <Tabs.Content value="print" className="focus-visible:outline-none">
              <PrintView title={session.title} dateLabel={dateLabel} runs={runs} layout={layout} clock={clock} clashing={clashing} />
            </Tabs.Content>
            {(view === 'graph' || view === 'calendar' || view === 'track') && colors.length ? (
              <ul className="mt-3 flex flex-wrap gap-3 text-xs" aria-label="Colours">
                {colors.map((c, i) => (
                  <li key={c.id} className="flex items-center gap-1">
                    <span className="inline-block h-3 w-3 rounded-sm" style={{ background: colorBy === 'cab' ? PALETTE[i % PALETTE.length] : PALETTE[layout.operators.findIndex((o) => o.id === c.id) % PALETTE.length] }} />
                    {c.name}
                  </li>
                ))}
                <li className="flex items-center gap-1"><span className="inline-block h-3 w-3 rounded-sm border-2 border-signal" /> clashing run</li>
                {view === 'graph' ? (
                  <li className="flex items-center gap-1"><span className="inline-block h-3 w-3 rounded-sm border-2 border-dashed border-signal" /> block held by a standing train</li>
                ) : null}
              </ul>
            ) : null}
          </section>

          <div className="no-print space-y-4">
            {editable ? (
              <Card title="Add a run">
                {layout.trains.length && layout.cabs.length && layout.blocks.length > 1 ? (
                  <RunForm
                    layout={layout}
                    runs={runs}
                    clock={clock}
                    suggestedDepart={suggestedDepart}
                    pending={t.pending}
                    onSubmit={async (body, label) => (await t.change({ type: 'create', body, label }))?.run ?? null}
                  />
                ) : (
                  <p className="text-sm text-muted">This layout needs at least two blocks, a cab and a train before runs can be added.</p>
                )}
              </Card>
            ) : null}
            <Card title={`Runs (${runs.length})`}>
              {drawn ? (
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
              ) : (
                <p className="text-sm text-muted" aria-busy="true">Loading the runs…</p>
              )}
            </Card>
            {drawn ? (
              <div className="lg:hidden">
                <CrewLoad runs={runs} layout={layout} ratio={session.clockRatio} />
              </div>
            ) : null}
          </div>
        </div>

        {/* Beside the views on a laptop, the findings stay in sight while the page scrolls (sticky, scrolling on their own). */}
        <aside className={`no-print space-y-4 self-start lg:sticky lg:top-4 lg:max-h-[calc(100dvh-2rem)] lg:overflow-y-auto ${canEdit ? 'max-lg:order-first' : ''}`}>
          {canEdit && status?.status === 'draft' ? (
            <section className="rounded-plate border border-brass/40 bg-brass-soft p-4 text-sm" aria-label="Publishing" data-testid="publish-panel">
              <p className="mb-2">This timetable is a <strong>draft</strong>: invited operators cannot see it yet.</p>
              <div className="mb-3">
                <CheckSummary check={counts} />
              </div>
              <StatusForm key={status.version} railwayId={status.railwayId} session={{ id: sessionId, version: status.version, status: status.status, title: status.title }} check={counts} compact />
            </section>
          ) : null}
          <div className="max-lg:fixed max-lg:inset-x-0 max-lg:bottom-0 max-lg:z-30 max-lg:border-t max-lg:border-line max-lg:bg-paper max-lg:shadow-[0_-6px_16px_-8px_rgb(0_0_0/0.3)]" data-testid="findings-dock">
            <button
              type="button"
              className="flex w-full items-center justify-between gap-2 px-4 py-3 text-left text-sm font-semibold lg:hidden"
              aria-expanded={sheetOpen}
              aria-controls="findings-sheet"
              onClick={() => setSheetOpen((o) => !o)}
              data-testid="findings-sheet-toggle"
            >
              <span>
                Findings: <span className={total.errors ? 'text-signal' : ''}>{total.errors} error{total.errors === 1 ? '' : 's'}</span>, {total.warnings} warning{total.warnings === 1 ? '' : 's'}
              </span>
              <span aria-hidden className={`transition-transform ${sheetOpen ? 'rotate-180' : ''}`}>▴</span>
            </button>
            <div id="findings-sheet" className={sheetOpen ? 'max-lg:max-h-[70dvh] max-lg:overflow-y-auto max-lg:px-2 max-lg:pb-2' : 'max-lg:hidden'}>
              {findingsPanel}
              {canEdit && status ? (
                <div className="mt-4">
                  <ControlFindings sessionId={sessionId} revision={t.revision} clock={clock} controlHref={`/railways/${status.railwayId}/sessions/${sessionId}/control`} />
                </div>
              ) : null}
            </div>
          </div>
          {drawn ? (
            <div className="hidden lg:block">
              <CrewLoad runs={runs} layout={layout} ratio={session.clockRatio} />
            </div>
          ) : null}
        </aside>
      </div>

      {t.undoable ? (
        <div className="no-print fixed inset-x-2 bottom-3 z-40 max-lg:bottom-16 mx-auto flex max-w-xl items-center justify-between gap-3 rounded-plate border border-line bg-ink px-4 py-3 text-sm text-paper shadow-lg" role="status" data-testid="undo-bar">
          <span>{t.undoable.label}.</span>
          <span className="flex gap-2">
            <Button type="button" variant="secondary" onClick={t.undo} data-testid="undo">Undo</Button>
            <button type="button" className="px-2 text-paper/80 hover:text-paper" onClick={t.dismissUndo} aria-label="Dismiss">×</button>
          </span>
        </div>
      ) : null}
    </Tabs.Root>
  );
}

const GRAPH_HEIGHT_KEY = 'fishplate:train-graph-height';

/**
 * The train graph's height: most of the window by default (a laptop gives it the screen's height
 * less the page header, a phone a little over half), or what the planner last set it to.
 */
function useGraphHeight(): { px: number; set: (px: number) => void } {
  const [px, setPx] = useState(480);
  useEffect(() => {
    const stored = Number(window.localStorage.getItem(GRAPH_HEIGHT_KEY));
    const wide = window.matchMedia('(min-width: 1024px)').matches;
    const fit = wide ? window.innerHeight - 150 : window.innerHeight * 0.55;
    const wanted = stored >= GRAPH_HEIGHT.min && stored <= GRAPH_HEIGHT.max ? stored : Math.min(GRAPH_HEIGHT.max, Math.max(GRAPH_HEIGHT.min, Math.round(fit)));
    // Read once the page is in the browser: the server cannot know the window.
    // eslint-disable-next-line react-hooks/set-state-in-effect -- a one-off read of the window and storage after hydration
    setPx(wanted);
  }, []);
  const set = useCallback((next: number) => {
    setPx(next);
    window.localStorage.setItem(GRAPH_HEIGHT_KEY, String(next));
  }, []);
  return { px, set };
}
