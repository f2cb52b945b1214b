export interface DutyInput {
  /** Motor supply of the driver, V. */
  supplyVolts: number;
  /** Voltage lost across the bridge, V. */
  dropVolts: number;
  /** The loco's rated voltage, at which it reaches its top speed, V. */
  ratedVolts: number;
  /** Scale top speed at rated voltage, km/h. */
  topSpeedKmh: number;
  /** Scale speed wanted, km/h. */
  targetSpeedKmh: number;
}

export type DutyResult =
  | {
      ok: true;
      /** PWM duty cycle, 0..1. */
      duty: number;
      /** The duty as an 8-bit PWM value, round(duty × 255). */
      pwm8: number;
      /** Voltage at the rails at full throttle: supply − drop. */
      trackVolts: number;
      /** Average voltage the loco needs for the target speed. */
      neededVolts: number;
    }
  | {
      ok: false;
      reason: string;
      code: 'bad-input' | 'no-track-voltage' | 'above-top-speed' | 'not-reachable';
    };

/**
 * The PWM duty cycle a cab needs for a target scale speed.
 *
 * The model is linear: a loco's speed is taken as proportional to its average track voltage,
 * reaching `topSpeedKmh` at `ratedVolts`, so it needs `ratedVolts × target / top` volts on average.
 * PWM gives an average of duty × the voltage it switches (the definition of pulse-width modulation;
 * NEM 630 Table 2 judges pulsed supplies by their average), and the bridge switches
 * `supplyVolts − dropVolts` onto the rails, so duty = needed / (supply − drop). Real motors need a
 * starting voltage and slow under load, so treat the figure as a first setting to trim by eye.
 *
 * Not reachable when the target is above the loco's top speed (that would over-drive it) or when
 * the rails cannot get the voltage needed.
 */
export function dutyFor(input: DutyInput): DutyResult {
  const { supplyVolts, dropVolts, ratedVolts, topSpeedKmh, targetSpeedKmh } = input;
  const values = [supplyVolts, dropVolts, ratedVolts, topSpeedKmh, targetSpeedKmh];
  if (values.some((value) => !Number.isFinite(value))) {
    return { ok: false, code: 'bad-input', reason: 'every figure must be a finite number' };
  }
  if (ratedVolts <= 0 || topSpeedKmh <= 0) {
    return { ok: false, code: 'bad-input', reason: 'rated volts and top speed must be greater than 0' };
  }
  if (targetSpeedKmh < 0 || dropVolts < 0) {
    return { ok: false, code: 'bad-input', reason: 'target speed and drop must be 0 or more' };
  }
  const trackVolts = supplyVolts - dropVolts;
  if (targetSpeedKmh > topSpeedKmh) {
    return {
      ok: false,
      code: 'above-top-speed',
      reason: `${targetSpeedKmh} km/h is above the loco's top speed of ${topSpeedKmh} km/h at ${ratedVolts} V`,
    };
  }
  const neededVolts = (ratedVolts * targetSpeedKmh) / topSpeedKmh;
  if (neededVolts === 0) return { ok: true, duty: 0, pwm8: 0, trackVolts, neededVolts };
  if (trackVolts <= 0) {
    return {
      ok: false,
      code: 'no-track-voltage',
      reason: `the bridge drop of ${dropVolts} V leaves nothing of the ${supplyVolts} V supply for the track`,
    };
  }
  if (neededVolts > trackVolts) {
    return {
      ok: false,
      code: 'not-reachable',
      reason: `needs ${round2(neededVolts)} V on average but the track gets at most ${round2(trackVolts)} V`,
    };
  }
  const duty = neededVolts / trackVolts;
  return { ok: true, duty, pwm8: Math.round(duty * 255), trackVolts, neededVolts };
}

function round2(value: number): number {
  return Math.round(value * 100) / 100;
}
