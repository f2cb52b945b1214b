/**
 * suggestRetime and applyRetime on small hand-made plans, one rule each; times are real seconds.
 */
import { describe, expect, it } from 'vitest';
import { applyRetime, planSchema, suggestRetime, toPlanJson, type Plan } from '@/lib/planning';

type RunRow = { id: string; train: string; cab: string; block: string; dep: number; arr: number; op?: string };

/** Each run stands in one block for its whole time; trains, cabs and blocks are made as named. */
function plan(rows: RunRow[]): Plan {
  const unique = (values: string[]) => [...new Set(values)];
  const built: Plan = {
    version: 1,
    scale: { name: 'H0', ratio: 87 },
    clock: { ratio: 6, fastStart: '06:00' },
    rules: { headwayS: 0, surgeS: 0, derate: 0.8 },
    supplies: [{ id: 's1', name: 'Supply', volts: 12, amps: 5 }],
    drivers: [{ id: 'd1', name: 'Driver', supplyId: 's1', channels: 4, channelAmps: 1, channelPeakAmps: 2, totalAmps: null, dropVolts: 0 }],
    cabs: unique(rows.map((r) => r.cab)).map((id, i) => ({ id, name: id, driverId: 'd1', channel: i + 1 })),
    blocks: unique(rows.map((r) => r.block)).map((id) => ({ id, name: id, lengthMm: 2000 })),
    links: [],
    locomotives: unique(rows.map((r) => r.train)).map((t) => ({ id: `l-${t}`, name: `Loco ${t}`, runningAmps: 0.3, stallAmps: 0.9, ratedVolts: 12 })),
    trains: unique(rows.map((r) => r.train)).map((id) => ({ id, name: id, locomotiveIds: [`l-${id}`], lightingAmps: 0, lengthMm: 1000 })),
    operators: unique(rows.flatMap((r) => (r.op ? [r.op] : []))).map((id) => ({ id, name: id })),
    runs: rows.map((r) => ({ id: r.id, trainId: r.train, cabId: r.cab, operatorId: r.op ?? null, departS: r.dep, arriveS: r.arr, steps: [{ blockId: r.block, enterS: r.dep, exitS: r.arr }] })),
  };
  expect(planSchema.safeParse(toPlanJson(built)).error?.issues ?? []).toEqual([]);
  return built;
}

describe('suggestRetime, one rule at a time', () => {
  it('of two orders that cost the same total delay, the departure order is kept (common practice: first come, first served)', () => {
    // One cab for A (0–100) and B (30–70). In departure order B waits for A: 100 − 30 = 70 s.
    // In arrival order B (70) goes first and A waits for it: 70 − 0 = 70 s. A tie: B is the one moved.
    const p = plan([
      { id: 'A', train: 'T1', cab: 'C1', block: 'X', dep: 0, arr: 100 },
      { id: 'B', train: 'T2', cab: 'C1', block: 'Y', dep: 30, arr: 70 },
    ]);
    expect(suggestRetime(p, { strategy: 'baseline' })).toEqual([{ runId: 'B', delayS: 70 }]);
    expect(suggestRetime(p)).toEqual([{ runId: 'B', delayS: 70 }]);
  });

  it('never moves a fixed run, even one its own train’s earlier fixed run overlaps', () => {
    // T1's A (0–100) and B (50–150) overlap: history the retime cannot change, so it moves neither.
    const p = plan([
      { id: 'A', train: 'T1', cab: 'C1', block: 'X', dep: 0, arr: 100 },
      { id: 'B', train: 'T1', cab: 'C2', block: 'Y', dep: 50, arr: 150 },
    ]);
    expect(suggestRetime(p, { fixed: new Set(['A', 'B']) })).toEqual([]);
    // Not fixed, B waits for A's arrival: 100 − 50 = 50 s.
    expect(suggestRetime(p)).toEqual([{ runId: 'B', delayS: 50 }]);
  });

  it('a train is busy until its latest arrival so far, not its last placed one', () => {
    // Fixed X (0–200) and Y (50–150) of T1; Z (160–250) of T1 may move: it waits for X, 200 − 160 = 40 s.
    const p = plan([
      { id: 'X', train: 'T1', cab: 'C1', block: 'X', dep: 0, arr: 200 },
      { id: 'Y', train: 'T1', cab: 'C2', block: 'Y', dep: 50, arr: 150 },
      { id: 'Z', train: 'T1', cab: 'C3', block: 'Z', dep: 160, arr: 250 },
    ]);
    expect(suggestRetime(p, { fixed: new Set(['X', 'Y']) })).toEqual([{ runId: 'Z', delayS: 40 }]);
  });
});

describe('suggestRetime, a move that clears one clash may make another', () => {
  it('after the operator moves a run back onto its cab’s next booking, the cab is checked again', () => {
    // Fixed: cab C1 taken 0–100 and 150–250, operator O1 taken 100–160 (on cab C2). R (C1, O1, 0–50):
    // the cab pushes it to 100, the operator to 160, where 160–210 meets the cab's 150–250: on to 250.
    const p = plan([
      { id: 'K1', train: 'T1', cab: 'C1', block: 'X', dep: 0, arr: 100 },
      { id: 'K2', train: 'T2', cab: 'C1', block: 'Y', dep: 150, arr: 250 },
      { id: 'M', train: 'T3', cab: 'C2', block: 'Z', dep: 100, arr: 160, op: 'O1' },
      { id: 'R', train: 'T4', cab: 'C1', block: 'W', dep: 0, arr: 50, op: 'O1' },
    ]);
    expect(suggestRetime(p, { fixed: new Set(['K1', 'K2', 'M']) })).toEqual([{ runId: 'R', delayS: 250 }]);
  });
});

describe('applyRetime', () => {
  it('adds each delay to the run’s departure, arrival and steps, and leaves the rest as they were', () => {
    const p = plan([
      { id: 'A', train: 'T1', cab: 'C1', block: 'X', dep: 0, arr: 100 },
      { id: 'B', train: 'T2', cab: 'C2', block: 'Y', dep: 30, arr: 70 },
    ]);
    p.runs[1]!.steps = [
      { blockId: 'Y', enterS: 20, exitS: 50 },
      { blockId: 'X', enterS: 45, exitS: 80 },
    ];
    const moved = applyRetime(p, [
      { runId: 'B', delayS: 30 },
      { runId: 'nowhere', delayS: 5 },
    ]);
    expect(moved.runs[0]).toBe(p.runs[0]);
    // 30 + 30 = 60, 70 + 30 = 100; steps 50–80 and 75–110.
    expect(moved.runs[1]).toEqual({
      ...p.runs[1],
      departS: 60,
      arriveS: 100,
      steps: [
        { blockId: 'Y', enterS: 50, exitS: 80 },
        { blockId: 'X', enterS: 75, exitS: 110 },
      ],
    });
    expect(p.runs[1]!.departS).toBe(30);
  });
});
