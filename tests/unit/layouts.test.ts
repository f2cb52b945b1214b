import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { readCsv, toCsv } from '@/lib/layouts/csv';
import { sniffImageType } from '@/lib/layouts/image-type';
import { dutySpeeds, dutyTables, heaviest, powerBudget, trainLoads, type BudgetInput } from '@/lib/layouts/power-budget';
import { fromMm, LENGTH_UNITS, toMm } from '@/lib/layouts/units';
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

const layout = (over: Partial<BudgetInput> = {}): BudgetInput => ({
  scale: { name: 'H0 (NEM)', ratio: 87 },
  supplies: [{ id: 's', name: 'Bench', volts: 15, amps: 2 }],
  drivers: [
    { id: 'd', name: 'Board', supplyId: 's', presetId: 'bipolar-quad-half-h-1a', partNumber: null, channels: 2, channelAmps: 1, channelPeakAmps: 2, totalAmps: null, dropVolts: 2.6 },
  ],
  cabs: [
    { id: 'c1', name: 'Cab 1', driverId: 'd', channel: 1 },
    { id: 'c2', name: 'Cab 2', driverId: 'd', channel: 2 },
  ],
  locomotives: [
    { id: 'l1', name: 'Tank', runningAmps: 0.5, stallAmps: 0.9, ratedVolts: 12, topSpeedKmh: 80 },
    { id: 'l2', name: 'Diesel', runningAmps: 0.4, stallAmps: 1, ratedVolts: 12, topSpeedKmh: 100 },
  ],
  trains: [
    { id: 't1', name: 'Stopper', locomotiveIds: ['l1'], lightingAmps: 0.09, lengthMm: 900 },
    { id: 't2', name: 'Double', locomotiveIds: ['l1', 'l2'], lightingAmps: 0, lengthMm: 1300 },
    { id: 't3', name: 'Light', locomotiveIds: ['l2'], lightingAmps: 0.02, lengthMm: 400 },
  ],
  ...over,
});

describe('power budget', () => {
  it('a train draws its locomotives plus lighting, running and at stall', () => {
    const [stopper, double] = trainLoads(layout());
    // Coach lighting: three grain-of-rice bulbs ≈ 3 × 30 mA = 0.09 A (common practice).
    expect(stopper).toMatchObject({ runningAmps: 0.59, surgeAmps: 0.99, topSpeedKmh: 80 });
    // Derived: 0.5 + 0.4 = 0.9 A running, 0.9 + 1.0 = 1.9 A at stall; the slower loco sets the top speed.
    expect(double).toMatchObject({ runningAmps: 0.9, surgeAmps: 1.9, topSpeedKmh: 80 });
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
    // Surge takes the two highest stall figures: Double 1.9 + Light (1.0 + 0.02) = 2.92 A > 2 A rating.
    expect(supply!.worstSurge).toEqual({ amps: 2.92, terms: [{ trainName: 'Double', amps: 1.9 }, { trainName: 'Light', amps: 1.02 }] });
    expect(supply!.status).toBe('over');
  });

  it('driver: heaviest train per channel, track voltage after the bridge drop against NEM 630', () => {
    const [driver] = powerBudget(layout()).drivers;
    // Double draws 0.9 A ≤ 1 A continuous but surges 1.9 A ≤ 2 A peak (SLRS007B class preset).
    expect(driver).toMatchObject({ channelRunning: { amps: 0.9 }, channelSurge: { amps: 1.9 } });
    // 15 V − 2.6 V drop = 12.4 V; NEM 630 Table 1: 12 V nominal for 16.5 mm gauge (H0).
    expect(driver).toMatchObject({ trackVolts: 12.4, nominalVolts: 12, gaugeMm: 16.5, status: 'ok' });
    expect(driver!.preset).toMatchObject({ source: expect.stringContaining('Texas Instruments datasheet SLRS007B, quadruple half-H driver'), edited: false });
    const low = powerBudget(layout({ supplies: [{ id: 's', name: 'Bench', volts: 12, amps: 5 }] })).drivers[0]!;
    // 12 V − 2.6 V = 9.4 V, below NEM 630's 12 V and NMRA S-9 I.A's 12 V minimum at full throttle.
    expect(low.trackVolts).toBe(9.4);
    expect(low.status).toBe('warning');
    expect(low.messages[0]).toMatch(/NEM 630 Table 1.*NMRA S-9 I\.A/);
  });

  it('flags a supply below the driver class minimum (SLRS007B: 4.5 V motor supply at least)', () => {
    const driver = powerBudget(layout({ supplies: [{ id: 's', name: 'Cell pack', volts: 4, amps: 2 }] })).drivers[0]!;
    expect(driver.status).not.toBe('ok');
    expect(driver.messages.join(' ')).toMatch(/Supply 4 V is below the 4\.5 V motor-supply minimum of this driver class/);
    // At the minimum itself there is no such message.
    const atMinimum = powerBudget(layout({ supplies: [{ id: 's', name: 'Cell pack', volts: 4.5, amps: 2 }] })).drivers[0]!;
    expect(atMinimum.messages.join(' ')).not.toMatch(/motor-supply minimum/);
  });

  it('judges the driver total rating against the surge of all cabs starting at once, not their running draw', () => {
    // Running: Double 0.9 + Stopper 0.59 = 1.49 A, inside 2.5 A; surge: Double 1.9 + Light 1.02 = 2.92 A,
    // above it (a start-up surge is judged against the rating it could trip, common practice).
    const totalRated = layout({ drivers: [{ ...layout().drivers[0]!, totalAmps: 2.5 }] });
    const driver = powerBudget(totalRated).drivers[0]!;
    expect(driver.messages.join(' ')).toMatch(/All cabs at once could surge to 2\.92 A, above the driver's 2\.5 A total rating/);
    const roomy = powerBudget(layout({ drivers: [{ ...layout().drivers[0]!, totalAmps: 3 }] })).drivers[0]!;
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

  it('uses the linear model per cab and names the locomotive a mixed consist waits for', () => {
    const [stopper, double] = dutyTables(layout());
    // Linear model (dutyFor): 40 of 80 km/h needs 12 V × 40/80 = 6 V on average; the rails get
    // 15 − 2.6 = 12.4 V, so duty = 6 / 12.4 = 0.4839 (PWM average = duty × voltage), 8-bit 123.
    expect(stopper!.speeds).toEqual([20, 40, 60, 80]);
    expect(stopper!.rows[1]![0]).toMatchObject({ ok: true, pwm8: 123 });
    expect(stopper!.rows[1]![0]!.duty).toBeCloseTo(6 / 12.4, 9);
    // Double: Tank needs 6 V for 40 km/h, Diesel 12 × 40/100 = 4.8 V; the cab must give Tank's.
    expect(double!.rows[1]![0]).toMatchObject({ ok: true, note: 'set by Tank' });
    // Top speed at 12 V rated on a 12.4 V track: reachable, 12 / 12.4.
    expect(stopper!.rows[3]![0]!.duty).toBeCloseTo(12 / 12.4, 9);
    const weak = dutyTables(layout({ supplies: [{ id: 's', name: 'Bench', volts: 12, amps: 5 }] }))[0]!;
    // 12 V − 2.6 V = 9.4 V cannot give the 12 V top speed needs.
    expect(weak.rows[3]![0]).toMatchObject({ ok: false });
    expect(weak.rows[3]![0]!.note).toMatch(/needs 12 V on average but the track gets at most 9.4 V/);
  });
});

describe('CSV reading', () => {
  it('round-trips quoted names with commas and quotes', () => {
    const text = toCsv('locomotives', [{ name: 'No. 7, "Heron"', running_amps: 0.35, stall_amps: 0.9, rated_volts: 12, top_speed_kmh: 80 }]);
    expect(text).toBe('name,running_amps,stall_amps,rated_volts,top_speed_kmh\r\n"No. 7, ""Heron""",0.35,0.9,12,80');
    const { records, issues } = readCsv('locomotives', text);
    expect(issues).toEqual([]);
    expect(records).toEqual([{ row: 2, cells: { name: 'No. 7, "Heron"', running_amps: '0.35', stall_amps: '0.9', rated_volts: '12', top_speed_kmh: '80' } }]);
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
