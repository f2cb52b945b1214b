/**
 * timeRun at its edges: the exact refusals, a dwell of 0, and a tail that clears a block at the very
 * point the train stops. 36 km/h at 1:100 is 36 / 3.6 × 1000 / 100 = 100 mm/s model (uniform speed,
 * s = v·t), so a 1000 mm block takes 10 s.
 */
import { describe, expect, it } from 'vitest';
import { defaultRamps, timeRun, type TimeRunInput } from '@/lib/planning';

const blocks = ['P', 'Q', 'R', 'S'].map((id) => ({ id, lengthMm: 1000 }));
const base: TimeRunInput = { blocks, scaleRatio: 100, trainLengthMm: 1000, route: ['P', 'Q', 'R'], departS: 0, speedKmh: 36 };

function refusal(input: Partial<TimeRunInput>): string {
  try {
    timeRun({ ...base, ...input });
  } catch (error) {
    expect(error).toBeInstanceOf(RangeError);
    return (error as Error).message;
  }
  throw new Error('timeRun accepted the input');
}

describe('timeRun refusals name the figure and the rule (common practice: say which input is wrong and why)', () => {
  it('names the route, the block and each figure that is out of range', () => {
    expect(refusal({ route: ['P'] })).toBe('timeRun needs a route of at least two blocks');
    expect(refusal({ route: ['P', 'X'] })).toBe('timeRun: unknown block "X" in the route');
    expect(refusal({ blocks: [...blocks, { id: 'Z', lengthMm: 0 }], route: ['P', 'Z'] })).toBe('timeRun: length of block "Z" must be greater than 0');
    expect(refusal({ speedKmh: 0 })).toBe('timeRun: speedKmh must be greater than 0');
    expect(refusal({ scaleRatio: -87 })).toBe('timeRun: scaleRatio must be greater than 0');
    expect(refusal({ trainLengthMm: 0 })).toBe('timeRun: trainLengthMm must be greater than 0');
    expect(refusal({ trainLengthMm: Number.POSITIVE_INFINITY })).toBe('timeRun: trainLengthMm must be greater than 0');
    expect(refusal({ departS: Number.NaN })).toBe('timeRun: departS must be a finite number');
    expect(refusal({ departS: Number.NEGATIVE_INFINITY })).toBe('timeRun: departS must be a finite number');
    expect(refusal({ dwellS: { Q: -1 } })).toBe('timeRun: dwellS["Q"] must be 0 or more');
  });

  it('stand and start-back figures may be 0 but not negative, nor NaN or infinite', () => {
    for (const name of ['standBeforeS', 'standAfterS', 'startBackMm'] as const) {
      expect(refusal({ [name]: -0.5 })).toBe(`timeRun: ${name} must be 0 or more`);
      expect(refusal({ [name]: Number.NaN })).toBe(`timeRun: ${name} must be 0 or more`);
      expect(refusal({ [name]: Number.POSITIVE_INFINITY })).toBe(`timeRun: ${name} must be 0 or more`);
      expect(() => timeRun({ ...base, [name]: 0 })).not.toThrow();
    }
    // A negative departure is a time before the session's start, which is allowed.
    expect(timeRun({ ...base, departS: -30 }).arriveS).toBeCloseTo(-10, 9);
  });
});

describe('timeRun: stops at the edges', () => {
  it('a dwell of 0 is no stop, even with ramps (it would otherwise brake to a stand and start again)', () => {
    const { accelKmhPerS, brakingKmhPerS } = defaultRamps(100); // common practice for 1:70 to 1:149: 15 and 20 km/h per s
    const ramps = { accelKmhPerS, brakingKmhPerS };
    const without = timeRun({ ...base, route: ['P', 'Q', 'R', 'S'], ...ramps });
    const zero = timeRun({ ...base, route: ['P', 'Q', 'R', 'S'], dwellS: { Q: 0, R: 0 }, ...ramps });
    expect(zero).toEqual(without);
    // And a real one costs its braking and acceleration: more than the 1 s dwell itself.
    const one = timeRun({ ...base, route: ['P', 'Q', 'R', 'S'], dwellS: { Q: 1 }, ...ramps });
    expect(one.arriveS - without.arriveS).toBeGreaterThan(1);
  });

  it('a tail that reaches a block’s end exactly where the train stops clears it as the train comes to rest, not after the dwell', () => {
    // P–Q–R–S, 1000 mm train, 30 s dwell with the head at R's far end (2000 mm from the start).
    // The head runs 0 → 2000 mm in 20 s, stands 20–50 s, runs 2000 → 3000 mm in 50–60 s.
    // Q's far end is 1000 mm in: the tail reaches it when the head is at 2000 mm, at 20 s.
    const timed = timeRun({ ...base, route: ['P', 'Q', 'R', 'S'], dwellS: { R: 30 } });
    expect(timed.arriveS).toBeCloseTo(60, 9);
    expect(timed.steps).toEqual([
      { blockId: 'P', enterS: 0, exitS: expect.closeTo(10, 9) },
      { blockId: 'Q', enterS: 0, exitS: expect.closeTo(20, 9) },
      { blockId: 'R', enterS: expect.closeTo(10, 9), exitS: expect.closeTo(60, 9) },
      // The head enters S when it moves on, after the dwell.
      { blockId: 'S', enterS: expect.closeTo(50, 9), exitS: expect.closeTo(60, 9) },
    ]);
  });

  it('a tail that reaches the block behind’s end as the train arrives frees it then, before the stand after', () => {
    // P–Q–R, 1000 mm train: the head stops at R's far end (2000 mm) at 20 s, the tail exactly at Q's far
    // end; Q is free at 20 s, R is held for the 5 s stand after, to 25 s.
    const timed = timeRun({ ...base, standAfterS: 5 });
    expect(timed.steps.map((s) => s.exitS)).toEqual([expect.closeTo(10, 9), expect.closeTo(20, 9), expect.closeTo(25, 9)]);
    // 1 mm longer and the tail is still in Q when it stops: Q is held with R.
    const longer = timeRun({ ...base, standAfterS: 5, trainLengthMm: 1001 });
    expect(longer.steps[1]!.exitS).toBeCloseTo(25, 9);
  });
});
