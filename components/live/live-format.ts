import type { FastClock } from '@/lib/planning';
import { formatFast } from '@/lib/planning/clock';
import { blockAtTime } from '@/lib/live/blocks';
import { fastMinutes } from '@/lib/sessions/time-labels';
import type { LiveRun, LiveState } from '@/lib/live/types';

export function fastAt(sessionS: number, clock: FastClock): string {
  return formatFast(sessionS, clock);
}

export function namesOf(state: LiveState) {
  const map = (list: { id: string; name: string }[]) => new Map(list.map((x) => [x.id, x.name]));
  return { block: map(state.names.blocks), cab: map(state.names.cabs), train: map(state.names.trains), operator: map(state.names.operators) };
}

/** The block a run is expected in at `nowS` (the one entered last), or null. */
export function blockAt(run: LiveRun, nowS: number): string | null {
  return blockAtTime(run.steps, nowS);
}

export const isUnderWay = (run: LiveRun) => run.status === 'running' || run.status === 'stopped';
export const notDeparted = (run: LiveRun) => run.status === 'waiting' || run.status === 'due';

export function delayLabel(delayS: number, clock: FastClock): string | null {
  const min = fastMinutes(delayS, clock);
  return min >= 1 ? `+${min} min` : null;
}

/** Runs with something reported (departed, stopped or arrived), in the order they actually left. */
export function reportedRuns(runs: readonly LiveRun[]): LiveRun[] {
  return runs.filter((r) => r.actual.departS !== null || r.actual.arriveS !== null || r.actual.stop !== null).sort((a, b) => (a.actual.departS ?? 0) - (b.actual.departS ?? 0));
}
