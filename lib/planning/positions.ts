/**
 * Where each train is at one moment, by the engine's occupancy rule (the one `checkPlan` checks
 * block clashes with): a train is in every block whose step it is in at that moment (`enterS ≤ t <
 * exitS`; the tail may still be in the block behind), and when no step of it holds it, it stands
 * where its runs leave it — from the session's start (or its first step, if earlier) in the block
 * its first run leaves from, between two runs in the block the earlier stops in, after its last run
 * in the block that run stops in until the session ends. Runs of one train are taken in departure
 * order (ties by id), as the check does. Pure; O(steps) per call.
 */

export interface PositionRun {
  id: string;
  trainId: string;
  departS: number;
  steps: readonly { blockId: string; enterS: number; exitS: number }[];
}

export interface TrainPosition {
  trainId: string;
  /** The blocks the train is in (more than one while its tail is still in the block behind). */
  blockIds: string[];
  /** Running (a step of a run holds it) or standing between, before or after its runs. */
  state: 'running' | 'standing';
  /** The run that places it: the run it is on, or the run whose end (or start) it stands at. */
  runId: string;
}

/**
 * Each train's position at `atS` (real seconds from the session's start), in the order of the
 * trains' first runs; trains nowhere at that moment (after the session, or with no runs) are left
 * out. `sessionEndS` defaults to the last step's exit, as in `checkPlan`.
 */
export function trainPositionsAt(runs: readonly PositionRun[], atS: number, sessionEndS?: number): TrainPosition[] {
  let end = sessionEndS ?? -Infinity;
  if (sessionEndS === undefined) for (const run of runs) for (const step of run.steps) if (step.exitS > end) end = step.exitS;
  const byTrain = new Map<string, PositionRun[]>();
  for (const run of runs) {
    if (run.steps.length === 0) continue;
    const list = byTrain.get(run.trainId);
    if (list) list.push(run);
    else byTrain.set(run.trainId, [run]);
  }
  const positions: TrainPosition[] = [];
  for (const [trainId, list] of byTrain) {
    list.sort((x, y) => x.departS - y.departS || (x.id < y.id ? -1 : x.id > y.id ? 1 : 0));
    const running: string[] = [];
    let runningRun: string | null = null;
    for (const run of list) {
      for (const step of run.steps) {
        if (step.enterS <= atS && atS < step.exitS && !running.includes(step.blockId)) {
          running.push(step.blockId);
          runningRun ??= run.id;
        }
      }
    }
    if (runningRun !== null) {
      positions.push({ trainId, blockIds: running, state: 'running', runId: runningRun });
      continue;
    }
    const stand = standingAt(list, atS, end);
    if (stand) positions.push({ trainId, blockIds: [stand.blockId], state: 'standing', runId: stand.runId });
  }
  return positions;
}

/** Where a train with no step at `atS` stands: the stands of `checkPlan`'s occupancy, or null. */
function standingAt(list: readonly PositionRun[], atS: number, sessionEndS: number): { blockId: string; runId: string } | null {
  const first = list[0]!;
  const firstStep = first.steps[0]!;
  if (Math.min(0, firstStep.enterS) <= atS && atS < firstStep.enterS) return { blockId: firstStep.blockId, runId: first.id };
  for (let i = 0; i < list.length; i++) {
    const run = list[i]!;
    const last = run.steps[run.steps.length - 1]!;
    const next = list[i + 1];
    const until = next ? next.steps[0]!.enterS : sessionEndS;
    if (last.exitS <= atS && atS < until) return { blockId: last.blockId, runId: run.id };
  }
  return null;
}
