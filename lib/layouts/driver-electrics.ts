import { driverDrop, type Driver, type DriverPreset } from '@/lib/planning';

/**
 * How a stored driver holds the engine's electrics: the least drop line as `dropVolts + dropOhms × I`,
 * the greatest as `dropMaxVolts + dropMaxOhms × I` (null: the same as the least), the peak's pulse
 * width in ms (null: none given) and the package rating in W (null: heat not checked).
 */
export interface DriverElectrics {
  dropVolts: number;
  dropOhms: number;
  dropMaxVolts: number | null;
  dropMaxOhms: number | null;
  peakPulseMs: number | null;
  packageWatts: number | null;
}

/** A stored driver's electrics as the engine's plan fields. */
export function planDriverElectrics(d: DriverElectrics): Pick<Driver, 'drop' | 'peakPulseS' | 'packageWatts'> {
  const min = { fixedVolts: d.dropVolts, ohms: d.dropOhms };
  return {
    drop: { min, max: { fixedVolts: d.dropMaxVolts ?? min.fixedVolts, ohms: d.dropMaxOhms ?? min.ohms } },
    peakPulseS: d.peakPulseMs === null ? null : d.peakPulseMs / 1000,
    packageWatts: d.packageWatts,
  };
}

/** A plan driver's electrics as stored fields (a plan with one fixed dropVolts gives a flat line). */
export function storedDriverElectrics(d: Pick<Driver, 'drop' | 'dropVolts' | 'peakPulseS' | 'packageWatts'>): DriverElectrics {
  const { min, max } = driverDrop(d);
  const same = min.fixedVolts === max.fixedVolts && min.ohms === max.ohms;
  return {
    dropVolts: min.fixedVolts,
    dropOhms: min.ohms,
    dropMaxVolts: same ? null : max.fixedVolts,
    dropMaxOhms: same ? null : max.ohms,
    // Plans written before pulse widths were recorded trusted the peak for any surge; stored drivers
    // say "none given" instead, which judges surges against the continuous rating (the safer reading).
    peakPulseMs: d.peakPulseS === undefined || d.peakPulseS === null ? null : d.peakPulseS * 1000,
    packageWatts: d.packageWatts ?? null,
  };
}

/** The ratings a preset fills into a driver's stored fields. */
export function presetDriverValues(preset: DriverPreset) {
  return {
    channels: preset.channels,
    channelAmps: preset.channelAmps,
    channelPeakAmps: preset.channelPeakAmps,
    totalAmps: preset.totalAmps,
    ...storedDriverElectrics({ drop: preset.drop, peakPulseS: preset.peakPulseS, packageWatts: preset.packageWatts }),
  };
}
