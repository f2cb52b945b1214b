export interface DutyInput {
  /** Motor supply of the driver, V. */
  supplyVolts: number;
  /**
   * Voltage lost across the bridge at the train's current, V: for a plan's driver,
   * `dropAt(driverDrop(driver).max, trainAmps)` (the most it may lose, so the duty is enough).
   */
  dropVolts: number;
  /** The locomotive's rated voltage, at which it reaches its top speed, V. */
  ratedVolts: number;
  /** Calibration: scale top speed at rated voltage, km/h. */
  topSpeedKmh: number;
  /** Calibration: average voltage below which the locomotive does not move, V; 0 when not measured. */
  startVolts?: number;
  /** Scale speed wanted, km/h. */
  targetSpeedKmh: number;
}

export type DutyResult =
  | {
      ok: true;
      /** PWM duty cycle, 0..1. */
      duty: number;
      /** The duty as an 8-bit PWM value 0..255 (duty = value / 255): round(duty × 255). */
      pwm8: number;
      /** The least duty at which the locomotive moves (its start voltage over the track voltage), 0..1. */
      startDuty: number;
      /** Voltage at the rails at full throttle: supply − drop. */
      trackVolts: number;
      /** Average voltage the locomotive needs for the target speed. */
      neededVolts: number;
    }
  | {
      ok: false;
      reason: string;
      code: 'bad-input' | 'no-track-voltage' | 'above-top-speed' | 'not-reachable';
    };

/** A duty 0..1 as an 8-bit PWM value 0..255 (duty = value / 255, common practice); clamped. */
export function pwm8Of(duty: number): number {
  return Math.round(Math.min(1, Math.max(0, duty)) * 255);
}

/**
 * The PWM duty cycle a cab needs for a target scale speed, and its 8-bit PWM value.
 *
 * The model: a locomotive does not move below its start voltage; above it, speed grows in proportion to
 * the average voltage beyond the start voltage, reaching `topSpeedKmh` at `ratedVolts`. So a target
 * above 0 needs `startVolts + (ratedVolts − startVolts) × target / top` volts on average (with no
 * start voltage measured, simply `ratedVolts × target / top`). PWM gives an average of duty × the
 * voltage it switches (the definition of pulse-width modulation; NEM 630 Table 2 judges pulsed
 * supplies by their average), and the bridge switches `supplyVolts − dropVolts` onto the rails, so
 * duty = needed / (supply − drop). Motors slow under load, so treat the figure as a first setting to
 * trim by eye.
 *
 * Not reachable when the target is above the locomotive's top speed (that would over-drive it) or when
 * the rails cannot get the voltage needed; a target equal to the top speed on rails that get exactly
 * the rated voltage is reachable at duty 1 (PWM 255).
 */
export function dutyFor(input: DutyInput): DutyResult {
  const { supplyVolts, dropVolts, ratedVolts, topSpeedKmh, targetSpeedKmh } = input;
  const startVolts = input.startVolts ?? 0;
  const values = [supplyVolts, dropVolts, ratedVolts, topSpeedKmh, targetSpeedKmh, startVolts];
  if (values.some((value) => !Number.isFinite(value))) {
    return { ok: false, code: 'bad-input', reason: 'every figure must be a finite number' };
  }
  if (ratedVolts <= 0 || topSpeedKmh <= 0) {
    return { ok: false, code: 'bad-input', reason: 'rated volts and top speed must be greater than 0' };
  }
  if (targetSpeedKmh < 0 || dropVolts < 0 || startVolts < 0) {
    return { ok: false, code: 'bad-input', reason: 'target speed, drop and start voltage must be 0 or more' };
  }
  if (!(startVolts < ratedVolts)) {
    return { ok: false, code: 'bad-input', reason: 'the start voltage must be below the rated voltage' };
  }
  const trackVolts = supplyVolts - dropVolts;
  if (targetSpeedKmh > topSpeedKmh) {
    return {
      ok: false,
      code: 'above-top-speed',
      reason: `${targetSpeedKmh} km/h is above the locomotive's top speed of ${topSpeedKmh} km/h at ${ratedVolts} V`,
    };
  }
  const neededVolts = targetSpeedKmh === 0 ? 0 : startVolts + ((ratedVolts - startVolts) * targetSpeedKmh) / topSpeedKmh;
  if (trackVolts <= 0) {
    if (neededVolts === 0) return { ok: true, duty: 0, pwm8: 0, startDuty: 0, trackVolts, neededVolts };
    return {
      ok: false,
      code: 'no-track-voltage',
      reason: `the bridge drop of ${round2(dropVolts)} V leaves nothing of the ${supplyVolts} V supply for the track`,
    };
  }
  const startDuty = Math.min(1, startVolts / trackVolts);
  if (neededVolts > trackVolts) {
    return {
      ok: false,
      code: 'not-reachable',
      reason: `needs ${round2(neededVolts)} V on average but the track gets at most ${round2(trackVolts)} V`,
    };
  }
  const duty = neededVolts / trackVolts;
  return { ok: true, duty, pwm8: pwm8Of(duty), startDuty, trackVolts, neededVolts };
}

function round2(value: number): number {
  return Math.round(value * 100) / 100;
}
