import { describe, expect, it } from 'vitest';
import { niceTicks } from '@/lib/charts/nice-ticks';

describe('niceTicks', () => {
  it('spaces ticks evenly by 1, 2, 2.5 or 5 times a power of ten and covers the maximum (common practice)', () => {
    // The case from the load chart: a 2.3 A peak once gave 0.6, 1.2, 1.8, 2.3.
    expect(niceTicks(2.3)).toEqual([0, 1, 2, 3]);
    expect(niceTicks(1.2)).toEqual([0, 0.5, 1, 1.5]);
    expect(niceTicks(0.3)).toEqual([0, 0.1, 0.2, 0.3]);
    expect(niceTicks(7.9)).toEqual([0, 2, 4, 6, 8]);
    expect(niceTicks(0)).toEqual([0, 1]);
    // A maximum of exactly `count` nice steps takes that step, not the next one up (common practice:
    // the axis ends at the maximum rather than past it).
    expect(niceTicks(8)).toEqual([0, 2, 4, 6, 8]);
    expect(niceTicks(100, 5)).toEqual([0, 20, 40, 60, 80, 100]);
    for (const max of [0.07, 0.45, 1.15, 2.3, 3.9, 12.6, 47]) {
      const ticks = niceTicks(max);
      const steps = ticks.slice(1).map((t, i) => Math.round((t - ticks[i]!) * 1e9) / 1e9);
      expect(new Set(steps).size).toBe(1);
      expect(ticks.at(-1)!).toBeGreaterThanOrEqual(max);
      expect(ticks.length).toBeLessThanOrEqual(6);
      const mantissa = steps[0]! / 10 ** Math.floor(Math.log10(steps[0]!));
      expect([1, 2, 2.5, 5]).toContain(Math.round(mantissa * 100) / 100);
    }
  });
});
