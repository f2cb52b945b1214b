import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { readCsv, toCsv } from '@/lib/layouts/csv';
import { sniffImageType } from '@/lib/layouts/image-type';
import { dutySpeeds, dutyTables, heaviest, powerBudget, trainLoads, type BudgetInput } from '@/lib/layouts/power-budget';
import { fromMm, LENGTH_UNITS, toMm } from '@/lib/layouts/units';
import { presetDriverValues } from '@/lib/layouts/driver-electrics';
import { DRIVER_PRESETS } from '@/lib/planning';
import { blockSchema, scaleIdOf } from '@/lib/validations/layout';

describe('length units', () => {
  it('converts with the exact inch and foot', () => {
    // International yard and pound agreement (1959): 1 in = 25.4 mm, 1 ft = 12 in = 304.8 mm.
    expect(toMm(1, 'in')).toBe(25.4);
    expect(toMm(1, 'ft')).toBe(304.8);
    expect(toMm(2.5, 'm')).toBe(2500);
    expect(toMm(12.5, 'cm')).toBe(125);
    expect(fromMm(609.6, 'ft')).toBe(2);
  });

  it('a length shown in any unit and typed back gives the same millimetres', () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 1_000_000_000 }), fc.constantFrom(...LENGTH_UNITS), (thousandths, unit) => {
        const mm = thousandths / 1000;
        expect(toMm(fromMm(mm, unit), unit)).toBe(mm);
      }),
      { numRuns: 2000 },
    );
  });

  it('the block schema stores mm and accepts a decimal comma', () => {
    expect(blockSchema.parse({ name: ' Loop ', length: '1,5', unit: 'M', position: '' })).toEqual({ name: 'Loop', lengthMm: 1500, positionMm: 0 });
  });
});

const QUAD = DRIVER_PRESETS.find((p) => p.id === 'bipolar-quad-half-h-1a')!; // TI SLRS007B
const SINGLE = DRIVER_PRESETS.find((p) => p.id === 'mosfet-single-high-current-3-6a')!; // TI DRV8871 SLVSCY9B

const layout = (over: Partial<BudgetInput> = {}): BudgetInput => ({
  scale: { name: 'H0 (NEM)', ratio: 87 },
  supplies: [{ id: 's', name: 'Bench', volts: 15, amps: 2 }],
  drivers: [{ id: 'd', name: 'Board', supplyId: 's', presetId: QUAD.id, partNumber: null, ...presetDriverValues(QUAD) }],
  cabs: [
    { id: 'c1', name: 'Cab 1', driverId: 'd', channel: 1 },
    { id: 'c2', name: 'Cab 2', driverId: 'd', channel: 2 },
  ],
  locomotives: [
    // Tank: start voltage not measured (full stall at start); Diesel: starts moving at 1.8 V.
    { id: 'l1', name: 'Tank', runningAmps: 0.5, stallAmps: 0.9, ratedVolts: 12, topSpeedKmh: 80, startVolts: null },
    { id: 'l2', name: 'Diesel', runningAmps: 0.4, stallAmps: 1, ratedVolts: 12, topSpeedKmh: 100, startVolts: 1.8 },
  ],
  trains: [
    { id: 't1', name: 'Stopper', locomotiveIds: ['l1'], lightingAmps: 0.09, lengthMm: 900 },
    { id: 't2', name: 'Double', locomotiveIds: ['l1', 'l2'], lightingAmps: 0, lengthMm: 1300 },
    { id: 't3', name: 'Light', locomotiveIds: ['l2'], lightingAmps: 0.02, lengthMm: 400 },
  ],
  ...over,
});

describe('power budget', () => {
  it('a train draws its locomotives plus lighting, running and at start', () => {
    const [stopper, double, light] = trainLoads(layout());
    // Coach lighting: three grain-of-rice bulbs ≈ 3 × 30 mA = 0.09 A (common practice).
    expect(stopper).toMatchObject({ runningAmps: 0.59, surgeAmps: 0.99, topSpeedKmh: 80 });
    // Derived: 0.5 + 0.4 = 0.9 A running. At start Tank draws its 0.9 A stall; Diesel, ramped, its
    // 1 A stall × 1.8 V / 12 V = 0.15 A, less than its 0.4 A running, so 0.4 A: 0.9 + 0.4 = 1.3 A.
    expect(double).toMatchObject({ runningAmps: 0.9, surgeAmps: 1.3, topSpeedKmh: 80 });
    expect(light).toMatchObject({ runningAmps: 0.42, surgeAmps: 0.42 });
  });

  it('the worst case takes one different train per cab, heaviest first', () => {
    const loads = trainLoads(layout());
    expect(heaviest(loads, 2, 'runningAmps')).toEqual({ amps: 1.49, terms: [{ trainName: 'Double', amps: 0.9 }, { trainName: 'Stopper', amps: 0.59 }] });
    expect(heaviest(loads, 5, 'runningAmps').terms).toHaveLength(3);
    expect(heaviest(loads, 0, 'runningAmps').amps).toBe(0);
  });

  it('supply: derated to 80 %, running against the derated figure, surge against the rating', () => {
    const [supply] = powerBudget(layout()).supplies;
    // Rule of thumb, the same 80 % as NEC 210.20(A): 2 A × 0.8 = 1.6 A.
    expect(supply).toMatchObject({ ratedAmps: 2, deratedAmps: 1.6, cabCount: 2 });
    expect(supply!.worstRunning.amps).toBe(1.49);
    expect(supply!.headroomAmps).toBeCloseTo(0.11, 9);
    // Surge takes the two highest start figures: Double 1.3 + Stopper 0.99 = 2.29 A > 2 A rating.
    expect(supply!.worstSurge).toEqual({ amps: 2.29, terms: [{ trainName: 'Double', amps: 1.3 }, { trainName: 'Stopper', amps: 0.99 }] });
    expect(supply!.status).toBe('over');
  });

  it('driver: surge against the continuous rating past the 5 ms peak, greatest drop at the heaviest train, heat (SLRS007B)', () => {
    const [driver] = powerBudget(layout()).drivers;
    expect(driver).toMatchObject({ channelRunning: { amps: 0.9 }, channelSurge: { amps: 1.3 }, surgeLimitAmps: 1, surgeJudgedContinuous: true });
    // SLRS007B: 2 A peak for at most 5 ms; a 2 s start is judged against the 1 A continuous rating.
    expect(driver!.messages.join(' ')).toMatch(/1\.3 A for its 2 s start, above the 1 A continuous rating: the 2 A peak holds for 5 ms only/);
    // Greatest drop at 0.9 A: 2.6 + 1.0 × 0.9 = 3.5 V (3.6 V worst case at 1 A, SLRS007B); 15 − 3.5 = 11.5 V,
    // below NEM 630 Table 1's 12 V for 16.5 mm gauge and NMRA S-9 I.A's 12 V at maximum anticipated load.
    expect(driver).toMatchObject({ dropVolts: 3.5, trackVolts: 11.5, nominalVolts: 12, gaugeMm: 16.5 });
    expect(driver!.messages.join(' ')).toMatch(/NEM 630 Table 1.*NMRA S-9 I\.A/);
    // Heat, one heaviest train per channel: typical (1.6 + 0.9) × 0.9 + (1.6 + 0.59) × 0.59 = 3.5421 W,
    // greatest (2.6 + 0.9) × 0.9 + (2.6 + 0.59) × 0.59 = 5.0321 W; both above 2075 mW at 25 °C (SLRS007B).
    expect(driver!.heatLowWatts).toBeCloseTo(3.5421, 9);
    expect(driver!.heatHighWatts).toBeCloseTo(5.0321, 9);
    expect(driver!.messages.join(' ')).toMatch(/about 3\.54 W to 5\.03 W, above its 2\.08 W package rating/);
    expect(driver!.status).toBe('over');
    expect(driver!.preset).toMatchObject({ source: expect.stringContaining('Texas Instruments datasheet SLRS007B'), edited: false });
  });

  it('driver: one light train on a 1 A-class channel stays within every rating (SLRS007B)', () => {
    const one = layout({ cabs: [{ id: 'c1', name: 'Cab 1', driverId: 'd', channel: 1 }], trains: [layout().trains[2]!], supplies: [{ id: 's', name: 'Bench', volts: 16, amps: 2 }] });
    const driver = powerBudget(one).drivers[0]!;
    // 0.42 A: greatest drop 2.6 + 0.42 = 3.02 V, 16 − 3.02 = 12.98 V ≥ 12 V; heat (2.6 + 0.42) × 0.42 = 1.27 W < 2.075 W.
    expect(driver.trackVolts).toBeCloseTo(12.98, 9);
    expect(driver.heatHighWatts).toBeCloseTo(3.02 * 0.42, 9);
    expect(driver).toMatchObject({ status: 'ok', messages: [] });
  });

  it('driver: warns when the supply is below the class minimum (SLRS007B: 4.5 V motor supply)', () => {
    const low = powerBudget(layout({ supplies: [{ id: 's', name: 'Cell pack', volts: 4, amps: 2 }] })).drivers[0]!;
    expect(low.status).not.toBe('ok');
    expect(low.messages.join(' ')).toMatch(/Supply 4 V is below the 4\.5 V motor-supply minimum of this driver class/);
    const atMinimum = powerBudget(layout({ supplies: [{ id: 's', name: 'Cell pack', volts: 4.5, amps: 2 }] })).drivers[0]!;
    expect(atMinimum.messages.join(' ')).not.toMatch(/motor-supply minimum/);
  });

  it('driver: the total rating is compared with every cab surging at once, not with the running current', () => {
    // Total 2 A: running 0.9 + 0.59 = 1.49 A fits, the surge 1.3 + 0.99 = 2.29 A does not (common practice:
    // all trains may start together after a stop).
    const capped = layout({ drivers: [{ ...layout().drivers[0]!, totalAmps: 2 }] });
    const driver = powerBudget(capped).drivers[0]!;
    expect(driver.worstRunning.amps).toBeLessThan(2);
    expect(driver.messages.join(' ')).toMatch(/All cabs at once could surge to 2\.29 A, above the driver's 2 A total rating/);
    const roomy = powerBudget(layout({ drivers: [{ ...layout().drivers[0]!, totalAmps: 2.29 }] })).drivers[0]!;
    expect(roomy.messages.join(' ')).not.toMatch(/total rating/);
  });

  it('flags a channel overload and a supply above the driver class maximum', () => {
    const heavy = layout({
      supplies: [{ id: 's', name: 'Big', volts: 15, amps: 10 }],
      drivers: [{ ...layout().drivers[0]!, presetId: 'mosfet-dual-low-voltage-1-2a', channelAmps: 0.8, channelPeakAmps: 3.2, dropVolts: 0.6 }],
    });
    const driver = powerBudget(heavy).drivers[0]!;
    expect(driver.status).toBe('over');
    expect(driver.messages.join(' ')).toMatch(/0\.9 A running, above the 0\.8 A continuous/);
    // Toshiba TB6612FNG datasheet: motor supply up to 13.5 V; 15 V is above it.
    expect(driver.messages.join(' ')).toMatch(/above the 13\.5 V motor-supply maximum/);
    expect(driver.preset?.edited).toBe(true);
  });

  it('every preset keeps its source and note for the page', () => {
    for (const p of DRIVER_PRESETS) {
      expect(p.source.length).toBeGreaterThan(10);
      expect(p.note.length).toBeGreaterThan(10);
      // Labels are generic classes, never part numbers.
      expect(p.label).not.toMatch(/\d{3,}|[A-Z]{2,}\d/);
    }
  });
});

describe('duty tables', () => {
  it('a quarter, half, three quarters and all of the top speed', () => {
    expect(dutySpeeds(80)).toEqual([20, 40, 60, 80]);
    expect(dutySpeeds(2)).toEqual([1, 2]);
  });

  it('uses the calibrated model with the greatest drop at the train current, and names the locomotive a mixed consist waits for', () => {
    const [stopper, double] = dutyTables(layout());
    // Stopper draws 0.59 A: greatest drop 2.6 + 0.59 = 3.19 V (SLRS007B fit), so the rails get 11.81 V.
    expect(stopper!.cabs[0]!.trackVolts).toBeCloseTo(15 - 3.19, 9);
    // 40 of 80 km/h with no start voltage needs 12 V × 40/80 = 6 V on average: duty 6 / 11.81 = 0.508
    // (PWM average = duty × voltage), 8-bit round(129.55) = 130.
    expect(stopper!.speeds).toEqual([20, 40, 60, 80]);
    expect(stopper!.rows[1]![0]).toMatchObject({ ok: true, pwm8: 130 });
    expect(stopper!.rows[1]![0]!.duty).toBeCloseTo(6 / 11.81, 9);
    // Top speed needs the full 12 V rated, more than 11.81 V.
    expect(stopper!.rows[3]![0]).toMatchObject({ ok: false });
    expect(stopper!.rows[3]![0]!.note).toMatch(/needs 12 V on average but the track gets at most 11.81 V/);
    // Double: Tank needs 6 V for 40 km/h, Diesel 1.8 + 10.2 × 40/100 = 5.88 V; the cab must give Tank's.
    expect(double!.rows[1]![0]).toMatchObject({ ok: true, note: 'set by Tank' });
  });

  it('DRV8871 SLVSCY9B at 12 V: a 0.45 A H0 train gets 12 − 0.45 × 0.565 = 11.75 V, not 9.97 V', () => {
    const single = layout({
      supplies: [{ id: 's', name: 'Bench', volts: 12, amps: 5 }],
      drivers: [{ id: 'd', name: 'Board', supplyId: 's', presetId: SINGLE.id, partNumber: null, ...presetDriverValues(SINGLE) }],
      cabs: [{ id: 'c1', name: 'Cab 1', driverId: 'd', channel: 1 }],
      locomotives: [{ id: 'l1', name: 'H0 loco', runningAmps: 0.45, stallAmps: 0.9, ratedVolts: 12, topSpeedKmh: 100, startVolts: 2 }],
      trains: [{ id: 't1', name: 'Local', locomotiveIds: ['l1'], lightingAmps: 0, lengthMm: 900 }],
    });
    const [table] = dutyTables(single);
    expect(table!.cabs[0]!.trackVolts).toBeCloseTo(12 - 0.45 * 0.565, 9);
    // 75 of 100 km/h: 2 + 10 × 0.75 = 9.5 V, reachable on 11.75 V.
    expect(table!.rows[2]![0]).toMatchObject({ ok: true });
    expect(powerBudget(single).drivers[0]!.trackVolts).toBeCloseTo(11.74575, 9);
  });
});

describe('CSV reading', () => {
  it('round-trips quoted names with commas and quotes', () => {
    const text = toCsv('locomotives', [{ name: 'No. 7, "Heron"', running_amps: 0.35, stall_amps: 0.9, rated_volts: 12, top_speed_kmh: 80 }]);
    expect(text).toBe('name,running_amps,stall_amps,rated_volts,top_speed_kmh,start_volts\r\n"No. 7, ""Heron""",0.35,0.9,12,80,');
    const { records, issues } = readCsv('locomotives', text);
    expect(issues).toEqual([]);
    expect(records).toEqual([{ row: 2, cells: { name: 'No. 7, "Heron"', running_amps: '0.35', stall_amps: '0.9', rated_volts: '12', top_speed_kmh: '80', start_volts: '' } }]);
  });

  it('counts rows as a spreadsheet does and reports ragged rows', () => {
    const { records, issues } = readCsv('links', '\uFEFFBlock_A,block_b\n\nA,B\nC\n');
    expect(records.map((r) => r.row)).toEqual([3, 4]);
    expect(issues).toEqual([{ row: 4, column: '', message: 'This row has 1 cells; the header has 2.' }]);
  });

  it('an empty file says what the header must be', () => {
    expect(readCsv('blocks', '').issues[0]?.message).toMatch(/first row must name the columns: name, length, unit, position/);
  });
});

describe('image sniffing', () => {
  it('recognises PNG, JPEG and WebP by signature and nothing else', () => {
    // PNG specification 5.2: 89 50 4E 47 0D 0A 1A 0A.
    expect(sniffImageType(Uint8Array.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0]))).toBe('image/png');
    // JPEG SOI FF D8 followed by a marker FF (ISO/IEC 10918-1).
    expect(sniffImageType(Uint8Array.from([0xff, 0xd8, 0xff, 0xe0]))).toBe('image/jpeg');
    // WebP container: "RIFF", 4-byte size, "WEBP".
    expect(sniffImageType(new TextEncoder().encode('RIFF\u0000\u0000\u0000\u0000WEBPVP8 '))).toBe('image/webp');
    expect(sniffImageType(new TextEncoder().encode('RIFF\u0000\u0000\u0000\u0000WAVEfmt '))).toBeNull();
    expect(sniffImageType(new TextEncoder().encode('GIF89a'))).toBeNull();
    expect(sniffImageType(new TextEncoder().encode('<svg></svg>'))).toBeNull();
    expect(sniffImageType(new Uint8Array())).toBeNull();
  });
});

describe('scale of a stored layout', () => {
  it('finds the table row by label, or by name and ratio for older rows, else custom', () => {
    expect(scaleIdOf({ scaleName: 'HO (NMRA)', scaleRatio: 87.1 })).toBe('ho-nmra');
    expect(scaleIdOf({ scaleName: 'IIm', scaleRatio: 22.5 })).toBe('iim-nem');
    expect(scaleIdOf({ scaleName: 'Sn3', scaleRatio: 64 })).toBe('custom');
  });
});
