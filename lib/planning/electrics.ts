import type { Driver, Locomotive } from './schema';

/**
 * A straight-line fit of a bridge's voltage drop against the current through it:
 * `drop = fixedVolts + ohms × amps`. Bipolar bridges have a fixed part (the transistors' saturation
 * voltages) plus a resistive slope; MOSFET bridges are purely resistive (fixedVolts 0, ohms the high-
 * plus low-side on-resistance).
 */
export interface DropLine {
  fixedVolts: number;
  ohms: number;
}

/**
 * A driver's drop as two lines: `min`, the least the datasheet lets the drop be (used where a small
 * drop is the danger: over-voltage at the rails, and the lower heat estimate), and `max`, the most it
 * may be (used where a large drop is the danger: under-voltage at maximum anticipated load, NMRA
 * S-9 I.A, and the upper heat estimate).
 */
export interface DriverDrop {
  min: DropLine;
  max: DropLine;
}

/** The drop of one line at a current, V. Negative currents count as 0. */
export function dropAt(line: DropLine, amps: number): number {
  return line.fixedVolts + line.ohms * Math.max(0, amps);
}

/** Heat in the bridge for one channel carrying `amps`: drop × current, W. */
export function channelWatts(line: DropLine, amps: number): number {
  return amps > 0 ? dropAt(line, amps) * amps : 0;
}

/**
 * A driver's drop lines. A plan written before drops depended on current gives one fixed
 * `dropVolts`; that reads as the same flat line for both bounds, so old plans check as before.
 */
export function driverDrop(driver: Pick<Driver, 'drop' | 'dropVolts'>): DriverDrop {
  if (driver.drop) return driver.drop;
  const flat = { fixedVolts: driver.dropVolts ?? 0, ohms: 0 };
  return { min: flat, max: flat };
}

/**
 * What a start-up surge of `surgeS` seconds is compared with on one channel. A peak rating holds
 * only for its pulse width: a surge longer than `peakPulseS` (or any surge, when the datasheet gives
 * the peak without a pulse width: `peakPulseS` null) is judged against the continuous rating. A plan
 * written before pulse widths were recorded (`peakPulseS` absent) keeps the peak rating.
 */
export function surgeLimit(
  driver: Pick<Driver, 'channelAmps' | 'channelPeakAmps' | 'peakPulseS'>,
  surgeS: number,
): { amps: number; continuous: boolean } {
  const pulse = driver.peakPulseS;
  if (pulse === undefined || (pulse !== null && surgeS <= pulse)) return { amps: driver.channelPeakAmps, continuous: false };
  return { amps: driver.channelAmps, continuous: true };
}

/**
 * A locomotive's current while it starts under a PWM ramp. The motor stands still until the ramp's
 * average voltage reaches the locomotive's start voltage; standing still it is a plain resistance, so it
 * draws its stall current (measured at rated volts) scaled by that voltage:
 * `stallAmps × startVolts / ratedVolts`. Never less than its running current (it goes on to run), and
 * the full stall current when the locomotive has no start voltage recorded (nothing says how gently it
 * starts).
 */
export function startAmps(locomotive: Pick<Locomotive, 'runningAmps' | 'stallAmps' | 'ratedVolts' | 'startVolts'>): number {
  if (locomotive.startVolts === undefined || locomotive.startVolts === null) return locomotive.stallAmps;
  const share = Math.min(1, Math.max(0, locomotive.startVolts / locomotive.ratedVolts));
  return Math.max(locomotive.runningAmps, locomotive.stallAmps * share);
}

/**
 * The one train-current sum: a train's lighting plus each of its locomotives, running and at start
 * (startAmps). Lighting first, then the locomotives in order, so every caller adds in the same order.
 */
export function trainAmps(
  lightingAmps: number,
  locomotives: Iterable<Pick<Locomotive, 'runningAmps' | 'stallAmps' | 'ratedVolts' | 'startVolts'>>,
): { runningAmps: number; startAmps: number } {
  let running = lightingAmps;
  let start = lightingAmps;
  for (const locomotive of locomotives) {
    running += locomotive.runningAmps;
    start += startAmps(locomotive);
  }
  return { runningAmps: running, startAmps: start };
}

/**
 * Scale speed, km/h, of a movement of `lengthMm` model millimetres in `seconds`: mm/s × ratio gives
 * prototype mm/s, × 3600 / 1e6 gives km/h (the inverse of modelSpeedMmPerS).
 */
export function scaleSpeedKmh(lengthMm: number, seconds: number, scaleRatio: number): number {
  return ((lengthMm / seconds) * scaleRatio * 3600) / 1e6;
}
