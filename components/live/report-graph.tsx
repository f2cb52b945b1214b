import type { FastClock } from '@/lib/planning';
import { formatFast } from '@/lib/planning/clock';
import type { SessionReport } from '@/lib/live/report';

const W = 1000;
const ROW = 28;
const LEFT = 130;
const TOP = 24;

/**
 * The train graph after the session: time across, the line's blocks down (Marey, 1885); each run's
 * planned path dashed, what actually happened solid on top.
 */
export function ReportGraph({ report, clock }: { report: SessionReport; clock: FastClock }) {
  const blocks = [...report.blocks].sort((a, b) => a.positionMm - b.positionMm);
  const rowOf = new Map(blocks.map((b, i) => [b.id, i]));
  const times = report.graph.flatMap((g) => [...g.planned, ...(g.actual ?? [])].flatMap((s) => [s.enterS, s.exitS]));
  if (!times.length) return <p className="text-muted">No runs to draw.</p>;
  const from = Math.min(...times);
  const to = Math.max(...times);
  const x = (s: number) => LEFT + ((s - from) / Math.max(1, to - from)) * (W - LEFT - 10);
  const y = (blockId: string) => TOP + (rowOf.get(blockId) ?? 0) * ROW + ROW / 2;
  const height = TOP + blocks.length * ROW + 24;
  const path = (steps: { blockId: string; enterS: number; exitS: number }[]) =>
    steps.map((s, i) => `${i ? 'L' : 'M'}${x(s.enterS).toFixed(1)},${y(s.blockId).toFixed(1)} L${x(s.exitS).toFixed(1)},${y(s.blockId).toFixed(1)}`).join(' ');
  const ticks = 6;
  const hue = (i: number) => `hsl(${(i * 67) % 360} 55% 45%)`;
  return (
    <svg viewBox={`0 0 ${W} ${height}`} className="w-full" role="img" aria-label="Train graph: planned dashed, actual solid" data-testid="report-graph">
      {blocks.map((b, i) => (
        <g key={b.id}>
          <line x1={LEFT} x2={W - 10} y1={TOP + i * ROW + ROW / 2} y2={TOP + i * ROW + ROW / 2} stroke="var(--line)" />
          <text x={LEFT - 6} y={TOP + i * ROW + ROW / 2 + 4} textAnchor="end" fontSize="11" fill="var(--muted)">{b.name}</text>
        </g>
      ))}
      {Array.from({ length: ticks + 1 }, (_, i) => from + ((to - from) * i) / ticks).map((t) => (
        <text key={t} x={x(t)} y={14} textAnchor="middle" fontSize="11" fill="var(--muted)">{formatFast(t, clock)}</text>
      ))}
      {report.graph.map((g, i) => (
        <g key={g.runId}>
          <path d={path(g.planned)} data-testid="planned-line" fill="none" stroke={hue(i)} strokeWidth="1.5" strokeDasharray="5 4" opacity="0.7" />
          {g.actual ? <path d={path(g.actual)} data-testid="actual-line" fill="none" stroke={hue(i)} strokeWidth="3" /> : null}
        </g>
      ))}
    </svg>
  );
}
