import type { FastClock } from './schema';
import { DAY_S, parseTimeOfDay } from './time-of-day';

/** Writes seconds after midnight as `HH:MM`, wrapping past 24 h (and before 0) onto the clock face. */
export function formatTimeOfDay(seconds: number): string {
  const minutes = Math.floor((((seconds % DAY_S) + DAY_S) % DAY_S) / 60);
  const hh = Math.floor(minutes / 60);
  const mm = minutes % 60;
  return `${String(hh).padStart(2, '0')}:${String(mm).padStart(2, '0')}`;
}

function fastStartS(clock: FastClock): number {
  // The schema guarantees the pattern; midnight is the safe reading of anything else.
  return parseTimeOfDay(clock.fastStart) ?? 0;
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

/**
 * Real session seconds (to the millisecond) for a fast time of day `HH:MM` or `HH:MM:SS`, or null
 * when the text is not one. A time before the fast start reads as the next fast day, so a session
 * that runs past fast midnight can be typed; `nearS` (a real time) picks the fast day nearest to it
 * instead, for step times of a run that crosses fast midnight.
 */
export function fastTimeToReal(text: string, clock: FastClock, nearS?: number): number | null {
  const fastS = parseTimeOfDay(text, { seconds: true });
  if (fastS === null) return null;
  const start = fastStartS(clock);
  let unwrapped = fastS < start ? fastS + DAY_S : fastS;
  if (nearS !== undefined) {
    const near = realToFast(nearS, clock);
    // The fast day nearest to `near`, by arithmetic rather than a day-by-day loop (`near` may be any number).
    const ahead = unwrapped - near;
    if (ahead > DAY_S / 2) unwrapped -= Math.ceil(ahead / DAY_S - 0.5) * DAY_S;
    else if (-ahead > DAY_S / 2) unwrapped += Math.ceil(-ahead / DAY_S - 0.5) * DAY_S;
  }
  return Math.round(fastToReal(unwrapped, clock) * 1000) / 1000;
}

/** The fast clock's face, `HH:MM`, at a real session time; wraps at 24 h. */
export function formatFast(realS: number, clock: FastClock): string {
  return fastFormatter(clock)(realS);
}

/** formatFast for one clock, its start read once (for writing many times). */
export function fastFormatter(clock: FastClock): (realS: number) => string {
  const start = fastStartS(clock);
  return (realS) => formatTimeOfDay(start + realS * clock.ratio);
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
