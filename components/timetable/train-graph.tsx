'use client';

import { memo, useEffect, useMemo, useRef, useState, type PointerEvent as ReactPointerEvent } from 'react';
import type { Finding } from '@/lib/planning';
import type { Highlight } from '@/lib/sessions/highlight';
import { fastLabel, realLabel, type SessionClock } from '@/lib/sessions/time-labels';
import type { TimetableLayout } from '@/lib/sessions/types';
import type { Run } from '@/lib/runs/schema';
import { Button } from '@/components/ui/button';

type Props = {
  layout: TimetableLayout;
  runs: Run[];
  findings: Finding[];
  clock: SessionClock;
  sessionLengthS: number;
  clashing: Set<string>;
  highlight?: Highlight;
  colorOf: (run: Run) => string;
  trainName: (id: string) => string;
  canEdit: boolean;
  onSelectRun: (runId: string) => void;
  onMoveRun: (run: Run, departS: number) => void;
  /** The drawing's height in px (the planner resizes it); without it each stretch of line gets ROW px. */
  height?: number;
  /**
   * Whether runs can be pointed at (wide invisible lines with a tooltip, to pick and drag them). The
   * builder turns it on once the page is live in the browser: before that nothing could answer a
   * pointer, and the server's HTML stays half the size.
   */
  interactive?: boolean;
};

const TOP = 34;
const BOTTOM = 26;
const ROW = 30;
/** The least height of one stretch of line, however small the drawing is made. */
const MIN_ROW = 16;

/** A label per distinct stretch of line: blocks side by side (a loop's two roads) share one row. */
function rowsOf(blocks: TimetableLayout['blocks']) {
  const byPosition = new Map<string, { from: number; to: number; names: string[]; ids: string[] }>();
  for (const b of blocks) {
    const key = `${b.positionMm}:${b.lengthMm}`;
    const row = byPosition.get(key) ?? { from: b.positionMm, to: b.positionMm + b.lengthMm, names: [], ids: [] };
    row.names.push(b.name);
    row.ids.push(b.id);
    byPosition.set(key, row);
  }
  return [...byPosition.values()].sort((a, b) => a.from - b.from || a.to - b.to);
}

/** The time step between ticks, in fast minutes, for about `wanted` ticks across the window. */
function tickStep(windowS: number, ratio: number, wanted: number): number {
  const fastMin = (windowS * ratio) / 60;
  for (const step of [1, 2, 5, 10, 15, 30, 60, 120, 240, 480]) if (fastMin / step <= wanted) return step;
  // Wider than a few fast days: whole fast days, as many as it takes to stay near `wanted` ticks.
  return Math.ceil(fastMin / wanted / 1440) * 1440;
}

/** Ticks and grid lines drawn at most (a guard on top of tickStep, whatever the window). */
const MAX_TICKS = 60;

type GraphRunProps = {
  runId: string;
  points: string;
  ghost?: string;
  color: string;
  selected: boolean;
  clash: boolean;
  dim: boolean;
  moving: boolean;
  canEdit: boolean;
  title: string;
  interactive: boolean;
};

/** One run's line (all props are plain values, so an unchanged run is not redrawn after an edit). */
const GraphRun = memo(function GraphRun({ runId, points, ghost, color, selected, clash, dim, moving, canEdit, title, interactive }: GraphRunProps) {
  return (
    <g opacity={dim ? 0.3 : 1}>
      {clash ? <polyline points={points} fill="none" className="stroke-signal" strokeWidth={selected ? 9 : 6} opacity={0.35} /> : null}
      <polyline points={points} fill="none" stroke={color} strokeWidth={selected ? 4 : 2.25} strokeLinejoin="round" strokeDasharray={moving ? '4 3' : undefined} />
      {interactive ? (
        <polyline
          points={points}
          fill="none"
          stroke="transparent"
          strokeWidth={14}
          data-run-id={runId}
          data-testid="graph-run"
          data-clash={clash ? 'true' : 'false'}
          data-selected={selected ? 'true' : 'false'}
          className={canEdit ? 'cursor-ew-resize' : 'cursor-pointer'}
        >
          <title>{title}</title>
        </polyline>
      ) : null}
      {ghost ? <polyline points={ghost} fill="none" stroke={color} strokeWidth={3} opacity={0.8} pointerEvents="none" /> : null}
    </g>
  );
});

/**
 * The time–distance diagram (Marey's train graph): time across, distance along the line down the
 * side, one line per run (slope is speed, flat is standing), block clashes boxed where they happen.
 * Zoom and pan over time; a planner drags a run sideways to give it a new departure.
 */
export function TrainGraph(props: Props) {
  const { layout, runs, findings, clock, sessionLengthS, clashing, highlight, colorOf, trainName, canEdit, interactive = true } = props;
  const box = useRef<HTMLDivElement>(null);
  const [width, setWidth] = useState(960);
  const [view, setView] = useState<[number, number]>([0, Math.max(600, sessionLengthS)]);
  const [drag, setDrag] = useState<{ kind: 'pan' | 'run'; startX: number; runId?: string; view: [number, number]; dx: number } | null>(null);

  useEffect(() => {
    const el = box.current;
    if (!el) return;
    const observer = new ResizeObserver(([entry]) => entry && setWidth(Math.max(320, entry.contentRect.width)));
    observer.observe(el);
    return () => observer.disconnect();
  }, []);

  const narrow = width < 600;
  const left = narrow ? 92 : 168;
  const right = 12;
  const rows = useMemo(() => rowsOf(layout.blocks), [layout.blocks]);
  const ROW_H = props.height ? Math.max(MIN_ROW, (props.height - TOP - BOTTOM) / Math.max(1, rows.length)) : ROW;
  const height = TOP + BOTTOM + rows.length * ROW_H;
  const rowOfBlock = useMemo(() => {
    const map = new Map<string, number>();
    rows.forEach((row, i) => row.ids.forEach((id) => map.set(id, i)));
    return map;
  }, [rows]);
  const blockById = useMemo(() => new Map(layout.blocks.map((b) => [b.id, b])), [layout.blocks]);

  // Distance is drawn row by row (evenly), so short blocks stay readable; within a row, by position.
  const yOfDistance = (mm: number) => {
    for (let i = 0; i < rows.length; i++) {
      const row = rows[i]!;
      if (mm <= row.to || i === rows.length - 1) {
        const within = row.to > row.from ? Math.min(1, Math.max(0, (mm - row.from) / (row.to - row.from))) : 0.5;
        return TOP + (i + within) * ROW_H;
      }
    }
    return TOP;
  };

  const [t0, t1] = view;
  const plotWidth = width - left - right;
  const x = (s: number) => left + ((s - t0) / (t1 - t0)) * plotWidth;
  const secondsPerPx = (t1 - t0) / plotWidth;

  /** Points of one run: the head's position along the line over time. */
  const pathOf = (run: Run, shiftS = 0) => {
    const pts: [number, number][] = [];
    const steps = run.steps;
    const pos = (id: string) => blockById.get(id);
    for (let i = 0; i < steps.length; i++) {
      const step = steps[i]!;
      const block = pos(step.blockId);
      if (!block) continue;
      const next = steps[i + 1] ? pos(steps[i + 1]!.blockId) : undefined;
      const prev = steps[i - 1] ? pos(steps[i - 1]!.blockId) : undefined;
      const towards = next ?? (prev ? { positionMm: 2 * block.positionMm - prev.positionMm } : block);
      const up = towards.positionMm >= block.positionMm;
      const entry = up ? block.positionMm : block.positionMm + block.lengthMm;
      const exit = up ? block.positionMm + block.lengthMm : block.positionMm;
      if (i === 0) {
        pts.push([step.enterS, exit], [run.departS, exit]);
      } else {
        pts.push([step.enterS, entry]);
        const leaves = steps[i + 1]?.enterS ?? run.arriveS;
        pts.push([Math.min(leaves, step.exitS), i === steps.length - 1 ? (entry + exit) / 2 : exit]);
        if (i === steps.length - 1) pts.push([step.exitS, (entry + exit) / 2]);
      }
    }
    // A point repeated (a step leaving where the next one enters) draws nothing: written once.
    const written: string[] = [];
    for (const [t, mm] of pts) {
      const point = `${x(t + shiftS).toFixed(1)},${yOfDistance(mm).toFixed(1)}`;
      if (point !== written.at(-1)) written.push(point);
    }
    return written.join(' ');
  };

  const zoom = (factor: number, centerS = (t0 + t1) / 2) => {
    const span = Math.min(Math.max(120, (t1 - t0) * factor), Math.max(600, sessionLengthS) * 1.5);
    const ratio = (centerS - t0) / (t1 - t0);
    const start = centerS - span * ratio;
    setView([start, start + span]);
  };

  const onPointerDown = (event: ReactPointerEvent<SVGSVGElement>) => {
    const target = event.target as Element;
    const runId = target.getAttribute('data-run-id');
    (event.currentTarget as Element).setPointerCapture(event.pointerId);
    if (runId && canEdit) setDrag({ kind: 'run', runId, startX: event.clientX, view, dx: 0 });
    else setDrag({ kind: 'pan', startX: event.clientX, view, dx: 0 });
  };
  const onPointerMove = (event: ReactPointerEvent<SVGSVGElement>) => {
    if (!drag) return;
    const dx = event.clientX - drag.startX;
    if (drag.kind === 'pan') {
      const shift = -dx * secondsPerPx;
      setView([drag.view[0] + shift, drag.view[1] + shift]);
    } else {
      setDrag({ ...drag, dx });
    }
  };
  const fastMinuteS = 60 / clock.ratio;
  const dragShiftS = drag?.kind === 'run' ? Math.round((drag.dx * secondsPerPx) / fastMinuteS) * fastMinuteS : 0;
  const onPointerUp = () => {
    if (drag?.kind === 'run' && drag.runId) {
      const run = runs.find((r) => r.id === drag.runId);
      if (run && Math.abs(drag.dx) < 4) props.onSelectRun(run.id);
      else if (run && dragShiftS !== 0) props.onMoveRun(run, run.departS + dragShiftS);
    }
    setDrag(null);
  };

  const step = tickStep(t1 - t0, clock.ratio, narrow ? 4 : 9);
  const ticks: number[] = [];
  {
    const stepS = (step * 60) / clock.ratio;
    const fastStartMin = Number(clock.fastStart.slice(0, 2)) * 60 + Number(clock.fastStart.slice(3, 5));
    // Align ticks to whole fast steps (e.g. 06:30, 06:45), not to the window's edge.
    const offsetS = (((-fastStartMin % step) + step) % step) * (60 / clock.ratio);
    for (let s = Math.ceil((t0 - offsetS) / stepS) * stepS + offsetS; s <= t1 && ticks.length < MAX_TICKS; s += stepS) ticks.push(s);
  }

  // Block clashes, and blocks held by a standing train when another comes: boxed where they happen.
  const overlaps = findings.filter((f) => f.kind === 'block-overlap' || f.kind === 'block-occupied');
  const dimOthers = highlight && highlight.runIds.size > 0;

  return (
    <div className="space-y-2" data-testid="train-graph">
      <div className="flex flex-wrap items-center gap-2 text-sm">
        <Button type="button" variant="secondary" onClick={() => zoom(0.5)} aria-label="Zoom in">+</Button>
        <Button type="button" variant="secondary" onClick={() => zoom(2)} aria-label="Zoom out">−</Button>
        <Button type="button" variant="ghost" onClick={() => setView([0, Math.max(600, sessionLengthS)])}>Whole session</Button>
        {highlight ? (
          <Button type="button" variant="ghost" onClick={() => { const span = Math.max(600, (highlight.toS - highlight.fromS) * 6); const mid = (highlight.fromS + highlight.toS) / 2; setView([mid - span / 2, mid + span / 2]); }}>
            Zoom to selection
          </Button>
        ) : null}
        <span className="text-muted">
          {canEdit ? 'Drag the background to pan; drag a run sideways to move its departure.' : 'Drag to pan.'}
        </span>
      </div>
      <div ref={box} className="overflow-hidden rounded-plate border border-line bg-surface">
        <svg
          width={width}
          height={height}
          role="img"
          aria-label={`Train graph: ${runs.length} runs over ${rows.length} stretches of line`}
          className={`block touch-none select-none ${drag ? 'cursor-grabbing' : 'cursor-grab'}`}
          onPointerDown={onPointerDown}
          onPointerMove={onPointerMove}
          onPointerUp={onPointerUp}
          onPointerCancel={() => setDrag(null)}
          onWheel={(e) => {
            if (!e.ctrlKey && !e.metaKey) return;
            e.preventDefault();
            const rect = (e.currentTarget as SVGSVGElement).getBoundingClientRect();
            zoom(e.deltaY > 0 ? 1.25 : 0.8, t0 + (e.clientX - rect.left - left) * secondsPerPx);
          }}
        >
          <defs>
            <clipPath id="graph-plot">
              <rect x={left} y={TOP - 4} width={plotWidth} height={rows.length * ROW_H + 8} />
            </clipPath>
          </defs>
          {rows.map((row, i) => {
            const marked = highlight && row.ids.some((id) => highlight.blockIds.has(id));
            const label = row.names.length > 1 ? `${row.names[0]} (+${row.names.length - 1})` : row.names[0]!;
            return (
              <g key={row.ids.join()}>
                <rect x={left} y={TOP + i * ROW_H} width={plotWidth} height={ROW_H} className={marked ? 'fill-brass-soft' : i % 2 ? 'fill-sunken' : 'fill-surface'} opacity={marked ? 1 : 0.6} />
                <text x={left - 6} y={TOP + i * ROW_H + ROW_H / 2 + 4} textAnchor="end" className={`fill-ink ${narrow ? 'text-[10px]' : 'text-[11px]'}`}>
                  <title>{row.names.join(' · ')}</title>
                  {label.length > (narrow ? 13 : 26) ? `${label.slice(0, narrow ? 12 : 25)}…` : label}
                </text>
              </g>
            );
          })}
          {ticks.map((s) => (
            <g key={s}>
              <line x1={x(s)} x2={x(s)} y1={TOP} y2={height - BOTTOM} className="stroke-line" strokeWidth={1} />
              <text x={x(s)} y={TOP - 18} textAnchor="middle" className="fill-ink text-[11px] font-semibold">{fastLabel(s, clock)}</text>
              <text x={x(s)} y={TOP - 6} textAnchor="middle" className="fill-muted text-[10px]">{realLabel(s, clock)}</text>
            </g>
          ))}
          <text x={4} y={TOP - 18} className="fill-muted text-[10px]">fast</text>
          <text x={4} y={TOP - 6} className="fill-muted text-[10px]">real</text>
          <g clipPath="url(#graph-plot)">
            {highlight && highlight.toS >= highlight.fromS ? (
              <rect x={x(highlight.fromS) - 2} y={TOP} width={Math.max(4, x(highlight.toS) - x(highlight.fromS) + 4)} height={rows.length * ROW_H} className="fill-brass" opacity={0.18} />
            ) : null}
            {runs.map((run) => {
              const selected = highlight?.runIds.has(run.id) ?? false;
              const clash = clashing.has(run.id);
              const moving = drag?.kind === 'run' && drag.runId === run.id;
              return (
                <GraphRun
                  key={run.id}
                  runId={run.id}
                  points={pathOf(run)}
                  ghost={moving && dragShiftS !== 0 ? pathOf(run, dragShiftS) : undefined}
                  color={colorOf(run)}
                  selected={selected}
                  clash={clash}
                  dim={Boolean(dimOthers && !selected)}
                  moving={moving}
                  canEdit={canEdit}
                  interactive={interactive}
                  title={interactive ? `${trainName(run.trainId)} · departs ${fastLabel(run.departS, clock)} fast (${realLabel(run.departS, clock)} real)${clash ? ' · clashes' : ''}` : ''}
                />
              );
            })}
            {overlaps.map((f) => {
              const row = rowOfBlock.get(f.ids[0]!);
              if (row === undefined) return null;
              const x0 = x(f.fromS);
              const w = Math.max(6, x(f.toS) - x0);
              return (
                <g key={`${f.kind}:${f.ids.join()}:${f.fromS}`} data-testid="graph-clash" data-kind={f.kind} pointerEvents="none">
                  <rect x={x0 - 3} y={TOP + row * ROW_H + 2} width={w + 6} height={ROW_H - 4} fill="none" className="stroke-signal" strokeWidth={2} rx={3} strokeDasharray={f.kind === 'block-occupied' ? '5 3' : undefined} />
                  <text x={x0 + w / 2} y={TOP + row * ROW_H + ROW_H / 2 + 4} textAnchor="middle" className="fill-signal text-[12px] font-bold">!</text>
                </g>
              );
            })}
          </g>
          {drag?.kind === 'run' && dragShiftS !== 0 ? (
            <text x={left + 6} y={height - 8} className="fill-ink text-[11px] font-semibold">
              {`${dragShiftS > 0 ? '+' : '−'}${Math.round(Math.abs(dragShiftS * clock.ratio) / 60)} fast min`}
            </text>
          ) : null}
        </svg>
      </div>
    </div>
  );
}
