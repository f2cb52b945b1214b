// The one time-zone module: wall-clock time in an IANA zone ⇄ UTC, with nothing but Intl (no time-zone
// library is installed). Hours come back 0–23 (some engines print midnight as 24).
// Client-safe: the session form, the calendar and every page that shows a session time use it.

const formatters = new Map<string, Intl.DateTimeFormat>();

function formatterFor(timeZone: string): Intl.DateTimeFormat {
  let f = formatters.get(timeZone);
  if (!f) {
    f = new Intl.DateTimeFormat('en-US', {
      timeZone,
      hourCycle: 'h23',
      year: 'numeric',
      month: '2-digit',
      day: '2-digit',
      hour: '2-digit',
      minute: '2-digit',
      second: '2-digit',
    });
    formatters.set(timeZone, f);
  }
  return f;
}

/** The wall clock in `timeZone` at an instant, as numbers. */
export function wallClockParts(utcMs: number, timeZone: string) {
  const parts: Record<string, number> = {};
  for (const p of formatterFor(timeZone).formatToParts(new Date(utcMs))) {
    if (p.type !== 'literal') parts[p.type] = Number(p.value);
  }
  return {
    year: parts.year!,
    month: parts.month!,
    day: parts.day!,
    hour: parts.hour! % 24,
    minute: parts.minute!,
    second: parts.second!,
  };
}

/** How far the zone's wall clock is ahead of UTC at an instant, in ms. */
export function zoneOffsetMs(utcMs: number, timeZone: string): number {
  const w = wallClockParts(utcMs, timeZone);
  const asUtc = Date.UTC(w.year, w.month - 1, w.day, w.hour, w.minute, w.second);
  return asUtc - Math.floor(utcMs / 1000) * 1000;
}

const pad = (n: number, width = 2) => String(n).padStart(width, '0');
const DAY_MS = 86_400_000;

/**
 * The instant a wall-clock date and time in `timeZone` names, or null when that wall time does not
 * exist there (the hour skipped when clocks go forward). In the hour that repeats when clocks go
 * back, the earlier instant is chosen.
 */
export function zonedToUtc(date: string, time: string, timeZone: string): Date | null {
  const d = /^(\d{4})-(\d{2})-(\d{2})$/.exec(date);
  const t = /^(\d{2}):(\d{2})$/.exec(time);
  if (!d || !t) return null;
  const wall = Date.UTC(Number(d[1]), Number(d[2]) - 1, Number(d[3]), Number(t[1]), Number(t[2]));
  // Try both offsets seen around the wall time: the one before a change and the one after it. The
  // instant lies within 14 h of `wall` (offsets run from −12 h to +14 h), so the probes sit a day away:
  // at half a day, a change in a zone more than 12 h ahead (Auckland's +13 → +12) fell between the
  // instant and the earlier probe, and the first of the repeated hour was lost. No zone changes its
  // offset twice within two days (IANA tz database 1970–2040).
  const candidates = new Set([wall - zoneOffsetMs(wall - DAY_MS, timeZone), wall - zoneOffsetMs(wall + DAY_MS, timeZone)]);
  const matching = [...candidates].filter((utc) => utc + zoneOffsetMs(utc, timeZone) === wall).sort((a, b) => a - b);
  return matching.length ? new Date(matching[0]!) : null;
}

/** An instant as the date (`YYYY-MM-DD`) and time (`HH:MM`) on the wall clock in `timeZone`. */
export function utcToZoned(instant: Date, timeZone: string): { date: string; time: string } {
  const w = wallClockParts(instant.getTime(), timeZone);
  return { date: `${pad(w.year, 4)}-${pad(w.month)}-${pad(w.day)}`, time: `${pad(w.hour)}:${pad(w.minute)}` };
}

/**
 * A floating ISO date-time (no offset) of the wall clock in `timeZone`, e.g. `2026-12-12T18:35:00`.
 * The calendar is given these with its own zone set to UTC, so it shows the session zone's clock.
 */
export function floatingIso(utcMs: number, timeZone: string): string {
  const w = wallClockParts(utcMs, timeZone);
  return `${pad(w.year, 4)}-${pad(w.month)}-${pad(w.day)}T${pad(w.hour)}:${pad(w.minute)}:${pad(w.second)}`;
}

// ---- Showing an instant in a zone, for people (en-GB, 24-hour) ----

// Building an Intl.DateTimeFormat costs far more than formatting with one (the builder page formats
// a few hundred times: every time label and finding span), so each zone and set of options gets one.
const FORMATTERS_KEPT = 256; // zones × option sets in use; a full cache starts again rather than grow
const peopleFormatters = new Map<string, Intl.DateTimeFormat>();

function peopleFormatter(timeZone: string, options: Intl.DateTimeFormatOptions): Intl.DateTimeFormat {
  const key = `${timeZone}\n${JSON.stringify(options)}`;
  let f = peopleFormatters.get(key);
  if (!f) {
    f = new Intl.DateTimeFormat('en-GB', { timeZone, ...options });
    if (peopleFormatters.size >= FORMATTERS_KEPT) peopleFormatters.clear();
    peopleFormatters.set(key, f);
  }
  return f;
}

/** A session's real date and time in its own zone, e.g. "Sat 12 Dec 2026, 14:00". */
export function formatInZone(date: Date, timeZone: string, options: Intl.DateTimeFormatOptions = {}): string {
  return peopleFormatter(timeZone, {
    weekday: 'short',
    day: 'numeric',
    month: 'short',
    year: 'numeric',
    hour: '2-digit',
    minute: '2-digit',
    hourCycle: 'h23',
    ...options,
  }).format(date);
}

export function formatTimeInZone(date: Date, timeZone: string): string {
  return peopleFormatter(timeZone, { hour: '2-digit', minute: '2-digit', hourCycle: 'h23' }).format(date);
}

/** A session's date alone in its zone, e.g. "Sat 12 Dec 2026". */
export function formatDateInZone(date: Date, timeZone: string): string {
  return peopleFormatter(timeZone, { weekday: 'short', day: 'numeric', month: 'short', year: 'numeric' }).format(date);
}
