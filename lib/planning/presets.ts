import type { Driver } from './schema';

/** A class of H-bridge motor driver, ready to become a plan's driver. */
export interface DriverPreset {
  id: string;
  /** Generic class name for the UI; the planner may type the part they actually use. */
  label: string;
  channels: number;
  /** Continuous current per channel, A. */
  channelAmps: number;
  /** Short-time current per channel, A; compared with a start-up surge. */
  channelPeakAmps: number;
  /** Rating for all channels together, A; null where the datasheet rates no total current. */
  totalAmps: number | null;
  /** Voltage lost across the bridge at the rated channel current, V. */
  dropVolts: number;
  /** Motor supply range, V; null where no minimum is stated. */
  minSupplyVolts: number | null;
  maxSupplyVolts: number;
  /** What the figures leave out, for the UI's help text. */
  note: string;
  /** The datasheet the figures come from. */
  source: string;
}

/** The five driver classes of the reference notes, with figures from their datasheets. */
export const DRIVER_PRESETS: readonly DriverPreset[] = [
  {
    id: 'bipolar-quad-half-h-1a',
    label: 'Bipolar quad half-H, 1 A class',
    // Four half-H outputs pair into two full bridges: one motor on each.
    channels: 2,
    channelAmps: 1.0,
    channelPeakAmps: 2.0,
    // The package is rated 2075 mW at 25 °C, not in amps: at 1 A per channel and a 2.6 V drop two
    // channels dissipate 2 × 2.6 W = 5.2 W, so full current on both needs copper or a heat sink.
    // How much depends on mounting, so no total is invented here; the note says so.
    totalAmps: null,
    // Drop at 1 A = high-side 1.4 V typ + low-side 1.2 V typ = 2.6 V (worst case 1.8 + 1.8 = 3.6 V).
    dropVolts: 2.6,
    minSupplyVolts: 4.5,
    maxSupplyVolts: 36,
    note:
      'Peak 2 A is non-repetitive, 5 ms at most. Absolute maximum 1.1 A per channel. Package dissipation 2075 mW at 25 °C: both channels at 1 A need heat sinking. Drop 2.6 V typical, 3.6 V worst case at 1 A; about 2.1 V at 0.5 A.',
    source: 'Texas Instruments datasheet SLRS007B, quadruple half-H driver',
  },
  {
    id: 'bipolar-dual-full-bridge-2a',
    label: 'Bipolar dual full-bridge module, 2 A class',
    channels: 2,
    channelAmps: 2.0,
    // The 2.5 A repetitive figure (10 ms on, 80 % duty) is the one a motor start lasts long enough to
    // meet; 3.0 A holds for 100 µs only.
    channelPeakAmps: 2.5,
    // Total dissipation is 25 W at Tcase 75 °C; both channels at 2 A with the 4.9 V worst-case drop
    // make 2 × 2 A × 4.9 V = 19.6 W, inside it, so the channel ratings are the binding limits.
    totalAmps: null,
    // Only the maximum drop at 2 A is given (4.9 V); planning on the worst case.
    dropVolts: 4.9,
    minSupplyVolts: null,
    maxSupplyVolts: 46,
    note:
      'Heat-sunk module. Drop 1.8–3.2 V at 1 A, up to 4.9 V at 2 A. Peak 3.0 A for 100 µs only. The two channels may be paralleled for 3 A.',
    source: 'STMicroelectronics dual full-bridge driver datasheet (Multiwatt15, January 2000)',
  },
  {
    id: 'mosfet-dual-low-voltage-1-2a',
    label: 'MOSFET dual, low voltage, 1.2 A class',
    channels: 2,
    channelAmps: 1.2,
    channelPeakAmps: 3.2,
    totalAmps: null,
    // 0.5 Ω high + low side at the rated 1.2 A: 1.2 A × 0.5 Ω = 0.6 V.
    dropVolts: 0.6,
    minSupplyVolts: 2.5,
    maxSupplyVolts: 13.5,
    note: '1.2 A is an average rating. Absolute maximum supply 15 V. Drop is resistive: current × 0.5 Ω.',
    source: 'Toshiba TB6612FNG datasheet (2014)',
  },
  {
    id: 'mosfet-single-high-current-3-6a',
    label: 'MOSFET single, high current, 3.6 A class',
    channels: 1,
    // The datasheet gives a 3.6 A peak and no continuous rating: sustained current is limited by
    // heat. 3.6 A is used for both figures; the note tells the planner to keep well below it.
    channelAmps: 3.6,
    channelPeakAmps: 3.6,
    totalAmps: null,
    // 0.565 Ω high + low side at 3.6 A: 3.6 A × 0.565 Ω = 2.034 V.
    dropVolts: 2.034,
    minSupplyVolts: 6.5,
    maxSupplyVolts: 45,
    note: 'No continuous rating: 3.6 A is the peak, and sustained current is thermally limited. Drop is resistive: current × 0.565 Ω.',
    source: 'Texas Instruments DRV8871 datasheet SLVSCY9B',
  },
  {
    id: 'mosfet-dual-very-low-voltage-1-5a',
    label: 'MOSFET dual, very low voltage, 1.5 A class',
    channels: 2,
    channelAmps: 1.5,
    channelPeakAmps: 2.0,
    totalAmps: null,
    // 0.36 Ω high + low side at the rated 1.5 A: 1.5 A × 0.36 Ω = 0.54 V.
    dropVolts: 0.54,
    minSupplyVolts: 2.7,
    maxSupplyVolts: 10.8,
    note: '1.5 A is an RMS rating. Drop is resistive: current × 0.36 Ω.',
    source: 'Texas Instruments DRV8833 datasheet',
  },
];

/** Finds a driver preset by id. */
export function findDriverPreset(id: string): DriverPreset | undefined {
  return DRIVER_PRESETS.find((preset) => preset.id === id);
}

/**
 * A plan driver with a preset's ratings. The name defaults to the preset's generic label.
 */
export function driverFromPreset(
  preset: DriverPreset,
  driver: { id: string; supplyId: string; name?: string },
): Driver {
  return {
    id: driver.id,
    name: driver.name ?? preset.label,
    supplyId: driver.supplyId,
    channels: preset.channels,
    channelAmps: preset.channelAmps,
    channelPeakAmps: preset.channelPeakAmps,
    totalAmps: preset.totalAmps,
    dropVolts: preset.dropVolts,
  };
}
