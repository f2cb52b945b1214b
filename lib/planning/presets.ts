import type { DriverDrop } from './electrics';
import type { Driver } from './schema';

/** A class of H-bridge motor driver, ready to become a plan's driver. */
export interface DriverPreset {
  id: string;
  /** Generic class name for the UI; the planner may type the part they actually use. */
  label: string;
  channels: number;
  /** Continuous current per channel, A. */
  channelAmps: number;
  /** Short-time current per channel, A; holds for peakPulseS only. */
  channelPeakAmps: number;
  /** How long the peak holds, s; null where the datasheet gives no pulse width. */
  peakPulseS: number | null;
  /** Rating for all channels together, A; null where the datasheet rates no total current. */
  totalAmps: number | null;
  /** The bridge's drop against current (see DriverDrop), fitted to the datasheet's figures. */
  drop: DriverDrop;
  /** What the package may dissipate, W; null where no figure is entered (heat then is not checked). */
  packageWatts: number | null;
  /** Motor supply range, V; null where no minimum is stated. */
  minSupplyVolts: number | null;
  maxSupplyVolts: number;
  /** What the figures leave out, for the UI's help text. */
  note: string;
  /** The datasheet the figures come from, and how derived figures were made. */
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
    // 2 A non-repetitive, for at most 5 ms.
    channelPeakAmps: 2.0,
    peakPulseS: 0.005,
    totalAmps: null,
    // Typical drop (high-side + low-side) 2.1 V at 0.5 A and 2.6 V at 1 A: the line through both is
    // 1.6 V + 1.0 Ω × I. No minimum is published, so the typical line is the least. The worst case
    // at 1 A is 1.8 + 1.8 = 3.6 V: the same slope raised to meet it gives 2.6 V + 1.0 Ω × I.
    drop: { min: { fixedVolts: 1.6, ohms: 1.0 }, max: { fixedVolts: 2.6, ohms: 1.0 } },
    // 2075 mW at 25 °C free air (DIP-16).
    packageWatts: 2.075,
    minSupplyVolts: 4.5,
    maxSupplyVolts: 36,
    note:
      'Peak 2 A is non-repetitive, 5 ms at most: a longer start-up surge is judged against the 1 A continuous rating. Absolute maximum 1.1 A per channel. Package dissipation 2075 mW at 25 °C: two channels at 0.5 A already reach it. No internal clamp diodes: add flyback diodes.',
    source:
      'Texas Instruments datasheet SLRS007B, quadruple half-H driver. Drop line fitted through 2.1 V at 0.5 A and 2.6 V at 1 A (typical); worst case 3.6 V at 1 A',
  },
  {
    id: 'bipolar-dual-full-bridge-2a',
    label: 'Bipolar dual full-bridge module, 2 A class',
    channels: 2,
    channelAmps: 2.0,
    // 2.5 A repetitive, 10 ms on at 80 % off; 3.0 A holds for 100 µs only.
    channelPeakAmps: 2.5,
    peakPulseS: 0.01,
    totalAmps: null,
    // Total drop at most 3.2 V at 1 A and 4.9 V at 2 A: the line through both is 1.5 V + 1.7 Ω × I.
    // At least 1.8 V at 1 A, 1.8 / 3.2 of the maximum; the same share at every current gives
    // 0.84 V + 0.96 Ω × I.
    drop: { min: { fixedVolts: 0.84, ohms: 0.96 }, max: { fixedVolts: 1.5, ohms: 1.7 } },
    // Total dissipation 25 W at Tcase 75 °C, with the heat sink the module has.
    packageWatts: 25,
    minSupplyVolts: null,
    maxSupplyVolts: 46,
    note:
      'Heat-sunk module. Drop 1.8–3.2 V at 1 A, up to 4.9 V at 2 A. Peak 2.5 A for 10 ms (repetitive), 3.0 A for 100 µs: a longer start-up surge is judged against 2 A. The two channels may be paralleled for 3 A.',
    source:
      'STMicroelectronics dual full-bridge driver datasheet (Multiwatt15, January 2000). Maximum drop line through 3.2 V at 1 A and 4.9 V at 2 A; minimum line scaled to 1.8 V at 1 A',
  },
  {
    id: 'mosfet-dual-low-voltage-1-2a',
    label: 'MOSFET dual, low voltage, 1.2 A class',
    channels: 2,
    channelAmps: 1.2,
    // Absolute maximum 3.2 A for a single 10 ms pulse.
    channelPeakAmps: 3.2,
    peakPulseS: 0.01,
    totalAmps: null,
    // 0.5 Ω high + low side (typical, motor supply ≥ 5 V): drop = I × 0.5 Ω.
    drop: { min: { fixedVolts: 0, ohms: 0.5 }, max: { fixedVolts: 0, ohms: 0.5 } },
    packageWatts: null,
    minSupplyVolts: 2.5,
    maxSupplyVolts: 13.5,
    note:
      '1.2 A is an average rating; the 3.2 A peak holds for a single 10 ms pulse. Absolute maximum supply 15 V. Drop is resistive: current × 0.5 Ω. Dissipation depends on the board: no package figure is entered, so heat is shown but not checked.',
    source: 'Toshiba TB6612FNG datasheet (2014): 0.5 Ω upper + lower on-resistance; peak 3.2 A (tw = 10 ms, single pulse)',
  },
  {
    id: 'mosfet-single-high-current-3-6a',
    label: 'MOSFET single, high current, 3.6 A class',
    channels: 1,
    // No continuous rating is given; heat sets it. Derived: a 150 °C junction over 25 °C air through
    // about 40 °C/W (the package's junction-to-ambient resistance on the standard test board) allows
    // (150 − 25) / 40 ≈ 3.1 W; on-resistance near 150 °C is about 1.5 × the 0.565 Ω at 25 °C
    // (common practice for power MOSFETs), ≈ 0.85 Ω, so √(3.1 W / 0.85 Ω) ≈ 1.9 A.
    channelAmps: 1.9,
    // 3.6 A is the current limit, with no pulse width: a surge is judged against the 1.9 A.
    channelPeakAmps: 3.6,
    peakPulseS: null,
    totalAmps: null,
    // 0.565 Ω high + low side: drop = I × 0.565 Ω.
    drop: { min: { fixedVolts: 0, ohms: 0.565 }, max: { fixedVolts: 0, ohms: 0.565 } },
    packageWatts: 3.1,
    minSupplyVolts: 6.5,
    maxSupplyVolts: 45,
    note:
      '3.6 A is a current limit, not a continuous rating: 1.9 A continuous is derived from the thermal figures (see source), and start-up surges are judged against it. Needs its exposed pad soldered to copper. Drop is resistive: current × 0.565 Ω.',
    source:
      'Texas Instruments DRV8871 datasheet SLVSCY9B: 0.565 Ω high + low side, 3.6 A peak. Continuous 1.9 A derived: (150 °C − 25 °C) / ≈ 40 °C/W ≈ 3.1 W; √(3.1 W / (1.5 × 0.565 Ω)) ≈ 1.9 A',
  },
  {
    id: 'mosfet-dual-very-low-voltage-1-5a',
    label: 'MOSFET dual, very low voltage, 1.5 A class',
    channels: 2,
    channelAmps: 1.5,
    // 2 A peak per bridge, with no pulse width: a surge is judged against the 1.5 A.
    channelPeakAmps: 2.0,
    peakPulseS: null,
    totalAmps: null,
    // 0.36 Ω high + low side: drop = I × 0.36 Ω.
    drop: { min: { fixedVolts: 0, ohms: 0.36 }, max: { fixedVolts: 0, ohms: 0.36 } },
    packageWatts: null,
    minSupplyVolts: 2.7,
    maxSupplyVolts: 10.8,
    note:
      '1.5 A is an RMS rating at 25 °C and 5 V; the 2 A peak has no pulse width, so start-up surges are judged against 1.5 A. Drop is resistive: current × 0.36 Ω. No package figure is entered, so heat is shown but not checked.',
    source: 'Texas Instruments DRV8833 datasheet: 0.36 Ω high + low side, 1.5 A RMS and 2 A peak per H-bridge',
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
    drop: preset.drop,
    peakPulseS: preset.peakPulseS,
    packageWatts: preset.packageWatts,
  };
}
