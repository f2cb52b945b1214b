/**
 * checkPlan's findings beyond their kinds and ids: the time each covers, against the brute force of
 * oracle.ts; the bookkeeping of the capped list (what is listed, counted and totalled when the caps
 * cut it); the time budget between phases; and the wording of check.ts's messages on a worked example.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { checkPlan, CheckBudgetError, FINDING_KINDS, type Finding, type Plan } from '@/lib/planning';
import { identicalRunsPlan } from '@/lib/cli/identical-runs-plan';
import { planArbitrary } from './plan-arbitrary';
import { oracleClashes, oracleContinuityAndRoutes, oracleStepGaps, type OracleFinding } from './oracle';

const CLASH_KINDS = ['block-overlap', 'block-occupied', 'cab-double-booked', 'operator-double-booked', 'train-double-booked', 'locomotive-in-two-trains'];
const SHAPE_KINDS = ['train-continuity', 'route-gap', 'train-too-long', 'step-gap'];
// Times to the microsecond: the engine takes the 1 ms tolerance off a locomotive's time on the track and
// adds it back, which floating point may not undo to the last bit.
const timed = (f: OracleFinding | Finding) => `${f.kind}|${f.severity}|${f.ids.join(',')}|${f.fromS!.toFixed(6)}|${f.toS!.toFixed(6)}`;
const timedOf = (findings: readonly (OracleFinding | Finding)[], kinds: readonly string[]) =>
  findings.filter((f) => kinds.includes(f.kind)).map(timed).sort();

describe('checkPlan finding times against brute force', () => {
  for (const timeScale of [1, 0.1]) {
    // Half the plans end the session at a given time (before, at or after the last step's exit), so
    // the stands after each train's last run reach it.
    const plans = fc
      .tuple(planArbitrary({ timeScale }), fc.option(fc.integer({ min: 0, max: 120 }), { nil: undefined }))
      .map(([plan, end]): Plan => (end === undefined ? plan : { ...plan, sessionEndS: end * timeScale }));

    it(`times × ${timeScale}: each clash covers the time both hold the block, cab, operator, train or locomotive, or the too-short gap`, () => {
      fc.assert(
        fc.property(plans, (plan) => {
          expect(timedOf(checkPlan(plan).findings, CLASH_KINDS)).toEqual(timedOf(oracleClashes(plan), CLASH_KINDS));
        }),
        { numRuns: 200 },
      );
    });

    it(`times × ${timeScale}: each continuity break, route gap, step gap and too-long stand covers the time it is about`, () => {
      fc.assert(
        fc.property(plans, (plan) => {
          const expected = [...oracleContinuityAndRoutes(plan), ...oracleStepGaps(plan)];
          expect(timedOf(checkPlan(plan).findings, SHAPE_KINDS)).toEqual(timedOf(expected, SHAPE_KINDS));
        }),
        { numRuns: 200 },
      );
    });
  }
});

describe('checkPlan caps: listed, counted and totalled', () => {
  const total = (counts: Record<string, number>) => FINDING_KINDS.reduce((sum, kind) => sum + counts[kind]!, 0);
  // More runs than the property tests use, so that kinds run past small caps.
  const plans = planArbitrary({ maxRuns: 10 });

  it('with a per-kind cap: counts and totals as uncapped, each kind listed up to the cap, every listed finding one of the uncapped ones', () => {
    fc.assert(
      fc.property(plans, fc.integer({ min: 0, max: 4 }), (plan, maxPerKind) => {
        const all = checkPlan(plan);
        const capped = checkPlan(plan, { maxPerKind });
        expect(capped.counts).toEqual(all.counts);
        // The totals count every finding, listed or not, by its severity.
        const severity = new Map(all.findings.map((f) => [f.kind, f.severity]));
        const bySeverity = { errors: 0, warnings: 0 };
        for (const kind of FINDING_KINDS) {
          if (all.counts[kind] > 0) bySeverity[severity.get(kind) === 'error' ? 'errors' : 'warnings'] += all.counts[kind];
          expect(capped.findings.filter((f) => f.kind === kind), kind).toHaveLength(Math.min(maxPerKind, all.counts[kind]));
        }
        expect(all.totals).toEqual(bySeverity);
        expect(capped.totals).toEqual(bySeverity);
        expect(all.findings).toHaveLength(total(all.counts));
        expect(all.truncated).toBe(false);
        expect(capped.truncated).toBe(capped.findings.length < total(all.counts));
        // Listed findings are whole (message written, in sentence case) and in the list's order.
        const uncapped = all.findings.map((f) => JSON.stringify(f));
        let at = -1;
        for (const f of capped.findings) {
          const next = uncapped.indexOf(JSON.stringify(f), at + 1);
          expect(next, f.message).toBeGreaterThan(at);
          at = next;
        }
      }),
      { numRuns: 100 },
    );
  });

  it('with a cap in all: the earliest findings of the full list, in its order', () => {
    fc.assert(
      fc.property(plans, fc.integer({ min: 0, max: 12 }), (plan, maxFindings) => {
        const all = checkPlan(plan);
        const capped = checkPlan(plan, { maxFindings });
        expect(capped.findings).toEqual(all.findings.slice(0, maxFindings));
        expect(capped.counts).toEqual(all.counts);
        expect(capped.totals).toEqual(all.totals);
        expect(capped.truncated).toBe(maxFindings < all.findings.length);
      }),
      { numRuns: 100 },
    );
  });

  it('orders the full list by start, then kind in FINDING_KINDS order, then ids', () => {
    fc.assert(
      fc.property(plans, (plan) => {
        const { findings } = checkPlan(plan);
        for (let i = 1; i < findings.length; i++) {
          const [a, b] = [findings[i - 1]!, findings[i]!];
          const order = a.fromS - b.fromS || FINDING_KINDS.indexOf(a.kind) - FINDING_KINDS.indexOf(b.kind) || (a.ids.join('\u0000') <= b.ids.join('\u0000') ? -1 : 1);
          expect(order, `${a.kind} ${a.ids} before ${b.kind} ${b.ids}`).toBeLessThan(0);
        }
      }),
      { numRuns: 100 },
    );
  });
});

describe('checkPlan time budget', () => {
  it('looks at the clock after each phase: an overrun first seen at any of them gives up', () => {
    const plan = identicalRunsPlan(3);
    // The clock reads 0 until the given reading, then 2 s: the budget of 1 s is spent from there on.
    const late = (from: number) => {
      let reads = 0;
      return () => (++reads >= from ? 2000 : 0);
    };
    let readings = 0;
    checkPlan(plan, { budget: { ms: 1000, now: () => (readings++, 0) } });
    // The start, then after the block clashes, the bookings, the track checks and the power checks.
    expect(readings).toBe(5);
    for (let from = 2; from <= readings; from++) expect(() => checkPlan(plan, { budget: { ms: 1000, now: late(from) } }), `reading ${from}`).toThrow(CheckBudgetError);
    expect(() => checkPlan(plan, { budget: { ms: 1000, now: late(readings + 1) } })).not.toThrow();
    expect(() => checkPlan(plan, { budget: { ms: 1000, now: late(2) } })).toThrow('the plan is too large to check within 1000 ms');
    try {
      checkPlan(plan, { budget: { ms: 1000, now: late(2) } });
    } catch (error) {
      expect(error).toMatchObject({ name: 'CheckBudgetError', budgetMs: 1000 });
    }
  });
});

describe('checkPlan messages on worked examples', () => {
  // Fast clock 6:1 from 06:00, so 10 real s are one fast minute. Yard and Platform get the noun
  // "block"; Main block already says it, and so does Cab 2 (cab North gets "cab").
  const base = (runs: Plan['runs'], extra: Partial<Plan> = {}): Plan => ({
    version: 1,
    scale: { name: 'H0', ratio: 87 },
    clock: { ratio: 6, fastStart: '06:00' },
    rules: { headwayS: 30, surgeS: 0, derate: 1 },
    supplies: [{ id: 's1', name: 'Bench supply', volts: 12, amps: 10 }],
    drivers: [{ id: 'd1', name: 'Driver', supplyId: 's1', channels: 2, channelAmps: 5, channelPeakAmps: 5, totalAmps: null, dropVolts: 0 }],
    cabs: [
      { id: 'c1', name: 'North', driverId: 'd1', channel: 1 },
      { id: 'c2', name: 'Cab 2', driverId: 'd1', channel: 2 },
    ],
    blocks: [
      { id: 'A', name: 'Yard', lengthMm: 2000 },
      { id: 'B', name: 'Main block', lengthMm: 2000 },
      { id: 'C', name: 'Platform', lengthMm: 800 },
    ],
    links: [{ a: 'A', b: 'B' }],
    locomotives: [{ id: 'l1', name: 'Tank engine', runningAmps: 0.3, stallAmps: 0.9, ratedVolts: 12 }],
    trains: [
      { id: 't1', name: 'Goods', locomotiveIds: ['l1'], lightingAmps: 0, lengthMm: 1000 },
      { id: 't2', name: 'Local', locomotiveIds: ['l1'], lightingAmps: 0, lengthMm: 1000 },
    ],
    operators: [{ id: 'o1', name: 'Ann' }],
    runs,
    ...extra,
  });
  const noSharedLoco = {
    trains: [
      { id: 't1', name: 'Goods', locomotiveIds: ['l1'], lightingAmps: 0, lengthMm: 1000 },
      { id: 't2', name: 'Local', locomotiveIds: [], lightingAmps: 0, lengthMm: 1000 },
    ],
  };
  const found = (plan: Plan) =>
    checkPlan(plan)
      .findings.filter((f) => CLASH_KINDS.includes(f.kind) || SHAPE_KINDS.includes(f.kind))
      .map((f) => [f.kind, f.ids, f.fromS, f.toS, f.message]);

  it('names two trains in a block by earlier departure first, with the shared time or the too-short gap (headway: common practice)', () => {
    const plan = base([
      // Goods holds Yard 0–40 and Main block 40–100; Local waits in Yard until it leaves at 50.
      { id: 'r2', trainId: 't1', cabId: 'c1', operatorId: 'o1', departS: 0, arriveS: 100, steps: [{ blockId: 'A', enterS: 0, exitS: 40 }, { blockId: 'B', enterS: 40, exitS: 100 }] },
      { id: 'r1', trainId: 't2', cabId: 'c1', operatorId: 'o1', departS: 50, arriveS: 200, steps: [{ blockId: 'A', enterS: 50, exitS: 120 }, { blockId: 'B', enterS: 120, exitS: 200 }] },
    ]);
    expect(found(plan)).toEqual([
      ['block-occupied', ['A', 'r1', 'r2'], 0, 40, 'Local stands in block Yard from 06:00 to 06:05 fast, before Local (06:05 departure); Goods (06:00 departure) runs through it from 06:00 to 06:04 fast'],
      ['locomotive-in-two-trains', ['l1', 't1', 't2'], 0, 200, 'Locomotive Tank engine is in train Goods and train Local, which are both on the track from 06:00 to 06:20 fast'],
      ['block-overlap', ['A', 'r1', 'r2'], 40, 50, 'Goods (06:00 departure) and Local (06:05 departure) pass through block Yard only 10 s apart (from 06:04 to 06:05 fast); the headway is 30 s'],
      ['cab-double-booked', ['c1', 'r1', 'r2'], 50, 100, 'Cab North is booked for Goods (06:00 departure) and Local (06:05 departure) at once, from 06:05 to 06:10 fast'],
      ['operator-double-booked', ['o1', 'r1', 'r2'], 50, 100, 'Ann is booked for Goods (06:00 departure) and Local (06:05 departure) at once, from 06:05 to 06:10 fast'],
      ['block-overlap', ['B', 'r1', 'r2'], 100, 120, 'Goods (06:00 departure) and Local (06:05 departure) pass through Main block only 20 s apart (from 06:10 to 06:12 fast); the headway is 30 s'],
      ['block-occupied', ['B', 'r1', 'r2'], 120, 200, 'Goods stands in Main block from 06:10 to 06:20 fast, after Goods (06:00 departure); Local (06:05 departure) runs through it from 06:12 to 06:20 fast'],
    ]);
  });

  it('says "are both in" for shared time and writes a gap to the millisecond, never rounded up', () => {
    const plan = base(
      [
        { id: 'r1', trainId: 't1', cabId: 'c1', operatorId: null, departS: 0, arriveS: 50, steps: [{ blockId: 'A', enterS: 0, exitS: 10 }, { blockId: 'B', enterS: 10, exitS: 50 }] },
        // Enters Yard 29.9985 s after Goods left it: 1.5 ms inside the headway's tolerance.
        { id: 'r2', trainId: 't2', cabId: 'c2', operatorId: null, departS: 39.9985, arriveS: 60, steps: [{ blockId: 'A', enterS: 39.9985, exitS: 45 }, { blockId: 'B', enterS: 45, exitS: 60 }] },
      ],
      { sessionEndS: 60, ...noSharedLoco },
    );
    expect(found(plan)).toEqual([
      ['block-occupied', ['A', 'r1', 'r2'], 0, 10, 'Local stands in block Yard from 06:00 to 06:03 fast, before Local (06:03 departure); Goods (06:00 departure) runs through it from 06:00 to 06:01 fast'],
      ['block-overlap', ['A', 'r1', 'r2'], 10, 39.9985, 'Goods (06:00 departure) and Local (06:03 departure) pass through block Yard only 29.998 s apart (from 06:01 to 06:03 fast); the headway is 30 s'],
      ['block-overlap', ['B', 'r1', 'r2'], 45, 50, 'Goods (06:00 departure) and Local (06:03 departure) are both in Main block from 06:04 to 06:05 fast'],
      ['block-occupied', ['B', 'r1', 'r2'], 50, 60, 'Goods stands in Main block from 06:05 to 06:06 fast, after Goods (06:00 departure); Local (06:03 departure) runs through it from 06:05 to 06:06 fast'],
    ]);
  });

  it('names a standing train by the run it waits for or follows, and two standing trains both', () => {
    const plan = base([
      // Goods ends in Yard at 50 and stands there to the session's end (160); Local stands there until 100.
      { id: 'rA', trainId: 't1', cabId: 'c1', operatorId: null, departS: 0, arriveS: 50, steps: [{ blockId: 'A', enterS: 0, exitS: 50 }] },
      { id: 'rB', trainId: 't2', cabId: 'c2', operatorId: null, departS: 100, arriveS: 160, steps: [{ blockId: 'A', enterS: 100, exitS: 130 }, { blockId: 'B', enterS: 130, exitS: 160 }] },
    ]);
    expect(found(plan)).toEqual([
      ['block-occupied', ['A', 'rA', 'rB'], 0, 50, 'Local stands in block Yard from 06:00 to 06:10 fast, before Local (06:10 departure); Goods (06:00 departure) runs through it from 06:00 to 06:05 fast'],
      ['locomotive-in-two-trains', ['l1', 't1', 't2'], 0, 160, 'Locomotive Tank engine is in train Goods and train Local, which are both on the track from 06:00 to 06:16 fast'],
      ['block-occupied', ['A', 'rA', 'rB'], 50, 100, 'Local stands in block Yard from 06:00 to 06:10 fast, before Local (06:10 departure); Goods stands there too, after Goods (06:00 departure), from 06:05 to 06:10 fast'],
      ['block-occupied', ['A', 'rA', 'rB'], 100, 130, 'Goods stands in block Yard from 06:05 to 06:16 fast, after Goods (06:00 departure); Local (06:10 departure) runs through it from 06:10 to 06:13 fast'],
    ]);
  });

  it('breaks a tie in departure by run id, and writes one fast minute as "at"', () => {
    const plan = base(
      [
        { id: 'rb', trainId: 't1', cabId: 'c1', operatorId: null, departS: 0, arriveS: 60, steps: [{ blockId: 'B', enterS: 0, exitS: 60 }] },
        { id: 'ra', trainId: 't2', cabId: 'c1', operatorId: null, departS: 0, arriveS: 60, steps: [{ blockId: 'C', enterS: 0, exitS: 60 }] },
        // 110.1 − 110 is 0.0999… in binary floating point: still "0.1 s".
        { id: 'rc', trainId: 't1', cabId: 'c2', operatorId: null, departS: 100, arriveS: 130, steps: [{ blockId: 'B', enterS: 100, exitS: 110 }, { blockId: 'A', enterS: 110.1, exitS: 130 }] },
        { id: 'rd', trainId: 't1', cabId: 'c2', operatorId: null, departS: 120, arriveS: 125, steps: [{ blockId: 'A', enterS: 120, exitS: 125 }] },
      ],
      noSharedLoco,
    );
    expect(found(plan)).toEqual([
      ['cab-double-booked', ['c1', 'ra', 'rb'], 0, 60, 'Cab North is booked for Local (06:00 departure) and Goods (06:00 departure) at once, from 06:00 to 06:06 fast'],
      ['train-too-long', ['ra', 'C'], 0, 60, 'Local (06:00 departure) stands in block Platform (800 mm), shorter than the train (1000 mm)'],
      ['step-gap', ['rc', 'B', 'A'], 110, 110.1, 'Goods (06:10 departure) leaves Main block 0.1 s before it enters block Yard: between them the train is nowhere'],
      // Two runs of one train at once: this finding only, not a clash in Yard.
      ['cab-double-booked', ['c2', 'rc', 'rd'], 120, 125, 'Cab 2 is booked for Goods (06:10 departure) and Goods (06:12 departure) at once, at 06:12 fast'],
      ['train-double-booked', ['t1', 'rc', 'rd'], 120, 125, 'Train Goods is booked for Goods (06:10 departure) and Goods (06:12 departure) at once, at 06:12 fast'],
    ]);
  });

  it('times compare with a 1 ms tolerance: a clash must last, and a gap fall short of the headway, by more than 1 ms (common practice)', () => {
    const goods: Plan['runs'][number] = {
      id: 'r1', trainId: 't1', cabId: 'c1', operatorId: null, departS: 0, arriveS: 40,
      steps: [{ blockId: 'A', enterS: 0, exitS: 40 }, { blockId: 'B', enterS: 40, exitS: 50 }],
    };
    const local = (departS: number, steps: Plan['runs'][number]['steps']): Plan['runs'][number] => ({ id: 'r2', trainId: 't2', cabId: 'c2', operatorId: null, departS, arriveS: 100, steps });
    // Local enters Yard as Goods leaves it: no shared time, a gap of 0 s, inside the 30 s headway.
    const touching = base([goods, local(40, [{ blockId: 'C', enterS: 0, exitS: 40 }, { blockId: 'A', enterS: 40, exitS: 100 }])], noSharedLoco);
    expect(found(touching).filter((f) => f[0] === 'block-overlap')).toEqual([
      ['block-overlap', ['A', 'r1', 'r2'], 40, 40, 'Goods (06:00 departure) and Local (06:04 departure) pass through block Yard only 0 s apart (at 06:04 fast); the headway is 30 s'],
    ]);
    // With no headway, Local is in Yard with Goods for exactly 1 ms (0.001 to 0.002 s): no clash there;
    // in Main block they are both from 40 to 50 s, and Goods stands there after its run.
    const oneMs = base([goods, local(0.001, [{ blockId: 'A', enterS: 0.001, exitS: 0.002 }, { blockId: 'B', enterS: 0.002, exitS: 100 }])], {
      ...noSharedLoco,
      rules: { headwayS: 0, surgeS: 0, derate: 1 },
    });
    expect(found(oneMs).filter((f) => CLASH_KINDS.includes(f[0] as string))).toEqual([
      ['block-overlap', ['B', 'r1', 'r2'], 40, 50, 'Goods (06:00 departure) and Local (06:00 departure) are both in Main block from 06:04 to 06:05 fast'],
      ['block-occupied', ['B', 'r1', 'r2'], 50, 100, 'Goods stands in Main block from 06:05 to 06:10 fast, after Goods (06:00 departure); Local (06:00 departure) runs through it from 06:05 to 06:10 fast'],
    ]);
    // Local waits 1 ms in Yard before its run (0 to 0.001 s): no stand, so only the two runs clash there.
    const shortWait = base([goods, local(0.001, [{ blockId: 'A', enterS: 0.001, exitS: 100 }])], noSharedLoco);
    expect(found(shortWait).filter((f) => CLASH_KINDS.includes(f[0] as string))).toEqual([
      ['block-overlap', ['A', 'r1', 'r2'], 0.001, 40, 'Goods (06:00 departure) and Local (06:00 departure) are both in block Yard from 06:00 to 06:04 fast'],
    ]);
  });

  it('a booking or a time on the track of 1 ms clashes with nothing (common practice: the 1 ms tolerance)', () => {
    const runOf = (id: string, trainId: string, cabId: string, blockId: string, departS: number, arriveS: number): Plan['runs'][number] => ({
      id, trainId, cabId, operatorId: null, departS, arriveS, steps: [{ blockId, enterS: departS, exitS: arriveS }],
    });
    // Cab North: Goods 0–40, Local for 1 ms at 10 s, then Local again 30–60 (a real double booking).
    const cab = base([runOf('r1', 't1', 'c1', 'A', 0, 40), runOf('r3', 't2', 'c1', 'C', 10, 10.001), runOf('r4', 't2', 'c1', 'C', 30, 60)], noSharedLoco);
    expect(found(cab).filter((f) => f[0] === 'cab-double-booked')).toEqual([
      ['cab-double-booked', ['c1', 'r1', 'r4'], 30, 40, 'Cab North is booked for Goods (06:00 departure) and Local (06:03 departure) at once, from 06:03 to 06:04 fast'],
    ]);
    // The session ends at 0: Goods (0–10 s) and Express (0–5 s) share the locomotive; Local, on the track
    // for 1 ms only, shares it with neither.
    const trains = [
      { id: 't1', name: 'Goods', locomotiveIds: ['l1'], lightingAmps: 0, lengthMm: 1000 },
      { id: 't2', name: 'Local', locomotiveIds: ['l1'], lightingAmps: 0, lengthMm: 1000 },
      { id: 't3', name: 'Express', locomotiveIds: ['l1'], lightingAmps: 0, lengthMm: 1000 },
    ];
    const loco = base([runOf('r1', 't1', 'c1', 'A', 0, 10), runOf('r2', 't2', 'c2', 'C', 0, 0.001), runOf('r3', 't3', 'c2', 'B', 20, 25)], {
      trains,
      sessionEndS: 0,
    });
    expect(found(loco).filter((f) => f[0] === 'locomotive-in-two-trains')).toEqual([
      ['locomotive-in-two-trains', ['l1', 't1', 't3'], 0, 10, 'Locomotive Tank engine is in train Goods and train Express, which are both on the track from 06:00 to 06:01 fast'],
    ]);
  });

  it('a step gap of exactly 1 ms is none; 2.5 ms is one, written to the millisecond (common practice: the 1 ms tolerance)', () => {
    const plan = base(
      [
        {
          id: 'r1',
          trainId: 't1',
          cabId: 'c1',
          operatorId: null,
          departS: 0,
          arriveS: 10,
          steps: [
            { blockId: 'A', enterS: 0, exitS: 0.001 },
            { blockId: 'B', enterS: 0.002, exitS: 5 },
            { blockId: 'A', enterS: 5.0025, exitS: 10 },
          ],
        },
      ],
      { trains: [{ id: 't1', name: 'Goods', locomotiveIds: ['l1'], lightingAmps: 0, lengthMm: 1000 }] },
    );
    expect(found(plan)).toEqual([
      ['step-gap', ['r1', 'B', 'A'], 5, 5.0025, 'Goods (06:00 departure) leaves Main block 0.002 s before it enters block Yard: between them the train is nowhere'],
    ]);
  });

  it('words the shape warnings: where a too-long train starts and ends, route and step gaps, a continuity break', () => {
    const plan = base(
      [
        { id: 'r1', trainId: 't1', cabId: 'c1', operatorId: null, departS: 10, arriveS: 100, steps: [{ blockId: 'C', enterS: 0, exitS: 30 }, { blockId: 'A', enterS: 40, exitS: 60 }, { blockId: 'B', enterS: 60, exitS: 110 }] },
        { id: 'r0', trainId: 't1', cabId: 'c2', operatorId: null, departS: 300, arriveS: 400, steps: [{ blockId: 'A', enterS: 300, exitS: 350 }, { blockId: 'C', enterS: 350, exitS: 420 }] },
      ],
      { trains: [{ id: 't1', name: 'Goods', locomotiveIds: ['l1'], lightingAmps: 0, lengthMm: 1000 }] },
    );
    expect(found(plan)).toEqual([
      ['train-too-long', ['r1', 'C'], 0, 10, 'Goods (06:01 departure) starts in block Platform (800 mm), shorter than the train (1000 mm)'],
      ['route-gap', ['r1', 'C', 'A'], 30, 40, 'Goods (06:01 departure) goes from block Platform straight to block Yard, which no link joins'],
      ['step-gap', ['r1', 'C', 'A'], 30, 40, 'Goods (06:01 departure) leaves block Platform 10 s before it enters block Yard: between them the train is nowhere'],
      ['train-continuity', ['t1', 'r1', 'r0'], 100, 300, 'Train Goods ends Goods (06:01 departure) in Main block but starts Goods (06:30 departure) in block Yard'],
      ['route-gap', ['r0', 'A', 'C'], 350, 350, 'Goods (06:30 departure) goes from block Yard straight to block Platform, which no link joins'],
      ['train-too-long', ['r0', 'C'], 400, 420, 'Goods (06:30 departure) ends in block Platform (800 mm), shorter than the train (1000 mm)'],
    ]);
  });
});
