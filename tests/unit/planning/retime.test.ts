import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { applyRetime, checkPlan, suggestRetime, type Plan } from '@/lib/planning';
import { planArbitrary } from './plan-arbitrary';
import { oracleBaselineTotal, oracleClashes, shiftRuns } from './oracle';

const CLEARED = ['block-overlap', 'cab-double-booked', 'operator-double-booked', 'train-double-booked'];

function trainOrderKept(before: Plan, after: Plan): boolean {
  const order = [...before.runs].sort((a, b) => a.departS - b.departS || (a.id < b.id ? -1 : 1));
  const shifted = new Map(after.runs.map((run) => [run.id, run]));
  const lastArrival = new Map<string, number>();
  for (const run of order) {
    const moved = shifted.get(run.id)!;
    const free = lastArrival.get(run.trainId);
    if (free !== undefined && moved.departS < free) return false;
    lastArrival.set(run.trainId, Math.max(free ?? -Infinity, moved.arriveS));
  }
  return true;
}

describe('suggestRetime promises', () => {
  for (const timeScale of [1, 0.1]) {
    for (const strategy of ['best', 'baseline'] as const) {
      it(`clears every clash, keeps train order and stays within the baseline (times × ${timeScale}, ${strategy})`, () => {
        fc.assert(
          fc.property(planArbitrary({ timeScale, maxRuns: 8 }), (plan) => {
            const delays = suggestRetime(plan, { strategy });
            const ids = delays.map((d) => d.runId);
            expect(new Set(ids).size).toBe(ids.length);
            for (const d of delays) expect(d.delayS).toBeGreaterThan(0);

            const shifted = shiftRuns(plan, delays);
            // Promise 1: no clash left, by the brute-force checker and by checkPlan.
            expect(oracleClashes(shifted).filter((f) => CLEARED.includes(f.kind))).toEqual([]);
            expect(checkPlan(shifted).findings.filter((f) => CLEARED.includes(f.kind))).toEqual([]);
            // Promise 2: each train's runs keep their order.
            expect(trainOrderKept(plan, shifted)).toBe(true);
            // Promise 3: no more delay in total than the baseline.
            const total = delays.reduce((sum, d) => sum + d.delayS, 0);
            expect(total).toBeLessThanOrEqual(oracleBaselineTotal(plan) + 1e-6);
            if (strategy === 'baseline') expect(total).toBeCloseTo(oracleBaselineTotal(plan), 6);
          }),
          { numRuns: 250 },
        );
      });
    }
  }

  it('moves nothing in a plan without clashes', () => {
    fc.assert(
      fc.property(planArbitrary(), (plan) => {
        const clean = shiftRuns(plan, suggestRetime(plan));
        expect(suggestRetime(clean)).toEqual([]);
      }),
      { numRuns: 100 },
    );
  });
});

describe('suggestRetime examples', () => {
  const plan: Plan = {
    version: 1,
    scale: { name: 'H0', ratio: 87 },
    clock: { ratio: 6, fastStart: '06:00' },
    rules: { headwayS: 30, surgeS: 2, derate: 0.8 },
    supplies: [{ id: 's1', name: 'Supply', volts: 12, amps: 5 }],
    drivers: [{ id: 'd1', name: 'Driver', supplyId: 's1', channels: 2, channelAmps: 1, channelPeakAmps: 2, totalAmps: null, dropVolts: 0 }],
    cabs: [
      { id: 'c1', name: 'Cab 1', driverId: 'd1', channel: 1 },
      { id: 'c2', name: 'Cab 2', driverId: 'd1', channel: 2 },
    ],
    blocks: [
      { id: 'A', name: 'A', lengthMm: 2000 },
      { id: 'B', name: 'B', lengthMm: 2000 },
    ],
    links: [{ a: 'A', b: 'B' }],
    locomotives: [{ id: 'l1', name: 'Loco', runningAmps: 0.3, stallAmps: 0.9, ratedVolts: 12 }],
    trains: [
      { id: 'long', name: 'Long', locomotiveIds: ['l1'], lightingAmps: 0, lengthMm: 1000 },
      { id: 'short', name: 'Short', locomotiveIds: ['l1'], lightingAmps: 0, lengthMm: 1000 },
    ],
    operators: [],
    runs: [
      // A long run holding block A from 0 to 300, and a short one wanting A from 10 to 20.
      { id: 'r1', trainId: 'long', cabId: 'c1', operatorId: null, departS: 0, arriveS: 300, steps: [{ blockId: 'A', enterS: 0, exitS: 300 }] },
      { id: 'r2', trainId: 'short', cabId: 'c2', operatorId: null, departS: 10, arriveS: 20, steps: [{ blockId: 'A', enterS: 10, exitS: 20 }] },
    ],
  };

  it('the baseline makes the short run wait for the long one plus headway', () => {
    // r2 may enter A once r1 has left it 30 s before: 300 + 30 − 10 = 320 s.
    expect(suggestRetime(plan, { strategy: 'baseline' })).toEqual([{ runId: 'r2', delayS: 320 }]);
  });

  it('the default lets the short run go first when that costs less in total', () => {
    // r2 first; r1 then waits until 20 + 30 = 50 s.
    const best = suggestRetime(plan);
    expect(best).toEqual([{ runId: 'r1', delayS: 50 }]);
    expect(checkPlan(applyRetime(plan, best)).findings.filter((f) => f.kind === 'block-overlap')).toEqual([]);
  });
});
