/**
 * checkPlan at edges the worked examples of check-findings.test.ts leave open: which run a message
 * names first when the sweep meets the later departure first, runs of two trains departing at once,
 * intervals shorter than the 1 ms tolerance (a stay, a booking, a time on the track), and trains on
 * the track before the session starts (the schema allows a day before it). Every plan is one the
 * schema accepts; the findings are worked by hand in the comments. The fast clock runs 4:1 from
 * 07:00 (polarity-plan.ts), so 15 real seconds are one fast minute; the headway is 0 s.
 */
import { describe, expect, it } from 'vitest';
import { checkPlan, planSchema, toPlanJson, type Plan } from '@/lib/planning';
import { oracleClashes } from './oracle';
import { basePlan, runOf } from './polarity-plan';

type Step = Plan['runs'][number]['steps'][number];

/** Blocks Yard, Loop and Siding (none of the names says "block"), all linked in a row. */
const track: Partial<Plan> = {
  blocks: [
    { id: 'Y', name: 'Yard', lengthMm: 2000 },
    { id: 'L', name: 'Loop', lengthMm: 2000 },
    { id: 'S', name: 'Siding', lengthMm: 2000 },
  ],
  links: [
    { a: 'Y', b: 'L' },
    { a: 'L', b: 'S' },
  ],
};

const step = (blockId: string, enterS: number, exitS: number): Step => ({ blockId, enterS, exitS });

/** The plan, after checking that the schema accepts it (checkPlan takes accepted plans only). */
const accepted = (overrides: Partial<Plan>): Plan => {
  const plan = basePlan({ ...track, ...overrides });
  expect(planSchema.safeParse(toPlanJson(plan)).success).toBe(true);
  return plan;
};
const findingsOf = (plan: Plan, kind: string) =>
  checkPlan(plan)
    .findings.filter((f) => f.kind === kind)
    .map((f) => [f.ids, f.fromS, f.toS, f.message]);

describe('checkPlan names the earlier departure first, whichever run the sweep meets first', () => {
  it('two trains in one block: the run that departed first is named first, though the other entered the block first', () => {
    // Goods (rb) departs at 0 from Loop and reaches Yard at 100 s; Railcar (ra) departs at 50 s in
    // Yard and leaves it at 120 s. Railcar's stay in Yard begins first, but Goods departed first.
    // Both are in Yard from 100 to 120 s (07:06:40 to 07:08 fast). Worked by hand.
    const runs = [runOf('rb', 't', 'c1', [step('L', 0, 100), step('Y', 100, 150)]), runOf('ra', 'u', 'c2', [step('Y', 50, 120)])];
    for (const order of [runs, [...runs].reverse()]) {
      expect(findingsOf(accepted({ runs: order }), 'block-overlap')).toEqual([
        [['Y', 'ra', 'rb'], 100, 120, 'Goods (07:00 departure) and Railcar (07:03 departure) are both in block Yard from 07:06 to 07:08 fast'],
      ]);
    }
  });

  it('a cab booked for two runs: the earlier departure first, and at a tie the smaller run id first', () => {
    // Cab 1 drives Goods (rb, 0–60 s) and Railcar (ra, from 30 s, or from 0 s for the tie); they
    // overlap from 30 (07:02 fast) or 0 (07:00) to 60 s (07:04). Worked by hand.
    const goods = runOf('rb', 't', 'c1', [step('Y', 0, 60)]);
    for (const [railcarDeparts, first, second, from] of [
      [30, 'Goods (07:00 departure)', 'Railcar (07:02 departure)', '07:02'],
      [0, 'Railcar (07:00 departure)', 'Goods (07:00 departure)', '07:00'],
    ] as const) {
      const railcar = runOf('ra', 'u', 'c1', [step('L', railcarDeparts, 60)]);
      for (const runs of [[goods, railcar], [railcar, goods]]) {
        expect(findingsOf(accepted({ runs }), 'cab-double-booked')).toEqual([
          [['c1', 'ra', 'rb'], railcarDeparts, 60, `Cab 1 is booked for ${first} and ${second} at once, from ${from} to 07:04 fast`],
        ]);
      }
    }
  });
});

describe('checkPlan orders a train’s runs departing at once by run id, within that train only', () => {
  it('a continuity break between two runs of one train that depart with another train’s run', () => {
    // All three runs depart at 100 s (07:06 fast). Goods runs rz in Siding; Railcar runs ry in Loop
    // and ra in Yard. Railcar's runs in order are ra, then ry (ties by id), so it ends ra in Yard but
    // starts ry in Loop. Goods' rz, though its id sorts after ra and it departs with it, is no run of
    // Railcar's and takes no part. Worked by hand.
    const runs = [runOf('rz', 't', 'c1', [step('S', 100, 110)]), runOf('ry', 'u', 'c2', [step('L', 100, 110)]), runOf('ra', 'u', 'c2', [step('Y', 100, 110)])];
    expect(findingsOf(accepted({ runs }), 'train-continuity')).toEqual([
      [['u', 'ra', 'ry'], 100, 110, 'Train Railcar ends Railcar (07:06 departure) in block Yard but starts Railcar (07:06 departure) in block Loop'],
    ]);
  });
});

describe('checkPlan: an interval of 1 ms or less clashes with nothing (common practice: the 1 ms tolerance)', () => {
  const counts = (plan: Plan, kinds: readonly string[]) => {
    const { counts: all } = checkPlan(plan);
    return Object.fromEntries(kinds.map((kind) => [kind, all[kind as keyof typeof all]]));
  };

  // Each plan puts the short interval in a block, cab or locomotive of its own and another train's
  // intervals in the next one, wholly before the short one starts: an interval that ends before it
  // begins, counted with those, would take a pair off their count.
  it('a 0.5 ms step in a block: only the real clash is counted', () => {
    // Headway 0. Railcar runs in Yard 0–10 s, then in Loop 10–200 s. Goods waits in Yard until 20 s,
    // runs in it to 30 s, then spends 0.5 ms in Siding (its stay there reaches 30.0005 − 0.001 s,
    // before it begins: nothing) and stands there. The one clash: Goods stands in Yard while Railcar
    // runs through it, 0–10 s, as the brute force of oracle.ts also finds.
    const plan = accepted({
      runs: [runOf('r1', 'u', 'c2', [step('Y', 0, 10), step('L', 10, 200)]), runOf('r2', 't', 'c1', [step('Y', 20, 30), step('S', 30, 30.0005)])],
    });
    expect(counts(plan, ['block-overlap', 'block-occupied'])).toEqual({ 'block-overlap': 0, 'block-occupied': 1 });
    expect(oracleClashes(plan).filter((f) => f.kind.startsWith('block-')).map((f) => [f.kind, f.ids])).toEqual([['block-occupied', ['Y', 'r1', 'r2']]]);
  });

  it('a 0.5 ms run books neither its cab nor its train', () => {
    // Railcar runs 0–5 s on Cab 2; Goods runs 10–10.0005 s on Cab 1. No double booking of any kind.
    const plan = accepted({ runs: [runOf('r1', 'u', 'c2', [step('L', 0, 5)]), runOf('r2', 't', 'c1', [step('Y', 10, 10.0005)])] });
    expect(counts(plan, ['cab-double-booked', 'train-double-booked'])).toEqual({ 'cab-double-booked': 0, 'train-double-booked': 0 });
  });

  it('a train on the track for 0.5 ms shares no locomotive', () => {
    // The session ends at 0. Railcar (locomotive Railcar motor) is on the track from −10 s to the
    // session's end; Goods (Loco) 0–0.0005 s, less than the tolerance. Nothing to find.
    const plan = accepted({ sessionEndS: 0, runs: [runOf('r1', 'u', 'c2', [step('L', -10, -5)]), runOf('r2', 't', 'c1', [step('Y', 0, 0.0005)])] });
    expect(counts(plan, ['locomotive-in-two-trains'])).toEqual({ 'locomotive-in-two-trains': 0 });
  });
});

describe('checkPlan: trains on the track before the session starts (the schema allows a day before it)', () => {
  it('a shared locomotive: both trains are on the track from the later of their first steps', () => {
    // Goods and Railcar both have Loco. Goods runs r1 at −100 s and r2 at 50 s; Railcar runs r3 at
    // −50 s. Each is on the track from its first step (or 0, if later) to the session's end (60 s, the
    // last exit): Goods from −100 s, Railcar from −50 s, so both from −50 s (06:56:40 fast) to 60 s
    // (07:04). Worked by hand.
    const plan = accepted({
      trains: [
        { id: 't', name: 'Goods', locomotiveIds: ['l'], lightingAmps: 0, lengthMm: 1000 },
        { id: 'u', name: 'Railcar', locomotiveIds: ['l'], lightingAmps: 0, lengthMm: 400 },
      ],
      runs: [runOf('r1', 't', 'c1', [step('Y', -100, -90)]), runOf('r2', 't', 'c1', [step('Y', 50, 60)]), runOf('r3', 'u', 'c2', [step('L', -50, -40)])],
    });
    const [shared, ...more] = findingsOf(plan, 'locomotive-in-two-trains');
    expect(more).toEqual([]);
    expect(shared!.slice(0, 2)).toEqual([['l', 't', 'u'], -50]);
    // The engine takes the 1 ms tolerance off the end and adds it back: 60 s to the microsecond.
    expect(shared![2]).toBeCloseTo(60, 6);
    expect(shared![3]).toBe('Locomotive Loco is in train Goods and train Railcar, which are both on the track from 06:56 to 07:04 fast');
  });
});

describe('checkPlan: a session that ends at a set time', () => {
  it('a train stands after its last run until the set end, even where another run goes on past it', () => {
    // The session ends at 120 s (07:08 fast). Goods runs in Yard 0–60 s, then stands there to 120 s.
    // Railcar runs through Loop 0–90 s and into Yard 90–180 s, past the session's end: it meets the
    // standing Goods from 90 to 120 s (07:06 to 07:08), not to its own exit at 180 s. Worked by hand.
    const plan = accepted({ sessionEndS: 120, runs: [runOf('r1', 't', 'c1', [step('Y', 0, 60)]), runOf('r2', 'u', 'c2', [step('L', 0, 90), step('Y', 90, 180)])] });
    expect(findingsOf(plan, 'block-occupied')).toEqual([
      [['Y', 'r1', 'r2'], 90, 120, 'Goods stands in block Yard from 07:04 to 07:08 fast, after Goods (07:00 departure); Railcar (07:00 departure) runs through it from 07:06 to 07:08 fast'],
    ]);
  });

  it('a train runs past the set end: it is on the track to its last run’s end, whichever run the plan lists last', () => {
    // The session ends at 30 s. Goods and Railcar share Loco. Goods runs rA in Yard 40–90 s and rB
    // 0–10 s (listed in that order); Railcar runs in Loop 0–60 s. Goods is on the track 0–90 s,
    // Railcar 0–60 s (both past the set end): both from 0 to 60 s (07:00 to 07:04 fast). Worked by hand.
    const plan = accepted({
      sessionEndS: 30,
      trains: [
        { id: 't', name: 'Goods', locomotiveIds: ['l'], lightingAmps: 0, lengthMm: 1000 },
        { id: 'u', name: 'Railcar', locomotiveIds: ['l'], lightingAmps: 0, lengthMm: 400 },
      ],
      runs: [runOf('rA', 't', 'c1', [step('Y', 40, 90)]), runOf('rB', 't', 'c1', [step('Y', 0, 10)]), runOf('r3', 'u', 'c2', [step('L', 0, 60)])],
    });
    const [shared, ...more] = findingsOf(plan, 'locomotive-in-two-trains');
    expect(more).toEqual([]);
    expect(shared!.slice(0, 2)).toEqual([['l', 't', 'u'], 0]);
    expect(shared![2]).toBeCloseTo(60, 6);
    expect(shared![3]).toBe('Locomotive Loco is in train Goods and train Railcar, which are both on the track from 07:00 to 07:04 fast');
  });
});
