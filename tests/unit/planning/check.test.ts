import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  checkPlan,
  DRIVER_PRESETS,
  driverFromPreset,
  gaugeForScale,
  planSchema,
  toPlanJson,
  type Finding,
  type LoadSeries,
  type Plan,
} from '@/lib/planning';
import { planArbitrary } from './plan-arbitrary';
import {
  breakpoints,
  cabOwner,
  loadAt,
  oracleClashes,
  oracleContinuityAndRoutes,
  oracleStepGaps,
  oracleHeat,
  oraclePower,
  oracleSpeed,
  oracleVoltage,
  type OracleFinding,
} from './oracle';

const RUNS = { numRuns: 300 };
const key = (f: OracleFinding | Finding) => `${f.kind}|${f.severity}|${f.ids.join(',')}`;
const keysOf = (findings: readonly (OracleFinding | Finding)[], kinds: readonly string[]) =>
  findings.filter((f) => kinds.includes(f.kind)).map(key).sort();

const CLASH_KINDS = ['block-overlap', 'block-occupied', 'cab-double-booked', 'operator-double-booked', 'train-double-booked', 'locomotive-in-two-trains'];
const SHAPE_KINDS = ['train-continuity', 'route-gap', 'train-too-long', 'step-gap'];
const POWER_KINDS = ['channel-overload', 'channel-peak-overload', 'driver-overload', 'supply-overload', 'supply-derate'];
const VOLTAGE_KINDS = ['track-voltage-high', 'track-voltage-low'];

describe('checkPlan against brute force', () => {
  for (const timeScale of [1, 0.1]) {
    describe(`times × ${timeScale}`, () => {
      const plans = planArbitrary({ timeScale });

      it('generated plans are valid plans', () => {
        fc.assert(
          fc.property(plans, (plan) => {
            expect(planSchema.safeParse(toPlanJson(plan)).success).toBe(true);
          }),
          { numRuns: 100 },
        );
      });

      it('finds exactly the whole session’s block clashes (stays and stands), double bookings and shared locomotives', () => {
        fc.assert(
          fc.property(plans, (plan) => {
            expect(keysOf(checkPlan(plan).findings, CLASH_KINDS)).toEqual(keysOf(oracleClashes(plan), CLASH_KINDS));
          }),
          RUNS,
        );
      });

      it('finds exactly the continuity breaks, route gaps and too-long stands', () => {
        fc.assert(
          fc.property(plans, (plan) => {
            expect(keysOf(checkPlan(plan).findings, SHAPE_KINDS)).toEqual(keysOf([...oracleContinuityAndRoutes(plan), ...oracleStepGaps(plan)], SHAPE_KINDS));
          }),
          RUNS,
        );
      });

      it('finds exactly the maximal overload intervals, breakpoint by breakpoint', () => {
        const full = (f: OracleFinding | Finding) =>
          `${key(f)}|${f.fromS}|${f.toS}|${f.peakAmps!.toFixed(6)}|${f.limitAmps!.toFixed(6)}`;
        fc.assert(
          fc.property(plans, (plan) => {
            const found = checkPlan(plan).findings.filter((f) => POWER_KINDS.includes(f.kind)).map(full).sort();
            expect(found).toEqual(oraclePower(plan).map(full).sort());
          }),
          RUNS,
        );
      });

      it('finds exactly the voltage warnings', () => {
        const full = (f: OracleFinding | Finding) => `${key(f)}|${f.fromS}|${f.toS}`;
        fc.assert(
          fc.property(plans, (plan) => {
            const found = checkPlan(plan).findings.filter((f) => VOLTAGE_KINDS.includes(f.kind)).map(full).sort();
            expect(found).toEqual(oracleVoltage(plan, gaugeForScale(plan.scale)).map(full).sort());
          }),
          RUNS,
        );
      });

      it('finds exactly the driver heat intervals, and whether even the least drop is over (drop × current summed over channels)', () => {
        const full = (f: OracleFinding | Finding) => `${key(f)}|${f.fromS}|${f.toS}`;
        fc.assert(
          fc.property(plans, (plan) => {
            const found = checkPlan(plan).findings.filter((f) => f.kind === 'driver-heat');
            const expected = oracleHeat(plan);
            expect(found.map(full).sort()).toEqual(expected.map(full).sort());
            const evenLeast = (list: { fromS?: number; ids: string[] }[]) => list.map((f) => `${f.ids[0]}|${f.fromS}`).sort();
            expect(evenLeast(found.filter((f) => f.message.includes('even at the least drop')))).toEqual(evenLeast(expected.filter((f) => f.lowOver)));
          }),
          RUNS,
        );
      });

      it('finds exactly the runs planned faster than a loco or its cab can go', () => {
        fc.assert(
          fc.property(plans, (plan) => {
            const found = checkPlan(plan).findings.filter((f) => f.kind === 'speed-not-reachable').map(key).sort();
            expect(found).toEqual(oracleSpeed(plan).map(key).sort());
          }),
          RUNS,
        );
      });

      it('gives each series its maxima as the highest breakpoint values, events at one instant counted as their outcome', () => {
        fc.assert(
          fc.property(plans, (plan) => {
            const { load } = checkPlan(plan);
            for (const series of [...load.cabs, ...load.drivers, ...load.supplies]) {
              const times = [...breakpoints(plan), -1];
              const owner = cabOwner(plan);
              const counts = load.cabs.includes(series) ? owner.cab(series.id) : load.drivers.includes(series) ? owner.driver(series.id) : owner.supply(series.id);
              const direct = times.map((t) => loadAt(plan, t, counts));
              expect(series.maxRunningAmps).toBeCloseTo(Math.max(0, ...direct.map((d) => d.running)), 9);
              expect(series.maxPeakAmps).toBeCloseTo(Math.max(0, ...direct.map((d) => d.peak)), 9);
            }
          }),
          { numRuns: 150 },
        );
      });

      it('gives every load as a step function matching a direct sum at each breakpoint', () => {
        const valueAt = (series: LoadSeries, t: number) => {
          let value: [number, number] = [0, 0];
          for (const [tS, running, peak] of series.points) if (tS <= t) value = [running, peak];
          return value;
        };
        fc.assert(
          fc.property(plans, (plan) => {
            const { load } = checkPlan(plan);
            const owner = cabOwner(plan);
            const groups: [LoadSeries[], (id: string) => (run: Plan['runs'][number]) => boolean][] = [
              [load.cabs, owner.cab],
              [load.drivers, owner.driver],
              [load.supplies, owner.supply],
            ];
            for (const [seriesList, counts] of groups) {
              for (const series of seriesList) {
                for (let i = 1; i < series.points.length; i++) expect(series.points[i]![0]).toBeGreaterThan(series.points[i - 1]![0]);
                for (const t of [...breakpoints(plan), -1, 1e6]) {
                  const direct = loadAt(plan, t, counts(series.id));
                  const [running, peak] = valueAt(series, t);
                  expect(running).toBeCloseTo(direct.running, 9);
                  expect(peak).toBeCloseTo(direct.peak, 9);
                }
              }
            }
          }),
          { numRuns: 150 },
        );
      });
    });
  }

  it('lists findings by start time, with run pairs in ascending string order', () => {
    fc.assert(
      fc.property(planArbitrary(), (plan) => {
        const { findings } = checkPlan(plan);
        for (let i = 1; i < findings.length; i++) expect(findings[i]!.fromS).toBeGreaterThanOrEqual(findings[i - 1]!.fromS);
        for (const f of findings) {
          if (CLASH_KINDS.includes(f.kind)) expect(f.ids[1]! < f.ids[2]!).toBe(true);
          expect(f.message.length).toBeGreaterThan(0);
        }
      }),
      { numRuns: 100 },
    );
  });
});

/** A small plan to edit in examples: one supply, one driver, cab "c1", blocks A–B–C. */
function basePlan(overrides: Partial<Plan> = {}): Plan {
  return {
    version: 1,
    scale: { name: 'H0', ratio: 87 },
    clock: { ratio: 6, fastStart: '06:00' },
    rules: { headwayS: 30, surgeS: 2, derate: 0.8 },
    supplies: [{ id: 's1', name: 'Bench supply', volts: 12, amps: 5 }],
    drivers: [{ id: 'd1', name: 'Driver', supplyId: 's1', channels: 2, channelAmps: 1, channelPeakAmps: 2, totalAmps: null, dropVolts: 0 }],
    cabs: [
      { id: 'c1', name: 'Cab 1', driverId: 'd1', channel: 1 },
      { id: 'c2', name: 'Cab 2', driverId: 'd1', channel: 2 },
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
    locomotives: [{ id: 'l1', name: 'Loco', runningAmps: 0.3, stallAmps: 0.9, ratedVolts: 12 }],
    trains: [{ id: 't1', name: 'Train', locomotiveIds: ['l1'], lightingAmps: 0, lengthMm: 1000 }],
    operators: [{ id: 'o1', name: 'Ann' }],
    runs: [],
    ...overrides,
  };
}

const run = (id: string, departS: number, arriveS: number, extra: Partial<Plan['runs'][number]> = {}): Plan['runs'][number] => ({
  id,
  trainId: 't1',
  cabId: 'c1',
  operatorId: null,
  departS,
  arriveS,
  steps: [
    { blockId: 'A', enterS: departS, exitS: departS + 5 },
    { blockId: 'B', enterS: departS, exitS: arriveS },
  ],
  ...extra,
});

describe('checkPlan examples', () => {
  it('reports a headway breach with the gap, the overlap window, and run ids in string order', () => {
    const plan = basePlan({
      trains: [
        { id: 't1', name: 'One', locomotiveIds: ['l1'], lightingAmps: 0, lengthMm: 1000 },
        { id: 't2', name: 'Two', locomotiveIds: ['l1'], lightingAmps: 0, lengthMm: 1000 },
      ],
      runs: [
        run('r2', 0, 40, { cabId: 'c1' }),
        // Enters A 10 s after r2 left it: inside the 30 s headway.
        run('r10', 15, 60, { cabId: 'c2', trainId: 't2', steps: [{ blockId: 'A', enterS: 15, exitS: 20 }, { blockId: 'B', enterS: 41, exitS: 60 }] }),
      ],
    });
    const overlaps = checkPlan(plan).findings.filter((f) => f.kind === 'block-overlap');
    expect(overlaps.map((f) => f.ids)).toEqual([
      ['A', 'r10', 'r2'],
      ['B', 'r10', 'r2'],
    ]);
    expect(overlaps[0]).toMatchObject({ fromS: 5, toS: 15 });
    expect(overlaps[0]!.message).toContain('headway is 30 s');
    // B: r2 holds it until 40, r10 enters at 41: 1 s apart.
    expect(overlaps[1]).toMatchObject({ fromS: 40, toS: 41 });
  });

  it('books a cab, an operator and a train only once at a time; touching movements are fine', () => {
    const plan = basePlan({
      rules: { headwayS: 0, surgeS: 0, derate: 1 },
      runs: [
        run('a', 0, 10, { operatorId: 'o1' }),
        run('b', 10, 20, { operatorId: 'o1', steps: [{ blockId: 'B', enterS: 10, exitS: 12 }, { blockId: 'C', enterS: 11, exitS: 20 }] }),
        run('c', 15, 25, { operatorId: 'o1', steps: [{ blockId: 'A', enterS: 15, exitS: 25 }] }),
      ],
    });
    const kinds = checkPlan(plan).findings.filter((f) => f.kind.endsWith('double-booked'));
    expect(kinds.map((f) => [f.kind, ...f.ids, f.fromS, f.toS])).toEqual([
      ['cab-double-booked', 'c1', 'b', 'c', 15, 20],
      ['operator-double-booked', 'o1', 'b', 'c', 15, 20],
      ['train-double-booked', 't1', 'b', 'c', 15, 20],
    ]);
  });

  it('warns when a train leaves from somewhere other than where it stopped', () => {
    const plan = basePlan({
      runs: [run('first', 0, 10), run('second', 100, 110, { steps: [{ blockId: 'C', enterS: 100, exitS: 120 }] })],
    });
    const found = checkPlan(plan).findings.find((f) => f.kind === 'train-continuity');
    expect(found).toMatchObject({ severity: 'warning', ids: ['t1', 'first', 'second'] });
  });

  it('finds a route gap between blocks no link joins', () => {
    const plan = basePlan({
      runs: [run('r1', 0, 10, { steps: [{ blockId: 'A', enterS: 0, exitS: 5 }, { blockId: 'C', enterS: 1, exitS: 12 }] })],
    });
    expect(checkPlan(plan).findings.find((f) => f.kind === 'route-gap')?.ids).toEqual(['r1', 'A', 'C']);
  });

  it('warns when the train stands in a block shorter than itself', () => {
    const plan = basePlan({
      blocks: [
        { id: 'A', name: 'A', lengthMm: 900 },
        { id: 'B', name: 'B', lengthMm: 2000 },
        { id: 'C', name: 'C', lengthMm: 2000 },
      ],
      runs: [run('r1', 0, 10)],
    });
    const found = checkPlan(plan).findings.filter((f) => f.kind === 'train-too-long');
    expect(found.map((f) => f.ids)).toEqual([['r1', 'A']]);
  });

  it('counts a load equal to its limit as within it, and surge only for surgeS', () => {
    // 0.5 + 0.5 A running on a 1.0 A channel: exactly at the limit, so no channel-overload.
    const plan = basePlan({
      locomotives: [{ id: 'l1', name: 'Loco', runningAmps: 0.5, stallAmps: 1.5, ratedVolts: 12 }],
      trains: [{ id: 't1', name: 'Train', locomotiveIds: ['l1'], lightingAmps: 0, lengthMm: 1000 }],
      rules: { headwayS: 0, surgeS: 2, derate: 1 },
      drivers: [{ id: 'd1', name: 'Driver', supplyId: 's1', channels: 2, channelAmps: 1, channelPeakAmps: 2, totalAmps: null, dropVolts: 0 }],
      runs: [
        run('a', 0, 10),
        run('b', 1, 10, { trainId: 't1', steps: [{ blockId: 'C', enterS: 1, exitS: 10 }] }),
      ],
    });
    const power = checkPlan(plan).findings.filter((f) => f.kind.includes('overload'));
    // Peaks: 1.5 (a surging) from 0; 1.5 + 1.5 = 3.0 from 1 to 2; 0.5 + 1.5 = 2.0 from 2 to 3 (at the limit).
    expect(power.map((f) => [f.kind, f.fromS, f.toS, f.peakAmps, f.limitAmps])).toEqual([
      ['channel-peak-overload', 1, 2, 3, 2],
    ]);
  });

  it('common practice: one 1.5 A large-scale loco overloads a 1 A-class channel but not a 2 A-class one', () => {
    const oneAmp = DRIVER_PRESETS.find((p) => p.id === 'bipolar-quad-half-h-1a')!;
    const twoAmp = DRIVER_PRESETS.find((p) => p.id === 'bipolar-dual-full-bridge-2a')!;
    const outdoor = (preset: typeof oneAmp) =>
      basePlan({
        scale: { name: 'IIm', ratio: 22.5 },
        // Common practice: outdoor large-scale track runs at 12–16 V and can take about 19 V; a supply
        // of 19 V less the 2 A-class bridge's 4.9 V drop leaves 14.1 V, inside that band.
        supplies: [{ id: 's1', name: 'Outdoor supply', volts: 19, amps: 5 }],
        drivers: [driverFromPreset(preset, { id: 'd1', supplyId: 's1' })],
        locomotives: [{ id: 'l1', name: 'Large-scale loco', runningAmps: 1.5, stallAmps: 2.2, ratedVolts: 18 }],
        rules: { headwayS: 30, surgeS: 0, derate: 0.8 },
        runs: [run('r1', 0, 60)],
      });
    const overloads = (plan: Plan) => checkPlan(plan).findings.filter((f) => f.kind === 'channel-overload');
    expect(overloads(outdoor(oneAmp))).toMatchObject([{ ids: ['c1'], peakAmps: 1.5, limitAmps: 1, fromS: 0, toS: 60 }]);
    expect(overloads(outdoor(twoAmp))).toEqual([]);
  });

  it('common practice: a 1 A-class chip drives two indoor HO motors, one per channel', () => {
    const oneAmp = DRIVER_PRESETS.find((p) => p.id === 'bipolar-quad-half-h-1a')!;
    // Common practice: modern HO, plan on 0.5 A at most per locomotive.
    const plan = basePlan({
      drivers: [driverFromPreset(oneAmp, { id: 'd1', supplyId: 's1' })],
      supplies: [{ id: 's1', name: 'Supply', volts: 15, amps: 2 }],
      locomotives: [{ id: 'l1', name: 'HO loco', runningAmps: 0.5, stallAmps: 0.9, ratedVolts: 12 }],
      trains: [
        { id: 't1', name: 'One', locomotiveIds: ['l1'], lightingAmps: 0, lengthMm: 1000 },
        { id: 't2', name: 'Two', locomotiveIds: ['l1'], lightingAmps: 0, lengthMm: 1000 },
      ],
      runs: [
        run('r1', 0, 60),
        run('r2', 0, 60, { trainId: 't2', cabId: 'c2', steps: [{ blockId: 'C', enterS: 0, exitS: 60 }] }),
      ],
    });
    expect(oneAmp.channels).toBe(2);
    const power = checkPlan(plan).findings.filter((f) => f.kind.includes('overload'));
    expect(power).toEqual([]);
  });

  it('warns when full throttle over-drives a loco (NEM 630 Table 2: PWM judged by average voltage)', () => {
    const plan = basePlan({
      supplies: [{ id: 's1', name: 'Supply', volts: 15, amps: 5 }],
      drivers: [{ id: 'd1', name: 'Driver', supplyId: 's1', channels: 2, channelAmps: 1, channelPeakAmps: 2, totalAmps: null, dropVolts: 0.6 }],
      runs: [run('r1', 0, 60), run('r2', 200, 260)],
    });
    const high = checkPlan(plan).findings.filter((f) => f.kind === 'track-voltage-high');
    // 15 V − 0.6 V = 14.4 V > 12 V rated; the safe duty is 12 / 14.4 = 83 %.
    expect(high).toMatchObject([{ ids: ['c1', 'l1'], fromS: 0, toS: 260, severity: 'warning' }]);
    expect(high[0]!.message).toContain('83 %');
  });

  it('warns when the rails get less than NEM 630 Table 1 nominal for the gauge (12 V for H0 16.5 mm, as NMRA S-9 I.A)', () => {
    // 12 V − 2.6 V (1 A-class bridge typical drop at 1 A, SLRS007B) = 9.4 V < 12 V.
    const low = basePlan({
      drivers: [{ id: 'd1', name: 'Driver', supplyId: 's1', channels: 2, channelAmps: 1, channelPeakAmps: 2, totalAmps: null, dropVolts: 2.6 }],
      runs: [run('r1', 0, 60)],
    });
    const found = checkPlan(low).findings.filter((f) => f.kind === 'track-voltage-low');
    expect(found).toMatchObject([{ ids: ['c1'], severity: 'warning' }]);
    expect(found[0]!.message).toContain('NEM 630');
    // Exactly 12 V at the rails meets NMRA S-9 I.A's "not less than 12 V".
    const exact = basePlan({ runs: [run('r1', 0, 60)] });
    expect(checkPlan(exact).findings.filter((f) => f.kind === 'track-voltage-low')).toEqual([]);
    // Z gauge (6.5 mm) is judged against 8 V (NEM 630 Table 1), so 9.4 V passes.
    const z = { ...low, scale: { name: 'Z', ratio: 220 } };
    expect(checkPlan(z).findings.filter((f) => f.kind === 'track-voltage-low')).toEqual([]);
  });
});
