// Session times for people: the fast clock's face and the real wall clock in the session's zone.
// Client-safe (no server imports).
import type { FastClock } from '@/lib/planning';
import { formatFast, formatTimeOfDay, realToFast } from '@/lib/planning/clock';
import { formatTimeInZone } from '@/lib/time-zone';

export type SessionClock = FastClock & { startsAtMs: number; timeZone: string };

export function fastLabel(realS: number, clock: FastClock): string {
  return formatFast(realS, clock);
}

/** The fast clock with seconds, `HH:MM:SS`, for step times. */
export function fastLabelSeconds(realS: number, clock: FastClock): string {
  const fastS = Math.round(realToFast(realS, clock));
  const s = ((fastS % 60) + 60) % 60;
  return `${formatTimeOfDay(fastS)}:${String(s).padStart(2, '0')}`;
}

export function realLabel(realS: number, clock: SessionClock): string {
  const date = new Date(clock.startsAtMs + realS * 1000);
  // A time beyond what a Date holds (a stored run far outside the session) reads as unknown, not a crash.
  return Number.isNaN(date.getTime()) ? '--:--' : formatTimeInZone(date, clock.timeZone);
}

/**
 * How much time the builder's views span, in real seconds: the session, stretched to the last
 * arrival, but never past a week (a run stored far outside the session must not make every view
 * draw ticks and slots for years).
 */
export const MAX_VIEW_S = 7 * 86_400;
export function viewLengthS(sessionLengthS: number, runs: readonly { arriveS: number }[]): number {
  const lastArrival = runs.reduce((last, r) => (Number.isFinite(r.arriveS) ? Math.max(last, r.arriveS) : last), 0);
  return Math.min(MAX_VIEW_S, Math.max(sessionLengthS, lastArrival));
}

/** `06:57–06:58 fast · 18:44–18:45 real` (one time when both ends read the same). */
export function spanLabel(fromS: number, toS: number, clock: SessionClock): string {
  const f1 = fastLabel(fromS, clock);
  const f2 = fastLabel(toS, clock);
  const r1 = realLabel(fromS, clock);
  const r2 = realLabel(toS, clock);
  return `${f1 === f2 ? f1 : `${f1}–${f2}`} fast · ${r1 === r2 ? r1 : `${r1}–${r2}`} real`;
}

/**
 * A real duration as fast minutes at the clock's ratio, rounded to `decimals` places: 46 s at 4:1
 * is 3.1 fast minutes to one place, 3 whole.
 */
export function fastMinutes(realS: number, clock: Pick<FastClock, 'ratio'>, decimals = 0): number {
  const scale = 10 ** decimals;
  return Math.round(((realS * clock.ratio) / 60) * scale) / scale;
}
