'use client';

import { memo, useEffect, useMemo, useRef, useState } from 'react';
import { fastLabel, fastLabelSeconds, realLabel, type SessionClock } from '@/lib/sessions/time-labels';
import { fastTimeToReal } from '@/lib/planning/clock';
import type { TimetableLayout } from '@/lib/sessions/types';
import type { Run } from '@/lib/runs/schema';
import { Button } from '@/components/ui/button';
import { Badge } from '@/components/ui/card';
import { inputClass } from '@/components/ui/field';

// The form input look without its full width, for inputs that sit in a row.
const compact = inputClass.replace('w-full', '').replace('px-3 py-2', 'px-2 py-1');
import { routeSummary } from './run-names';
import type { UpdateRunBody } from '@/lib/runs/schema';

type Actions = {
  onPatch: (run: Run, body: Omit<UpdateRunBody, 'version'>) => void;
  onDelete: (run: Run) => void;
  onSeries: (run: Run, everyFastMin: number, count: number) => void;
  onSelect: (runId: string) => void;
};

function DepartureInput({ run, clock, onPatch, label }: { run: Run; clock: SessionClock; onPatch: Actions['onPatch']; label: string }) {
  const shown = fastLabel(run.departS, clock);
  const [value, setValue] = useState(shown);
  const [error, setError] = useState(false);
  const commit = () => {
    const text = value.trim();
    if (text === shown) return setError(false);
    if (!/^([01]\d|2[0-3]):[0-5]\d$/.test(text)) return setError(true);
    setError(false);
    onPatch(run, { depart: text });
  };
  return (
    <input
      aria-label={`Departure of ${label} (fast clock)`}
      data-testid="run-depart"
      value={value}
      inputMode="numeric"
      aria-invalid={error || undefined}
      title={error ? 'Enter HH:MM on the fast clock' : undefined}
      onChange={(e) => setValue(e.target.value)}
      onBlur={commit}
      onKeyDown={(e) => {
        if (e.key === 'Enter') {
          e.preventDefault();
          commit();
        }
        if (e.key === 'Escape') setValue(shown);
      }}
      className={`${compact} w-20 font-semibold tabular-nums`}
    />
  );
}

function StepsEditor({ run, layout, clock, onPatch }: { run: Run; layout: TimetableLayout; clock: SessionClock; onPatch: Actions['onPatch'] }) {
  const [rows, setRows] = useState(() => run.steps.map((s) => ({ blockId: s.blockId, enter: fastLabelSeconds(s.enterS, clock), exit: fastLabelSeconds(s.exitS, clock) })));
  const [error, setError] = useState<string>();
  const save = () => {
    const steps = [];
    for (const [i, row] of rows.entries()) {
      const enterS = fastTimeToReal(row.enter, clock, run.steps[i]!.enterS);
      const exitS = fastTimeToReal(row.exit, clock, run.steps[i]!.exitS);
      if (enterS === null || exitS === null) return setError(`Step ${i + 1}: write times as HH:MM:SS on the fast clock.`);
      if (!(enterS < exitS)) return setError(`Step ${i + 1}: the train must leave the block after it enters it.`);
      if (i > 0 && enterS < steps[i - 1]!.enterS) return setError(`Step ${i + 1} enters before step ${i}.`);
      steps.push({ blockId: row.blockId, enterS, exitS });
    }
    const first = steps[0]!;
    const last = steps[steps.length - 1]!;
    // Keep the departure and arrival inside the first and last blocks' times, as a plan requires.
    const departS = Math.min(Math.max(run.departS, first.enterS), first.exitS);
    const arriveS = Math.max(Math.min(run.arriveS, last.exitS), Math.min(departS + 1, last.exitS));
    if (!(departS < arriveS)) return setError('The run must arrive after it departs.');
    setError(undefined);
    onPatch(run, { steps: { departS, arriveS, steps } });
  };
  return (
    <div className="mt-2 rounded-plate bg-sunken p-3" data-testid="steps-editor">
      <p className="mb-2 text-xs text-muted">Times each block is held (fast clock, HH:MM:SS). timeRun worked these out; change any to override it.</p>
      <div className="overflow-x-auto">
        <table className="text-sm">
          <thead>
            <tr className="text-left text-xs text-muted">
              <th className="pr-2">Block</th>
              <th className="pr-2">Enters</th>
              <th>Leaves</th>
            </tr>
          </thead>
          <tbody>
            {rows.map((row, i) => (
              <tr key={`${row.blockId}-${i}`}>
                <td className="pr-2">{layout.blocks.find((b) => b.id === row.blockId)?.name}</td>
                {(['enter', 'exit'] as const).map((field) => (
                  <td key={field} className="py-0.5 pr-2">
                    <input
                      aria-label={`${field === 'enter' ? 'Enters' : 'Leaves'} step ${i + 1}`}
                      value={row[field]}
                      onChange={(e) => setRows((r) => r.map((x, j) => (j === i ? { ...x, [field]: e.target.value } : x)))}
                      className={`${compact} w-28 tabular-nums`}
                    />
                  </td>
                ))}
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      {error ? <p className="mt-2 text-sm text-signal" role="alert">{error}</p> : null}
      <Button type="button" variant="secondary" className="mt-2" onClick={save}>Save step times</Button>
    </div>
  );
}

function SeriesForm({ run, onSeries }: { run: Run; onSeries: Actions['onSeries'] }) {
  const [every, setEvery] = useState('30');
  const [count, setCount] = useState('3');
  const [error, setError] = useState<string>();
  return (
    <form
      className="mt-2 flex flex-wrap items-end gap-2 rounded-plate bg-sunken p-3 text-sm"
      onSubmit={(e) => {
        e.preventDefault();
        const n = Number(count);
        const m = Number(every);
        if (!Number.isInteger(m) || m < 1 || m > 1440) return setError('Every 1 to 1440 fast minutes.');
        if (!Number.isInteger(n) || n < 1 || n > 50) return setError('Make 1 to 50 copies.');
        setError(undefined);
        onSeries(run, m, n);
      }}
      data-testid="series-form"
    >
      <label className="space-y-1">
        <span className="block text-xs font-semibold">Every (fast minutes)</span>
        <input value={every} onChange={(e) => setEvery(e.target.value)} className={`${compact} w-24`} inputMode="numeric" />
      </label>
      <label className="space-y-1">
        <span className="block text-xs font-semibold">Copies</span>
        <input value={count} onChange={(e) => setCount(e.target.value)} className={`${compact} w-20`} inputMode="numeric" />
      </label>
      <Button type="submit" variant="secondary">Make series</Button>
      {error ? <p className="w-full text-signal" role="alert">{error}</p> : null}
    </form>
  );
}

type RowProps = {
  run: Run;
  layout: TimetableLayout;
  clock: SessionClock;
  clash: boolean;
  lit: boolean;
  canEdit: boolean;
  open: 'steps' | 'series' | null;
  onToggle: (runId: string, panel: 'steps' | 'series') => void;
  actions: Actions;
};

/** One run; re-rendered only when the run (its version), its marks or its open panel change. */
const RunRow = memo(
  function RunRow({ run, layout, clock, clash, lit, canEdit, open, onToggle, actions }: RowProps) {
    const trainName = layout.trains.find((t) => t.id === run.trainId)?.name ?? 'Unknown train';
    const label = `${trainName} at ${fastLabel(run.departS, clock)}`;
    const operator = layout.operators.find((o) => o.id === run.operatorId);
    return (
      <li
        className={`py-2 pl-2 ${clash ? 'border-l-4 border-signal' : 'border-l-4 border-transparent'} ${lit ? 'bg-brass-soft' : ''}`}
        data-testid="run-row"
        data-run-id={run.id}
        data-clash={clash ? 'true' : 'false'}
      >
        <div className="flex flex-wrap items-center gap-x-3 gap-y-2">
          {canEdit ? (
            // Keyed by what it shows, so a departure changed elsewhere (a drag, a repair) resets the field.
            <DepartureInput key={fastLabel(run.departS, clock)} run={run} clock={clock} onPatch={actions.onPatch} label={label} />
          ) : (
            <span className="w-14 font-semibold tabular-nums">{fastLabel(run.departS, clock)}</span>
          )}
          <span className="w-24 text-xs text-muted tabular-nums">
            {realLabel(run.departS, clock)} real
            <br />
            arr. {fastLabel(run.arriveS, clock)}
          </span>
          <button type="button" className="min-w-0 flex-1 text-left" onClick={() => actions.onSelect(run.id)}>
            <span className="block font-semibold">
              {trainName} {clash ? <Badge tone="bad">clash</Badge> : null}
            </span>
            <span className="block text-xs text-muted">{routeSummary(run, layout)}</span>
          </button>
          {canEdit ? (
            <>
              <select
                aria-label={`Cab for ${label}`}
                value={run.cabId}
                onChange={(e) => actions.onPatch(run, { cabId: e.target.value })}
                className={`${compact} w-28`}
              >
                {layout.cabs.map((c) => (
                  <option key={c.id} value={c.id}>{c.name}</option>
                ))}
              </select>
              <select
                aria-label={`Operator for ${label}`}
                value={run.operatorId ?? ''}
                onChange={(e) => actions.onPatch(run, { operatorId: e.target.value || null })}
                className={`${compact} w-40`}
              >
                <option value="">No operator</option>
                {layout.operators.map((o) => (
                  <option key={o.id} value={o.id}>{o.name}{o.reply === 'declined' ? ' (declined)' : ''}</option>
                ))}
              </select>
            </>
          ) : (
            <span className="text-sm">
              {layout.cabs.find((c) => c.id === run.cabId)?.name} · {operator?.name ?? 'no operator'}
            </span>
          )}
          {operator?.reply === 'declined' ? <Badge tone="bad">operator declined</Badge> : null}
          {canEdit ? (
            <span className="flex gap-1">
              <Button type="button" variant="ghost" className="px-2 py-1" aria-expanded={open === 'steps'} onClick={() => onToggle(run.id, 'steps')}>
                Steps
              </Button>
              <Button type="button" variant="ghost" className="px-2 py-1" aria-expanded={open === 'series'} onClick={() => onToggle(run.id, 'series')}>
                Series
              </Button>
              <Button type="button" variant="danger" className="px-2 py-1" aria-label={`Delete ${label}`} onClick={() => actions.onDelete(run)}>
                Delete
              </Button>
            </span>
          ) : null}
        </div>
        {open === 'steps' ? <StepsEditor key={`${run.id}-${run.version}`} run={run} layout={layout} clock={clock} onPatch={actions.onPatch} /> : null}
        {open === 'series' ? <SeriesForm run={run} onSeries={actions.onSeries} /> : null}
      </li>
    );
  },
  (a, b) =>
    a.run.id === b.run.id &&
    a.run.version === b.run.version &&
    a.run.departS === b.run.departS &&
    a.run.cabId === b.run.cabId &&
    a.run.operatorId === b.run.operatorId &&
    a.clash === b.clash &&
    a.lit === b.lit &&
    a.open === b.open &&
    a.canEdit === b.canEdit &&
    a.clock === b.clock &&
    a.layout === b.layout,
);

/** How many runs are listed before "show all": enough for a session, few enough to stay quick. */
const LISTED_AT_FIRST = 60;

/** The runs by departure, each editable in place: departure, cab and operator; steps, series, delete. */
export function RunTable({
  runs,
  layout,
  clock,
  clashing,
  highlighted,
  canEdit,
  actions,
}: {
  runs: Run[];
  layout: TimetableLayout;
  clock: SessionClock;
  clashing: Set<string>;
  highlighted: Set<string>;
  canEdit: boolean;
  actions: Actions;
}) {
  const [open, setOpen] = useState<{ runId: string; panel: 'steps' | 'series' } | null>(null);
  const [showAll, setShowAll] = useState(false);
  // Stable handlers, so that memoised rows are not re-rendered for a new closure.
  const latest = useRef(actions);
  useEffect(() => {
    latest.current = actions;
  });
  const stable = useMemo<Actions>(
    () => ({
      onPatch: (...a) => latest.current.onPatch(...a),
      onDelete: (...a) => latest.current.onDelete(...a),
      onSeries: (...a) => latest.current.onSeries(...a),
      onSelect: (...a) => latest.current.onSelect(...a),
    }),
    [],
  );
  const onToggle = useMemo(
    () => (runId: string, panel: 'steps' | 'series') => setOpen((o) => (o?.runId === runId && o.panel === panel ? null : { runId, panel })),
    [],
  );
  const sorted = useMemo(() => [...runs].sort((a, b) => a.departS - b.departS || a.id.localeCompare(b.id)), [runs]);
  if (runs.length === 0) return <p className="text-sm text-muted" data-testid="no-runs">No runs yet. Add the first one below.</p>;
  const listed = showAll || sorted.length <= LISTED_AT_FIRST ? sorted : sorted.filter((r, i) => i < LISTED_AT_FIRST || highlighted.has(r.id));
  return (
    <>
      <ul className="divide-y divide-line" data-testid="run-list">
        {listed.map((run) => (
          <RunRow
            key={run.id}
            run={run}
            layout={layout}
            clock={clock}
            clash={clashing.has(run.id)}
            lit={highlighted.has(run.id)}
            canEdit={canEdit}
            open={open?.runId === run.id ? open.panel : null}
            onToggle={onToggle}
            actions={stable}
          />
        ))}
      </ul>
      {listed.length < sorted.length ? (
        <Button type="button" variant="ghost" className="mt-2 w-full" onClick={() => setShowAll(true)}>
          Show all {sorted.length} runs
        </Button>
      ) : null}
    </>
  );
}
