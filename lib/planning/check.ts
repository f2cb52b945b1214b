import { compareFindings, FINDING_KINDS, orderedPair, type Finding, type FindingKind } from './finding';
import { countOverlapsInGroups, forEachOverlapInGroups, groupBy, sortByKey } from './intervals';
import { buildLoadProfile, findPowerOverloads, type LoadProfile } from './load';
import { planNames, withNoun, type PlanNames } from './names';
import { indexPlan, type PlanIndex } from './plan-index';
import type { Plan } from './schema';
import { findVoltageIssues } from './voltage';

export interface PlanCheck {
  /**
   * Sorted by fromS, then kind, then ids. At most FINDING_LIMITS.perKind of one kind and
   * FINDING_LIMITS.total in all (the options can lower them); `counts` has how many there are.
   */
  findings: Finding[];
  /** How many findings of each kind the plan has, listed or not: exact, whatever the caps. */
  counts: Record<FindingKind, number>;
  /** Errors and warnings among all the findings, listed or not. */
  totals: { errors: number; warnings: number };
  /** True when some findings are not listed (a count above what `findings` holds of that kind). */
  truncated: boolean;
  load: LoadProfile;
}

/** Default caps on listed findings: a plan with more says so (`truncated`) and counts them all. */
export const FINDING_LIMITS = { perKind: 1000, total: 2000 } as const;

export interface CheckOptions {
  /** List at most this many findings of one kind (default FINDING_LIMITS.perKind). */
  maxPerKind?: number;
  /** List at most this many findings in all, the earliest first (default FINDING_LIMITS.total). */
  maxFindings?: number;
  /**
   * Give up with CheckBudgetError when the check has run longer than `ms` by `now()` (checked
   * between its phases), so that a server answering one request is not held up for long.
   */
  budget?: { ms: number; now: () => number };
}

/** checkPlan ran past its time budget; nothing was listed. */
export class CheckBudgetError extends Error {
  constructor(readonly budgetMs: number) {
    super(`the plan is too large to check within ${budgetMs} ms`);
    this.name = 'CheckBudgetError';
  }
}

/**
 * Findings as they are found: every one is counted, but only the first `maxPerKind` of a kind are
 * built (message included), so a plan with a quadratic number of clashes costs no more than the caps.
 */
class FindingList {
  readonly counts = Object.fromEntries(FINDING_KINDS.map((kind) => [kind, 0])) as Record<FindingKind, number>;
  readonly listed: Finding[] = [];
  readonly totals = { errors: 0, warnings: 0 };
  private readonly kept = Object.fromEntries(FINDING_KINDS.map((kind) => [kind, 0])) as Record<FindingKind, number>;

  constructor(private readonly maxPerKind: number) {}

  /** How many more findings of this kind will be listed. */
  room(kind: FindingKind): number {
    return this.maxPerKind - this.kept[kind];
  }

  add(finding: Finding): void {
    this.counts[finding.kind]++;
    this.totals[finding.severity === 'error' ? 'errors' : 'warnings']++;
    if (this.kept[finding.kind] >= this.maxPerKind) return;
    this.kept[finding.kind]++;
    this.listed.push(finding);
  }

  /** Records `total` findings of a kind (all of one severity) of which those already `add`ed are a part. */
  countAll(kind: FindingKind, total: number, severity: Finding['severity']): void {
    this.totals[severity === 'error' ? 'errors' : 'warnings'] += total - this.counts[kind];
    this.counts[kind] = total;
  }
}

/**
 * Checks a plan the schema accepted; never throws on one.
 *
 * Finding kinds and their ids (run pairs in ascending string order; intervals half-open):
 * - `block-overlap` (error) `[blockId, runA, runB]`: steps of two runs in one block within the
 *   headway (`a.enterS < b.exitS + headwayS && b.enterS < a.exitS + headwayS`); one per block and
 *   pair of stays, where a run's stay merges its steps in the block that overlap, touch or come
 *   within the headway of each other (so a run that passes a block twice, far apart, can clash
 *   twice with another). fromS..toS is the shared occupancy, or the too-short gap between them.
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
 * Work grows as n log n in the number of steps: every check is a sort and a sweep. Pairs (clashes)
 * are counted without listing them, and only as many as the caps allow are built, so a plan where
 * every run clashes with every other costs no more than one where none do.
 */
export function checkPlan(plan: Plan, options: CheckOptions = {}): PlanCheck {
  const budget = options.budget;
  const started = budget?.now() ?? 0;
  const inBudget = () => {
    if (budget !== undefined && budget.now() - started > budget.ms) throw new CheckBudgetError(budget.ms);
  };
  const list = new FindingList(options.maxPerKind ?? FINDING_LIMITS.perKind);
  const index = indexPlan(plan);
  const names = planNames(plan);
  findBlockOverlaps(plan, index, names, list);
  inBudget();
  findDoubleBookings(plan, index.runCab, plan.cabs, 'cab-double-booked', (id) => withNoun('cab', names.cab(id)), names, list);
  findDoubleBookings(plan, index.runOperator, plan.operators, 'operator-double-booked', names.operator, names, list);
  findDoubleBookings(plan, index.runTrain, plan.trains, 'train-double-booked', (id) => withNoun('train', names.train(id)), names, list);
  inBudget();
  const shapes: Finding[] = [];
  findContinuityBreaks(plan, index, names, shapes);
  findRouteGaps(plan, index, names, shapes);
  findTooLong(plan, index, names, shapes);
  inBudget();
  const load = buildLoadProfile(plan, index);
  findPowerOverloads(load, plan.rules.derate, shapes, names);
  findVoltageIssues(plan, index, shapes, names);
  inBudget();
  for (const finding of shapes) list.add(finding);
  const findings = list.listed.sort(compareFindings);
  const maxFindings = options.maxFindings ?? FINDING_LIMITS.total;
  if (findings.length > maxFindings) findings.length = maxFindings;
  const truncated = findings.length < FINDING_KINDS.reduce((sum, kind) => sum + list.counts[kind], 0);
  return { findings, counts: list.counts, totals: list.totals, truncated, load };
}

/**
 * A run's stays in the blocks: its steps in one block merged where they overlap, touch or come
 * within the headway of each other, so that two stays of one run in a block are always more than
 * the headway apart. `reach` is the stay's end plus the headway: two stays clash exactly when their
 * `[enter, reach)` intervals overlap (a.enter < b.exit + h && b.enter < a.exit + h).
 */
function stays(plan: Plan, index: PlanIndex) {
  const headway = plan.rules.headwayS;
  const { stepEnter, stepExit, stepBlock, stepRun } = index;
  // By block, then run, then entry: each run's steps in one block are then side by side.
  const order = Array.from({ length: stepEnter.length }, (_, k) => k).sort(
    (x, y) => stepBlock[x]! - stepBlock[y]! || stepRun[x]! - stepRun[y]! || stepEnter[x]! - stepEnter[y]! || x - y,
  );
  const block: number[] = [];
  const run: number[] = [];
  const enter: number[] = [];
  const exit: number[] = [];
  const reach: number[] = [];
  for (const k of order) {
    const b = stepBlock[k]!;
    if (b < 0) continue;
    const last = block.length - 1;
    if (last >= 0 && block[last] === b && run[last] === stepRun[k] && stepEnter[k]! <= reach[last]!) {
      if (stepExit[k]! > exit[last]!) {
        exit[last] = stepExit[k]!;
        reach[last] = stepExit[k]! + headway;
      }
      continue;
    }
    block.push(b);
    run.push(stepRun[k]!);
    enter.push(stepEnter[k]!);
    exit.push(stepExit[k]!);
    reach.push(stepExit[k]! + headway);
  }
  return { block, run, enter, exit, reach };
}

/**
 * Block overlaps, one finding per block and pair of stays (see stays). All are counted in
 * O(n log n); only as many as the list has room for are found, in order of the later stay's entry.
 */
function findBlockOverlaps(plan: Plan, index: PlanIndex, names: PlanNames, list: FindingList): void {
  const headway = plan.rules.headwayS;
  const stay = stays(plan, index);
  const blockCount = plan.blocks.length;
  const total = countOverlapsInGroups(stay.block, blockCount, stay.enter, stay.reach).reduce((a, b) => a + b, 0);
  let room = list.room('block-overlap');
  if (room > 0 && total > 0) {
    const order = sortByKey(Array.from({ length: stay.block.length }, (_, i) => i), stay.enter);
    forEachOverlapInGroups(order, stay.block, blockCount, stay.enter, stay.reach, (p, q) => {
      const lastIn = Math.max(stay.enter[p]!, stay.enter[q]!);
      const firstOut = Math.min(stay.exit[p]!, stay.exit[q]!);
      const shared = lastIn < firstOut;
      const fromS = Math.min(lastIn, firstOut);
      const toS = Math.max(lastIn, firstOut);
      const runP = stay.run[p]!;
      const runQ = stay.run[q]!;
      const blockId = plan.blocks[stay.block[p]!]!.id;
      const [runA, runB] = orderedPair(plan.runs[runP]!.id, plan.runs[runQ]!.id);
      // Ids stay in string order; the message names the earlier departure first, as people read it.
      const [early, late] = earlierFirst(plan, runP, runQ);
      const both = `${names.run(early)} and ${names.run(late)}`;
      const block = withNoun('block', names.block(blockId));
      const message = shared
        ? `${both} are both in ${block} ${names.span(fromS, toS)}`
        : `${both} pass through ${block} only ${round1(toS - fromS)} s apart ` +
          `(${names.span(fromS, toS)}); the headway is ${headway} s`;
      list.add({ kind: 'block-overlap', severity: 'error', ids: [blockId, runA, runB], fromS, toS, message });
      return --room > 0;
    });
  }
  list.countAll('block-overlap', total, 'error');
}

function findDoubleBookings(
  plan: Plan,
  runOwner: Int32Array,
  owners: readonly { id: string }[],
  kind: 'cab-double-booked' | 'operator-double-booked' | 'train-double-booked',
  ownerName: (id: string) => string,
  names: PlanNames,
  list: FindingList,
): void {
  const runs = plan.runs;
  const depart = Float64Array.from(runs, (run) => run.departS);
  const arrive = Float64Array.from(runs, (run) => run.arriveS);
  const total = countOverlapsInGroups(runOwner, owners.length, depart, arrive).reduce((a, b) => a + b, 0);
  let room = list.room(kind);
  if (room > 0 && total > 0) {
    const order = sortByKey(Array.from({ length: runs.length }, (_, r) => r), depart);
    forEachOverlapInGroups(order, runOwner, owners.length, depart, arrive, (p, q) => {
      const ownerId = owners[runOwner[p]!]!.id;
      const [runA, runB] = orderedPair(runs[p]!.id, runs[q]!.id);
      const fromS = Math.max(depart[p]!, depart[q]!);
      const toS = Math.min(arrive[p]!, arrive[q]!);
      list.add({
        kind,
        severity: 'error',
        ids: [ownerId, runA, runB],
        fromS,
        toS,
        message: `${ownerName(ownerId)} is booked for ${earlierFirst(plan, p, q).map(names.run).join(' and ')} at once, ${names.span(fromS, toS)}`,
      });
      return --room > 0;
    });
  }
  list.countAll(kind, total, 'error');
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
