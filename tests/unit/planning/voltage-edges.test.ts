/**
 * The voltage checks at their edges: the planned speed's null cases, the highest voltage over a cab's
 * runs, the top speed's rounding allowance and the locomotives the speed check skips. The driver is
 * the 1 A-class quad half-H bridge (TI SLRS007B: drop 1.6 V + 1.0 Ω × I least, 2.6 V + 1.0 Ω × I greatest;
 * shared/DOMAIN.md), H0 at 1:87 (NEM 010).
 */
import { describe, expect, it, vi } from 'vitest';
import { checkPlan, DRIVER_PRESETS, driverFromPreset, planSchema, plannedSpeedKmh, toPlanJson, type Plan } from '@/lib/planning';

const QUAD = DRIVER_PRESETS.find((p) => p.id === 'bipolar-quad-half-h-1a')!;
type Run = Plan['runs'][number];

const run = (id: string, trainId: string, departS: number, arriveS: number, steps: Run['steps']): Run => ({ id, trainId, cabId: 'c1', operatorId: null, departS, arriveS, steps });
/** A 2 m block each, A–B–C in a row; the head runs 4000 mm (B and C) from A's far end to C's. */
const moving = (id: string, trainId: string, departS: number, arriveS: number): Run => {
  const quarter = (arriveS - departS) / 4;
  return run(id, trainId, departS, arriveS, [
    { blockId: 'A', enterS: departS, exitS: departS + quarter },
    { blockId: 'B', enterS: departS + quarter, exitS: departS + 2 * quarter },
    { blockId: 'C', enterS: departS + 2 * quarter, exitS: arriveS },
  ]);
};
const standing = (id: string, trainId: string, departS: number, arriveS: number): Run => run(id, trainId, departS, arriveS, [{ blockId: 'A', enterS: departS, exitS: arriveS }]);

function plan(supplyVolts: number, locomotives: Plan['locomotives'], trains: Plan['trains'], runs: Run[]): Plan {
  const built: Plan = {
    version: 1,
    scale: { name: 'H0', ratio: 87 },
    clock: { ratio: 6, fastStart: '06:00' },
    rules: { headwayS: 0, surgeS: 0, derate: 0.8 },
    supplies: [{ id: 's1', name: 'Bench supply', volts: supplyVolts, amps: 10 }],
    drivers: [driverFromPreset(QUAD, { id: 'd1', supplyId: 's1', name: 'Board' })],
    cabs: [{ id: 'c1', name: 'Cab 1', driverId: 'd1', channel: 1 }],
    blocks: ['A', 'B', 'C'].map((id) => ({ id, name: id, lengthMm: 2000 })),
    links: [
      { a: 'A', b: 'B' },
      { a: 'B', b: 'C' },
    ],
    locomotives,
    trains,
    operators: [],
    runs,
  };
  const parsed = planSchema.safeParse(toPlanJson(built));
  expect(parsed.error?.issues ?? []).toEqual([]);
  return built;
}
const train = (id: string, locomotiveIds: string[], lightingAmps = 0): Plan['trains'][number] => ({ id, name: `Train ${id}`, locomotiveIds, lightingAmps, lengthMm: 1000 });
// Calibration: 2 V start, 100 km/h at 12 V rated.
const EXPRESS: Plan['locomotives'][number] = { id: 'l1', name: 'Express loco', runningAmps: 0.5, stallAmps: 1, ratedVolts: 12, startVolts: 2, topSpeedKmh: 100 };
const lengths = (p: Plan) => new Map(p.blocks.map((b) => [b.id, b.lengthMm]));
const ofKind = (p: Plan, kind: string) => checkPlan(p).findings.filter((f) => f.kind === kind);

describe('planned speed: no speed to judge', () => {
  it('is null for a run that stands in one block, and for one through a block of unknown length', () => {
    const p = plan(12, [EXPRESS], [train('t1', ['l1'])], [standing('r1', 't1', 0, 60), moving('r2', 't1', 100, 120)]);
    expect(plannedSpeedKmh(p, p.runs[0]!, lengths(p))).toBeNull();
    expect(plannedSpeedKmh(p, p.runs[0]!, lengths(p), { accelKmhPerS: 15, brakingKmhPerS: 20 })).toBeNull();
    const noC = new Map([...lengths(p)].filter(([id]) => id !== 'C'));
    expect(plannedSpeedKmh(p, p.runs[1]!, noC)).toBeNull();
    // With every length known: 4000 mm in 20 s = 200 mm/s model, × 87 × 3.6 / 1000 = 62.64 km/h scale.
    expect(plannedSpeedKmh(p, p.runs[1]!, lengths(p))).toBeCloseTo(62.64, 9);
  });

  it('a locomotive standing, or with no top speed recorded, gets no speed finding however fast the run', () => {
    // 4000 mm in 2 s = 2 m/s model = 626.4 km/h scale: far above any top speed.
    const noTop = { ...EXPRESS, id: 'l2', name: 'Uncalibrated', topSpeedKmh: undefined };
    const nullTop = { ...EXPRESS, id: 'l3', name: 'Also uncalibrated', topSpeedKmh: null };
    const p = plan(12, [EXPRESS, noTop, nullTop], [train('t1', ['l1']), train('t2', ['l2']), train('t3', ['l3'])], [
      standing('r1', 't1', 0, 60),
      moving('r2', 't2', 100, 102),
      moving('r3', 't3', 200, 202),
    ]);
    expect(ofKind(p, 'speed-not-reachable')).toEqual([]);
    // The same run with the calibrated loco is out of reach: the check does run here.
    const q = plan(12, [EXPRESS], [train('t1', ['l1'])], [moving('r2', 't1', 100, 102)]);
    expect(ofKind(q, 'speed-not-reachable').map((f) => f.ids)).toEqual([['r2', 'l1']]);
  });
});

describe('top speed: a planned speed within a millionth of it is the top speed', () => {
  // Uniform speed, s = v·t: 100 km/h scale at 1:87 is 100 / 3.6 × 1000 / 87 = 319.28 mm/s model, so
  // 4000 mm take 4000 × 87 × 3.6 / 100 000 = 12.528 s. On 24 V the rails get at least
  // 24 − (2.6 + 0.5) = 20.9 V ≥ 12 V rated, so the top speed itself is within reach.
  const atTop = 12.528;
  const found = (seconds: number) => ofKind(plan(24, [EXPRESS], [train('t1', ['l1'])], [moving('r1', 't1', 0, seconds)]), 'speed-not-reachable');

  it('5 × 10⁻⁷ faster than the top speed (100.00005 km/h) is taken as the top speed: reachable', () => {
    expect(found(atTop * (1 - 5e-7))).toEqual([]);
    expect(found(atTop)).toEqual([]);
  });

  it('2 × 10⁻⁶ faster (100.0002 km/h) is above the top speed', () => {
    const [finding, ...more] = found(atTop * (1 - 2e-6));
    expect(more).toEqual([]);
    expect(finding).toMatchObject({ ids: ['r1', 'l1'], fromS: 0 });
    expect(finding!.message).toContain("above the locomotive's top speed of 100 km/h");
  });
});

describe('over-drive: the highest voltage over a cab’s runs, and the current it was at', () => {
  // Small tank (0.4 A) alone: least drop 1.6 + 0.4 = 2.0 V, 15 − 2.0 = 13 V at the rails.
  // The same loco with 0.6 A of coach lighting: 1.0 A, 15 − 2.6 = 12.4 V. Both above its 12 V.
  // The finding gives the higher, 13 V at 0.4 A; safe duty ⌊12 / 13 × 100⌋ = 92 % (NEM 630 Table 2).
  const tank: Plan['locomotives'][number] = { id: 'l1', name: 'Small tank', runningAmps: 0.4, stallAmps: 0.8, ratedVolts: 12 };
  const message =
    "Cab 1 puts up to 13 V on the rails at full throttle (the bridge's least drop at 0.4 A), above the 12 V rating of Small tank (2 runs); keep its duty at or below 92 % (NEM 630 Table 2 judges PWM by its average voltage)";
  const overDrive = (first: string, second: string) =>
    ofKind(plan(15, [tank], [train('light', ['l1']), train('lit', ['l1'], 0.6)], [standing('r1', first, 0, 60), standing('r2', second, 100, 160)]), 'track-voltage-high');

  it('the heavier train first, the lighter after: the lighter one’s 13 V is kept', () => {
    expect(overDrive('lit', 'light')).toEqual([expect.objectContaining({ ids: ['c1', 'l1'], fromS: 0, toS: 160, message })]);
  });

  it('the lighter train first: its 13 V is not replaced by the heavier one’s 12.4 V', () => {
    expect(overDrive('light', 'lit')).toEqual([expect.objectContaining({ ids: ['c1', 'l1'], fromS: 0, toS: 160, message })]);
  });

  it('the wording is built when the module loads fresh (volts to 0.01 V, amps to 0.001 A)', async () => {
    // Re-imported inside the test, so the module's own helpers are built afresh here.
    vi.resetModules();
    const fresh = await import('@/lib/planning');
    const p = plan(15, [tank], [train('light', ['l1']), train('lit', ['l1'], 0.6)], [standing('r1', 'lit', 0, 60), standing('r2', 'light', 100, 160)]);
    expect(fresh.checkPlan(p).findings.filter((f) => f.kind === 'track-voltage-high').map((f) => f.message)).toEqual([message]);
  });
});
