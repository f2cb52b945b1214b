import { z } from 'zod';
import { SESSION_STATUSES } from '@/db/enums';
import { timeOfDaySchema } from '@/lib/planning';

const id = z.string().trim().min(1, 'Choose one.').max(100, 'That id is too long.');

/** A number typed into a form field (FormData gives strings; an empty field is "missing", not 0). */
function numberField(label: string, min: number, max: number) {
  return z
    .union([z.string(), z.number()], { error: `Enter ${label}.` })
    .transform((v) => (typeof v === 'string' ? v.trim() : v))
    .refine((v) => v !== '', `Enter ${label}.`)
    .transform(Number)
    // One message per field: a value that is not a number is not also out of range.
    .refine((v) => Number.isFinite(v), { message: `Enter ${label} as a number.`, abort: true })
    .refine((v) => v >= min && v <= max, `Use ${min} to ${max}.`);
}

const timeOfDay = (what: string) => timeOfDaySchema({ missing: `Enter ${what}.`, invalid: `Enter ${what} as HH:MM, e.g. 18:30.` });

/** Fast-clock ratio: 3:1 to 12:1 is seen on layouts, 4:1 to 6:1 typical (common practice); 1 is real time. */
export const CLOCK_RATIO_RANGE = { min: 1, max: 24 } as const;

export { SESSION_DEFAULTS, STATUS_MOVES } from './session-constants';

/** Bounds of the session-day settings (also the report route's `punctualMin`). */
export const SESSION_DAY_RANGE = { standS: { min: 0, max: 3600 }, punctualFastMin: { min: 0, max: 120 } } as const;

export const sessionSettingsSchema = z.object({
  title: z.string({ error: 'Enter a title.' }).trim().min(2, 'Use at least 2 characters.').max(120, 'Use at most 120 characters.'),
  place: z.string().trim().max(200, 'Use at most 200 characters.').default(''),
  description: z.string().trim().max(2000, 'Use at most 2000 characters.').default(''),
  date: z
    .string({ error: 'Enter the date.' })
    .trim()
    .regex(/^\d{4}-\d{2}-\d{2}$/, { message: 'Enter the date as YYYY-MM-DD.', abort: true })
    .refine((d) => !Number.isNaN(Date.parse(`${d}T00:00:00Z`)) && new Date(`${d}T00:00:00Z`).toISOString().startsWith(d), 'That date does not exist.'),
  startTime: timeOfDay('the start time'),
  endTime: timeOfDay('the end time'),
  clockRatio: numberField('the fast-clock ratio', CLOCK_RATIO_RANGE.min, CLOCK_RATIO_RANGE.max),
  fastStart: timeOfDay('the fast-clock start'),
  headwayS: numberField('the headway in seconds', 0, 3600),
  surgeS: numberField('the surge time in seconds', 0, 60),
  deratePercent: numberField('the supply load limit in percent', 10, 100),
  // Optional so that a form or tool that leaves them out keeps the stored value (or the default).
  standS: numberField('the least stand in seconds', SESSION_DAY_RANGE.standS.min, SESSION_DAY_RANGE.standS.max).optional(),
  punctualFastMin: numberField('the punctuality margin in fast minutes', SESSION_DAY_RANGE.punctualFastMin.min, SESSION_DAY_RANGE.punctualFastMin.max).optional(),
});
export type SessionSettingsInput = z.infer<typeof sessionSettingsSchema>;

export const createSessionSchema = sessionSettingsSchema.extend({ layoutId: id });

export const updateSessionSchema = sessionSettingsSchema.extend({
  sessionId: id,
  version: numberField('the version', 1, Number.MAX_SAFE_INTEGER),
});


export const sessionStatusSchema = z.object({
  sessionId: id,
  version: numberField('the version', 1, Number.MAX_SAFE_INTEGER),
  status: z.enum(SESSION_STATUSES, { error: 'Choose draft, published or cancelled.' }),
  /** Publishing a timetable with errors names how many errors the host agreed to publish with. */
  acknowledgedErrors: numberField('the number of errors', 0, 1_000_000).optional(),
});

export const duplicateSessionSchema = z.object({
  sessionId: id,
  date: sessionSettingsSchema.shape.date,
  title: sessionSettingsSchema.shape.title.optional(),
});

/** Route parameters of the session handlers. */
export const sessionParamsSchema = z.object({ sessionId: id });
export const runParamsSchema = z.object({ sessionId: id, runId: id });
