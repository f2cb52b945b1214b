'use client';

import { useMemo, useState } from 'react';
import { trainPositionsAt } from '@/lib/planning/positions';
import { fastTimeToReal } from '@/lib/planning/clock';
import { fastLabel, type SessionClock } from '@/lib/sessions/time-labels';
import type { TimetableLayout } from '@/lib/sessions/types';
import type { Run } from '@/lib/runs/schema';
import { TrackDiagram, type DiagramMark } from '@/components/layouts/track-diagram';
import { Field, TextInput } from '@/components/ui/field';

/**
 * Where every train is at a chosen fast-clock time, drawn on the track diagram: the engine's
 * occupancy rule (`trainPositionsAt`), so a train stands where its last run left it and a tag in
 * two blocks is a train whose tail has not yet cleared the block behind. A slider steps through
 * the session a fast minute at a time; the list under it says the same in words.
 */
export function TrackView({
  layout,
  runs,
  clock,
  lengthS,
  sessionEndS,
  colorOf,
  trainName,
}: {
  layout: TimetableLayout;
  runs: readonly Run[];
  clock: SessionClock;
  lengthS: number;
  sessionEndS: number;
  colorOf: (run: Run) => string;
  trainName: (id: string) => string;
}) {
  const firstDepart = runs.reduce((m, r) => Math.min(m, r.departS), Infinity);
  const [atS, setAtS] = useState(() => (Number.isFinite(firstDepart) ? Math.max(0, firstDepart) : 0));
  const [text, setText] = useState(() => fastLabel(atS, clock));
  const [error, setError] = useState<string | null>(null);
  const stepS = 60 / clock.ratio;

  const positions = useMemo(() => trainPositionsAt(runs, atS, sessionEndS), [runs, atS, sessionEndS]);
  const marks = useMemo(() => {
    const byRun = new Map(runs.map((r) => [r.id, r]));
    const map = new Map<string, DiagramMark[]>();
    for (const p of positions) {
      const run = byRun.get(p.runId);
      for (const blockId of p.blockIds) {
        const list = map.get(blockId) ?? [];
        list.push({ key: p.trainId, label: trainName(p.trainId), colour: run ? colorOf(run) : '#55606a', standing: p.state === 'standing' });
        map.set(blockId, list);
      }
    }
    return map;
  }, [positions, runs, colorOf, trainName]);
  const blockName = useMemo(() => new Map(layout.blocks.map((b) => [b.id, b.name])), [layout.blocks]);

  const moveTo = (s: number) => {
    const clamped = Math.min(Math.max(0, s), lengthS);
    setAtS(clamped);
    setText(fastLabel(clamped, clock));
    setError(null);
  };

  return (
    <div className="space-y-3" data-testid="track-view">
      <div className="flex flex-wrap items-end gap-3">
        <div className="w-36">
          <Field label="At (fast clock)" name="track-at" error={error ?? undefined}>
            <TextInput
              name="track-at"
              value={text}
              inputMode="numeric"
              onChange={(e) => setText(e.target.value)}
              onBlur={() => {
                const s = fastTimeToReal(text, clock);
                if (s === null || s < 0 || s > lengthS) setError('A fast time within the session, HH:MM.');
                else moveTo(s);
              }}
              onKeyDown={(e) => {
                if (e.key === 'Enter') {
                  e.preventDefault();
                  (e.target as HTMLInputElement).blur();
                }
              }}
            />
          </Field>
        </div>
        <label className="flex min-w-48 flex-1 flex-col gap-1 text-sm">
          <span className="font-semibold">Step through the session</span>
          <input
            type="range"
            min={0}
            max={Math.max(stepS, Math.floor(lengthS / stepS) * stepS)}
            step={stepS}
            value={atS}
            onChange={(e) => moveTo(Number(e.target.value))}
            aria-valuetext={`${fastLabel(atS, clock)} fast`}
            className="accent-verdigris"
          />
        </label>
      </div>
      <TrackDiagram title={`Where the trains are at ${fastLabel(atS, clock)} fast`} idPrefix="track-view" blocks={layout.blocks} links={layout.links} marks={marks} />
      <ul className="grid gap-1 text-sm sm:grid-cols-2" aria-live="polite" data-testid="train-positions">
        {positions.map((p) => (
          <li key={p.trainId} data-testid="train-position" data-train={trainName(p.trainId)}>
            <span className="font-semibold">{trainName(p.trainId)}</span>{' '}
            {p.state === 'standing' ? 'stands in' : 'runs in'} {p.blockIds.map((id) => blockName.get(id) ?? '?').join(' and ')}
          </li>
        ))}
        {positions.length === 0 ? <li className="text-muted">No train is on the track at this time.</li> : null}
      </ul>
    </div>
  );
}
