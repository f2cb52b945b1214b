import { dutyFor } from './duty';
import { dropAt, driverDrop, scaleSpeedKmh } from './electrics';
import { willList, type FindingSink } from './finding';
import { runCurrents } from './load';
import { planNames, withNoun, type PlanNames } from './names';
import type { PlanIndex } from './plan-index';
import { VOLTS_TOLERANCE } from './rules';
import { modelRateMmPerS2, type Ramps } from './motion';
import { gaugeForScale } from './scales';
import type { Plan } from './schema';

/**
 * Nominal DC track voltage for a gauge, NEM 630 Table 1: 8 V up to 6.5 mm, 12 V above 6.5 mm and
 * below 32 mm, 16 V from 32 mm.
 */
export function nominalTrackVolts(gaugeMm: number): number {
  if (gaugeMm <= 6.5) return 8;
  if (gaugeMm < 32) return 12;
  return 16;
}

/** Full-throttle voltage at the rails of a driver: its supply less the bridge drop (at the current drawn). */
export function trackVoltsOf(supplyVolts: number, dropVolts: number): number {
  return supplyVolts - dropVolts;
}

const volts = (value: number) => `${Math.round(value * 100) / 100} V`;
const ampsText = (value: number) => `${Math.round(value * 1000) / 1000} A`;

/**
 * The cruise, scale km/h, a run is planned at: the distance its head covers (every block after the
 * first, from the first block's far end to the last's; see timeRun) over the time it moves. With
 * the train's ramps (accelKmhPerS, brakingKmhPerS) the cruise v solves T = D/v + v/2a + v/2b
 * (elementary kinematics: accelerating to v and braking from it each cost v/2·rate more than running
 * at v), the smaller root; a time too short even for a train that brakes as soon as it reaches
 * its peak gives that triangle's peak, 2D/T. Stops on the way only add to T, so this never
 * overstates the need. Null for a run whose blocks are unknown or that stands in one block.
 */
export function plannedSpeedKmh(plan: Plan, run: Plan['runs'][number], blockLength: ReadonlyMap<string, number>, ramps: Partial<Ramps> = {}): number | null {
  let distance = 0;
  for (let k = 1; k < run.steps.length; k++) {
    const length = blockLength.get(run.steps[k]!.blockId);
    if (length === undefined) return null;
    distance += length;
  }
  if (distance === 0) return null; // a run of one block stands: there is no speed to reach
  const seconds = run.arriveS - run.departS;
  const ratio = plan.scale.ratio;
  // k = 1/2a + 1/2b in model s²/mm; 0 at constant speed.
  const k =
    (ramps.accelKmhPerS === undefined ? 0 : 1 / (2 * modelRateMmPerS2(ramps.accelKmhPerS, ratio))) +
    (ramps.brakingKmhPerS === undefined ? 0 : 1 / (2 * modelRateMmPerS2(ramps.brakingKmhPerS, ratio)));
  if (k === 0) return scaleSpeedKmh(distance, seconds, ratio);
  const discriminant = seconds * seconds - 4 * k * distance;
  const mmPerS = discriminant < 0 ? (2 * distance) / seconds : (seconds - Math.sqrt(discriminant)) / (2 * k);
  return scaleSpeedKmh(mmPerS, 1, ratio);
}

/**
 * The voltage findings, all warnings and all judged at full throttle, where the rails get the
 * supply less the bridge's drop at the train's running current (see driverDrop):
 *
 * - `track-voltage-high`, ids `[cabId, locomotiveId]`: a locomotive runs on a cab whose full-throttle track
 *   voltage, with the bridge's *least* drop at the train's running current, is above the locomotive's
 *   ratedVolts, so full throttle over-drives it. One finding per cab and locomotive over all its runs, from
 *   the first departure to the last arrival. PWM is judged by its average voltage (NEM 630 Table 2),
 *   so the message gives the largest safe duty.
 * - `track-voltage-low`, ids `[cabId]`: a cab with runs whose full-throttle track voltage, with the
 *   bridge's *greatest* drop at the heaviest train it drives ("at maximum anticipated load", NMRA
 *   S-9 I.A), is below the NEM 630 Table 1 nominal for the plan's gauge (12 V for 6.5–32 mm gauge,
 *   which NMRA S-9 I.A also sets as the least full-throttle voltage at the rails). Skipped when the
 *   plan's scale is not in the scale table, since there is no standard gauge to judge by.
 * - `speed-not-reachable`, ids `[runId, locomotiveId]`: a run's planned speed (plannedSpeedKmh) needs more
 *   than the locomotive can give (above its top speed) or more duty than its cab can give (dutyFor with the
 *   greatest drop at the train's running current). Only for locomotives with a top speed recorded.
 */
export function findVoltageIssues(plan: Plan, index: PlanIndex, findings: FindingSink, names: PlanNames = planNames(plan)): void {
  const locomotiveOf = new Map<string, number>();
  plan.locomotives.forEach((locomotive, i) => {
    if (!locomotiveOf.has(locomotive.id)) locomotiveOf.set(locomotive.id, i);
  });
  const drops = plan.drivers.map((driver) => driverDrop(driver));
  const blockLength = new Map<string, number>();
  for (const block of plan.blocks) if (!blockLength.has(block.id)) blockLength.set(block.id, block.lengthMm);
  const { runningAmps } = runCurrents(plan);

  // Per cab: span of its runs and its heaviest train; per cab and locomotive: span, run count, highest volts.
  const cabLoad = new Map<number, { fromS: number; toS: number; amps: number }>();
  const overDriven = new Map<number, { cab: number; locomotive: number; fromS: number; toS: number; runs: number; track: number; amps: number }>();
  plan.runs.forEach((run, r) => {
    const cab = index.runCab[r]!;
    const driver = plan.drivers[index.runDriver[r]!];
    const supply = plan.supplies[index.runSupply[r]!];
    if (cab < 0 || driver === undefined || supply === undefined) return;
    const amps = runningAmps[r]!;
    const load = cabLoad.get(cab);
    if (load === undefined) cabLoad.set(cab, { fromS: run.departS, toS: run.arriveS, amps });
    else {
      load.fromS = Math.min(load.fromS, run.departS);
      load.toS = Math.max(load.toS, run.arriveS);
      load.amps = Math.max(load.amps, amps);
    }
    const train = plan.trains[index.runTrain[r]!];
    if (train === undefined) return;
    const drop = drops[index.runDriver[r]!]!;
    const highest = trackVoltsOf(supply.volts, dropAt(drop.min, amps));
    let speed: number | null | undefined;
    for (const locomotiveId of train.locomotiveIds) {
      const l = locomotiveOf.get(locomotiveId);
      if (l === undefined) continue;
      const locomotive = plan.locomotives[l]!;
      if (locomotive.topSpeedKmh !== undefined && locomotive.topSpeedKmh !== null) {
        speed ??= plannedSpeedKmh(plan, run, blockLength, train);
        if (speed !== null) reachFinding(run, locomotive, locomotive.topSpeedKmh, speed, supply.volts, dropAt(drop.max, amps), names, findings);
      }
      if (!(highest > locomotive.ratedVolts + VOLTS_TOLERANCE)) continue;
      const key = cab * plan.locomotives.length + l;
      const entry = overDriven.get(key);
      if (entry === undefined) overDriven.set(key, { cab, locomotive: l, fromS: run.departS, toS: run.arriveS, runs: 1, track: highest, amps });
      else {
        entry.fromS = Math.min(entry.fromS, run.departS);
        entry.toS = Math.max(entry.toS, run.arriveS);
        entry.runs++;
        if (highest > entry.track) {
          entry.track = highest;
          entry.amps = amps;
        }
      }
    }
  });

  for (const entry of overDriven.values()) {
    const cab = plan.cabs[entry.cab]!;
    const locomotive = plan.locomotives[entry.locomotive]!;
    const safeDuty = Math.floor((locomotive.ratedVolts / entry.track) * 100);
    findings.push({
      kind: 'track-voltage-high',
      severity: 'warning',
      ids: [cab.id, locomotive.id],
      fromS: entry.fromS,
      toS: entry.toS,
      message: !willList(findings, 'track-voltage-high')
        ? ''
        : `${withNoun('cab', names.cab(cab.id))} puts up to ${volts(entry.track)} on the rails at full throttle (the bridge's least drop at ${ampsText(entry.amps)}), above the ${volts(locomotive.ratedVolts)} rating of ${names.locomotive(locomotive.id)} ` +
        `(${entry.runs} run${entry.runs === 1 ? '' : 's'}); keep its duty at or below ${safeDuty} % (NEM 630 Table 2 judges PWM by its average voltage)`,
    });
  }

  const gauge = gaugeForScale(plan.scale);
  if (gauge === null) return;
  const nominal = nominalTrackVolts(gauge);
  for (const [cabIndex, load] of cabLoad) {
    const cab = plan.cabs[cabIndex]!;
    const driver = plan.drivers[index.cabDriver[cabIndex]!]!;
    const supply = plan.supplies[index.driverSupply[index.cabDriver[cabIndex]!]!]!;
    const drop = dropAt(driverDrop(driver).max, load.amps);
    const track = trackVoltsOf(supply.volts, drop);
    if (!(track < nominal - VOLTS_TOLERANCE)) continue;
    const nmra = nominal === 12 ? '; NMRA S-9 I.A asks for at least 12 V at full throttle at maximum anticipated load' : '';
    findings.push({
      kind: 'track-voltage-low',
      severity: 'warning',
      ids: [cab.id],
      fromS: load.fromS,
      toS: load.toS,
      message:
        `${withNoun('cab', names.cab(cab.id))} gives at most ${volts(track)} at the rails with its heaviest train (${ampsText(load.amps)}: supply ${volts(supply.volts)} less up to ${volts(drop)} bridge drop), ` +
        `below the ${nominal} V nominal of NEM 630 Table 1 for ${gauge} mm gauge${nmra}; trains may not reach their top speed`,
    });
  }
}

function reachFinding(
  run: Plan['runs'][number],
  locomotive: Plan['locomotives'][number],
  topSpeedKmh: number,
  speedKmh: number,
  supplyVolts: number,
  dropVolts: number,
  names: PlanNames,
  findings: FindingSink,
): void {
  const result = dutyFor({
    supplyVolts,
    dropVolts,
    ratedVolts: locomotive.ratedVolts,
    topSpeedKmh,
    startVolts: locomotive.startVolts ?? 0,
    // A speed that rounds to the top speed is the top speed (times are stored to the millisecond).
    targetSpeedKmh: Math.abs(speedKmh - topSpeedKmh) < 1e-6 * topSpeedKmh ? topSpeedKmh : speedKmh,
  });
  // No 'bad-input' escape: every figure here comes from an accepted plan (a top speed recorded, a start
  // voltage below the rated one, a run that moves), so any refusal is a finding worth seeing.
  if (result.ok) return;
  findings.push({
    kind: 'speed-not-reachable',
    severity: 'warning',
    ids: [run.id, locomotive.id],
    fromS: run.departS,
    toS: run.arriveS,
    message: !willList(findings, 'speed-not-reachable')
      ? ''
      : `${names.run(run.id)} is planned at ${Math.round(speedKmh * 10) / 10} km/h, more than ${names.locomotive(locomotive.id)} can give on its cab: ${result.reason}`,
  });
}
