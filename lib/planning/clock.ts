import type { FastClock } from './schema';

/** A time of day written HH:MM (24-hour). */
export const HH_MM_PATTERN = /^([01]\d|2[0-3]):([0-5]\d)$/;

const DAY_S = 24 * 3600;

/** Seconds after midnight for a `HH:MM` time of day, or null when the text is not one. */
export function parseFastTime(text: string): number | null {
  const match = HH_MM_PATTERN.exec(text.trim());
  if (match === null) return null;
  return Number(match[1]) * 3600 + Number(match[2]) * 60;
}

/** Writes seconds after midnight as `HH:MM`, wrapping past 24 h (and before 0) onto the clock face. */
export function formatTimeOfDay(seconds: number): string {
  const minutes = Math.floor((((seconds % DAY_S) + DAY_S) % DAY_S) / 60);
  const hh = Math.floor(minutes / 60);
  const mm = minutes % 60;
  return `${String(hh).padStart(2, '0')}:${String(mm).padStart(2, '0')}`;
}

function fastStartS(clock: FastClock): number {
  // The schema guarantees the pattern; midnight is the safe reading of anything else.
  return parseFastTime(clock.fastStart) ?? 0;
}

/**
 * Fast-clock seconds after fast midnight at a real session time: fastStart + realS × ratio. Not
 * wrapped, so a session running past fast midnight keeps counting up (86 400 s and beyond).
 */
export function realToFast(realS: number, clock: FastClock): number {
  return fastStartS(clock) + realS * clock.ratio;
}

/** Real session seconds at a fast-clock time given in seconds after fast midnight (unwrapped). */
export function fastToReal(fastS: number, clock: FastClock): number {
  return (fastS - fastStartS(clock)) / clock.ratio;
}

/** The fast clock's face, `HH:MM`, at a real session time; wraps at 24 h. */
export function formatFast(realS: number, clock: FastClock): string {
  return formatTimeOfDay(realToFast(realS, clock));
}

/**
 * Real session time for messages: `h:mm:ss`, with tenths of a second when the time has them.
 */
export function formatSessionTime(realS: number): string {
  const sign = realS < 0 ? '-' : '';
  const tenths = Math.round(Math.abs(realS) * 10);
  const whole = Math.floor(tenths / 10);
  const h = Math.floor(whole / 3600);
  const m = Math.floor((whole % 3600) / 60);
  const s = whole % 60;
  const fraction = tenths % 10 === 0 ? '' : `.${tenths % 10}`;
  return `${sign}${h}:${String(m).padStart(2, '0')}:${String(s).padStart(2, '0')}${fraction}`;
}
