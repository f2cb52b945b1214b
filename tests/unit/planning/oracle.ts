/**
 * Brute-force versions of the plan check and the baseline retimer, written for clarity rather
 * than speed: every pair of steps, every pair of runs, every breakpoint of the session.
 */
import type { Plan } from '@/lib/planning';

export interface OracleFinding {
  lowOver?: boolean;
  kind: string;
  severity: 'error' | 'warning';
  ids: string[];
  fromS?: number;
  toS?: number;
  peakAmps?: number;
  limitAmps?: number;
}

const TOL = 1e-9;
const pair = (a: string, b: string) => (a < b ? [a, b] : [b, a]);
const movementsOverlap = (a: Plan['runs'][number], b: Plan['runs'][number]) => a.departS < b.arriveS && b.departS < a.arriveS;

/** 1 ms: clashes must last, and gaps fall short, by more than this (the engine's TIME_TOLERANCE_S). */
const TIME_TOL = 0.001;

/** One thing a train does in a block: a step of one of its runs, or a stand (between runs, or at the session's ends). */
interface Piece {
  enterS: number;
  exitS: number;
  /** The run it speaks for: the step's own run, or the run before a stand (the first, for the wait before it). */
  run: number;
  /** Steps: the flat position (runs in plan order, steps in order), which breaks ties as the engine does. */
  flat: number;
  stand: boolean;
}

/** Every step and every stand of one train, walked through the whole session, in one block. */
export function oraclePieces(plan: Plan, trainId: string, blockId: string): { steps: Piece[]; stands: Piece[] } {
  const steps: Piece[] = [];
  let flat = 0;
  plan.runs.forEach((run, r) => {
    run.steps.forEach((step) => {
      if (run.trainId === trainId && step.blockId === blockId) steps.push({ enterS: step.enterS, exitS: step.exitS, run: r, flat, stand: false });
      flat++;
    });
  });
  const own = plan.runs
    .map((run, r) => ({ run, r }))
    .filter(({ run }) => run.trainId === trainId)
    .sort((x, y) => x.run.departS - y.run.departS || (x.run.id < y.run.id ? -1 : 1));
  const allExits = plan.runs.flatMap((run) => run.steps.map((s) => s.exitS));
  const sessionEnd = plan.sessionEndS ?? Math.max(...allExits);
  const stands: Piece[] = [];
  const stand = (r: number, block: string, fromS: number, toS: number) => {
    if (block === blockId && toS - fromS > TIME_TOL) stands.push({ enterS: fromS, exitS: toS, run: r, flat: -1, stand: true });
  };
  own.forEach(({ run, r }, i) => {
    const first = run.steps[0]!;
    const last = run.steps.at(-1)!;
    if (i === 0) stand(r, first.blockId, Math.min(0, first.enterS), first.enterS);
    const next = own[i + 1];
    stand(r, last.blockId, last.exitS, next ? next.run.steps[0]!.enterS : sessionEnd);
  });
  return { steps, stands };
}

/** A train's stays: its steps in the block merged, again and again, while two come within the headway. */
export function oracleStays(steps: Piece[], h: number): Piece[][] {
  let groups = steps.map((s) => [s]);
  const span = (g: Piece[]) => ({ enterS: Math.min(...g.map((p) => p.enterS)), exitS: Math.max(...g.map((p) => p.exitS)) });
  for (let merged = true; merged; ) {
    merged = false;
    outer: for (let i = 0; i < groups.length; i++) {
      for (let j = 0; j < groups.length; j++) {
        const x = span(groups[i]!);
        const y = span(groups[j]!);
        if (i !== j && x.enterS <= y.exitS + h && y.enterS <= x.exitS + h) {
          groups = [...groups.filter((_, k) => k !== i && k !== j), [...groups[i]!, ...groups[j]!]];
          merged = true;
          break outer;
        }
      }
    }
  }
  return groups;
}

/** One interval per stay or stand, speaking for the run entered last by a given time. */
interface Held {
  enterS: number;
  exitS: number;
  stand: boolean;
  runAt: (atS: number) => number;
}

function held(plan: Plan, trainId: string, blockId: string, h: number): Held[] {
  const { steps, stands } = oraclePieces(plan, trainId, blockId);
  const out: Held[] = stands.map((s) => ({ enterS: s.enterS, exitS: s.exitS, stand: true, runAt: () => s.run }));
  for (const group of oracleStays(steps, h)) {
    const byEntry = [...group].sort((x, y) => x.enterS - y.enterS || x.flat - y.flat);
    out.push({
      enterS: byEntry[0]!.enterS,
      exitS: Math.max(...group.map((p) => p.exitS)),
      stand: false,
      runAt: (atS) => [...byEntry].reverse().find((p) => p.enterS <= atS)?.run ?? byEntry[0]!.run,
    });
  }
  return out;
}

/**
 * The whole session's clashes, brute force: every pair of trains walked through every block
 * (stays and stands), every pair of runs for the bookings.
 */
export function oracleClashes(plan: Plan): OracleFinding[] {
  const out: OracleFinding[] = [];
  const h = plan.rules.headwayS;
  const runs = plan.runs;
  const trains = plan.trains;
  for (let i = 0; i < trains.length; i++) {
    for (let j = i + 1; j < trains.length; j++) {
      for (const block of plan.blocks) {
        for (const x of held(plan, trains[i]!.id, block.id, h)) {
          for (const y of held(plan, trains[j]!.id, block.id, h)) {
            if (!(x.enterS < y.exitS + h - TIME_TOL && y.enterS < x.exitS + h - TIME_TOL)) continue;
            const lastIn = Math.max(x.enterS, y.enterS);
            const firstOut = Math.min(x.exitS, y.exitS);
            const kind = x.stand || y.stand ? 'block-occupied' : 'block-overlap';
            // The time both hold the block, or the too-short gap between them.
            const [fromS, toS] = lastIn < firstOut ? [lastIn, firstOut] : [firstOut, lastIn];
            out.push({ kind, severity: 'error', ids: [block.id, ...pair(runs[x.runAt(lastIn)]!.id, runs[y.runAt(lastIn)]!.id)], fromS, toS });
          }
        }
      }
    }
  }
  const bookedTogether = (a: Plan['runs'][number], b: Plan['runs'][number]) => a.departS < b.arriveS - TIME_TOL && b.departS < a.arriveS - TIME_TOL;
  for (let i = 0; i < runs.length; i++) {
    for (let j = i + 1; j < runs.length; j++) {
      const a = runs[i]!;
      const b = runs[j]!;
      if (!bookedTogether(a, b)) continue;
      const at = { fromS: Math.max(a.departS, b.departS), toS: Math.min(a.arriveS, b.arriveS) };
      if (a.cabId === b.cabId) out.push({ kind: 'cab-double-booked', severity: 'error', ids: [a.cabId, ...pair(a.id, b.id)], ...at });
      if (a.operatorId !== null && a.operatorId === b.operatorId) {
        out.push({ kind: 'operator-double-booked', severity: 'error', ids: [a.operatorId, ...pair(a.id, b.id)], ...at });
      }
      if (a.trainId === b.trainId) out.push({ kind: 'train-double-booked', severity: 'error', ids: [a.trainId, ...pair(a.id, b.id)], ...at });
    }
  }
  // A locomotive in two trains: every train with runs is on the track for the whole session.
  // It is on the track from the session's start (or a run's first step, if earlier) to the session's
  // end (or a run's last step, if later).
  const onTrack = trains.filter((t) => runs.some((r) => r.trainId === t.id));
  const sessionEnd = plan.sessionEndS ?? Math.max(...runs.flatMap((r) => r.steps.map((s) => s.exitS)));
  const span = (t: Plan['trains'][number]) => {
    const own = runs.filter((r) => r.trainId === t.id);
    return { from: Math.min(0, ...own.map((r) => r.steps[0]!.enterS)), to: Math.max(sessionEnd, ...own.map((r) => r.steps.at(-1)!.exitS)) };
  };
  for (const locomotive of plan.locomotives) {
    const inIt = onTrack.filter((t) => t.locomotiveIds.includes(locomotive.id));
    for (let i = 0; i < inIt.length; i++) {
      for (let j = i + 1; j < inIt.length; j++) {
        const [x, y] = [span(inIt[i]!), span(inIt[j]!)];
        out.push({
          kind: 'locomotive-in-two-trains',
          severity: 'error',
          ids: [locomotive.id, ...pair(inIt[i]!.id, inIt[j]!.id)],
          fromS: Math.max(x.from, y.from),
          toS: Math.min(x.to, y.to),
        });
      }
    }
  }
  return out;
}

/** Gaps between consecutive steps of a run wider than 1 ms. */
export function oracleStepGaps(plan: Plan): OracleFinding[] {
  const out: OracleFinding[] = [];
  for (const run of plan.runs) {
    for (let i = 1; i < run.steps.length; i++) {
      if (run.steps[i]!.enterS - run.steps[i - 1]!.exitS > TIME_TOL) {
        out.push({
          kind: 'step-gap',
          severity: 'error',
          ids: [run.id, run.steps[i - 1]!.blockId, run.steps[i]!.blockId],
          fromS: run.steps[i - 1]!.exitS,
          toS: run.steps[i]!.enterS,
        });
      }
    }
  }
  return out;
}

export function oracleContinuityAndRoutes(plan: Plan): OracleFinding[] {
  const out: OracleFinding[] = [];
  for (const train of plan.trains) {
    const own = plan.runs
      .filter((run) => run.trainId === train.id)
      .sort((a, b) => a.departS - b.departS || (a.id < b.id ? -1 : 1));
    for (let i = 1; i < own.length; i++) {
      const earlier = own[i - 1]!;
      const later = own[i]!;
      if (earlier.steps.at(-1)!.blockId !== later.steps[0]!.blockId) {
        const [fromS, toS] = [earlier.arriveS, later.departS].sort((p, q) => p - q);
        out.push({ kind: 'train-continuity', severity: 'warning', ids: [train.id, earlier.id, later.id], fromS, toS });
      }
    }
  }
  for (const run of plan.runs) {
    for (let i = 1; i < run.steps.length; i++) {
      const a = run.steps[i - 1]!.blockId;
      const b = run.steps[i]!.blockId;
      const linked = plan.links.some((l) => (l.a === a && l.b === b) || (l.a === b && l.b === a));
      const [fromS, toS] = [run.steps[i - 1]!.exitS, run.steps[i]!.enterS].sort((p, q) => p - q);
      if (a !== b && !linked) out.push({ kind: 'route-gap', severity: 'error', ids: [run.id, a, b], fromS, toS });
    }
    const train = plan.trains.find((t) => t.id === run.trainId)!;
    const first = run.steps[0]!;
    const last = run.steps.at(-1)!;
    // Where the train stands before it departs and after it arrives; one stand when both are one block.
    const stands =
      first.blockId === last.blockId
        ? [{ blockId: first.blockId, fromS: first.enterS, toS: last.exitS }]
        : [
            { blockId: first.blockId, fromS: first.enterS, toS: run.departS },
            { blockId: last.blockId, fromS: run.arriveS, toS: last.exitS },
          ];
    for (const { blockId, fromS, toS } of stands) {
      const block = plan.blocks.find((b) => b.id === blockId)!;
      if (block.lengthMm < train.lengthMm) out.push({ kind: 'train-too-long', severity: 'warning', ids: [run.id, blockId], fromS, toS });
    }
  }
  return out;
}

/**
 * A run's running current, and its start current: each locomotive's stall current scaled by its start
 * voltage over its rated voltage (a stalled motor is a resistance), at least its running current;
 * the full stall current when no start voltage is recorded.
 */
export function runAmps(plan: Plan, run: Plan['runs'][number]): { running: number; stall: number } {
  const train = plan.trains.find((t) => t.id === run.trainId)!;
  let running = train.lightingAmps;
  let stall = train.lightingAmps;
  for (const id of train.locomotiveIds) {
    const locomotive = plan.locomotives.find((l) => l.id === id)!;
    running += locomotive.runningAmps;
    const sv = locomotive.startVolts;
    stall += sv === undefined || sv === null ? locomotive.stallAmps : Math.max(locomotive.runningAmps, (locomotive.stallAmps * Math.min(sv, locomotive.ratedVolts)) / locomotive.ratedVolts);
  }
  return { running, stall };
}

/** A driver's drop lines; a plan with one fixed dropVolts has the same flat line for both. */
export function dropLines(driver: Plan['drivers'][number]) {
  return driver.drop ?? { min: { fixedVolts: driver.dropVolts!, ohms: 0 }, max: { fixedVolts: driver.dropVolts!, ohms: 0 } };
}

/** Every time at which some load can change, sorted, without repeats. */
export function breakpoints(plan: Plan): number[] {
  const times = new Set<number>();
  for (const run of plan.runs) {
    times.add(run.departS);
    times.add(run.arriveS);
    if (run.departS + plan.rules.surgeS < run.arriveS) times.add(run.departS + plan.rules.surgeS);
  }
  return [...times].sort((a, b) => a - b);
}

/** Load at time t, summed directly over the runs that pass the filter. */
export function loadAt(plan: Plan, t: number, counts: (run: Plan['runs'][number]) => boolean): { running: number; peak: number } {
  let running = 0;
  let peak = 0;
  for (const run of plan.runs) {
    if (!counts(run) || !(run.departS <= t && t < run.arriveS)) continue;
    const amps = runAmps(plan, run);
    running += amps.running;
    peak += t < run.departS + plan.rules.surgeS ? amps.stall : amps.running;
  }
  return { running, peak };
}

export function cabOwner(plan: Plan) {
  const driverOfCab = (cabId: string) => plan.drivers.find((d) => d.id === plan.cabs.find((c) => c.id === cabId)!.driverId)!;
  return {
    cab: (cabId: string) => (run: Plan['runs'][number]) => run.cabId === cabId,
    driver: (driverId: string) => (run: Plan['runs'][number]) => driverOfCab(run.cabId).id === driverId,
    supply: (supplyId: string) => (run: Plan['runs'][number]) => driverOfCab(run.cabId).supplyId === supplyId,
  };
}

export function oraclePower(plan: Plan): OracleFinding[] {
  const times = breakpoints(plan);
  const owner = cabOwner(plan);
  const out: OracleFinding[] = [];
  const scan = (kind: string, severity: 'error' | 'warning', id: string, counts: (run: Plan['runs'][number]) => boolean, which: 'running' | 'peak', limit: number | null) => {
    if (limit === null) return;
    let open: OracleFinding | null = null;
    for (let i = 0; i + 1 < times.length; i++) {
      const load = loadAt(plan, times[i]!, counts)[which];
      if (load > limit + TOL) {
        if (open === null) open = { kind, severity, ids: [id], fromS: times[i]!, toS: times[i + 1]!, peakAmps: load, limitAmps: limit };
        else {
          open.toS = times[i + 1]!;
          open.peakAmps = Math.max(open.peakAmps!, load);
        }
      } else if (open !== null) {
        out.push(open);
        open = null;
      }
    }
    if (open !== null) out.push(open);
  };
  for (const cab of plan.cabs) {
    const driver = plan.drivers.find((d) => d.id === cab.driverId)!;
    scan('channel-overload', 'error', cab.id, owner.cab(cab.id), 'running', driver.channelAmps);
    // Datasheets: a peak rating holds for its pulse width only; a longer surge (or any, when no width
    // is given) is judged against the continuous rating. No width recorded at all: the peak holds.
    const pulse = driver.peakPulseS;
    const peakHolds = pulse === undefined || (pulse !== null && plan.rules.surgeS <= pulse);
    scan('channel-peak-overload', 'error', cab.id, owner.cab(cab.id), 'peak', peakHolds ? driver.channelPeakAmps : driver.channelAmps);
  }
  for (const driver of plan.drivers) scan('driver-overload', 'error', driver.id, owner.driver(driver.id), 'peak', driver.totalAmps);
  for (const supply of plan.supplies) {
    scan('supply-overload', 'error', supply.id, owner.supply(supply.id), 'peak', supply.amps);
    scan('supply-derate', 'warning', supply.id, owner.supply(supply.id), 'running', supply.amps * plan.rules.derate);
  }
  return out;
}

/**
 * Driver heat at time t: over the driver's cabs, (fixed + ohms × I) × I for the cab's running
 * current I, on the minimum and on the maximum drop line.
 */
export function heatAt(plan: Plan, driver: Plan['drivers'][number], t: number): { low: number; high: number } {
  const owner = cabOwner(plan);
  const { min, max } = dropLines(driver);
  let low = 0;
  let high = 0;
  for (const cab of plan.cabs.filter((c) => c.driverId === driver.id)) {
    const amps = loadAt(plan, t, owner.cab(cab.id)).running;
    if (amps <= 0) continue;
    low += (min.fixedVolts + min.ohms * amps) * amps;
    high += (max.fixedVolts + max.ohms * amps) * amps;
  }
  return { low, high };
}

/** `driver-heat`: maximal intervals where the maximum-line heat exceeds the package rating. */
export function oracleHeat(plan: Plan): OracleFinding[] {
  const times = breakpoints(plan);
  const out: OracleFinding[] = [];
  for (const driver of plan.drivers) {
    const limit = driver.packageWatts;
    if (limit === undefined || limit === null) continue;
    let open: (OracleFinding & { lowOver: boolean }) | null = null;
    const close = () => {
      if (open === null) return;
      const { lowOver, ...finding } = open;
      // Severity is always a warning; whether even the least drop is over shows in the message.
      out.push({ ...finding, severity: 'warning', lowOver });
      open = null;
    };
    for (let i = 0; i + 1 < times.length; i++) {
      const heat = heatAt(plan, driver, times[i]!);
      if (heat.high > limit + TOL) {
        if (open === null) open = { kind: 'driver-heat', severity: 'warning', ids: [driver.id], fromS: times[i]!, toS: times[i + 1]!, lowOver: false };
        open.toS = times[i + 1]!;
        open.lowOver ||= heat.low > limit + TOL;
      } else close();
    }
    close();
  }
  return out;
}

/**
 * Voltage: full-throttle track volts = supply − drop. High: above a locomotive's rating, per cab and
 * locomotive. Low: below NEM 630 Table 1's nominal for the scale's gauge (8 / 12 / 16 V), per cab with runs.
 */
export function oracleVoltage(plan: Plan, gaugeMm: number | null): OracleFinding[] {
  const out: OracleFinding[] = [];
  const nominal = gaugeMm === null ? null : gaugeMm <= 6.5 ? 8 : gaugeMm < 32 ? 12 : 16;
  for (const cab of plan.cabs) {
    const driver = plan.drivers.find((d) => d.id === cab.driverId)!;
    const supply = plan.supplies.find((s) => s.id === driver.supplyId)!;
    const { min, max } = dropLines(driver);
    const runs = plan.runs.filter((run) => run.cabId === cab.id);
    if (runs.length === 0) continue;
    // Over-voltage with the least drop at each train's own running current.
    const highest = (run: Plan['runs'][number]) => {
      const amps = runAmps(plan, run).running;
      return supply.volts - (min.fixedVolts + min.ohms * amps);
    };
    for (const locomotive of plan.locomotives) {
      const on = runs.filter((run) => plan.trains.find((t) => t.id === run.trainId)!.locomotiveIds.includes(locomotive.id) && highest(run) > locomotive.ratedVolts + TOL);
      if (on.length > 0) {
        out.push({
          kind: 'track-voltage-high',
          severity: 'warning',
          ids: [cab.id, locomotive.id],
          fromS: Math.min(...on.map((r) => r.departS)),
          toS: Math.max(...on.map((r) => r.arriveS)),
        });
      }
    }
    // Under-voltage with the greatest drop at the heaviest train (NMRA S-9 I.A: maximum anticipated load).
    const heaviest = Math.max(...runs.map((run) => runAmps(plan, run).running));
    const lowest = supply.volts - (max.fixedVolts + max.ohms * heaviest);
    if (nominal !== null && lowest < nominal - TOL) {
      out.push({
        kind: 'track-voltage-low',
        severity: 'warning',
        ids: [cab.id],
        fromS: Math.min(...runs.map((r) => r.departS)),
        toS: Math.max(...runs.map((r) => r.arriveS)),
      });
    }
  }
  return out;
}

/**
 * The cruise (mm/s) that covers `distance` mm in `seconds` from a stand to a stand with ramps
 * `a`, `b` (mm/s²), found by bisection on the movement's duration: D/v + v/2a + v/2b while the
 * ramps fit (v²/2a + v²/2b ≤ D), else the triangle's √(2D(1/a + 1/b)), which no cruise shortens.
 * Too short a time for even the triangle: its peak for that time, 2D/T.
 */
function cruiseFor(distance: number, seconds: number, a: number, b: number): number {
  const duration = (v: number) => (v * v * (1 / a + 1 / b) <= 2 * distance ? distance / v + v / (2 * a) + v / (2 * b) : Math.sqrt(2 * distance * (1 / a + 1 / b)));
  if (seconds <= duration(1e12) * (1 + 1e-12)) return (2 * distance) / seconds;
  let lo = 1e-9;
  let hi = Math.sqrt((2 * distance) / (1 / a + 1 / b)); // the fastest cruise the ramps let it reach
  for (let i = 0; i < 200; i++) {
    const mid = (lo + hi) / 2;
    if (duration(mid) > seconds) lo = mid;
    else hi = mid;
  }
  return (lo + hi) / 2;
}

/**
 * Speed: a run's cruise scale speed (head distance = every block after the first, over the
 * movement time, less the ramps' cost when the train has ramps; km/h = mm/s × ratio × 3.6 / 1000)
 * against each locomotive's top speed and against the track voltage with the greatest drop at the
 * train's current.
 */
export function oracleSpeed(plan: Plan): OracleFinding[] {
  const out: OracleFinding[] = [];
  for (const run of plan.runs) {
    const train = plan.trains.find((t) => t.id === run.trainId)!;
    const cab = plan.cabs.find((c) => c.id === run.cabId)!;
    const driver = plan.drivers.find((d) => d.id === cab.driverId)!;
    const supply = plan.supplies.find((s) => s.id === driver.supplyId)!;
    const distance = run.steps.slice(1).reduce((sum, step) => sum + plan.blocks.find((b) => b.id === step.blockId)!.lengthMm, 0);
    if (distance === 0) continue; // one block: the run stands, nothing to reach
    const seconds = run.arriveS - run.departS;
    const rate = (kmhPerS: number) => ((kmhPerS / 3.6) * 1000) / plan.scale.ratio;
    const mmPerS =
      train.accelKmhPerS === undefined || train.brakingKmhPerS === undefined
        ? distance / seconds
        : cruiseFor(distance, seconds, rate(train.accelKmhPerS), rate(train.brakingKmhPerS));
    const kmh = (mmPerS * plan.scale.ratio * 3.6) / 1000;
    const amps = runAmps(plan, run).running;
    const { max } = dropLines(driver);
    const track = supply.volts - (max.fixedVolts + max.ohms * amps);
    for (const id of train.locomotiveIds) {
      const locomotive = plan.locomotives.find((l) => l.id === id)!;
      if (locomotive.topSpeedKmh === undefined || locomotive.topSpeedKmh === null) continue;
      const sv = locomotive.startVolts ?? 0;
      const needed = sv + ((locomotive.ratedVolts - sv) * Math.min(kmh, locomotive.topSpeedKmh)) / locomotive.topSpeedKmh;
      if (kmh > locomotive.topSpeedKmh * (1 + 1e-6) || needed > track) out.push({ kind: 'speed-not-reachable', severity: 'warning', ids: [run.id, id], fromS: run.departS, toS: run.arriveS });
    }
  }
  return out;
}

/** The shifted copy of a plan, written out independently of the engine's applyRetime. */
export function shiftRuns(plan: Plan, delays: readonly { runId: string; delayS: number }[]): Plan {
  const delayOf = new Map(delays.map((d) => [d.runId, d.delayS]));
  return {
    ...plan,
    runs: plan.runs.map((run) => {
      const d = delayOf.get(run.id) ?? 0;
      return {
        ...run,
        departS: run.departS + d,
        arriveS: run.arriveS + d,
        steps: run.steps.map((s) => ({ ...s, enterS: s.enterS + d, exitS: s.exitS + d })),
      };
    }),
  };
}

/** Do two (shifted) runs clash in a way the retimer must clear? */
function clash(plan: Plan, a: Plan['runs'][number], b: Plan['runs'][number]): boolean {
  const h = plan.rules.headwayS;
  if (movementsOverlap(a, b)) {
    if (a.cabId === b.cabId || a.trainId === b.trainId) return true;
    if (a.operatorId !== null && a.operatorId === b.operatorId) return true;
  }
  if (a.trainId === b.trainId) return false;
  return a.steps.some((sa) => b.steps.some((sb) => sa.blockId === sb.blockId && sa.enterS < sb.exitS + h && sb.enterS < sa.exitS + h));
}

/** The next double above x, by its bit pattern. */
function nextUp(x: number): number {
  if (x === 0) return Number.MIN_VALUE;
  const view = new DataView(new ArrayBuffer(8));
  view.setFloat64(0, x);
  view.setBigInt64(0, view.getBigInt64(0) + (x > 0 ? 1n : -1n));
  return view.getFloat64(0);
}

/** Smallest shift d with base + d >= target as the computer adds them (one bump at a time). */
function reach(base: number, target: number): number {
  let d = target - base;
  while (base + d < target) d = nextUp(d);
  return d;
}

/**
 * The baseline of the issue, done the obvious way: runs by departS (ties by id), each given the
 * smallest delay at which it clashes with none placed and leaves after its train's placed runs
 * arrive. The smallest delay is either the lower bound or a point where some clash just ends, so
 * those are the only candidates to try.
 */
export function oracleBaselineTotal(plan: Plan): number {
  const order = [...plan.runs].sort((a, b) => a.departS - b.departS || (a.id < b.id ? -1 : 1));
  const h = plan.rules.headwayS;
  const placed: Plan['runs'][number][] = [];
  let total = 0;
  for (const run of order) {
    let low = 0;
    for (const p of placed) if (p.trainId === run.trainId) low = Math.max(low, reach(run.departS, p.arriveS));
    const candidates = [low];
    for (const p of placed) {
      candidates.push(reach(run.departS, p.arriveS));
      for (const sp of p.steps) for (const s of run.steps) if (sp.blockId === s.blockId) candidates.push(reach(s.enterS, sp.exitS + h));
    }
    const shift = (d: number) => shiftRuns({ ...plan, runs: [run] }, [{ runId: run.id, delayS: d }]).runs[0]!;
    let chosen = Infinity;
    for (const d of candidates.filter((c) => c >= low).sort((a, b) => a - b)) {
      const moved = shift(d);
      const trainFree = placed.every((p) => p.trainId !== run.trainId || moved.departS >= p.arriveS);
      if (trainFree && placed.every((p) => !clash(plan, moved, p))) {
        chosen = d;
        break;
      }
    }
    total += chosen;
    placed.push(shift(chosen));
  }
  return total;
}
