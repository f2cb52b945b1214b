/**
 * The track and polarity findings in full (ids, times, wording), on the layouts of polarity.test.ts:
 * the right-hand rail positive in the direction of travel (NEM 631 2.3); a reversing loop or wye
 * needs a reversing section longer than the train (common practice).
 */
import { describe, expect, it } from 'vitest';
import { checkPlan, type Plan } from '@/lib/planning';

const TRACK_KINDS = ['reversing-loop', 'joint-wiring', 'joint-short', 'reversing-section-short', 'route-reversal', 'route-gap'];
const found = (plan: Plan) =>
  checkPlan(plan)
    .findings.filter((f) => TRACK_KINDS.includes(f.kind))
    .map((f) => [f.kind, f.ids, f.fromS, f.toS, f.message]);

function basePlan(overrides: Partial<Plan>): Plan {
  return {
    version: 1, scale: { name: 'H0', ratio: 87 }, clock: { ratio: 4, fastStart: '07:00' }, rules: { headwayS: 0, surgeS: 0, derate: 1 },
    supplies: [{ id: 's', name: 'Supply', volts: 12, amps: 10 }],
    drivers: [{ id: 'd', name: 'Driver', supplyId: 's', channels: 2, channelAmps: 5, channelPeakAmps: 5, totalAmps: null, dropVolts: 0 }],
    cabs: [{ id: 'c1', name: 'Cab 1', driverId: 'd', channel: 1 }, { id: 'c2', name: 'East', driverId: 'd', channel: 2 }],
    blocks: [], links: [],
    locomotives: [{ id: 'l', name: 'Loco', runningAmps: 0.3, stallAmps: 0.5, ratedVolts: 12 }, { id: 'l2', name: 'Railcar motor', runningAmps: 0.2, stallAmps: 0.4, ratedVolts: 12 }],
    trains: [{ id: 't', name: 'Goods', locomotiveIds: ['l'], lightingAmps: 0, lengthMm: 1000 }, { id: 'u', name: 'Railcar', locomotiveIds: ['l2'], lightingAmps: 0, lengthMm: 400 }],
    operators: [], runs: [], ...overrides,
  };
}
const run = (id: string, trainId: string, cabId: string, blocks: string[], startS = 0, perBlock = 10, overlap = 2) => ({
  id, trainId, cabId, operatorId: null, departS: startS, arriveS: startS + blocks.length * perBlock,
  steps: blocks.map((blockId, i) => ({ blockId, enterS: startS + i * perBlock - (i === 0 ? 0 : overlap), exitS: startS + (i + 1) * perBlock })),
});
const balloon = (section: boolean, loopMm = 3000) => basePlan({
  blocks: [{ id: 'M', name: 'Main', lengthMm: 2000 }, { id: 'L', name: 'Balloon', lengthMm: loopMm, reversingSection: section }],
  links: [{ a: 'M', aEnd: 'b', b: 'L', bEnd: 'a' }, { a: 'M', aEnd: 'b', b: 'L', bEnd: 'b' }],
});

// Fast clock 4:1 from 07:00: 38 s real is 07:02:32 fast.
describe('track and polarity findings, worked examples', () => {
  it('a balloon loop with no reversing section: the loop, and the short where the train closes it (NEM 631 2.3)', () => {
    const plan = balloon(false);
    plan.runs = [run('r', 't', 'c1', ['M', 'L', 'M'], 0, 20, 2)];
    expect(found(plan)).toEqual([
      [
        'reversing-loop',
        ['M', 'L'],
        0,
        0,
        'The track through Main, Balloon turns a train round (a reversing loop or wye): at the joint of Main and Balloon the rails meet the other way round, so no wiring avoids a short. Make one block of the loop a reversing section with its own polarity switch, longer than the longest train',
      ],
      // Out of the loop's b end into Main's b end: Main needs reverse there. The train bridges the gap 38–40 s.
      [
        'joint-short',
        ['r', 'L', 'M'],
        38,
        40,
        'Goods (07:00 departure) bridges the rail gap from block Balloon into block Main at 07:02 fast with its cab driving forward, but the block entered needs reverse for the right-hand rail to be positive in the direction of travel (NEM 631 2.3): its wheels short the supply across the gap',
      ],
    ]);
  });

  it('a reversing section too short for the train, or left before the train is wholly in (common practice)', () => {
    const short = balloon(true, 800);
    short.runs = [run('r', 't', 'c1', ['M', 'L', 'M'], 0, 20, 2)];
    expect(found(short)).toEqual([
      [
        'reversing-section-short',
        ['r', 'L'],
        18,
        40,
        "Goods (07:00 departure) is never wholly inside the reversing section Balloon (800 mm, shorter than the train's 1000 mm): the section cannot change polarity without the train bridging a rail gap of opposite polarity",
      ],
    ]);
    // 3 m is long enough, but the head re-enters Main at 19 s, before the tail clears it at 20 s.
    const early = balloon(true, 3000);
    early.runs = [run('r', 't', 'c1', ['M', 'L', 'M'], 0, 20, 2)];
    early.runs[0]!.steps[2]!.enterS = 19;
    expect(found(early)).toEqual([
      [
        'reversing-section-short',
        ['r', 'L'],
        18,
        40,
        'Goods (07:00 departure) is never wholly inside the reversing section Balloon (its head reaches Main before its tail clears Main): the section cannot change polarity without the train bridging a rail gap of opposite polarity',
      ],
    ]);
  });

  it('blocks wired the opposite way: the joint, and the short with the outputs each side (NEM 631 2.3)', () => {
    const wired = (a: 'left' | 'right', b: 'left' | 'right') =>
      basePlan({
        blocks: [
          { id: 'A', name: 'Yard road', lengthMm: 2000, positiveRail: a },
          { id: 'B', name: 'Yard lead', lengthMm: 2000, positiveRail: b },
        ],
        links: [{ a: 'A', b: 'B' }],
        runs: [run('r', 't', 'c1', ['A', 'B'], 0, 10, 2)],
      });
    const joint =
      'Block Yard road (b end) and block Yard lead (a end) are wired so that one cab output puts opposite polarity either side of their rail gap: a train crossing it shorts the supply. Swap the feeders of one of them (its positive rail)';
    const short = (cab: string, needs: string) =>
      `Goods (07:00 departure) bridges the rail gap from block Yard road into block Yard lead at 07:00 fast with its cab driving ${cab}, but the block entered needs ${needs} for the right-hand rail to be positive in the direction of travel (NEM 631 2.3): its wheels short the supply across the gap`;
    expect(found(wired('right', 'left'))).toEqual([
      ['joint-wiring', ['A', 'B'], 0, 0, joint],
      ['joint-short', ['r', 'A', 'B'], 8, 10, short('forward', 'reverse')],
    ]);
    expect(found(wired('left', 'right'))).toEqual([
      ['joint-wiring', ['A', 'B'], 0, 0, joint],
      ['joint-short', ['r', 'A', 'B'], 8, 10, short('reverse', 'forward')],
    ]);
  });

  it("two cabs meeting through a train's wheels, a turn outside a reversing place, and ends no link joins", () => {
    const otherCab = basePlan({
      blocks: ['A', 'B', 'C'].map((id) => ({ id, name: id, lengthMm: 2000 })),
      links: [
        { a: 'A', b: 'B' },
        { a: 'B', b: 'C' },
      ],
      runs: [run('r1', 't', 'c1', ['A', 'B'], 0, 10, 2), { ...run('r2', 'u', 'c2', ['C', 'B'], 0, 9, 0), steps: [{ blockId: 'B', enterS: 0, exitS: 9 }] }],
    });
    // Railcar holds B on cab East until 9 s; Goods bridges A–B from 8 s.
    expect(found(otherCab)).toEqual([
      [
        'joint-short',
        ['r1', 'A', 'B'],
        8,
        10,
        'Goods (07:00 departure) bridges the rail gap from block A into block B at 07:00 fast while block B is fed by cab East for Railcar (07:00 departure): two cabs meet across the gap through its wheels',
      ],
    ]);
    const turn = basePlan({
      blocks: ['A', 'B', 'S'].map((id) => ({ id, name: id, lengthMm: 2000 })),
      links: [
        { a: 'A', aEnd: 'b', b: 'B', bEnd: 'a' },
        { a: 'A', aEnd: 'b', b: 'S', bEnd: 'a' },
      ],
      runs: [run('r', 't', 'c1', ['B', 'A', 'S'])],
    });
    expect(found(turn)).toEqual([
      [
        'route-reversal',
        ['r', 'A'],
        8,
        20,
        'Goods (07:00 departure) changes direction in block A, which is not a place where trains may reverse: end the run there and start another, or mark the block a reversing place',
      ],
    ]);
    const ends = basePlan({
      blocks: ['A', 'B'].map((id) => ({ id, name: id, lengthMm: 2000 })),
      links: [{ a: 'A', aEnd: 'b', b: 'B', bEnd: 'a' }],
      runs: [run('r', 't', 'c1', ['A', 'B'])],
    });
    // The run says it leaves A by its a end; the only link joins A's b end to B's a end.
    ends.runs[0]!.steps[0] = { ...ends.runs[0]!.steps[0]!, toEnd: 'a' };
    expect(found(ends)).toEqual([
      ['route-gap', ['r', 'A', 'B'], 8, 10, 'Goods (07:00 departure) leaves block A by its a end into block B by its a end, and no link joins those ends'],
    ]);
  });
});
