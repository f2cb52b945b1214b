// Every row of the scale table and every driver preset, pinned by value against the published source
// named beside it (see /work/shared/DOMAIN.md). The expected figures are written here, never read
// from the modules under test. The modules are loaded again inside each test (vi.resetModules, then
// import): their tables are built when the module is evaluated, and a module imported at the top of
// this file would be built before a mutation test run switches a change on (Stryker's Vitest runner
// does that in a beforeAll).
import { beforeEach, describe, expect, it, vi } from 'vitest';

type Scales = typeof import('@/lib/planning/scales');
type Presets = typeof import('@/lib/planning/presets');
let scales: Scales;
let presets: Presets;

beforeEach(async () => {
  vi.resetModules();
  scales = await import('@/lib/planning/scales');
  presets = await import('@/lib/planning/presets');
});

const NEM = 'NEM 010 (MOROP, 2011), Table 1';

/** id, name, label, standard, ratio (1:n), gauge mm, source text the row must carry. */
const EXPECTED_SCALES = [
  ['z-nem', 'Z', 'Z (NEM)', 'NEM', 220, 6.5, NEM], // NEM 010 Table 1: Z 1:220, 6.5 mm
  ['n-nem', 'N', 'N (NEM)', 'NEM', 160, 9, NEM], // NEM 010 Table 1: N 1:160, 9 mm
  ['n-nmra', 'N', 'N (NMRA)', 'NMRA', 160, 9, 'NMRA S-1.2'], // NMRA S-1.2: N 1:160, 9 mm
  ['tt-nem', 'TT', 'TT (NEM)', 'NEM', 120, 12, NEM], // NEM 010 Table 1: TT 1:120, 12 mm
  ['tt-nmra', 'TT', 'TT (NMRA)', 'NMRA', 120, 12, 'NMRA S-1.2'], // NMRA S-1.2: TT 1:120, 12 mm
  ['h0-nem', 'H0', 'H0 (NEM)', 'NEM', 87, 16.5, NEM], // NEM 010 Table 1: H0 1:87, 16.5 mm
  ['ho-nmra', 'HO', 'HO (NMRA)', 'NMRA', 87.1, 16.5, 'NMRA S-1.2 (3.5 mm to the foot)'], // NMRA S-1.2: 3.5 mm/ft = 304.8 / 3.5 = 1:87.1
  // NEM 010 §3.4 names 4 mm scale 1:76; 4 mm to the foot is 304.8 / 4 = 1:76.2 (common practice).
  ['oo-nem', 'OO', 'OO (4 mm scale)', 'NEM', 76.2, 16.5, 'NEM 010 §3.4 names 4 mm scale 1:76; 1:76.2 (4 mm to the foot) is common practice'],
  ['s-nem', 'S', 'S (NEM)', 'NEM', 64, 22.5, NEM], // NEM 010 Table 1: S 1:64, 22.5 mm
  // NMRA S-1.2: S 1:64; gauge 56.5 in × 25.4 mm / 64 = 22.42 mm, entered as 22.4.
  ['s-nmra', 'S', 'S (NMRA)', 'NMRA', 64, 22.4, 'NMRA S-1.2; gauge derived: 56.5 in × 25.4 mm / 64 = 22.4 mm'],
  ['0-nem', '0', '0 (NEM)', 'NEM', 45, 32, NEM], // NEM 010 Table 1: 0 1:45, 32 mm
  ['o-nmra', 'O', 'O (NMRA)', 'NMRA', 48, 31.75, 'NMRA S-1.2'], // NMRA S-1.2: O 1:48, 1.25 in = 31.75 mm
  ['i-nem', 'I', 'I (NEM)', 'NEM', 32, 45, NEM], // NEM 010 Table 1: I 1:32, 45 mm
  ['iim-nem', 'IIm', 'IIm (large scale, metre gauge on 45 mm track)', 'NEM', 22.5, 45, NEM], // NEM 010 Table 1: IIm 1:22.5, 45 mm
] as const;

describe('scale table (NEM 010 Table 1, NMRA S-1.2)', () => {
  it('holds exactly the published rows, in decreasing ratio', () => {
    expect(scales.SCALES.map((s) => s.id)).toEqual(EXPECTED_SCALES.map((row) => row[0]));
  });

  it.each(EXPECTED_SCALES)('%s: name, label, standard, ratio, gauge and source', (id, name, label, standard, ratio, gaugeMm, source) => {
    const row = scales.SCALES.find((s) => s.id === id);
    expect(row).toEqual({ id, name, label, standard, ratio, gaugeMm, source });
  });

  it("a scale's gauge stands for its prototype's standard gauge, 1435 mm, within 15 % (OO's 16.5 mm is 12 % under 1435 / 76.2; IIm models metre gauge)", () => {
    // 1435 mm / ratio: H0 16.49, N 8.97, Z 6.52, TT 11.96. IIm models 1000 mm track: 1000 / 22.5 = 44.4.
    for (const [id, , , , ratio, gaugeMm] of EXPECTED_SCALES) {
      const prototype = id === 'iim-nem' ? 1000 : 1435;
      const row = scales.SCALES.find((s) => s.id === id);
      expect(Math.abs((row?.gaugeMm ?? 0) - prototype / ratio) / (prototype / ratio), id).toBeLessThan(0.15);
      expect(row?.gaugeMm).toBe(gaugeMm);
    }
  });
});

describe('findScale', () => {
  it('finds by id, ignoring case and spaces around it', () => {
    expect(scales.findScale('n-nmra')?.label).toBe('N (NMRA)');
    expect(scales.findScale('  Z-NEM ')?.ratio).toBe(220);
  });

  it('finds by name: a name two standards share gives the NEM row, listed first', () => {
    expect(scales.findScale('N')?.id).toBe('n-nem');
    expect(scales.findScale(' h0 ')?.id).toBe('h0-nem');
    expect(scales.findScale('ho')?.id).toBe('ho-nmra');
  });

  it('finds by label, and nothing for an unknown key', () => {
    expect(scales.findScale('OO (4 mm scale)')?.id).toBe('oo-nem');
    expect(scales.findScale('s (nmra)')?.gaugeMm).toBe(22.4);
    expect(scales.findScale('G')).toBeUndefined();
    expect(scales.findScale('')).toBeUndefined();
  });
});

describe('gaugeForScale', () => {
  it('goes by name first, whatever the ratio says', () => {
    // NEM 010: H0 runs on 16.5 mm track; the ratio 1:1 matches no row.
    expect(scales.gaugeForScale({ name: 'H0', ratio: 1 })).toBe(16.5);
    expect(scales.gaugeForScale({ name: 'S (NMRA)', ratio: 64 })).toBe(22.4);
  });

  it('else by a ratio within 1 %: 1:87.5 is H0 (0.6 % off), 1:161 is N (0.6 % off)', () => {
    expect(scales.gaugeForScale({ name: 'My layout', ratio: 87.5 })).toBe(16.5);
    expect(scales.gaugeForScale({ name: 'My layout', ratio: 161 })).toBe(9);
    expect(scales.gaugeForScale({ name: 'My layout', ratio: 31.8 })).toBe(45); // 1:32, 0.6 % off
  });

  it('a ratio shared by two rows gives the first, NEM 22.5 mm for 1:64', () => {
    expect(scales.gaugeForScale({ name: 'My layout', ratio: 64 })).toBe(22.5);
    // Near but not on the shared ratio both rows are equally far off, so the first still wins.
    expect(scales.gaugeForScale({ name: 'My layout', ratio: 64.3 })).toBe(22.5);
    expect(scales.gaugeForScale({ name: 'My layout', ratio: 63.7 })).toBe(22.5);
  });

  it('null just past 1 % and far from every row', () => {
    expect(scales.gaugeForScale({ name: 'My layout', ratio: 162 })).toBeNull(); // 1.25 % off 1:160
    expect(scales.gaugeForScale({ name: 'My layout', ratio: 100 })).toBeNull();
    expect(scales.gaugeForScale({ name: 'My layout', ratio: 1000 })).toBeNull();
  });
});

/** Each preset's figures, from the datasheet named beside it (DOMAIN.md, driver table). */
const EXPECTED_PRESETS = [
  {
    // Texas Instruments SLRS007B, quadruple half-H driver: 1 A per output, 2 A non-repetitive for
    // ≤ 5 ms, 4.5–36 V, 2075 mW at 25 °C (DIP-16); four half-H outputs = two full bridges.
    id: 'bipolar-quad-half-h-1a',
    label: 'Bipolar quad half-H, 1 A class',
    channels: 2, channelAmps: 1.0, channelPeakAmps: 2.0, peakPulseS: 0.005, totalAmps: null,
    // Drop line through 2.1 V at 0.5 A and 2.6 V at 1 A (typical): 1.6 V + 1.0 Ω × I; worst case
    // 3.6 V at 1 A (1.8 + 1.8): 2.6 V + 1.0 Ω × I.
    drop: { min: { fixedVolts: 1.6, ohms: 1.0 }, max: { fixedVolts: 2.6, ohms: 1.0 } },
    packageWatts: 2.075, minSupplyVolts: 4.5, maxSupplyVolts: 36,
    checks: [[0.5, 2.1, 3.1], [1, 2.6, 3.6]], noteHas: ['5 ms', '1.1 A', '2075 mW'], sourceHas: 'SLRS007B',
  },
  {
    // STMicroelectronics dual full-bridge (Multiwatt15, Jan 2000): 2 A DC, 2.5 A repetitive (10 ms),
    // up to 46 V, 25 W at Tcase 75 °C; drop 1.8 min – 3.2 V max at 1 A, up to 4.9 V at 2 A.
    id: 'bipolar-dual-full-bridge-2a',
    label: 'Bipolar dual full-bridge module, 2 A class',
    channels: 2, channelAmps: 2.0, channelPeakAmps: 2.5, peakPulseS: 0.01, totalAmps: null,
    drop: { min: { fixedVolts: 0.84, ohms: 0.96 }, max: { fixedVolts: 1.5, ohms: 1.7 } },
    packageWatts: 25, minSupplyVolts: null, maxSupplyVolts: 46,
    checks: [[1, 1.8, 3.2], [2, 2.76, 4.9]], noteHas: ['1.8–3.2 V', '4.9 V', '3 A'], sourceHas: 'Multiwatt15',
  },
  {
    // Toshiba TB6612FNG (2014): 1.2 A average, 3.2 A single 10 ms pulse, 2.5–13.5 V, 0.5 Ω high + low.
    id: 'mosfet-dual-low-voltage-1-2a',
    label: 'MOSFET dual, low voltage, 1.2 A class',
    channels: 2, channelAmps: 1.2, channelPeakAmps: 3.2, peakPulseS: 0.01, totalAmps: null,
    drop: { min: { fixedVolts: 0, ohms: 0.5 }, max: { fixedVolts: 0, ohms: 0.5 } },
    packageWatts: null, minSupplyVolts: 2.5, maxSupplyVolts: 13.5,
    checks: [[1, 0.5, 0.5]], noteHas: ['10 ms', '15 V', '0.5 Ω'], sourceHas: 'TB6612FNG',
  },
  {
    // Texas Instruments DRV8871 SLVSCY9B: one bridge, 3.6 A current limit, 6.5–45 V, 0.565 Ω high +
    // low. Continuous derived: (150 − 25) °C / 40 °C/W ≈ 3.1 W; √(3.1 / (1.5 × 0.565)) ≈ 1.9 A.
    id: 'mosfet-single-high-current-3-6a',
    label: 'MOSFET single, high current, 3.6 A class',
    channels: 1, channelAmps: 1.9, channelPeakAmps: 3.6, peakPulseS: null, totalAmps: null,
    drop: { min: { fixedVolts: 0, ohms: 0.565 }, max: { fixedVolts: 0, ohms: 0.565 } },
    packageWatts: 3.1, minSupplyVolts: 6.5, maxSupplyVolts: 45,
    checks: [[1, 0.565, 0.565]], noteHas: ['1.9 A', '0.565 Ω'], sourceHas: 'DRV8871',
  },
  {
    // Texas Instruments DRV8833: 1.5 A RMS, 2 A peak per bridge, 2.7–10.8 V, 0.36 Ω high + low.
    id: 'mosfet-dual-very-low-voltage-1-5a',
    label: 'MOSFET dual, very low voltage, 1.5 A class',
    channels: 2, channelAmps: 1.5, channelPeakAmps: 2.0, peakPulseS: null, totalAmps: null,
    drop: { min: { fixedVolts: 0, ohms: 0.36 }, max: { fixedVolts: 0, ohms: 0.36 } },
    packageWatts: null, minSupplyVolts: 2.7, maxSupplyVolts: 10.8,
    checks: [[1, 0.36, 0.36]], noteHas: ['1.5 A', '0.36 Ω'], sourceHas: 'DRV8833',
  },
] as const;

describe('driver presets (datasheets named in DOMAIN.md)', () => {
  it('holds exactly the five classes, in order', () => {
    expect(presets.DRIVER_PRESETS.map((p) => p.id)).toEqual(EXPECTED_PRESETS.map((p) => p.id));
  });

  it.each(EXPECTED_PRESETS)('$id: every rating by value', (expected) => {
    const preset = presets.findDriverPreset(expected.id);
    if (preset === undefined) throw new Error(`no preset ${expected.id}`);
    const { checks: _checks, noteHas: _noteHas, sourceHas: _sourceHas, ...values } = expected;
    const { note: _note, source: _source, ...actual } = preset;
    expect(actual).toEqual(values);
  });

  it.each(EXPECTED_PRESETS)('$id: the drop lines meet the datasheet\'s figures at the currents it gives', (expected) => {
    const preset = presets.findDriverPreset(expected.id);
    if (preset === undefined) throw new Error(`no preset ${expected.id}`);
    for (const [amps, least, most] of expected.checks) {
      expect(preset.drop.min.fixedVolts + preset.drop.min.ohms * amps).toBeCloseTo(least, 2);
      expect(preset.drop.max.fixedVolts + preset.drop.max.ohms * amps).toBeCloseTo(most, 2);
    }
  });

  it.each(EXPECTED_PRESETS)('$id: physically consistent ratings', (expected) => {
    const preset = presets.findDriverPreset(expected.id);
    if (preset === undefined) throw new Error(`no preset ${expected.id}`);
    expect(preset.channels).toBeGreaterThanOrEqual(1);
    expect(preset.channelAmps).toBeGreaterThan(0);
    // A short-time rating is above the continuous one.
    expect(preset.channelPeakAmps).toBeGreaterThan(preset.channelAmps);
    // The least drop is never above the most, at any current.
    expect(preset.drop.min.fixedVolts).toBeLessThanOrEqual(preset.drop.max.fixedVolts);
    expect(preset.drop.min.ohms).toBeLessThanOrEqual(preset.drop.max.ohms);
    if (preset.minSupplyVolts !== null) expect(preset.minSupplyVolts).toBeLessThan(preset.maxSupplyVolts);
    // The drop at the continuous rating stays below the highest supply.
    expect(preset.drop.max.fixedVolts + preset.drop.max.ohms * preset.channelAmps).toBeLessThan(preset.maxSupplyVolts);
  });

  it.each(EXPECTED_PRESETS)('$id: help text and source name the datasheet\'s figures', (expected) => {
    const preset = presets.findDriverPreset(expected.id);
    for (const part of expected.noteHas) expect(preset?.note).toContain(part);
    expect(preset?.source).toContain(expected.sourceHas);
  });

  it('findDriverPreset: nothing for an unknown id', () => {
    expect(presets.findDriverPreset('no-such-driver')).toBeUndefined();
    expect(presets.findDriverPreset('')).toBeUndefined();
  });

  it('driverFromPreset copies the ratings; the name defaults to the class label', () => {
    const preset = presets.findDriverPreset('mosfet-dual-low-voltage-1-2a');
    if (preset === undefined) throw new Error('no preset');
    expect(presets.driverFromPreset(preset, { id: 'd1', supplyId: 's1' })).toEqual({
      id: 'd1', name: 'MOSFET dual, low voltage, 1.2 A class', supplyId: 's1',
      channels: 2, channelAmps: 1.2, channelPeakAmps: 3.2, totalAmps: null,
      drop: { min: { fixedVolts: 0, ohms: 0.5 }, max: { fixedVolts: 0, ohms: 0.5 } },
      peakPulseS: 0.01, packageWatts: null,
    });
    expect(presets.driverFromPreset(preset, { id: 'd2', supplyId: 's1', name: 'Yard bridge' }).name).toBe('Yard bridge');
  });
});
