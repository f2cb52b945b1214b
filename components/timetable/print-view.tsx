'use client';

import { fastLabel, realLabel, type SessionClock } from '@/lib/sessions/time-labels';
import type { TimetableLayout } from '@/lib/sessions/types';
import type { Run } from '@/lib/runs/schema';
import { Button } from '@/components/ui/button';
import { routeSummary } from './run-names';

/** A printable timetable: runs by departure with cab, operator, route and fast and real times. */
export function PrintView({
  title,
  dateLabel,
  runs,
  layout,
  clock,
  clashing,
}: {
  title: string;
  dateLabel: string;
  runs: Run[];
  layout: TimetableLayout;
  clock: SessionClock;
  clashing: Set<string>;
}) {
  const name = (list: { id: string; name: string }[], id: string | null) => (id ? (list.find((x) => x.id === id)?.name ?? '—') : '—');
  const sorted = [...runs].sort((a, b) => a.departS - b.departS);
  return (
    <div className="print-sheet space-y-3" data-testid="print-view">
      <div className="no-print flex flex-wrap items-center gap-3">
        <Button type="button" onClick={() => window.print()}>Print timetable</Button>
        <span className="text-sm text-muted">Only the timetable is printed; the builder around it is left off.</span>
      </div>
      <header>
        <h2 className="font-display text-xl font-bold">{title}</h2>
        <p className="text-sm text-muted">
          {dateLabel} · fast clock {clock.ratio}:1 from {clock.fastStart} · {runs.length} runs
        </p>
      </header>
      <div className="overflow-x-auto">
        <table className="w-full min-w-[40rem] border-collapse text-sm">
          <thead>
            <tr className="border-b-2 border-ink text-left">
              <th className="py-1 pr-2">Departs (fast / real)</th>
              <th className="py-1 pr-2">Arrives (fast / real)</th>
              <th className="py-1 pr-2">Train</th>
              <th className="py-1 pr-2">Cab</th>
              <th className="py-1 pr-2">Operator</th>
              <th className="py-1">Route</th>
            </tr>
          </thead>
          <tbody>
            {sorted.map((run) => (
              <tr key={run.id} className="border-b border-line align-top" data-testid="print-row">
                <td className="py-1 pr-2 font-semibold tabular-nums">
                  {fastLabel(run.departS, clock)} <span className="font-normal text-muted">/ {realLabel(run.departS, clock)}</span>
                </td>
                <td className="py-1 pr-2 tabular-nums">
                  {fastLabel(run.arriveS, clock)} <span className="text-muted">/ {realLabel(run.arriveS, clock)}</span>
                </td>
                <td className="py-1 pr-2">
                  {name(layout.trains, run.trainId)}
                  {clashing.has(run.id) ? <span className="ml-1 font-semibold text-signal">(clash)</span> : null}
                </td>
                <td className="py-1 pr-2">{name(layout.cabs, run.cabId)}</td>
                <td className="py-1 pr-2">{name(layout.operators, run.operatorId)}</td>
                <td className="py-1">{routeSummary(run, layout)}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
    </div>
  );
}
