import type { Plan } from './schema';

/**
 * A plan's references resolved to list positions, and its steps laid out flat, so that the check
 * and the retimer work on numbers. A reference that does not resolve becomes -1 and is skipped,
 * so nothing here throws even on a plan the schema never saw.
 */
export interface PlanIndex {
  blockOf: Map<string, number>;
  runTrain: Int32Array;
  runCab: Int32Array;
  /** The run's cab's driver, or -1. */
  runDriver: Int32Array;
  /** The run's cab's driver's supply, or -1. */
  runSupply: Int32Array;
  /** -1 for a run with no operator. */
  runOperator: Int32Array;
  cabDriver: Int32Array;
  driverSupply: Int32Array;
  /** Run r's steps are flat positions stepStart[r] .. stepStart[r + 1] - 1. */
  stepStart: Int32Array;
  stepRun: Int32Array;
  stepBlock: Int32Array;
  stepEnter: Float64Array;
  stepExit: Float64Array;
}

/** Each id of `list` mapped to `value` of its first item (a repeated id is the schema's finding, not a second entry). */
export function firstById<T extends { id: string }, V>(list: readonly T[], value: (item: T, index: number) => V): Map<string, V> {
  const map = new Map<string, V>();
  list.forEach((item, i) => {
    if (!map.has(item.id)) map.set(item.id, value(item, i));
  });
  return map;
}

const positions = (list: readonly { id: string }[]) => firstById(list, (_, i) => i);

/** Resolves a plan's references once; see PlanIndex. */
export function indexPlan(plan: Plan): PlanIndex {
  const supplyOf = positions(plan.supplies);
  const driverOf = positions(plan.drivers);
  const cabOf = positions(plan.cabs);
  const blockOf = positions(plan.blocks);
  const trainOf = positions(plan.trains);
  const operatorOf = positions(plan.operators);

  const driverSupply = Int32Array.from(plan.drivers, (driver) => supplyOf.get(driver.supplyId) ?? -1);
  const cabDriver = Int32Array.from(plan.cabs, (cab) => driverOf.get(cab.driverId) ?? -1);

  const runs = plan.runs;
  const runTrain = new Int32Array(runs.length);
  const runCab = new Int32Array(runs.length);
  const runDriver = new Int32Array(runs.length);
  const runSupply = new Int32Array(runs.length);
  const runOperator = new Int32Array(runs.length);
  const stepStart = new Int32Array(runs.length + 1);
  for (let r = 0; r < runs.length; r++) {
    const run = runs[r]!;
    runTrain[r] = trainOf.get(run.trainId) ?? -1;
    const cab = cabOf.get(run.cabId) ?? -1;
    runCab[r] = cab;
    const driver = cab >= 0 ? cabDriver[cab]! : -1;
    runDriver[r] = driver;
    runSupply[r] = driver >= 0 ? driverSupply[driver]! : -1;
    runOperator[r] = run.operatorId === null ? -1 : (operatorOf.get(run.operatorId) ?? -1);
    stepStart[r + 1] = stepStart[r]! + run.steps.length;
  }

  const total = stepStart[runs.length]!;
  const stepRun = new Int32Array(total);
  const stepBlock = new Int32Array(total);
  const stepEnter = new Float64Array(total);
  const stepExit = new Float64Array(total);
  for (let r = 0; r < runs.length; r++) {
    let k = stepStart[r]!;
    for (const step of runs[r]!.steps) {
      stepRun[k] = r;
      stepBlock[k] = blockOf.get(step.blockId) ?? -1;
      stepEnter[k] = step.enterS;
      stepExit[k] = step.exitS;
      k++;
    }
  }

  return {
    blockOf,
    runTrain,
    runCab,
    runDriver,
    runSupply,
    runOperator,
    cabDriver,
    driverSupply,
    stepStart,
    stepRun,
    stepBlock,
    stepEnter,
    stepExit,
  };
}
