import { describe, expect, it } from 'vitest';
import { planDriverElectrics, presetDriverValues, storedDriverElectrics } from '@/lib/layouts/driver-electrics';
import { DRIVER_PRESETS, dropAt } from '@/lib/planning';

const preset = (id: string) => DRIVER_PRESETS.find((p) => p.id === id)!;

describe('a driver’s electrics between the stored fields and the plan', () => {
  it('a quad half-H preset fills its datasheet lines (TI SLRS007B: 1.4 + 1.2 V typical, 1.8 + 1.8 V greatest at 1 A; 2 A for 5 ms; 2075 mW)', () => {
    const values = presetDriverValues(preset('bipolar-quad-half-h-1a'));
    expect([values.channels, values.channelAmps, values.channelPeakAmps]).toEqual([2, 1, 2]);
    expect(values.peakPulseMs).toBeCloseTo(5, 9);
    expect(values.packageWatts).toBe(2.075);
    expect(values.dropMaxVolts).not.toBeNull();
    const plan = planDriverElectrics(values);
    expect(dropAt(plan.drop!.min, 1)).toBeCloseTo(2.6, 9);
    expect(dropAt(plan.drop!.max, 1)).toBeCloseTo(3.6, 9);
    expect(plan.peakPulseS).toBeCloseTo(0.005, 12);
  });

  it('a MOSFET preset with no pulse width given stores none, so a surge is judged against the continuous rating (TI DRV8871 SLVSCY9B)', () => {
    const values = presetDriverValues(preset('mosfet-single-high-current-3-6a'));
    expect(values.peakPulseMs).toBeNull();
    expect(planDriverElectrics(values).peakPulseS).toBeNull();
    expect(values.totalAmps).toBe(preset('mosfet-single-high-current-3-6a').totalAmps);
  });

  it('an own driver with one drop line stores it once; blank greatest line and heat mean the same line and no check', () => {
    const own = { dropVolts: 1.2, dropOhms: 0.3, dropMaxVolts: null, dropMaxOhms: null, peakPulseMs: 10, packageWatts: null };
    const plan = planDriverElectrics(own);
    expect(plan).toEqual({ drop: { min: { fixedVolts: 1.2, ohms: 0.3 }, max: { fixedVolts: 1.2, ohms: 0.3 } }, peakPulseS: 0.01, packageWatts: null });
    expect(storedDriverElectrics(plan)).toEqual(own);
  });

  it('a greatest line that differs in its voltage or in its resistance alone is kept whole', () => {
    const volts = planDriverElectrics({ dropVolts: 1, dropOhms: 0.5, dropMaxVolts: 2, dropMaxOhms: null, peakPulseMs: null, packageWatts: 3 });
    expect(volts.drop!.max).toEqual({ fixedVolts: 2, ohms: 0.5 });
    expect(storedDriverElectrics(volts)).toMatchObject({ dropMaxVolts: 2, dropMaxOhms: 0.5, packageWatts: 3, peakPulseMs: null });
    const ohms = planDriverElectrics({ dropVolts: 1, dropOhms: 0.5, dropMaxVolts: null, dropMaxOhms: 0.8, peakPulseMs: null, packageWatts: null });
    expect(ohms.drop!.max).toEqual({ fixedVolts: 1, ohms: 0.8 });
    expect(storedDriverElectrics(ohms)).toMatchObject({ dropMaxVolts: 1, dropMaxOhms: 0.8 });
  });

  it('an older plan with one fixed drop and no pulse width stores a flat line and "none given"', () => {
    expect(storedDriverElectrics({ dropVolts: 2.6, peakPulseS: undefined, packageWatts: undefined })).toEqual({
      dropVolts: 2.6,
      dropOhms: 0,
      dropMaxVolts: null,
      dropMaxOhms: null,
      peakPulseMs: null,
      packageWatts: null,
    });
  });
});
