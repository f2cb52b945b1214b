import { willList, type FindingSink } from './finding';
import { withNoun, type PlanNames } from './names';
import type { PlanIndex } from './plan-index';
import { TIME_TOLERANCE_S } from './rules';
import type { Plan } from './schema';
import { groupBy, orderByKey } from './intervals';
import { checkJointParity, endAdjacency, endCode, linkEnds, neededOutput, nodeEnd, travelOfSteps, type FlatTravel, type Travel } from './track';

/** How many other trains' steps one crossing is compared with in a block (a plan full of clashes stays bounded). */
const CROSSING_SCAN_CAP = 64;

/** The direction of travel of every step of the plan (see travelOfRun), laid out as the index lays out the steps. */
function travelOfPlanSteps(plan: Plan, index: PlanIndex): FlatTravel {
  const joined = endAdjacency(plan.blocks.length, plan.links, (id) => index.blockOf.get(id));
  const total = index.stepBlock.length;
  const givenFrom = new Int8Array(total);
  const givenTo = new Int8Array(total);
  const out: FlatTravel = { fromEnd: new Uint8Array(total), toEnd: new Uint8Array(total), joined: new Uint8Array(total) };
  const steps = { block: index.stepBlock, givenFrom, givenTo };
  plan.runs.forEach((run, r) => {
    const first = index.stepStart[r]!;
    run.steps.forEach((step, j) => {
      givenFrom[first + j] = endCode(step.fromEnd);
      givenTo[first + j] = endCode(step.toEnd);
    });
    travelOfSteps(steps, first, index.stepStart[r + 1]!, joined, out);
  });
  return out;
}

/** The direction of travel of every run's steps (see travelOfRun), in plan order. */
export function travelOfPlan(plan: Plan, index: PlanIndex): Travel[] {
  const flat = travelOfPlanSteps(plan, index);
  return plan.runs.map((_, r) => {
    const from = index.stepStart[r]!;
    const to = index.stepStart[r + 1]!;
    return {
      fromEnd: Array.from(flat.fromEnd.subarray(from, to), nodeEnd),
      toEnd: Array.from(flat.toEnd.subarray(from, to), nodeEnd),
      joined: Array.from(flat.joined.subarray(from, to), (j) => j === 1),
    };
  });
}

/**
 * The track's and the runs' direction and polarity findings (see checkPlan for the kinds):
 * `reversing-loop` and `joint-wiring` from the layout alone; `route-reversal`, `joint-short` and
 * `reversing-section-short` from the runs. Work: O(blocks + links + steps) after the steps' order by
 * entry (`stepsByEnter`, as orderByKey gives it; sorted here when not given).
 */
export function findPolarityIssues(plan: Plan, index: PlanIndex, names: PlanNames, findings: FindingSink, stepsByEnter?: Int32Array): void {
  const blockOf = (id: string) => index.blockOf.get(id);
  const blockName = (id: string) => withNoun('block', names.block(id));
  const parity = checkJointParity(plan.blocks, plan.links, blockOf);
  for (const loop of parity.reversingLoops) {
    const link = plan.links[loop.link]!;
    const loopNames = loop.blocks.map((b) => names.block(plan.blocks[b]!.id));
    findings.push({
      kind: 'reversing-loop',
      severity: 'error',
      ids: loop.blocks.map((b) => plan.blocks[b]!.id),
      fromS: 0,
      toS: 0,
      message:
        `the track through ${loopNames.join(', ')} turns a train round (a reversing loop or wye): at the joint of ` +
        `${names.block(link.a)} and ${names.block(link.b)} the rails meet the other way round, so no wiring avoids a short. ` +
        'Make one block of the loop a reversing section with its own polarity switch, longer than the longest train',
    });
  }
  for (const i of parity.mismatched) {
    const link = plan.links[i]!;
    const { aEnd, bEnd } = linkEnds(link);
    findings.push({
      kind: 'joint-wiring',
      severity: 'warning',
      ids: [link.a, link.b],
      fromS: 0,
      toS: 0,
      message:
        `${blockName(link.a)} (${aEnd} end) and ${blockName(link.b)} (${bEnd} end) are wired so that one cab output puts opposite ` +
        'polarity either side of their rail gap: a train crossing it shorts the supply. Swap the feeders of one of them (its positive rail)',
    });
  }

  const travel = travelOfPlanSteps(plan, index);
  const { stepStart, stepBlock, stepEnter, stepExit, runCab } = index;

  // Steps per block, sorted by entry, with the latest exit so far (to stop scanning early).
  const byBlock = groupBy(stepBlock, plan.blocks.length, stepsByEnter ?? orderByKey(stepEnter));
  const latestExit = new Float64Array(byBlock.items.length);
  for (let b = 0; b < plan.blocks.length; b++) {
    let max = -Infinity;
    for (let i = byBlock.offsets[b]!; i < byBlock.offsets[b + 1]!; i++) latestExit[i] = max = Math.max(max, stepExit[byBlock.items[i]!]!);
  }
  /** A step of another run with another cab holding block b over [fromS, toS] (the crossing). */
  const otherFeed = (b: number, run: number, fromS: number, toS: number): number | null => {
    const start = byBlock.offsets[b]!;
    const until = Math.max(toS, fromS + 2 * TIME_TOLERANCE_S) - TIME_TOLERANCE_S;
    const after = fromS + TIME_TOLERANCE_S;
    let lo = start;
    let hi = byBlock.offsets[b + 1]!;
    while (lo < hi) {
      const mid = (lo + hi) >> 1;
      if (stepEnter[byBlock.items[mid]!]! < until) lo = mid + 1;
      else hi = mid;
    }
    for (let i = lo - 1, scanned = 0; i >= start && latestExit[i]! > after && scanned < CROSSING_SCAN_CAP; i--, scanned++) {
      const k = byBlock.items[i]!;
      const r = index.stepRun[k]!;
      if (r !== run && stepExit[k]! > after && runCab[r] !== runCab[run] && runCab[r]! >= 0) return k;
    }
    return null;
  };
  /** Pairs of blocks some link joins, whichever ends (numbered a × blocks + b, both ways round). */
  let linkedPairs: Set<number> | undefined;
  const linked = (x: number, y: number) => {
    if (linkedPairs === undefined) {
      linkedPairs = new Set();
      for (const link of plan.links) {
        const a = index.blockOf.get(link.a);
        const b = index.blockOf.get(link.b);
        if (a === undefined || b === undefined) continue;
        linkedPairs.add(a * plan.blocks.length + b);
        linkedPairs.add(b * plan.blocks.length + a);
      }
    }
    return linkedPairs.has(x * plan.blocks.length + y);
  };
  plan.runs.forEach((run, r) => {
    const first = stepStart[r]!;
    const count = stepStart[r + 1]! - first;
    const train = plan.trains[index.runTrain[r]!];
    for (let j = 0; j < count; j++) {
      const k = first + j;
      const b = stepBlock[k]!;
      if (b < 0) continue;
      const block = plan.blocks[b]!;
      const sameAsNext = j + 1 < count && stepBlock[k + 1] === b;
      // A turn inside the block: it comes in and leaves by the same end.
      if (travel.fromEnd[k] === travel.toEnd[k] && j > 0 && j < count - 1 && !sameAsNext && !block.reversingPlace) {
        const step = run.steps[j]!;
        findings.push({
          kind: 'route-reversal',
          severity: 'error',
          ids: [run.id, block.id],
          fromS: step.enterS,
          toS: step.exitS,
          message:
            `${names.run(run.id)} changes direction in ${blockName(block.id)}, which is not a place where trains may reverse: ` +
            'end the run there and start another, or mark the block a reversing place',
        });
      }
      if (j === 0 || stepBlock[k - 1] === b) continue;
      const x = stepBlock[k - 1]!;
      if (x < 0) continue;
      const from = plan.blocks[x]!;
      const fromS = stepEnter[k]!;
      const toS = Math.max(stepExit[k - 1]!, stepEnter[k]!);
      if (travel.joined[k] === 0) {
        // Ends given on the steps that no link joins (a pair of blocks with no link at all is a route-gap).
        const before = run.steps[j - 1]!;
        const step = run.steps[j]!;
        if ((before.toEnd !== undefined || step.fromEnd !== undefined) && linked(x, b)) {
          findings.push({
            kind: 'route-gap',
            severity: 'error',
            ids: [run.id, from.id, block.id],
            fromS: Math.min(before.exitS, step.enterS),
            toS,
            message:
              `${names.run(run.id)} leaves ${blockName(from.id)} by its ${nodeEnd(travel.toEnd[k - 1]!)} end into ${blockName(block.id)} ` +
              `by its ${nodeEnd(travel.fromEnd[k]!)} end, and no link joins those ends`,
          });
        }
        continue;
      }
      // Polarity across the joint: what the cab must give the block left and the block entered.
      const leaving = neededOutput(nodeEnd(travel.toEnd[k - 1]!), from.positiveRail);
      const entering = neededOutput(nodeEnd(1 - travel.fromEnd[k]!), block.positiveRail);
      const switched = from.reversingSection === true || block.reversingSection === true;
      // Why the wheels short the supply across the gap, if they do (written only when listed).
      let why: (() => string) | null = null;
      if (leaving !== entering && !switched) {
        why = () =>
          `with its cab driving ${leaving > 0 ? 'forward' : 'reverse'}, but the block entered needs ${entering > 0 ? 'forward' : 'reverse'} ` +
          'for the right-hand rail to be positive in the direction of travel (NEM 631 2.3): its wheels short the supply across the gap';
      } else {
        const other = otherFeed(x, r, fromS, toS) ?? otherFeed(b, r, fromS, toS);
        if (other !== null) {
          const otherRun = plan.runs[index.stepRun[other]!]!;
          why = () =>
            `while ${blockName(plan.blocks[stepBlock[other]!]!.id)} is fed by ${withNoun('cab', names.cab(otherRun.cabId))} for ${names.run(otherRun.id)}: ` +
            'two cabs meet across the gap through its wheels';
        }
      }
      if (why === null) continue;
      findings.push({
        kind: 'joint-short',
        severity: 'error',
        ids: [run.id, from.id, block.id],
        fromS,
        toS,
        message: willList(findings, 'joint-short')
          ? `${names.run(run.id)} bridges the rail gap from ${blockName(from.id)} into ${blockName(block.id)} ${names.span(fromS, toS)} ${why()}`
          : '',
      });
    }

    // Reversing sections passed through: the polarity flips while the train is wholly inside.
    if (train === undefined) return;
    let j = 0;
    while (j < count) {
      const b = stepBlock[first + j]!;
      let last = j;
      while (last + 1 < count && stepBlock[first + last + 1] === b) last++;
      const block = plan.blocks[b];
      if (block?.reversingSection && j > 0 && last < count - 1 && travel.joined[first + j] === 1 && travel.joined[first + last + 1] === 1) {
        const from = plan.blocks[stepBlock[first + j - 1]!]!;
        const to = plan.blocks[stepBlock[first + last + 1]!]!;
        const enteringNeeds = neededOutput(nodeEnd(travel.toEnd[first + j - 1]!), from.positiveRail);
        const leavingNeeds = neededOutput(nodeEnd(1 - travel.fromEnd[first + last + 1]!), to.positiveRail);
        const tailClear = run.steps[j - 1]!.exitS;
        const headOut = run.steps[last + 1]!.enterS;
        const fits = block.lengthMm >= train.lengthMm && headOut - tailClear > TIME_TOLERANCE_S;
        if (enteringNeeds !== leavingNeeds && !fits) {
          const fromS = run.steps[j]!.enterS;
          const toS = run.steps[last]!.exitS;
          findings.push({
            kind: 'reversing-section-short',
            severity: 'error',
            ids: [run.id, block.id],
            fromS,
            toS,
            message:
              `${names.run(run.id)} is never wholly inside the reversing section ${names.block(block.id)} ` +
              (block.lengthMm < train.lengthMm
                ? `(${block.lengthMm} mm, shorter than the train's ${train.lengthMm} mm)`
                : `(its head reaches ${names.block(to.id)} before its tail clears ${names.block(from.id)})`) +
              ': the section cannot change polarity without the train bridging a rail gap of opposite polarity',
          });
        }
      }
      j = last + 1;
    }
  });
}
