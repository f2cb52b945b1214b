import { describe, expect, it } from 'vitest';
import { dutyFor } from '@/lib/planning';

// dutyFor's guards, one bad figure at a time from a good input (12 V locomotive, 80 km/h at 12 V, 15 V
// supply, 2.6 V drop: TI SLRS007B's typical drop at 1 A).
const good = { supplyVolts: 15, dropVolts: 2.6, ratedVolts: 12, topSpeedKmh: 80, targetSpeedKmh: 40, startVolts: 2 };

describe('dutyFor refuses figures it cannot use', () => {
  it('takes the good input', () => {
    // Linear from the start voltage: 2 + (12 − 2) × 40/80 = 7 V on 12.4 V of track.
    expect(dutyFor(good)).toMatchObject({ ok: true, neededVolts: 7, trackVolts: 12.4 });
  });

  it('a figure that is not finite', () => {
    for (const key of Object.keys(good) as (keyof typeof good)[]) {
      for (const bad of [Number.NaN, Number.POSITIVE_INFINITY]) {
        expect(dutyFor({ ...good, [key]: bad }), `${key} = ${bad}`).toEqual({ ok: false, code: 'bad-input', reason: 'every figure must be a finite number' });
      }
    }
  });

  it('a rated voltage or top speed of 0 or less', () => {
    for (const over of [{ ratedVolts: 0 }, { topSpeedKmh: 0 }, { topSpeedKmh: -80 }]) {
      expect(dutyFor({ ...good, ...over }), JSON.stringify(over)).toEqual({ ok: false, code: 'bad-input', reason: 'rated volts and top speed must be greater than 0' });
    }
  });

  it('a negative target, drop or start voltage; 0 is fine', () => {
    for (const over of [{ targetSpeedKmh: -1 }, { dropVolts: -0.1 }, { startVolts: -0.1 }]) {
      expect(dutyFor({ ...good, ...over }), JSON.stringify(over)).toEqual({ ok: false, code: 'bad-input', reason: 'target speed, drop and start voltage must be 0 or more' });
    }
    for (const over of [{ targetSpeedKmh: 0 }, { dropVolts: 0 }, { startVolts: 0 }]) expect(dutyFor({ ...good, ...over }).ok, JSON.stringify(over)).toBe(true);
  });

  it('a start voltage at or above the rated voltage', () => {
    expect(dutyFor({ ...good, startVolts: 12 })).toEqual({ ok: false, code: 'bad-input', reason: 'the start voltage must be below the rated voltage' });
  });

  it('no track voltage at all: standing still is duty 0, moving is impossible', () => {
    const none = { ...good, supplyVolts: 2.6 }; // the drop takes the whole supply
    expect(dutyFor({ ...none, targetSpeedKmh: 0 })).toMatchObject({ ok: true, duty: 0, pwm8: 0, startDuty: 0 });
    expect(dutyFor(none)).toEqual({ ok: false, code: 'no-track-voltage', reason: 'the bridge drop of 2.6 V leaves nothing of the 2.6 V supply for the track' });
    // Standing still needs 0 V even with a start voltage: the locomotive is not asked to move.
    expect(dutyFor({ ...good, targetSpeedKmh: 0 })).toMatchObject({ ok: true, duty: 0, neededVolts: 0 });
  });
});
