import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { defaultRamps, modelRateMmPerS2, modelSpeedMmPerS, Movement, planSchema, timeRun, toPlanJson, type Plan } from '@/lib/planning';

const blocks = [
  { id: 'A', lengthMm: 2000 },
  { id: 'B', lengthMm: 2000 },
  { id: 'C', lengthMm: 1000 },
  { id: 'D', lengthMm: 3000 },
];

describe('timeRun at constant speed (no ramps given)', () => {
  it('times a run at 100 km/h in H0 (319.3 mm/s, derived) block by block, stopping with the head at the far end', () => {
    const v = modelSpeedMmPerS(100, 87); // derived: 100 000 m / 3600 s / 87 = 319.3 mm/s
    const timed = timeRun({ blocks, scaleRatio: 87, trainLengthMm: 500, route: ['A', 'B', 'C'], departS: 100, speedKmh: 100, standBeforeS: 60, standAfterS: 30 });
    const tail = 500 / v; // 1.566 s for the 500 mm train to pass a point
    // A 2 m block at 319.3 mm/s takes 6.26 s (DOMAIN.md, derived: 2000 / 319.3).
    expect(2000 / v).toBeCloseTo(6.26, 2);
    expect(timed.departS).toBe(100);
    // The train stands with its head at A's far end: its tail clears A after 500 mm.
    expect(timed.steps[0]).toEqual({ blockId: 'A', enterS: 40, exitS: 100 + tail });
    expect(timed.steps[1]!.enterS).toBe(100);
    expect(timed.steps[1]!.exitS).toBeCloseTo(100 + 6.26 + tail, 2);
    expect(timed.steps[2]!.enterS).toBeCloseTo(106.26, 2);
    // It stops with its head at C's far end: 2000 + 1000 mm from the start, 3000 / 319.3 = 9.40 s.
    expect(timed.arriveS).toBeCloseTo(109.4, 2);
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
    expect(timed.arriveS).toBeCloseTo(60 + 40, 9); // head at D's far end: 6000 mm in 60 s; dwells for A and D are ignored
    expect(d!.exitS).toBe(timed.arriveS);
  });

  it('a train longer than its last block holds the block behind until its stand ends', () => {
    // 2500 mm train stopping with its head at C's far end (1000 mm block): its tail is 1500 mm back, in B.
    const timed = timeRun({ blocks, scaleRatio: 100, trainLengthMm: 2500, route: ['B', 'C'], departS: 0, speedKmh: 36, standAfterS: 50 });
    expect(timed.arriveS).toBeCloseTo(10, 9);
    expect(timed.steps[0]!.exitS).toBeCloseTo(60, 9);
    expect(timed.steps[1]!.exitS).toBeCloseTo(60, 9);
  });

  it('refuses a route of one block, unknown blocks and rates that are not positive', () => {
    expect(() => timeRun({ blocks, scaleRatio: 87, trainLengthMm: 500, route: ['A'], departS: 0, speedKmh: 60 })).toThrow(RangeError);
    expect(() => timeRun({ blocks, scaleRatio: 87, trainLengthMm: 500, route: ['A', 'X'], departS: 0, speedKmh: 60 })).toThrow(/unknown block "X"/);
    expect(() => timeRun({ blocks, scaleRatio: 87, trainLengthMm: 500, route: ['A', 'B'], departS: 0, speedKmh: 0 })).toThrow(/speedKmh/);
    expect(() => timeRun({ blocks, scaleRatio: 87, trainLengthMm: 500, route: ['A', 'B'], departS: 0, speedKmh: 60, accelKmhPerS: 0 })).toThrow(/accelKmhPerS/);
    expect(() => timeRun({ blocks, scaleRatio: 87, trainLengthMm: 500, route: ['A', 'B'], departS: 0, speedKmh: 60, brakingKmhPerS: Number.NaN })).toThrow(/brakingKmhPerS/);
  });
});

describe('the cases of issue 12 (each failed on the engine that stopped a train a train-length into its last block)', () => {
  it('a run that continues from where the last one stopped: the 2 m block is crossed in full (6.26 s + 0.94 s), not 0.94 s + 0.94 s', () => {
    const v = modelSpeedMmPerS(100, 87); // 319.3 mm/s (derived, DOMAIN.md)
    const first = timeRun({ blocks, scaleRatio: 87, trainLengthMm: 300, route: ['A', 'B'], departS: 0, speedKmh: 100 });
    const next = timeRun({ blocks, scaleRatio: 87, trainLengthMm: 300, route: ['B', 'C'], departS: first.arriveS + 60, speedKmh: 100 });
    // The first run brings the head through all 2000 mm of B: 6.26 s (the old engine stopped it
    // 300 mm in, after 0.94 s, and the next run then started it from B's far end).
    expect(first.arriveS - first.steps[1]!.enterS).toBeCloseTo(6.26, 2);
    // The next run starts there: the 300 mm train's tail clears B after 300 / 319.3 = 0.94 s.
    expect(next.steps[0]!.exitS - next.departS).toBeCloseTo(0.94, 2);
    // Over both runs the head travels B's length plus the train's (2300 mm: 7.20 s) while in B.
    const moving = first.arriveS - first.steps[1]!.enterS + (next.steps[0]!.exitS - next.departS);
    expect(moving).toBeCloseTo(2300 / v, 6);
    expect(moving).toBeCloseTo(7.2, 2);
  });

  it('accelerates from a stand, cruises and brakes to a stop: the 2 m block at 100 km/h in H0 takes 12.10 s with common-practice ramps', () => {
    // Elementary kinematics with the H0 defaults (common practice): 15 km/h per second up, 20 down.
    const ramps = defaultRamps(87);
    expect(ramps).toMatchObject({ accelKmhPerS: 15, brakingKmhPerS: 20 });
    const v = modelSpeedMmPerS(100, 87); // 319.28 mm/s
    const a = modelRateMmPerS2(15, 87); // 15 / 3.6 × 1000 / 87 = 47.89 mm/s²
    const b = modelRateMmPerS2(20, 87); // 20 / 3.6 × 1000 / 87 = 63.86 mm/s²
    expect(a).toBeCloseTo(47.89, 2);
    expect(b).toBeCloseTo(63.86, 2);
    // Up to speed: t = v / a = 100 / 15 = 6.667 s over v² / 2a = 1064.3 mm.
    // Braking:     t = v / b = 100 / 20 = 5 s over v² / 2b = 798.2 mm.
    // Cruise: (2000 − 1064.3 − 798.2) / 319.28 = 0.431 s. In all 6.667 + 0.431 + 5 = 12.097 s.
    expect((v * v) / (2 * a)).toBeCloseTo(1064.28, 1);
    expect((v * v) / (2 * b)).toBeCloseTo(798.21, 1);
    const timed = timeRun({ blocks, scaleRatio: 87, trainLengthMm: 300, route: ['A', 'B'], departS: 0, speedKmh: 100, ...ramps });
    expect(timed.arriveS).toBeCloseTo(12.097, 3);
    expect(timed.arriveS).toBeGreaterThan(6.26); // at constant speed: 6.26 s
    // The 300 mm train's tail clears A while still accelerating: 300 = a t² / 2, t = √(600 / 47.89) = 3.54 s
    // (at constant speed 0.94 s).
    expect(timed.steps[0]!.exitS).toBeCloseTo(Math.sqrt(600 / a), 9);
    expect(timed.steps[0]!.exitS).toBeCloseTo(3.54, 2);
  });

  it('a block too short to reach the cruise: a triangle, peak 73.3 km/h over 1 m (elementary kinematics)', () => {
    // v_peak² = 2 d / (1/a + 1/b) = 2000 / (1/47.89 + 1/63.86) = 54 735 mm²/s², v_peak = 233.95 mm/s
    // = 233.95 × 87 × 3.6 / 1000 = 73.27 km/h; time = v_peak / a + v_peak / b = 4.885 + 3.664 = 8.549 s.
    const timed = timeRun({ blocks, scaleRatio: 87, trainLengthMm: 300, route: ['B', 'C'], departS: 0, speedKmh: 100, accelKmhPerS: 15, brakingKmhPerS: 20 });
    expect(timed.arriveS).toBeCloseTo(8.549, 3);
  });

  it('a dwell brakes and accelerates too: it costs v/2a + v/2b more than the stand itself', () => {
    const ramps = { accelKmhPerS: 15, brakingKmhPerS: 20 };
    const base = { blocks, scaleRatio: 87, trainLengthMm: 300, route: ['A', 'B', 'D'], departS: 0, speedKmh: 60, ...ramps };
    const through = timeRun(base);
    const stopping = timeRun({ ...base, dwellS: { B: 30 } });
    const v = modelSpeedMmPerS(60, 87); // 191.6 mm/s; ramps 638.6 mm up and 479.0 mm down fit B and D
    const lost = v / (2 * modelRateMmPerS2(15, 87)) + v / (2 * modelRateMmPerS2(20, 87)); // 60/30 + 60/40 = 3.5 s
    expect(lost).toBeCloseTo(3.5, 9);
    expect(stopping.arriveS - through.arriveS).toBeCloseTo(30 + 3.5, 9);
    // The stop is with the head at B's far end: the train enters D after the dwell.
    const bTime = new Movement(2000, v, modelRateMmPerS2(15, 87), modelRateMmPerS2(20, 87)).duration;
    expect(stopping.steps[2]!.enterS).toBeCloseTo(bTime + 30, 9);
  });

  it('a train reversing out of the block it stopped in runs the block’s length less its own before its tail clears', () => {
    // Constant speed, 100 mm/s: a 500 mm train in the 2000 mm block A reverses; its new head stands
    // 1500 mm short of the end it leaves by, so the tail clears A after 1500 + 500 mm = 20 s.
    const timed = timeRun({ blocks, scaleRatio: 100, trainLengthMm: 500, route: ['A', 'B'], departS: 0, speedKmh: 36, startBackMm: 1500 });
    expect(timed.steps[0]!.exitS).toBeCloseTo(20, 9);
    expect(timed.steps[1]!.enterS).toBeCloseTo(15, 9);
    expect(timed.arriveS).toBeCloseTo(35, 9);
  });
});

describe('Movement against a step-by-step simulation (brute-force oracle)', () => {
  it('the closed form agrees with integrating the motion in 0.5 ms steps', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 100, max: 3000 }),
        fc.integer({ min: 20, max: 150 }),
        fc.integer({ min: 5, max: 40 }),
        fc.integer({ min: 5, max: 40 }),
        (distance, kmh, accelKmhPerS, brakingKmhPerS) => {
          const v = modelSpeedMmPerS(kmh, 87);
          const a = modelRateMmPerS2(accelKmhPerS, 87);
          const b = modelRateMmPerS2(brakingKmhPerS, 87);
          const movement = new Movement(distance, v, a, b);
          // Simulate: brake once the rest to go is within the braking distance, else speed up to the cruise.
          const dt = 0.0005;
          let x = 0;
          let speed = 0;
          let t = 0;
          const marks = [distance / 4, distance / 2, (3 * distance) / 4];
          const seen: number[] = [];
          while (x < distance - 1e-6 && t < 1000) {
            if ((speed * speed) / (2 * b) >= distance - x) {
              if (speed <= b * dt) break; // at a stand (within one step's braking)
              speed -= b * dt;
            } else speed = Math.min(v, speed + a * dt);
            x += speed * dt;
            t += dt;
            while (seen.length < marks.length && x >= marks[seen.length]!) seen.push(t);
          }
          marks.forEach((mark, i) => expect(Math.abs(movement.timeAt(mark) - seen[i]!)).toBeLessThan(0.02));
          // The last millimetres of a stop are sensitive to the steps (τ = √(2r/b)): a looser bound.
          expect(Math.abs(movement.duration - t)).toBeLessThan(0.4);
        },
      ),
      { numRuns: 40 },
    );
  });
});

describe('timeRun properties', () => {
  const plainPlan = (scaleRatio: number, trackBlocks: { id: string; name: string; lengthMm: number }[], trainLengthMm: number, timed: ReturnType<typeof timeRun>): Plan => ({
    version: 1,
    scale: { name: 'H0', ratio: scaleRatio },
    clock: { ratio: 1, fastStart: '00:00' },
    rules: { headwayS: 0, surgeS: 0, derate: 1 },
    supplies: [{ id: 's', name: '', volts: 12, amps: 1 }],
    drivers: [{ id: 'd', name: '', supplyId: 's', channels: 1, channelAmps: 1, channelPeakAmps: 1, totalAmps: null, dropVolts: 0 }],
    cabs: [{ id: 'c', name: '', driverId: 'd', channel: 1 }],
    blocks: trackBlocks,
    links: [],
    locomotives: [{ id: 'l', name: '', runningAmps: 0, stallAmps: 0, ratedVolts: 12 }],
    trains: [{ id: 't', name: '', locomotiveIds: ['l'], lightingAmps: 0, lengthMm: trainLengthMm }],
    operators: [],
    runs: [{ id: 'r', trainId: 't', cabId: 'c', operatorId: null, ...timed }],
  });

  it('always gives steps the plan schema accepts, and takes v/2a + v/2b longer than at constant speed when the ramps fit', () => {
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
        fc.option(fc.record({ accelKmhPerS: fc.integer({ min: 1, max: 60 }), brakingKmhPerS: fc.integer({ min: 1, max: 60 }) }), { nil: undefined }),
        (blockLengths, speedKmh, scaleRatio, trainLengthMm, departS, standBeforeS, standAfterS, dwells, ramps) => {
          const route = blockLengths.map((_, i) => `b${i}`);
          const trackBlocks = blockLengths.map((lengthMm, i) => ({ id: `b${i}`, name: '', lengthMm }));
          const dwellS = Object.fromEntries(dwells.map((s, i) => [`b${i}`, s]));
          const timed = timeRun({ blocks: trackBlocks, scaleRatio, trainLengthMm, route, departS, speedKmh, standBeforeS, standAfterS, dwellS, ...ramps });
          expect(timed.steps.map((s) => s.blockId)).toEqual(route);
          expect(planSchema.safeParse(toPlanJson(plainPlan(scaleRatio, trackBlocks, trainLengthMm, timed))).success).toBe(true);
          // Without dwells the head runs every block after the first.
          if (dwells.every((s) => s === 0)) {
            const run = blockLengths.slice(1).reduce((sum, l) => sum + l, 0);
            const v = modelSpeedMmPerS(speedKmh, scaleRatio);
            const constant = run / v;
            const took = timed.arriveS - timed.departS;
            if (ramps === undefined) {
              expect(took).toBeCloseTo(constant, 6);
            } else {
              const a = modelRateMmPerS2(ramps.accelKmhPerS, scaleRatio);
              const b = modelRateMmPerS2(ramps.brakingKmhPerS, scaleRatio);
              const extra = v / (2 * a) + v / (2 * b);
              expect(took).toBeGreaterThanOrEqual(constant - 1e-9);
              expect(took).toBeLessThanOrEqual(constant + extra + 1e-6);
              if ((v * v) / (2 * a) + (v * v) / (2 * b) <= run) expect(took).toBeCloseTo(constant + extra, 6);
            }
          }
        },
      ),
      { numRuns: 300 },
    );
  });

  it('a run with a dwell is the same as stopping there and going on with the next run (the next run starts where the last stopped)', () => {
    fc.assert(
      fc.property(
        fc.array(fc.integer({ min: 600, max: 5000 }), { minLength: 3, maxLength: 7 }),
        fc.integer({ min: 10, max: 150 }),
        fc.integer({ min: 50, max: 600 }),
        fc.integer({ min: 1, max: 90 }),
        fc.integer({ min: 1, max: 40 }),
        fc.integer({ min: 1, max: 40 }),
        fc.nat(),
        (blockLengths, speedKmh, trainLengthMm, dwell, accelKmhPerS, brakingKmhPerS, pick) => {
          const route = blockLengths.map((_, i) => `b${i}`);
          const trackBlocks = blockLengths.map((lengthMm, i) => ({ id: `b${i}`, lengthMm }));
          const k = 1 + (pick % (route.length - 2)); // an intermediate block
          const common = { blocks: trackBlocks, scaleRatio: 87, trainLengthMm, speedKmh, accelKmhPerS, brakingKmhPerS };
          const whole = timeRun({ ...common, route, departS: 0, dwellS: { [route[k]!]: dwell } });
          const first = timeRun({ ...common, route: route.slice(0, k + 1), departS: 0, standAfterS: dwell });
          const second = timeRun({ ...common, route: route.slice(k), departS: first.arriveS + dwell });
          expect(second.arriveS).toBeCloseTo(whole.arriveS, 6);
          // The block stopped in is held from the head entering it (first run) until the tail clears it (second run).
          expect(first.steps[k]!.enterS).toBeCloseTo(whole.steps[k]!.enterS, 6);
          expect(second.steps[0]!.exitS).toBeCloseTo(whole.steps[k]!.exitS, 6);
          second.steps.slice(1).forEach((step, i) => {
            expect(step.enterS).toBeCloseTo(whole.steps[k + 1 + i]!.enterS, 6);
            expect(step.exitS).toBeCloseTo(whole.steps[k + 1 + i]!.exitS, 6);
          });
          for (let i = 0; i < k; i++) expect(first.steps[i]!.exitS).toBeCloseTo(whole.steps[i]!.exitS, 6);
        },
      ),
      { numRuns: 200 },
    );
  });
});
