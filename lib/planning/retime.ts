import { IntervalUnion, shiftReaching } from './intervals';
import { indexPlan, type PlanIndex } from './plan-index';
import type { Plan } from './schema';

export interface Retime {
  runId: string;
  /** Seconds to add to the run's departS, arriveS and every step; always > 0. */
  delayS: number;
}

export interface RetimeOptions {
  /**
   * `baseline` places runs in order of departS (ties by run id), each at the smallest delay that
   * clashes with none placed before it. `best` (the default) also tries a second order and keeps
   * whichever needs less delay in total, so it never needs more than the baseline.
   */
  strategy?: 'baseline' | 'best';
  /**
   * Runs that must not move (during a session: those already under way or done). They are placed
   * first, at delay 0, and every other run is fitted around them.
   */
  fixed?: ReadonlySet<string>;
}

/**
 * Delays that clear every `block-overlap`, `cab-double-booked`, `operator-double-booked` and
 * `train-double-booked` finding once applied (not `block-occupied`: a standing train is not moved
 * by a delay) (shift the run's departS, arriveS and all steps by
 * delayS), keep each train's runs in order (a later run departs no earlier than the earlier one
 * arrives), and delay no more in total than the baseline greedy. One entry per moved run, in plan
 * order.
 *
 * The greedy places runs one at a time. Runs already placed never clash with each other, so the
 * time each block, cab and operator is taken forms a set of disjoint intervals (IntervalUnion);
 * a new run's smallest delay is found by jumping past the interval it meets until it meets none, a
 * binary search per jump, so a typical plan costs O(steps log steps).
 *
 * How `best` improves on the baseline: the departS order makes a short run wait behind a long one
 * that departed a moment earlier. The second order places runs by arriveS, which lets short runs
 * go first (the same idea as shortest-job-first), with each train's runs kept in their departS
 * order by giving a train's places in the order to its runs in turn. The smaller total wins.
 */
export function suggestRetime(plan: Plan, options: RetimeOptions = {}): Retime[] {
  const index = indexPlan(plan);
  const runs = plan.runs;
  const fixed = new Uint8Array(runs.length);
  if (options.fixed) runs.forEach((run, r) => (fixed[r] = options.fixed!.has(run.id) ? 1 : 0));
  const fixedFirst = (order: number[]) => [...order.filter((r) => fixed[r]), ...order.filter((r) => !fixed[r])];
  const byDeparture = runs.map((_, r) => r);
  byDeparture.sort((a, b) => compareRuns(plan, a, b));
  let delays = placeGreedily(plan, index, fixedFirst(byDeparture), fixed);

  if ((options.strategy ?? 'best') === 'best' && runs.length > 1) {
    const byArrival = runs.map((_, r) => r);
    byArrival.sort((a, b) => runs[a]!.arriveS - runs[b]!.arriveS || compareRuns(plan, a, b));
    const other = placeGreedily(plan, index, fixedFirst(keepTrainOrder(index, byDeparture, byArrival)), fixed);
    if (total(other) < total(delays)) delays = other;
  }

  const moved: Retime[] = [];
  runs.forEach((run, r) => {
    const delayS = delays[r]!;
    if (delayS > 0) moved.push({ runId: run.id, delayS });
  });
  return moved;
}

/**
 * Applies retime delays to a plan: each moved run's departS, arriveS and steps shift by its delay.
 * Runs not listed, and delays naming no run, are left alone.
 */
export function applyRetime(plan: Plan, retimes: readonly Retime[]): Plan {
  const delayOf = new Map(retimes.map((retime) => [retime.runId, retime.delayS]));
  return {
    ...plan,
    runs: plan.runs.map((run) => {
      const delay = delayOf.get(run.id);
      if (delay === undefined) return run;
      return {
        ...run,
        departS: run.departS + delay,
        arriveS: run.arriveS + delay,
        steps: run.steps.map((step) => ({ ...step, enterS: step.enterS + delay, exitS: step.exitS + delay })),
      };
    }),
  };
}

function compareRuns(plan: Plan, a: number, b: number): number {
  const x = plan.runs[a]!;
  const y = plan.runs[b]!;
  if (x.departS !== y.departS) return x.departS - y.departS;
  return x.id < y.id ? -1 : x.id > y.id ? 1 : 0;
}

function total(delays: Float64Array): number {
  let sum = 0;
  for (const delay of delays) sum += delay;
  return sum;
}

/**
 * `order` with each train's runs put back in their `trainOrder` sequence, each train keeping the
 * places its runs hold in `order`.
 */
function keepTrainOrder(index: PlanIndex, trainOrder: readonly number[], order: readonly number[]): number[] {
  const queues = new Map<number, number[]>();
  for (const r of trainOrder) {
    const train = index.runTrain[r]!;
    let queue = queues.get(train);
    if (queue === undefined) queues.set(train, (queue = []));
    queue.push(r);
  }
  const taken = new Map<number, number>();
  return order.map((r) => {
    const train = index.runTrain[r]!;
    const next = taken.get(train) ?? 0;
    taken.set(train, next + 1);
    return queues.get(train)![next]!;
  });
}

/** The greedy: runs in the given order, each at its smallest clash-free delay. */
function placeGreedily(plan: Plan, index: PlanIndex, order: readonly number[], fixed: Uint8Array): Float64Array {
  const headway = plan.rules.headwayS;
  const runs = plan.runs;
  // Per block, per train: a train's own runs never clash with each other in a block.
  const blockTaken = new Map<number, Map<number, IntervalUnion>>();
  const cabTaken = new Map<number, IntervalUnion>();
  const operatorTaken = new Map<number, IntervalUnion>();
  const trainFreeAt = new Map<number, number>();
  const taken = (map: Map<number, IntervalUnion>, key: number) => {
    let set = map.get(key);
    if (set === undefined) map.set(key, (set = new IntervalUnion()));
    return set;
  };
  const { stepStart, stepBlock, stepEnter, stepExit } = index;
  const delays = new Float64Array(runs.length);

  for (const r of order) {
    const run = runs[r]!;
    const depart = run.departS;
    const arrive = run.arriveS;
    const train = index.runTrain[r]!;
    const cab = index.runCab[r]!;
    const operator = index.runOperator[r]!;
    const cabSet = cab >= 0 ? cabTaken.get(cab) : undefined;
    const operatorSet = operator >= 0 ? operatorTaken.get(operator) : undefined;
    const firstStep = stepStart[r]!;
    const endStep = stepStart[r + 1]!;

    // The train cannot leave before its earlier runs have arrived.
    let delay = 0;
    const freeAt = trainFreeAt.get(train);
    if (!fixed[r] && freeAt !== undefined && depart < freeAt) delay = shiftReaching(depart, freeAt);

    // Jump past whatever the run meets until a full pass meets nothing. Every jump lands at the
    // end of a placed interval, so there are finitely many, and the comparisons are the ones
    // checkPlan makes on the shifted plan.
    for (let moved = !fixed[r]; moved && Number.isFinite(delay); ) {
      moved = false;
      for (const set of [cabSet, operatorSet]) {
        if (set === undefined) continue;
        const end = set.overlapEnd(depart + delay, arrive + delay);
        if (end !== -Infinity) {
          delay = shiftReaching(depart, end);
          moved = true;
        }
      }
      for (let k = firstStep; k < endStep; k++) {
        const block = stepBlock[k]!;
        const trains = block >= 0 ? blockTaken.get(block) : undefined;
        if (trains === undefined) continue;
        for (const [other, set] of trains) {
          if (other === train) continue;
          const end = set.overlapEnd(stepEnter[k]! + delay, stepExit[k]! + delay + headway);
          if (end !== -Infinity) {
            delay = shiftReaching(stepEnter[k]!, end);
            moved = true;
          }
        }
      }
    }

    delays[r] = delay;
    if (cab >= 0) taken(cabTaken, cab).add(depart + delay, arrive + delay);
    if (operator >= 0) taken(operatorTaken, operator).add(depart + delay, arrive + delay);
    for (let k = firstStep; k < endStep; k++) {
      const block = stepBlock[k]!;
      if (block < 0) continue;
      let trains = blockTaken.get(block);
      if (trains === undefined) blockTaken.set(block, (trains = new Map()));
      taken(trains, train).add(stepEnter[k]! + delay, stepExit[k]! + delay + headway);
    }
    const arrival = arrive + delay;
    if (freeAt === undefined || arrival > freeAt) trainFreeAt.set(train, arrival);
  }
  return delays;
}
