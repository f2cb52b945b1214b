import { formatSessionTime } from './clock';
import type { Finding, FindingKind } from './finding';
import { sortByKey } from './intervals';
import { withNoun, type PlanNames } from './names';
import { indexPlan, type PlanIndex } from './plan-index';
import { AMPS_TOLERANCE } from './rules';
import type { Plan } from './schema';

/**
 * One breakpoint of a load step function: from `tS` until the next breakpoint the load is
 * `runningAmps` (running current throughout each movement) and `peakAmps` (stall current during
 * each movement's first surgeS seconds).
 */
export type LoadPoint = [tS: number, runningAmps: number, peakAmps: number];

/** The load on one supply, driver or cab over the session, ready for a chart. */
export interface LoadSeries {
  id: string;
  name: string;
  /** The headline rating: a cab's channelAmps, a driver's totalAmps, a supply's amps. */
  limitAmps: number | null;
  /** What the running load is compared with: channelAmps for a cab, amps × derate for a supply. */
  runningLimitAmps: number | null;
  /** What the peak load is compared with: channelPeakAmps, totalAmps, or a supply's amps. */
  peakLimitAmps: number | null;
  /**
   * Breakpoints sorted by tS, no two at the same time. The load is 0 before the first and from the
   * last on; empty when nothing draws current through it.
   */
  points: LoadPoint[];
  maxRunningAmps: number;
  maxPeakAmps: number;
}

/** Loads of every supply, driver and cab, in plan order. */
export interface LoadProfile {
  supplies: LoadSeries[];
  drivers: LoadSeries[];
  cabs: LoadSeries[];
}

/** A run's current: running throughout its movement, stall for the first surgeS seconds. */
export function runCurrents(plan: Plan): { runningAmps: Float64Array; stallAmps: Float64Array } {
  const locoOf = new Map<string, Plan['locos'][number]>();
  for (const loco of plan.locos) if (!locoOf.has(loco.id)) locoOf.set(loco.id, loco);
  const trainOf = new Map<string, Plan['trains'][number]>();
  for (const train of plan.trains) if (!trainOf.has(train.id)) trainOf.set(train.id, train);
  const totals = new Map<string, [number, number]>();
  for (const train of plan.trains) {
    let running = train.lightingAmps;
    let stall = train.lightingAmps;
    for (const locoId of train.locoIds) {
      const loco = locoOf.get(locoId);
      if (loco === undefined) continue;
      running += loco.runningAmps;
      stall += loco.stallAmps;
    }
    if (!totals.has(train.id)) totals.set(train.id, [running, stall]);
  }
  const runningAmps = new Float64Array(plan.runs.length);
  const stallAmps = new Float64Array(plan.runs.length);
  plan.runs.forEach((run, r) => {
    const total = totals.get(run.trainId);
    runningAmps[r] = total?.[0] ?? 0;
    stallAmps[r] = total?.[1] ?? 0;
  });
  return { runningAmps, stallAmps };
}

interface Tally {
  running: number;
  peak: number;
  moving: number;
  series: LoadSeries;
}

/**
 * Builds every load step function with one sort of the runs' events (departure, end of surge,
 * arrival): O(runs log runs). Each event is applied to the run's cab, its driver and its supply.
 * checkPlan returns the same profile as its `load`.
 */
export function buildLoadProfile(plan: Plan, index: PlanIndex = indexPlan(plan)): LoadProfile {
  const series = (id: string, name: string, limit: number | null, running: number | null, peak: number | null) => ({
    id,
    name,
    limitAmps: limit,
    runningLimitAmps: running,
    peakLimitAmps: peak,
    points: [] as LoadPoint[],
    maxRunningAmps: 0,
    maxPeakAmps: 0,
  });
  const profile: LoadProfile = {
    supplies: plan.supplies.map((s) => series(s.id, s.name, s.amps, s.amps * plan.rules.derate, s.amps)),
    drivers: plan.drivers.map((d) => series(d.id, d.name, d.totalAmps, null, d.totalAmps)),
    cabs: plan.cabs.map((c, i) => {
      const driver = plan.drivers[index.cabDriver[i]!];
      return series(c.id, c.name, driver?.channelAmps ?? null, driver?.channelAmps ?? null, driver?.channelPeakAmps ?? null);
    }),
  };
  const tally = (s: LoadSeries): Tally => ({ running: 0, peak: 0, moving: 0, series: s });
  const cabTallies = profile.cabs.map(tally);
  const driverTallies = profile.drivers.map(tally);
  const supplyTallies = profile.supplies.map(tally);

  const { runningAmps, stallAmps } = runCurrents(plan);
  const surgeS = plan.rules.surgeS;
  const runs = plan.runs;
  // Three events per run: 3r departure, 3r + 1 end of surge, 3r + 2 arrival.
  const time = new Float64Array(runs.length * 3);
  const events: number[] = [];
  for (let r = 0; r < runs.length; r++) {
    const run = runs[r]!;
    if (index.runCab[r]! < 0) continue;
    time[3 * r] = run.departS;
    time[3 * r + 1] = run.departS + surgeS;
    time[3 * r + 2] = run.arriveS;
    events.push(3 * r, 3 * r + 2);
    // A surge that outlasts the movement simply ends at arrival.
    if (run.departS + surgeS < run.arriveS) events.push(3 * r + 1);
  }
  sortByKey(events, time);

  const apply = (t: Tally | undefined, at: number, dRunning: number, dPeak: number, dMoving: number) => {
    if (t === undefined) return;
    t.moving += dMoving;
    if (t.moving === 0) {
      // Snap to zero when nothing moves, so rounding from long sums never leaves a phantom load.
      t.running = 0;
      t.peak = 0;
    } else {
      t.running += dRunning;
      t.peak += dPeak;
    }
    const points = t.series.points;
    const last = points[points.length - 1];
    if (last !== undefined && last[0] === at) {
      last[1] = t.running;
      last[2] = t.peak;
    } else {
      points.push([at, t.running, t.peak]);
    }
    if (t.running > t.series.maxRunningAmps) t.series.maxRunningAmps = t.running;
    if (t.peak > t.series.maxPeakAmps) t.series.maxPeakAmps = t.peak;
  };

  for (const event of events) {
    const r = Math.floor(event / 3);
    const phase = event - 3 * r;
    const run = runs[r]!;
    const running = runningAmps[r]!;
    const stall = stallAmps[r]!;
    const surgeOutlasts = !(run.departS + surgeS < run.arriveS);
    let dRunning = 0;
    let dPeak = 0;
    let dMoving = 0;
    if (phase === 0) {
      dRunning = running;
      dPeak = stall;
      dMoving = 1;
    } else if (phase === 1) {
      dPeak = running - stall;
    } else {
      dRunning = -running;
      dPeak = surgeOutlasts ? -stall : -running;
      dMoving = -1;
    }
    const at = time[event]!;
    const cab = index.runCab[r]!;
    const driver = index.runDriver[r]!;
    const supply = index.runSupply[r]!;
    apply(cabTallies[cab], at, dRunning, dPeak, dMoving);
    if (driver >= 0) apply(driverTallies[driver], at, dRunning, dPeak, dMoving);
    if (supply >= 0) apply(supplyTallies[supply], at, dRunning, dPeak, dMoving);
  }
  return profile;
}

/**
 * One finding per maximal interval where a series' chosen load exceeds its limit (by more than
 * AMPS_TOLERANCE), with the highest load in the interval.
 */
function overloads(
  s: LoadSeries,
  which: 1 | 2,
  limit: number | null,
  kind: FindingKind,
  severity: Finding['severity'],
  describe: (peak: number, limit: number, fromS: number, toS: number) => string,
  findings: Finding[],
): void {
  if (limit === null) return;
  const points = s.points;
  let i = 0;
  while (i < points.length) {
    if (!(points[i]![which] > limit + AMPS_TOLERANCE)) {
      i++;
      continue;
    }
    const fromS = points[i]![0];
    let peak = 0;
    while (i < points.length && points[i]![which] > limit + AMPS_TOLERANCE) {
      if (points[i]![which] > peak) peak = points[i]![which];
      i++;
    }
    // The last point always has zero load, so the interval ends at a breakpoint.
    const toS = i < points.length ? points[i]![0] : fromS;
    findings.push({
      kind,
      severity,
      ids: [s.id],
      fromS,
      toS,
      message: describe(peak, limit, fromS, toS),
      peakAmps: peak,
      limitAmps: limit,
    });
  }
}

const amps = (value: number) => `${Math.round(value * 1000) / 1000} A`;

/**
 * The five power findings over a load profile. `names` words the messages (checkPlan passes the
 * plan's); without it, series are named as the profile names them and times as session time.
 */
export function findPowerOverloads(profile: LoadProfile, derate: number, findings: Finding[], names?: PlanNames): void {
  const span = names
    ? names.span
    : (fromS: number, toS: number) => `from ${formatSessionTime(fromS)} to ${formatSessionTime(toS)}`;
  const called = (s: LoadSeries, noun: string) => withNoun(noun, s.name.trim() || `"${s.id}"`);
  for (const cab of profile.cabs) {
    overloads(cab, 1, cab.runningLimitAmps, 'channel-overload', 'error', (peak, limit, from, to) =>
      `${called(cab, 'cab')} draws up to ${amps(peak)} running ${span(from, to)}, above its channel's ${amps(limit)} continuous rating`,
      findings);
    overloads(cab, 2, cab.peakLimitAmps, 'channel-peak-overload', 'error', (peak, limit, from, to) =>
      `${called(cab, 'cab')} draws up to ${amps(peak)} with start-up surge ${span(from, to)}, above its channel's ${amps(limit)} peak rating`,
      findings);
  }
  for (const driver of profile.drivers) {
    overloads(driver, 2, driver.peakLimitAmps, 'driver-overload', 'error', (peak, limit, from, to) =>
      `${called(driver, 'driver')} carries up to ${amps(peak)} across its channels ${span(from, to)}, above its ${amps(limit)} total rating`,
      findings);
  }
  for (const supply of profile.supplies) {
    overloads(supply, 2, supply.peakLimitAmps, 'supply-overload', 'error', (peak, limit, from, to) =>
      `${called(supply, 'supply')} must deliver up to ${amps(peak)} ${span(from, to)}, above its ${amps(limit)} rating`,
      findings);
    overloads(supply, 1, supply.runningLimitAmps, 'supply-derate', 'warning', (peak, limit, from, to) =>
      `${called(supply, 'supply')} runs at up to ${amps(peak)} ${span(from, to)}, above ${Math.round(derate * 100)} % of its rating (${amps(limit)}); continuous loads are best kept to 80 %`,
      findings);
  }
}
