import type { Plan, Run } from './schema';

/** What has been reported of one run, in session real seconds. */
export interface RunActuals {
  departS?: number;
  arriveS?: number;
  /** Stops on the way, in order; `toS` is null while the train still stands. */
  stops?: readonly { fromS: number; toS: number | null }[];
}

export interface PropagateInput {
  /** The timetable being run (planned times, plus any repair the host applied). */
  plan: Plan;
  actuals: ReadonlyMap<string, RunActuals>;
  /** The shared clock in session seconds, or null before it starts (then nothing is overdue). */
  nowS: number | null;
  /**
   * Least real seconds a train, cab or operator stands between two of its runs. Where the plan
   * itself allows less, the plan's gap is kept, so an unreported session predicts the plan.
   */
  standS: number;
}

export type PredictedStatus = 'waiting' | 'due' | 'running' | 'stopped' | 'arrived';

export interface PredictedRun {
  runId: string;
  plannedDepartS: number;
  plannedArriveS: number;
  departS: number;
  arriveS: number;
  /** Predicted (or actual) departure minus planned, real seconds; 0 when early or on time. */
  departDelayS: number;
  arriveDelayS: number;
  status: PredictedStatus;
  /** The earlier run (same train, cab or operator) that holds this one back, if any. */
  heldBy: string | null;
}

export interface Propagation {
  runs: PredictedRun[];
  /** The plan with every run at its predicted (or actual) times, for checkPlan. */
  predicted: Plan;
}

/**
 * Predicts the rest of a session from its reports. Runs go in planned departure order; a run not
 * yet departed leaves at the latest of its planned time, each predecessor's predicted arrival (the
 * last earlier run of the same train, of the same cab and of the same operator) plus the stand
 * time, and — once the clock runs — now. It takes its planned running time plus any stop; a train
 * standing after a stop arrives no earlier than now plus what was left of its trip. A reported
 * departure or arrival is taken as it is. A prediction of something not yet reported is never
 * earlier than planned (an early train is held to its timetable).
 */
export function propagateDelays(input: PropagateInput): Propagation {
  const { plan, actuals, nowS, standS } = input;
  const order = plan.runs.map((_, i) => i);
  order.sort((a, b) => {
    const x = plan.runs[a]!;
    const y = plan.runs[b]!;
    return x.departS - y.departS || (x.id < y.id ? -1 : x.id > y.id ? 1 : 0);
  });

  const lastOf = { train: new Map<string, number>(), cab: new Map<string, number>(), operator: new Map<string, number>() };
  const result: PredictedRun[] = new Array(plan.runs.length);
  const runs: Run[] = plan.runs.slice();

  for (const i of order) {
    const run = plan.runs[i]!;
    const actual = actuals.get(run.id) ?? {};
    const duration = run.arriveS - run.departS;
    const predecessors = [
      lastOf.train.get(run.trainId),
      lastOf.cab.get(run.cabId),
      run.operatorId === null ? undefined : lastOf.operator.get(run.operatorId),
    ];

    let departS: number;
    let heldBy: string | null = null;
    if (actual.departS !== undefined) {
      departS = actual.departS;
    } else {
      departS = run.departS;
      for (const p of predecessors) {
        if (p === undefined) continue;
        const before = plan.runs[p]!;
        const gap = Math.min(standS, run.departS - before.arriveS);
        const earliest = result[p]!.arriveS + gap;
        if (earliest > departS) {
          departS = earliest;
          heldBy = before.id;
        }
      }
      if (nowS !== null && nowS > departS) {
        departS = nowS;
        heldBy = null;
      }
    }

    let arriveS: number;
    let status: PredictedStatus;
    let stretchFromS: number | null = null;
    if (actual.arriveS !== undefined) {
      arriveS = actual.arriveS;
      status = 'arrived';
    } else if (actual.departS === undefined) {
      arriveS = departS + duration;
      status = nowS !== null && nowS >= run.departS ? 'due' : 'waiting';
    } else {
      let stood = 0;
      let open: number | null = null;
      for (const stop of actual.stops ?? []) {
        stretchFromS ??= stop.fromS;
        if (stop.toS === null) open = stop.fromS;
        else stood += Math.max(0, stop.toS - stop.fromS);
      }
      arriveS = Math.max(departS + duration, run.arriveS) + stood;
      status = 'running';
      if (open !== null) {
        status = 'stopped';
        const left = Math.max(0, arriveS - open);
        if (nowS !== null) arriveS = Math.max(arriveS, nowS + left);
      } else if (nowS !== null && nowS > arriveS) {
        arriveS = nowS;
      }
    }
    if (actual.arriveS === undefined) arriveS = Math.max(arriveS, run.arriveS);

    result[i] = {
      runId: run.id,
      plannedDepartS: run.departS,
      plannedArriveS: run.arriveS,
      departS,
      arriveS,
      departDelayS: Math.max(0, departS - run.departS),
      arriveDelayS: Math.max(0, arriveS - run.arriveS),
      status,
      heldBy,
    };
    runs[i] = shiftRun(run, departS, arriveS, stretchFromS);
    lastOf.train.set(run.trainId, i);
    lastOf.cab.set(run.cabId, i);
    if (run.operatorId !== null) lastOf.operator.set(run.operatorId, i);
  }
  return { runs: result, predicted: { ...plan, runs } };
}

/**
 * The run moved to depart at `departS`, its steps shifted alike; when it arrives later than that
 * shift alone gives, the step it stood in (at `stretchFromS`, else its last) is stretched and the
 * steps after it move on by the extra.
 */
function shiftRun(run: Run, departS: number, arriveS: number, stretchFromS: number | null): Run {
  const shift = departS - run.departS;
  const extra = arriveS - (run.arriveS + shift);
  const at = stretchFromS ?? Infinity;
  const lastIndex = run.steps.length - 1;
  let stretched = false;
  const steps = run.steps.map((step, k) => {
    const enterS = step.enterS + shift;
    const exitS = step.exitS + shift;
    if (extra <= 0) return { ...step, enterS, exitS };
    if (stretched) return { ...step, enterS: enterS + extra, exitS: exitS + extra };
    if (exitS >= at || k === lastIndex) {
      stretched = true;
      return { ...step, enterS, exitS: exitS + extra };
    }
    return { ...step, enterS, exitS };
  });
  return { ...run, departS, arriveS, steps };
}
