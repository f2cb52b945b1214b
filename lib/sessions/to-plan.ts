import { planDriverElectrics } from '@/lib/layouts/driver-electrics';
import { planBlockOf, planLinkOf, stepEndsOf } from '@/lib/layouts/track-rows';
import { defaultRamps, type Plan, type Ramps } from '@/lib/planning';
import type { loadLayoutRows, loadSessionRows } from '@/db/queries/plan-data';

type LayoutRows = ReturnType<typeof loadLayoutRows>;
type SessionRows = NonNullable<ReturnType<typeof loadSessionRows>>;

/** A layout's rows as the engine's model of a plan (toPlanJson writes it as the interchange), with no runs. */
export function layoutToPlan(rows: LayoutRows, extra: Pick<Plan, 'clock' | 'rules'> & { operators?: Plan['operators'] }): Plan {
  const layout = rows.layout;
  if (!layout) throw new Error('layoutToPlan: layout rows without a layout');
  const locomotivesOf = new Map<string, string[]>();
  for (const c of rows.consists) locomotivesOf.set(c.trainId, [...(locomotivesOf.get(c.trainId) ?? []), c.locomotiveId]);
  return {
    version: 1,
    scale: { name: layout.scaleName, ratio: layout.scaleRatio },
    clock: extra.clock,
    rules: extra.rules,
    supplies: rows.supplies.map((s) => ({ id: s.id, name: s.name, volts: s.volts, amps: s.amps })),
    drivers: rows.drivers.map((d) => ({
      id: d.id,
      name: d.name,
      supplyId: d.supplyId,
      channels: d.channels,
      channelAmps: d.channelAmps,
      channelPeakAmps: d.channelPeakAmps,
      totalAmps: d.totalAmps,
      ...planDriverElectrics(d),
    })),
    cabs: rows.cabs.map((c) => ({ id: c.id, name: c.name, driverId: c.driverId, channel: c.channel })),
    blocks: rows.blocks.map(planBlockOf),
    links: rows.links.map(planLinkOf),
    locomotives: rows.locomotives.map((l) => ({
      id: l.id,
      name: l.name,
      runningAmps: l.runningAmps,
      stallAmps: l.stallAmps,
      ratedVolts: l.ratedVolts,
      startVolts: l.startVolts,
      topSpeedKmh: l.topSpeedKmh,
    })),
    // A train without locomotives cannot be in a valid plan; the rolling-stock screens refuse to
    // save one, so none should reach here.
    trains: rows.trains.map((tr) => ({
      id: tr.id,
      name: tr.name,
      locomotiveIds: locomotivesOf.get(tr.id) ?? [],
      lightingAmps: tr.lightingAmps,
      lengthMm: tr.lengthMm,
      ...trainRamps(tr, layout.scaleRatio),
    })),
    operators: extra.operators ?? [],
    runs: [],
  };
}

/** A stored session as the engine's model of a plan. */
export function sessionToPlan(rows: SessionRows): Plan {
  const stepsOf = new Map<string, Plan['runs'][number]['steps']>();
  for (const s of rows.steps) {
    const list = stepsOf.get(s.runId) ?? [];
    list.push({ blockId: s.blockId, enterS: s.enterS, exitS: s.exitS, ...stepEndsOf(s) });
    stepsOf.set(s.runId, list);
  }
  const base = layoutToPlan(rows, {
    clock: { ratio: rows.session.clockRatio, fastStart: rows.session.fastStart },
    rules: { headwayS: rows.session.headwayS, surgeS: rows.session.surgeS, derate: rows.session.derate },
    operators: rows.operators,
  });
  return {
    ...base,
    // Every train holds the block it last stopped in until the session ends.
    sessionEndS: (rows.session.endsAt.getTime() - rows.session.startsAt.getTime()) / 1000,
    runs: rows.runs.map((r) => ({
      id: r.id,
      trainId: r.trainId,
      cabId: r.cabId,
      operatorId: r.operatorId,
      departS: r.departS,
      arriveS: r.arriveS,
      steps: stepsOf.get(r.id) ?? [],
    })),
  };
}

/** A stored train's ramps: its own, or the common-practice default for the layout's scale where blank. */
export function trainRamps(train: { accelKmhPerS: number | null; brakingKmhPerS: number | null }, scaleRatio: number): Ramps {
  const fallback = defaultRamps(scaleRatio);
  return { accelKmhPerS: train.accelKmhPerS ?? fallback.accelKmhPerS, brakingKmhPerS: train.brakingKmhPerS ?? fallback.brakingKmhPerS };
}
