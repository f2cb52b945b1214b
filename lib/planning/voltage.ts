import type { Finding } from './finding';
import { planNames, withNoun, type PlanNames } from './names';
import type { PlanIndex } from './plan-index';
import { VOLTS_TOLERANCE } from './rules';
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

/** Full-throttle voltage at the rails of a driver: its supply less the bridge drop. */
export function trackVoltsOf(supplyVolts: number, dropVolts: number): number {
  return supplyVolts - dropVolts;
}

const volts = (value: number) => `${Math.round(value * 100) / 100} V`;

/**
 * The two voltage findings, both warnings and both judged at full throttle, where the rails get
 * `supply.volts − driver.dropVolts`:
 *
 * - `track-voltage-high`, ids `[cabId, locoId]`: a loco runs on a cab whose full-throttle track
 *   voltage is above the loco's ratedVolts, so full throttle over-drives it. One finding per cab and
 *   loco over all its runs, from the first departure to the last arrival. PWM is judged by its
 *   average voltage (NEM 630 Table 2), so the message gives the largest safe duty.
 * - `track-voltage-low`, ids `[cabId]`: a cab with runs whose full-throttle track voltage is below
 *   the NEM 630 Table 1 nominal for the plan's gauge (12 V for 6.5–32 mm gauge, which NMRA S-9 I.A
 *   also sets as the least full-throttle voltage at the rails). Skipped when the plan's scale is not
 *   in the scale table, since there is no standard gauge to judge by.
 */
export function findVoltageIssues(plan: Plan, index: PlanIndex, findings: Finding[], names: PlanNames = planNames(plan)): void {
  const gauge = gaugeForScale(plan.scale);
  const nominal = gauge === null ? null : nominalTrackVolts(gauge);
  const locoOf = new Map<string, Plan['locos'][number]>();
  for (const loco of plan.locos) if (!locoOf.has(loco.id)) locoOf.set(loco.id, loco);

  // Per cab: span of its runs; per cab and loco: span and run count.
  const cabSpan = new Map<number, [number, number]>();
  const overDriven = new Map<string, { cab: number; loco: string; fromS: number; toS: number; runs: number }>();
  plan.runs.forEach((run, r) => {
    const cab = index.runCab[r]!;
    const driver = plan.drivers[index.runDriver[r]!];
    const supply = plan.supplies[index.runSupply[r]!];
    if (cab < 0 || driver === undefined || supply === undefined) return;
    const span = cabSpan.get(cab);
    if (span === undefined) cabSpan.set(cab, [run.departS, run.arriveS]);
    else {
      span[0] = Math.min(span[0], run.departS);
      span[1] = Math.max(span[1], run.arriveS);
    }
    const train = plan.trains[index.runTrain[r]!];
    if (train === undefined) return;
    const track = trackVoltsOf(supply.volts, driver.dropVolts);
    for (const locoId of train.locoIds) {
      const loco = locoOf.get(locoId);
      if (loco === undefined || !(track > loco.ratedVolts + VOLTS_TOLERANCE)) continue;
      const key = `${cab}\u0000${locoId}`;
      const entry = overDriven.get(key);
      if (entry === undefined) overDriven.set(key, { cab, loco: locoId, fromS: run.departS, toS: run.arriveS, runs: 1 });
      else {
        entry.fromS = Math.min(entry.fromS, run.departS);
        entry.toS = Math.max(entry.toS, run.arriveS);
        entry.runs++;
      }
    }
  });

  for (const entry of overDriven.values()) {
    const cab = plan.cabs[entry.cab]!;
    const driver = plan.drivers[index.cabDriver[entry.cab]!]!;
    const supply = plan.supplies[index.driverSupply[index.cabDriver[entry.cab]!]!]!;
    const track = trackVoltsOf(supply.volts, driver.dropVolts);
    const loco = locoOf.get(entry.loco)!;
    const safeDuty = Math.floor((loco.ratedVolts / track) * 100);
    findings.push({
      kind: 'track-voltage-high',
      severity: 'warning',
      ids: [cab.id, loco.id],
      fromS: entry.fromS,
      toS: entry.toS,
      message:
        `${withNoun('cab', names.cab(cab.id))} puts ${volts(track)} on the rails at full throttle, above the ${volts(loco.ratedVolts)} rating of ${names.loco(loco.id)} ` +
        `(${entry.runs} run${entry.runs === 1 ? '' : 's'}); keep its duty at or below ${safeDuty} % (NEM 630 Table 2 judges PWM by its average voltage)`,
    });
  }

  if (nominal === null || gauge === null) return;
  for (const [cabIndex, [fromS, toS]] of cabSpan) {
    const cab = plan.cabs[cabIndex]!;
    const driver = plan.drivers[index.cabDriver[cabIndex]!]!;
    const supply = plan.supplies[index.driverSupply[index.cabDriver[cabIndex]!]!]!;
    const track = trackVoltsOf(supply.volts, driver.dropVolts);
    if (!(track < nominal - VOLTS_TOLERANCE)) continue;
    const nmra = nominal === 12 ? '; NMRA S-9 I.A asks for at least 12 V at full throttle' : '';
    findings.push({
      kind: 'track-voltage-low',
      severity: 'warning',
      ids: [cab.id],
      fromS,
      toS,
      message:
        `${withNoun('cab', names.cab(cab.id))} gives at most ${volts(track)} at the rails (supply ${volts(supply.volts)} less ${volts(driver.dropVolts)} bridge drop), ` +
        `below the ${nominal} V nominal of NEM 630 Table 1 for ${gauge} mm gauge${nmra}; trains may not reach their top speed`,
    });
  }
}
