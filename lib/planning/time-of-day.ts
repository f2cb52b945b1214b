// The one reader of a written time of day (`HH:MM`, or `HH:MM:SS` where seconds are allowed), for the
// fast clock and the wall clock alike. Imports nothing (no zod either: the browser's clock code uses it),
// so every module can; its zod schema, timeOfDaySchema, lives in ./schema.

/** Seconds in a day. */
export const DAY_S = 86_400;

const HH_MM = '([01]\\d|2[0-3]):([0-5]\\d)';
const PATTERNS = {
  minutes: new RegExp(`^${HH_MM}$`),
  seconds: new RegExp(`^${HH_MM}(?::([0-5]\\d))?$`),
} as const;

export type TimeOfDayOptions = {
  /** Also accept `HH:MM:SS` (default: `HH:MM` only). */
  seconds?: boolean;
};

/** The pattern parseTimeOfDay reads, for the zod schema built on it (./schema's timeOfDaySchema). */
export function timeOfDayPattern(options: TimeOfDayOptions = {}): RegExp {
  return options.seconds ? PATTERNS.seconds : PATTERNS.minutes;
}

/**
 * Seconds after midnight for a 24-hour time of day written `HH:MM` (two digits each, 00:00 to 23:59),
 * or `HH:MM:SS` when `seconds` is set; null for anything else. Surrounding blanks are ignored.
 */
export function parseTimeOfDay(text: string, options: TimeOfDayOptions = {}): number | null {
  const match = timeOfDayPattern(options).exec(text.trim());
  if (match === null) return null;
  return Number(match[1]) * 3600 + Number(match[2]) * 60 + Number(match[3] ?? 0);
}
