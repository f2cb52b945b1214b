import { planSchema, type Plan } from '@/lib/planning';
import type { WiringSheet } from '@/lib/control';

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
export const T = 4000 / ((60 / 3.6) * (1000 / 87)) + 60 / 15 / 2 + 60 / 20 / 2;

export function plan(): Plan {
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
export const wiring: WiringSheet = {
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
