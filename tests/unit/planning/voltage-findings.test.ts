/**
 * The voltage findings in full (ids, times, wording) on one worked example: a 1 A-class quad half-H
 * bridge (TI SLRS007B: drop 1.6 V + 1.0 Ω × I typical, 2.6 V + 1.0 Ω × I worst case) on a bench supply.
 */
import { describe, expect, it } from 'vitest';
import { checkPlan, DRIVER_PRESETS, driverFromPreset, planSchema, toPlanJson, type Plan } from '@/lib/planning';

const QUAD = DRIVER_PRESETS.find((p) => p.id === 'bipolar-quad-half-h-1a')!;
const VOLTAGE_KINDS = ['track-voltage-high', 'track-voltage-low', 'speed-not-reachable'];

const standing = (id: string, trainId: string, cabId: string, from: number, to: number): Plan['runs'][number] => ({
  id,
  trainId,
  cabId,
  operatorId: null,
  departS: from,
  arriveS: to,
  steps: [{ blockId: 'A', enterS: from, exitS: to }],
});

/** Pick-up (a 0.4 A tank engine) stands twice on Cab 1; Freight (a 1 A diesel, 80 km/h top) runs A–B–C on cab West in 5 s. */
function plan(scale: Plan['scale'], supplyVolts: number): Plan {
  const built: Plan = {
    version: 1,
    scale,
    clock: { ratio: 6, fastStart: '06:00' },
    rules: { headwayS: 0, surgeS: 0, derate: 0.8 },
    supplies: [{ id: 's1', name: 'Bench supply', volts: supplyVolts, amps: 10 }],
    drivers: [driverFromPreset(QUAD, { id: 'd1', supplyId: 's1', name: 'Board' })],
    cabs: [
      { id: 'c1', name: 'Cab 1', driverId: 'd1', channel: 1 },
      { id: 'c2', name: 'West', driverId: 'd1', channel: 2 },
    ],
    blocks: [
      { id: 'A', name: 'A', lengthMm: 2000 },
      { id: 'B', name: 'B', lengthMm: 2000 },
      { id: 'C', name: 'C', lengthMm: 2000 },
    ],
    links: [
      { a: 'A', b: 'B' },
      { a: 'B', b: 'C' },
    ],
    locomotives: [
      { id: 'l1', name: 'Small tank', runningAmps: 0.4, stallAmps: 0.8, ratedVolts: 12 },
      { id: 'l2', name: 'Heavy diesel', runningAmps: 1, stallAmps: 1, ratedVolts: 12, startVolts: 2, topSpeedKmh: 80 },
    ],
    trains: [
      { id: 't1', name: 'Pick-up', locomotiveIds: ['l1'], lightingAmps: 0, lengthMm: 1000 },
      { id: 't2', name: 'Freight', locomotiveIds: ['l2'], lightingAmps: 0, lengthMm: 1000 },
    ],
    operators: [],
    runs: [
      standing('r1', 't1', 'c1', 0, 60),
      standing('r2', 't1', 'c1', 100, 160),
      {
        id: 'r3',
        trainId: 't2',
        cabId: 'c2',
        operatorId: null,
        departS: 0,
        arriveS: 5,
        steps: [
          { blockId: 'A', enterS: 0, exitS: 1 },
          { blockId: 'B', enterS: 1, exitS: 3 },
          { blockId: 'C', enterS: 3, exitS: 5 },
        ],
      },
    ],
  };
  expect(planSchema.safeParse(toPlanJson(built)).success).toBe(true);
  return built;
}

const found = (p: Plan) =>
  checkPlan(p)
    .findings.filter((f) => VOLTAGE_KINDS.includes(f.kind))
    .map((f) => [f.kind, f.ids, f.fromS, f.toS, f.message]);

describe('voltage findings, worked example', () => {
  it('H0 (16.5 mm) on 15 V: over-drive at the least drop, under-voltage at the greatest, a run too fast for its loco', () => {
    expect(found(plan({ name: 'H0', ratio: 87 }, 15))).toEqual([
      // 15 − (1.6 + 0.4) = 13 V > 12 V rated; safe duty ⌊12 / 13 × 100⌋ = 92 % (NEM 630 Table 2: PWM by average voltage).
      [
        'track-voltage-high',
        ['c1', 'l1'],
        0,
        160,
        "Cab 1 puts up to 13 V on the rails at full throttle (the bridge's least drop at 0.4 A), above the 12 V rating of Small tank (2 runs); keep its duty at or below 92 % (NEM 630 Table 2 judges PWM by its average voltage)",
      ],
      // 15 − (1.6 + 1.0) = 12.4 V > 12 V; ⌊12 / 12.4 × 100⌋ = 96 %.
      [
        'track-voltage-high',
        ['c2', 'l2'],
        0,
        5,
        "Cab West puts up to 12.4 V on the rails at full throttle (the bridge's least drop at 1 A), above the 12 V rating of Heavy diesel (1 run); keep its duty at or below 96 % (NEM 630 Table 2 judges PWM by its average voltage)",
      ],
      // 15 − (2.6 + 1.0) = 11.4 V < 12 V (NEM 630 Table 1 for 16.5 mm; NMRA S-9 I.A). Cab 1 gets
      // 15 − (2.6 + 0.4) = 12 V exactly: not below.
      [
        'track-voltage-low',
        ['c2'],
        0,
        5,
        'Cab West gives at most 11.4 V at the rails with its heaviest train (1 A: supply 15 V less up to 3.6 V bridge drop), below the 12 V nominal of NEM 630 Table 1 for 16.5 mm gauge; NMRA S-9 I.A asks for at least 12 V at full throttle at maximum anticipated load; trains may not reach their top speed',
      ],
      // 4 m (B and C) in 5 s = 0.8 m/s model, × 87 × 3.6 = 250.56 km/h scale, above the 80 km/h top speed.
      [
        'speed-not-reachable',
        ['r3', 'l2'],
        0,
        5,
        "Freight (06:00 departure) is planned at 250.6 km/h, more than Heavy diesel can give on its cab: 250.56 km/h is above the locomotive's top speed of 80 km/h at 12 V",
      ],
    ]);
  });

  it('Z (6.5 mm) on 9 V: judged against 8 V (NEM 630 Table 1), without the NMRA 12 V clause', () => {
    // 9 − 3.6 = 5.4 V < 8 V; Cab 1: 9 − 3.0 = 6 V < 8 V. Neither over-drives a 12 V loco.
    expect(found(plan({ name: 'Z', ratio: 220 }, 9)).filter((f) => f[0] === 'track-voltage-low')).toEqual([
      [
        'track-voltage-low',
        ['c1'],
        0,
        160,
        'Cab 1 gives at most 6 V at the rails with its heaviest train (0.4 A: supply 9 V less up to 3 V bridge drop), below the 8 V nominal of NEM 630 Table 1 for 6.5 mm gauge; trains may not reach their top speed',
      ],
      [
        'track-voltage-low',
        ['c2'],
        0,
        5,
        'Cab West gives at most 5.4 V at the rails with its heaviest train (1 A: supply 9 V less up to 3.6 V bridge drop), below the 8 V nominal of NEM 630 Table 1 for 6.5 mm gauge; trains may not reach their top speed',
      ],
    ]);
  });

  it('a scale outside the table has no nominal to judge by: no under-voltage finding', () => {
    expect(found(plan({ name: 'My own', ratio: 50 }, 9)).filter((f) => f[0] === 'track-voltage-low')).toEqual([]);
  });
});
