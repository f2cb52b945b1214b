// The limits this project means its forms and JSON bodies to have, written down by the tests and not
// read from the schemas under test: a schema whose limit is loosened or tightened by mistake then
// disagrees with this table (tests/unit/validation-bounds.test.ts probes each edge, one field at a time).

/** One numeric field: the smallest and largest values it takes (`gt`: the minimum itself is refused). */
export type Bound = { field: string; min: number; gt?: true; max: number; int?: true; source: string };

export const SESSION_SETTINGS_BOUNDS: Bound[] = [
  { field: 'clockRatio', min: 1, max: 24, source: 'fast clocks run 3:1 to 12:1 on layouts, 1 is real time (common practice); 24 leaves room' },
  { field: 'headwayS', min: 0, max: 3600, source: 'real seconds between trains in a block, at most an hour (common practice)' },
  { field: 'surgeS', min: 0, max: 60, source: 'a motor start surge lasts seconds, not minutes (common practice)' },
  {
    field: 'deratePercent',
    min: 10,
    max: 100,
    source: 'continuous load at 80 % of a supply rating (rule of thumb, the NEC 210.20(A) figure); below 10 % a supply carries nothing useful',
  },
  { field: 'standS', min: 0, max: 3600, source: 'real seconds a train, cab or operator stands between runs, at most an hour (common practice)' },
  { field: 'punctualFastMin', min: 0, max: 120, source: 'a punctuality margin of a few fast minutes, at most two fast hours (common practice)' },
];

export const SERIES_BOUNDS: Bound[] = [
  { field: 'everyFastMin', min: 1, max: 24 * 60, int: true, source: 'one fast-clock day at most between copies (common practice)' },
  { field: 'count', min: 1, max: 50, int: true, source: 'copies made at once, bounded so one request writes a bounded number of runs (common practice)' },
];

export const RUN_TIMING_BOUNDS: Bound[] = [
  { field: 'speedKmh', min: 0, gt: true, max: 500, source: 'scale speed; the fastest trains in service run about 350 km/h (common practice)' },
  { field: 'standBeforeS', min: 0, max: 3600, source: 'a stand of up to an hour real time (common practice)' },
  { field: 'standAfterS', min: 0, max: 3600, source: 'a stand of up to an hour real time (common practice)' },
];

export const SUPPLY_BOUNDS: Bound[] = [
  { field: 'volts', min: 0, gt: true, max: 60, source: 'track supplies are low voltage; the driver presets go to 46 V (dual full-bridge datasheet, Multiwatt15)' },
  { field: 'amps', min: 0, gt: true, max: 100, source: 'common practice' },
];

export const DRIVER_BOUNDS: Bound[] = [
  { field: 'channels', min: 1, max: 16, int: true, source: 'common practice: the presets have 1 or 2 bridges per package' },
  { field: 'channelAmps', min: 0, gt: true, max: 50, source: 'common practice (the single high-current MOSFET class is the largest preset)' },
  { field: 'dropVolts', min: 0, max: 20, source: 'bridge drop: up to 4.9 V at 2 A in the dual full-bridge datasheet; 20 V leaves room' },
];

export const LOCOMOTIVE_BOUNDS: Bound[] = [
  { field: 'runningAmps', min: 0, max: 20, source: 'common practice' },
  { field: 'ratedVolts', min: 0, gt: true, max: 60, source: 'NEM 630 Table 1 nominal DC 8–16 V by gauge; 60 V leaves room' },
  { field: 'topSpeedKmh', min: 0, gt: true, max: 600, source: 'common practice' },
];

/** Whether every field of `input` that a bound names is inside it (fields it does not name pass). */
export function withinBounds(input: Record<string, unknown>, bounds: Bound[]): boolean {
  return bounds.every((b) => {
    if (!(b.field in input)) return true;
    const raw = input[b.field];
    const n = typeof raw === 'number' ? raw : typeof raw === 'string' && raw.trim() !== '' ? Number(raw.trim()) : Number.NaN;
    return Number.isFinite(n) && (b.gt ? n > b.min : n >= b.min) && n <= b.max && (!b.int || Number.isInteger(n));
  });
}

/** Counts and lengths of a run and of the builder's request bodies: the most (and least) each takes. */
export const RUN_LIMITS = {
  /** An id's characters: database ids (UUIDs, 36) fit with room (common practice). */
  idChars: { min: 1, max: 100, source: 'common practice: a UUID is 36 characters' },
  /** A note's characters: a line or two on a timetable (common practice). */
  noteChars: { max: 500, source: 'common practice: a timetable note is a line or two' },
  /** Blocks a run passes through: the plan interchange's own limit per run. */
  steps: { min: 1, max: 500, source: 'common practice: a run passes at least one block; a long run on a large layout passes a few hundred' },
  /** Blocks picked to time a route: first and last at least. */
  waypoints: { min: 2, max: 100, source: 'common practice: a route has a first and a last block' },
  /** Runs moved by one retime request. */
  moves: { min: 1, max: 5000, source: 'common practice: a session holds a few thousand runs at most' },
  /** How far one move shifts a run, in real seconds: a week either way. */
  moveS: { max: 7 * 86_400, source: 'common practice: a session lasts a day; a week leaves room' },
  /** The edit number a caller saw: the first stored edit is version 1. */
  version: { min: 1, source: 'common practice: optimistic-lock versions count from 1' },
} as const;

/** What a CSV import takes before refusing the file (413): the bounds the file screens state. */
export const CSV_LIMITS = {
  /** Bytes of the file, UTF-8 (a BOM counts): 1 MB, decimal, as the refusal says. */
  bytes: { max: 1_000_000, source: 'common practice: a few thousand rows of a layout table fit in well under 1 MB' },
  /** Data rows, the header and blank lines not counted. */
  rows: { max: 5_000, source: 'common practice: a large layout has a few hundred blocks or vehicles' },
} as const;
