import { z } from 'zod';
import { SESSION_STATUSES } from '@/db/enums';
import { HH_MM_PATTERN } from '@/lib/planning';

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

const timeOfDay = (what: string) =>
  z.string({ error: `Enter ${what}.` }).trim().regex(HH_MM_PATTERN, `Enter ${what} as HH:MM, e.g. 18:30.`);

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

// ---- Runs (JSON bodies of the builder's route handlers) ----

const seconds = z.number({ error: 'Enter a time in seconds.' });
const fastTime = z
  .string({ error: 'Enter the departure on the fast clock.' })
  .trim()
  .regex(/^([01]\d|2[0-3]):([0-5]\d)(:([0-5]\d))?$/, 'Enter the departure as HH:MM on the fast clock, e.g. 06:45.');

export const stepInputSchema = z.object({
  blockId: id,
  enterS: seconds,
  exitS: seconds,
});

/** How a run's steps are timed: from a route and a speed (timeRun), or given step by step. */
const timingFields = {
  /** Blocks in order; consecutive ones are joined by the shortest route, so first and last are enough. */
  waypoints: z.array(id).min(2, 'Pick at least the first and the last block.').max(100, 'At most 100 blocks.'),
  speedKmh: z.number({ error: 'Enter a scale speed.' }).gt(0, 'The speed must be more than 0 km/h.').max(500, 'Use at most 500 km/h.'),
  standBeforeS: z.number().min(0, 'Use 0 or more seconds.').max(3600, 'Use at most 3600 s.').default(60),
  standAfterS: z.number().min(0, 'Use 0 or more seconds.').max(3600, 'Use at most 3600 s.').default(120),
};

export const createRunSchema = z.union([
  z.object({
    trainId: id,
    cabId: id,
    operatorId: id.nullable().default(null),
    depart: fastTime,
    ...timingFields,
    note: z.string().trim().max(500).default(''),
  }),
  // Given step by step: how an undo puts a deleted run back, and how outside tools add one.
  z.object({
    trainId: id,
    cabId: id,
    operatorId: id.nullable().default(null),
    departS: seconds,
    arriveS: seconds,
    speedKmh: z.number().positive().max(500).nullable().default(null),
    steps: z.array(stepInputSchema).min(1, 'A run needs at least one step.').max(500),
    note: z.string().trim().max(500).default(''),
  }),
]);
export type CreateRunInput = z.infer<typeof createRunSchema>;

export const updateRunSchema = z
  .object({
    version: z.number({ error: 'Say which version of the run you edited.' }).int().min(1),
    trainId: id.optional(),
    cabId: id.optional(),
    operatorId: id.nullable().optional(),
    note: z.string().trim().max(500).optional(),
    /** Move the whole run to depart at this fast-clock time. */
    depart: fastTime.optional(),
    /** Move the whole run to depart at this real session time (dragging on a timeline). */
    departS: seconds.optional(),
    /** Re-time from a route and speed. */
    timing: z.object(timingFields).optional(),
    /** Override the step times (and the departure and arrival they hold). */
    steps: z
      .object({ departS: seconds, arriveS: seconds, steps: z.array(stepInputSchema).min(1).max(500) })
      .optional(),
  })
  .refine((v) => [v.depart, v.departS, v.timing, v.steps].filter((x) => x !== undefined).length <= 1, {
    message: 'Change the departure, the timing or the steps, one at a time.',
    path: ['depart'],
  });
export type UpdateRunInput = z.infer<typeof updateRunSchema>;

export const seriesSchema = z.object({
  everyFastMin: z.number({ error: 'Enter how many fast minutes apart.' }).int('Use whole minutes.').min(1, 'Use at least 1 minute.').max(24 * 60, 'Use at most 1440 minutes.'),
  count: z.number({ error: 'Enter how many copies.' }).int('Use a whole number.').min(1, 'Make at least 1 copy.').max(50, 'Make at most 50 copies at once.'),
});

export const retimeMovesSchema = z.object({
  moves: z
    .array(
      z.object({
        runId: id,
        version: z.number().int().min(1),
        delayS: z.number().refine((v) => v !== 0, 'A move must shift the run.').refine((v) => Math.abs(v) <= 7 * 86_400, 'That is more than a week.'),
      }),
    )
    .min(1, 'Nothing to move.')
    .max(5000, 'At most 5000 runs at once.'),
});
export type RetimeMoves = z.infer<typeof retimeMovesSchema>['moves'];

/** Route parameters of the session handlers. */
export const sessionParamsSchema = z.object({ sessionId: id });
export const runParamsSchema = z.object({ sessionId: id, runId: id });
