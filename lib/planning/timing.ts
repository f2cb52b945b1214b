import { Movement, modelRateMmPerS2 } from './motion';

/**
 * Model speed in mm/s for a scale speed: km/h ÷ 3.6 gives prototype m/s, ÷ the scale ratio gives
 * model m/s, × 1000 gives mm/s. 100 km/h in 1:87 is 100 000 m / 3600 s / 87 = 319.3 mm/s.
 */
export function modelSpeedMmPerS(speedKmh: number, scaleRatio: number): number {
  return ((speedKmh / 3.6) * 1000) / scaleRatio;
}

export interface TimeRunInput {
  blocks: readonly { id: string; lengthMm: number }[];
  scaleRatio: number;
  trainLengthMm: number;
  /** Block ids from the block the train stands in to the block it stops in; at least two. */
  route: readonly string[];
  departS: number;
  /** Scale speed, km/h: the cruise. */
  speedKmh: number;
  /**
   * Scale km/h gained per second from a stand (see defaultRamps for common practice). Absent: the
   * train is at speed at once (the constant-speed model).
   */
  accelKmhPerS?: number;
  /** Scale km/h lost per second when stopping. Absent: the train stops at once. */
  brakingKmhPerS?: number;
  /**
   * How far the head stands short of route[0]'s far end at departure, mm; default 0, where the
   * last run of the train stopped (its head at the far end of its last block). A train that
   * reverses out of the block it stopped in starts with its new head `length of route[0] − train
   * length` short of the end it now leaves by.
   */
  startBackMm?: number;
  /** How long the train stands in route[0] before departing; default 0. */
  standBeforeS?: number;
  /** How long the train stands in the last block after arriving; default 0. */
  standAfterS?: number;
  /** Stops on the way: seconds to stand in an intermediate block, keyed by block id. */
  dwellS?: Readonly<Record<string, number>>;
}

export interface TimedRun {
  departS: number;
  arriveS: number;
  steps: { blockId: string; enterS: number; exitS: number }[];
}

/**
 * The steps of a run, ready for a plan's run.
 *
 * The model (elementary kinematics; the rates are common practice, see defaultRamps): the train
 * stands in route[0] from `departS − standBeforeS` with its head at route[0]'s far end (where its
 * last run stopped it, less `startBackMm`). At `departS` it accelerates at `accelKmhPerS` to the
 * cruise `speedKmh`, runs at it, and brakes at `brakingKmhPerS` so as to stop with its head at the
 * far end of the last block, at `arriveS` (a Movement; scale rates and speeds become model ones by
 * ÷ 3.6 ÷ scaleRatio, see modelSpeedMmPerS). A block is occupied from the moment the head enters
 * it until the tail clears its far end, `trainLengthMm` of head travel later (route[0] until the
 * head has run `startBackMm + trainLengthMm`). A block the tail has not cleared when the train
 * stops (a train longer than its last block) is held with the last block, to `arriveS +
 * standAfterS`. The model does not check that the train fits the last block: the plan check's
 * `train-too-long` finding does.
 *
 * So the next run of the same train, from the block this one ends in, starts where this one
 * stopped: its head at that block's far end.
 *
 * A dwell in an intermediate block (`dwellS[blockId]`) brakes the train to a stop with its head at
 * that block's far end, stands that many seconds and accelerates again: each stretch between stops
 * is its own Movement. Every block the train still occupies (its tail may reach back several
 * blocks) is held for the dwell too. A block that appears more than once in the route dwells each
 * time; dwells named for route[0] or the last block are ignored, since standBeforeS and standAfterS
 * set those.
 *
 * The result meets the plan schema: steps sorted by enterS, each enterS < exitS,
 * first.enterS <= departS and arriveS <= last.exitS.
 *
 * @throws RangeError for a route of fewer than two blocks (a movement needs somewhere to go; a run
 *   that only stands is written by hand), an unknown block, or a speed, rate, ratio, length or time
 *   that is not a positive (or, for stand, dwell and start-back figures, non-negative) finite number.
 */
export function timeRun(input: TimeRunInput): TimedRun {
  const { route, departS, scaleRatio, trainLengthMm, speedKmh } = input;
  const standBeforeS = input.standBeforeS ?? 0;
  const standAfterS = input.standAfterS ?? 0;
  const startBackMm = input.startBackMm ?? 0;
  if (route.length < 2) throw new RangeError('timeRun needs a route of at least two blocks');
  requirePositive('speedKmh', speedKmh);
  requirePositive('scaleRatio', scaleRatio);
  requirePositive('trainLengthMm', trainLengthMm);
  requireFinite('departS', departS);
  requireNonNegative('standBeforeS', standBeforeS);
  requireNonNegative('standAfterS', standAfterS);
  requireNonNegative('startBackMm', startBackMm);
  if (input.accelKmhPerS !== undefined) requirePositive('accelKmhPerS', input.accelKmhPerS);
  if (input.brakingKmhPerS !== undefined) requirePositive('brakingKmhPerS', input.brakingKmhPerS);

  const lengthOf = new Map<string, number>();
  for (const block of input.blocks) if (!lengthOf.has(block.id)) lengthOf.set(block.id, block.lengthMm);
  const lengths = route.map((blockId) => {
    const length = lengthOf.get(blockId);
    if (length === undefined) throw new RangeError(`timeRun: unknown block "${blockId}" in the route`);
    requirePositive(`length of block "${blockId}"`, length);
    return length;
  });

  const cruise = modelSpeedMmPerS(speedKmh, scaleRatio);
  const accel = input.accelKmhPerS === undefined ? Infinity : modelRateMmPerS2(input.accelKmhPerS, scaleRatio);
  const braking = input.brakingKmhPerS === undefined ? Infinity : modelRateMmPerS2(input.brakingKmhPerS, scaleRatio);
  const last = route.length - 1;

  // exitEnd[i]: distance the head has run, from departure, when it reaches the far end of route[i].
  const exitEnd = new Float64Array(route.length);
  exitEnd[0] = startBackMm;
  for (let i = 1; i <= last; i++) exitEnd[i] = exitEnd[i - 1]! + lengths[i]!;
  const distance = exitEnd[last]!;

  // The stretches between stops: each starts (at `from`, at time `startS`) and ends at a stand.
  const stretches: { from: number; startS: number; movement: Movement }[] = [];
  let from = 0;
  let startS = departS;
  const addStretch = (to: number) => {
    const movement = new Movement(to - from, cruise, accel, braking);
    stretches.push({ from, startS, movement });
    from = to;
    startS += movement.duration;
  };
  for (let i = 1; i < last; i++) {
    const dwell = input.dwellS?.[route[i]!];
    if (dwell === undefined || dwell === 0) continue;
    requireNonNegative(`dwellS["${route[i]}"]`, dwell);
    addStretch(exitEnd[i]!);
    startS += dwell;
  }
  addStretch(distance);
  const arrival = startS; // the end of the last stretch: the head at the last block's far end

  // When the head passes distance x. At a stop exactly at x, the head leaves x when the next
  // stretch starts (entering the next block happens after the dwell) but reaches it when the
  // stretch before ends (a tail clearing the block behind happens as the train comes to rest).
  const find = (x: number, movingOn: boolean): number => {
    let lo = 0;
    let hi = stretches.length - 1;
    while (lo < hi) {
      const mid = (lo + hi + 1) >> 1;
      const start = stretches[mid]!.from;
      if (movingOn ? start <= x : start < x) lo = mid;
      else hi = mid - 1;
    }
    return lo;
  };
  const at = (x: number, movingOn: boolean): number => {
    const stretch = stretches[find(x, movingOn)]!;
    return stretch.startS + stretch.movement.timeAt(x - stretch.from);
  };
  // A block whose far end the tail has not cleared when the train stops is held with the last one.
  const tailClears = (x: number): number => (x > distance ? arrival + standAfterS : at(x, false));

  const steps: TimedRun['steps'] = [{ blockId: route[0]!, enterS: departS - standBeforeS, exitS: tailClears(exitEnd[0]! + trainLengthMm) }];
  for (let i = 1; i < last; i++) {
    steps.push({ blockId: route[i]!, enterS: at(exitEnd[i - 1]!, true), exitS: tailClears(exitEnd[i]! + trainLengthMm) });
  }
  steps.push({ blockId: route[last]!, enterS: at(exitEnd[last - 1]!, true), exitS: arrival + standAfterS });
  return { departS, arriveS: arrival, steps };
}

function requireFinite(name: string, value: number): void {
  if (!Number.isFinite(value)) throw new RangeError(`timeRun: ${name} must be a finite number`);
}

function requirePositive(name: string, value: number): void {
  if (!Number.isFinite(value) || value <= 0) throw new RangeError(`timeRun: ${name} must be greater than 0`);
}

function requireNonNegative(name: string, value: number): void {
  if (!Number.isFinite(value) || value < 0) throw new RangeError(`timeRun: ${name} must be 0 or more`);
}
