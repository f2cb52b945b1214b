import { defaultRamps, dropAt, driverDrop, dutyFor, formatFast, indexPlan, neededOutput, plannedSpeedKmh, trainAmps, travelOfPlan, type Plan, type Travel } from '@/lib/planning';
import type { BlockWiring, ControlTiming, WiringSheet } from './wiring';

/** Format name and version of the control schedule (documented in the README). */
export const SCHEDULE_FORMAT = 'fishplate-control-schedule';
export const SCHEDULE_VERSION = 1;

export type Direction = 'forward' | 'reverse' | 'off';
export type Polarity = 'normal' | 'swapped';

/** One timed setting. `atMs`: real milliseconds from the schedule's origin. */
export type ControlEntry =
  | { atMs: number; kind: 'direction'; cabId: string; direction: Direction }
  /** A ramp is one entry: PWM goes from `from` to `to` (8-bit, 0..255) linearly over `rampMs` (0: at once). */
  | { atMs: number; kind: 'speed'; cabId: string; from: number; to: number; rampMs: number }
  | { atMs: number; kind: 'feed'; blockId: string; cabId: string | null }
  | { atMs: number; kind: 'polarity'; blockId: string; polarity: Polarity };

export type ControlFindingKind =
  | 'control-left-out'
  | 'control-reversing-stop'
  | 'interlock-shoot-through'
  | 'interlock-dead-time'
  | 'interlock-break-before-make'
  | 'interlock-two-cabs';

export interface ControlFinding {
  kind: ControlFindingKind;
  severity: 'error' | 'warning';
  ids: string[];
  /** Real session seconds. */
  fromS: number;
  toS: number;
  message: string;
}

export interface ScheduledRun {
  runId: string;
  trainId: string;
  cabId: string;
  departS: number;
  arriveS: number;
  pwm: number;
  speedKmh: number;
  /** Cab direction per step of the run, after any flip in a reversing section. */
  directions: Direction[];
}

export interface ControlSchedule {
  format: typeof SCHEDULE_FORMAT;
  version: typeof SCHEDULE_VERSION;
  /** Session seconds of atMs 0 (0 or earlier, so the first settings before the first run fit). */
  originS: number;
  clock: Plan['clock'];
  timing: ControlTiming;
  cabs: { cabId: string; name: string }[];
  blocks: { blockId: string; name: string; reversing: boolean }[];
  runs: ScheduledRun[];
  entries: ControlEntry[];
  /** atMs of the last entry's end (ramps included). */
  endMs: number;
  findings: ControlFinding[];
}

/**
 * What the schedule needs beyond the plan: the wiring, each run's scale speed (null: taken from the
 * run's steps) and each locomotive's top speed at its rated voltage.
 */
export interface ControlInput {
  plan: Plan;
  wiring: WiringSheet;
  runSpeedKmh: Readonly<Record<string, number | null>>;
  locomotiveTopSpeedKmh: Readonly<Record<string, number>>;
}

const KIND_ORDER: Record<ControlEntry['kind'], number> = { feed: 0, polarity: 1, direction: 2, speed: 3 };

/** Orders entries by time; at the same millisecond releases before connects, then polarity, direction, speed. */
export function compareEntries(a: ControlEntry, b: ControlEntry): number {
  if (a.atMs !== b.atMs) return a.atMs - b.atMs;
  const ka = KIND_ORDER[a.kind] * 2 + (a.kind === 'feed' && a.cabId !== null ? 1 : 0);
  const kb = KIND_ORDER[b.kind] * 2 + (b.kind === 'feed' && b.cabId !== null ? 1 : 0);
  return ka - kb;
}

interface Window {
  fromS: number;
  toS: number;
  runId: string;
}

/**
 * Sheets written before the track had ends: the direction through each block of a route from the
 * wiring sheet's `forwardTowards` — forward when the next block is one the block names; in the last
 * block, forward when the train came from a block that is not ahead of it. Used only for a layout
 * whose links and steps carry no ends (see `cabDirections`); otherwise the engine's ends decide.
 */
export function travelDirections(route: readonly string[], wiringOf: (blockId: string) => BlockWiring | undefined): Direction[] {
  return route.map((blockId, i) => {
    const towards = wiringOf(blockId)?.forwardTowards ?? [];
    const next = route[i + 1];
    if (next !== undefined) return towards.includes(next) ? 'forward' : 'reverse';
    const previous = route[i - 1];
    if (previous === undefined) return 'off';
    return towards.includes(previous) ? 'reverse' : 'forward';
  });
}

/**
 * Compiles a checked plan and its layout's wiring into the control schedule: per cab the direction
 * and the 8-bit PWM value with momentum as ramps, per block the feeding cab and a reversing section's
 * polarity. Runs are taken in order of departure; a run that would break an interlock against one
 * already scheduled (its cab still busy, a block still fed by another cab), that is not wired, whose
 * speed the cab cannot reach (`dutyFor`) or whose direction would change across a gap that is not a
 * reversing section is left out with a finding, so the schedule itself is always safe. The result is
 * then replayed by `checkInterlocks`, whose findings are added (none, unless this function is wrong).
 */
/** Whether a plan's track records ends anywhere (then the engine's direction of travel is the one to use). */
function trackHasEnds(plan: Plan): boolean {
  return (
    plan.links.some((l) => l.aEnd !== undefined || l.bEnd !== undefined) ||
    plan.runs.some((r) => r.steps.some((s) => s.fromEnd !== undefined || s.toEnd !== undefined))
  );
}

/**
 * The cab direction each step of a run needs, from the engine's direction of travel (travelOfPlan:
 * the steps' ends, else the links') and the block's wiring (`positiveRail`): `neededOutput`, NEM 631
 * 2.3 (right-hand rail positive in the direction of travel). An old sheet's `forwardTowards` is read
 * only when the layout records no ends at all and the sheet names some block ahead on the route.
 */
export function cabDirections(
  route: readonly string[],
  travel: Travel,
  positiveRail: (blockId: string) => 'right' | 'left' | undefined,
  legacy: ((route: readonly string[]) => Direction[]) | null,
): Direction[] {
  if (legacy) return legacy(route);
  return route.map((blockId, i) => (neededOutput(travel.toEnd[i]!, positiveRail(blockId)) === 1 ? 'forward' : 'reverse'));
}

export function compileSchedule(input: ControlInput): ControlSchedule {
  const { plan, wiring } = input;
  const timing = wiring.timing;
  const deadS = timing.deadTimeMs / 1000;
  const breakS = timing.breakMs / 1000;
  const cabWiring = new Map(wiring.cabs.map((c) => [c.cabId, c]));
  const blockWiring = new Map(wiring.blocks.map((b) => [b.blockId, b]));
  const cabById = new Map(plan.cabs.map((c) => [c.id, c]));
  const blockById = new Map(plan.blocks.map((b) => [b.id, b]));
  const trainById = new Map(plan.trains.map((t) => [t.id, t]));
  const locomotiveById = new Map(plan.locomotives.map((l) => [l.id, l]));
  const driverById = new Map(plan.drivers.map((d) => [d.id, d]));
  const supplyById = new Map(plan.supplies.map((s) => [s.id, s]));
  const blockName = (id: string) => blockById.get(id)?.name ?? id;
  const cabName = (id: string) => cabById.get(id)?.name ?? id;
  const fast = (s: number) => formatFast(s, plan.clock);
  const blockLength = new Map(plan.blocks.map((b) => [b.id, b.lengthMm]));
  const travels = travelOfPlan(plan, indexPlan(plan));
  const planOrder = new Map(plan.runs.map((r, i) => [r, i]));
  const hasEnds = trackHasEnds(plan);
  const sheetNamesAhead = wiring.blocks.some((b) => b.forwardTowards.length > 0);
  const legacy = !hasEnds && sheetNamesAhead ? (route: readonly string[]) => travelDirections(route, (b) => blockWiring.get(b)) : null;
  const rampDefault = defaultRamps(plan.scale.ratio);

  const findings: ControlFinding[] = [];
  const cabWindows = new Map<string, Window[]>();
  const blockWindows = new Map<string, (Window & { cabId: string; heldFrom: number; heldTo: number })[]>();
  type EntryBody = ControlEntry extends infer E ? (E extends ControlEntry ? Omit<E, 'atMs'> : never) : never;
  interface Pending { at: number; entry: EntryBody }
  const pending: Pending[] = [];
  const runs: ScheduledRun[] = [];

  const ordered = [...plan.runs].sort((a, b) => a.departS - b.departS || (a.id < b.id ? -1 : a.id > b.id ? 1 : 0));
  for (const run of ordered) {
    const train = trainById.get(run.trainId);
    const label = `${train?.name ?? run.trainId} (${fast(run.departS)} departure)`;
    const leaveOut = (why: string, ids: string[] = []) =>
      findings.push({
        kind: 'control-left-out',
        severity: 'error',
        ids: [run.id, ...ids],
        fromS: run.departS,
        toS: run.arriveS,
        message: `${label} is left out of the control schedule: ${why}`,
      });
    const cab = cabWiring.get(run.cabId);
    if (!train) {
      leaveOut(`its train ${run.trainId} is not in the plan`);
      continue;
    }
    if (!cab) {
      leaveOut(`${cabName(run.cabId)} is not on the wiring sheet`);
      continue;
    }
    const route = run.steps.map((s) => s.blockId);
    const unfed = route.find((b) => !blockWiring.get(b)?.feeds.some((f) => f.cabId === run.cabId));
    if (unfed !== undefined) {
      leaveOut(`${blockName(unfed)} has no relay to ${cabName(run.cabId)}`, [unfed]);
      continue;
    }
    if (route.length < 2) {
      leaveOut('it does not leave its block');
      continue;
    }
    if (run.steps.some((s) => !(s.exitS > run.departS && s.enterS < run.arriveS))) {
      leaveOut('a step lies wholly before its departure or after its arrival');
      continue;
    }

    // Direction per step, with the flips a reversing section allows.
    const r = planOrder.get(run)!;
    if (!legacy) {
      const t = travels[r]!;
      const turn = route.findIndex((_, i) => i > 0 && i < route.length - 1 && t.fromEnd[i] === t.toEnd[i] && route[i + 1] !== route[i]);
      if (turn !== -1) {
        leaveOut(`it changes direction in ${blockName(route[turn]!)}: the cab would have to stop and reverse there; make it two runs`, [route[turn]!]);
        continue;
      }
    }
    const travel = cabDirections(route, travels[r]!, (b) => blockById.get(b)?.positiveRail, legacy);
    const reversing = route.map((b) => blockWiring.get(b)!.polarityPin !== null);
    const firstFixed = travel.findIndex((_, i) => !reversing[i]);
    let cabDir: Direction = travel[firstFixed === -1 ? 0 : firstFixed]!;
    const directions: Direction[] = [];
    const flips: { step: number; to: Direction }[] = [];
    let broken: string | null = null;
    for (let i = 0; i < route.length; i++) {
      if (!reversing[i] && travel[i] !== cabDir) {
        const previous = i - 1;
        if (previous >= 0 && reversing[previous] && previous > 0) {
          flips.push({ step: previous, to: travel[i]! });
          directions[previous] = travel[i]!;
          cabDir = travel[i]!;
        } else {
          // The layout may call the block before a reversing section (the engine's model) while the sheet gives it no relay.
          const unswitched = previous >= 0 && blockById.get(route[previous]!)?.reversingSection ? route[previous]! : null;
          broken =
            unswitched !== null
              ? `${blockName(unswitched)} is a reversing section on the layout but the wiring sheet gives it no polarity relay`
              : `the cab would have to drive ${blockName(route[i - 1] ?? route[i]!)} and ${blockName(route[i]!)} in opposite directions with no reversing section between: the train would short the gap`;
          break;
        }
      }
      directions[i] = directions[i] ?? cabDir;
    }
    if (broken !== null) {
      leaveOut(broken);
      continue;
    }

    // PWM from the driver model: the locomotive that needs the most duty sets the cab's value.
    const driver = driverById.get(cabById.get(run.cabId)?.driverId ?? '');
    const supply = supplyById.get(driver?.supplyId ?? '');
    // The train's ramps (scale km/h per second), the scale's common practice where it has none.
    const accelKmhPerS = train.accelKmhPerS ?? rampDefault.accelKmhPerS;
    const brakingKmhPerS = train.brakingKmhPerS ?? rampDefault.brakingKmhPerS;
    const speedKmh = input.runSpeedKmh[run.id] ?? plannedSpeedKmh(plan, run, blockLength, { accelKmhPerS, brakingKmhPerS });
    if (speedKmh === null) {
      // Its route has two blocks or more (checked above): plannedSpeedKmh found no length for one of them.
      leaveOut('the length of its route is unknown (a block is not on the layout), so its speed is too');
      continue;
    }
    let pwm = 0;
    let stillPwm = 0;
    let pwmProblem: string | null = null;
    // The bridge's greatest drop at the train's running current, so the duty is enough (see dutyFor).
    const runningAmps = trainAmps(train.lightingAmps, train.locomotiveIds.map((id) => locomotiveById.get(id)).filter((l) => l !== undefined)).runningAmps;
    for (const locomotiveId of train.locomotiveIds) {
      const locomotive = locomotiveById.get(locomotiveId);
      const top = input.locomotiveTopSpeedKmh[locomotiveId];
      if (!locomotive || !driver || !supply || top === undefined) {
        pwmProblem = 'its locomotives, driver or supply are missing';
        break;
      }
      // The duty at each end of the ramps: at the cruise, and standing (dutyFor gives 0 at 0 km/h).
      const dutyAt = (targetSpeedKmh: number) =>
        dutyFor({
          supplyVolts: supply.volts,
          dropVolts: dropAt(driverDrop(driver).max, runningAmps),
          ratedVolts: locomotive.ratedVolts,
          topSpeedKmh: top,
          startVolts: locomotive.startVolts ?? 0,
          targetSpeedKmh,
        });
      const duty = dutyAt(Math.round(speedKmh * 10) / 10);
      const still = dutyAt(0);
      if (!duty.ok || !still.ok) {
        pwmProblem = `${locomotive.name}: ${duty.ok ? (still.ok ? '' : still.reason) : duty.reason}`;
        break;
      }
      stillPwm = Math.max(stillPwm, still.pwm8);
      pwm = Math.max(pwm, duty.pwm8);
    }
    if (pwmProblem !== null || pwm === 0) {
      leaveOut(pwmProblem ?? 'its speed gives a PWM value of 0');
      continue;
    }

    // Resource windows, checked against the runs already scheduled.
    const cabWindow: Window = { fromS: run.departS - timing.leadS, toS: run.arriveS + deadS, runId: run.id };
    // The relay is closed over `fromS..toS`; the block is held (fed or occupied) over `heldFrom..heldTo`.
    const feedWindows = new Map<string, Window & { cabId: string; heldFrom: number; heldTo: number }>();
    run.steps.forEach((step, i) => {
      const fromS = (i === 0 ? run.departS : step.enterS) - timing.leadS;
      const toS = (i === run.steps.length - 1 ? run.arriveS : step.exitS) + timing.releaseS;
      const had = feedWindows.get(step.blockId);
      feedWindows.set(step.blockId, {
        fromS: Math.min(had?.fromS ?? fromS, fromS),
        toS: Math.max(had?.toS ?? toS, toS),
        heldFrom: Math.min(had?.heldFrom ?? fromS, fromS, step.enterS),
        heldTo: Math.max(had?.heldTo ?? toS, toS, step.exitS),
        runId: run.id,
        cabId: run.cabId,
      });
    });
    // The cab is busy from its first block connecting to its last block released.
    for (const w of feedWindows.values()) {
      cabWindow.fromS = Math.min(cabWindow.fromS, w.fromS);
      cabWindow.toS = Math.max(cabWindow.toS, w.toS);
    }
    const cabClash = (cabWindows.get(run.cabId) ?? []).find((w) => w.fromS < cabWindow.toS && cabWindow.fromS < w.toS);
    if (cabClash) {
      leaveOut(`${cabName(run.cabId)} is still driving another run`, [cabClash.runId]);
      continue;
    }
    let blockClash: { blockId: string; runId: string } | null = null;
    for (const [blockId, w] of feedWindows) {
      const other = (blockWindows.get(blockId) ?? []).find((o) => o.heldFrom < w.heldTo + breakS && w.heldFrom < o.heldTo + breakS);
      if (other) {
        blockClash = { blockId, runId: other.runId };
        break;
      }
    }
    if (blockClash) {
      leaveOut(`${blockName(blockClash.blockId)} is still fed for another run`, [blockClash.blockId, blockClash.runId]);
      continue;
    }

    // Ramps: a speed change over the train's rate (0 → cruise at its acceleration, cruise → 0 at its braking).
    const accelS = speedKmh / accelKmhPerS;
    const brakeS = speedKmh / brakingKmhPerS;

    // Moving legs: from departure to each flip, and from each flip to arrival.
    const legs: { fromS: number; toS: number; direction: Direction }[] = [];
    let legStart = run.departS;
    let legDir = directions[0]!;
    const stops: { stopS: number; flipS: number; blockId: string; direction: Direction }[] = [];
    for (const flip of flips) {
      const prev = run.steps[flip.step - 1]!;
      const next = run.steps[flip.step + 1]!;
      const here = run.steps[flip.step]!;
      // Wholly inside: the tail has cleared the block before and the head has not reached the block after.
      const windowStart = Math.max(prev.exitS, here.enterS, legStart + 0.001);
      const windowEnd = Math.min(next.enterS, here.exitS, run.arriveS);
      const stopS = windowStart;
      const flipS = stopS + brakeS + deadS;
      if (!(flipS < windowEnd)) {
        broken = `the train is not wholly inside the reversing section ${blockName(route[flip.step]!)} long enough to stop (${Math.round(brakeS * 10) / 10} s) and change direction`;
        break;
      }
      legs.push({ fromS: legStart, toS: stopS + brakeS, direction: legDir });
      stops.push({ stopS, flipS, blockId: route[flip.step]!, direction: flip.to });
      legStart = flipS;
      legDir = flip.to;
    }
    if (broken !== null) {
      leaveOut(broken);
      continue;
    }
    legs.push({ fromS: legStart, toS: run.arriveS, direction: legDir });

    // Accepted: book the windows and write the settings.
    const cabList = cabWindows.get(run.cabId) ?? [];
    cabList.push(cabWindow);
    cabWindows.set(run.cabId, cabList);
    for (const [blockId, w] of feedWindows) {
      const list = blockWindows.get(blockId) ?? [];
      list.push(w);
      blockWindows.set(blockId, list);
    }
    runs.push({ runId: run.id, trainId: run.trainId, cabId: run.cabId, departS: run.departS, arriveS: run.arriveS, pwm, speedKmh, directions });

    for (const [blockId, w] of feedWindows) {
      pending.push({ at: w.fromS, entry: { kind: 'feed', blockId, cabId: run.cabId } });
      pending.push({ at: w.toS, entry: { kind: 'feed', blockId, cabId: null } });
    }
    route.forEach((blockId, i) => {
      if (!reversing[i] || route.indexOf(blockId) !== i) return;
      const dirAtEntry = i === 0 ? directions[0]! : directions[i - 1]!;
      const polarity: Polarity = travel[i] === dirAtEntry ? 'normal' : 'swapped';
      pending.push({ at: feedWindows.get(blockId)!.fromS, entry: { kind: 'polarity', blockId, polarity } });
    });

    pending.push({ at: run.departS - timing.leadS, entry: { kind: 'direction', cabId: run.cabId, direction: directions[0]! } });
    for (const leg of legs) {
      // A leg too short for both ramps at the train's rates (the engine's triangle, see Movement)
      // shortens both in proportion, so the train still stands at the leg's end.
      const span = Math.max(leg.toS - leg.fromS, 0);
      const scale = Math.min(1, span / Math.max(accelS + brakeS, 0.001));
      const upS = accelS * scale;
      const downS = brakeS * scale;
      pending.push({ at: leg.fromS, entry: { kind: 'speed', cabId: run.cabId, from: stillPwm, to: pwm, rampMs: Math.round(upS * 1000) } });
      pending.push({ at: leg.toS - downS, entry: { kind: 'speed', cabId: run.cabId, from: pwm, to: stillPwm, rampMs: Math.round(downS * 1000) } });
    }
    for (const stop of stops) {
      pending.push({ at: stop.flipS, entry: { kind: 'direction', cabId: run.cabId, direction: stop.direction } });
      const travelHere = travel[route.indexOf(stop.blockId)]!;
      pending.push({ at: stop.flipS, entry: { kind: 'polarity', blockId: stop.blockId, polarity: travelHere === stop.direction ? 'normal' : 'swapped' } });
      findings.push({
        kind: 'control-reversing-stop',
        severity: 'warning',
        ids: [run.id, stop.blockId],
        fromS: stop.stopS,
        toS: stop.flipS,
        message: `${label} stops in the reversing section ${blockName(stop.blockId)} for ${Math.round((stop.flipS - stop.stopS) * 10) / 10} s while its direction and the section's polarity change: add the time to the run`,
      });
    }
    pending.push({ at: run.arriveS + deadS, entry: { kind: 'direction', cabId: run.cabId, direction: 'off' } });
  }

  const earliest = pending.reduce((min, p) => Math.min(min, p.at), 0);
  const originS = Math.min(0, Math.floor(earliest) - 1);
  const entries = pending.map((p) => ({ ...p.entry, atMs: Math.round((p.at - originS) * 1000) }) as ControlEntry).sort(compareEntries);
  const endMs = entries.reduce((max, e) => Math.max(max, e.atMs + (e.kind === 'speed' ? e.rampMs : 0)), 0);

  const schedule: ControlSchedule = {
    format: SCHEDULE_FORMAT,
    version: SCHEDULE_VERSION,
    originS,
    clock: plan.clock,
    timing,
    cabs: wiring.cabs.filter((c) => cabById.has(c.cabId)).map((c) => ({ cabId: c.cabId, name: cabName(c.cabId) })),
    blocks: wiring.blocks
      .filter((b) => blockById.has(b.blockId))
      .map((b) => ({ blockId: b.blockId, name: blockName(b.blockId), reversing: b.polarityPin !== null })),
    runs,
    entries,
    endMs,
    findings,
  };
  schedule.findings.push(...checkInterlocks(schedule, plan));
  return schedule;
}

/** The PWM value of a cab at `atMs` given the last speed entry that started at or before it. */
export function pwmAt(entry: Extract<ControlEntry, { kind: 'speed' }> | undefined, atMs: number): number {
  if (!entry) return 0;
  if (entry.rampMs === 0 || atMs >= entry.atMs + entry.rampMs) return entry.to;
  const f = Math.max(0, atMs - entry.atMs) / entry.rampMs;
  return Math.round(entry.from + (entry.to - entry.from) * f);
}

/**
 * Replays a schedule and reports every broken interlock: a direction change while the cab's PWM was
 * not 0 for the whole dead time before it; a block relay switching while a train stands in it and a
 * cab it connects or disconnects has PWM above 0 (break before make), or a block switched from one
 * cab straight to another; a block fed by two cabs. Shoot-through cannot be written in the schedule
 * (a direction is forward, reverse or off), and is checked on the pins of the generated programs.
 */
export function checkInterlocks(schedule: ControlSchedule, plan: Plan): ControlFinding[] {
  const out: ControlFinding[] = [];
  const deadMs = schedule.timing.deadTimeMs;
  const toS = (ms: number) => ms / 1000 + schedule.originS;
  const lastSpeed = new Map<string, Extract<ControlEntry, { kind: 'speed' }>>();
  // From when each cab's PWM is 0 and stays 0 (null: it is not 0 for good); -Infinity: never driven yet.
  const zeroFrom = new Map<string, number | null>();
  const feed = new Map<string, string | null>();
  const lastRelease = new Map<string, number>();
  const scheduled = new Set(schedule.runs.map((r) => r.runId));
  const occupancy = new Map<string, { fromMs: number; toMs: number; cabId: string }[]>();
  for (const run of plan.runs) {
    if (!scheduled.has(run.id)) continue;
    for (const step of run.steps) {
      const list = occupancy.get(step.blockId) ?? [];
      list.push({ fromMs: (step.enterS - schedule.originS) * 1000, toMs: (step.exitS - schedule.originS) * 1000, cabId: run.cabId });
      occupancy.set(step.blockId, list);
    }
  }
  const pwmNow = (cabId: string, atMs: number) => pwmAt(lastSpeed.get(cabId), atMs);
  const report = (kind: ControlFindingKind, ids: string[], atMs: number, message: string) =>
    out.push({ kind, severity: 'error', ids, fromS: toS(atMs), toS: toS(atMs), message });

  for (const e of schedule.entries) {
    if (e.kind === 'speed') {
      const was = zeroFrom.has(e.cabId) ? zeroFrom.get(e.cabId)! : -Infinity;
      const stillZero = e.from === 0 && e.to === 0 && was !== null && was <= e.atMs;
      zeroFrom.set(e.cabId, e.to !== 0 ? null : stillZero ? was : e.atMs + e.rampMs);
      lastSpeed.set(e.cabId, e);
    } else if (e.kind === 'direction') {
      const since = zeroFrom.has(e.cabId) ? zeroFrom.get(e.cabId)! : -Infinity;
      if (since === null || e.atMs - since < deadMs) {
        report('interlock-dead-time', [e.cabId], e.atMs, `cab ${e.cabId} changes direction without ${deadMs} ms at PWM 0 first`);
      }
    } else if (e.kind === 'feed' || e.kind === 'polarity') {
      const current = feed.get(e.blockId) ?? null;
      const involved = e.kind === 'feed' ? [current, e.cabId] : [current];
      const currentFlows = involved.some((c) => c !== null && pwmNow(c, e.atMs) > 0);
      if (currentFlows && (occupancy.get(e.blockId) ?? []).some((o) => o.fromMs <= e.atMs && e.atMs <= o.toMs)) {
        report('interlock-break-before-make', [e.blockId], e.atMs, `block ${e.blockId} switches while current flows through it`);
      }
      if (e.kind === 'feed') {
        if (current !== null && e.cabId !== null) {
          report('interlock-two-cabs', [e.blockId, current, e.cabId], e.atMs, `block ${e.blockId} would be fed by ${current} and ${e.cabId} at once`);
        } else if (e.cabId !== null && e.atMs - (lastRelease.get(e.blockId) ?? -Infinity) < schedule.timing.breakMs) {
          report('interlock-break-before-make', [e.blockId], e.atMs, `block ${e.blockId} connects within ${schedule.timing.breakMs} ms of its last release`);
        }
        if (e.cabId === null) lastRelease.set(e.blockId, e.atMs);
        feed.set(e.blockId, e.cabId);
      }
    }
  }
  return out;
}
