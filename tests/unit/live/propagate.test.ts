import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { propagateDelays, suggestRetime, type Plan, type RunActuals } from '@/lib/planning';
import { planArbitrary } from '../planning/plan-arbitrary';
import { oracleClashes, shiftRuns } from '../planning/oracle';

// A hand-made timetable on a 6:1 fast clock. Times are real session seconds; one step per run is
// enough for propagation (it reads departures, arrivals and who runs what).
function plan(runs: { id: string; train: string; cab: string; op: string | null; dep: number; arr: number }[]): Plan {
  return {
    version: 1,
    scale: { name: 'H0', ratio: 87 },
    clock: { ratio: 6, fastStart: '06:00' },
    rules: { headwayS: 0, surgeS: 0, derate: 0.8 },
    supplies: [],
    drivers: [],
    cabs: [],
    blocks: [],
    links: [],
    locomotives: [],
    trains: [],
    operators: [],
    runs: runs.map((r) => ({ id: r.id, trainId: r.train, cabId: r.cab, operatorId: r.op, departS: r.dep, arriveS: r.arr, steps: [{ blockId: 'b1', enterS: r.dep, exitS: r.arr }] })),
  };
}
const byId = (result: ReturnType<typeof propagateDelays>) => new Map(result.runs.map((r) => [r.runId, r]));

describe('delay propagation, worked examples (common practice: a late train makes its next working late, less the slack)', () => {
  const base = plan([
    { id: 'A', train: 'T1', cab: 'C1', op: 'O1', dep: 100, arr: 400 },
    { id: 'B', train: 'T1', cab: 'C2', op: 'O2', dep: 460, arr: 700 },
    { id: 'C', train: 'T2', cab: 'C3', op: 'O3', dep: 300, arr: 350 },
  ]);

  it('with no reports and the clock not started, the prediction is the plan', () => {
    const result = byId(propagateDelays({ plan: base, actuals: new Map(), nowS: null, standS: 60 }));
    for (const run of base.runs) expect(result.get(run.id)).toMatchObject({ departS: run.departS, arriveS: run.arriveS, departDelayS: 0, status: 'waiting' });
  });

  it('a run that leaves 120 s late arrives 120 s late, and the train’s next run waits for it plus the stand time', () => {
    const actuals = new Map<string, RunActuals>([['A', { departS: 220 }]]);
    const result = byId(propagateDelays({ plan: base, actuals, nowS: 220, standS: 60 }));
    // A: 220 + (400 − 100) = 520. B: planned gap 460 − 400 = 60 = stand, so 520 + 60 = 580.
    expect(result.get('A')).toMatchObject({ departS: 220, arriveS: 520, departDelayS: 120, arriveDelayS: 120, status: 'running' });
    expect(result.get('B')).toMatchObject({ departS: 580, arriveS: 820, departDelayS: 120, heldBy: 'A', status: 'waiting' });
    // C shares nothing with A and leaves on time (now is before its departure).
    expect(result.get('C')).toMatchObject({ departS: 300, departDelayS: 0 });
  });

  it('slack beyond the stand time absorbs a delay', () => {
    const roomy = plan([
      { id: 'A', train: 'T1', cab: 'C1', op: 'O1', dep: 100, arr: 400 },
      { id: 'B', train: 'T1', cab: 'C1', op: 'O1', dep: 600, arr: 700 },
    ]);
    const result = byId(propagateDelays({ plan: roomy, actuals: new Map([['A', { departS: 220 }]]), nowS: 220, standS: 60 }));
    // A arrives 520; B may leave from 520 + min(60, 600 − 400) = 580, before its 600: on time.
    expect(result.get('B')).toMatchObject({ departS: 600, departDelayS: 0, heldBy: null });
  });

  it('the same operator on another train and cab also waits', () => {
    const shared = plan([
      { id: 'A', train: 'T1', cab: 'C1', op: 'O1', dep: 100, arr: 400 },
      { id: 'D', train: 'T9', cab: 'C9', op: 'O1', dep: 430, arr: 500 },
    ]);
    const result = byId(propagateDelays({ plan: shared, actuals: new Map([['A', { departS: 250 }]]), nowS: 250, standS: 60 }));
    // A arrives 550; gap min(60, 430 − 400 = 30) = 30; D leaves 580.
    expect(result.get('D')).toMatchObject({ departS: 580, arriveS: 650, heldBy: 'A' });
  });

  it('a run whose time has come but that has not left leaves now at the earliest', () => {
    const result = byId(propagateDelays({ plan: base, actuals: new Map(), nowS: 250, standS: 60 }));
    expect(result.get('A')).toMatchObject({ departS: 250, arriveS: 550, status: 'due' });
  });

  it('a train standing after a stop arrives no earlier than now plus what was left of its trip', () => {
    const actuals = new Map<string, RunActuals>([['A', { departS: 100, stops: [{ fromS: 200, toS: null }] }]]);
    const result = byId(propagateDelays({ plan: base, actuals, nowS: 500, standS: 60 }));
    // 200 s of the trip were left at the stop (400 − 200); now is 500: arrives 700.
    expect(result.get('A')).toMatchObject({ arriveS: 700, status: 'stopped' });
    const moving = byId(
      propagateDelays({ plan: base, actuals: new Map([['A', { departS: 100, stops: [{ fromS: 200, toS: 290 }] }]]), nowS: 300, standS: 60 }),
    );
    // Stood 90 s: arrives 490.
    expect(moving.get('A')).toMatchObject({ arriveS: 490, status: 'running' });
  });

  it('an arrival reported is taken as it is; an early train is held to its timetable', () => {
    const result = byId(propagateDelays({ plan: base, actuals: new Map([['A', { departS: 90, arriveS: 380 }], ['C', { departS: 290 }]]), nowS: 295, standS: 60 }));
    expect(result.get('A')).toMatchObject({ departS: 90, arriveS: 380, status: 'arrived', departDelayS: 0 });
    expect(result.get('C')).toMatchObject({ departS: 290, arriveS: 350 });
  });

  it('the predicted plan moves the steps with the run and stretches the one a train stands in', () => {
    const two = plan([{ id: 'A', train: 'T1', cab: 'C1', op: null, dep: 100, arr: 400 }]);
    two.runs[0]!.steps = [
      { blockId: 'b1', enterS: 100, exitS: 250 },
      { blockId: 'b2', enterS: 240, exitS: 400 },
    ];
    const { predicted } = propagateDelays({ plan: two, actuals: new Map([['A', { departS: 110, stops: [{ fromS: 200, toS: 260 }] }]]), nowS: 300, standS: 0 });
    // Shift 10 s; stood 60 s in b1 (its shifted exit 260 ≥ 200): b1 exits 320, b2 moves 70 s.
    expect(predicted.runs[0]!.steps).toEqual([
      { blockId: 'b1', enterS: 110, exitS: 320 },
      { blockId: 'b2', enterS: 310, exitS: 470 },
    ]);
  });
});

const actualsArbitrary = (p: Plan) =>
  fc.record({
    reports: fc.array(
      fc.record({
        run: fc.integer({ min: 0, max: Math.max(0, p.runs.length - 1) }),
        late: fc.integer({ min: -20, max: 200 }),
        arrived: fc.boolean(),
        stop: fc.option(fc.integer({ min: 0, max: 100 }), { nil: undefined }),
      }),
      { maxLength: 5 },
    ),
    nowS: fc.option(fc.integer({ min: 0, max: 400 }), { nil: null }),
    standS: fc.integer({ min: 0, max: 120 }),
  });

describe('delay propagation, property', () => {
  it('never predicts something unreported earlier than planned, and never leaves a dependency broken', () => {
    fc.assert(
      fc.property(
        planArbitrary({ maxRuns: 8 }).chain((p) => fc.tuple(fc.constant(p), actualsArbitrary(p))),
        ([p, { reports, nowS, standS }]) => {
          const actuals = new Map<string, RunActuals>();
          for (const r of reports) {
            const run = p.runs[r.run];
            if (!run || actuals.has(run.id)) continue;
            const departS = run.departS + r.late;
            const duration = run.arriveS - run.departS;
            actuals.set(run.id, {
              departS,
              ...(r.arrived ? { arriveS: departS + duration + (r.stop ?? 0) } : {}),
              ...(r.stop !== undefined && !r.arrived ? { stops: [{ fromS: departS + duration / 2, toS: null }] } : {}),
            });
          }
          const { runs } = propagateDelays({ plan: p, actuals, nowS, standS });
          const predicted = new Map(runs.map((r) => [r.runId, r]));
          for (const run of p.runs) {
            const got = predicted.get(run.id)!;
            const a = actuals.get(run.id);
            if (a?.departS === undefined) expect(got.departS).toBeGreaterThanOrEqual(run.departS);
            if (a?.arriveS === undefined) expect(got.arriveS).toBeGreaterThanOrEqual(run.arriveS);
            expect(got.arriveS).toBeGreaterThanOrEqual(got.departS);
          }
          // Dependencies, found here independently: for each run, every earlier run (by planned
          // departure) of the same train, cab or operator — the last one of each must be done first.
          const order = [...p.runs].sort((x, y) => x.departS - y.departS || (x.id < y.id ? -1 : 1));
          order.forEach((run, i) => {
            if (actuals.get(run.id)?.departS !== undefined) return;
            for (const same of [(o: Plan['runs'][number]) => o.trainId === run.trainId, (o: Plan['runs'][number]) => o.cabId === run.cabId, (o: Plan['runs'][number]) => run.operatorId !== null && o.operatorId === run.operatorId]) {
              const before = order.slice(0, i).filter(same).at(-1);
              if (!before) continue;
              const gap = Math.min(standS, run.departS - before.arriveS);
              expect(predicted.get(run.id)!.departS).toBeGreaterThanOrEqual(predicted.get(before.id)!.arriveS + gap - 1e-9);
            }
          });
          if (actuals.size === 0 && nowS === null) {
            for (const run of p.runs) expect(predicted.get(run.id)).toMatchObject({ departS: run.departS, arriveS: run.arriveS });
          }
        },
      ),
      { numRuns: 300 },
    );
  });
});

describe('the engine’s retime restricted to the future', () => {
  it('never moves a fixed run, and clears every clash that involves a run it may move', () => {
    fc.assert(
      fc.property(
        planArbitrary({ maxRuns: 8 }).chain((p) => fc.tuple(fc.constant(p), fc.subarray(p.runs.map((r) => r.id)))),
        ([p, fixedIds]) => {
          const fixed = new Set(fixedIds);
          const moves = suggestRetime(p, { fixed });
          for (const m of moves) expect(fixed.has(m.runId)).toBe(false);
          const shifted = shiftRuns(p, moves);
          // A clash the fixed runs make among themselves is history; any other must be gone. A block clash is
          // between a train's whole stay in the block and another's, and a stay can join a fixed run with one
          // the retime may move: so history is what the fixed runs alone still clash on (same kind, same place,
          // same pair of trains, cabs or operators), not only a clash whose two named runs are both fixed.
          // Only what a retime clears (a standing train or a shared locomotive is not moved by a delay).
          const cleared = ['block-overlap', 'cab-double-booked', 'operator-double-booked', 'train-double-booked'];
          const trainOf = new Map(shifted.runs.map((r) => [r.id, r.trainId]));
          const key = (f: { kind: string; ids: string[] }) =>
            [f.kind, f.ids.length > 2 ? f.ids[0] : '', ...f.ids.slice(-2).map((id) => trainOf.get(id) ?? id).sort()].join('|');
          const history = new Set(oracleClashes({ ...shifted, runs: shifted.runs.filter((r) => fixed.has(r.id)) }).map(key));
          const left = oracleClashes(shifted).filter(
            (f) => cleared.includes(f.kind) && !f.ids.slice(-2).every((id) => fixed.has(id)) && !history.has(key(f)),
          );
          expect(left).toEqual([]);
        },
      ),
      { numRuns: 250 },
    );
  });
});

describe('delay propagation, edges', () => {
  // b1 then b2; the tail clears b1 at 250 and the head enters b2 at 240 (a 160 s and a 160 s block).
  const twoBlocks = () => {
    const p = plan([{ id: 'A', train: 'T1', cab: 'C1', op: null, dep: 100, arr: 400 }]);
    p.runs[0]!.steps = [
      { blockId: 'b1', enterS: 100, exitS: 250 },
      { blockId: 'b2', enterS: 240, exitS: 400 },
    ];
    return p;
  };

  it('runs leaving at the same planned time go in run-id order, whatever the order of the list (common practice: a stable tie-break)', () => {
    // A (T1, 100–150) and B (T2, 100–200) share cab C1. By id A goes first; it left at 130, so it
    // arrives 130 + 50 = 180, and B may leave at 180 + min(0, 100 − 150) = 130.
    const rows = [
      { id: 'B', train: 'T2', cab: 'C1', op: null, dep: 100, arr: 200 },
      { id: 'A', train: 'T1', cab: 'C1', op: null, dep: 100, arr: 150 },
    ];
    for (const list of [rows, [...rows].reverse()]) {
      const result = byId(propagateDelays({ plan: plan(list), actuals: new Map([['A', { departS: 130 }]]), nowS: null, standS: 0 }));
      expect(result.get('B')).toMatchObject({ departS: 130, arriveS: 230, heldBy: 'A', departDelayS: 30 });
    }
  });

  it('a predecessor that arrives exactly the stand time before the departure does not hold the run', () => {
    const base = plan([
      { id: 'A', train: 'T1', cab: 'C1', op: 'O1', dep: 100, arr: 400 },
      { id: 'B', train: 'T1', cab: 'C2', op: 'O2', dep: 460, arr: 700 },
    ]);
    // 400 + min(60, 460 − 400) = 460: B leaves on time and nothing holds it.
    const result = byId(propagateDelays({ plan: base, actuals: new Map(), nowS: null, standS: 60 }));
    expect(result.get('B')).toMatchObject({ departS: 460, heldBy: null, status: 'waiting' });
  });

  it('a run is due from the second of its planned departure; held to the second the clock reaches, it is still held', () => {
    const base = plan([
      { id: 'A', train: 'T1', cab: 'C1', op: 'O1', dep: 100, arr: 400 },
      { id: 'B', train: 'T1', cab: 'C2', op: 'O2', dep: 460, arr: 700 },
    ]);
    expect(byId(propagateDelays({ plan: base, actuals: new Map(), nowS: 100, standS: 60 })).get('A')).toMatchObject({ departS: 100, status: 'due' });
    expect(byId(propagateDelays({ plan: base, actuals: new Map(), nowS: 99, standS: 60 })).get('A')).toMatchObject({ departS: 100, status: 'waiting' });
    // A ran 220–520: B may leave at 520 + 60 = 580, and the clock says 580: A still holds it.
    const held = byId(propagateDelays({ plan: base, actuals: new Map([['A', { departS: 220, arriveS: 520 }]]), nowS: 580, standS: 60 }));
    expect(held.get('B')).toMatchObject({ departS: 580, heldBy: 'A', status: 'due' });
    // One second later the clock, not A, sets it.
    const late = byId(propagateDelays({ plan: base, actuals: new Map([['A', { departS: 220, arriveS: 520 }]]), nowS: 581, standS: 60 }));
    expect(late.get('B')).toMatchObject({ departS: 581, heldBy: null });
  });

  it('before the clock starts nothing is overdue, even a run planned before the session’s start (times may be negative)', () => {
    const early = plan([{ id: 'N', train: 'T1', cab: 'C1', op: null, dep: -120, arr: -30 }]);
    expect(byId(propagateDelays({ plan: early, actuals: new Map(), nowS: null, standS: 0 })).get('N')).toEqual({
      runId: 'N',
      plannedDepartS: -120,
      plannedArriveS: -30,
      departS: -120,
      arriveS: -30,
      departDelayS: 0,
      arriveDelayS: 0,
      status: 'waiting',
      heldBy: null,
    });
    // Reported away on time: arrives −120 + 90 = −30, not at a clock that has not started.
    const away = byId(propagateDelays({ plan: early, actuals: new Map([['N', { departS: -120 }]]), nowS: null, standS: 0 }));
    expect(away.get('N')).toMatchObject({ arriveS: -30, status: 'running' });
    // Standing since −100 with no clock: still −30 (what was left, 70 s, counts only from a known now).
    const standing = byId(propagateDelays({ plan: early, actuals: new Map([['N', { departS: -120, stops: [{ fromS: -100, toS: null }] }]]), nowS: null, standS: 0 }));
    expect(standing.get('N')).toMatchObject({ arriveS: -30, status: 'stopped' });
  });

  it('a train still running past its predicted arrival arrives now at the earliest; its last block is held the longer', () => {
    const { runs, predicted } = propagateDelays({ plan: twoBlocks(), actuals: new Map([['A', { departS: 100 }]]), nowS: 450, standS: 0 });
    expect(runs[0]).toMatchObject({ arriveS: 450, arriveDelayS: 50, status: 'running' });
    // No stop reported: the 50 s go to the last step (b2 exits 400 + 50), b1 is as planned.
    expect(predicted.runs[0]!.steps).toEqual([
      { blockId: 'b1', enterS: 100, exitS: 250 },
      { blockId: 'b2', enterS: 240, exitS: 450 },
    ]);
  });

  it('a stop in the second block stretches that block only', () => {
    const { predicted } = propagateDelays({ plan: twoBlocks(), actuals: new Map([['A', { departS: 100, stops: [{ fromS: 300, toS: 330 }] }]]), nowS: 340, standS: 0 });
    // Stood 30 s from 300, after b1's exit (250): arrives 430, b2 exits 430, b1 unchanged.
    expect(predicted.runs[0]).toMatchObject({ departS: 100, arriveS: 430 });
    expect(predicted.runs[0]!.steps).toEqual([
      { blockId: 'b1', enterS: 100, exitS: 250 },
      { blockId: 'b2', enterS: 240, exitS: 430 },
    ]);
  });

  it('a stop at the very second the tail would clear b1 keeps b1 held (common practice: a block is free once the tail has passed its end)', () => {
    const { predicted } = propagateDelays({ plan: twoBlocks(), actuals: new Map([['A', { departS: 100, stops: [{ fromS: 250, toS: 280 }] }]]), nowS: 290, standS: 0 });
    // Stood 30 s: b1 exits 250 + 30 = 280; b2 moves on by 30 (270–430).
    expect(predicted.runs[0]!.steps).toEqual([
      { blockId: 'b1', enterS: 100, exitS: 280 },
      { blockId: 'b2', enterS: 270, exitS: 430 },
    ]);
  });

  it('an early arrival shifts the steps with the departure and stretches nothing', () => {
    const { predicted } = propagateDelays({ plan: twoBlocks(), actuals: new Map([['A', { departS: 90, arriveS: 380 }]]), nowS: 385, standS: 0 });
    // Left 10 s early: every step moves −10 s; it arrived 380, before the shifted 390, so no step grows.
    expect(predicted.runs[0]).toMatchObject({ departS: 90, arriveS: 380 });
    expect(predicted.runs[0]!.steps).toEqual([
      { blockId: 'b1', enterS: 90, exitS: 240 },
      { blockId: 'b2', enterS: 230, exitS: 390 },
    ]);
    // With no reports at all the predicted plan is the plan itself, steps included.
    const p = twoBlocks();
    expect(propagateDelays({ plan: p, actuals: new Map(), nowS: null, standS: 0 }).predicted.runs).toEqual(p.runs);
  });
});
