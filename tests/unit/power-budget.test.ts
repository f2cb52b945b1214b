import { describe, expect, it } from 'vitest';
import { dutySpeeds, dutyTables, powerBudget, trainLoads, type BudgetInput } from '@/lib/layouts/power-budget';
import { presetDriverValues } from '@/lib/layouts/driver-electrics';
import { DRIVER_PRESETS } from '@/lib/planning';

// Each edge here is one rule of the budget at its limit: a load equal to a rating is within it, a
// load above it is not. Figures are sums and products of the inputs (common practice); the 80 %
// continuous share is the rule of thumb of NEC 210.20(A); nominal track voltages are NEM 630 Table 1.

const QUAD = DRIVER_PRESETS.find((p) => p.id === 'bipolar-quad-half-h-1a')!; // TI SLRS007B: 4.5–36 V motor supply

/** An own driver with a flat 1 V drop, no preset, no total, no pulse width, no heat rating. */
const ownDriver = {
  id: 'd',
  name: 'Board',
  supplyId: 's',
  presetId: null,
  partNumber: null,
  channels: 2,
  channelAmps: 1,
  channelPeakAmps: 2,
  totalAmps: null,
  dropVolts: 1,
};

const layout = (over: Partial<BudgetInput> = {}): BudgetInput => ({
  scale: { name: 'H0 (NEM)', ratio: 87 },
  derate: 0.8,
  surgeS: 2,
  supplies: [{ id: 's', name: 'Bench', volts: 20, amps: 2 }],
  drivers: [ownDriver],
  cabs: [
    { id: 'c1', name: 'Cab 1', driverId: 'd', channel: 1 },
    { id: 'c2', name: 'Cab 2', driverId: 'd', channel: 2 },
  ],
  // Start voltage not measured: the start current is the stall current.
  locomotives: [
    { id: 'a', name: 'Tank', runningAmps: 0.8, stallAmps: 0.8, ratedVolts: 12, topSpeedKmh: 80, startVolts: null },
    { id: 'b', name: 'Railcar', runningAmps: 0.8, stallAmps: 0.8, ratedVolts: 12, topSpeedKmh: 80, startVolts: null },
  ],
  trains: [
    { id: 't1', name: 'Goods', locomotiveIds: ['a'], lightingAmps: 0, lengthMm: 900 },
    { id: 't2', name: 'Stopper', locomotiveIds: ['b'], lightingAmps: 0, lengthMm: 400 },
  ],
  ...over,
});
const supplyOf = (input: BudgetInput) => powerBudget(input).supplies[0]!;
const driverOf = (input: BudgetInput) => powerBudget(input).drivers[0]!;
const supplyWith = (amps: number) => ({ supplies: [{ id: 's', name: 'Bench', volts: 20, amps }] });

describe('supply budget at its edges', () => {
  it('a running load equal to the derated figure is within it (2 A × 0.8 = 1.6 A, two trains of 0.8 A)', () => {
    expect(supplyOf(layout())).toMatchObject({ deratedAmps: 1.6, status: 'ok', messages: [], headroomAmps: 0 });
  });

  it('above the derated figure is a warning that names the share', () => {
    const supply = supplyOf(layout(supplyWith(1.99)));
    expect(supply.status).toBe('warning');
    expect(supply.messages).toEqual(['Running load 1.6 A is above 80 % of the rating (1.592 A); continuous loads are best kept to 80 %.']);
  });

  it('running and starting at exactly the rating is a warning, not over', () => {
    const supply = supplyOf(layout(supplyWith(1.6)));
    expect(supply.status).toBe('warning');
    expect(supply.messages).toHaveLength(1);
  });

  it('above the rating, running and at start, is over', () => {
    const supply = supplyOf(layout(supplyWith(1.5)));
    expect(supply.status).toBe('over');
    expect(supply.messages).toEqual([
      'Running load 1.6 A is above the 1.5 A rating.',
      'Start-up surge 1.6 A is above the 1.5 A rating if every cab starts at once.',
    ]);
  });

  it('a surge above the rating alone makes it over', () => {
    const stall = layout().locomotives.map((l) => ({ ...l, stallAmps: 1 }));
    const supply = supplyOf(layout({ ...supplyWith(1.99), locomotives: stall }));
    expect(supply.status).toBe('over');
    expect(supply.messages[1]).toBe('Start-up surge 2 A is above the 1.99 A rating if every cab starts at once.');
    expect(supplyOf(layout({ locomotives: stall }))).toMatchObject({ status: 'ok', messages: [] }); // surge 2 A on a 2 A rating
  });

  it('a supply and a driver no cab uses say so', () => {
    const budget = powerBudget(layout({ cabs: [] }));
    expect(budget.supplies[0]!.messages).toEqual(['No cab draws from this supply yet.']);
    expect(budget.drivers[0]!.messages).toEqual(['No cab uses this driver yet.']);
    expect(budget.supplies[0]!.cabCount).toBe(0);
    // A cab on a driver that does not exist counts nowhere.
    expect(powerBudget(layout({ cabs: [{ id: 'c9', name: 'Cab 9', driverId: 'gone', channel: 1 }] })).supplies[0]!.cabCount).toBe(0);
  });
});

describe('driver budget at its edges', () => {
  it('a channel carrying its continuous rating exactly is within it; above is over, naming the train', () => {
    expect(driverOf(layout({ drivers: [{ ...ownDriver, channelAmps: 0.8 }] }))).toMatchObject({ status: 'ok', messages: [] });
    const over = driverOf(layout({ drivers: [{ ...ownDriver, channelAmps: 0.79, channelPeakAmps: 2 }] }));
    expect(over.status).toBe('over');
    expect(over.messages[0]).toBe('“Goods” draws 0.8 A running, above the 0.79 A continuous rating of a channel.');
  });

  it('without a pulse width the surge is judged against the continuous rating, and the message says the peak holds for no stated time', () => {
    const stall = layout().locomotives.map((l) => ({ ...l, stallAmps: 1.5 }));
    const driver = driverOf(layout({ locomotives: stall }));
    expect(driver).toMatchObject({ surgeLimitAmps: 1, surgeJudgedContinuous: true, status: 'over' });
    expect(driver.messages).toEqual([
      '“Goods” draws 1.5 A for its 2 s start, above the 1 A continuous rating: the 2 A peak holds for no stated time.',
    ]);
    // The surge equal to the continuous rating is within it.
    expect(driverOf(layout({ locomotives: layout().locomotives.map((l) => ({ ...l, stallAmps: 1 })) }))).toMatchObject({ status: 'ok', messages: [] });
  });

  it('a pulse width longer than the surge lets the peak rating judge it', () => {
    const stall = layout().locomotives.map((l) => ({ ...l, stallAmps: 2.5 }));
    const driver = driverOf(layout({ locomotives: stall, drivers: [{ ...ownDriver, peakPulseMs: 3000 }] }));
    expect(driver).toMatchObject({ surgeLimitAmps: 2, surgeJudgedContinuous: false, peakPulseMs: 3000 });
    expect(driver.messages).toEqual(['“Goods” surges to 2.5 A at start, above the 2 A peak rating of a channel.']);
  });

  it('heat equal to the package rating is within it; above is a warning, and an overload stays over', () => {
    // Flat 1 V drop: 1 V × 0.8 A on each of two channels = 1.6 W.
    expect(driverOf(layout({ drivers: [{ ...ownDriver, packageWatts: 1.6 }] }))).toMatchObject({ heatHighWatts: 1.6, status: 'ok', messages: [] });
    const warm = driverOf(layout({ drivers: [{ ...ownDriver, packageWatts: 1.5 }] }));
    expect(warm.status).toBe('warning');
    expect(warm.messages).toEqual([
      'With every cab running its heaviest train the bridge dissipates about 1.6 W to 1.6 W, above its 1.5 W package rating: add a heat sink or spread the trains over more drivers.',
    ]);
    const hotAndOver = driverOf(layout({ drivers: [{ ...ownDriver, packageWatts: 1.5, channelAmps: 0.79 }] }));
    expect(hotAndOver.status).toBe('over');
    expect(hotAndOver.messages).toHaveLength(3); // running, its surge against the continuous rating, heat
  });

  it('track voltage equal to the NEM 630 nominal is enough; below it warns, citing NMRA S-9 for 12 V', () => {
    // 13 V supply − 1 V drop = 12 V, the NEM 630 Table 1 nominal for 16.5 mm gauge.
    expect(driverOf(layout({ supplies: [{ id: 's', name: 'Bench', volts: 13, amps: 2 }] }))).toMatchObject({ trackVolts: 12, status: 'ok', messages: [] });
    const low = driverOf(layout({ supplies: [{ id: 's', name: 'Bench', volts: 12.5, amps: 2 }] }));
    expect(low.status).toBe('warning');
    expect(low.messages).toEqual([
      'Track gets 11.5 V at full throttle with the heaviest train, below the 12 V nominal of NEM 630 Table 1 for 16.5 mm gauge (NMRA S-9 I.A: at least 12 V at full throttle at maximum anticipated load).',
    ]);
    // 45 mm gauge (NEM 010: I, 1:32): 16 V nominal, no NMRA figure.
    const garden = driverOf(layout({ scale: { name: 'I (NEM)', ratio: 32 }, supplies: [{ id: 's', name: 'Bench', volts: 16, amps: 2 }] }));
    expect(garden.messages).toEqual(['Track gets 15 V at full throttle with the heaviest train, below the 16 V nominal of NEM 630 Table 1 for 45 mm gauge.']);
    // An own scale with no gauge in the table: no nominal to compare with.
    expect(driverOf(layout({ scale: { name: 'Odd', ratio: 100 }, supplies: [{ id: 's', name: 'Bench', volts: 5, amps: 2 }] }))).toMatchObject({
      nominalVolts: null,
      gaugeMm: null,
      messages: [],
    });
  });

  it('a preset class: a supply at its maximum is within it, above is over (SLRS007B: 36 V)', () => {
    const preset = { ...ownDriver, presetId: QUAD.id, ...presetDriverValues(QUAD) };
    const quiet = (volts: number) => ({ supplies: [{ id: 's', name: 'Bench', volts, amps: 2 }], drivers: [preset], trains: [], cabs: [layout().cabs[0]!] });
    expect(driverOf(layout(quiet(36))).messages).toEqual([]);
    const high = driverOf(layout(quiet(36.5)));
    expect(high.status).toBe('over');
    expect(high.messages).toEqual([`Supply 36.5 V is above the 36 V motor-supply maximum of this driver class (${QUAD.source}).`]);
    const low = driverOf(layout(quiet(4)));
    expect(low.status).toBe('warning');
    expect(low.preset).toMatchObject({ id: QUAD.id, edited: false });
    expect(driverOf(layout({ ...quiet(20), drivers: [{ ...preset, channelAmps: 0.9 }] })).preset!.edited).toBe(true);
  });

  it('a driver whose supply is gone shows a dash and 0 V, and judges no supply limits', () => {
    const preset = { ...ownDriver, supplyId: 'gone', presetId: QUAD.id, ...presetDriverValues(QUAD) };
    const driver = driverOf(layout({ drivers: [preset], trains: [], scale: { name: 'Odd', ratio: 100 } }));
    expect(driver).toMatchObject({ supplyName: '—', supplyVolts: 0, messages: [] });
  });
});

describe('train loads', () => {
  it('lighting is a part only when it draws; unknown locomotives are left out; a consist goes at its slowest', () => {
    const loads = trainLoads({
      locomotives: [...layout().locomotives, { id: 'c', name: 'Fast', runningAmps: 0.3, stallAmps: 0.6, ratedVolts: 12, topSpeedKmh: 160, startVolts: null }],
      trains: [
        { id: 't1', name: 'Lit', locomotiveIds: ['a', 'c', 'gone'], lightingAmps: 0.1, lengthMm: 900 },
        { id: 't2', name: 'Dark', locomotiveIds: ['b'], lightingAmps: 0, lengthMm: 400 },
        { id: 't3', name: 'Coaches', locomotiveIds: [], lightingAmps: 0, lengthMm: 400 },
      ],
    });
    expect(loads[0]).toMatchObject({ runningAmps: 1.2, surgeAmps: 1.5, topSpeedKmh: 80 });
    expect(loads[0]!.parts.map((p) => p.label)).toEqual(['Tank', 'Fast', 'lighting']);
    expect(loads[1]!.parts.map((p) => p.label)).toEqual(['Railcar']);
    expect(loads[2]).toMatchObject({ runningAmps: 0, topSpeedKmh: null, parts: [] });
  });
});

describe('duty tables', () => {
  it('speeds are a quarter to all of the top speed, at least 1 km/h, never above it', () => {
    expect(dutySpeeds(100)).toEqual([25, 50, 75, 100]);
    expect(dutySpeeds(2)).toEqual([1, 2]);
    expect(dutySpeeds(0.5)).toEqual([]);
  });

  it('a consist of different locomotives names the one that sets the duty; an unreachable speed names the locomotive', () => {
    const locomotives = [
      { id: 'a', name: 'Tank', runningAmps: 0.5, stallAmps: 1, ratedVolts: 12, topSpeedKmh: 80, startVolts: null },
      { id: 'b', name: 'Railcar', runningAmps: 0.5, stallAmps: 1, ratedVolts: 12, topSpeedKmh: 100, startVolts: 2 },
    ];
    const trains = [
      { id: 't1', name: 'Pair', locomotiveIds: ['a', 'b'], lightingAmps: 0, lengthMm: 900 },
      { id: 't2', name: 'Twins', locomotiveIds: ['a', 'a'], lightingAmps: 0, lengthMm: 900 },
      { id: 't3', name: 'Coaches', locomotiveIds: [], lightingAmps: 0, lengthMm: 400 },
    ];
    const cabs = [...layout().cabs, { id: 'c9', name: 'Orphan', driverId: 'gone', channel: 1 }];
    const [pair, twins, coaches] = dutyTables(layout({ locomotives, trains, cabs }));
    expect(pair!.cabs.map((c) => c.name)).toEqual(['Cab 1', 'Cab 2']);
    expect(pair!.cabs[0]!.trackVolts).toBe(19);
    // Tank needs 12 × 80/80 = 12 V at 80 km/h; Railcar (2 V start) 2 + 10 × 80/100 = 10 V: Tank sets it.
    expect(pair!.speeds).toEqual([20, 40, 60, 80]);
    expect(pair!.rows[3]![0]).toMatchObject({ ok: true, note: 'set by Tank' });
    expect(pair!.rows[3]![0]!.duty).toBeCloseTo(12 / 19, 9);
    expect(twins!.rows[0]![0]!.note).toBe('');
    expect(coaches).toMatchObject({ topSpeedKmh: null, speeds: [], rows: [] });
    // 12.5 V supply − 1 V = 11.5 V: the Tank cannot reach 80 km/h (needs 12 V).
    const weak = dutyTables(layout({ locomotives, trains: [trains[0]!, { ...trains[1]!, locomotiveIds: ['a'] }], supplies: [{ id: 's', name: 'Bench', volts: 12.5, amps: 2 }] }));
    expect(weak[0]!.rows[3]![0]).toMatchObject({ ok: false, duty: null, pwm8: null, note: expect.stringMatching(/^Tank: needs 12 V/) });
    expect(weak[1]!.rows[3]![0]!.note).toMatch(/^needs 12 V/);
  });
});
