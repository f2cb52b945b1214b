import { compareFindings, orderedPair, type Finding } from './finding';
import { forEachOverlap, groupBy, sortByKey } from './intervals';
import { buildLoadProfile, findPowerOverloads, type LoadProfile } from './load';
import { planNames, withNoun, type PlanNames } from './names';
import { indexPlan, type PlanIndex } from './plan-index';
import type { Plan } from './schema';
import { findVoltageIssues } from './voltage';

export interface PlanCheck {
  /** Sorted by fromS, then kind, then ids. */
  findings: Finding[];
  load: LoadProfile;
}

/**
 * Checks a plan the schema accepted; never throws on one.
 *
 * Finding kinds and their ids (run pairs in ascending string order; intervals half-open):
 * - `block-overlap` (error) `[blockId, runA, runB]`: steps of two runs in one block within the
 *   headway (`a.enterS < b.exitS + headwayS && b.enterS < a.exitS + headwayS`); one per block and
 *   pair. fromS..toS is the shared occupancy, or the too-short gap between them.
 * - `cab-double-booked`, `operator-double-booked`, `train-double-booked` (errors)
 *   `[cabId | operatorId | trainId, runA, runB]`: movements `[departS, arriveS)` overlap; fromS..toS
 *   is the overlap.
 * - `train-continuity` (warning) `[trainId, earlierRun, laterRun]`: consecutive runs of a train
 *   (by departS, ties by run id) where the later one starts away from where the earlier one ended.
 * - `route-gap` (error) `[runId, blockA, blockB]`: consecutive steps in different blocks that no
 *   link joins.
 * - `train-too-long` (warning) `[runId, blockId]`: the train stands (first or last step) in a block
 *   shorter than itself; one finding when both are the same block.
 * - `channel-overload`, `channel-peak-overload` `[cabId]`, `driver-overload` `[driverId]`,
 *   `supply-overload`, `supply-derate` (warning) `[supplyId]`: one per maximal interval over the
 *   limit, with peakAmps and limitAmps (see LoadProfile for the loads).
 * - `track-voltage-high`, `track-voltage-low` (warnings): see findVoltageIssues.
 *
 * Work grows as n log n in the number of steps: every check is a sort and a sweep.
 */
export function checkPlan(plan: Plan): PlanCheck {
  const index = indexPlan(plan);
  const names = planNames(plan);
  const findings: Finding[] = [];
  findBlockOverlaps(plan, index, names, findings);
  findDoubleBookings(plan, index.runCab, plan.cabs, 'cab-double-booked', (id) => withNoun('cab', names.cab(id)), names, findings);
  findDoubleBookings(plan, index.runOperator, plan.operators, 'operator-double-booked', names.operator, names, findings);
  findDoubleBookings(plan, index.runTrain, plan.trains, 'train-double-booked', (id) => withNoun('train', names.train(id)), names, findings);
  findContinuityBreaks(plan, index, names, findings);
  findRouteGaps(plan, index, names, findings);
  findTooLong(plan, index, names, findings);
  const load = buildLoadProfile(plan, index);
  findPowerOverloads(load, plan.rules.derate, findings, names);
  findVoltageIssues(plan, index, findings, names);
  findings.sort(compareFindings);
  return { findings, load };
}

function findBlockOverlaps(plan: Plan, index: PlanIndex, names: PlanNames, findings: Finding[]): void {
  const headway = plan.rules.headwayS;
  const { stepEnter, stepExit, stepRun, stepBlock } = index;
  const reach = new Float64Array(stepExit.length);
  for (let k = 0; k < reach.length; k++) reach[k] = stepExit[k]! + headway;
  const { items, offsets } = groupBy(stepBlock, plan.blocks.length);
  const runCount = plan.runs.length;

  for (let b = 0; b < plan.blocks.length; b++) {
    const from = offsets[b]!;
    const to = offsets[b + 1]!;
    if (to - from < 2) continue;
    const order = sortByKey(Array.from(items.subarray(from, to)), stepEnter);
    // A run may pass through a block more than once; one finding per pair covers every meeting.
    let pairs: Map<number, { fromS: number; toS: number; shared: boolean; a: number; b: number }> | undefined;
    forEachOverlap(order, stepEnter, reach, (p, q) => {
      const runP = stepRun[p]!;
      const runQ = stepRun[q]!;
      if (runP === runQ) return;
      const lastIn = Math.max(stepEnter[p]!, stepEnter[q]!);
      const firstOut = Math.min(stepExit[p]!, stepExit[q]!);
      const shared = lastIn < firstOut;
      const fromS = Math.min(lastIn, firstOut);
      const toS = Math.max(lastIn, firstOut);
      const key = Math.min(runP, runQ) * runCount + Math.max(runP, runQ);
      pairs ??= new Map();
      const seen = pairs.get(key);
      if (seen === undefined) pairs.set(key, { fromS, toS, shared, a: runP, b: runQ });
      else {
        seen.fromS = Math.min(seen.fromS, fromS);
        seen.toS = Math.max(seen.toS, toS);
        seen.shared ||= shared;
      }
    });
    if (pairs === undefined) continue;
    const blockId = plan.blocks[b]!.id;
    for (const pair of pairs.values()) {
      const [runA, runB] = orderedPair(plan.runs[pair.a]!.id, plan.runs[pair.b]!.id);
      // Ids stay in string order; the message names the earlier departure first, as people read it.
      const [early, late] = earlierFirst(plan, pair.a, pair.b);
      const both = `${names.run(early)} and ${names.run(late)}`;
      const block = withNoun('block', names.block(blockId));
      const message = pair.shared
        ? `${both} are both in ${block} ${names.span(pair.fromS, pair.toS)}`
        : `${both} pass through ${block} only ${round1(pair.toS - pair.fromS)} s apart ` +
          `(${names.span(pair.fromS, pair.toS)}); the headway is ${headway} s`;
      findings.push({
        kind: 'block-overlap',
        severity: 'error',
        ids: [blockId, runA, runB],
        fromS: pair.fromS,
        toS: pair.toS,
        message,
      });
    }
  }
}

function findDoubleBookings(
  plan: Plan,
  runOwner: Int32Array,
  owners: readonly { id: string }[],
  kind: 'cab-double-booked' | 'operator-double-booked' | 'train-double-booked',
  ownerName: (id: string) => string,
  names: PlanNames,
  findings: Finding[],
): void {
  const runs = plan.runs;
  const depart = Float64Array.from(runs, (run) => run.departS);
  const arrive = Float64Array.from(runs, (run) => run.arriveS);
  const { items, offsets } = groupBy(runOwner, owners.length);
  for (let o = 0; o < owners.length; o++) {
    const from = offsets[o]!;
    const to = offsets[o + 1]!;
    if (to - from < 2) continue;
    const order = sortByKey(Array.from(items.subarray(from, to)), depart);
    const ownerId = owners[o]!.id;
    forEachOverlap(order, depart, arrive, (p, q) => {
      const [runA, runB] = orderedPair(runs[p]!.id, runs[q]!.id);
      const fromS = Math.max(depart[p]!, depart[q]!);
      const toS = Math.min(arrive[p]!, arrive[q]!);
      findings.push({
        kind,
        severity: 'error',
        ids: [ownerId, runA, runB],
        fromS,
        toS,
        message: `${ownerName(ownerId)} is booked for ${earlierFirst(plan, p, q).map(names.run).join(' and ')} at once, ${names.span(fromS, toS)}`,
      });
    });
  }
}

function findContinuityBreaks(plan: Plan, index: PlanIndex, names: PlanNames, findings: Finding[]): void {
  const runs = plan.runs;
  const { items, offsets } = groupBy(index.runTrain, plan.trains.length);
  for (let t = 0; t < plan.trains.length; t++) {
    const from = offsets[t]!;
    const to = offsets[t + 1]!;
    if (to - from < 2) continue;
    const order = Array.from(items.subarray(from, to)).sort((a, b) => {
      const x = runs[a]!;
      const y = runs[b]!;
      if (x.departS !== y.departS) return x.departS - y.departS;
      return x.id < y.id ? -1 : x.id > y.id ? 1 : 0;
    });
    for (let i = 1; i < order.length; i++) {
      const earlier = runs[order[i - 1]!]!;
      const later = runs[order[i]!]!;
      const endedIn = earlier.steps[earlier.steps.length - 1]!.blockId;
      const startsIn = later.steps[0]!.blockId;
      if (endedIn === startsIn) continue;
      const trainId = plan.trains[t]!.id;
      findings.push({
        kind: 'train-continuity',
        severity: 'warning',
        ids: [trainId, earlier.id, later.id],
        fromS: Math.min(earlier.arriveS, later.departS),
        toS: Math.max(earlier.arriveS, later.departS),
        message:
          `${withNoun('train', names.train(trainId))} ends ${names.run(earlier.id)} in ${withNoun('block', names.block(endedIn))} ` +
          `but starts ${names.run(later.id)} in ${withNoun('block', names.block(startsIn))}`,
      });
    }
  }
}

function findRouteGaps(plan: Plan, index: PlanIndex, names: PlanNames, findings: Finding[]): void {
  const blockCount = plan.blocks.length;
  const joined = new Set<number>();
  for (const link of plan.links) {
    const a = index.blockOf.get(link.a);
    const b = index.blockOf.get(link.b);
    if (a === undefined || b === undefined) continue;
    joined.add(a * blockCount + b);
    joined.add(b * blockCount + a);
  }
  const { stepBlock, stepStart } = index;
  plan.runs.forEach((run, r) => {
    const first = stepStart[r]!;
    for (let k = first + 1; k < stepStart[r + 1]!; k++) {
      const a = stepBlock[k - 1]!;
      const b = stepBlock[k]!;
      if (a === b || (a >= 0 && b >= 0 && joined.has(a * blockCount + b))) continue;
      const before = run.steps[k - 1 - first]!;
      const after = run.steps[k - first]!;
      findings.push({
        kind: 'route-gap',
        severity: 'error',
        ids: [run.id, before.blockId, after.blockId],
        fromS: Math.min(before.exitS, after.enterS),
        toS: Math.max(before.exitS, after.enterS),
        message:
          `${names.run(run.id)} goes from ${withNoun('block', names.block(before.blockId))} straight to ` +
          `${withNoun('block', names.block(after.blockId))}, which no link joins`,
      });
    }
  });
}

function findTooLong(plan: Plan, index: PlanIndex, names: PlanNames, findings: Finding[]): void {
  plan.runs.forEach((run, r) => {
    const train = plan.trains[index.runTrain[r]!];
    if (train === undefined) return;
    const first = run.steps[0]!;
    const last = run.steps[run.steps.length - 1]!;
    const stands =
      first.blockId === last.blockId
        ? [{ blockId: first.blockId, fromS: first.enterS, toS: last.exitS, where: 'stands' }]
        : [
            { blockId: first.blockId, fromS: first.enterS, toS: run.departS, where: 'starts' },
            { blockId: last.blockId, fromS: run.arriveS, toS: last.exitS, where: 'ends' },
          ];
    for (const stand of stands) {
      const block = plan.blocks[index.blockOf.get(stand.blockId) ?? -1];
      if (block === undefined || !(block.lengthMm < train.lengthMm)) continue;
      findings.push({
        kind: 'train-too-long',
        severity: 'warning',
        ids: [run.id, block.id],
        fromS: stand.fromS,
        toS: stand.toS,
        message:
          `${names.run(run.id)} ${stand.where} in ${withNoun('block', names.block(block.id))} (${block.lengthMm} mm), ` +
          `shorter than the train (${train.lengthMm} mm)`,
      });
    }
  });
}

/** Two runs' ids, the one departing first (ties: smaller id) first. */
function earlierFirst(plan: Plan, a: number, b: number): [string, string] {
  const x = plan.runs[a]!;
  const y = plan.runs[b]!;
  return x.departS < y.departS || (x.departS === y.departS && x.id < y.id) ? [x.id, y.id] : [y.id, x.id];
}

function round1(value: number): number {
  return Math.round(value * 10) / 10;
}
