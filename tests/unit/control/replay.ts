import type { ControlEntry, ControlSchedule } from '@/lib/control';

/**
 * An independent replay of a control schedule, written without the module's helpers: the state of
 * every cab and block at any moment, by scanning the entries from the start.
 */
export interface ReplayState {
  direction: Map<string, 'forward' | 'reverse' | 'off'>;
  pwm: Map<string, number>;
  feed: Map<string, string | null>;
  polarity: Map<string, 'normal' | 'swapped'>;
}

export function stateAt(schedule: ControlSchedule, atMs: number): ReplayState {
  const state: ReplayState = { direction: new Map(), pwm: new Map(), feed: new Map(), polarity: new Map() };
  const ramps = new Map<string, Extract<ControlEntry, { kind: 'speed' }>>();
  for (const e of schedule.entries) {
    if (e.atMs > atMs) break;
    if (e.kind === 'direction') state.direction.set(e.cabId, e.direction);
    else if (e.kind === 'speed') ramps.set(e.cabId, e);
    else if (e.kind === 'feed') state.feed.set(e.blockId, e.cabId);
    else state.polarity.set(e.blockId, e.polarity);
  }
  for (const [cabId, r] of ramps) {
    const done = r.rampMs === 0 ? 1 : Math.min(1, (atMs - r.atMs) / r.rampMs);
    state.pwm.set(cabId, r.from + (r.to - r.from) * done);
  }
  return state;
}

/** Every moment at which something may change: entry times and ramp ends. */
export function changeTimes(schedule: ControlSchedule): number[] {
  const times = new Set<number>();
  for (const e of schedule.entries) {
    times.add(e.atMs);
    if (e.kind === 'speed') times.add(e.atMs + e.rampMs);
  }
  return [...times].sort((a, b) => a - b);
}
