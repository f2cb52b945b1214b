import { formatSessionTime } from './clock';
import { channelWatts, driverDrop, surgeLimit, trainAmps, type DropLine } from './electrics';
import { willList, type Finding, type FindingKind, type FindingSink } from './finding';
import { orderByKey } from './intervals';
import { withNoun, type PlanNames } from './names';
import { indexPlan, type PlanIndex } from './plan-index';
import { AMPS_TOLERANCE } from './rules';
import type { Plan } from './schema';

/**
 * One breakpoint of a load step function: from `tS` until the next breakpoint the load is
 * `runningAmps` (running current throughout each movement) and `peakAmps` (start current during
 * each movement's first surgeS seconds; see startAmps).
 */
export type LoadPoint = [tS: number, runningAmps: number, peakAmps: number];

/**
 * One breakpoint of a driver's heat: from `tS` the bridge dissipates between `lowWatts` (its minimum
 * drop line) and `highWatts` (its maximum drop line), summed over its channels' running currents.
 */
export type HeatPoint = [tS: number, lowWatts: number, highWatts: number];

/** A driver's dissipation over the session against its package rating. */
export interface HeatSeries {
  /** The package rating, W; null when none is entered (heat shown, not checked). */
  limitWatts: number | null;
  /** Breakpoints sorted by tS, no two at the same time; empty when no channel carries current. */
  points: HeatPoint[];
  maxLowWatts: number;
  maxHighWatts: number;
}

/** The load on one supply, driver or cab over the session, ready for a chart. */
export interface LoadSeries {
  id: string;
  name: string;
  /** The headline rating: a cab's channelAmps, a driver's totalAmps, a supply's amps. */
  limitAmps: number | null;
  /** What the running load is compared with: channelAmps for a cab, amps × derate for a supply. */
  runningLimitAmps: number | null;
  /**
   * What the peak load is compared with: a cab's channelPeakAmps while the start-up surge fits in
   * its pulse width, else its channelAmps (see surgeLimit); a driver's totalAmps; a supply's amps.
   */
  peakLimitAmps: number | null;
  /** Cabs: the peak rating does not cover the surge, so peakLimitAmps is the continuous rating. */
  surgeJudgedContinuous: boolean;
  /**
   * Breakpoints sorted by tS, no two at the same time. The load is 0 before the first and from the
   * last on; empty when nothing draws current through it.
   */
  points: LoadPoint[];
  /** The highest loads over the points (events at one instant count once, as their outcome). */
  maxRunningAmps: number;
  maxPeakAmps: number;
  /** Drivers only: the heat in the bridge; null for cabs and supplies. */
  heat: HeatSeries | null;
}

/** Loads of every supply, driver and cab, in plan order. */
export interface LoadProfile {
  supplies: LoadSeries[];
  drivers: LoadSeries[];
  cabs: LoadSeries[];
}

/**
 * A run's current: running throughout its movement, its start current (startAmps, summed over the
 * train's locomotives, plus lighting) for the first surgeS seconds.
 */
export function runCurrents(plan: Plan): { runningAmps: Float64Array; stallAmps: Float64Array } {
  const locomotiveOf = new Map<string, Plan['locomotives'][number]>();
  for (const locomotive of plan.locomotives) if (!locomotiveOf.has(locomotive.id)) locomotiveOf.set(locomotive.id, locomotive);
  const totals = new Map<string, [number, number]>();
  for (const train of plan.trains) {
    const locomotives = train.locomotiveIds.map((id) => locomotiveOf.get(id)).filter((locomotive) => locomotive !== undefined);
    const amps = trainAmps(train.lightingAmps, locomotives);
    if (!totals.has(train.id)) totals.set(train.id, [amps.runningAmps, amps.startAmps]);
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
  steps: Steps;
}

/**
 * Builds every load step function with one sort of the runs' events (departure, end of surge,
 * arrival): O(runs log runs). Each event is applied to the run's cab, its driver and its supply; a
 * driver's heat is recomputed from its channels' running currents at each event on it. Maxima are
 * taken over the finished points, so events falling on one instant count only as their outcome.
 * checkPlan returns the same profile as its `load`.
 */
export function buildLoadProfile(plan: Plan, index: PlanIndex = indexPlan(plan)): LoadProfile {
  const series = (id: string, name: string, limit: number | null, running: number | null, peak: number | null): LoadSeries => ({
    id,
    name,
    limitAmps: limit,
    runningLimitAmps: running,
    peakLimitAmps: peak,
    surgeJudgedContinuous: false,
    points: [] as LoadPoint[],
    maxRunningAmps: 0,
    maxPeakAmps: 0,
    heat: null,
  });
  const surgeS = plan.rules.surgeS;
  const profile: LoadProfile = {
    supplies: plan.supplies.map((s) => series(s.id, s.name, s.amps, s.amps * plan.rules.derate, s.amps)),
    drivers: plan.drivers.map((d) => ({
      ...series(d.id, d.name, d.totalAmps, null, d.totalAmps),
      heat: { limitWatts: d.packageWatts ?? null, points: [], maxLowWatts: 0, maxHighWatts: 0 },
    })),
    cabs: plan.cabs.map((c, i) => {
      const driver = plan.drivers[index.cabDriver[i]!];
      if (driver === undefined) return series(c.id, c.name, null, null, null);
      const surge = surgeLimit(driver, surgeS);
      return { ...series(c.id, c.name, driver.channelAmps, driver.channelAmps, surge.amps), surgeJudgedContinuous: surge.continuous };
    }),
  };
  const tally = (s: LoadSeries): Tally => ({ running: 0, peak: 0, moving: 0, series: s, steps: steps(s.points) });
  const heatSteps = profile.drivers.map((d) => steps(d.heat!.points));
  const cabTallies = profile.cabs.map(tally);
  const driverTallies = profile.drivers.map(tally);
  const supplyTallies = profile.supplies.map(tally);
  const driverLines: (readonly [DropLine, DropLine])[] = plan.drivers.map((d) => {
    const drop = driverDrop(d);
    return [drop.min, drop.max] as const;
  });
  const driverCabs: number[][] = plan.drivers.map(() => []);
  index.cabDriver.forEach((d, c) => {
    if (d >= 0) driverCabs[d]!.push(c);
  });

  const { runningAmps, stallAmps } = runCurrents(plan);
  const runs = plan.runs;
  // Three events per run: 3r departure, 3r + 1 end of surge, 3r + 2 arrival.
  const time = new Float64Array(runs.length * 3);
  const listed = new Int32Array(runs.length * 3);
  let count = 0;
  for (let r = 0; r < runs.length; r++) {
    const run = runs[r]!;
    if (index.runCab[r]! < 0) continue;
    time[3 * r] = run.departS;
    time[3 * r + 1] = run.departS + surgeS;
    time[3 * r + 2] = run.arriveS;
    listed[count++] = 3 * r;
    // A surge that outlasts the movement simply ends at arrival.
    if (run.departS + surgeS < run.arriveS) listed[count++] = 3 * r + 1;
    listed[count++] = 3 * r + 2;
  }
  // By time, ties in event order (run, then phase).
  const events = orderByKey(time, listed.subarray(0, count));

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
    setPoint(t.steps, at, t.running, t.peak);
  };

  const heatOf = (driver: number, at: number) => {
    const [low, high] = driverLines[driver]!;
    let lowWatts = 0;
    let highWatts = 0;
    for (const c of driverCabs[driver]!) {
      const amps = cabTallies[c]!.running;
      lowWatts += channelWatts(low, amps);
      highWatts += channelWatts(high, amps);
    }
    setPoint(heatSteps[driver]!, at, lowWatts, highWatts);
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
    if (driver >= 0) {
      apply(driverTallies[driver], at, dRunning, dPeak, dMoving);
      if (phase !== 1) heatOf(driver, at);
    }
    if (supply >= 0) apply(supplyTallies[supply], at, dRunning, dPeak, dMoving);
  }

  for (const t of [...cabTallies, ...driverTallies, ...supplyTallies]) {
    const max = finish(t.steps);
    t.series.maxRunningAmps = max.a;
    t.series.maxPeakAmps = max.b;
  }
  profile.drivers.forEach((driver, d) => {
    const max = finish(heatSteps[d]!);
    driver.heat!.maxLowWatts = max.a;
    driver.heat!.maxHighWatts = max.b;
  });
  return profile;
}

/** A step function being built: its breakpoints, and the highest values among those finished. */
interface Steps {
  points: [number, number, number][];
  a: number;
  b: number;
}

const steps = (points: [number, number, number][]): Steps => ({ points, a: 0, b: 0 });

/** Takes a finished breakpoint into the maxima. */
function fold(steps: Steps, point: readonly [number, number, number]): void {
  if (point[1] > steps.a) steps.a = point[1];
  if (point[2] > steps.b) steps.b = point[2];
}

/**
 * Appends a breakpoint, or overwrites the last one when it is at the same instant; a breakpoint is
 * taken into the maxima once the next instant begins (so only an instant's outcome counts).
 */
function setPoint(steps: Steps, at: number, a: number, b: number): void {
  const points = steps.points;
  const last = points[points.length - 1];
  if (last !== undefined && last[0] === at) {
    last[1] = a;
    last[2] = b;
    return;
  }
  if (last !== undefined) fold(steps, last);
  points.push([at, a, b]);
}

/** The maxima over every breakpoint, the last one included. */
function finish(steps: Steps): { a: number; b: number } {
  const last = steps.points[steps.points.length - 1];
  if (last !== undefined) fold(steps, last);
  return steps;
}

/**
 * One finding per maximal interval where a step function's chosen value exceeds its limit (by more
 * than the tolerance), with the highest value in the interval; `extra` may adjust each finding.
 */
function overloads(
  id: string,
  points: readonly (readonly [number, number, number])[],
  which: 1 | 2,
  limit: number | null,
  kind: FindingKind,
  severity: Finding['severity'] | ((otherPeak: number, limit: number) => Finding['severity']),
  describe: (peak: number, limit: number, fromS: number, toS: number, otherPeak: number) => string,
  findings: FindingSink,
  tolerance = AMPS_TOLERANCE,
): Finding[] {
  const made: Finding[] = [];
  if (limit === null) return made;
  const other = which === 1 ? 2 : 1;
  let i = 0;
  while (i < points.length) {
    if (!(points[i]![which] > limit + tolerance)) {
      i++;
      continue;
    }
    const fromS = points[i]![0];
    let peak = 0;
    let otherPeak = 0;
    while (i < points.length && points[i]![which] > limit + tolerance) {
      if (points[i]![which] > peak) peak = points[i]![which];
      if (points[i]![other] > otherPeak) otherPeak = points[i]![other];
      i++;
    }
    // The last point always has zero load, so the interval ends at a breakpoint.
    const toS = i < points.length ? points[i]![0] : fromS;
    const finding: Finding = {
      kind,
      severity: typeof severity === 'function' ? severity(otherPeak, limit) : severity,
      ids: [id],
      fromS,
      toS,
      message: willList(findings, kind) ? describe(peak, limit, fromS, toS, otherPeak) : '',
      peakAmps: peak,
      limitAmps: limit,
    };
    findings.push(finding);
    made.push(finding);
  }
  return made;
}

const amps = (value: number) => `${Math.round(value * 1000) / 1000} A`;
const watts = (value: number) => `${Math.round(value * 100) / 100} W`;

/** Heat within this many watts of a package rating counts as within it. */
const WATTS_TOLERANCE = 1e-9;

/**
 * The power findings over a load profile: the five current findings and `driver-heat`. `names`
 * words the messages (checkPlan passes the plan's); without it, series are named as the profile
 * names them and times as session time.
 *
 * `driver-heat` (warning) `[driverId]`: one per maximal interval where the bridge's dissipation on its
 * maximum drop line exceeds the package rating. A warning, not an error: the rating is for one
 * mounting at 25 °C (copper, heat sink and air change it), so the message says how far over it is,
 * on the least and on the greatest drop. It carries watts (not amps): `peakWatts`, `limitWatts`.
 */
export function findPowerOverloads(profile: LoadProfile, derate: number, findings: FindingSink, names?: PlanNames): void {
  const span = names
    ? names.span
    : (fromS: number, toS: number) => `from ${formatSessionTime(fromS)} to ${formatSessionTime(toS)}`;
  const called = (s: LoadSeries, noun: string) => withNoun(noun, s.name.trim() || `"${s.id}"`);
  for (const cab of profile.cabs) {
    overloads(cab.id, cab.points, 1, cab.runningLimitAmps, 'channel-overload', 'error', (peak, limit, from, to) =>
      `${called(cab, 'cab')} draws up to ${amps(peak)} running ${span(from, to)}, above its channel's ${amps(limit)} continuous rating`,
      findings);
    overloads(cab.id, cab.points, 2, cab.peakLimitAmps, 'channel-peak-overload', 'error', (peak, limit, from, to) =>
      cab.surgeJudgedContinuous
        ? `${called(cab, 'cab')} draws up to ${amps(peak)} while trains start ${span(from, to)}; the start-up surge lasts longer than the channel's peak rating holds, so it is judged against the ${amps(limit)} continuous rating`
        : `${called(cab, 'cab')} draws up to ${amps(peak)} with start-up surge ${span(from, to)}, above its channel's ${amps(limit)} peak rating`,
      findings);
  }
  for (const driver of profile.drivers) {
    overloads(driver.id, driver.points, 2, driver.peakLimitAmps, 'driver-overload', 'error', (peak, limit, from, to) =>
      `${called(driver, 'driver')} carries up to ${amps(peak)} across its channels ${span(from, to)}, above its ${amps(limit)} total rating`,
      findings);
    const heat = driver.heat;
    if (heat === null || heat.limitWatts === null) continue;
    const made = overloads(
      driver.id,
      heat.points,
      2,
      heat.limitWatts,
      'driver-heat',
      'warning',
      (peak, limit, from, to, low) =>
        `${called(driver, 'driver')} dissipates about ${watts(low)} (least drop) to ${watts(peak)} (greatest drop) ${span(from, to)}, ` +
        `${low > limit + WATTS_TOLERANCE ? 'even at the least drop ' : ''}above its ${watts(limit)} package rating: add a heat sink or spread the trains over more drivers`,
      findings,
      WATTS_TOLERANCE,
    );
    for (const f of made) {
      f.peakWatts = f.peakAmps;
      f.limitWatts = f.limitAmps;
      delete f.peakAmps;
      delete f.limitAmps;
    }
  }
  for (const supply of profile.supplies) {
    overloads(supply.id, supply.points, 2, supply.peakLimitAmps, 'supply-overload', 'error', (peak, limit, from, to) =>
      `${called(supply, 'supply')} must deliver up to ${amps(peak)} ${span(from, to)}, above its ${amps(limit)} rating`,
      findings);
    overloads(supply.id, supply.points, 1, supply.runningLimitAmps, 'supply-derate', 'warning', (peak, limit, from, to) =>
      `${called(supply, 'supply')} runs at up to ${amps(peak)} ${span(from, to)}, above ${Math.round(derate * 100)} % of its rating (${amps(limit)}); continuous loads are best kept to 80 %`,
      findings);
  }
}
