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
  /** Scale speed, km/h. */
  speedKmh: number;
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
 * The steps of a run at constant scale speed, ready for a plan's run.
 *
 * The model: the train stands in route[0] from `departS − standBeforeS`. At `departS` its head is at
 * the exit end of route[0] and it moves at the model speed v = speedKmh ÷ 3.6 ÷ scaleRatio m/s
 * (see modelSpeedMmPerS). The head crosses each following block in `lengthMm / v`; a block is
 * occupied from the moment the head enters it until the tail clears its far end, a further
 * `trainLengthMm / v` (route[0] is held until the tail clears it, `trainLengthMm / v` after
 * departure). The train stops when its tail has cleared the second-to-last block, so
 * `arriveS` = head entering the last block + `trainLengthMm / v`, and it holds the last block until
 * `arriveS + standAfterS`. Because the train has a length, the last block is held for a positive time
 * even when standAfterS is 0. The model does not check that the train fits the last block: the
 * plan check's `train-too-long` finding does.
 *
 * A dwell in an intermediate block (`dwellS[blockId]`) stops the train with its head at that
 * block's exit end for that many seconds, then it goes on; every block the train still occupies
 * (its tail may reach back several blocks) is held for the dwell too. A block that appears more
 * than once in the route dwells each time; dwells named for route[0] or the last block are ignored,
 * since standBeforeS and standAfterS set those.
 *
 * The result meets the plan schema: steps sorted by enterS, each enterS < exitS,
 * first.enterS <= departS and arriveS <= last.exitS.
 *
 * @throws RangeError for a route of fewer than two blocks (a movement needs somewhere to go; a run
 *   that only stands is written by hand), an unknown block, or a speed, ratio, length or time that
 *   is not a positive (or, for stand and dwell times, non-negative) finite number.
 */
export function timeRun(input: TimeRunInput): TimedRun {
  const { route, departS, scaleRatio, trainLengthMm, speedKmh } = input;
  const standBeforeS = input.standBeforeS ?? 0;
  const standAfterS = input.standAfterS ?? 0;
  if (route.length < 2) throw new RangeError('timeRun needs a route of at least two blocks');
  requirePositive('speedKmh', speedKmh);
  requirePositive('scaleRatio', scaleRatio);
  requirePositive('trainLengthMm', trainLengthMm);
  requireFinite('departS', departS);
  requireNonNegative('standBeforeS', standBeforeS);
  requireNonNegative('standAfterS', standAfterS);

  const lengthOf = new Map<string, number>();
  for (const block of input.blocks) if (!lengthOf.has(block.id)) lengthOf.set(block.id, block.lengthMm);
  const lengths = route.map((blockId) => {
    const length = lengthOf.get(blockId);
    if (length === undefined) throw new RangeError(`timeRun: unknown block "${blockId}" in the route`);
    requirePositive(`length of block "${blockId}"`, length);
    return length;
  });

  const speed = modelSpeedMmPerS(speedKmh, scaleRatio);
  const last = route.length - 1;

  // exitEnd[i]: distance the head has run, from departure, when it reaches the exit end of route[i].
  const exitEnd = new Float64Array(route.length);
  for (let i = 1; i <= last; i++) exitEnd[i] = exitEnd[i - 1]! + lengths[i]!;

  // Stops at the exit end of intermediate blocks, in route order, with a running sum of dwell.
  const stopAt: number[] = [];
  const dwellBefore: number[] = [0];
  for (let i = 1; i < last; i++) {
    const dwell = input.dwellS?.[route[i]!];
    if (dwell === undefined || dwell === 0) continue;
    requireNonNegative(`dwellS["${route[i]}"]`, dwell);
    stopAt.push(exitEnd[i]!);
    dwellBefore.push(dwellBefore[dwellBefore.length - 1]! + dwell);
  }

  // When the head passes distance x. A stop exactly at x counts when the head moves on from x
  // (entering the next block happens after the dwell) but not when it reaches x (a tail clearing
  // the block behind happens as the train comes to rest).
  const dwellTo = (x: number, movingOn: boolean): number => {
    let lo = 0;
    let hi = stopAt.length;
    while (lo < hi) {
      const mid = (lo + hi) >> 1;
      if (movingOn ? stopAt[mid]! <= x : stopAt[mid]! < x) lo = mid + 1;
      else hi = mid;
    }
    return dwellBefore[lo]!;
  };
  const headLeaves = (x: number) => departS + x / speed + dwellTo(x, true);
  const headReaches = (x: number) => departS + x / speed + dwellTo(x, false);

  const steps: TimedRun['steps'] = [
    { blockId: route[0]!, enterS: departS - standBeforeS, exitS: headReaches(trainLengthMm) },
  ];
  for (let i = 1; i < last; i++) {
    steps.push({
      blockId: route[i]!,
      enterS: headLeaves(exitEnd[i - 1]!),
      exitS: headReaches(exitEnd[i]! + trainLengthMm),
    });
  }
  const arriveS = headReaches(exitEnd[last - 1]! + trainLengthMm);
  steps.push({ blockId: route[last]!, enterS: headLeaves(exitEnd[last - 1]!), exitS: arriveS + standAfterS });
  return { departS, arriveS, steps };
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
