import { z } from 'zod';
import { defaultRamps } from './motion';
import { timeOfDayPattern, type TimeOfDayOptions } from './time-of-day';

/**
 * A zod string for a time of day that `parseTimeOfDay` reads (same pattern, so the two never
 * disagree), trimmed. `missing` is the message for a value that is not a string, `invalid` for one
 * that is not a time of day.
 */
export function timeOfDaySchema(messages: { invalid: string; missing?: string }, options: TimeOfDayOptions = {}) {
  const text = messages.missing === undefined ? z.string() : z.string({ error: messages.missing });
  return text.trim().regex(timeOfDayPattern(options), messages.invalid);
}

/**
 * What an id in a plan may look like: a letter or digit, then up to 63 letters, digits, `.`, `_`,
 * `:` or `-`. Database ids (UUIDs) fit; control characters, spaces, `;`, `,`, quotes and
 * backslashes never reach a calendar, a file name or a log line through an id.
 */
export const PLAN_ID_PATTERN = /^[A-Za-z0-9][A-Za-z0-9._:-]{0,63}$/;

/**
 * Bounds on what one plan may hold, so that every loop the check runs is bounded too: a plan is
 * refused (not truncated) when it is larger.
 */
export const PLAN_LIMITS = {
  runs: 10_000,
  stepsPerRun: 500,
  steps: 100_000,
  /** Blocks, links, trains, locomotives, cabs, drivers, supplies, operators: each list. */
  things: 20_000,
  /** Times are real seconds from the session's start: a day before it to a week after. */
  earliestS: -86_400,
  latestS: 7 * 86_400,
} as const;

const id = z
  .string()
  .min(1, 'must not be empty')
  .regex(PLAN_ID_PATTERN, 'must be 1–64 letters, digits, ".", "_", ":" or "-", starting with a letter or digit');
const name = z.string().max(200, 'must be 200 characters or fewer');
const positive = z.number().positive('must be greater than 0');
const nonNegative = z.number().min(0, 'must be 0 or more');
/** A number in (0, max]: the physical ranges below are generous, but bounded. */
const upTo = (max: number) => positive.max(max, `must be ${max} or less`);
const zeroTo = (max: number) => nonNegative.max(max, `must be ${max} or less`);
// zod 4 numbers are finite by default, so times can never be Infinity or NaN; the range keeps
// every time-driven loop (ticks, grid lines) of the screens bounded.
const seconds = z
  .number()
  .min(PLAN_LIMITS.earliestS, `must be ${PLAN_LIMITS.earliestS} s or later (a day before the session)`)
  .max(PLAN_LIMITS.latestS, `must be ${PLAN_LIMITS.latestS} s or earlier (a week after the session's start)`);
const listOf = <T extends z.ZodType>(item: T, max: number = PLAN_LIMITS.things) => z.array(item).max(max, `must hold ${max} or fewer`);

// Scale ratios from 1:1 to 1:1000 (NEM 010's smallest listed scale, Z, is 1:220).
export const scaleSchema = z.object({ name, ratio: z.number().min(1, 'must be 1 or more').max(1000, 'must be 1000 or less') });

export const clockSchema = z.object({
  // 3:1 to 12:1 is what sessions use (common practice); 60:1 leaves room.
  ratio: z.number().min(1, 'must be 1 or more').max(60, 'must be 60 or less'),
  fastStart: timeOfDaySchema({ invalid: 'must be a time of day written HH:MM' }),
});

export const rulesSchema = z.object({
  headwayS: zeroTo(3600),
  surgeS: zeroTo(600),
  derate: z.number().gt(0, 'must be greater than 0').max(1, 'must be 1 or less'),
});

export const supplySchema = z.object({ id, name, volts: upTo(100), amps: upTo(100) });

/** A straight-line drop against current: fixedVolts + ohms × amps (see DropLine). */
export const dropLineSchema = z.object({ fixedVolts: zeroTo(100), ohms: zeroTo(1000) });

export const driverSchema = z.object({
  id,
  name,
  supplyId: id,
  channels: z.number().int('must be a whole number').min(1, 'must be 1 or more').max(64, 'must be 64 or fewer'),
  channelAmps: upTo(100),
  channelPeakAmps: upTo(100),
  totalAmps: upTo(100).nullable(),
  /** One fixed drop, V: plans written before the drop depended on current. `drop` replaces it. */
  dropVolts: zeroTo(100).optional(),
  /** The drop against current, as the least and the most the datasheet allows (see driverDrop). */
  drop: z.object({ min: dropLineSchema, max: dropLineSchema }).optional(),
  /**
   * How long the peak rating holds, s. Null: the datasheet gives no pulse width, so a surge is judged
   * against the continuous rating. Absent (older plans): the peak covers the surge.
   */
  peakPulseS: upTo(3600).nullable().optional(),
  /** What the package may dissipate, W, at 25 °C; null or absent: not checked. */
  packageWatts: upTo(1000).nullable().optional(),
});

export const cabSchema = z.object({
  id,
  name,
  driverId: id,
  channel: z.number().int('must be a whole number').min(1, 'must be 1 or more').max(64, 'must be 64 or fewer'),
});

/** A block's two ends. A train travels through a block from one end to the other. */
export const BLOCK_ENDS = ['a', 'b'] as const;
export const blockEndSchema = z.enum(BLOCK_ENDS);

// Lengths up to a kilometre of model track in one block, and trains up to 100 m.
export const blockSchema = z.object({
  id,
  name,
  lengthMm: upTo(1_000_000),
  /**
   * Which rail the cab's positive output feeds, looking towards the block's `b` end. Absent: the
   * right-hand rail, so that a cab driving forward moves a train towards `b` (NEM 631 2.3).
   */
  positiveRail: z.enum(['right', 'left']).optional(),
  /** A reversing section: the block has its own polarity switch (a relay or an H-bridge of its own). */
  reversingSection: z.boolean().optional(),
  /** A reversing place: a train may change direction here in the middle of a run. */
  reversingPlace: z.boolean().optional(),
});

/**
 * A rail joint: end `aEnd` of block `a` meets end `bEnd` of block `b`. Absent ends (plans written
 * before blocks had ends): `a`'s `b` end meets `b`'s `a` end, the line running from `a` to `b`.
 */
export const linkSchema = z.object({ a: id, b: id, aEnd: blockEndSchema.optional(), bEnd: blockEndSchema.optional() });

export const locomotiveSchema = z.object({
  id,
  name,
  runningAmps: zeroTo(100),
  stallAmps: zeroTo(100),
  ratedVolts: upTo(100),
  /** Calibration: the average voltage below which the locomotive does not move, V (below ratedVolts). */
  startVolts: zeroTo(100).nullable().optional(),
  /** Calibration: scale top speed at ratedVolts, km/h. */
  topSpeedKmh: upTo(1000).nullable().optional(),
});

/** A consist: one to sixteen locomotives; `noun` is the word the interchange version uses. */
const consistOf = (noun: string) => z.array(id).min(1, `a train needs at least one ${noun}`).max(16, `a train has at most 16 ${noun}s`);

export const trainSchema = z.object({
  id,
  name,
  locomotiveIds: consistOf('locomotive'),
  lightingAmps: zeroTo(100),
  lengthMm: upTo(100_000),
  /** Scale km/h gained per second from a stand (motion.ts defaultRamps gives common practice). */
  accelKmhPerS: upTo(1000).optional(),
  /** Scale km/h lost per second when stopping. */
  brakingKmhPerS: upTo(1000).optional(),
});

export const operatorSchema = z.object({ id, name });

/**
 * A run's time in one block. `fromEnd` and `toEnd` give the direction of travel: the train comes in
 * at `fromEnd` and leaves (or stops facing) `toEnd`; the same end twice means it reverses in the
 * block. Absent: derived from the route (see travelOfRun).
 */
export const stepSchema = z.object({
  blockId: id,
  enterS: seconds,
  exitS: seconds,
  fromEnd: blockEndSchema.optional(),
  toEnd: blockEndSchema.optional(),
});

export const runSchema = z.object({
  id,
  trainId: id,
  cabId: id,
  operatorId: id.nullable(),
  departS: seconds,
  arriveS: seconds,
  steps: z
    .array(stepSchema)
    .min(1, 'a run needs at least one step')
    .max(PLAN_LIMITS.stepsPerRun, `a run has at most ${PLAN_LIMITS.stepsPerRun} steps`),
});

const planFields = {
  scale: scaleSchema,
  clock: clockSchema,
  rules: rulesSchema,
  supplies: listOf(supplySchema),
  drivers: listOf(driverSchema),
  cabs: listOf(cabSchema),
  blocks: listOf(blockSchema),
  links: listOf(linkSchema, 2 * PLAN_LIMITS.things),
  operators: listOf(operatorSchema),
  runs: listOf(runSchema, PLAN_LIMITS.runs),
  /**
   * When the session ends, real seconds from its start: every train holds the block it last
   * stopped in until then. Absent: the latest time in the plan.
   */
  sessionEndS: seconds.optional(),
};

/** Version 1 of the interchange (still read): `locos`, trains' `locoIds`, ramps optional. */
const trainSchemaV1 = trainSchema.omit({ locomotiveIds: true }).extend({ locoIds: consistOf('loco') });
const planShapeV1 = z.object({ version: z.literal(1), ...planFields, locos: listOf(locomotiveSchema), trains: listOf(trainSchemaV1) });

/** Version 2: one name per concept (`locomotives`, `locomotiveIds`), and every train's ramps. */
export const trainSchemaV2 = trainSchema.extend({ accelKmhPerS: upTo(1000), brakingKmhPerS: upTo(1000) });
const planShapeV2 = z.object({ version: z.literal(2), ...planFields, locomotives: listOf(locomotiveSchema), trains: listOf(trainSchemaV2) });

/**
 * The engine's model of a plan: version 2's field names (`locomotives`, `locomotiveIds`), and
 * `version` saying which interchange version it was read from. Plans built in code may leave a
 * train's ramps out (it reaches its speed at once); plans read by planSchema always carry them.
 */
type PlanShape = Omit<z.infer<typeof planShapeV2>, 'version' | 'trains'> & { version: 1 | 2; trains: z.infer<typeof trainSchema>[] };
type IssuePath = (string | number)[];
/** The interchange as written, version 2. */
export type PlanJson = z.infer<typeof planShapeV2>;

/**
 * Version 1 read as the model: its names become version 2's, and every train without ramps gets
 * the common-practice figures for the plan's scale (defaultRamps): version 1 plans were timed at
 * constant speed, but the trains they describe do not stop at once.
 */
function upgradeV1(plan: z.infer<typeof planShapeV1>): PlanShape {
  const { locos, trains, ...rest } = plan;
  const ramps = defaultRamps(plan.scale.ratio);
  return {
    ...rest,
    locomotives: locos,
    trains: trains.map(({ locoIds, ...train }) => ({
      ...train,
      locomotiveIds: locoIds,
      accelKmhPerS: train.accelKmhPerS ?? ramps.accelKmhPerS,
      brakingKmhPerS: train.brakingKmhPerS ?? ramps.brakingKmhPerS,
    })),
  };
}

/** The model as interchange version 2 (what every export writes); trains without ramps get defaultRamps. */
export function toPlanJson(plan: PlanShape): PlanJson {
  const { version: _version, ...rest } = plan;
  const ramps = defaultRamps(plan.scale.ratio);
  return {
    version: 2,
    ...rest,
    trains: plan.trains.map((train) => ({
      ...train,
      accelKmhPerS: train.accelKmhPerS ?? ramps.accelKmhPerS,
      brakingKmhPerS: train.brakingKmhPerS ?? ramps.brakingKmhPerS,
    })),
  };
}

/** The words a reference issue uses: each interchange version names the locomotive its own way. */
type PlanWords = { locomotive: string; locomotives: string; locomotiveIds: string };
const V1_WORDS: PlanWords = { locomotive: 'loco', locomotives: 'locos', locomotiveIds: 'locoIds' };
const V2_WORDS: PlanWords = { locomotive: 'locomotive', locomotives: 'locomotives', locomotiveIds: 'locomotiveIds' };

/**
 * The plan interchange: version 2, or version 1 (upgraded, see upgradeV1), told apart by
 * `version`. The object shape checks each field on its own; the refinement checks what needs the
 * whole plan: unique ids, references that resolve, channel numbers, and the time order inside
 * each run. The result is the engine's model (PlanShape): version 2's field names, either version;
 * issues name the fields and words of the version read.
 */
export const planSchema = z
  .discriminatedUnion('version', [planShapeV1, planShapeV2], { error: 'version must be 1 or 2' })
  .transform((plan): PlanShape => (plan.version === 2 ? plan : upgradeV1(plan)))
  .superRefine((plan, ctx) => {
    const report = (path: IssuePath, message: string) => ctx.addIssue({ code: 'custom', path, message });
    const steps = plan.runs.reduce((sum, run) => sum + run.steps.length, 0);
    if (steps > PLAN_LIMITS.steps) {
      report(['runs'], `the runs have ${steps} steps in all; a plan holds at most ${PLAN_LIMITS.steps}`);
      return;
    }
    checkPlanReferences(plan, plan.version === 2 ? V2_WORDS : V1_WORDS, report);
  });

export type Plan = PlanShape;
export type Scale = Plan['scale'];
export type FastClock = Plan['clock'];
export type Rules = Plan['rules'];
export type Supply = Plan['supplies'][number];
export type Driver = Plan['drivers'][number];
export type Cab = Plan['cabs'][number];
export type Block = Plan['blocks'][number];
export type Link = Plan['links'][number];
export type BlockEnd = z.infer<typeof blockEndSchema>;
export type Locomotive = Plan['locomotives'][number];
export type Train = Plan['trains'][number];
export type Operator = Plan['operators'][number];
export type Run = Plan['runs'][number];
export type Step = Run['steps'][number];

function indexIds(
  list: readonly { id: string }[],
  listName: string,
  noun: string,
  report: (path: IssuePath, message: string) => void,
): Map<string, number> {
  const index = new Map<string, number>();
  list.forEach((item, i) => {
    const first = index.get(item.id);
    if (first === undefined) index.set(item.id, i);
    else report([listName, i, 'id'], `duplicate ${noun} id "${item.id}" (also ${listName}[${first}])`);
  });
  return index;
}

function checkPlanReferences(plan: PlanShape, words: PlanWords, report: (path: IssuePath, message: string) => void): void {
  const supplies = indexIds(plan.supplies, 'supplies', 'supply', report);
  const drivers = indexIds(plan.drivers, 'drivers', 'driver', report);
  const cabs = indexIds(plan.cabs, 'cabs', 'cab', report);
  const blocks = indexIds(plan.blocks, 'blocks', 'block', report);
  const locomotives = indexIds(plan.locomotives, words.locomotives, words.locomotive, report);
  const trains = indexIds(plan.trains, 'trains', 'train', report);
  const operators = indexIds(plan.operators, 'operators', 'operator', report);
  indexIds(plan.runs, 'runs', 'run', report);

  plan.drivers.forEach((driver, i) => {
    if (!supplies.has(driver.supplyId)) report(['drivers', i, 'supplyId'], `unknown supply "${driver.supplyId}"`);
    if (driver.drop === undefined && driver.dropVolts === undefined) report(['drivers', i, 'drop'], 'give the bridge drop (drop or dropVolts)');
    const drop = driver.drop;
    if (drop !== undefined && (drop.min.fixedVolts > drop.max.fixedVolts || drop.min.ohms > drop.max.ohms)) {
      report(['drivers', i, 'drop'], 'the minimum drop line must lie at or below the maximum one');
    }
  });

  plan.locomotives.forEach((locomotive, i) => {
    if (locomotive.startVolts !== undefined && locomotive.startVolts !== null && !(locomotive.startVolts < locomotive.ratedVolts)) {
      report([words.locomotives, i, 'startVolts'], `start voltage ${locomotive.startVolts} V must be below the rated ${locomotive.ratedVolts} V`);
    }
  });

  const channelTaken = new Map<string, string>();
  plan.cabs.forEach((cab, i) => {
    const driverIndex = drivers.get(cab.driverId);
    if (driverIndex === undefined) {
      report(['cabs', i, 'driverId'], `unknown driver "${cab.driverId}"`);
      return;
    }
    const driver = plan.drivers[driverIndex]!;
    if (cab.channel > driver.channels) {
      report(['cabs', i, 'channel'], `channel ${cab.channel} is outside 1..${driver.channels} of driver "${driver.id}"`);
      return;
    }
    // A NUL separator cannot occur in a JSON-typed id without being escaped, so keys cannot collide.
    const key = `${cab.driverId}\u0000${cab.channel}`;
    const holder = channelTaken.get(key);
    if (holder !== undefined) {
      report(['cabs', i, 'channel'], `channel ${cab.channel} of driver "${cab.driverId}" is already cab "${holder}"`);
    } else {
      channelTaken.set(key, cab.id);
    }
  });

  plan.links.forEach((link, i) => {
    if (!blocks.has(link.a)) report(['links', i, 'a'], `unknown block "${link.a}"`);
    if (!blocks.has(link.b)) report(['links', i, 'b'], `unknown block "${link.b}"`);
  });

  plan.trains.forEach((train, i) => {
    const seen = new Set<string>();
    train.locomotiveIds.forEach((locomotiveId, j) => {
      const path = ['trains', i, words.locomotiveIds, j];
      if (!locomotives.has(locomotiveId)) report(path, `unknown ${words.locomotive} "${locomotiveId}"`);
      // One locomotive cannot be coupled into the same consist twice; counting it twice would double its current.
      else if (seen.has(locomotiveId)) report(path, `${words.locomotive} "${locomotiveId}" is already in this train`);
      seen.add(locomotiveId);
    });
  });

  plan.runs.forEach((run, i) => {
    if (!trains.has(run.trainId)) report(['runs', i, 'trainId'], `unknown train "${run.trainId}"`);
    if (!cabs.has(run.cabId)) report(['runs', i, 'cabId'], `unknown cab "${run.cabId}"`);
    if (run.operatorId !== null && !operators.has(run.operatorId)) {
      report(['runs', i, 'operatorId'], `unknown operator "${run.operatorId}"`);
    }
    if (!(run.departS < run.arriveS)) {
      report(['runs', i, 'arriveS'], `arriveS ${run.arriveS} must be after departS ${run.departS}`);
    }
    run.steps.forEach((step, j) => {
      if (!blocks.has(step.blockId)) report(['runs', i, 'steps', j, 'blockId'], `unknown block "${step.blockId}"`);
      if (!(step.enterS < step.exitS)) {
        report(['runs', i, 'steps', j, 'exitS'], `exitS ${step.exitS} must be after enterS ${step.enterS}`);
      }
      const previous = run.steps[j - 1];
      if (previous !== undefined && step.enterS < previous.enterS) {
        report(
          ['runs', i, 'steps', j, 'enterS'],
          `steps must be sorted by enterS: ${step.enterS} comes after ${previous.enterS}`,
        );
      }
    });
    const first = run.steps[0];
    const last = run.steps[run.steps.length - 1];
    if (first !== undefined && first.enterS > run.departS) {
      report(
        ['runs', i, 'steps', 0, 'enterS'],
        `the first step must begin no later than departS ${run.departS}, not at ${first.enterS}`,
      );
    }
    if (last !== undefined && last.exitS < run.arriveS) {
      report(
        ['runs', i, 'steps', run.steps.length - 1, 'exitS'],
        `the last step must end no earlier than arriveS ${run.arriveS}, not at ${last.exitS}`,
      );
    }
  });
}

/** Writes a zod issue path the way a reader finds the field: `runs[3].steps[0].blockId`. */
export function formatIssuePath(path: readonly PropertyKey[]): string {
  let text = '';
  for (const key of path) {
    if (typeof key === 'number') text += `[${key}]`;
    else if (typeof key === 'string') text += text === '' ? key : `.${key}`;
    else text += `[${String(key)}]`;
  }
  return text;
}

/**
 * One line per issue, `path: message`, for example `runs[3].cabId: unknown cab "c9"`. Issues on the
 * plan as a whole (an empty path) are written as the message alone.
 */
export function formatPlanIssues(error: { issues: readonly { path: readonly PropertyKey[]; message: string }[] }): string[] {
  return error.issues.map((issue) => {
    const path = formatIssuePath(issue.path);
    return path === '' ? issue.message : `${path}: ${issue.message}`;
  });
}
