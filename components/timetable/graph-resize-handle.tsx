'use client';

import { useRef, type KeyboardEvent, type PointerEvent } from 'react';

export const GRAPH_HEIGHT = { min: 240, max: 1600, step: 40, bigStep: 160 } as const;

const clamp = (px: number) => Math.round(Math.min(GRAPH_HEIGHT.max, Math.max(GRAPH_HEIGHT.min, px)));

/**
 * A bar under the train graph that makes it taller or shorter: drag it, or focus it and use the
 * arrow keys (Shift for bigger steps), Home and End. A focusable separator, as WAI-ARIA's window
 * splitter pattern describes, with the graph's height as its value.
 */
export function GraphResizeHandle({ height, onResize, controls }: { height: number; onResize: (px: number) => void; controls: string }) {
  const drag = useRef<{ y: number; height: number } | null>(null);
  const onKeyDown = (e: KeyboardEvent<HTMLDivElement>) => {
    const step = e.shiftKey ? GRAPH_HEIGHT.bigStep : GRAPH_HEIGHT.step;
    const next =
      e.key === 'ArrowDown' ? height + step
      : e.key === 'ArrowUp' ? height - step
      : e.key === 'Home' ? GRAPH_HEIGHT.min
      : e.key === 'End' ? GRAPH_HEIGHT.max
      : null;
    if (next === null) return;
    e.preventDefault();
    onResize(clamp(next));
  };
  const onPointerDown = (e: PointerEvent<HTMLDivElement>) => {
    e.currentTarget.setPointerCapture(e.pointerId);
    drag.current = { y: e.clientY, height };
  };
  const onPointerMove = (e: PointerEvent<HTMLDivElement>) => {
    if (drag.current) onResize(clamp(drag.current.height + e.clientY - drag.current.y));
  };
  return (
    <div
      role="separator"
      aria-orientation="horizontal"
      aria-label="Train graph height"
      aria-controls={controls}
      aria-valuemin={GRAPH_HEIGHT.min}
      aria-valuemax={GRAPH_HEIGHT.max}
      aria-valuenow={height}
      aria-valuetext={`${height} px high`}
      tabIndex={0}
      onKeyDown={onKeyDown}
      onPointerDown={onPointerDown}
      onPointerMove={onPointerMove}
      onPointerUp={() => (drag.current = null)}
      onPointerCancel={() => (drag.current = null)}
      className="group flex h-4 cursor-row-resize touch-none items-center justify-center rounded-plate focus-visible:outline focus-visible:outline-2 focus-visible:outline-verdigris"
      data-testid="graph-resize"
      title="Drag, or use the arrow keys, to change the graph's height"
    >
      <span aria-hidden className="h-1.5 w-16 rounded-full bg-line group-hover:bg-muted group-focus-visible:bg-verdigris" />
    </div>
  );
}
