import {
  channelWatts,
  defaultRules,
  dropAt,
  dutyFor,
  findDriverPreset,
  gaugeForScale,
  nominalTrackVolts,
  startAmps,
  surgeLimit,
  trackVoltsOf,
  trainAmps,
  AMPS_TOLERANCE,
  VOLTS_TOLERANCE,
  type DriverPreset,
} from '@/lib/planning';
import type { CabValues, DriverValues, SupplyValues } from '@/db/queries/layout-power';
import { planDriverElectrics, presetDriverValues, type DriverElectrics } from './driver-electrics';

// The power budget of a layout before any timetable: what each supply and driver could be asked to
// carry if every cab ran a train at once. Every figure is an input, a sum or product of inputs, or a
// value from the engine's cited tables (presets, NEM 630), and each result says how it was made.

export interface BudgetInput {
  scale: { name: string; ratio: number };
  /** Share of a supply's rating it may carry continuously (rules derate; 0.8 by default). */
  derate?: number;
  /** How long a start-up surge lasts, s (rules surgeS; 2 s by default). */
  surgeS?: number;
  supplies: (SupplyValues & { id: string })[];
  drivers: (DriverValues & { id: string })[];
  cabs: (CabValues & { id: string })[];
  locomotives: { id: string; name: string; runningAmps: number; stallAmps: number; ratedVolts: number; topSpeedKmh: number; startVolts?: number | null }[];
  trains: { id: string; name: string; locomotiveIds: string[]; lightingAmps: number; lengthMm: number }[];
}

export type Status = 'ok' | 'warning' | 'over';

/**
 * A train's current: lighting plus each locomotive's, running and at start (start-up surge: the stall
 * current scaled by the start voltage under a PWM ramp; the full stall current when not measured).
 */
export interface TrainLoad {
  id: string;
  name: string;
  runningAmps: number;
  surgeAmps: number;
  parts: { label: string; runningAmps: number; stallAmps: number; startAmps: number }[];
  /** The slowest locomotive's top speed: the consist cannot go faster. Null without locomotives. */
  topSpeedKmh: number | null;
}

/** A worst-case sum: which trains, and how much each adds. */
export interface WorstCase {
  amps: number;
  terms: { trainName: string; amps: number }[];
}

export interface SupplyBudget {
  id: string;
  name: string;
  volts: number;
  ratedAmps: number;
  derate: number;
  deratedAmps: number;
  cabCount: number;
  worstRunning: WorstCase;
  worstSurge: WorstCase;
  /** Running load against the derated figure; surge against the rating. */
  status: Status;
  headroomAmps: number;
  messages: string[];
}

export interface DriverBudget {
  id: string;
  name: string;
  supplyName: string;
  supplyVolts: number;
  preset: (Pick<DriverPreset, 'id' | 'label' | 'source' | 'note' | 'minSupplyVolts' | 'maxSupplyVolts'> & { edited: boolean }) | null;
  partNumber: string | null;
  channels: number;
  cabCount: number;
  channelAmps: number;
  channelPeakAmps: number;
  totalAmps: number | null;
  /** What a channel's surge is judged against (the peak while the surge fits its pulse width). */
  surgeLimitAmps: number;
  surgeJudgedContinuous: boolean;
  peakPulseMs: number | null;
  /** The bridge's greatest drop at the heaviest train (NMRA S-9 I.A: at maximum anticipated load). */
  dropVolts: number;
  /** Heat with one heaviest train per used channel, on the least and greatest drop lines, W. */
  heatLowWatts: number;
  heatHighWatts: number;
  packageWatts: number | null;
  /** The heaviest single train on one channel (a channel drives one train at a time). */
  channelRunning: WorstCase;
  channelSurge: WorstCase;
  worstRunning: WorstCase;
  worstSurge: WorstCase;
  trackVolts: number;
  nominalVolts: number | null;
  gaugeMm: number | null;
  status: Status;
  messages: string[];
}

export interface PowerBudget {
  derate: number;
  trains: TrainLoad[];
  supplies: SupplyBudget[];
  drivers: DriverBudget[];
}

/** Lighting plus every locomotive of the consist, running and at start (see startAmps). */
export function trainLoads(input: Pick<BudgetInput, 'locomotives' | 'trains'>): TrainLoad[] {
  const locomotiveOf = new Map(input.locomotives.map((l) => [l.id, l]));
  return input.trains.map((train) => {
    const locomotives = train.locomotiveIds.map((id) => locomotiveOf.get(id)).filter((l) => l !== undefined);
    const parts = [
      ...locomotives.map((l) => ({ label: l.name, runningAmps: l.runningAmps, stallAmps: l.stallAmps, startAmps: startAmps(l) })),
      ...(train.lightingAmps > 0
        ? [{ label: 'lighting', runningAmps: train.lightingAmps, stallAmps: train.lightingAmps, startAmps: train.lightingAmps }]
        : []),
    ];
    const amps = trainAmps(train.lightingAmps, locomotives);
    return {
      id: train.id,
      name: train.name,
      runningAmps: round(amps.runningAmps),
      surgeAmps: round(amps.startAmps),
      parts,
      topSpeedKmh: locomotives.length ? Math.min(...locomotives.map((l) => l.topSpeedKmh)) : null,
    };
  });
}

/**
 * The `k` largest of one current over distinct trains: k cabs running at once carry k different
 * trains (a train is on one cab at a time), so the worst case is the k heaviest. Trains sharing a
 * locomotive cannot really run together; counting them anyway only makes the figure safer.
 */
export function heaviest(loads: TrainLoad[], k: number, which: 'runningAmps' | 'surgeAmps'): WorstCase {
  const terms = [...loads]
    .sort((a, b) => b[which] - a[which] || a.name.localeCompare(b.name))
    .slice(0, Math.max(0, k))
    .map((l) => ({ trainName: l.name, amps: l[which] }));
  return { amps: round(terms.reduce((s, x) => s + x.amps, 0)), terms };
}

const a = (v: number) => `${round(v)} A`;
const w = (x: number) => `${Math.round(x * 100) / 100} W`;
const v = (x: number) => `${Math.round(x * 100) / 100} V`;
/** A warning, unless the status is already over. */
const atLeastWarning = (status: Status): Status => (status === 'over' ? 'over' : 'warning');

export function powerBudget(input: BudgetInput): PowerBudget {
  const derate = input.derate ?? defaultRules.derate;
  const loads = trainLoads(input);
  const gaugeMm = gaugeForScale(input.scale);
  const nominalVolts = gaugeMm === null ? null : nominalTrackVolts(gaugeMm);
  const supplyOf = new Map(input.supplies.map((s) => [s.id, s]));
  const driverOf = new Map(input.drivers.map((d) => [d.id, d]));
  const cabsOnDriver = new Map<string, number>();
  const cabsOnSupply = new Map<string, number>();
  for (const cab of input.cabs) {
    const driver = driverOf.get(cab.driverId);
    if (!driver) continue;
    cabsOnDriver.set(driver.id, (cabsOnDriver.get(driver.id) ?? 0) + 1);
    cabsOnSupply.set(driver.supplyId, (cabsOnSupply.get(driver.supplyId) ?? 0) + 1);
  }

  const supplies: SupplyBudget[] = input.supplies.map((s) => {
    const cabCount = cabsOnSupply.get(s.id) ?? 0;
    const deratedAmps = round(s.amps * derate);
    const worstRunning = heaviest(loads, cabCount, 'runningAmps');
    const worstSurge = heaviest(loads, cabCount, 'surgeAmps');
    const messages: string[] = [];
    let status: Status = 'ok';
    if (worstRunning.amps > s.amps + AMPS_TOLERANCE) {
      status = 'over';
      messages.push(`Running load ${a(worstRunning.amps)} is above the ${a(s.amps)} rating.`);
    } else if (worstRunning.amps > deratedAmps + AMPS_TOLERANCE) {
      status = 'warning';
      messages.push(`Running load ${a(worstRunning.amps)} is above ${Math.round(derate * 100)} % of the rating (${a(deratedAmps)}); continuous loads are best kept to 80 %.`);
    }
    if (worstSurge.amps > s.amps + AMPS_TOLERANCE) {
      status = 'over';
      messages.push(`Start-up surge ${a(worstSurge.amps)} is above the ${a(s.amps)} rating if every cab starts at once.`);
    }
    if (cabCount === 0) messages.push('No cab draws from this supply yet.');
    return {
      id: s.id,
      name: s.name,
      volts: s.volts,
      ratedAmps: s.amps,
      derate,
      deratedAmps,
      cabCount,
      worstRunning,
      worstSurge,
      status,
      headroomAmps: round(deratedAmps - worstRunning.amps),
      messages,
    };
  });

  const surgeS = input.surgeS ?? defaultRules.surgeS;
  const drivers: DriverBudget[] = input.drivers.map((d) => {
    const supply = supplyOf.get(d.supplyId);
    const cabCount = cabsOnDriver.get(d.id) ?? 0;
    const preset = d.presetId ? findDriverPreset(d.presetId) : undefined;
    const electrics = storedElectrics(d);
    const edited = preset !== undefined && !sameRatings(presetDriverValues(preset), { ...d, ...electrics });
    const plan = planDriverElectrics(electrics);
    const drop = plan.drop!;
    const surge = surgeLimit({ channelAmps: d.channelAmps, channelPeakAmps: d.channelPeakAmps, peakPulseS: plan.peakPulseS }, surgeS);
    const channelRunning = heaviest(loads, Math.min(1, cabCount), 'runningAmps');
    const channelSurge = heaviest(loads, Math.min(1, cabCount), 'surgeAmps');
    const worstRunning = heaviest(loads, cabCount, 'runningAmps');
    const worstSurge = heaviest(loads, cabCount, 'surgeAmps');
    const supplyVolts = supply?.volts ?? 0;
    const dropVolts = round(dropAt(drop.max, channelRunning.amps));
    const trackVolts = round(trackVoltsOf(supplyVolts, dropVolts));
    // One heaviest train per used channel: drop × current on each, summed over the package.
    const heatLowWatts = round(worstRunning.terms.reduce((w, t) => w + channelWatts(drop.min, t.amps), 0));
    const heatHighWatts = round(worstRunning.terms.reduce((w, t) => w + channelWatts(drop.max, t.amps), 0));
    const messages: string[] = [];
    let status: Status = 'ok';
    if (channelRunning.amps > d.channelAmps + AMPS_TOLERANCE) {
      status = 'over';
      messages.push(`“${channelRunning.terms[0]?.trainName}” draws ${a(channelRunning.amps)} running, above the ${a(d.channelAmps)} continuous rating of a channel.`);
    }
    if (channelSurge.amps > surge.amps + AMPS_TOLERANCE) {
      status = 'over';
      messages.push(
        surge.continuous
          ? `“${channelSurge.terms[0]?.trainName}” draws ${a(channelSurge.amps)} for its ${surgeS} s start, above the ${a(surge.amps)} continuous rating: the ${a(d.channelPeakAmps)} peak holds ${electrics.peakPulseMs === null ? 'for no stated time' : `for ${electrics.peakPulseMs} ms only`}.`
          : `“${channelSurge.terms[0]?.trainName}” surges to ${a(channelSurge.amps)} at start, above the ${a(d.channelPeakAmps)} peak rating of a channel.`,
      );
    }
    if (d.totalAmps !== null && worstSurge.amps > d.totalAmps + AMPS_TOLERANCE) {
      status = 'over';
      messages.push(`All cabs at once could surge to ${a(worstSurge.amps)}, above the driver's ${a(d.totalAmps)} total rating.`);
    }
    if (electrics.packageWatts !== null && heatHighWatts > electrics.packageWatts + 1e-9) {
      // A warning, as in the plan check: the package rating holds for one mounting at 25 °C.
      status = atLeastWarning(status);
      messages.push(
        `With every cab running its heaviest train the bridge dissipates about ${w(heatLowWatts)} to ${w(heatHighWatts)}, above its ${w(electrics.packageWatts)} package rating: add a heat sink or spread the trains over more drivers.`,
      );
    }
    if (nominalVolts !== null && gaugeMm !== null && trackVolts < nominalVolts - VOLTS_TOLERANCE) {
      status = atLeastWarning(status);
      messages.push(
        `Track gets ${v(trackVolts)} at full throttle with the heaviest train, below the ${nominalVolts} V nominal of NEM 630 Table 1 for ${gaugeMm} mm gauge` +
          (nominalVolts === 12 ? ' (NMRA S-9 I.A: at least 12 V at full throttle at maximum anticipated load)' : '') + '.',
      );
    }
    if (preset && supply) {
      if (supply.volts > preset.maxSupplyVolts + VOLTS_TOLERANCE) {
        status = 'over';
        messages.push(`Supply ${v(supply.volts)} is above the ${v(preset.maxSupplyVolts)} motor-supply maximum of this driver class (${preset.source}).`);
      } else if (preset.minSupplyVolts !== null && supply.volts < preset.minSupplyVolts - VOLTS_TOLERANCE) {
        status = atLeastWarning(status);
        messages.push(`Supply ${v(supply.volts)} is below the ${v(preset.minSupplyVolts)} motor-supply minimum of this driver class (${preset.source}).`);
      }
    }
    if (cabCount === 0) messages.push('No cab uses this driver yet.');
    return {
      id: d.id,
      name: d.name,
      supplyName: supply?.name ?? '—',
      supplyVolts,
      preset: preset
        ? { id: preset.id, label: preset.label, source: preset.source, note: preset.note, minSupplyVolts: preset.minSupplyVolts, maxSupplyVolts: preset.maxSupplyVolts, edited }
        : null,
      partNumber: d.partNumber,
      channels: d.channels,
      cabCount,
      channelAmps: d.channelAmps,
      channelPeakAmps: d.channelPeakAmps,
      totalAmps: d.totalAmps,
      surgeLimitAmps: surge.amps,
      surgeJudgedContinuous: surge.continuous,
      peakPulseMs: electrics.peakPulseMs,
      dropVolts,
      heatLowWatts,
      heatHighWatts,
      packageWatts: electrics.packageWatts,
      channelRunning,
      channelSurge,
      worstRunning,
      worstSurge,
      trackVolts,
      nominalVolts,
      gaugeMm,
      status,
      messages,
    };
  });

  return { derate, trains: loads, supplies, drivers };
}

export interface DutyCell {
  ok: boolean;
  /** 0..1 when ok. */
  duty: number | null;
  pwm8: number | null;
  /** The locomotive that needs the most (in a consist of different locomotives), or why not. */
  note: string;
}

export interface DutyTable {
  trainId: string;
  trainName: string;
  topSpeedKmh: number | null;
  speeds: number[];
  cabs: { id: string; name: string; trackVolts: number }[];
  /** rows[speed][cab] */
  rows: DutyCell[][];
}

/** Scale speeds for a duty table: a quarter, half, three quarters and all of the top speed. */
export function dutySpeeds(topSpeedKmh: number): number[] {
  return [...new Set([0.25, 0.5, 0.75, 1].map((f) => Math.max(1, Math.round(topSpeedKmh * f))))].filter((s) => s <= topSpeedKmh);
}

/**
 * PWM duty per train, speed and cab with the engine's linear model (`dutyFor`). Every locomotive of
 * a consist gets the same duty, so the cab must give the one that needs the most; that one is named.
 */
export function dutyTables(input: BudgetInput): DutyTable[] {
  const locomotiveOf = new Map(input.locomotives.map((l) => [l.id, l]));
  const driverOf = new Map(input.drivers.map((d) => [d.id, d]));
  const supplyOf = new Map(input.supplies.map((s) => [s.id, s]));
  const cabs = input.cabs
    .map((cab) => {
      const driver = driverOf.get(cab.driverId);
      const supply = driver ? supplyOf.get(driver.supplyId) : undefined;
      return driver && supply ? { cab, driver, supply } : null;
    })
    .filter((c) => c !== null);
  const loads = new Map(trainLoads(input).map((l) => [l.id, l]));
  return input.trains.map((train) => {
    const locomotives = train.locomotiveIds.map((id) => locomotiveOf.get(id)).filter((l) => l !== undefined);
    const top = locomotives.length ? Math.min(...locomotives.map((l) => l.topSpeedKmh)) : null;
    const speeds = top === null ? [] : dutySpeeds(top);
    // The bridge's greatest drop at this train's running current, so the duty is enough.
    const amps = loads.get(train.id)?.runningAmps ?? 0;
    const dropOf = (driver: DriverValues) => dropAt(planDriverElectrics(storedElectrics(driver)).drop!.max, amps);
    const rows = speeds.map((speed) =>
      cabs.map(({ driver, supply }): DutyCell => {
        let best: { duty: number; pwm8: number; locomotive: string } | null = null;
        for (const locomotive of locomotives) {
          const r = dutyFor({
            supplyVolts: supply.volts,
            dropVolts: dropOf(driver),
            ratedVolts: locomotive.ratedVolts,
            topSpeedKmh: locomotive.topSpeedKmh,
            startVolts: locomotive.startVolts ?? 0,
            targetSpeedKmh: speed,
          });
          if (!r.ok) return { ok: false, duty: null, pwm8: null, note: locomotives.length > 1 ? `${locomotive.name}: ${r.reason}` : r.reason };
          if (best === null || r.duty > best.duty) best = { duty: r.duty, pwm8: r.pwm8, locomotive: locomotive.name };
        }
        if (best === null) return { ok: false, duty: null, pwm8: null, note: 'no locomotive' };
        const mixed = new Set(locomotives.map((l) => `${l.ratedVolts}/${l.topSpeedKmh}/${l.startVolts ?? 0}`)).size > 1;
        return { ok: true, duty: best.duty, pwm8: best.pwm8, note: mixed ? `set by ${best.locomotive}` : '' };
      }),
    );
    return {
      trainId: train.id,
      trainName: train.name,
      topSpeedKmh: top,
      speeds,
      cabs: cabs.map(({ cab, driver, supply }) => ({ id: cab.id, name: cab.name, trackVolts: round(trackVoltsOf(supply.volts, dropOf(driver))) })),
      rows,
    };
  });
}

/** A driver row's electrics, with the columns an older caller may leave out at their defaults. */
function storedElectrics(d: DriverValues): DriverElectrics {
  return {
    dropVolts: d.dropVolts,
    dropOhms: d.dropOhms ?? 0,
    dropMaxVolts: d.dropMaxVolts ?? null,
    dropMaxOhms: d.dropMaxOhms ?? null,
    peakPulseMs: d.peakPulseMs ?? null,
    packageWatts: d.packageWatts ?? null,
  };
}

/** Whether a driver still has a preset's ratings (so the page can say they were edited). */
function sameRatings(p: ReturnType<typeof presetDriverValues>, d: DriverValues & DriverElectrics): boolean {
  return (Object.keys(p) as (keyof typeof p)[]).every((k) => p[k] === d[k]);
}

function round(value: number): number {
  return Math.round(value * 1e6) / 1e6;
}
