import { compareFindings, FINDING_KINDS, orderedPair, willList, type Finding, type FindingKind, type FindingSink } from './finding';
import { countOverlapsInGroups, forEachMarkedOverlapInGroups, forEachOverlapInGroups, groupBy, orderByKey } from './intervals';
import { TIME_TOLERANCE_S } from './rules';
import { buildLoadProfile, findPowerOverloads, type LoadProfile } from './load';
import { planNames, sentenceCase, withNoun, type PlanNames } from './names';
import { indexPlan, type PlanIndex } from './plan-index';
import type { Plan } from './schema';
import { findPolarityIssues } from './polarity';
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
class FindingList implements FindingSink {
  readonly counts = Object.fromEntries(FINDING_KINDS.map((kind) => [kind, 0])) as Record<FindingKind, number>;
  readonly listed: Finding[] = [];
  readonly totals = { errors: 0, warnings: 0 };
  private readonly kept = Object.fromEntries(FINDING_KINDS.map((kind) => [kind, 0])) as Record<FindingKind, number>;

  constructor(private readonly maxPerKind: number) {}

  /** How many more findings of this kind will be listed. */
  room(kind: FindingKind): number {
    return this.maxPerKind - this.kept[kind];
  }

  /** Whether a finding of this kind added now is listed (else only counted). */
  lists(kind: FindingKind): boolean {
    return this.kept[kind] < this.maxPerKind;
  }

  push(finding: Finding): void {
    this.add(finding);
  }

  add(finding: Finding): void {
    this.counts[finding.kind]++;
    this.totals[finding.severity === 'error' ? 'errors' : 'warnings']++;
    if (this.kept[finding.kind] >= this.maxPerKind) return;
    this.kept[finding.kind]++;
    finding.message = sentenceCase(finding.message);
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
 * Times compare with TIME_TOLERANCE_S (1 ms): a clash must last, and a too-short gap fall short
 * of the headway, by more than that.
 *
 * - `block-overlap` (error) `[blockId, runA, runB]`: steps of two trains in one block within the
 *   headway (`a.enterS < b.exitS + headwayS − 1 ms` and the other way round); one per block and
 *   pair of stays, where a train's stay merges its steps in the block (of any of its runs) that
 *   overlap, touch or come within the headway of each other. Runs of one train never clash here.
 *   The runs named are those whose steps the trains had entered last when the clash began.
 * - `block-occupied` (error) `[blockId, runA, runB]`: as block-overlap, where one side is a train
 *   standing in the block between its runs, or before its first run (from the session's start) or
 *   after its last (to `sessionEndS`); the stand is named by the run before it (the first run for
 *   the wait before it). A retime cannot clear these: a train standing all session needs another
 *   route or block.
 * - `locomotive-in-two-trains` (error) `[locomotiveId, trainA, trainB]`: see findLocomotiveInTwoTrains.
 * - `step-gap` (error) `[runId, blockA, blockB]`: a run's step begins more than 1 ms after the
 *   step before it ended.
 * - `cab-double-booked`, `operator-double-booked`, `train-double-booked` (errors)
 *   `[cabId | operatorId | trainId, runA, runB]`: movements `[departS, arriveS)` overlap by more
 *   than 1 ms; fromS..toS is the overlap. Two runs of one train that overlap are this finding only.
 * - `train-continuity` (warning) `[trainId, earlierRun, laterRun]`: consecutive runs of a train
 *   (by departS, ties by run id) where the later one starts away from where the earlier one ended.
 * - `route-gap` (error) `[runId, blockA, blockB]`: consecutive steps in different blocks that no
 *   link joins.
 * - `train-too-long` (warning) `[runId, blockId]`: the train stands (first or last step) in a block
 *   shorter than itself; one finding when both are the same block.
 * - `route-reversal` (error) `[runId, blockId]`: the run changes direction inside a block (not its
 *   first or last) that is not a reversing place.
 * - `reversing-loop` (error) `[blockId…]` (the loop): joints no wiring can make agree, a reversing
 *   loop or wye with no reversing section; from the layout, at time 0.
 * - `joint-wiring` (warning) `[blockA, blockB]`: a joint whose two blocks are wired so that one cab
 *   output gives opposite polarity across it (outside any reversing loop); at time 0.
 * - `joint-short` (error) `[runId, blockLeft, blockEntered]`: while the train bridges the rail gap,
 *   the two blocks need opposite cab outputs (neither a reversing section), or one of them is fed by
 *   another cab for another run.
 * - `reversing-section-short` (error) `[runId, blockId]`: the run passes through a reversing section
 *   that must flip and is never wholly inside it (too short, or head out before tail in).
 * See polarity.ts and track.ts for the model (NEM 631 2.3).
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
  // Shared orders: every step by entry, and each train's runs in the order it runs them.
  const stepsByEnter = orderByKey(index.stepEnter);
  const trainRuns = runsByTrain(plan, index);
  const sessionEnd = findBlockClashes(plan, index, stepsByEnter, trainRuns, names, list);
  inBudget();
  const movements = runMovements(plan);
  findDoubleBookings(plan, movements, index.runCab, plan.cabs, 'cab-double-booked', (id) => withNoun('cab', names.cab(id)), names, list);
  findDoubleBookings(plan, movements, index.runOperator, plan.operators, 'operator-double-booked', names.operator, names, list);
  findDoubleBookings(plan, movements, index.runTrain, plan.trains, 'train-double-booked', (id) => withNoun('train', names.train(id)), names, list);
  inBudget();
  // The other checks add to the list as they go (each kind comes from one check only), writing
  // messages only for findings it lists.
  findLocomotiveInTwoTrains(plan, index, names, sessionEnd, list);
  findContinuityBreaks(plan, trainRuns, names, list);
  findRouteGaps(plan, index, names, list);
  findStepGaps(plan, index, names, list);
  findTooLong(plan, index, names, list);
  findPolarityIssues(plan, index, names, list, stepsByEnter);
  inBudget();
  const load = buildLoadProfile(plan, index);
  findPowerOverloads(load, plan.rules.derate, list, names);
  findVoltageIssues(plan, index, list, names);
  inBudget();
  const findings = list.listed.sort(compareFindings);
  const maxFindings = options.maxFindings ?? FINDING_LIMITS.total;
  if (findings.length > maxFindings) findings.length = maxFindings;
  const truncated = findings.length < FINDING_KINDS.reduce((sum, kind) => sum + list.counts[kind], 0);
  return { findings, counts: list.counts, totals: list.totals, truncated, load };
}

/**
 * Where each train is over the whole session, block by block. A train occupies a block from the
 * session's start (the block its first run departs from) to the session's end (the block its last
 * run stops in), and between two runs it holds the block it stands in. So the occupancy has two
 * parts: stays, a train's steps in one block merged where they overlap, touch or come within the
 * headway of each other (so two stays of one train in a block are always more than the headway
 * apart); and stands, the time a train waits between its runs and before the first and after the
 * last, which no step covers. An interval clashes with another train's when their
 * `[enter, reach)` overlap, reach = exit + headway − TIME_TOLERANCE_S.
 */
function occupancy(plan: Plan, index: PlanIndex, stepsByEnter: Int32Array, trainRuns: RunsByTrain) {
  const headway = plan.rules.headwayS;
  const { stepEnter, stepExit, stepBlock, stepRun, stepStart } = index;
  const trainCount = plan.trains.length;
  const stepCount = stepEnter.length;
  // A run whose train is unknown (only in a plan the schema never saw) is an owner of its own.
  const stepOwner = new Int32Array(stepCount);
  for (let k = 0; k < stepCount; k++) {
    const r = stepRun[k]!;
    stepOwner[k] = index.runTrain[r]! >= 0 ? index.runTrain[r]! : trainCount + r;
  }
  // Steps in a known block by block, owner, entry and position: stable groupings of the entry order.
  const byOwner = groupBy(stepOwner, trainCount + plan.runs.length, stepsByEnter).items;
  const stepOrder = groupBy(stepBlock, plan.blocks.length, byOwner).items;

  // At most one stay per step, and one stand per run and one more per train.
  const capacity = stepOrder.length + plan.runs.length + trainCount;
  const block = new Int32Array(capacity);
  const owner = new Int32Array(capacity);
  const enterAll = new Float64Array(capacity);
  const exitAll = new Float64Array(capacity);
  const reachAll = new Float64Array(capacity);
  /** Stays: their steps are stepOrder[from[i]] .. stepOrder[to[i] − 1]; stands: from[i] = −1 − run. */
  const from = new Int32Array(capacity);
  const to = new Int32Array(capacity);
  let count = 0;
  const push = (b: number, o: number, e: number, x: number, f: number, t: number) => {
    block[count] = b;
    owner[count] = o;
    enterAll[count] = e;
    exitAll[count] = x;
    reachAll[count] = x + headway - TIME_TOLERANCE_S;
    from[count] = f;
    to[count] = t;
    count++;
  };
  for (let i = 0; i < stepOrder.length; i++) {
    const k = stepOrder[i]!;
    const b = stepBlock[k]!;
    const o = stepOwner[k]!;
    const last = count - 1;
    if (last >= 0 && block[last] === b && owner[last] === o && stepEnter[k]! <= exitAll[last]! + headway) {
      if (stepExit[k]! > exitAll[last]!) {
        exitAll[last] = stepExit[k]!;
        reachAll[last] = stepExit[k]! + headway - TIME_TOLERANCE_S;
      }
      to[last] = i + 1;
      continue;
    }
    push(b, o, stepEnter[k]!, stepExit[k]!, i, i + 1);
  }
  const stayCount = count;

  // Stands, train by train in departure order.
  let sessionEnd = plan.sessionEndS ?? -Infinity;
  if (plan.sessionEndS === undefined) for (const x of stepExit) if (x > sessionEnd) sessionEnd = x;
  const stand = (t: number, r: number, at: number, fromS: number, toS: number) => {
    const b = stepBlock[at]!;
    if (b >= 0 && toS - fromS > TIME_TOLERANCE_S) push(b, t, fromS, toS, -1 - r, -1);
  };
  for (let t = 0; t < trainCount; t++) {
    const end = trainRuns.offsets[t + 1]!;
    for (let i = trainRuns.offsets[t]!; i < end; i++) {
      const r = trainRuns.items[i]!;
      const firstStep = stepStart[r]!;
      const lastStep = stepStart[r + 1]! - 1;
      if (i === trainRuns.offsets[t]) stand(t, r, firstStep, Math.min(0, stepEnter[firstStep]!), stepEnter[firstStep]!);
      if (i + 1 < end) stand(t, r, lastStep, stepExit[lastStep]!, stepEnter[stepStart[trainRuns.items[i + 1]!]!]!);
      else stand(t, r, lastStep, stepExit[lastStep]!, sessionEnd);
    }
  }
  const enter = enterAll.subarray(0, count);
  const exit = exitAll.subarray(0, count);
  const reach = reachAll.subarray(0, count);
  const isStand = new Uint8Array(count);
  // An interval shorter than the tolerance (with no headway) can clash with nothing.
  const group = new Int32Array(count);
  for (let i = 0; i < count; i++) {
    isStand[i] = from[i]! < 0 ? 1 : 0;
    group[i] = reach[i]! > enter[i]! ? block[i]! : -1;
  }

  /** The run an interval speaks for at time `atS`: a stand's own, or the stay's step entered last by then. */
  const runAt = (i: number, atS: number): number => {
    if (from[i]! < 0) return -1 - from[i]!;
    let lo = from[i]!;
    let hi = to[i]! - 1;
    while (lo < hi) {
      const mid = (lo + hi + 1) >> 1;
      if (stepEnter[stepOrder[mid]!]! <= atS) lo = mid;
      else hi = mid - 1;
    }
    return stepRun[stepOrder[lo]!]!;
  };
  return { count, block, owner, enter, exit, reach, group, isStand, stayCount, runAt, sessionEnd };
}

type Occupancy = ReturnType<typeof occupancy>;

/** A gap as people read it: to the millisecond, never rounded up (29.9995 s is "29.999 s"). */
function formatGap(seconds: number): string {
  return `${Math.floor(seconds * 1000 + 1e-6) / 1000} s`;
}

/** The shared time of two intervals, or the too-short gap between them. */
function meeting(occ: Occupancy, p: number, q: number) {
  const lastIn = Math.max(occ.enter[p]!, occ.enter[q]!);
  const firstOut = Math.min(occ.exit[p]!, occ.exit[q]!);
  const shared = lastIn < firstOut;
  return { shared, lastIn, fromS: Math.min(lastIn, firstOut), toS: Math.max(lastIn, firstOut) };
}

/**
 * `block-overlap` between two trains' stays and `block-occupied` where a stand is one side, one
 * finding per block and pair. All are counted in O(n log n); only as many as the list has room for
 * are found, in order of the later interval's entry.
 */
function findBlockClashes(
  plan: Plan,
  index: PlanIndex,
  stepsByEnter: Int32Array,
  trainRuns: RunsByTrain,
  names: PlanNames,
  list: FindingList,
): number {
  const headway = plan.rules.headwayS;
  const occ = occupancy(plan, index, stepsByEnter, trainRuns);
  const blockCount = plan.blocks.length;
  const sum = (values: number[]) => values.reduce((a, b) => a + b, 0);
  const orders = { byStart: orderByKey(occ.enter), byEnd: orderByKey(occ.reach) };
  const stayGroup = occ.group.map((g, i) => (occ.isStand[i] ? -1 : g));
  const stayPairs = sum(countOverlapsInGroups(stayGroup, blockCount, occ.enter, occ.reach, orders));
  // Pairs of one train (a stand and its own stays) never clash: count them to take them off. Their
  // groups are numbered in (block, owner) order, from the intervals grouped by owner, then block.
  const byOwner = groupBy(occ.owner, plan.trains.length + plan.runs.length).items;
  const byBlockOwner = groupBy(occ.group, blockCount, byOwner);
  const ownerGroup = new Int32Array(occ.count).fill(-1);
  let ownerGroups = 0;
  for (let k = 0; k < byBlockOwner.items.length; k++) {
    const i = byBlockOwner.items[k]!;
    const before = k > 0 ? byBlockOwner.items[k - 1]! : -1;
    if (before < 0 || occ.group[before] !== occ.group[i] || occ.owner[before] !== occ.owner[i]) ownerGroups++;
    ownerGroup[i] = ownerGroups - 1;
  }
  const samePairs = sum(countOverlapsInGroups(ownerGroup, ownerGroups, occ.enter, occ.reach, orders));
  const allPairs = sum(countOverlapsInGroups(occ.group, blockCount, occ.enter, occ.reach, orders));
  const order = orders.byStart;

  const describe = (p: number, q: number, kind: 'block-overlap' | 'block-occupied') => {
    const m = meeting(occ, p, q);
    const runP = occ.runAt(p, m.lastIn);
    const runQ = occ.runAt(q, m.lastIn);
    const blockId = plan.blocks[occ.block[p]!]!.id;
    const [runA, runB] = orderedPair(plan.runs[runP]!.id, plan.runs[runQ]!.id);
    const block = withNoun('block', names.block(blockId));
    const apart = `only ${formatGap(m.toS - m.fromS)} apart (${names.span(m.fromS, m.toS)}); the headway is ${headway} s`;
    let message: string;
    if (kind === 'block-overlap') {
      // Ids stay in string order; the message names the earlier departure first, as people read it.
      const [early, late] = earlierFirst(plan, runP, runQ);
      const both = `${names.run(early)} and ${names.run(late)}`;
      message = m.shared ? `${both} are both in ${block} ${names.span(m.fromS, m.toS)}` : `${both} pass through ${block} ${apart}`;
    } else {
      const [stand, other] = occ.isStand[p] ? [p, q] : [q, p];
      // A stand is named by the run it waits for (before a train's first run) or follows.
      const standRun = (i: number) => {
        const run = plan.runs[occ.runAt(i, m.lastIn)]!;
        return { train: names.train(run.trainId), which: `${occ.exit[i]! <= run.departS ? 'before' : 'after'} ${names.run(run.id)}` };
      };
      const waiting = standRun(stand);
      const waits = `${waiting.train} stands in ${block} ${names.span(occ.enter[stand]!, occ.exit[stand]!)}, ${waiting.which}`;
      const when = m.shared ? names.span(m.fromS, m.toS) : apart;
      if (occ.isStand[other]) {
        const also = standRun(other);
        message = `${waits}; ${also.train} stands there too, ${also.which}, ${when}`;
      } else {
        message = `${waits}; ${names.run(plan.runs[other === p ? runP : runQ]!.id)} runs through it ${when}`;
      }
    }
    return { kind, severity: 'error' as const, ids: [blockId, runA, runB], fromS: m.fromS, toS: m.toS, message };
  };

  // Never more visits than pairs: the sweep stops at the last one.
  let room = Math.min(list.room('block-overlap'), stayPairs);
  if (room > 0) {
    forEachOverlapInGroups(order, stayGroup, blockCount, occ.enter, occ.reach, (p, q) => {
      list.add(describe(p, q, 'block-overlap'));
      return --room > 0;
    });
  }
  list.countAll('block-overlap', stayPairs, 'error');

  const occupiedPairs = allPairs - stayPairs - samePairs;
  room = Math.min(list.room('block-occupied'), occupiedPairs);
  if (room > 0) {
    forEachMarkedOverlapInGroups(order, occ.group, blockCount, occ.isStand, occ.enter, occ.reach, (p, q) => {
      if (occ.owner[p] === occ.owner[q]) return true;
      list.add(describe(p, q, 'block-occupied'));
      return --room > 0;
    });
  }
  list.countAll('block-occupied', occupiedPairs, 'error');
  return occ.sessionEnd;
}

/** Every run's movement `[departS, arriveS)`, and the orders findDoubleBookings sweeps it in. */
function runMovements(plan: Plan) {
  const runs = plan.runs;
  const depart = Float64Array.from(runs, (run) => run.departS);
  const arrive = Float64Array.from(runs, (run) => run.arriveS);
  // Two movements clash when they share more than the tolerance: [departS, arriveS − tolerance).
  const until = Float64Array.from(runs, (run) => run.arriveS - TIME_TOLERANCE_S);
  return { depart, arrive, until, orders: { byStart: orderByKey(depart), byEnd: orderByKey(until) } };
}

function findDoubleBookings(
  plan: Plan,
  movements: ReturnType<typeof runMovements>,
  runOwner: Int32Array,
  owners: readonly { id: string }[],
  kind: 'cab-double-booked' | 'operator-double-booked' | 'train-double-booked',
  ownerName: (id: string) => string,
  names: PlanNames,
  list: FindingList,
): void {
  const runs = plan.runs;
  const { depart, arrive, until, orders } = movements;
  const owner = Int32Array.from(runOwner, (o, r) => (until[r]! > depart[r]! ? o : -1));
  const total = countOverlapsInGroups(owner, owners.length, depart, until, orders).reduce((a, b) => a + b, 0);
  let room = Math.min(list.room(kind), total);
  if (room > 0) {
    const order = orders.byStart;
    forEachOverlapInGroups(order, owner, owners.length, depart, until, (p, q) => {
      const ownerId = owners[owner[p]!]!.id;
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

/**
 * `locomotive-in-two-trains` `[locomotiveId, trainA, trainB]` (error): a locomotive in the consists of two
 * trains that are on the track at the same moment. A train with runs is on the track from the
 * session's start (or its first step, if earlier) to the session's end.
 */
function findLocomotiveInTwoTrains(plan: Plan, index: PlanIndex, names: PlanNames, sessionEnd: number, list: FindingList): void {
  const firstEnter = new Float64Array(plan.trains.length).fill(Infinity);
  const lastExit = new Float64Array(plan.trains.length).fill(-Infinity);
  for (let r = 0; r < plan.runs.length; r++) {
    const t = index.runTrain[r]!;
    if (t < 0) continue;
    const first = index.stepEnter[index.stepStart[r]!]!;
    const last = index.stepExit[index.stepStart[r + 1]! - 1]!;
    if (first < firstEnter[t]!) firstEnter[t] = first;
    if (last > lastExit[t]!) lastExit[t] = last;
  }
  const locomotiveOf = new Map(plan.locomotives.map((locomotive, i) => [locomotive.id, i]));
  const locomotive: number[] = [];
  const train: number[] = [];
  const start: number[] = [];
  const end: number[] = [];
  plan.trains.forEach((t, i) => {
    if (firstEnter[i] === Infinity) return;
    for (const locomotiveId of new Set(t.locomotiveIds)) {
      const l = locomotiveOf.get(locomotiveId);
      if (l === undefined) continue;
      locomotive.push(l);
      train.push(i);
      start.push(Math.min(0, firstEnter[i]!));
      end.push(Math.max(sessionEnd, lastExit[i]!) - TIME_TOLERANCE_S);
    }
  });
  const group = Int32Array.from(locomotive, (l, i) => (end[i]! > start[i]! ? l : -1));
  const total = countOverlapsInGroups(group, plan.locomotives.length, start, end).reduce((a, b) => a + b, 0);
  let room = Math.min(list.room('locomotive-in-two-trains'), total);
  if (room > 0) {
    const order = orderByKey(start);
    forEachOverlapInGroups(order, group, plan.locomotives.length, start, end, (p, q) => {
      const locomotiveId = plan.locomotives[locomotive[p]!]!.id;
      const [trainA, trainB] = orderedPair(plan.trains[train[p]!]!.id, plan.trains[train[q]!]!.id);
      const fromS = Math.max(start[p]!, start[q]!);
      const toS = Math.min(end[p]!, end[q]!) + TIME_TOLERANCE_S;
      list.add({
        kind: 'locomotive-in-two-trains',
        severity: 'error',
        ids: [locomotiveId, trainA, trainB],
        fromS,
        toS,
        message:
          `${withNoun('locomotive', names.locomotive(locomotiveId))} is in ${withNoun('train', names.train(trainA))} and ` +
          `${withNoun('train', names.train(trainB))}, which are both on the track ${names.span(fromS, toS)}`,
      });
      return --room > 0;
    });
  }
  list.countAll('locomotive-in-two-trains', total, 'error');
}

/** `step-gap` `[runId, blockA, blockB]` (error): a run's next step begins after its step before ended. */
function findStepGaps(plan: Plan, index: PlanIndex, names: PlanNames, findings: FindingSink): void {
  const { stepStart, stepEnter, stepExit } = index;
  for (let r = 0; r < plan.runs.length; r++) {
    for (let k = stepStart[r]! + 1; k < stepStart[r + 1]!; k++) {
      const gap = stepEnter[k]! - stepExit[k - 1]!;
      if (!(gap > TIME_TOLERANCE_S)) continue;
      const run = plan.runs[r]!;
      const before = run.steps[k - 1 - stepStart[r]!]!;
      const after = run.steps[k - stepStart[r]!]!;
      findings.push({
        kind: 'step-gap',
        severity: 'error',
        ids: [run.id, before.blockId, after.blockId],
        fromS: before.exitS,
        toS: after.enterS,
        message: willList(findings, 'step-gap')
          ? `${names.run(run.id)} leaves ${withNoun('block', names.block(before.blockId))} ${formatGap(gap)} before it enters ` +
            `${withNoun('block', names.block(after.blockId))}: between them the train is nowhere`
          : '',
      });
    }
  }
}

/** Each train's runs (indices) in the order it runs them: by departS, ties by run id. */
interface RunsByTrain {
  /** Train t's runs are items[offsets[t]] .. items[offsets[t + 1] − 1]. */
  items: Int32Array;
  offsets: Int32Array;
}

function runsByTrain(plan: Plan, index: PlanIndex): RunsByTrain {
  const runs = plan.runs;
  const depart = Float64Array.from(runs, (run) => run.departS);
  const grouped = groupBy(index.runTrain, plan.trains.length, orderByKey(depart));
  // Ties in departS (rare) by id: an insertion sort that only moves runs departing together.
  const { items, offsets } = grouped;
  for (let t = 0; t < plan.trains.length; t++) {
    for (let i = offsets[t]! + 1; i < offsets[t + 1]!; i++) {
      const r = items[i]!;
      let j = i - 1;
      while (j >= offsets[t]! && depart[items[j]!] === depart[r] && runs[items[j]!]!.id > runs[r]!.id) {
        items[j + 1] = items[j]!;
        j--;
      }
      items[j + 1] = r;
    }
  }
  return grouped;
}

function findContinuityBreaks(plan: Plan, trainRuns: RunsByTrain, names: PlanNames, findings: FindingSink): void {
  const runs = plan.runs;
  const { items, offsets } = trainRuns;
  for (let t = 0; t < plan.trains.length; t++) {
    for (let i = offsets[t]! + 1; i < offsets[t + 1]!; i++) {
      const earlier = runs[items[i - 1]!]!;
      const later = runs[items[i]!]!;
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
        message: willList(findings, 'train-continuity')
          ? `${withNoun('train', names.train(trainId))} ends ${names.run(earlier.id)} in ${withNoun('block', names.block(endedIn))} ` +
            `but starts ${names.run(later.id)} in ${withNoun('block', names.block(startsIn))}`
          : '',
      });
    }
  }
}

function findRouteGaps(plan: Plan, index: PlanIndex, names: PlanNames, findings: FindingSink): void {
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
        message: willList(findings, 'route-gap')
          ? `${names.run(run.id)} goes from ${withNoun('block', names.block(before.blockId))} straight to ` +
            `${withNoun('block', names.block(after.blockId))}, which no link joins`
          : '',
      });
    }
  });
}

function findTooLong(plan: Plan, index: PlanIndex, names: PlanNames, findings: FindingSink): void {
  plan.runs.forEach((run, r) => {
    const train = plan.trains[index.runTrain[r]!];
    if (train === undefined) return;
    const shorter = (b: number) => b >= 0 && plan.blocks[b]!.lengthMm < train.lengthMm;
    if (!shorter(index.stepBlock[index.stepStart[r]!]!) && !shorter(index.stepBlock[index.stepStart[r + 1]! - 1]!)) return;
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
        message: willList(findings, 'train-too-long')
          ? `${names.run(run.id)} ${stand.where} in ${withNoun('block', names.block(block.id))} (${block.lengthMm} mm), ` +
            `shorter than the train (${train.lengthMm} mm)`
          : '',
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

