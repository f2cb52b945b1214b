import 'server-only';
import { z } from 'zod';
import type { LayoutImport } from '@/db/queries/layout-import';
import type { loadLayoutRows } from '@/db/queries/plan-data';
import { AppError, type Issue } from '@/lib/errors';
import { defaultRules, formatIssuePath, linkEnds, planSchema, toPlanJson, type PlanJson } from '@/lib/planning';
import { storedDriverElectrics } from '@/lib/layouts/driver-electrics';
import { layoutToPlan } from '@/lib/sessions/to-plan';
import { blockSchema, cabSchema, driverSchema, inScaleRange, locomotiveSchema, SCALE_RATIO_MESSAGE, supplySchema, trainSchema } from '@/lib/validations/layout';

type LayoutRows = ReturnType<typeof loadLayoutRows>;

/**
 * A layout has no clock of its own; its plan carries real time (1:1 from 00:00) and the default
 * rules, which a session replaces with its own.
 */
export const EXPORT_CLOCK = { ratio: 1, fastStart: '00:00' } as const;

/**
 * Fields Fishplate keeps beside the interchange's own: the engine's schema ignores keys it does not
 * know, so a plan with them is still a valid plan, and an export imports back whole. `locos` is
 * version 1's name for version 2's `locomotives`.
 */
const extras = z.object({
  layout: z.object({ name: z.string().optional(), setting: z.enum(['indoor', 'outdoor']).optional(), notes: z.string().optional() }).optional(),
  blocks: z.array(z.object({ positionMm: z.number().min(0).optional() })),
  drivers: z.array(z.object({ presetId: z.string().nullable().optional(), partNumber: z.string().nullable().optional() })),
  // Older exports carried the top speed here; the plan's locomotives now carry it themselves.
  locos: z.array(z.object({ topSpeedKmh: z.number().nullable().optional() })).optional(),
  locomotives: z.array(z.object({ topSpeedKmh: z.number().nullable().optional() })).optional(),
});

/** The layout as the engine's plan interchange, version 2, without runs, with Fishplate's extras. */
export function exportLayoutPlan(rows: LayoutRows): PlanJson & Record<string, unknown> {
  const layout = rows.layout;
  if (!layout) throw new Error('exportLayoutPlan: no layout');
  const plan = toPlanJson(layoutToPlan(rows, { clock: { ...EXPORT_CLOCK }, rules: { ...defaultRules } }));
  const block = new Map(rows.blocks.map((b) => [b.id, b]));
  const driver = new Map(rows.drivers.map((d) => [d.id, d]));
  return {
    ...plan,
    layout: { name: layout.name, setting: layout.setting, notes: layout.notes },
    blocks: plan.blocks.map((b) => ({ ...b, positionMm: block.get(b.id)?.positionMm ?? 0 })),
    drivers: plan.drivers.map((d) => ({ ...d, presetId: driver.get(d.id)?.presetId ?? null, partNumber: driver.get(d.id)?.partNumber ?? null })),
  };
}

function fail(issues: Issue[]): never {
  const first = issues[0]!;
  throw new AppError('bad_request', `The plan cannot be imported: ${first.path ? `${first.path}: ` : ''}${first.message}${issues.length > 1 ? ` (and ${issues.length - 1} more)` : ''}`, {
    issues: issues.slice(0, 50),
  });
}

/**
 * Turns a plan file into a new layout's rows, checking it with the engine's schema first and then
 * with the same rules as the forms (names, bounds, unique names, channels). Runs are not imported:
 * a layout holds no timetable. Answers the rows and how many runs were left out.
 */
export function planToImport(input: unknown, name: string | undefined): { data: LayoutImport; skippedRuns: number } {
  const parsed = planSchema.safeParse(input);
  if (!parsed.success) fail(parsed.error.issues.map((i) => ({ path: formatIssuePath(i.path), message: i.message })));
  const plan = parsed.data;
  const extra = extras.safeParse(input);
  if (!extra.success) fail(extra.error.issues.map((i) => ({ path: formatIssuePath(i.path), message: i.message })));
  const ext = extra.data;

  const issues: Issue[] = [];
  const check = <S extends z.ZodType>(schema: S, value: unknown, at: string): z.infer<S> | null => {
    const r = schema.safeParse(value);
    if (r.success) return r.data;
    for (const i of r.error.issues) issues.push({ path: `${at}.${formatIssuePath(i.path)}`, message: i.message });
    return null;
  };
  const unique = (list: readonly { name: string }[], scope: string) => {
    const seen = new Map<string, number>();
    list.forEach((item, i) => {
      const key = item.name.trim().toLowerCase();
      const first = seen.get(key);
      if (first !== undefined) issues.push({ path: `${scope}[${i}].name`, message: `the name “${item.name}” is also ${scope}[${first}]; names must be unique` });
      else seen.set(key, i);
    });
  };
  // Issues name the fields of the version read: version 1 calls the locomotives `locos`.
  const locomotivesPath = plan.version === 2 ? 'locomotives' : 'locos';
  for (const scope of ['blocks', 'supplies', 'drivers', 'cabs', 'trains'] as const) unique(plan[scope], scope);
  unique(plan.locomotives, locomotivesPath);
  // The same range as the layout form: a ratio of 1e308 once timed every run to hours beyond any session.
  if (!inScaleRange(plan.scale.ratio)) issues.push({ path: 'scale.ratio', message: SCALE_RATIO_MESSAGE });

  const blocks = plan.blocks.map((b, i) => {
    const v = check(blockSchema, { name: b.name, length: b.lengthMm, unit: 'mm', position: ext.blocks[i]?.positionMm ?? 0 }, `blocks[${i}]`);
    // Wiring and reversing flags come from the plan itself (absent: the defaults).
    return v && { ...v, positiveRail: b.positiveRail ?? 'right', reversingSection: b.reversingSection ?? false, reversingPlace: b.reversingPlace ?? false, key: b.id };
  });
  // One link per rail joint: a balloon loop joins one end to both ends of a block, so pairs may repeat.
  const seenJoints = new Set<string>();
  plan.links.forEach((l, i) => {
    const { aEnd, bEnd } = linkEnds(l);
    const key = [`${l.a}\u0000${aEnd}`, `${l.b}\u0000${bEnd}`].sort().join('\u0001');
    if (l.a === l.b) issues.push({ path: `links[${i}]`, message: 'a block cannot link to itself' });
    else if (seenJoints.has(key)) issues.push({ path: `links[${i}]`, message: 'these two block ends are already linked' });
    seenJoints.add(key);
  });
  const supplies = plan.supplies.map((s, i) => {
    const v = check(supplySchema, { name: s.name, volts: s.volts, amps: s.amps }, `supplies[${i}]`);
    return v && { ...v, key: s.id };
  });
  const drivers = plan.drivers.map((d, i) => {
    const presetId = ext.drivers[i]?.presetId ?? null;
    const v = check(driverSchema, { ...d, ...storedDriverElectrics(d), presetId, partNumber: ext.drivers[i]?.partNumber ?? null }, `drivers[${i}]`);
    return v && { ...v, key: d.id };
  });
  const cabs = plan.cabs.map((c, i) => {
    const v = check(cabSchema, { name: c.name, driverId: c.driverId, channel: c.channel }, `cabs[${i}]`);
    return v && { ...v, key: c.id };
  });
  const locomotives = plan.locomotives.map((l, i) => {
    const top = l.topSpeedKmh ?? (ext.locomotives ?? ext.locos)?.[i]?.topSpeedKmh ?? undefined;
    if (top === undefined) {
      issues.push({ path: `${locomotivesPath}[${i}].topSpeedKmh`, message: 'missing: Fishplate needs each locomotive’s top scale speed (km/h) to work out PWM duty' });
      return null;
    }
    const v = check(locomotiveSchema, { name: l.name, runningAmps: l.runningAmps, stallAmps: l.stallAmps, ratedVolts: l.ratedVolts, topSpeedKmh: top, startVolts: l.startVolts ?? null }, `${locomotivesPath}[${i}]`);
    return v && { ...v, key: l.id };
  });
  const trains = plan.trains.map((tr, i) => {
    const v = check(
      trainSchema,
      { name: tr.name, locomotiveIds: tr.locomotiveIds, lightingAmps: tr.lightingAmps, length: tr.lengthMm, unit: 'mm', accelKmhPerS: tr.accelKmhPerS ?? null, brakingKmhPerS: tr.brakingKmhPerS ?? null },
      `trains[${i}]`,
    );
    return v && { ...v, key: tr.id };
  });
  if (issues.length) fail(issues);

  const layoutName = name?.trim() || ext.layout?.name?.trim() || 'Imported layout';
  return {
    data: {
      layout: {
        name: layoutName.slice(0, 80),
        scaleName: plan.scale.name.trim().slice(0, 40) || `1:${plan.scale.ratio}`,
        scaleRatio: plan.scale.ratio,
        setting: ext.layout?.setting ?? 'indoor',
        notes: (ext.layout?.notes ?? '').slice(0, 4000),
      },
      blocks: blocks.filter((b) => b !== null),
      links: plan.links.map((l) => ({ a: l.a, b: l.b, ...linkEnds(l) })),
      supplies: supplies.filter((s) => s !== null),
      drivers: drivers.filter((d) => d !== null),
      cabs: cabs.filter((c) => c !== null),
      locomotives: locomotives.filter((l) => l !== null),
      trains: trains.filter((tr) => tr !== null),
    },
    skippedRuns: plan.runs.length,
  };
}
