import { z } from 'zod';
import { DRIVER_PRESETS, SCALES } from '@/lib/planning';
import { LENGTH_UNITS, toMm, type LengthUnit } from '@/lib/layouts/units';

// Shared by the forms (through zodResolver), the server actions, the CSV import and the route
// handlers. Inputs arrive as text (forms, CSV cells) or numbers (JSON); both are accepted.

const NUMBER_TEXT = /^[-+]?(\d+([.,]\d*)?|[.,]\d+)([eE][-+]?\d+)?$/;

/** Text or number → number; blank → undefined (so "required" and "optional" read clearly). */
function toNumber(value: unknown): unknown {
  if (typeof value !== 'string') return value ?? undefined;
  const text = value.trim();
  if (text === '') return undefined;
  return NUMBER_TEXT.test(text) ? Number(text.replace(',', '.')) : Number.NaN;
}

const numberMessage = (issue: { input?: unknown }) =>
  issue.input === undefined ? 'Enter a number.' : 'Enter a number, like 12 or 0.5.';

/** A required number from text or JSON, with bounds and a unit for the messages. */
function number(opts: { min?: number; gt?: number; max: number; unit?: string; int?: boolean }) {
  const u = opts.unit ? ` ${opts.unit}` : '';
  let n = z.number({ error: numberMessage });
  if (opts.int) n = n.int('Enter a whole number.');
  if (opts.gt !== undefined) n = n.gt(opts.gt, `Must be more than ${opts.gt}${u}.`);
  if (opts.min !== undefined) n = n.min(opts.min, `Must be ${opts.min}${u} or more.`);
  n = n.max(opts.max, `Must be ${opts.max}${u} or less.`);
  return z.preprocess(toNumber, n);
}

/** The same number, where a blank means `fallback`. */
function numberOr(fallback: number, opts: Parameters<typeof number>[0]) {
  return z.preprocess((v) => {
    const n = toNumber(v);
    return n === undefined ? fallback : n;
  }, number(opts));
}

/** The same number, where a blank means "none" (null). */
function numberOrNull(opts: Parameters<typeof number>[0]) {
  return z.preprocess((v) => toNumber(v) ?? null, number(opts).nullable());
}

const text = (v: unknown) => (v === null || v === undefined ? '' : String(v));

/** A name shown in lists: trimmed, 1–80 characters. */
export const entityName = z.preprocess(
  text,
  z.string().trim().min(1, 'Enter a name.').max(80, 'Use at most 80 characters.'),
);

/** Locomotive names: `;` separates the locomotives of a consist in CSV files, so it is not allowed. */
export const locomotiveName = entityName.pipe(
  z.string().refine((v) => !v.includes(';'), 'Semicolons separate locomotives in CSV files; use another character.'),
);

const rowId = z.preprocess(text, z.string().min(1, 'Choose one.').max(100, 'That id is not valid.'));
const version = z.preprocess(toNumber, z.number({ error: 'The version seen is missing.' }).int().min(1));

export const lengthUnitSchema = z.preprocess(
  (v) => (typeof v === 'string' ? v.trim().toLowerCase() : v),
  z.enum(LENGTH_UNITS, { error: `Choose a unit: ${LENGTH_UNITS.join(', ')}.` }),
);

// Longest block or train: 1 km of model track, far above any layout, low enough to catch a slip of units.
const MAX_LENGTH_MM = 1_000_000;

/** A length typed in a unit, checked after conversion to mm (the bound is in mm). */
function lengthIn(unit: LengthUnit, value: number, ctx: z.RefinementCtx, path: string) {
  const mm = toMm(value, unit);
  if (mm > MAX_LENGTH_MM) ctx.addIssue({ code: 'custom', path: [path], message: 'Must be at most 1 000 m (1 000 000 mm).' });
  // Rounded to 0.001 mm, a positive length typed in a large unit can come out as 0.
  if (!(mm > 0)) ctx.addIssue({ code: 'custom', path: [path], message: 'Must be more than 0.' });
  return mm;
}

// ---- Layouts --------------------------------------------------------------------------------------

export const CUSTOM_SCALE = 'custom';
const scaleIds = SCALES.map((s) => s.id) as [string, ...string[]];

export const layoutFields = z.object({
  name: entityName,
  scaleId: z.preprocess(text, z.enum([...scaleIds, CUSTOM_SCALE], { error: 'Choose a scale, or “Own ratio”.' })),
  customScaleName: z.preprocess(text, z.string().trim().max(40, 'Use at most 40 characters.')),
  customRatio: z.preprocess((v) => toNumber(v) ?? null, z.number({ error: numberMessage }).nullable()),
  setting: z.preprocess(text, z.enum(['indoor', 'outdoor'], { error: 'Choose indoor or outdoor.' })),
  notes: z.preprocess(text, z.string().max(4000, 'Use at most 4 000 characters.')),
});
type LayoutFields = z.infer<typeof layoutFields>;

/** Scale ratios a layout may have: 1:1 to 1:1000, around the scale table (Z, 1:220, is its smallest). */
export const SCALE_RATIO_RANGE = { min: 1, max: 1000 } as const;
export const SCALE_RATIO_MESSAGE = 'Use a ratio from 1 to 1000 (1:1 to 1:1000).';
export const inScaleRange = (ratio: number) => ratio >= SCALE_RATIO_RANGE.min && ratio <= SCALE_RATIO_RANGE.max;

function checkCustomScale(v: LayoutFields, ctx: z.RefinementCtx) {
  if (v.scaleId !== CUSTOM_SCALE) return;
  if (!v.customScaleName) ctx.addIssue({ code: 'custom', path: ['customScaleName'], message: 'Name your scale.' });
  if (v.customRatio === null) ctx.addIssue({ code: 'custom', path: ['customRatio'], message: 'Enter the ratio, e.g. 87 for 1:87.' });
  else if (!inScaleRange(v.customRatio)) ctx.addIssue({ code: 'custom', path: ['customRatio'], message: SCALE_RATIO_MESSAGE });
}

/** A layout's fields as stored: the scale's label and ratio from the scale table, or the planner's own. */
function toLayout(v: LayoutFields) {
  const scale = SCALES.find((s) => s.id === v.scaleId);
  return {
    name: v.name,
    scaleName: scale ? scale.label : v.customScaleName,
    scaleRatio: scale ? scale.ratio : (v.customRatio ?? 0),
    setting: v.setting,
    notes: v.notes,
  };
}

export const layoutSchema = layoutFields.superRefine(checkCustomScale).transform(toLayout);
export const layoutEditSchema = layoutFields
  .extend({ version })
  .superRefine(checkCustomScale)
  .transform((v) => ({ ...toLayout(v), version: v.version }));

/** The scale-table row a stored layout uses, or "custom". */
export function scaleIdOf(layout: { scaleName: string; scaleRatio: number }): string {
  const row =
    SCALES.find((s) => s.label === layout.scaleName) ??
    SCALES.find((s) => s.name === layout.scaleName && s.ratio === layout.scaleRatio);
  return row?.id ?? CUSTOM_SCALE;
}

// ---- Blocks and links ---------------------------------------------------------------------------

const yesNo = z.enum(['no', 'yes'], 'must be yes or no');

export const blockFields = z.object({
  name: entityName,
  length: number({ gt: 0, max: MAX_LENGTH_MM }),
  position: numberOr(0, { min: 0, max: MAX_LENGTH_MM * 10 }),
  unit: lengthUnitSchema,
  /** Which rail the cab's positive feeder goes to, looking towards the block's b end (NEM 631 2.3). Absent: unchanged. */
  positiveRail: z.enum(['right', 'left'], 'must be right or left').optional(),
  /** Has its own polarity switch (a reversing section). Absent: unchanged. */
  reversingSection: yesNo.optional(),
  /** Trains may turn round here in the middle of a run. Absent: unchanged. */
  reversingPlace: yesNo.optional(),
});

const toBlock = (v: z.infer<typeof blockFields>, ctx: z.RefinementCtx) => ({
  name: v.name,
  lengthMm: lengthIn(v.unit, v.length, ctx, 'length'),
  positionMm: toMm(v.position, v.unit),
  ...(v.positiveRail !== undefined ? { positiveRail: v.positiveRail } : {}),
  ...(v.reversingSection !== undefined ? { reversingSection: v.reversingSection === 'yes' } : {}),
  ...(v.reversingPlace !== undefined ? { reversingPlace: v.reversingPlace === 'yes' } : {}),
});

/** A block as typed: name, length and position along the line in one unit; stored in mm. */
export const blockSchema = blockFields.transform(toBlock);
export const blockEditSchema = blockFields
  .extend({ id: rowId, version })
  .transform((v, ctx) => ({ id: v.id, version: v.version, ...toBlock(v, ctx) }));

const blockEnd = z.enum(['a', 'b'], 'must be the a end or the b end');

/** A rail joint: an end of one block meets an end of another (absent ends: the first's b end to the second's a end). */
export const linkSchema = z
  .object({ blockAId: rowId, blockBId: rowId, blockAEnd: blockEnd.default('b'), blockBEnd: blockEnd.default('a') })
  .refine((v) => v.blockAId !== v.blockBId, { path: ['blockBId'], message: 'A block cannot link to itself.' });

export const linkDeleteSchema = z.object({ id: rowId });

/** Deleting a versioned row names the version seen, like an edit. */
export const rowDeleteSchema = z.object({ id: rowId, version });

// ---- Power --------------------------------------------------------------------------------------

export const supplySchema = z.object({
  name: entityName,
  // Track supplies are low voltage; 60 V leaves room for any driver class in the presets (46 V max).
  volts: number({ gt: 0, max: 60, unit: 'V' }),
  amps: number({ gt: 0, max: 100, unit: 'A' }),
});
export const supplyEditSchema = supplySchema.extend({ id: rowId, version });

const presetIds = DRIVER_PRESETS.map((p) => p.id) as [string, ...string[]];

export const driverFields = z.object({
  name: entityName,
  supplyId: rowId,
  presetId: z.preprocess(
    (v) => (v === '' || v === undefined ? null : v),
    z.enum(presetIds, { error: 'Choose a preset from the list, or “Own ratings”.' }).nullable(),
  ),
  partNumber: z.preprocess(
    (v) => (typeof v === 'string' && v.trim() !== '' ? v.trim() : null),
    z.string().max(80, 'Use at most 80 characters.').nullable(),
  ),
  channels: number({ min: 1, max: 16, int: true }),
  channelAmps: number({ gt: 0, max: 50, unit: 'A' }),
  channelPeakAmps: number({ gt: 0, max: 100, unit: 'A' }),
  totalAmps: numberOrNull({ gt: 0, max: 200, unit: 'A' }),
  // Bridge drop against current: least line dropVolts + dropOhms × I; greatest line (blank: the same).
  dropVolts: number({ min: 0, max: 20, unit: 'V' }),
  dropOhms: numberOr(0, { min: 0, max: 20, unit: 'Ω' }),
  dropMaxVolts: numberOrNull({ min: 0, max: 20, unit: 'V' }),
  dropMaxOhms: numberOrNull({ min: 0, max: 20, unit: 'Ω' }),
  // How long the peak holds (blank: no pulse width given); datasheets give 100 µs to tens of ms.
  peakPulseMs: numberOrNull({ gt: 0, max: 60_000, unit: 'ms' }),
  // Package dissipation (blank: not checked); the heat-sunk module class is rated 25 W.
  packageWatts: numberOrNull({ gt: 0, max: 500, unit: 'W' }),
});

type DriverCheck = z.infer<typeof driverFields>;
const peakAtLeastContinuous = (v: DriverCheck) => v.channelPeakAmps >= v.channelAmps;
const peakMessage = { path: ['channelPeakAmps'], message: 'The peak rating cannot be below the continuous rating.' };
const maxDropAtLeastLeast = (v: DriverCheck) => (v.dropMaxVolts ?? v.dropVolts) >= v.dropVolts;
const maxDropMessage = { path: ['dropMaxVolts'], message: 'The worst-case drop cannot be below the least drop.' };
const maxOhmsAtLeastLeast = (v: DriverCheck) => (v.dropMaxOhms ?? v.dropOhms) >= v.dropOhms;
const maxOhmsMessage = { path: ['dropMaxOhms'], message: 'The worst-case resistance cannot be below the least.' };

export const driverSchema = driverFields
  .refine(peakAtLeastContinuous, peakMessage)
  .refine(maxDropAtLeastLeast, maxDropMessage)
  .refine(maxOhmsAtLeastLeast, maxOhmsMessage);
export const driverEditSchema = driverFields
  .extend({ id: rowId, version })
  .refine(peakAtLeastContinuous, peakMessage)
  .refine(maxDropAtLeastLeast, maxDropMessage)
  .refine(maxOhmsAtLeastLeast, maxOhmsMessage);

export const cabSchema = z.object({
  name: entityName,
  driverId: rowId,
  channel: number({ min: 1, max: 16, int: true }),
});
export const cabEditSchema = cabSchema.extend({ id: rowId, version });

// ---- Rolling stock ------------------------------------------------------------------------------

const stallAtLeastRunning = (v: { runningAmps: number; stallAmps: number }) => v.stallAmps >= v.runningAmps;
const stallMessage = { path: ['stallAmps'], message: 'Stall current cannot be below the running current.' };

export const locomotiveFields = z.object({
  name: locomotiveName,
  runningAmps: number({ min: 0, max: 20, unit: 'A' }),
  stallAmps: number({ min: 0, max: 40, unit: 'A' }),
  ratedVolts: number({ gt: 0, max: 60, unit: 'V' }),
  // Calibration: top speed at the rated voltage, and the voltage at which it starts to move (blank: not measured).
  topSpeedKmh: number({ gt: 0, max: 600, unit: 'km/h' }),
  startVolts: numberOrNull({ min: 0, max: 60, unit: 'V' }),
});
const startBelowRated = (v: { startVolts: number | null; ratedVolts: number }) => v.startVolts === null || v.startVolts < v.ratedVolts;
const startMessage = { path: ['startVolts'], message: 'The start voltage must be below the rated voltage.' };
export const locomotiveSchema = locomotiveFields.refine(stallAtLeastRunning, stallMessage).refine(startBelowRated, startMessage);
export const locomotiveEditSchema = locomotiveFields
  .extend({ id: rowId, version })
  .refine(stallAtLeastRunning, stallMessage)
  .refine(startBelowRated, startMessage);

const locomotiveIds = z.preprocess(
  (v) => (Array.isArray(v) ? v : typeof v === 'string' && v !== '' ? [v] : []),
  z
    .array(z.string().min(1).max(100))
    .min(1, 'A train needs at least one locomotive.')
    .max(12, 'Use at most 12 locomotives.')
    .refine((ids) => new Set(ids).size === ids.length, 'A locomotive can be in a consist once only.'),
);

export const trainFields = z.object({
  name: entityName,
  locomotiveIds,
  lightingAmps: numberOr(0, { min: 0, max: 20, unit: 'A' }),
  length: number({ gt: 0, max: MAX_LENGTH_MM }),
  unit: lengthUnitSchema,
  // Ramps in scale km/h per second; blank takes the scale's common-practice default (defaultRamps).
  accelKmhPerS: numberOrNull({ gt: 0, max: 100, unit: 'km/h per second' }),
  brakingKmhPerS: numberOrNull({ gt: 0, max: 100, unit: 'km/h per second' }),
});

const toTrain = (v: z.infer<typeof trainFields>, ctx: z.RefinementCtx) => ({
  name: v.name,
  locomotiveIds: v.locomotiveIds,
  lightingAmps: v.lightingAmps,
  lengthMm: lengthIn(v.unit, v.length, ctx, 'length'),
  accelKmhPerS: v.accelKmhPerS,
  brakingKmhPerS: v.brakingKmhPerS,
});

export const trainSchema = trainFields.transform(toTrain);
export const trainEditSchema = trainFields
  .extend({ id: rowId, version })
  .transform((v, ctx) => ({ id: v.id, version: v.version, ...toTrain(v, ctx) }));

// ---- Files --------------------------------------------------------------------------------------

export const CSV_TABLES = ['blocks', 'links', 'locomotives', 'trains'] as const;
export type CsvTable = (typeof CSV_TABLES)[number];
export const csvTableSchema = z.enum(CSV_TABLES, { error: `Choose a table: ${CSV_TABLES.join(', ')}.` });

/** CSV files are refused above these, before anything is parsed. */
export const CSV_MAX_BYTES = 1_000_000;
export const CSV_MAX_ROWS = 5_000;

/** Track-plan images: PNG, JPEG or WebP, checked by their bytes, up to 5 MB. */
export const IMAGE_MAX_BYTES = 5 * 1024 * 1024;

/** Reads a FormData into a plain object; keys listed in `arrays` keep every value. */
export function formToObject(formData: FormData, arrays: readonly string[] = []): Record<string, unknown> {
  const out: Record<string, unknown> = {};
  for (const key of new Set(formData.keys())) {
    const values = formData.getAll(key).map((v) => (typeof v === 'string' ? v : ''));
    out[key] = arrays.includes(key) ? values : values[0];
  }
  for (const key of arrays) out[key] ??= [];
  return out;
}
