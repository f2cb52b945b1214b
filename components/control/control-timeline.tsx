import type { ControlEntry, ControlSchedule } from '@/lib/control';
import { formatFast, realToFast } from '@/lib/planning';

const LANE = 46;
const LABEL = 150;
const WIDTH = 1200;
const CAB_COLOURS = ['#2f7d6d', '#b4602a', '#5b5fb0', '#a23b6b', '#6b8a1f', '#1f6f9a', '#8a5a1f', '#444'];
/** Tick spacings in fast minutes; the first that gives at most 12 ticks across the window is used. */
const TICK_FAST_MIN = [1, 2, 5, 10, 15, 30, 60, 120, 240];

type Speed = Extract<ControlEntry, { kind: 'speed' }>;

/** A stretch of the schedule in its own milliseconds (0 = the schedule's origin). */
export type TimelineWindow = { fromMs: number; toMs: number };

/**
 * The control schedule over fast-clock time, drawn on the server for one window of the session:
 * per cab a band for the direction (F/R) and the PWM value as a line with each running value
 * written beside it (ramps drawn as ramps), per block who feeds it, coloured by cab.
 */
export function ControlTimeline({ schedule, window }: { schedule: ControlSchedule; window?: TimelineWindow }) {
  const cabs = schedule.cabs;
  const blocks = schedule.blocks;
  const colour = new Map(cabs.map((c, i) => [c.cabId, CAB_COLOURS[i % CAB_COLOURS.length]!]));
  const end = Math.max(schedule.endMs, 1);
  const from = window?.fromMs ?? 0;
  const to = Math.max(window?.toMs ?? end, from + 1);
  const plotW = WIDTH - LABEL - 10;
  const x = (ms: number) => LABEL + ((ms - from) / (to - from)) * plotW;
  const sessionS = (ms: number) => ms / 1000 + schedule.originS;
  const height = 24 + (cabs.length + blocks.length) * LANE + 10;
  const ratio = schedule.clock.ratio;
  const fastMinAt = (ms: number) => realToFast(sessionS(ms), schedule.clock) / 60;
  const msAtFastMin = (fastMin: number) => from + ((fastMin - fastMinAt(from)) * 60 * 1000) / ratio;
  const spanFastMin = fastMinAt(to) - fastMinAt(from);
  const step = TICK_FAST_MIN.find((m) => spanFastMin / m <= 12) ?? 480;
  const ticks: number[] = [];
  for (let m = Math.ceil(fastMinAt(from) / step) * step; m <= fastMinAt(to) && ticks.length < 20; m += step) ticks.push(msAtFastMin(m));
  const inWindow = (ms: number) => ms >= from && ms <= to;
  const clipId = 'control-plot';

  const cabLane = (cabId: string, row: number) => {
    const top = 24 + row * LANE;
    const bands: { from: number; to: number; direction: string }[] = [];
    let current: { from: number; direction: string } | null = null;
    const points: [number, number][] = [[0, 0]];
    const values: { atMs: number; value: number }[] = [];
    let value = 0;
    for (const e of schedule.entries) {
      if (e.kind === 'direction' && e.cabId === cabId) {
        if (current && current.direction !== 'off') bands.push({ ...current, to: e.atMs });
        current = { from: e.atMs, direction: e.direction };
      } else if (e.kind === 'speed' && e.cabId === cabId) {
        const s = e as Speed;
        points.push([s.atMs, value], [s.atMs, s.from], [s.atMs + s.rampMs, s.to]);
        if (s.to > 0) values.push({ atMs: s.atMs + s.rampMs, value: s.to });
        value = s.to;
      }
    }
    if (current && current.direction !== 'off') bands.push({ ...current, to: end });
    points.push([end, value]);
    const y = (v: number) => top + LANE - 6 - (v / 255) * (LANE - 12);
    return (
      <g key={cabId} data-testid="cab-lane">
        <text x={4} y={top + LANE / 2 + 4} className="fill-ink text-[12px]">{cabs[row]?.name}</text>
        <g clipPath={`url(#${clipId})`}>
          {bands.map((b, i) => (
            <g key={i}>
              <rect x={x(b.from)} y={top + 4} width={Math.max(x(b.to) - x(b.from), 1)} height={LANE - 8} fill={b.direction === 'forward' ? '#cfe8df' : '#f4dcc8'}>
                <title>{`${b.direction} ${formatFast(sessionS(b.from), schedule.clock)}–${formatFast(sessionS(b.to), schedule.clock)}`}</title>
              </rect>
              {x(b.to) - x(b.from) > 14 ? (
                <text x={Math.max(x(b.from), LABEL) + 3} y={top + 15} className="fill-ink text-[10px] font-semibold">{b.direction === 'forward' ? 'F' : 'R'}</text>
              ) : null}
            </g>
          ))}
          <polyline points={points.map(([ms, v]) => `${x(ms).toFixed(1)},${y(v).toFixed(1)}`).join(' ')} fill="none" stroke={colour.get(cabId)} strokeWidth={1.5} />
          {values.filter((v) => inWindow(v.atMs)).map((v, i) => (
            <text key={i} x={x(v.atMs) + 14} y={y(v.value) - 3} className="fill-ink text-[10px] tabular-nums" data-testid="pwm-value">{v.value}</text>
          ))}
        </g>
      </g>
    );
  };

  const blockLane = (blockId: string, row: number) => {
    const top = 24 + (cabs.length + row) * LANE;
    const spans: { from: number; to: number; cabId: string }[] = [];
    let open: { from: number; cabId: string } | null = null;
    for (const e of schedule.entries) {
      if (e.kind !== 'feed' || e.blockId !== blockId) continue;
      if (open) spans.push({ ...open, to: e.atMs });
      open = e.cabId === null ? null : { from: e.atMs, cabId: e.cabId };
    }
    if (open) spans.push({ ...open, to: end });
    const polarity = schedule.entries.filter((e) => e.kind === 'polarity' && e.blockId === blockId);
    return (
      <g key={blockId} data-testid="block-lane">
        <text x={4} y={top + LANE / 2 + 4} className="fill-ink text-[12px]">{blocks[row]?.name.slice(0, 22)}</text>
        <g clipPath={`url(#${clipId})`}>
        {spans.map((s, i) => (
          <rect key={i} x={x(s.from)} y={top + 12} width={Math.max(x(s.to) - x(s.from), 1)} height={LANE - 24} fill={colour.get(s.cabId) ?? '#888'}>
            <title>{`${cabs.find((c) => c.cabId === s.cabId)?.name ?? s.cabId} ${formatFast(sessionS(s.from), schedule.clock)}–${formatFast(sessionS(s.to), schedule.clock)}`}</title>
          </rect>
        ))}
        {polarity.map((p, i) => (
          <text key={i} x={x(p.atMs)} y={top + 10} className="fill-ink text-[10px]">{p.kind === 'polarity' && p.polarity === 'swapped' ? '⇄' : '='}</text>
        ))}
        </g>
      </g>
    );
  };

  return (
    <div className="overflow-x-auto" data-testid="control-timeline">
      <svg viewBox={`0 0 ${WIDTH} ${height}`} className="min-w-[900px]" role="img" aria-label="Control timeline: direction and PWM per cab, feed per block">
        <defs>
          <clipPath id={clipId}>
            <rect x={LABEL} y={0} width={plotW} height={height} />
          </clipPath>
        </defs>
        {ticks.map((ms) => (
          <g key={ms}>
            <line x1={x(ms)} x2={x(ms)} y1={18} y2={height - 6} stroke="#ddd" />
            <text x={x(ms)} y={12} textAnchor="middle" className="fill-muted text-[11px]">{formatFast(sessionS(ms), schedule.clock)}</text>
          </g>
        ))}
        {cabs.map((c, i) => cabLane(c.cabId, i))}
        {blocks.map((b, i) => blockLane(b.blockId, i))}
      </svg>
      <p className="mt-2 text-xs text-muted">
        Cab lanes: green band (F) forward, orange band (R) reverse; the line is the 8-bit PWM value (0–255) with each running value written beside it, ramps drawn as
        ramps. Block lanes: coloured by the cab that feeds the block; ⇄ marks a reversing section&apos;s polarity swapped.
      </p>
    </div>
  );
}

/** The same schedule as a list, for phones: one line per setting in fast-clock time. */
export function ControlList({ schedule, window, limit = 300 }: { schedule: ControlSchedule; window?: TimelineWindow; limit?: number }) {
  const cabName = new Map(schedule.cabs.map((c) => [c.cabId, c.name]));
  const blockName = new Map(schedule.blocks.map((b) => [b.blockId, b.name]));
  const line = (e: ControlEntry) => {
    if (e.kind === 'direction') return `${cabName.get(e.cabId)}: ${e.direction}`;
    if (e.kind === 'speed') return `${cabName.get(e.cabId)}: PWM ${e.from} → ${e.to}${e.rampMs ? ` over ${(e.rampMs / 1000).toFixed(1)} s` : ''}`;
    if (e.kind === 'feed') return `${blockName.get(e.blockId)}: ${e.cabId === null ? 'released' : `fed by ${cabName.get(e.cabId)}`}`;
    return `${blockName.get(e.blockId)}: polarity ${e.polarity}`;
  };
  const inWindow = window ? schedule.entries.filter((e) => e.atMs >= window.fromMs && e.atMs <= window.toMs) : schedule.entries;
  const shown = inWindow.slice(0, limit);
  return (
    <div data-testid="control-list">
      <ol className="divide-y divide-line text-sm">
        {shown.map((e, i) => (
          <li key={i} className="flex gap-3 py-1.5">
            <span className="w-16 shrink-0 tabular-nums text-muted">{formatFast(e.atMs / 1000 + schedule.originS, schedule.clock)}</span>
            <span>{line(e)}</span>
          </li>
        ))}
      </ol>
      {shown.length === 0 ? <p className="text-sm text-muted">No settings change in this stretch.</p> : null}
      {inWindow.length > limit ? (
        <p className="mt-2 text-xs text-muted">First {limit} of {inWindow.length} settings; the JSON download has them all.</p>
      ) : null}
    </div>
  );
}
