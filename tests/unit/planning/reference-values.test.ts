import { describe, expect, it } from 'vitest';
import {
  defaultRules,
  DRIVER_PRESETS,
  channelWatts,
  dropAt,
  dutyFor,
  fastToReal,
  findScale,
  formatFast,
  gaugeForScale,
  modelSpeedMmPerS,
  nominalTrackVolts,
  parseTimeOfDay,
  timeOfDaySchema,
  realToFast,
  SCALES,
} from '@/lib/planning';

describe('scale table', () => {
  const ratio = (id: string) => SCALES.find((s) => s.id === id)!.ratio;
  const gauge = (id: string) => SCALES.find((s) => s.id === id)!.gaugeMm;

  it('carries the NEM 010 Table 1 ratios and gauges', () => {
    expect([ratio('z-nem'), gauge('z-nem')]).toEqual([220, 6.5]); // NEM 010 Table 1
    expect([ratio('n-nem'), gauge('n-nem')]).toEqual([160, 9]); // NEM 010 Table 1
    expect([ratio('tt-nem'), gauge('tt-nem')]).toEqual([120, 12]); // NEM 010 Table 1
    expect([ratio('h0-nem'), gauge('h0-nem')]).toEqual([87, 16.5]); // NEM 010 Table 1
    expect([ratio('s-nem'), gauge('s-nem')]).toEqual([64, 22.5]); // NEM 010 Table 1
    expect([ratio('0-nem'), gauge('0-nem')]).toEqual([45, 32]); // NEM 010 Table 1
    expect([ratio('i-nem'), gauge('i-nem')]).toEqual([32, 45]); // NEM 010 Table 1
    expect([ratio('iim-nem'), gauge('iim-nem')]).toEqual([22.5, 45]); // NEM 010 Table 1
    expect(ratio('oo-nem')).toBe(76.2); // NEM 010 §3.4 names 4 mm scale 1:76; 1:76.2 common practice
  });

  it('carries the NMRA S-1.2 ratios and gauges', () => {
    expect(ratio('ho-nmra')).toBe(87.1); // NMRA S-1.2: 3.5 mm to the foot
    expect(ratio('ho-nmra')).toBeCloseTo(304.8 / 3.5, 1); // derived: 1 ft = 304.8 mm, / 3.5 mm
    expect(gauge('ho-nmra')).toBe(16.5); // NMRA S-1.2
    expect(ratio('n-nmra')).toBe(160); // NMRA S-1.2
    expect(ratio('tt-nmra')).toBe(120); // NMRA S-1.2
    expect([ratio('o-nmra'), gauge('o-nmra')]).toEqual([48, 31.75]); // NMRA S-1.2
    expect(gauge('s-nmra')).toBeCloseTo((56.5 * 25.4) / 64, 1); // NMRA S-1.2, derived 56.5 in / 64 = 22.4 mm
    expect(gauge('s-nmra')).toBe(22.4);
  });

  it('looks scales up by id, name or ratio', () => {
    expect(findScale('H0')?.id).toBe('h0-nem');
    expect(findScale('ho')?.id).toBe('ho-nmra');
    expect(findScale('HO (NMRA)')?.ratio).toBe(87.1);
    expect(findScale('nope')).toBeUndefined();
    expect(gaugeForScale({ name: 'Branch line', ratio: 87 })).toBe(16.5);
    expect(gaugeForScale({ name: 'Branch line', ratio: 100 })).toBeNull();
    for (const scale of SCALES) expect(scale.source.length).toBeGreaterThan(0);
  });
});

describe('speed conversion', () => {
  it('100 km/h in H0 is 319.3 mm/s (derived: 100 000 m / 3600 s / 87 = 0.3193 m/s)', () => {
    expect(modelSpeedMmPerS(100, 87)).toBeCloseTo((100_000_000 / 3600) / 87, 9); // derived: 10⁸ mm per 3600 s, NEM 010 ratio 1:87
    expect(modelSpeedMmPerS(100, 87)).toBeCloseTo(319.3, 1);
  });

  it('60 mph in HO is 307.9 mm/s (derived: 26.82 m/s / 87.1)', () => {
    const kmh = (60 * 1609.344) / 1000; // 60 mph = 96.56 km/h
    expect(modelSpeedMmPerS(kmh, 87.1)).toBeCloseTo(307.9, 1); // derived, NMRA S-1.2 ratio 1:87.1
  });

  it('a 2 m block at 319.3 mm/s takes 6.26 s (derived: 2000 / 319.3)', () => {
    expect(2000 / modelSpeedMmPerS(100, 87)).toBeCloseTo(6.26, 2);
  });
});

describe('fast clock', () => {
  const clock = { ratio: 6, fastStart: '06:00' };

  it('6:1 gives 10 real minutes per fast hour (common practice)', () => {
    expect(realToFast(600, clock) - realToFast(0, clock)).toBe(3600);
    expect(fastToReal(7 * 3600, clock)).toBe(600);
    expect(formatFast(600, clock)).toBe('07:00');
  });

  it('round-trips and wraps at 24 h', () => {
    expect(fastToReal(realToFast(1234.5, clock), clock)).toBeCloseTo(1234.5, 9);
    // 18 fast hours after 06:00 is midnight: 18 × 600 real seconds.
    expect(formatFast(18 * 600, clock)).toBe('00:00');
    expect(formatFast(18 * 600 + 90, clock)).toBe('00:09');
    expect(formatFast(-60, clock)).toBe('05:54');
    expect(formatFast(0, { ratio: 4, fastStart: '23:59' })).toBe('23:59');
  });

  it('parses HH:MM and refuses anything else', () => {
    expect(parseTimeOfDay('07:30')).toBe(7 * 3600 + 30 * 60);
    expect(parseTimeOfDay('23:59')).toBe(86_340);
    expect(parseTimeOfDay('24:00')).toBeNull();
    expect(parseTimeOfDay('7:30')).toBeNull();
    expect(parseTimeOfDay('07:60')).toBeNull();
  });

  // ISO 8601 extended time of day: hh:mm or hh:mm:ss, 24-hour, two digits each (24:00 end-of-day not used here).
  it('reads seconds only where they are allowed, and the zod schema agrees with the parser', () => {
    expect(parseTimeOfDay('07:30:15')).toBeNull();
    expect(parseTimeOfDay('07:30:15', { seconds: true })).toBe(7 * 3600 + 30 * 60 + 15);
    expect(parseTimeOfDay(' 23:59:59 ', { seconds: true })).toBe(86_399);
    expect(parseTimeOfDay('07:30:60', { seconds: true })).toBeNull();
    expect(parseTimeOfDay('07:30:5', { seconds: true })).toBeNull();
    for (const seconds of [false, true]) {
      const schema = timeOfDaySchema({ invalid: 'bad' }, { seconds });
      for (const text of ['00:00', '07:30', '23:59', '07:30:15', '24:00', '7:30', '07:60', '07:30:60', '', 'noon']) {
        expect(schema.safeParse(text).success, `${text} seconds=${seconds}`).toBe(parseTimeOfDay(text, { seconds }) !== null);
      }
    }
  });
});

describe('dutyFor', () => {
  it('average voltage = duty × supply (PWM definition)', () => {
    // No drop: the rails see the supply switched at the duty cycle.
    const result = dutyFor({ supplyVolts: 12, dropVolts: 0, ratedVolts: 12, topSpeedKmh: 120, targetSpeedKmh: 60 });
    expect(result).toMatchObject({ ok: true, duty: 0.5, neededVolts: 6, trackVolts: 12 });
    if (result.ok) {
      expect(result.duty * 12).toBeCloseTo(result.neededVolts, 12); // PWM: average = duty × supply
      expect(result.pwm8).toBe(128); // 8-bit PWM, duty = value / 255 (common practice): round(127.5)
    }
  });

  it('takes the bridge drop off the supply', () => {
    // 15 V supply less the 1 A-class bridge's 2.6 V typical drop (SLRS007B) leaves 12.4 V.
    const result = dutyFor({ supplyVolts: 15, dropVolts: 2.6, ratedVolts: 12, topSpeedKmh: 100, targetSpeedKmh: 100 });
    expect(result.ok).toBe(true);
    if (result.ok) {
      expect(result.trackVolts).toBeCloseTo(12.4, 12);
      expect(result.duty).toBeCloseTo(12 / 12.4, 12);
      expect(result.pwm8).toBe(Math.round((12 / 12.4) * 255));
    }
  });

  it('says when the target cannot be reached', () => {
    expect(dutyFor({ supplyVolts: 12, dropVolts: 2.6, ratedVolts: 12, topSpeedKmh: 100, targetSpeedKmh: 90 })).toMatchObject({
      ok: false,
      code: 'not-reachable',
    });
    expect(dutyFor({ supplyVolts: 12, dropVolts: 0, ratedVolts: 12, topSpeedKmh: 100, targetSpeedKmh: 120 })).toMatchObject({
      ok: false,
      code: 'above-top-speed',
    });
    expect(dutyFor({ supplyVolts: 3, dropVolts: 3.6, ratedVolts: 12, topSpeedKmh: 100, targetSpeedKmh: 10 })).toMatchObject({
      ok: false,
      code: 'no-track-voltage',
    });
    expect(dutyFor({ supplyVolts: 12, dropVolts: 0, ratedVolts: 0, topSpeedKmh: 100, targetSpeedKmh: 10 })).toMatchObject({
      ok: false,
      code: 'bad-input',
    });
    expect(dutyFor({ supplyVolts: 12, dropVolts: 0, ratedVolts: 12, topSpeedKmh: 100, targetSpeedKmh: 0 })).toMatchObject({
      ok: true,
      duty: 0,
      pwm8: 0,
    });
  });
});

describe('driver presets', () => {
  const preset = (id: string) => DRIVER_PRESETS.find((p) => p.id === id)!;

  it('has five generic classes with no part numbers or makers in their labels', () => {
    expect(DRIVER_PRESETS).toHaveLength(5);
    for (const p of DRIVER_PRESETS) {
      expect(p.label).not.toMatch(/\d{3}|TI\b|Texas|ST\b|Toshiba|DRV|TB6|L29|SN7/i);
      expect(p.source.length).toBeGreaterThan(0);
      expect(p.channelPeakAmps).toBeGreaterThanOrEqual(p.channelAmps);
    }
  });

  it('bipolar quad half-H matches its datasheet (TI SLRS007B)', () => {
    const p = preset('bipolar-quad-half-h-1a');
    expect([p.channels, p.channelAmps, p.channelPeakAmps]).toEqual([2, 1, 2]); // SLRS007B: 1 A per channel, 2 A non-repetitive
    expect(p.peakPulseS).toBe(0.005); // SLRS007B: the 2 A peak for at most 5 ms
    // SLRS007B typical drop (VOH + VOL): about 2.1 V at 0.5 A and 1.4 + 1.2 = 2.6 V at 1 A.
    expect(dropAt(p.drop.min, 0.5)).toBeCloseTo(2.1, 12);
    expect(dropAt(p.drop.min, 1)).toBeCloseTo(1.4 + 1.2, 12);
    // SLRS007B worst case at 1 A: 1.8 + 1.8 = 3.6 V.
    expect(dropAt(p.drop.max, 1)).toBeCloseTo(1.8 + 1.8, 12);
    expect(p.packageWatts).toBe(2.075); // SLRS007B: 2075 mW at 25 °C
    expect([p.minSupplyVolts, p.maxSupplyVolts]).toEqual([4.5, 36]); // SLRS007B
  });

  it('bipolar dual full-bridge matches its datasheet (ST, Multiwatt15, Jan 2000)', () => {
    const p = preset('bipolar-dual-full-bridge-2a');
    expect([p.channels, p.channelAmps, p.channelPeakAmps]).toEqual([2, 2, 2.5]); // 2 A DC, 2.5 A repetitive
    expect(p.peakPulseS).toBe(0.01); // the 2.5 A repetitive peak: 10 ms on
    expect(dropAt(p.drop.min, 1)).toBeCloseTo(1.8, 12); // total drop at least 1.8 V at 1 A
    expect(dropAt(p.drop.max, 1)).toBeCloseTo(3.2, 12); // at most 3.2 V at 1 A
    expect(dropAt(p.drop.max, 2)).toBeCloseTo(4.9, 12); // up to 4.9 V at 2 A
    expect(p.maxSupplyVolts).toBe(46);
    expect(p.packageWatts).toBe(25); // 25 W total dissipation at Tcase 75 °C
    // Both channels at 2 A on the greatest drop: 2 × 2 A × 4.9 V = 19.6 W, inside the 25 W.
    expect(2 * channelWatts(p.drop.max, 2)).toBeLessThan(p.packageWatts!);
  });

  it('MOSFET classes match their datasheets (TB6612FNG 2014, DRV8871 SLVSCY9B, DRV8833)', () => {
    const low = preset('mosfet-dual-low-voltage-1-2a');
    expect([low.channels, low.channelAmps, low.channelPeakAmps, low.minSupplyVolts, low.maxSupplyVolts]).toEqual([2, 1.2, 3.2, 2.5, 13.5]);
    expect(dropAt(low.drop.max, 1.2)).toBeCloseTo(1.2 * 0.5, 12); // TB6612FNG: 0.5 Ω upper + lower, I × R
    expect(dropAt(low.drop.min, 0.4)).toBeCloseTo(0.4 * 0.5, 12);
    const single = preset('mosfet-single-high-current-3-6a');
    expect([single.channels, single.channelPeakAmps, single.minSupplyVolts, single.maxSupplyVolts]).toEqual([1, 3.6, 6.5, 45]);
    expect(dropAt(single.drop.max, 3.6)).toBeCloseTo(3.6 * 0.565, 12); // DRV8871: 0.565 Ω high + low side
    // DRV8871 gives no continuous rating: derived from heat, (150 − 25) °C / 40 °C/W over the hot
    // on-resistance 1.5 × 0.565 Ω (derived, see the preset's source line), not its 3.6 A peak.
    expect(single.channelAmps).toBeCloseTo(Math.sqrt((150 - 25) / 40 / (1.5 * 0.565)), 1);
    expect(single.channelAmps).toBeLessThan(single.channelPeakAmps);
    expect(single.source).toMatch(/derived/i);
    expect(single.peakPulseS).toBeNull(); // no pulse width given: surges judged against the continuous figure
    const veryLow = preset('mosfet-dual-very-low-voltage-1-5a');
    expect([veryLow.channels, veryLow.channelAmps, veryLow.channelPeakAmps, veryLow.minSupplyVolts, veryLow.maxSupplyVolts]).toEqual([
      2, 1.5, 2, 2.7, 10.8,
    ]);
    expect(dropAt(veryLow.drop.max, 1.5)).toBeCloseTo(1.5 * 0.36, 12); // DRV8833: 0.36 Ω high + low side
  });

  it('common practice: the 1 A class and the 2 A class each drive two motors; large scale wants the 2 A class', () => {
    expect(preset('bipolar-quad-half-h-1a').channels).toBe(2);
    expect(preset('bipolar-dual-full-bridge-2a').channels).toBe(2);
    // Common practice: outdoor large-scale track at 12–16 V, up to about 19 V. A 19 V supply stays
    // inside the 2 A class's 46 V and the 1 A class's 36 V; the low-voltage MOSFET classes cannot take it.
    expect(preset('bipolar-dual-full-bridge-2a').maxSupplyVolts).toBeGreaterThanOrEqual(19);
    expect(preset('mosfet-dual-low-voltage-1-2a').maxSupplyVolts).toBeLessThan(19);
    expect(preset('mosfet-dual-very-low-voltage-1-5a').maxSupplyVolts).toBeLessThan(19);
  });
});

describe('rules and track voltage', () => {
  it('defaults: 80 % continuous supply load (rule of thumb; NEC 210.20(A) uses the same 80 %)', () => {
    expect(defaultRules).toEqual({ headwayS: 30, surgeS: 2, derate: 0.8 });
  });

  it('nominal DC track voltage by gauge (NEM 630 Table 1)', () => {
    expect(nominalTrackVolts(6.5)).toBe(8); // NEM 630 Table 1: gauge ≤ 6.5 mm
    expect(nominalTrackVolts(16.5)).toBe(12); // NEM 630 Table 1: 6.5 < gauge < 32 mm
    expect(nominalTrackVolts(32)).toBe(16); // NEM 630 Table 1: gauge ≥ 32 mm
    expect(nominalTrackVolts(45)).toBe(16); // large scale; common practice runs 12–16 V, up to about 19 V
  });
});
