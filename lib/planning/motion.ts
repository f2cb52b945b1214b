/**
 * Motion with ramps: how a train gets going and comes to a stand.
 *
 * Rates are in scale km/h per second (prototype terms, like a speed in scale km/h): 1 m/s² =
 * 3.6 km/h per second. In the model the rate shrinks by the scale ratio, as speed does:
 * `rate ÷ 3.6 × 1000 ÷ ratio` mm/s².
 */

/** Model acceleration in mm/s² for a rate in scale km/h per second (like modelSpeedMmPerS). */
export function modelRateMmPerS2(kmhPerS: number, scaleRatio: number): number {
  return ((kmhPerS / 3.6) * 1000) / scaleRatio;
}

export interface Ramps {
  /** Scale km/h gained per second from standstill. */
  accelKmhPerS: number;
  /** Scale km/h lost per second when stopping. */
  brakingKmhPerS: number;
}

export interface RampDefault extends Ramps {
  source: string;
}

const COMMON_PRACTICE =
  'common practice: model momentum is set far shorter than the prototype’s 0.5–1.0 m/s² (1.8–3.6 km/h per second), since a layout compresses the line too';

/**
 * Sensible ramps for a scale (common practice, not a standard): a train reaches 60 km/h in about
 * 3 s in the small scales, 4 s in H0/OO/TT, 5 s in S and 0, 6 s in the garden scales, and brakes a
 * little harder than it accelerates. By ratio, so a planner's own scale gets the nearest row's
 * value: 1:150 and smaller (Z, N) 20/25, down to 1:70 (TT, H0, HO, OO) 15/20, down to 1:40 (S, 0,
 * O) 12/15, larger (I, IIm) 10/12 km/h per second.
 */
export function defaultRamps(scaleRatio: number): RampDefault {
  if (scaleRatio >= 150) return { accelKmhPerS: 20, brakingKmhPerS: 25, source: COMMON_PRACTICE };
  if (scaleRatio >= 70) return { accelKmhPerS: 15, brakingKmhPerS: 20, source: COMMON_PRACTICE };
  if (scaleRatio >= 40) return { accelKmhPerS: 12, brakingKmhPerS: 15, source: COMMON_PRACTICE };
  return { accelKmhPerS: 10, brakingKmhPerS: 12, source: COMMON_PRACTICE };
}

/**
 * One movement from a stand to a stand over `distance` (elementary kinematics): accelerate at `accel`
 * to `cruise`, run at it, brake at `braking` so as to stop exactly at the end. When the distance is
 * too short to reach the cruise (v²/2a + v²/2b > distance) the train brakes as soon as it must: a
 * triangle with peak speed √(2·distance ÷ (1/a + 1/b)). Rates may be Infinity (an instant change).
 */
export class Movement {
  readonly peak: number;
  readonly accelDistance: number;
  readonly brakeFrom: number;
  readonly accelTime: number;
  readonly cruiseEnd: number;
  readonly duration: number;

  constructor(
    readonly distance: number,
    cruise: number,
    readonly accel: number,
    readonly braking: number,
  ) {
    const inverse = 1 / accel + 1 / braking; // 0 when both are instant
    const needed = (cruise * cruise * inverse) / 2;
    this.peak = needed <= distance ? cruise : Math.sqrt((2 * distance) / inverse);
    const v = this.peak;
    this.accelDistance = (v * v) / (2 * accel);
    this.brakeFrom = distance - (v * v) / (2 * braking);
    this.accelTime = v / accel;
    this.cruiseEnd = this.accelTime + (this.brakeFrom - this.accelDistance) / v;
    this.duration = this.cruiseEnd + v / braking;
  }

  /** Seconds from the start until the head has run `x` (0 ≤ x ≤ distance). */
  timeAt(x: number): number {
    if (x <= 0) return 0;
    if (x >= this.distance) return this.duration;
    // x = a t² / 2 while accelerating.
    if (x < this.accelDistance) return Math.sqrt((2 * x) / this.accel);
    if (x <= this.brakeFrom) return this.accelTime + (x - this.accelDistance) / this.peak;
    // The rest to go, r = b τ² / 2, is covered in the last τ seconds.
    return this.duration - Math.sqrt((2 * (this.distance - x)) / this.braking);
  }
}
