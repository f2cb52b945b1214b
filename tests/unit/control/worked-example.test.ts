import { describe, expect, it } from 'vitest';
import { planSchema, type Plan } from '@/lib/planning';
import { compileSchedule, type ControlEntry, type WiringSheet } from '@/lib/control';

/**
 * Worked example, H0 (1:87): a train with the scale's common-practice ramps (defaultRamps: 15 km/h
 * per second up, 20 down; "common practice", not a standard) runs 60 km/h over two 2 m blocks.
 *
 * Ramp durations = speed change ÷ rate, in scale units:
 *   up    60 km/h ÷ 15 km/h/s = 4 s  → rampMs 4000
 *   down  60 km/h ÷ 20 km/h/s = 3 s  → rampMs 3000
 * The run's time, so that the engine's plannedSpeedKmh gives back 60 km/h (T = D/v + v/2a + v/2b):
 *   v = 60 km/h = 60 ÷ 3.6 × 1000 ÷ 87 = 191.57 mm/s in the model; D = 2000 + 2000 = 4000 mm
 *   D/v = 4000 × 87 × 3.6 ÷ 60 000 = 20.88 s; v/2a = 4 s ÷ 2 = 2 s; v/2b = 3 s ÷ 2 = 1.5 s
 *   T = 20.88 + 2 + 1.5 = 24.38 s
 * PWM at each end (dutyFor): standing, 0 V needed → 0; at 60 km/h a 12 V, 120 km/h locomotive needs
 *   12 × 60 ÷ 120 = 6 V on average; the rails get 15 − 1.5 = 13.5 V; duty 6 ÷ 13.5 = 0.444;
 *   × 255 = 113.3 → 113.
 * Direction (NEM 631 2.3: the right-hand rail is positive in the direction of travel): every block
 * is wired with the cab's + on the left rail looking towards its b end, so heading for b the
 * positive rail is on the left and the cab must drive reverse; heading back for a, forward.
 */
const T = 4000 / ((60 / 3.6) * (1000 / 87)) + 60 / 15 / 2 + 60 / 20 / 2;

function plan(): Plan {
  const go = (id: string, departS: number, blocks: string[]) => ({
    id,
    trainId: 't',
    cabId: 'c1',
    operatorId: null,
    departS,
    arriveS: departS + T,
    steps: blocks.map((blockId, i) => ({ blockId, enterS: departS + (i * T) / 3, exitS: departS + ((i + 1) * T) / 3 + (i < 2 ? 1 : 0) })),
  });
  return planSchema.parse({
    version: 2,
    scale: { name: 'H0', ratio: 87 },
    clock: { ratio: 1, fastStart: '07:00' },
    rules: { headwayS: 0, surgeS: 0, derate: 1 },
    supplies: [{ id: 's', name: 'Supply', volts: 15, amps: 10 }],
    drivers: [{ id: 'd', name: 'Driver', supplyId: 's', channels: 1, channelAmps: 2, channelPeakAmps: 3, totalAmps: null, dropVolts: 1.5 }],
    cabs: [{ id: 'c1', name: 'Cab 1', driverId: 'd', channel: 1 }],
    blocks: ['b1', 'b2', 'b3'].map((id) => ({ id, name: id.toUpperCase(), lengthMm: 2000, positiveRail: 'left' })),
    links: [
      { a: 'b1', b: 'b2', aEnd: 'b', bEnd: 'a' },
      { a: 'b2', b: 'b3', aEnd: 'b', bEnd: 'a' },
    ],
    locomotives: [{ id: 'l', name: 'Loco', runningAmps: 0.3, stallAmps: 0.6, ratedVolts: 12, startVolts: 0, topSpeedKmh: 120 }],
    trains: [{ id: 't', name: 'Goods', locomotiveIds: ['l'], lightingAmps: 0, lengthMm: 300, accelKmhPerS: 15, brakingKmhPerS: 20 }],
    operators: [],
    runs: [go('out', 10, ['b1', 'b2', 'b3']), go('back', 100, ['b3', 'b2', 'b1'])],
  });
}

/** An old sheet that claims forward towards the next block everywhere: the engine's ends must win. */
const wiring: WiringSheet = {
  version: 1,
  boards: [{ id: 'u', kind: 'header40', name: 'Board', emergencyStopPin: 'GPIO4', startPin: null }],
  cabs: [{ cabId: 'c1', boardId: 'u', forwardPin: 'GPIO17', reversePin: 'GPIO27', pwmPin: 'GPIO18', bothHighBrakes: false }],
  blocks: [
    { blockId: 'b1', boardId: 'u', feeds: [{ cabId: 'c1', pin: 'GPIO5' }], polarityPin: null, forwardTowards: ['b2'] },
    { blockId: 'b2', boardId: 'u', feeds: [{ cabId: 'c1', pin: 'GPIO6' }], polarityPin: null, forwardTowards: ['b3'] },
    { blockId: 'b3', boardId: 'u', feeds: [{ cabId: 'c1', pin: 'GPIO13' }], polarityPin: null, forwardTowards: [] },
  ],
  timing: { leadS: 1, releaseS: 0.5, deadTimeMs: 300, breakMs: 50, accelerateS: 9, brakeS: 9 },
};

type Speed = Extract<ControlEntry, { kind: 'speed' }>;

describe('control schedule worked example (H0, common-practice ramps, NEM 631 2.3)', () => {
  const schedule = compileSchedule({ plan: plan(), wiring, runSpeedKmh: { out: null, back: null }, locomotiveTopSpeedKmh: { l: 120 } });
  const atS = (ms: number) => ms / 1000 + schedule.originS;

  it('schedules both runs at the speed the engine planned (plannedSpeedKmh) and its dutyFor value', () => {
    expect(schedule.findings).toEqual([]);
    expect(schedule.runs.map((r) => r.runId)).toEqual(['out', 'back']);
    for (const run of schedule.runs) {
      expect(run.speedKmh).toBeCloseTo(60, 6); // T was built from 60 km/h
      expect(run.pwm).toBe(113); // 6 V ÷ 13.5 V × 255 = 113.3
    }
  });

  it('ramps up over 60 ÷ 15 = 4 s from departure and down over 60 ÷ 20 = 3 s ending at arrival (common practice rates)', () => {
    const speeds = schedule.entries.filter((e): e is Speed => e.kind === 'speed');
    expect(speeds).toHaveLength(4);
    const [up, down] = speeds;
    expect(up).toMatchObject({ from: 0, to: 113, rampMs: 4000 });
    expect(atS(up!.atMs)).toBeCloseTo(10, 3);
    expect(down).toMatchObject({ from: 113, to: 0, rampMs: 3000 });
    // Braking starts 3 s before arrival so the train stands at 10 + 24.38 s.
    expect(atS(down!.atMs + down!.rampMs)).toBeCloseTo(10 + T, 2);
    expect(T).toBeCloseTo(24.38, 2);
  });

  it('drives reverse heading for b and forward heading for a on blocks wired + on the left (NEM 631 2.3), whatever forwardTowards says', () => {
    const byRun = new Map(schedule.runs.map((r) => [r.runId, r.directions]));
    expect(byRun.get('out')).toEqual(['reverse', 'reverse', 'reverse']);
    expect(byRun.get('back')).toEqual(['forward', 'forward', 'forward']);
    const directions = schedule.entries.filter((e) => e.kind === 'direction').map((e) => (e.kind === 'direction' ? e.direction : ''));
    expect(directions).toEqual(['reverse', 'off', 'forward', 'off']);
  });

  it('reads forwardTowards only for a layout without ends (an old sheet)', () => {
    const old = plan();
    old.links = old.links.map(({ a, b }) => ({ a, b }));
    old.blocks = old.blocks.map(({ positiveRail: _, ...b }) => b);
    const legacy = compileSchedule({ plan: old, wiring, runSpeedKmh: { out: null, back: null }, locomotiveTopSpeedKmh: { l: 120 } });
    // The sheet says forward towards b2 and b3: out is forward, back is reverse.
    expect(legacy.runs.map((r) => r.directions[0])).toEqual(['forward', 'reverse']);
  });

  it('flips a reversing section with the engine: polarity normal while the cab drives what the section needs, swapped after the cab reverses', () => {
    // b3 wired the other way (+ on the right looking to b): heading for b it needs forward, b1 and b2 reverse
    // (NEM 631 2.3), so the cab must change direction while the train is wholly inside b2.
    const loop = plan();
    loop.blocks = loop.blocks.map((b) => (b.id === 'b3' ? { ...b, positiveRail: 'right' } : b.id === 'b2' ? { ...b, reversingSection: true } : b));
    loop.runs = [loop.runs[0]!];
    const noRelay = compileSchedule({ plan: loop, wiring, runSpeedKmh: { out: null }, locomotiveTopSpeedKmh: { l: 120 } });
    expect(noRelay.findings.map((f) => f.message)).toEqual([expect.stringContaining('B2 is a reversing section on the layout but the wiring sheet gives it no polarity relay')]);
    const relay = { ...wiring, blocks: wiring.blocks.map((b) => (b.blockId === 'b2' ? { ...b, polarityPin: 'GPIO19' } : b)) };
    const flipped = compileSchedule({ plan: loop, wiring: relay, runSpeedKmh: { out: null }, locomotiveTopSpeedKmh: { l: 120 } });
    expect(flipped.runs[0]!.directions).toEqual(['reverse', 'forward', 'forward']);
    const polarity = flipped.entries.filter((e) => e.kind === 'polarity').map((e) => (e.kind === 'polarity' ? e.polarity : ''));
    // b2 needs reverse heading for b: the cab gives reverse on entry (normal), forward after the flip (swapped).
    expect(polarity).toEqual(['normal', 'swapped']);
    expect(flipped.findings.map((f) => f.kind)).toEqual(['control-reversing-stop']);
  });
});
