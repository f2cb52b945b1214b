// Session times for people: the fast clock's face and the real wall clock in the session's zone.
// Client-safe (no server imports).
import type { FastClock } from '@/lib/planning';
import { formatFast, formatTimeOfDay, parseFastTime, realToFast } from '@/lib/planning/clock';
import { formatTimeInZone } from '@/lib/format';

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
 * Real session seconds for a fast time `HH:MM` or `HH:MM:SS`, or null when it is not one. A time
 * before the fast start reads as the next fast day; `nearS` (a real time) picks the day nearest to
 * it instead, for step times of a run that crosses fast midnight.
 */
export function fastTextToReal(text: string, clock: FastClock, nearS?: number): number | null {
  const m = /^(\d{2}):(\d{2})(?::(\d{2}))?$/.exec(text.trim());
  if (!m) return null;
  const base = parseFastTime(`${m[1]}:${m[2]}`);
  if (base === null) return null;
  const seconds = Number(m[3] ?? 0);
  if (seconds > 59) return null;
  const fastS = base + seconds;
  const start = parseFastTime(clock.fastStart) ?? 0;
  const day = 86_400;
  let unwrapped = fastS < start ? fastS + day : fastS;
  if (nearS !== undefined) {
    const near = realToFast(nearS, clock);
    // The fast day nearest to `near`, by arithmetic rather than a day-by-day loop (`near` may be any number).
    const ahead = unwrapped - near;
    if (ahead > day / 2) unwrapped -= Math.ceil(ahead / day - 0.5) * day;
    else if (-ahead > day / 2) unwrapped += Math.ceil(-ahead / day - 0.5) * day;
  }
  return (unwrapped - start) / clock.ratio;
}

/** A real duration as fast minutes, e.g. `+3 fast min` for 46 s at 4:1. */
export function fastMinutes(realS: number, ratio: number): number {
  return Math.round(((realS * ratio) / 60) * 10) / 10;
}
