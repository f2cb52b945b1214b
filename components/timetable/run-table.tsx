'use client';

import { useEffect, useState } from 'react';
import { fastLabel, fastLabelSeconds, fastTextToReal, realLabel, type SessionClock } from '@/lib/sessions/time-labels';
import type { BuilderLayout, BuilderRun } from '@/lib/sessions/types';
import { Button } from '@/components/ui/button';
import { Badge } from '@/components/ui/card';
import { inputClass } from '@/components/ui/field';
import { routeSummary } from './run-names';
import type { RunPatchBody } from './api';

type Actions = {
  onPatch: (run: BuilderRun, body: Omit<RunPatchBody, 'version'>) => void;
  onDelete: (run: BuilderRun) => void;
  onSeries: (run: BuilderRun, everyFastMin: number, count: number) => void;
  onSelect: (runId: string) => void;
};

function DepartureInput({ run, clock, onPatch, label }: { run: BuilderRun; clock: SessionClock; onPatch: Actions['onPatch']; label: string }) {
  const shown = fastLabel(run.departS, clock);
  const [value, setValue] = useState(shown);
  const [error, setError] = useState(false);
  useEffect(() => setValue(shown), [shown]);
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
      className={`${inputClass} w-20 font-semibold tabular-nums`}
    />
  );
}

function StepsEditor({ run, layout, clock, onPatch }: { run: BuilderRun; layout: BuilderLayout; clock: SessionClock; onPatch: Actions['onPatch'] }) {
  const [rows, setRows] = useState(() => run.steps.map((s) => ({ blockId: s.blockId, enter: fastLabelSeconds(s.enterS, clock), exit: fastLabelSeconds(s.exitS, clock) })));
  const [error, setError] = useState<string>();
  const save = () => {
    const steps = [];
    for (const [i, row] of rows.entries()) {
      const enterS = fastTextToReal(row.enter, clock, run.steps[i]!.enterS);
      const exitS = fastTextToReal(row.exit, clock, run.steps[i]!.exitS);
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
                      className={`${inputClass} w-28 tabular-nums`}
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

function SeriesForm({ run, onSeries }: { run: BuilderRun; onSeries: Actions['onSeries'] }) {
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
        <input value={every} onChange={(e) => setEvery(e.target.value)} className={`${inputClass} w-24`} inputMode="numeric" />
      </label>
      <label className="space-y-1">
        <span className="block text-xs font-semibold">Copies</span>
        <input value={count} onChange={(e) => setCount(e.target.value)} className={`${inputClass} w-20`} inputMode="numeric" />
      </label>
      <Button type="submit" variant="secondary">Make series</Button>
      {error ? <p className="w-full text-signal" role="alert">{error}</p> : null}
    </form>
  );
}

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
  runs: BuilderRun[];
  layout: BuilderLayout;
  clock: SessionClock;
  clashing: Set<string>;
  highlighted: Set<string>;
  canEdit: boolean;
  actions: Actions;
}) {
  const [open, setOpen] = useState<{ runId: string; panel: 'steps' | 'series' } | null>(null);
  const trainName = (id: string) => layout.trains.find((t) => t.id === id)?.name ?? 'Unknown train';
  const sorted = [...runs].sort((a, b) => a.departS - b.departS || a.id.localeCompare(b.id));
  if (runs.length === 0) return <p className="text-sm text-muted" data-testid="no-runs">No runs yet. Add the first one below.</p>;
  return (
    <ul className="divide-y divide-line" data-testid="run-list">
      {sorted.map((run) => {
        const label = `${trainName(run.trainId)} at ${fastLabel(run.departS, clock)}`;
        const operator = layout.operators.find((o) => o.id === run.operatorId);
        const clash = clashing.has(run.id);
        const lit = highlighted.has(run.id);
        return (
          <li
            key={run.id}
            className={`py-2 pl-2 ${clash ? 'border-l-4 border-signal' : 'border-l-4 border-transparent'} ${lit ? 'bg-brass-soft' : ''}`}
            data-testid="run-row"
            data-run-id={run.id}
            data-clash={clash ? 'true' : 'false'}
          >
            <div className="flex flex-wrap items-center gap-x-3 gap-y-2">
              {canEdit ? (
                <DepartureInput run={run} clock={clock} onPatch={actions.onPatch} label={label} />
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
                  {trainName(run.trainId)} {clash ? <Badge tone="bad">clash</Badge> : null}
                </span>
                <span className="block text-xs text-muted">{routeSummary(run, layout)}</span>
              </button>
              {canEdit ? (
                <>
                  <select
                    aria-label={`Cab for ${label}`}
                    value={run.cabId}
                    onChange={(e) => actions.onPatch(run, { cabId: e.target.value })}
                    className={`${inputClass} w-28`}
                  >
                    {layout.cabs.map((c) => (
                      <option key={c.id} value={c.id}>{c.name}</option>
                    ))}
                  </select>
                  <select
                    aria-label={`Operator for ${label}`}
                    value={run.operatorId ?? ''}
                    onChange={(e) => actions.onPatch(run, { operatorId: e.target.value || null })}
                    className={`${inputClass} w-40`}
                  >
                    <option value="">No operator</option>
                    {layout.operators.map((o) => (
                      <option key={o.id} value={o.id}>{o.name}{o.rsvp === 'declined' ? ' (declined)' : ''}</option>
                    ))}
                  </select>
                </>
              ) : (
                <span className="text-sm">
                  {layout.cabs.find((c) => c.id === run.cabId)?.name} · {operator?.name ?? 'no operator'}
                </span>
              )}
              {operator?.rsvp === 'declined' ? <Badge tone="bad">operator declined</Badge> : null}
              {canEdit ? (
                <span className="flex gap-1">
                  <Button type="button" variant="ghost" className="px-2" aria-expanded={open?.runId === run.id && open.panel === 'steps'} onClick={() => setOpen(open?.runId === run.id && open.panel === 'steps' ? null : { runId: run.id, panel: 'steps' })}>
                    Steps
                  </Button>
                  <Button type="button" variant="ghost" className="px-2" aria-expanded={open?.runId === run.id && open.panel === 'series'} onClick={() => setOpen(open?.runId === run.id && open.panel === 'series' ? null : { runId: run.id, panel: 'series' })}>
                    Series
                  </Button>
                  <Button type="button" variant="danger" className="px-2" aria-label={`Delete ${label}`} onClick={() => actions.onDelete(run)}>
                    Delete
                  </Button>
                </span>
              ) : null}
            </div>
            {open?.runId === run.id && open.panel === 'steps' ? <StepsEditor key={`${run.id}-${run.version}`} run={run} layout={layout} clock={clock} onPatch={actions.onPatch} /> : null}
            {open?.runId === run.id && open.panel === 'series' ? <SeriesForm run={run} onSeries={actions.onSeries} /> : null}
          </li>
        );
      })}
    </ul>
  );
}
