/**
 * The polarity check at its edges: the crossing's time window and its scan cap, turns at the first
 * and last step and inside a stay split into steps, ends no link joins, and a reversing section
 * exactly as long as the train or left exactly as the tail clears. Model: the right-hand rail is
 * positive in the direction of travel (NEM 631 2.3); a reversing section is gapped at both ends,
 * has its own polarity switch and must hold the whole train while it flips (common practice).
 * Times are real seconds; the fast clock runs 4:1 from 07:00.
 */
import { describe, expect, it } from 'vitest';
import { checkPlan, indexPlan, TIME_TOLERANCE_S, travelOfPlan, type Finding, type Plan } from '@/lib/planning';
import { orderByKey } from '@/lib/planning/intervals';
import { planNames } from '@/lib/planning/names';
import { findPolarityIssues } from '@/lib/planning/polarity';
import { basePlan, runOf } from './polarity-plan';

const TRACK_KINDS = ['reversing-loop', 'joint-wiring', 'joint-short', 'reversing-section-short', 'route-reversal', 'route-gap'];
const found = (plan: Plan) =>
  checkPlan(plan)
    .findings.filter((f) => TRACK_KINDS.includes(f.kind))
    .map((f) => [f.kind, f.severity, f.ids, f.fromS, f.toS, f.message]);

type Rail = 'right' | 'left';
type End = 'a' | 'b';
interface StepSpec {
  blockId: string;
  enterS: number;
  exitS: number;
  fromEnd?: End;
  toEnd?: End;
}

const blocksOf = (ids: string[], rails: Partial<Record<string, Rail>> = {}) =>
  ids.map((id) => ({ id, name: id, lengthMm: 2000, ...(rails[id] ? { positiveRail: rails[id] } : {}) }));

describe('travelOfPlan: the direction of travel of every step, run by run', () => {
  it('worked example by hand: two runs over one joint, one each way', () => {
    // Link A.b–B.a. Goods A → B: it leaves A by its b end (the only end joined to B) and enters B by
    // its a end, heading on to B's b end. Railcar B → A: B's a end is the one joined to A, so it heads
    // for a, and enters A at its b end, heading for a. The first step of a run crosses no joint.
    const plan = basePlan({
      blocks: blocksOf(['A', 'B']),
      links: [{ a: 'A', aEnd: 'b', b: 'B', bEnd: 'a' }],
      runs: [
        runOf('r1', 't', 'c1', [
          { blockId: 'A', enterS: 0, exitS: 10 },
          { blockId: 'B', enterS: 8, exitS: 20 },
        ]),
        runOf('r2', 'u', 'c2', [
          { blockId: 'B', enterS: 30, exitS: 40 },
          { blockId: 'A', enterS: 38, exitS: 50 },
        ]),
      ],
    });
    expect(travelOfPlan(plan, indexPlan(plan))).toEqual([
      { fromEnd: ['a', 'a'], toEnd: ['b', 'b'], joined: [false, true] },
      { fromEnd: ['b', 'b'], toEnd: ['a', 'a'], joined: [false, true] },
    ]);
  });
});

describe('a crossing while another cab feeds the block beyond (two cabs meeting through the wheels)', () => {
  // Link A.b–B.a, both wired alike: the polarity agrees across the gap (NEM 631 2.3), so the only
  // short is another cab's. Goods on Cab 2 bridges the gap A → B from 8 s (entering B) to 10 s
  // (its tail clears A). Railcar on Cab 1 stands in B over [enterS, exitS).
  const crossing = (other: { blockId?: string; enterS: number; exitS: number; cabId?: string }, tail = { exitS: 10, enterB: 8 }) =>
    basePlan({
      blocks: blocksOf(['A', 'B']),
      links: [{ a: 'A', aEnd: 'b', b: 'B', bEnd: 'a' }],
      runs: [
        runOf('r1', 't', 'c2', [
          { blockId: 'A', enterS: 0, exitS: tail.exitS },
          { blockId: 'B', enterS: tail.enterB, exitS: 20 },
        ]),
        runOf('r2', 'u', other.cabId ?? 'c1', [{ blockId: other.blockId ?? 'B', enterS: other.enterS, exitS: other.exitS }]),
      ],
    });
  const short = (fromS: number, toS: number, blockId = 'B') => [
    'joint-short',
    'error',
    ['r1', 'A', 'B'],
    fromS,
    toS,
    `Goods (07:00 departure) bridges the rail gap from block A into block B at 07:00 fast while block ${blockId} is fed by Cab 1 for Railcar (07:00 departure): two cabs meet across the gap through its wheels`,
  ];

  it('finds the other cab when its train enters the block in the middle of the crossing (9 s, inside 8–10 s)', () => {
    // Cab 1 (the plan's first cab, index 0) feeds B from 9 s while the wheels still bridge the gap.
    expect(found(crossing({ enterS: 9, exitS: 30 }))).toEqual([short(8, 10)]);
  });

  it('no short when the other train enters as the tail clears (10 s), or within the 1 ms tolerance before it (9.999 s)', () => {
    // Intervals [8, 10) and [10, 30) only touch; TIME_TOLERANCE_S (1 ms) counts 9.999 s as 10 s too.
    expect(found(crossing({ enterS: 10, exitS: 30 }))).toEqual([]);
    expect(found(crossing({ enterS: 9.999, exitS: 30 }))).toEqual([]);
    // 2 ms before the tail clears is a real overlap.
    expect(found(crossing({ enterS: 9.998, exitS: 30 }))).toEqual([short(8, 10)]);
  });

  it('no short when the other cab stops feeding the block as the crossing starts (8 s), or within 1 ms after it (8.001 s)', () => {
    // Railcar in A over [1, exitS) on Cab 1: it leaves A (and Cab 1 stops feeding it) as Goods'
    // head enters B at 8 s. Goods itself holds A from 0 s to 10 s, so the scan passes Railcar's step
    // (the latest exit so far is Goods' 10 s) and must look at Railcar's own exit.
    expect(found(crossing({ blockId: 'A', enterS: 1, exitS: 8 }))).toEqual([]);
    expect(found(crossing({ blockId: 'A', enterS: 1, exitS: 8.001 }))).toEqual([]);
    // Still feeding A 2 ms into the crossing: a short, named by the block left.
    expect(found(crossing({ blockId: 'A', enterS: 1, exitS: 8.002 }))).toEqual([short(8, 10, 'A')]);
  });

  it('a crossing timed with no overlap (out of A and into B both at 10 s) still bridges the gap for an instant', () => {
    // fromS = 10 s, toS = max(10, 10) = 10 s; the window is widened to 2 ms (10 s .. 10.002 s, less the
    // 1 ms tolerance at each side), so Railcar entering B at 10 s on Cab 1 is there as the wheels pass.
    expect(found(crossing({ enterS: 10, exitS: 30 }, { exitS: 10, enterB: 10 }))).toEqual([short(10, 10)]);
    // Entering B 2 ms later (past the 1 ms tolerance) it is not there as the wheels pass.
    expect(found(crossing({ enterS: 10.002, exitS: 30 }, { exitS: 10, enterB: 10 }))).toEqual([]);
  });

  it('a run on a cab the plan does not have feeds nothing (an unresolved reference is skipped, plan-index.ts)', () => {
    expect(found(crossing({ enterS: 9, exitS: 30, cabId: 'ghost' }))).toEqual([]);
  });

  it('compares a crossing with at most 64 steps of the block (CROSSING_SCAN_CAP), nearest entry first', () => {
    // Goods (Cab 2) bridges A → B from 8 s to 10 s. Fillers: n runs on Cab 2 too (no short with
    // Goods' own cab) standing in B from 9 s; Railcar on Cab 1 entered B at 5 s. Scanning back from the
    // crossing's end: the n fillers, Goods' own step (8 s), then Railcar as the (n + 2)th step.
    const withFillers = (n: number) => {
      const plan = crossing({ enterS: 5, exitS: 30 });
      for (let i = 0; i < n; i++) plan.runs.push(runOf(`f${i}`, 'u', 'c2', [{ blockId: 'B', enterS: 9, exitS: 30 }]));
      return plan;
    };
    const cab1Shorts = (plan: Plan) => checkPlan(plan).findings.filter((f) => f.kind === 'joint-short' && f.message.includes('Cab 1'));
    // 62 fillers: Railcar is the 64th step looked at, the last the cap allows.
    expect(cab1Shorts(withFillers(62)).map((f) => [f.ids, f.fromS, f.toS])).toEqual([[['r1', 'A', 'B'], 8, 10]]);
    // 63 fillers: it would be the 65th; the scan stops first, so a plan full of clashes costs no more.
    expect(cab1Shorts(withFillers(63))).toEqual([]);
  });

  it('finds the same whether checkPlan passes the steps in order of entry or the check sorts them itself', () => {
    // Listed out of order of entry: Goods' step in B (8 s), Railcar II in B at 100 s, Railcar at 0–9 s.
    // Sorted by entry, Railcar (Cab 1, in B until 9 s) is the step before the crossing's end (10 s).
    const plan = crossing({ enterS: 100, exitS: 110 });
    plan.runs.push(runOf('r3', 'u', 'c1', [{ blockId: 'B', enterS: 0, exitS: 9 }]));
    const index = indexPlan(plan);
    const listed = (stepsByEnter?: Int32Array) => {
      const findings: Finding[] = [];
      findPolarityIssues(plan, index, planNames(plan), findings, stepsByEnter);
      return findings.map((f) => [f.kind, f.ids, f.fromS, f.toS]);
    };
    expect(listed()).toEqual([['joint-short', ['r1', 'A', 'B'], 8, 10]]);
    expect(listed(orderByKey(index.stepEnter))).toEqual(listed());
  });

  it('leaves the message empty for a finding that would only be counted (finding.ts FindingSink.lists)', () => {
    const plan = crossing({ enterS: 9, exitS: 30 });
    const pushed: Finding[] = [];
    findPolarityIssues(plan, indexPlan(plan), planNames(plan), { push: (f) => pushed.push(f), lists: () => false });
    expect(pushed.map((f) => [f.kind, f.ids, f.fromS, f.toS, f.message])).toEqual([['joint-short', ['r1', 'A', 'B'], 8, 10, '']]);
  });
});

describe('ends no link joins (route-gap from the run\'s ends)', () => {
  // Blocks P, Q, R in that order; links P.b–Q.a and Q.b–R.a.
  const line = (runs: Plan['runs']) =>
    basePlan({
      blocks: blocksOf(['P', 'Q', 'R']),
      links: [
        { a: 'P', aEnd: 'b', b: 'Q', bEnd: 'a' },
        { a: 'Q', aEnd: 'b', b: 'R', bEnd: 'a' },
      ],
      runs,
    });
  const gap = (id: string, from: string, to: string, fromS: number, out: End, into: End, dep: string) => [
    'route-gap',
    'error',
    [id, from, to],
    fromS,
    fromS + 2,
    `Goods (${dep} departure) leaves block ${from} by its ${out} end into block ${to} by its ${into} end, and no link joins those ends`,
  ];

  it('a run that says it leaves by the end away from the next block, in either direction along the line', () => {
    // Q → R leaving Q by its a end (joined to P, not R): into R by its a end (R's end nearest Q).
    // R → Q leaving R by its b end (joined to nothing): into Q by its a end (the default, no end reaches).
    const plan = line([
      runOf('forward', 't', 'c1', [
        { blockId: 'Q', enterS: 0, exitS: 10, toEnd: 'a' },
        { blockId: 'R', enterS: 8, exitS: 20 },
      ]),
      runOf('back', 't', 'c1', [
        { blockId: 'R', enterS: 100, exitS: 110, toEnd: 'b' },
        { blockId: 'Q', enterS: 108, exitS: 120 },
      ]),
    ]);
    expect(found(plan)).toEqual([gap('forward', 'Q', 'R', 8, 'a', 'a', '07:00'), gap('back', 'R', 'Q', 108, 'b', 'a', '07:06')]);
  });

  it('a run that says it enters by the end away from the block before (only the entry end given)', () => {
    // Q is left by its b end (the end joined to R), R is said to be entered at its b end: not joined.
    const plan = line([
      runOf('r', 't', 'c1', [
        { blockId: 'Q', enterS: 0, exitS: 10 },
        { blockId: 'R', enterS: 8, exitS: 20, fromEnd: 'b' },
      ]),
    ]);
    expect(found(plan)).toEqual([gap('r', 'Q', 'R', 8, 'b', 'b', '07:00')]);
  });

  it('blocks with no link at all: the route check\'s finding only, not a second one about ends', () => {
    // R → P with ends given: check.ts findRouteGaps names the missing link; the ends add nothing.
    const plan = line([
      runOf('r', 't', 'c1', [
        { blockId: 'R', enterS: 0, exitS: 10, toEnd: 'b' },
        { blockId: 'P', enterS: 8, exitS: 20, fromEnd: 'a' },
      ]),
    ]);
    expect(found(plan)).toEqual([['route-gap', 'error', ['r', 'R', 'P'], 8, 10, 'Goods (07:00 departure) goes from block R straight to block P, which no link joins']]);
  });

  it('a block joined to itself (a circle as one block): two steps in it are one stay, not a crossing', () => {
    // Link O.b–O.a. Round the circle: the first step leaves by b, the second says it came in at a.
    const plan = basePlan({
      blocks: blocksOf(['O']),
      links: [{ a: 'O', aEnd: 'b', b: 'O', bEnd: 'a' }],
      runs: [
        runOf('r', 't', 'c1', [
          { blockId: 'O', enterS: 0, exitS: 10, toEnd: 'b' },
          { blockId: 'O', enterS: 10, exitS: 20, fromEnd: 'a' },
        ]),
      ],
    });
    expect(found(plan)).toEqual([]);
  });
});

describe('turns: a run changing direction inside a block', () => {
  // Links A.b–B.a and A.b–S.a (a siding S off A's b end, as in polarity.test.ts).
  const siding = (runs: Plan['runs']) =>
    basePlan({
      blocks: blocksOf(['A', 'B', 'S']),
      links: [
        { a: 'A', aEnd: 'b', b: 'B', bEnd: 'a' },
        { a: 'A', aEnd: 'b', b: 'S', bEnd: 'a' },
      ],
      runs,
    });

  it('a stop split into two steps reports the turn once, at the step the train leaves from', () => {
    // B → A (in at A's b end), stop in A heading back for b (given), start again in A, out to S by A's b end.
    // Both A steps come in and leave by b; the stay is one turn, reported with the second step's times.
    const plan = siding([
      runOf('r', 't', 'c1', [
        { blockId: 'B', enterS: 0, exitS: 10 },
        { blockId: 'A', enterS: 8, exitS: 30, toEnd: 'b' },
        { blockId: 'A', enterS: 30, exitS: 50 },
        { blockId: 'S', enterS: 48, exitS: 60 },
      ]),
    ]);
    expect(found(plan)).toEqual([
      [
        'route-reversal',
        'error',
        ['r', 'A'],
        30,
        50,
        'Goods (07:00 departure) changes direction in block A, which is not a place where trains may reverse: end the run there and start another, or mark the block a reversing place',
      ],
    ]);
  });

  it('no turn at a run\'s first or last step, whatever ends they give (a run may start or end facing either way)', () => {
    // The first step comes from A's b end and leaves by it; the last comes in at S's a end and "leaves" by a.
    const plan = siding([
      runOf('r', 't', 'c1', [
        { blockId: 'A', enterS: 0, exitS: 10, fromEnd: 'b', toEnd: 'b' },
        { blockId: 'S', enterS: 8, exitS: 20, fromEnd: 'a', toEnd: 'a' },
      ]),
    ]);
    expect(found(plan)).toEqual([]);
    // The same two blocks in the middle of a run: both turns are reported (control for the above).
    plan.runs = [
      runOf('r', 't', 'c1', [
        { blockId: 'B', enterS: 0, exitS: 10 },
        { blockId: 'A', enterS: 8, exitS: 20, fromEnd: 'b', toEnd: 'b' },
        { blockId: 'S', enterS: 18, exitS: 30, fromEnd: 'a', toEnd: 'a' },
        { blockId: 'A', enterS: 28, exitS: 40 },
      ]),
    ];
    expect(found(plan).map((f) => [f[0], f[2], f[3], f[4]])).toEqual([
      ['route-reversal', ['r', 'A'], 8, 20],
      ['route-reversal', ['r', 'S'], 18, 30],
    ]);
  });
});

describe('a reversing section between two blocks of opposite polarity (NEM 631 2.3; common practice: longer than the train)', () => {
  // A.b–S.a and S.b–C.a. A and S wired alike; C wired the other way (as the far side of a loop is):
  // heading from A's b end the cab must give forward in A (+1) and reverse in C (−1), so S flips while
  // the train is wholly inside it. Steps: A 0–20 s, S 18–40 s, C 38–60 s; the tail clears A at 20 s and
  // the head reaches C at 38 s.
  const section = (o: { sectionMm?: number; trainMm?: number; cRail?: Rail; sRail?: Rail; steps?: StepSpec[]; isSection?: boolean; trainId?: string } = {}) =>
    basePlan({
      blocks: [
        { id: 'A', name: 'Approach', lengthMm: 2000 },
        { id: 'S', name: 'Section', lengthMm: o.sectionMm ?? 1000, reversingSection: o.isSection ?? true, positiveRail: o.sRail ?? 'right' },
        { id: 'C', name: 'Curve', lengthMm: 2000, positiveRail: o.cRail ?? 'left' },
      ],
      links: [
        { a: 'A', aEnd: 'b', b: 'S', bEnd: 'a' },
        { a: 'S', aEnd: 'b', b: 'C', bEnd: 'a' },
      ],
      trains: [{ id: 't', name: 'Goods', locomotiveIds: ['l'], lightingAmps: 0, lengthMm: o.trainMm ?? 1000 }],
      runs: [
        runOf('r', o.trainId ?? 't', 'c1', o.steps ?? [
          { blockId: 'A', enterS: 0, exitS: 20 },
          { blockId: 'S', enterS: 18, exitS: 40 },
          { blockId: 'C', enterS: 38, exitS: 60 },
        ]),
      ],
    });
  const tooShort = (fromS: number, toS: number, why: string) => [
    'reversing-section-short',
    'error',
    ['r', 'S'],
    fromS,
    toS,
    `Goods (07:00 departure) is never wholly inside the reversing section Section ${why}: the section cannot change polarity without the train bridging a rail gap of opposite polarity`,
  ];

  it('a train exactly as long as the section fits; 1 mm longer does not', () => {
    expect(found(section({ sectionMm: 1000, trainMm: 1000 }))).toEqual([]);
    expect(found(section({ sectionMm: 1000, trainMm: 1001 }))).toEqual([tooShort(18, 40, "(1000 mm, shorter than the train's 1001 mm)")]);
  });

  it('the head reaching the far block as the tail clears the near one (20 s both) is never wholly inside', () => {
    const steps = (headOut: number) => [
      { blockId: 'A', enterS: 0, exitS: 20 },
      { blockId: 'S', enterS: 18, exitS: 40 },
      { blockId: 'C', enterS: headOut, exitS: 60 },
    ];
    const early = "(its head reaches Curve before its tail clears Approach)";
    // Section exactly the train's length, so only the times can fail.
    expect(found(section({ steps: steps(20) }))).toEqual([tooShort(18, 40, early)]);
    // Within the 1 ms tolerance (TIME_TOLERANCE_S) it is the same instant.
    expect(TIME_TOLERANCE_S).toBe(0.001);
    expect(found(section({ steps: steps(20.0009) }))).toEqual([tooShort(18, 40, early)]);
    // 2 ms of the train wholly inside is enough for the switch in the model.
    expect(found(section({ steps: steps(20.002) }))).toEqual([]);
  });

  it('a stay in the section split into two steps is one passage', () => {
    const steps = [
      { blockId: 'A', enterS: 0, exitS: 20 },
      { blockId: 'S', enterS: 18, exitS: 30 },
      { blockId: 'S', enterS: 30, exitS: 40 },
      { blockId: 'C', enterS: 38, exitS: 60 },
    ];
    expect(found(section({ steps, sectionMm: 800 }))).toEqual([tooShort(18, 40, "(800 mm, shorter than the train's 1000 mm)")]);
    expect(found(section({ steps, sectionMm: 1200 }))).toEqual([]);
  });

  it('no flip needed (the blocks either side wired alike): a short section is no matter', () => {
    expect(found(section({ sectionMm: 500, cRail: 'right' }))).toEqual([]);
  });

  it('crossing into the section by a joint of opposite polarity is no short: the section has its own switch', () => {
    // S wired the other way from A: leaving A by b needs forward, entering S at a (heading b) needs reverse.
    // C wired like A: no flip overall, so nothing at all to report.
    expect(found(section({ sRail: 'left', cRail: 'right', sectionMm: 500 }))).toEqual([]);
  });

  it('the same block not marked a reversing section: a wiring fault and a short, not a section too short', () => {
    const plan = section({ isSection: false, sectionMm: 800 });
    expect(found(plan)).toEqual([
      [
        'joint-wiring',
        'warning',
        ['S', 'C'],
        0,
        0,
        'Block Section (b end) and block Curve (a end) are wired so that one cab output puts opposite polarity either side of their rail gap: a train crossing it shorts the supply. Swap the feeders of one of them (its positive rail)',
      ],
      [
        'joint-short',
        'error',
        ['r', 'S', 'C'],
        38,
        40,
        'Goods (07:00 departure) bridges the rail gap from block Section into block Curve at 07:02 fast with its cab driving forward, but the block entered needs reverse for the right-hand rail to be positive in the direction of travel (NEM 631 2.3): its wheels short the supply across the gap',
      ],
    ]);
  });

  it('a passage in or out by ends no link joins is the route\'s finding, not the section\'s', () => {
    // In: A left by its a end (joined to nothing): the cab gives reverse in A, forward in C (wired like A).
    const inBadly = section({
      sectionMm: 800,
      cRail: 'right',
      steps: [
        { blockId: 'A', enterS: 0, exitS: 20, toEnd: 'a' },
        { blockId: 'S', enterS: 18, exitS: 40 },
        { blockId: 'C', enterS: 38, exitS: 60 },
      ],
    });
    expect(found(inBadly)).toEqual([
      ['route-gap', 'error', ['r', 'A', 'S'], 18, 20, 'Goods (07:00 departure) leaves block Approach by its a end into block Section by its a end, and no link joins those ends'],
    ]);
    // Out: C said to be entered at its b end (S's b end joins C's a end): forward in A, reverse in C.
    const outBadly = section({
      sectionMm: 800,
      cRail: 'right',
      steps: [
        { blockId: 'A', enterS: 0, exitS: 20 },
        { blockId: 'S', enterS: 18, exitS: 40 },
        { blockId: 'C', enterS: 38, exitS: 60, fromEnd: 'b' },
      ],
    });
    expect(found(outBadly)).toEqual([
      ['route-gap', 'error', ['r', 'S', 'C'], 38, 40, 'Goods (07:00 departure) leaves block Section by its b end into block Curve by its b end, and no link joins those ends'],
    ]);
  });

  it('names it on a plan the schema never saw without throwing (unknown train, unknown block: skipped, plan-index.ts)', () => {
    // A run of a train the plan does not have: no length to compare, so no section finding.
    expect(found(section({ trainId: 'ghost', sectionMm: 10 }))).toEqual([]);
    // A step in a block the plan does not have, turning in it: skipped by every polarity check.
    const lost = section({
      steps: [
        { blockId: 'A', enterS: 0, exitS: 20 },
        { blockId: 'nowhere', enterS: 18, exitS: 40, fromEnd: 'a', toEnd: 'a' },
        { blockId: 'C', enterS: 38, exitS: 60 },
      ],
    });
    expect(() => checkPlan(lost)).not.toThrow();
    expect(found(lost).filter((f) => f[0] !== 'route-gap')).toEqual([]);
  });
});
