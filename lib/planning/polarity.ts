import type { Finding } from './finding';
import { withNoun, type PlanNames } from './names';
import type { PlanIndex } from './plan-index';
import { TIME_TOLERANCE_S } from './rules';
import type { Plan } from './schema';
import { checkJointParity, endAdjacency, linkEnds, neededOutput, travelOfRun, type End, type Travel } from './track';

/** How many other trains' steps one crossing is compared with in a block (a plan full of clashes stays bounded). */
const CROSSING_SCAN_CAP = 64;

/** The direction of travel of every run's steps (see travelOfRun), in plan order. */
export function travelOfPlan(plan: Plan, index: PlanIndex): Travel[] {
  const joined = endAdjacency(plan.blocks.length, plan.links, (id) => index.blockOf.get(id));
  return plan.runs.map((run, r) => {
    const first = index.stepStart[r]!;
    return travelOfRun(
      run.steps.map((step, j) => ({ block: index.stepBlock[first + j]!, fromEnd: step.fromEnd, toEnd: step.toEnd })),
      joined,
    );
  });
}

/**
 * The track's and the runs' direction and polarity findings (see checkPlan for the kinds):
 * `reversing-loop` and `joint-wiring` from the layout alone; `route-reversal`, `joint-short` and
 * `reversing-section-short` from the runs. Work: O(blocks + links + steps log steps).
 */
export function findPolarityIssues(plan: Plan, index: PlanIndex, names: PlanNames, findings: Finding[]): void {
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

  const travels = travelOfPlan(plan, index);
  const { stepStart, stepBlock, stepEnter, stepExit, runCab } = index;

  // Other trains' steps per block, sorted by entry, with the latest exit so far (to stop scanning early).
  const byBlock: number[][] = Array.from({ length: plan.blocks.length }, () => []);
  for (let k = 0; k < stepBlock.length; k++) if (stepBlock[k]! >= 0) byBlock[stepBlock[k]!]!.push(k);
  const latestExit: Float64Array[] = byBlock.map((list) => {
    list.sort((x, y) => stepEnter[x]! - stepEnter[y]! || x - y);
    const out = new Float64Array(list.length);
    let max = -Infinity;
    list.forEach((k, i) => (out[i] = max = Math.max(max, stepExit[k]!)));
    return out;
  });
  /** A step of another run with another cab holding block b over [fromS, toS] (the crossing). */
  const otherFeed = (b: number, run: number, fromS: number, toS: number): number | null => {
    const list = byBlock[b]!;
    const until = Math.max(toS, fromS + 2 * TIME_TOLERANCE_S) - TIME_TOLERANCE_S;
    const after = fromS + TIME_TOLERANCE_S;
    let lo = 0;
    let hi = list.length;
    while (lo < hi) {
      const mid = (lo + hi) >> 1;
      if (stepEnter[list[mid]!]! < until) lo = mid + 1;
      else hi = mid;
    }
    for (let i = lo - 1, scanned = 0; i >= 0 && latestExit[b]![i]! > after && scanned < CROSSING_SCAN_CAP; i--, scanned++) {
      const k = list[i]!;
      const r = index.stepRun[k]!;
      if (r !== run && stepExit[k]! > after && runCab[r] !== runCab[run] && runCab[r]! >= 0) return k;
    }
    return null;
  };

  plan.runs.forEach((run, r) => {
    const travel = travels[r]!;
    const first = stepStart[r]!;
    const count = stepStart[r + 1]! - first;
    const train = plan.trains[index.runTrain[r]!];
    for (let j = 0; j < count; j++) {
      const b = stepBlock[first + j]!;
      if (b < 0) continue;
      const block = plan.blocks[b]!;
      const step = run.steps[j]!;
      const sameAsNext = j + 1 < count && stepBlock[first + j + 1] === b;
      // A turn inside the block: it comes in and leaves by the same end.
      if (travel.fromEnd[j] === travel.toEnd[j] && j > 0 && j < count - 1 && !sameAsNext && !block.reversingPlace) {
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
      if (j === 0 || stepBlock[first + j - 1] === b) continue;
      const x = stepBlock[first + j - 1]!;
      if (x < 0) continue;
      const from = plan.blocks[x]!;
      const before = run.steps[j - 1]!;
      const fromS = step.enterS;
      const toS = Math.max(before.exitS, step.enterS);
      if (!travel.joined[j]) {
        // Ends given on the steps that no link joins (a pair of blocks with no link at all is a route-gap).
        const linked = plan.links.some((l) => (l.a === from.id && l.b === block.id) || (l.a === block.id && l.b === from.id));
        if (linked && (before.toEnd !== undefined || step.fromEnd !== undefined)) {
          findings.push({
            kind: 'route-gap',
            severity: 'error',
            ids: [run.id, from.id, block.id],
            fromS: Math.min(before.exitS, step.enterS),
            toS,
            message:
              `${names.run(run.id)} leaves ${blockName(from.id)} by its ${travel.toEnd[j - 1]} end into ${blockName(block.id)} ` +
              `by its ${travel.fromEnd[j]} end, and no link joins those ends`,
          });
        }
        continue;
      }
      // Polarity across the joint: what the cab must give the block left and the block entered.
      const need = (blk: typeof block, heading: End) => neededOutput(heading, blk.positiveRail);
      const leaving = need(from, travel.toEnd[j - 1]!);
      const entering = need(block, travel.fromEnd[j] === 'a' ? 'b' : 'a');
      const switched = from.reversingSection === true || block.reversingSection === true;
      const short = (why: string) =>
        findings.push({
          kind: 'joint-short',
          severity: 'error',
          ids: [run.id, from.id, block.id],
          fromS,
          toS,
          message: `${names.run(run.id)} bridges the rail gap from ${blockName(from.id)} into ${blockName(block.id)} ${names.span(fromS, toS)} ${why}`,
        });
      if (leaving !== entering && !switched) {
        short(
          `with its cab driving ${leaving > 0 ? 'forward' : 'reverse'}, but the block entered needs ${entering > 0 ? 'forward' : 'reverse'} ` +
            'for the right-hand rail to be positive in the direction of travel (NEM 631 2.3): its wheels short the supply across the gap',
        );
        continue;
      }
      const other = otherFeed(x, r, fromS, toS) ?? otherFeed(b, r, fromS, toS);
      if (other !== null) {
        const otherRun = plan.runs[index.stepRun[other]!]!;
        short(
          `while ${blockName(plan.blocks[stepBlock[other]!]!.id)} is fed by ${withNoun('cab', names.cab(otherRun.cabId))} for ${names.run(otherRun.id)}: ` +
            'two cabs meet across the gap through its wheels',
        );
      }
    }

    // Reversing sections passed through: the polarity flips while the train is wholly inside.
    if (train === undefined) return;
    let j = 0;
    while (j < count) {
      const b = stepBlock[first + j]!;
      let last = j;
      while (last + 1 < count && stepBlock[first + last + 1] === b) last++;
      const block = plan.blocks[b];
      if (block?.reversingSection && j > 0 && last < count - 1 && travel.joined[j] && travel.joined[last + 1]) {
        const from = plan.blocks[stepBlock[first + j - 1]!]!;
        const to = plan.blocks[stepBlock[first + last + 1]!]!;
        const enteringNeeds = neededOutput(travel.toEnd[j - 1]!, from.positiveRail);
        const leavingNeeds = neededOutput(travel.fromEnd[last + 1] === 'a' ? 'b' : 'a', to.positiveRail);
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
