'use client';

import type { EventClickArg, EventDropArg, EventInput } from '@fullcalendar/core';
import interactionPlugin from '@fullcalendar/interaction';
import FullCalendar from '@fullcalendar/react';
import timeGridPlugin from '@fullcalendar/timegrid';
import { useMemo } from 'react';
import type { Highlight } from '@/lib/sessions/highlight';
import { fastLabel, MAX_VIEW_S, type SessionClock } from '@/lib/sessions/time-labels';
import { floatingIso } from '@/lib/time-zone';
import type { Run } from '@/lib/runs/schema';

const pad = (n: number) => String(n).padStart(2, '0');
/** `HH:MM:SS` for a number of seconds after the session day's midnight (may pass 24 h). */
const duration = (s: number) => `${pad(Math.floor(s / 3600))}:${pad(Math.floor((s % 3600) / 60))}:00`;

/**
 * The session's hours as a day column, one event per run at its real time in the session's zone.
 * The calendar runs in UTC and is given the zone's wall-clock times, so it shows them unchanged
 * (no time-zone plugin needed). Dragging an event moves the run's departure.
 */
export function CalendarView({
  runs,
  clock,
  endsAtMs,
  clashing,
  highlight,
  colorOf,
  label,
  canEdit,
  onSelectRun,
  onMoveRun,
}: {
  runs: Run[];
  clock: SessionClock;
  endsAtMs: number;
  clashing: Set<string>;
  highlight?: Highlight;
  colorOf: (run: Run) => string;
  label: (run: Run) => string;
  canEdit: boolean;
  onSelectRun: (runId: string) => void;
  onMoveRun: (run: Run, departS: number) => void;
}) {
  const startIso = floatingIso(clock.startsAtMs, clock.timeZone);
  const day = startIso.slice(0, 10);
  const midnight = Date.parse(`${day}T00:00:00Z`);
  const wallS = (ms: number) => (Date.parse(`${floatingIso(ms, clock.timeZone)}Z`) - midnight) / 1000;
  // Runs stored far outside the session (older data) are left out: the day column spans at most two days.
  const shown = useMemo(() => runs.filter((r) => Math.abs(r.departS) <= MAX_VIEW_S && Math.abs(r.arriveS) <= MAX_VIEW_S), [runs]);
  const firstS = shown.reduce((first, r) => Math.min(first, wallS(clock.startsAtMs + r.departS * 1000)), wallS(clock.startsAtMs));
  const lastS = shown.reduce((last, r) => Math.max(last, wallS(clock.startsAtMs + r.arriveS * 1000)), wallS(endsAtMs));
  const minS = Math.max(0, Math.floor(firstS / 1800) * 1800);
  const maxS = Math.min(Math.ceil(lastS / 1800) * 1800 + 1800, minS + 48 * 3600);

  const events = useMemo<EventInput[]>(
    () =>
      shown.map((run) => {
        const clash = clashing.has(run.id);
        const selected = highlight?.runIds.has(run.id) ?? false;
        const color = colorOf(run);
        return {
          id: run.id,
          title: `${clash ? '⚠ ' : ''}${fastLabel(run.departS, clock)} ${label(run)}`,
          start: floatingIso(clock.startsAtMs + run.departS * 1000, clock.timeZone),
          end: floatingIso(clock.startsAtMs + Math.max(run.arriveS, run.departS + 60) * 1000, clock.timeZone),
          backgroundColor: color,
          borderColor: clash ? 'var(--signal)' : color,
          textColor: '#fff',
          classNames: [clash ? 'fp-clash' : '', selected ? 'fp-selected' : '', highlight && !selected && highlight.runIds.size ? 'fp-dim' : ''].filter(Boolean),
          extendedProps: { clash },
        };
      }),
    [shown, clashing, highlight, colorOf, label, clock],
  );

  return (
    <div className="fp-calendar rounded-plate border border-line bg-surface p-2" data-testid="calendar-view">
      <style>{`
        .fp-calendar .fc { --fc-border-color: var(--line); --fc-page-bg-color: var(--surface); --fc-neutral-bg-color: var(--sunken); --fc-today-bg-color: transparent; font-size: 0.8rem; }
        .fp-calendar .fc-event.fp-clash { border-width: 2px; box-shadow: 0 0 0 2px var(--signal); }
        .fp-calendar .fc-event.fp-selected { box-shadow: 0 0 0 3px var(--brass); z-index: 5; }
        .fp-calendar .fc-event.fp-dim { opacity: 0.35; }
        .fp-calendar .fc-col-header-cell-cushion, .fp-calendar .fc-timegrid-slot-label-cushion { color: var(--ink); }
      `}</style>
      <FullCalendar
        plugins={[timeGridPlugin, interactionPlugin]}
        initialView="timeGridDay"
        initialDate={day}
        timeZone="UTC"
        headerToolbar={false}
        allDaySlot={false}
        slotMinTime={duration(minS)}
        slotMaxTime={duration(maxS)}
        slotDuration="00:05:00"
        slotLabelInterval="00:15:00"
        slotLabelFormat={{ hour: '2-digit', minute: '2-digit', hourCycle: 'h23' }}
        eventTimeFormat={{ hour: '2-digit', minute: '2-digit', hourCycle: 'h23' }}
        dayHeaderFormat={{ weekday: 'long', day: 'numeric', month: 'long' }}
        eventMinHeight={18}
        expandRows={false}
        height="auto"
        nowIndicator={false}
        editable={canEdit}
        eventDurationEditable={false}
        snapDuration="00:00:15"
        events={events}
        eventClick={(arg: EventClickArg) => onSelectRun(arg.event.id)}
        eventDrop={(arg: EventDropArg) => {
          const run = runs.find((r) => r.id === arg.event.id);
          const deltaMs = (arg.event.start?.getTime() ?? 0) - (arg.oldEvent.start?.getTime() ?? 0);
          if (!run || deltaMs === 0) return arg.revert();
          // The cache update re-renders the event where it landed; revert FullCalendar's own copy.
          arg.revert();
          onMoveRun(run, run.departS + deltaMs / 1000);
        }}
      />
      <p className="px-2 pt-2 text-xs text-muted">
        Real time in {clock.timeZone}; each event starts with its fast-clock departure.{canEdit ? ' Drag an event to move its departure.' : ''}
      </p>
    </div>
  );
}
