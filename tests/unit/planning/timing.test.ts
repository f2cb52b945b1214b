import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { modelSpeedMmPerS, planSchema, timeRun, type Plan } from '@/lib/planning';

const blocks = [
  { id: 'A', lengthMm: 2000 },
  { id: 'B', lengthMm: 2000 },
  { id: 'C', lengthMm: 1000 },
  { id: 'D', lengthMm: 3000 },
];

describe('timeRun', () => {
  it('times a run at 100 km/h in H0 (319.3 mm/s, derived) block by block', () => {
    const v = modelSpeedMmPerS(100, 87); // derived: 100 000 m / 3600 s / 87 = 319.3 mm/s
    const timed = timeRun({ blocks, scaleRatio: 87, trainLengthMm: 500, route: ['A', 'B', 'C'], departS: 100, speedKmh: 100, standBeforeS: 60, standAfterS: 30 });
    const tail = 500 / v;
    // A 2 m block at 319.3 mm/s takes 6.26 s (derived: 2000 / 319.3).
    expect(2000 / v).toBeCloseTo(6.26, 2);
    expect(timed.departS).toBe(100);
    expect(timed.steps[0]).toEqual({ blockId: 'A', enterS: 40, exitS: 100 + tail });
    expect(timed.steps[1]!.enterS).toBe(100);
    expect(timed.steps[1]!.exitS).toBeCloseTo(100 + 6.26 + tail, 2);
    expect(timed.steps[2]!.enterS).toBeCloseTo(106.26, 2);
    expect(timed.arriveS).toBeCloseTo(106.26 + tail, 2);
    expect(timed.steps[2]!.exitS).toBeCloseTo(timed.arriveS + 30, 9);
  });

  it('holds every block the train still covers for a dwell', () => {
    const v = modelSpeedMmPerS(36, 100); // 100 mm/s: easy arithmetic
    expect(v).toBeCloseTo(100, 12);
    // Train 2500 mm: stopping with its head at the end of B (2 m in), its tail is still in A.
    const timed = timeRun({ blocks, scaleRatio: 100, trainLengthMm: 2500, route: ['A', 'B', 'C', 'D'], departS: 0, speedKmh: 36, dwellS: { B: 40, A: 999, D: 999 } });
    const [a, b, c, d] = timed.steps;
    expect(b!.enterS).toBe(0);
    expect(c!.enterS).toBeCloseTo(20 + 40, 9); // head crosses B in 20 s, then dwells 40 s
    expect(a!.exitS).toBeCloseTo(25 + 40, 9); // tail clears A after 2500 mm: 25 s of running plus the dwell
    expect(b!.exitS).toBeCloseTo(45 + 40, 9);
    expect(c!.exitS).toBeCloseTo(55 + 40, 9);
    expect(d!.enterS).toBeCloseTo(30 + 40, 9);
    expect(timed.arriveS).toBeCloseTo(55 + 40, 9); // tail clears C; dwells for A and D are ignored
    expect(d!.exitS).toBe(timed.arriveS);
  });

  it('refuses a route of one block and unknown blocks', () => {
    expect(() => timeRun({ blocks, scaleRatio: 87, trainLengthMm: 500, route: ['A'], departS: 0, speedKmh: 60 })).toThrow(RangeError);
    expect(() => timeRun({ blocks, scaleRatio: 87, trainLengthMm: 500, route: ['A', 'X'], departS: 0, speedKmh: 60 })).toThrow(/unknown block "X"/);
    expect(() => timeRun({ blocks, scaleRatio: 87, trainLengthMm: 500, route: ['A', 'B'], departS: 0, speedKmh: 0 })).toThrow(/speedKmh/);
  });

  it('always gives steps the plan schema accepts', () => {
    const lengths = fc.array(fc.integer({ min: 100, max: 5000 }), { minLength: 2, maxLength: 8 });
    fc.assert(
      fc.property(
        lengths,
        fc.integer({ min: 1, max: 300 }),
        fc.constantFrom(22.5, 87, 160),
        fc.integer({ min: 50, max: 4000 }),
        fc.integer({ min: 0, max: 5000 }),
        fc.integer({ min: 0, max: 120 }),
        fc.integer({ min: 0, max: 120 }),
        fc.array(fc.integer({ min: 0, max: 90 }), { maxLength: 8 }),
        (blockLengths, speedKmh, scaleRatio, trainLengthMm, departS, standBeforeS, standAfterS, dwells) => {
          const route = blockLengths.map((_, i) => `b${i}`);
          const trackBlocks = blockLengths.map((lengthMm, i) => ({ id: `b${i}`, name: '', lengthMm }));
          const dwellS = Object.fromEntries(dwells.map((s, i) => [`b${i}`, s]));
          const timed = timeRun({ blocks: trackBlocks, scaleRatio, trainLengthMm, route, departS, speedKmh, standBeforeS, standAfterS, dwellS });
          expect(timed.steps.map((s) => s.blockId)).toEqual(route);
          const plan: Plan = {
            version: 1,
            scale: { name: 'H0', ratio: scaleRatio },
            clock: { ratio: 1, fastStart: '00:00' },
            rules: { headwayS: 0, surgeS: 0, derate: 1 },
            supplies: [{ id: 's', name: '', volts: 12, amps: 1 }],
            drivers: [{ id: 'd', name: '', supplyId: 's', channels: 1, channelAmps: 1, channelPeakAmps: 1, totalAmps: null, dropVolts: 0 }],
            cabs: [{ id: 'c', name: '', driverId: 'd', channel: 1 }],
            blocks: trackBlocks,
            links: [],
            locos: [{ id: 'l', name: '', runningAmps: 0, stallAmps: 0, ratedVolts: 12 }],
            trains: [{ id: 't', name: '', locoIds: ['l'], lightingAmps: 0, lengthMm: trainLengthMm }],
            operators: [],
            runs: [{ id: 'r', trainId: 't', cabId: 'c', operatorId: null, ...timed }],
          };
          expect(planSchema.safeParse(plan).success).toBe(true);
          // Without dwells the movement lasts (route after the first block + train) / speed.
          if (dwells.every((s) => s === 0)) {
            const run = blockLengths.slice(1, -1).reduce((sum, l) => sum + l, 0) + trainLengthMm;
            expect(timed.arriveS - timed.departS).toBeCloseTo(run / modelSpeedMmPerS(speedKmh, scaleRatio), 6);
          }
        },
      ),
      { numRuns: 300 },
    );
  });
});
