import { describe, expect, it } from 'vitest';
import {
  checkPlan,
  DRIVER_PRESETS,
  driverFromPreset,
  dutyFor,
  planSchema,
  toPlanJson,
  plannedSpeedKmh,
  startAmps,
  timeRun,
  trainAmps,
  type Finding,
  type Plan,
} from '@/lib/planning';

// Worked examples for the electrics: each "Why" case of the engine's second edition, with the
// datasheet or standard each figure comes from beside the check.

const preset = (id: string) => DRIVER_PRESETS.find((p) => p.id === id)!;
const QUAD = preset('bipolar-quad-half-h-1a'); // TI SLRS007B
const MODULE = preset('bipolar-dual-full-bridge-2a'); // ST dual full-bridge, Multiwatt15
const SINGLE = preset('mosfet-single-high-current-3-6a'); // TI DRV8871 SLVSCY9B

type Locomotive = Plan['locomotives'][number];

/** One supply, one driver from a preset, two cabs, three 2 m blocks in a row; H0 (1:87). */
function plan(options: {
  driver: (typeof DRIVER_PRESETS)[number];
  volts: number;
  locomotives: Locomotive[];
  trains?: Plan['trains'];
  runs: Plan['runs'];
  surgeS?: number;
}): Plan {
  const built: Plan = {
    version: 1,
    scale: { name: 'H0', ratio: 87 },
    clock: { ratio: 6, fastStart: '06:00' },
    rules: { headwayS: 0, surgeS: options.surgeS ?? 2, derate: 0.8 },
    supplies: [{ id: 's1', name: 'Bench supply', volts: options.volts, amps: 10 }],
    drivers: [driverFromPreset(options.driver, { id: 'd1', supplyId: 's1', name: 'Board' })],
    cabs: Array.from({ length: options.driver.channels }, (_, i) => ({ id: `c${i + 1}`, name: `Cab ${i + 1}`, driverId: 'd1', channel: i + 1 })),
    blocks: [
      { id: 'A', name: 'A', lengthMm: 2000 },
      { id: 'B', name: 'B', lengthMm: 2000 },
      { id: 'C', name: 'C', lengthMm: 2000 },
    ],
    links: [
      { a: 'A', b: 'B' },
      { a: 'B', b: 'C' },
    ],
    locomotives: options.locomotives,
    trains: options.trains ?? options.locomotives.map((l, i) => ({ id: `t${i + 1}`, name: `Train ${i + 1}`, locomotiveIds: [l.id], lightingAmps: 0, lengthMm: 1000 })),
    operators: [],
    runs: options.runs,
  };
  expect(planSchema.safeParse(toPlanJson(built)).success).toBe(true);
  return built;
}

/** A run standing in one block from `from` to `to` (departure to arrival), on cab `cab`. */
const standing = (id: string, trainId: string, cabId: string, from: number, to: number, blockId = 'A'): Plan['runs'][number] => ({
  id,
  trainId,
  cabId,
  operatorId: null,
  departS: from,
  arriveS: to,
  steps: [{ blockId, enterS: from, exitS: to }],
});

const of = (findings: Finding[], kind: Finding['kind']) => findings.filter((f) => f.kind === kind);

describe('bridge drop against current', () => {
  it('DRV8871 SLVSCY9B: a 0.45 A H0 train at 12 V sees 12 − 0.45 × 0.565 = 11.75 V, not 9.97 V', () => {
    const locomotive: Locomotive = { id: 'l1', name: 'H0 loco', runningAmps: 0.45, stallAmps: 0.9, ratedVolts: 12 };
    const found = checkPlan(plan({ driver: SINGLE, volts: 12, locomotives: [locomotive], runs: [standing('r1', 't1', 'c1', 0, 60)] })).findings;
    const low = of(found, 'track-voltage-low');
    // 11.75 V is still below NMRA S-9 I.A's 12 V "at maximum anticipated load", so the warning stays,
    // with the true figure (12 − 0.45 × 0.565 = 11.746 V).
    expect(low).toHaveLength(1);
    expect(low[0]!.message).toContain('11.75 V');
    expect(low[0]!.message).not.toContain('9.97');
  });

  it('ST dual full-bridge: at light load the least drop (1.8 V at 1 A, scaled) lets the rails over-drive a 12 V loco', () => {
    // 15 V supply, 0.3 A train: least drop 0.84 + 0.96 × 0.3 = 1.128 V, so 13.87 V > 12 V rated.
    // The old fixed 4.9 V (the worst case at 2 A) gave 10.1 V and hid it.
    const locomotive: Locomotive = { id: 'l1', name: 'Light loco', runningAmps: 0.3, stallAmps: 0.8, ratedVolts: 12 };
    const found = checkPlan(plan({ driver: MODULE, volts: 15, locomotives: [locomotive], runs: [standing('r1', 't1', 'c1', 0, 60)] })).findings;
    const high = of(found, 'track-voltage-high');
    expect(high).toMatchObject([{ ids: ['c1', 'l1'], severity: 'warning' }]);
    expect(high[0]!.message).toContain('13.87 V');
    // Safe duty = 12 / 13.872 = 86.5 %, floored (NEM 630 Table 2: PWM judged by average voltage).
    expect(high[0]!.message).toContain('86 %');
  });

  it('NMRA S-9 I.A: under-voltage is judged at the heaviest train with the greatest drop', () => {
    // Quad half-H (SLRS007B) on 15 V: greatest drop at 1 A is 3.6 V, so 11.4 V < 12 V; a 0.2 A train
    // alone gets 15 − (2.6 + 0.2) = 12.2 V, enough.
    const light: Locomotive = { id: 'l1', name: 'Light', runningAmps: 0.2, stallAmps: 0.4, ratedVolts: 12, startVolts: 2 };
    const heavy: Locomotive = { id: 'l2', name: 'Heavy', runningAmps: 1, stallAmps: 1, ratedVolts: 12, startVolts: 2 };
    const lightOnly = checkPlan(plan({ driver: QUAD, volts: 15, locomotives: [light], runs: [standing('r1', 't1', 'c1', 0, 60)] })).findings;
    expect(of(lightOnly, 'track-voltage-low')).toEqual([]);
    const both = checkPlan(
      plan({ driver: QUAD, volts: 15, locomotives: [light, heavy], runs: [standing('r1', 't1', 'c1', 0, 60), standing('r2', 't2', 'c1', 100, 160)] }),
    ).findings;
    const low = of(both, 'track-voltage-low');
    expect(low).toMatchObject([{ ids: ['c1'], fromS: 0, toS: 160 }]);
    expect(low[0]!.message).toContain('11.4 V');
  });
});

describe('peak ratings hold for their pulse width only', () => {
  const surging: Locomotive = { id: 'l1', name: 'Old motor', runningAmps: 0.5, stallAmps: 1.9, ratedVolts: 12 };

  it('SLRS007B: 1.9 A for 2 s on the 1 A class fails (the 2 A peak holds for 5 ms)', () => {
    const found = checkPlan(plan({ driver: QUAD, volts: 15, locomotives: [surging], runs: [standing('r1', 't1', 'c1', 0, 60)] })).findings;
    const peak = of(found, 'channel-peak-overload');
    expect(peak).toMatchObject([{ ids: ['c1'], fromS: 0, toS: 2, peakAmps: 1.9, limitAmps: 1 }]);
    expect(peak[0]!.message).toContain('continuous');
  });

  it('SLRS007B: a surge within 5 ms is judged against the 2 A peak', () => {
    const found = checkPlan(plan({ driver: QUAD, volts: 15, locomotives: [surging], surgeS: 0.005, runs: [standing('r1', 't1', 'c1', 0, 60)] })).findings;
    expect(of(found, 'channel-peak-overload')).toEqual([]);
  });

  it('ST dual full-bridge: the 2.5 A repetitive peak holds for 10 ms; a 2 s surge of 2.4 A is judged against 2 A', () => {
    const big: Locomotive = { id: 'l1', name: 'Large-scale loco', runningAmps: 1.5, stallAmps: 2.4, ratedVolts: 18 };
    const long = checkPlan(plan({ driver: MODULE, volts: 19, locomotives: [big], runs: [standing('r1', 't1', 'c1', 0, 60)] })).findings;
    expect(of(long, 'channel-peak-overload')).toMatchObject([{ peakAmps: 2.4, limitAmps: 2 }]);
    const short = checkPlan(plan({ driver: MODULE, volts: 19, locomotives: [big], surgeS: 0.01, runs: [standing('r1', 't1', 'c1', 0, 60)] })).findings;
    expect(of(short, 'channel-peak-overload')).toEqual([]);
  });

  it('DRV8871: no pulse width for its 3.6 A, so a surge is judged against the derived 1.9 A', () => {
    const locomotive: Locomotive = { id: 'l1', name: 'Big', runningAmps: 1, stallAmps: 3, ratedVolts: 12 };
    const found = checkPlan(plan({ driver: SINGLE, volts: 15, locomotives: [locomotive], surgeS: 0.001, runs: [standing('r1', 't1', 'c1', 0, 60)] })).findings;
    expect(of(found, 'channel-peak-overload')).toMatchObject([{ peakAmps: 3, limitAmps: 1.9 }]);
  });

  it('DRV8871 SLVSCY9B: 2.5 A running is over the 1.9 A continuous derived from its thermal figures, though under the 3.6 A limit', () => {
    // The preset's source line: (150 − 25) °C / ≈ 40 °C/W ≈ 3.1 W; √(3.1 W / (1.5 × 0.565 Ω)) ≈ 1.9 A.
    // The engine before issue 12 took the 3.6 A current limit as the continuous rating and found nothing.
    const locomotive: Locomotive = { id: 'l1', name: 'Garden loco', runningAmps: 2.5, stallAmps: 2.5, ratedVolts: 12 };
    const found = checkPlan(plan({ driver: SINGLE, volts: 15, locomotives: [locomotive], surgeS: 0, runs: [standing('r1', 't1', 'c1', 0, 60)] })).findings;
    expect(of(found, 'channel-overload')).toMatchObject([{ ids: ['c1'], fromS: 0, toS: 60, peakAmps: 2.5, limitAmps: 1.9 }]);
    expect(SINGLE.channelPeakAmps).toBe(3.6);
  });
});

describe('start current under a PWM ramp', () => {
  it('a stalled motor is a resistance: stall current at rated volts × start volts / rated volts', () => {
    // 3 A stall at 12 V; the ramp reaches the 6 V start voltage before the motor turns: 3 × 6 / 12 = 1.5 A.
    expect(startAmps({ runningAmps: 0.5, stallAmps: 3, ratedVolts: 12, startVolts: 6 })).toBeCloseTo(1.5, 12);
    // Never less than the running current it goes on to draw.
    expect(startAmps({ runningAmps: 0.5, stallAmps: 1.9, ratedVolts: 12, startVolts: 2.4 })).toBe(0.5);
    // No start voltage measured: the full stall current (nothing says how gently it starts).
    expect(startAmps({ runningAmps: 0.5, stallAmps: 1.9, ratedVolts: 12 })).toBe(1.9);
  });

  it('a train draws its lighting plus each loco: currents of loads in parallel add (Kirchhoff’s current law)', () => {
    const locomotives = [
      { runningAmps: 0.5, stallAmps: 3, ratedVolts: 12, startVolts: 6 },
      { runningAmps: 0.25, stallAmps: 1.9, ratedVolts: 12 },
    ];
    // Running: 0.125 + 0.5 + 0.25; at start: 0.125 + 3 × 6 / 12 + 1.9 (binary fractions, so exact sums).
    expect(trainAmps(0.125, locomotives)).toEqual({ runningAmps: 0.875, startAmps: 0.125 + 1.5 + 1.9 });
    expect(trainAmps(0.125, [])).toEqual({ runningAmps: 0.125, startAmps: 0.125 });
  });

  it('SLRS007B: the same 1.9 A motor started by a ramp with a 2.4 V start voltage passes the 1 A class', () => {
    const ramped: Locomotive = { id: 'l1', name: 'Old motor', runningAmps: 0.5, stallAmps: 1.9, ratedVolts: 12, startVolts: 2.4 };
    const found = checkPlan(plan({ driver: QUAD, volts: 15, locomotives: [ramped], runs: [standing('r1', 't1', 'c1', 0, 60)] })).findings;
    expect(of(found, 'channel-peak-overload')).toEqual([]);
    const hard: Locomotive = { ...ramped, stallAmps: 3, startVolts: 6 };
    const over = checkPlan(plan({ driver: QUAD, volts: 15, locomotives: [hard], runs: [standing('r1', 't1', 'c1', 0, 60)] })).findings;
    expect(of(over, 'channel-peak-overload')).toMatchObject([{ peakAmps: 1.5, limitAmps: 1 }]);
  });
});

describe('driver heat', () => {
  const locomotive: Locomotive = { id: 'l1', name: 'H0 loco', runningAmps: 0.5, stallAmps: 0.9, ratedVolts: 12, startVolts: 2 };
  const two = (runs: Plan['runs']) =>
    plan({
      driver: QUAD,
      volts: 15,
      locomotives: [locomotive],
      trains: [
        { id: 't1', name: 'One', locomotiveIds: ['l1'], lightingAmps: 0, lengthMm: 1000 },
        { id: 't2', name: 'Two', locomotiveIds: ['l1'], lightingAmps: 0, lengthMm: 1000 },
      ],
      runs,
    });

  it('SLRS007B: two 0.5 A trains on the 1 A quad class dissipate about 2.1 W, above 2075 mW', () => {
    // Per channel (1.6 + 1.0 × 0.5) V × 0.5 A = 1.05 W typical; two channels 2.1 W > 2.075 W.
    // Greatest drop (2.6 + 1.0 × 0.5) V × 0.5 A × 2 = 3.1 W.
    const { findings, load } = checkPlan(two([standing('r1', 't1', 'c1', 0, 60), standing('r2', 't2', 'c2', 10, 50, 'C')]));
    const heat = of(findings, 'driver-heat');
    expect(heat).toMatchObject([{ ids: ['d1'], severity: 'warning', fromS: 10, toS: 50, limitWatts: 2.075 }]);
    expect(heat[0]!.peakWatts).toBeCloseTo(3.1, 12);
    expect(heat[0]!.message).toContain('2.1 W');
    expect(heat[0]!.message).toContain('even at the least drop');
    const series = load.drivers[0]!.heat!;
    expect(series.limitWatts).toBe(2.075);
    expect(series.maxLowWatts).toBeCloseTo(2.1, 12);
    expect(series.maxHighWatts).toBeCloseTo(3.1, 12);
  });

  it('SLRS007B: one 0.5 A train (1.05 W typical, 1.55 W at the greatest drop) stays inside 2075 mW', () => {
    const { findings } = checkPlan(two([standing('r1', 't1', 'c1', 0, 60)]));
    expect(of(findings, 'driver-heat')).toEqual([]);
  });
});

describe('load maxima at coincident events', () => {
  it('a train arriving as the next one departs on the same cab: peak 1.0 A and running 0.5 A, not 1.5 A and 1 A', () => {
    // Common practice figures: 0.5 A running, 1.0 A stalled (no start voltage: full stall).
    const locomotive: Locomotive = { id: 'l1', name: 'Loco', runningAmps: 0.5, stallAmps: 1, ratedVolts: 12 };
    const trains = [
      { id: 't1', name: 'One', locomotiveIds: ['l1'], lightingAmps: 0, lengthMm: 1000 },
      { id: 't2', name: 'Two', locomotiveIds: ['l1'], lightingAmps: 0, lengthMm: 1000 },
    ];
    // The later run is listed first, so its departure is processed before the other's arrival.
    const { load } = checkPlan(plan({ driver: QUAD, volts: 15, locomotives: [locomotive], trains, runs: [standing('b', 't2', 'c1', 10, 20, 'C'), standing('a', 't1', 'c1', 0, 10)] }));
    const cab = load.cabs[0]!;
    expect(cab.maxPeakAmps).toBe(1);
    expect(cab.maxRunningAmps).toBe(0.5);
  });
});

describe('planned speed against what a cab can give', () => {
  // H0 (1:87): v mm/s = km/h / 3.6 × 1000 / 87 (DOMAIN: 100 km/h = 319.3 mm/s). The head runs from
  // A's far end to C's (4000 mm) while it moves; the 1000 mm train's tail clears a block 1000 mm later.
  const timedAt = (kmh: number): Plan['runs'][number] => {
    const v = ((kmh / 3.6) * 1000) / 87;
    const t = (mm: number) => mm / v;
    return {
      id: 'r1',
      trainId: 't1',
      cabId: 'c1',
      operatorId: null,
      departS: 0,
      arriveS: t(4000),
      steps: [
        { blockId: 'A', enterS: -5, exitS: t(1000) },
        { blockId: 'B', enterS: 0, exitS: t(3000) },
        { blockId: 'C', enterS: t(2000), exitS: t(4000) + 5 },
      ],
    };
  };
  // Calibration: 2 V start, 100 km/h at 12 V rated.
  const locomotive: Locomotive = { id: 'l1', name: 'Express loco', runningAmps: 0.5, stallAmps: 1, ratedVolts: 12, startVolts: 2, topSpeedKmh: 100 };

  it('recovers the planned speed from the steps', () => {
    const p = plan({ driver: QUAD, volts: 12, locomotives: [locomotive], runs: [timedAt(90)] });
    expect(plannedSpeedKmh(p, p.runs[0]!, new Map(p.blocks.map((b) => [b.id, b.lengthMm])))).toBeCloseTo(90, 9);
  });

  it('recovers the cruise of a run timed with ramps (kinematics: T = D/v + v/2a + v/2b)', () => {
    const blocks = [{ id: 'A', lengthMm: 2000 }, { id: 'B', lengthMm: 2000 }, { id: 'C', lengthMm: 2000 }];
    const ramps = { accelKmhPerS: 15, brakingKmhPerS: 20 }; // H0 common practice (defaultRamps)
    const timed = timeRun({ blocks, scaleRatio: 87, trainLengthMm: 1000, route: ['A', 'B', 'C'], departS: 0, speedKmh: 90, ...ramps });
    // 90 km/h: 287.36 mm/s; 4000 / 287.36 = 13.92 s, + 90/30 + 90/40 = 3 + 2.25 s of ramps = 19.17 s.
    expect(timed.arriveS).toBeCloseTo(4000 / ((90 / 3.6) * 1000 / 87) + 5.25, 9);
    const p = plan({ driver: QUAD, volts: 12, locomotives: [locomotive], runs: [{ id: 'r1', trainId: 't1', cabId: 'c1', operatorId: null, ...timed }] });
    const lengths = new Map(p.blocks.map((b) => [b.id, b.lengthMm]));
    expect(plannedSpeedKmh(p, p.runs[0]!, lengths, ramps)).toBeCloseTo(90, 6);
    // Without the ramps the average, 4000 mm / 19.17 s = 208.7 mm/s = 65.35 km/h, understates the cruise.
    expect(plannedSpeedKmh(p, p.runs[0]!, lengths)).toBeCloseTo(65.35, 2);
  });

  it('SLRS007B at 12 V: 90 km/h needs 2 + 10 × 0.9 = 11 V but the rails get 12 − 3.1 = 8.9 V; 60 km/h (8 V) fits', () => {
    const fast = checkPlan(plan({ driver: QUAD, volts: 12, locomotives: [locomotive], runs: [timedAt(90)] })).findings;
    expect(of(fast, 'speed-not-reachable')).toMatchObject([{ ids: ['r1', 'l1'], severity: 'warning' }]);
    expect(of(fast, 'speed-not-reachable')[0]!.message).toContain('8.9 V');
    const slow = checkPlan(plan({ driver: QUAD, volts: 12, locomotives: [locomotive], runs: [timedAt(60)] })).findings;
    expect(of(slow, 'speed-not-reachable')).toEqual([]);
  });

  it('a speed above the top speed is out of reach on any cab', () => {
    const found = checkPlan(plan({ driver: QUAD, volts: 24, locomotives: [locomotive], runs: [timedAt(101)] })).findings;
    expect(of(found, 'speed-not-reachable')[0]!.message).toContain('above the loco');
  });
});

describe('dutyFor with calibration', () => {
  it('a 12 V loco on rails that get exactly 12 V reaches its top speed at duty 1 (PWM 255)', () => {
    // Needed voltage equal to track voltage: reachable (NEM 630 Table 2, PWM average = duty × volts).
    expect(dutyFor({ supplyVolts: 12, dropVolts: 0, ratedVolts: 12, topSpeedKmh: 100, targetSpeedKmh: 100 })).toMatchObject({
      ok: true,
      duty: 1,
      pwm8: 255,
      neededVolts: 12,
      trackVolts: 12,
    });
    // A hair more needed than the track gives is not.
    expect(dutyFor({ supplyVolts: 12, dropVolts: 0.001, ratedVolts: 12, topSpeedKmh: 100, targetSpeedKmh: 100 })).toMatchObject({
      ok: false,
      code: 'not-reachable',
    });
  });

  it('a target just above the top speed is refused, however much voltage the track has', () => {
    expect(dutyFor({ supplyVolts: 30, dropVolts: 0, ratedVolts: 12, topSpeedKmh: 100, targetSpeedKmh: 100.5 })).toMatchObject({
      ok: false,
      code: 'above-top-speed',
    });
  });

  it('starts from the start voltage: 2 V + (12 − 2) V × 50/100 = 7 V, duty 7/12, PWM round(148.75) = 149', () => {
    const result = dutyFor({ supplyVolts: 12, dropVolts: 0, ratedVolts: 12, topSpeedKmh: 100, startVolts: 2, targetSpeedKmh: 50 });
    expect(result).toMatchObject({ ok: true, neededVolts: 7, pwm8: 149 });
    if (result.ok) {
      expect(result.duty).toBeCloseTo(7 / 12, 12);
      expect(result.startDuty).toBeCloseTo(2 / 12, 12); // the locomotive stands below this duty
    }
    expect(dutyFor({ supplyVolts: 12, dropVolts: 0, ratedVolts: 12, topSpeedKmh: 100, startVolts: 12, targetSpeedKmh: 50 })).toMatchObject({
      ok: false,
      code: 'bad-input',
    });
  });
});
