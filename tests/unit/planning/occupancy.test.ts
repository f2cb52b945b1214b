/**
 * Issue 12, item 1: the whole session's occupancy. Each case of the "Why" that concerns
 * trains standing, one train's runs, shared locomotives, step gaps and the 1 ms tolerance is a test
 * here; the brute-force oracle in check.test.ts covers the general case.
 */
import { describe, expect, it } from 'vitest';
import { checkPlan, suggestRetime, type Plan } from '@/lib/planning';

type RunSpec = { id: string; train: string; cab?: string; operator?: string | null; steps: [string, number, number][]; departS?: number; arriveS?: number };

/** A line A–B–C–D, two cabs, two trains (each its own locomotive unless told), headway 30 s. */
function plan(runs: RunSpec[], over: Partial<Plan> = {}): Plan {
  return {
    version: 1,
    scale: { name: 'H0', ratio: 87 },
    clock: { ratio: 1, fastStart: '06:00' },
    rules: { headwayS: 30, surgeS: 2, derate: 0.8 },
    supplies: [{ id: 's1', name: 'Supply', volts: 12, amps: 5 }],
    drivers: [{ id: 'd1', name: 'Driver', supplyId: 's1', channels: 2, channelAmps: 1, channelPeakAmps: 2, totalAmps: null, dropVolts: 0 }],
    cabs: [
      { id: 'c1', name: 'Cab 1', driverId: 'd1', channel: 1 },
      { id: 'c2', name: 'Cab 2', driverId: 'd1', channel: 2 },
    ],
    blocks: ['A', 'B', 'C', 'D'].map((id) => ({ id, name: id, lengthMm: 2000 })),
    links: [
      { a: 'A', b: 'B' },
      { a: 'B', b: 'C' },
      { a: 'C', b: 'D' },
    ],
    locomotives: [
      { id: 'l1', name: 'Loco 1', runningAmps: 0.1, stallAmps: 0.2, ratedVolts: 12 },
      { id: 'l2', name: 'Loco 2', runningAmps: 0.1, stallAmps: 0.2, ratedVolts: 12 },
    ],
    trains: [
      { id: 'T1', name: 'T1', locomotiveIds: ['l1'], lightingAmps: 0, lengthMm: 500 },
      { id: 'T2', name: 'T2', locomotiveIds: ['l2'], lightingAmps: 0, lengthMm: 500 },
    ],
    operators: [],
    runs: runs.map((r) => ({
      id: r.id,
      trainId: r.train,
      cabId: r.cab ?? (r.train === 'T1' ? 'c1' : 'c2'),
      operatorId: r.operator ?? null,
      departS: r.departS ?? r.steps[0]![1],
      arriveS: r.arriveS ?? r.steps.at(-1)![2],
      steps: r.steps.map(([blockId, enterS, exitS]) => ({ blockId, enterS, exitS })),
    })),
    ...over,
  };
}

const kinds = (p: Plan) => checkPlan(p).findings.map((f) => f.kind);

describe('issue 12 item 1: a train standing between its runs holds its block', () => {
  it('a second train timetabled into the block where the first stands is a block-occupied error', () => {
    // Common practice (block working): one train in a block at a time, standing or moving.
    const p = plan([
      { id: 'r1', train: 'T1', steps: [['A', 0, 20], ['B', 10, 60]] },
      // T1 waits in B from 60 s until it leaves again at 400 s.
      { id: 'r2', train: 'T1', steps: [['B', 400, 420], ['C', 410, 460]] },
      // T2 runs through B at 200 s, while T1 stands there: a collision.
      { id: 'r3', train: 'T2', steps: [['D', 180, 195], ['C', 185, 200], ['B', 195, 230], ['A', 220, 260]] },
    ]);
    const found = checkPlan(p).findings.filter((f) => f.kind === 'block-occupied');
    expect(found.map((f) => f.ids)).toEqual([['B', 'r1', 'r3']]);
    expect(found[0]!.severity).toBe('error');
    // The stand is named by the run it follows, the other side by its train and departure (issue 13 item 8).
    expect(found[0]!.message).toBe(
      'T1 stands in block B from 06:01 to 06:06 fast, after T1 (06:00 departure); T2 (06:03 departure) runs through it at 06:03 fast',
    );
  });

  it('holds the first block from the session start and the last to the session end', () => {
    const p = plan(
      [
        { id: 'r1', train: 'T1', steps: [['A', 300, 320], ['B', 310, 360]] },
        { id: 'r2', train: 'T2', steps: [['D', 0, 20], ['C', 10, 40], ['B', 30, 60], ['A', 50, 90]] },
        { id: 'r3', train: 'T2', steps: [['A', 500, 520], ['B', 510, 560]] },
      ],
      { sessionEndS: 3600 },
    );
    const ids = checkPlan(p).findings.filter((f) => f.kind === 'block-occupied').map((f) => f.ids.join(' '));
    // T1 stands in A from the session's start until 300 s (named by its first run, r1) while T2 arrives there at 50 s.
    expect(ids).toContain('A r1 r2');
    // T1 stands in B from 360 s to the session's end (named by its last run, r1) while T2 comes at 510 s.
    expect(ids).toContain('B r1 r3');
    const before = checkPlan(p).findings.find((f) => f.kind === 'block-occupied' && f.ids.join(' ') === 'A r1 r2')!;
    // Before its first run the stand is named by the run it waits for.
    expect(before.message).toMatch(/^T1 stands in block A from 06:00 to 06:05 fast, before T1 \(06:05 departure\); T2 \(06:00 departure\) runs through it/);
  });

  it('a wait covered by hand is not "T1 and T1 … 0 s apart", and the repair moves nothing', () => {
    // Common practice: headway separates two trains; a train cannot be too close to itself.
    const p = plan([
      { id: 'r1', train: 'T1', steps: [['A', 0, 20], ['B', 10, 60]] },
      // The planner covers the wait in B by a run of its own that only stands.
      { id: 'r2', train: 'T1', steps: [['B', 60, 400]] },
      { id: 'r3', train: 'T1', steps: [['B', 400, 420], ['C', 410, 460]] },
    ]);
    expect(kinds(p)).toEqual([]);
    expect(suggestRetime(p)).toEqual([]);
  });

  it('a turnaround shorter than the stand times plus the headway (210 s by default) is no clash', () => {
    // The builder's defaults: 60 s stand before a departure and 120 s after an arrival (lib/runs/schema.ts),
    // 30 s headway (defaultRules, common practice); integration/runs.test.ts times the same through the API.
    // Arrives in B at 60 s, stands 120 s after arrival; departs again 100 s later, standing 60 s before.
    const p = plan([
      { id: 'r1', train: 'T1', steps: [['A', 0, 20], ['B', 10, 180]], arriveS: 60 },
      { id: 'r2', train: 'T1', steps: [['B', 100, 200], ['A', 190, 240]], departS: 160 },
    ]);
    expect(kinds(p)).toEqual([]);
  });

  it('two runs of one train that really overlap are train-double-booked only, not a block overlap too', () => {
    // Common practice: one clash, one finding; the train being in two places is what is wrong.
    const p = plan([
      { id: 'r1', train: 'T1', steps: [['A', 0, 20], ['B', 10, 60]] },
      { id: 'r2', train: 'T1', steps: [['A', 30, 50], ['B', 40, 90]] },
    ]);
    const errors = checkPlan(p).findings.filter((f) => f.severity === 'error');
    expect(errors.map((f) => [f.kind, ...f.ids]).sort()).toEqual([
      ['cab-double-booked', 'c1', 'r1', 'r2'],
      ['train-double-booked', 'T1', 'r1', 'r2'],
    ]);
  });
});

describe('issue 12 item 1: locomotives, step gaps and the 1 ms tolerance', () => {
  it('a locomotive in two trains that are on the track at once is an error', () => {
    // Common practice: a locomotive is in one consist at a time.
    const p = plan([
      { id: 'r1', train: 'T1', steps: [['A', 0, 20], ['B', 10, 60]] },
      { id: 'r2', train: 'T2', steps: [['D', 1000, 1020], ['C', 1010, 1060]] },
    ]);
    p.trains[1]!.locomotiveIds = ['l1'];
    const found = checkPlan(p).findings.filter((f) => f.kind === 'locomotive-in-two-trains');
    expect(found.map((f) => f.ids)).toEqual([['l1', 'T1', 'T2']]);
    expect(found[0]!.message).toContain('Loco 1');
  });

  it('a time gap between two steps of one run is reported with the run named', () => {
    // Common practice: a moving train's head enters the next block as it leaves the last; 5 s in no block is an error in the steps.
    const p = plan([{ id: 'r1', train: 'T1', steps: [['A', 0, 10], ['B', 15, 60]] }]);
    const found = checkPlan(p).findings.filter((f) => f.kind === 'step-gap');
    expect(found.map((f) => f.ids)).toEqual([['r1', 'A', 'B']]);
    expect(found[0]!.message).toMatch(/^T1 \(06:00 departure\) leaves block A 5 s before it enters block B/);
  });

  it('a floating-point "overlap" of 5.5e-17 s is no clash', () => {
    // IEEE 754 binary64 (what JavaScript numbers are): 0.1 + 0.2 rounds to 0.30000000000000004.
    const end = 0.1 + 0.2; // 0.30000000000000004
    expect(end - 0.3).toBeCloseTo(5.55e-17, 18);
    const p = plan(
      [
        { id: 'r1', train: 'T1', cab: 'c1', steps: [['A', 0, 0.1], ['B', 0.05, end]] },
        { id: 'r2', train: 'T2', cab: 'c1', steps: [['B', 0.3, 0.5], ['C', 0.4, 0.6]] },
      ],
      { rules: { headwayS: 0, surgeS: 0, derate: 0.8 } },
    );
    expect(kinds(p).filter((k) => k !== 'block-occupied')).toEqual([]);
  });

  it('a gap just short of the 30 s headway is printed to the millisecond (29.998 s), never as the headway; within 1 ms it is no clash', () => {
    const p = plan([
      { id: 'r1', train: 'T1', steps: [['A', 0, 20], ['B', 10, 60], ['C', 50, 100], ['D', 90, 140]] },
      // T2 waits on a branch E off C, and enters C 29.9985 s after T1 has cleared it.
      { id: 'r2', train: 'T2', steps: [['E', 100, 135], ['C', 129.9985, 160]] },
    ]);
    p.blocks.push({ id: 'E', name: 'E', lengthMm: 2000 });
    p.links.push({ a: 'C', b: 'E' });
    expect(checkPlan(p).findings.map((f) => f.kind)).toEqual(['block-overlap']);
    const clash = checkPlan(p).findings.find((f) => f.kind === 'block-overlap' && f.ids[0] === 'C')!;
    expect(clash.message).toContain('only 29.998 s apart');
    expect(clash.message).not.toContain(' 30 s apart');
    expect(clash.message).toContain('the headway is 30 s');
    // 29.9995 s falls short of the headway by less than the 1 ms tolerance: no clash.
    p.runs[1]!.steps[1]!.enterS = 129.9995;
    expect(checkPlan(p).findings).toEqual([]);
    // The issue's own 29.999 s ("30 s apart; headway 30 s" before) is 1 ms short, within the tolerance: no clash either.
    p.runs[1]!.steps[1]!.enterS = 129.999;
    expect(checkPlan(p).findings).toEqual([]);
    // 29.99 s is a clash, and says so (rounded down to the millisecond, never up to the headway).
    p.runs[1]!.steps[1]!.enterS = 129.99;
    const near = checkPlan(p).findings.find((f) => f.kind === 'block-overlap' && f.ids[0] === 'C')!;
    expect(near.message).toContain('only 29.99 s apart');
    expect(near.message).not.toContain(' 30 s apart');
  });
});
