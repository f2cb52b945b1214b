// The run and its steps: one zod schema for every place that reads or writes a run. The route
// handlers parse with these, the service writes what they give, and the builder's client imports
// the inferred types, so a field added here reaches every copy path (series, plan import, undo)
// and the compiler points at each place that must show it. Pure: zod and types only.
import { z } from 'zod';
import { PLAN_LIMITS, planSchema, timeOfDaySchema, type Plan } from '@/lib/planning';

const id = z.string().trim().min(1, 'Choose one.').max(100, 'That id is too long.');
const seconds = z.number({ error: 'Enter a time in seconds.' });

/** A run holds at most this many steps (blocks passed through). */
export const MAX_STEPS_PER_RUN = 500;

const blockEnd = z.enum(['a', 'b']);
/** A block passed through; fromEnd/toEnd: the direction of travel, when the route finder recorded it. */
export const stepSchema = z.object({ blockId: id, enterS: seconds, exitS: seconds, fromEnd: blockEnd.optional(), toEnd: blockEnd.optional() });
export type Step = z.infer<typeof stepSchema>;

const steps = z.array(stepSchema).min(1, 'A run needs at least one step.').max(MAX_STEPS_PER_RUN, `A run has at most ${MAX_STEPS_PER_RUN} steps.`);
const speedKmh = z.number({ error: 'Enter a scale speed.' }).gt(0, 'The speed must be more than 0 km/h.').max(500, 'Use at most 500 km/h.');
const note = z.string().trim().max(500, 'Use at most 500 characters.');

// Without defaults: the patch below takes these as optional, and a zod default inside an optional
// field would fill in what the caller left alone.
const runShape = {
  trainId: id,
  cabId: id,
  operatorId: id.nullable(),
  /** Real seconds from the session's start. */
  departS: seconds,
  arriveS: seconds,
  /** The scale speed the run was timed at, when it was timed from a route. */
  speedKmh: speedKmh.nullable(),
  note,
  steps,
};

/** Every field of a run except who it is (id) and which edit it is at (version): what a copy carries. */
export const runFieldsSchema = z.object({
  ...runShape,
  operatorId: runShape.operatorId.default(null),
  speedKmh: runShape.speedKmh.default(null),
  note: runShape.note.default(''),
});
export type RunFields = z.infer<typeof runFieldsSchema>;

/** A stored run as the builder sees it. */
export type Run = RunFields & { id: string; version: number };

/** The names of a run's fields, from the schema (tests build their field-by-field checks from it). */
export const RUN_FIELD_NAMES = runFieldsSchema.keyof().options;

/** A run's timing: departure, arrival and the steps between. Every other field is an attribute. */
type TimingKey = 'departS' | 'arriveS' | 'steps';
export type RunTiming = Pick<RunFields, TimingKey>;
export type RunAttributes = Omit<RunFields, TimingKey>;

// Plain functions over these types, in a zod-free module the builder's client imports.
export { restoreEdit, runAttributesOf, runFieldsOf, shiftTiming } from './fields';

/**
 * What the plan interchange does not carry: a stored run's fields beyond the engine's run. Plan
 * import keeps these from the posted run when it has them, else from the stored run of the same id.
 * A new run field must be listed here or be part of the engine's run (the check below fails to
 * compile otherwise).
 */
export const RUN_FIELDS_OUTSIDE_PLAN = ['speedKmh', 'note'] as const satisfies readonly (keyof RunFields)[];
type PlanRun = Plan['runs'][number];
type Unplaced = Exclude<keyof RunFields, keyof PlanRun | (typeof RUN_FIELDS_OUTSIDE_PLAN)[number]>;
const everyFieldPlaced: [Unplaced] extends [never] ? true : Unplaced = true;
void everyFieldPlaced;

/** The fields outside the plan, as they may come with a posted plan's run (each optional). */
// Every name of RUN_FIELDS_OUTSIDE_PLAN must be here (the satisfies fails to compile otherwise), or a posted
// plan's run would have the new field stripped by the parse.
const OUTSIDE_PLAN_MASK = { speedKmh: true, note: true } as const satisfies Record<(typeof RUN_FIELDS_OUTSIDE_PLAN)[number], true>;
export const runFieldsOutsidePlanSchema = z.object(runShape).pick(OUTSIDE_PLAN_MASK).partial();

/** A posted plan interchange (a session's plan, a plan to check) is read up to this many bytes: a few thousand runs fit well inside. */
export const PLAN_MAX_BYTES = 5_000_000;

/** A posted plan: the plan interchange, whose runs may carry the fields outside it beside their own. */
export const postedPlanSchema = planSchema
  .and(z.object({ runs: z.array(runFieldsOutsidePlanSchema).max(PLAN_LIMITS.runs) }))
  .transform((plan) => plan as Omit<Plan, 'runs'> & { runs: (PlanRun & z.infer<typeof runFieldsOutsidePlanSchema>)[] });
export type PostedPlan = z.infer<typeof postedPlanSchema>;

/** A run as the engine's plan interchange sees it. */
export function toPlanRun(run: Omit<RunFields, (typeof RUN_FIELDS_OUTSIDE_PLAN)[number]> & { id: string }): PlanRun {
  return {
    id: run.id,
    trainId: run.trainId,
    cabId: run.cabId,
    operatorId: run.operatorId,
    departS: run.departS,
    arriveS: run.arriveS,
    steps: run.steps.map((s) => ({
      blockId: s.blockId,
      enterS: s.enterS,
      exitS: s.exitS,
      ...(s.fromEnd ? { fromEnd: s.fromEnd } : {}),
      ...(s.toEnd ? { toEnd: s.toEnd } : {}),
    })),
  };
}

// ---- Request bodies of the builder's route handlers ----

export const fastTimeSchema = timeOfDaySchema(
  { missing: 'Enter the departure on the fast clock.', invalid: 'Enter the departure as HH:MM on the fast clock, e.g. 06:45.' },
  { seconds: true },
);

/** How a run's steps are timed from a route and a speed (timeRun). */
const timingShape = {
  /** Blocks in order; consecutive ones are joined by the shortest route, so first and last are enough. */
  waypoints: z.array(id).min(2, 'Pick at least the first and the last block.').max(100, 'At most 100 blocks.'),
  speedKmh,
  standBeforeS: z.number().min(0, 'Use 0 or more seconds.').max(3600, 'Use at most 3600 s.').default(60),
  standAfterS: z.number().min(0, 'Use 0 or more seconds.').max(3600, 'Use at most 3600 s.').default(120),
};
export const routeTimingSchema = z.object(timingShape);
export type RouteTiming = z.infer<typeof routeTimingSchema>;

/**
 * A new run: its attributes with a fast-clock departure and a route to time; or every field given
 * (how an undo puts a deleted run back, and how outside tools add one).
 */
export const createRunSchema = z.union([
  runFieldsSchema.omit({ departS: true, arriveS: true, steps: true, speedKmh: true }).extend({ depart: fastTimeSchema, ...timingShape }),
  runFieldsSchema,
]);
export type CreateRunInput = z.infer<typeof createRunSchema>;
export type CreateRunBody = z.input<typeof createRunSchema>;

/**
 * An edit: any attributes, and at most one of a new departure (fast clock, or real seconds when
 * dragged on a timeline; the whole run moves), a new timing from route and speed, or the timing
 * given whole.
 */
export const updateRunSchema = z
  .object({
    version: z.number({ error: 'Say which version of the run you edited.' }).int().min(1),
    ...z.object(runShape).omit({ departS: true, arriveS: true, steps: true }).partial().shape,
    depart: fastTimeSchema.optional(),
    departS: seconds.optional(),
    timing: routeTimingSchema.optional(),
    steps: z.object({ departS: seconds, arriveS: seconds, steps }).optional(),
  })
  .refine((v) => [v.depart, v.departS, v.timing, v.steps].filter((x) => x !== undefined).length <= 1, {
    message: 'Change the departure, the timing or the steps, one at a time.',
    path: ['depart'],
  });
export type UpdateRunInput = z.infer<typeof updateRunSchema>;
export type UpdateRunBody = z.input<typeof updateRunSchema>;

export const seriesSchema = z.object({
  everyFastMin: z.number({ error: 'Enter how many fast minutes apart.' }).int('Use whole minutes.').min(1, 'Use at least 1 minute.').max(24 * 60, 'Use at most 1440 minutes.'),
  count: z.number({ error: 'Enter how many copies.' }).int('Use a whole number.').min(1, 'Make at least 1 copy.').max(50, 'Make at most 50 copies at once.'),
});
export type SeriesBody = z.infer<typeof seriesSchema>;

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
export type Move = RetimeMoves[number];

/** `DELETE ...?version=3`: the version of the run the caller saw. */
export const deleteRunQuerySchema = z.object({
  version: z.coerce.number({ error: 'Say which version of the run you are deleting (?version=).' }).int().min(1, 'Say which version of the run you are deleting (?version=).'),
});
