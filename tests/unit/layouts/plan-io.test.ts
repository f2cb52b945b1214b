/**
 * Plan files in and out of a layout (lib/layouts/plan-io.ts), by value: the export's extras, every
 * refusal's whole message and path (one bad field at a time; the limits are the ones
 * tests/shared/expected-bounds.ts writes down, not read from the schemas under test), and the rows
 * an import gives. The interchange itself is Fishplate's own (lib/planning/schema.ts); names are
 * compared without case the way Unicode's default case folding for lower case does (String.prototype.toLowerCase,
 * ECMA-262 22.1.3.28), so "Straße" and "STRASSE" are two names.
 */
import { describe, expect, it } from 'vitest';
import { AppError } from '@/lib/errors';
import { exportLayoutPlan, planToImport } from '@/lib/layouts/plan-io';
import { DRIVER_PRESETS } from '@/lib/planning/presets';
import { defaultRules } from '@/lib/planning';
import { DRIVER_BOUNDS, LOCOMOTIVE_BOUNDS, SUPPLY_BOUNDS } from '../../shared/expected-bounds';

type Json = Record<string, unknown>;
const boundOf = (list: { field: string; max: number }[], field: string) => list.find((b) => b.field === field)!.max;

/** A small version-2 plan: two blocks joined end to end, one of each other thing. */
function planV2() {
  return {
    version: 2 as const,
    scale: { name: 'H0', ratio: 87 },
    clock: { ratio: 1, fastStart: '00:00' },
    rules: { ...defaultRules },
    supplies: [{ id: 's1', name: 'Bench supply', volts: 15, amps: 3 }],
    drivers: [{ id: 'd1', name: 'Bridge one', supplyId: 's1', channels: 2, channelAmps: 2, channelPeakAmps: 3, totalAmps: null as number | null, dropVolts: 1.2 }] as Json[],
    cabs: [{ id: 'c1', name: 'Cab one', driverId: 'd1', channel: 1 }] as Json[],
    blocks: [
      { id: 'b1', name: 'West', lengthMm: 1200 },
      { id: 'b2', name: 'East', lengthMm: 900, positiveRail: 'left', reversingSection: true, reversingPlace: true },
    ] as Json[],
    links: [{ a: 'b1', b: 'b2', aEnd: 'b', bEnd: 'a' }] as Json[],
    operators: [],
    runs: [] as Json[],
    locomotives: [{ id: 'l1', name: 'Tank engine', runningAmps: 0.3, stallAmps: 0.8, ratedVolts: 12, topSpeedKmh: 90 }] as Json[],
    trains: [{ id: 't1', name: 'Goods', locomotiveIds: ['l1'], lightingAmps: 0, lengthMm: 600, accelKmhPerS: 2, brakingKmhPerS: 3 }] as Json[],
  };
}

/** The AppError planToImport throws for `input`, with its message and issues. */
function refusal(input: unknown, name?: string): { message: string; issues: { path: string; message: string }[] } {
  try {
    planToImport(input, name);
  } catch (e) {
    expect(e).toBeInstanceOf(AppError);
    const err = e as AppError;
    expect(err.code).toBe('bad_request');
    return { message: err.message, issues: err.extra.issues ?? [] };
  }
  throw new Error('planToImport accepted the plan');
}

describe('planToImport', () => {
  it('turns a valid plan into rows, keeping wiring, flags, ids as keys and every figure', () => {
    const { data, skippedRuns } = planToImport(planV2(), undefined);
    expect(skippedRuns).toBe(0);
    expect(data).toEqual({
      layout: { name: 'Imported layout', scaleName: 'H0', scaleRatio: 87, setting: 'indoor', notes: '' },
      blocks: [
        { name: 'West', lengthMm: 1200, positionMm: 0, positiveRail: 'right', reversingSection: false, reversingPlace: false, key: 'b1' },
        { name: 'East', lengthMm: 900, positionMm: 0, positiveRail: 'left', reversingSection: true, reversingPlace: true, key: 'b2' },
      ],
      links: [{ a: 'b1', b: 'b2', aEnd: 'b', bEnd: 'a' }],
      supplies: [{ name: 'Bench supply', volts: 15, amps: 3, key: 's1' }],
      drivers: [expect.objectContaining({ name: 'Bridge one', supplyId: 's1', presetId: null, partNumber: null, channels: 2, key: 'd1' })],
      cabs: [{ name: 'Cab one', driverId: 'd1', channel: 1, key: 'c1' }],
      locomotives: [{ name: 'Tank engine', runningAmps: 0.3, stallAmps: 0.8, ratedVolts: 12, topSpeedKmh: 90, startVolts: null, key: 'l1' }],
      trains: [expect.objectContaining({ name: 'Goods', locomotiveIds: ['l1'], lightingAmps: 0, lengthMm: 600, accelKmhPerS: 2, brakingKmhPerS: 3, key: 't1' })],
    });
  });

  it('keeps Fishplate’s extras: layout name, setting and notes, block positions, driver preset and part number, start volts', () => {
    const plan: Json = planV2();
    const preset = DRIVER_PRESETS[0]!.id;
    plan.layout = { name: '  Harbour branch  ', setting: 'outdoor', notes: 'Garden line' };
    (plan.blocks as Json[])[1]!.positionMm = 2500;
    (plan.drivers as Json[])[0] = { ...(plan.drivers as Json[])[0], presetId: preset, partNumber: 'BR-2' };
    (plan.locomotives as Json[])[0]!.startVolts = 3.5;
    const { data } = planToImport(plan, undefined);
    expect(data.layout).toEqual({ name: 'Harbour branch', scaleName: 'H0', scaleRatio: 87, setting: 'outdoor', notes: 'Garden line' });
    expect(data.blocks.map((b) => b.positionMm)).toEqual([0, 2500]);
    expect(data.drivers[0]).toMatchObject({ presetId: preset, partNumber: 'BR-2' });
    expect(data.locomotives[0]!.startVolts).toBe(3.5);
  });

  it('names the layout by the name given (trimmed, at most 80 characters), else the file’s, else “Imported layout”', () => {
    const plan: Json = { ...planV2(), layout: { name: 'From the file' } };
    expect(planToImport(plan, '  Copy  ').data.layout.name).toBe('Copy');
    expect(planToImport(plan, '   ').data.layout.name).toBe('From the file');
    expect(planToImport(plan, 'x'.repeat(90)).data.layout.name).toBe('x'.repeat(80));
    expect(planToImport({ ...planV2(), layout: { setting: 'outdoor' } }, undefined).data.layout).toMatchObject({ name: 'Imported layout', setting: 'outdoor', notes: '' });
    expect(planToImport({ ...planV2(), layout: { name: '   ' } }, undefined).data.layout.name).toBe('Imported layout');
    expect(planToImport({ ...planV2(), layout: { notes: 'n'.repeat(4100) } }, undefined).data.layout.notes).toBe('n'.repeat(4000));
  });

  it('names the scale by the file’s name (trimmed, at most 40 characters), else by its ratio', () => {
    expect(planToImport({ ...planV2(), scale: { name: '  Sn3  ', ratio: 64 } }, undefined).data.layout).toMatchObject({ scaleName: 'Sn3', scaleRatio: 64 });
    expect(planToImport({ ...planV2(), scale: { name: '', ratio: 64 } }, undefined).data.layout.scaleName).toBe('1:64');
    expect(planToImport({ ...planV2(), scale: { name: '   ', ratio: 22.5 } }, undefined).data.layout.scaleName).toBe('1:22.5');
    expect(planToImport({ ...planV2(), scale: { name: 's'.repeat(50), ratio: 64 } }, undefined).data.layout.scaleName).toBe('s'.repeat(40));
  });

  it('counts the runs it leaves out', () => {
    const plan = planV2();
    plan.runs = [{ id: 'r1', trainId: 't1', cabId: 'c1', operatorId: null, departS: 0, arriveS: 60, steps: [{ blockId: 'b1', enterS: 0, exitS: 60 }] }];
    expect(planToImport(plan, undefined).skippedRuns).toBe(1);
  });

  it('refuses what is not a plan with the engine’s first issue, its path, and how many more', () => {
    // No path: the whole input is wrong.
    expect(refusal('not a plan')).toEqual({ message: 'The plan cannot be imported: version must be 1 or 2', issues: [{ path: '', message: 'version must be 1 or 2' }] });
    const two = refusal({ ...planV2(), scale: { name: 'H0', ratio: 0 }, clock: { ratio: 0, fastStart: '00:00' } });
    expect(two.message).toBe('The plan cannot be imported: scale.ratio: must be 1 or more (and 1 more)');
    expect(two.issues).toEqual([
      { path: 'scale.ratio', message: 'must be 1 or more' },
      { path: 'clock.ratio', message: 'must be 1 or more' },
    ]);
    expect(refusal({ ...planV2(), scale: { name: 'H0', ratio: 0 } }).message).toBe('The plan cannot be imported: scale.ratio: must be 1 or more');
  });

  it('lists at most 50 issues, and says how many there are in all', () => {
    const plan = planV2();
    plan.supplies = Array.from({ length: 60 }, (_, i) => ({ id: `s${i}`, name: 'Same', volts: 15, amps: 3 }));
    const r = refusal(plan);
    expect(r.issues).toHaveLength(50);
    expect(r.message).toBe('The plan cannot be imported: supplies[1].name: the name “Same” is also supplies[0]; names must be unique (and 58 more)');
    expect(r.issues[49]).toEqual({ path: 'supplies[50].name', message: 'the name “Same” is also supplies[0]; names must be unique' });
  });

  it('refuses Fishplate’s extras when they are malformed, naming the field', () => {
    expect(refusal({ ...planV2(), layout: { setting: 'garden' } }).issues[0]!.path).toBe('layout.setting');
    const plan = planV2();
    (plan.blocks[0] as Json).positionMm = -1;
    expect(refusal(plan).issues).toEqual([{ path: 'blocks[0].positionMm', message: expect.any(String) }]);
    const driver = planV2();
    (driver.drivers[0] as Json).partNumber = 7;
    expect(refusal(driver).issues.map((i) => i.path)).toEqual(['drivers[0].partNumber']);
  });

  it('refuses names used twice in one list, without regard to case or spaces round them', () => {
    const plan = planV2();
    plan.blocks.push({ id: 'b3', name: '  wEST ', lengthMm: 500 });
    expect(refusal(plan).message).toBe('The plan cannot be imported: blocks[2].name: the name “  wEST ” is also blocks[0]; names must be unique');
    for (const [scope, item] of [
      ['supplies', { id: 's2', name: 'BENCH SUPPLY', volts: 12, amps: 1 }],
      ['cabs', { id: 'c2', name: 'cab one', driverId: 'd1', channel: 2 }],
      ['trains', { id: 't2', name: 'goods', locomotiveIds: ['l1'], lightingAmps: 0, lengthMm: 300, accelKmhPerS: 2, brakingKmhPerS: 3 }],
      ['locomotives', { id: 'l2', name: 'TANK ENGINE', runningAmps: 0.3, stallAmps: 0.8, ratedVolts: 12, topSpeedKmh: 80 }],
      ['drivers', { id: 'd2', name: 'bridge one', supplyId: 's1', channels: 1, channelAmps: 1, channelPeakAmps: 2, totalAmps: null, dropVolts: 1 }],
    ] as const) {
      const p = planV2();
      (p[scope] as unknown[]).push(item);
      expect(refusal(p).issues, scope).toEqual([{ path: `${scope}[1].name`, message: `the name “${item.name}” is also ${scope}[0]; names must be unique` }]);
    }
    // Lower-case folding keeps ß apart from ss (upper-case folding would join them).
    const german = planV2();
    german.blocks.push({ id: 'b3', name: 'Straße', lengthMm: 500 }, { id: 'b4', name: 'STRASSE', lengthMm: 500 });
    expect(planToImport(german, undefined).data.blocks.map((b) => b.name)).toEqual(['West', 'East', 'Straße', 'STRASSE']);
  });

  it('refuses a block linked to itself and a joint linked twice, even named from its other side', () => {
    const self = planV2();
    self.links.push({ a: 'b1', b: 'b1', aEnd: 'a', bEnd: 'b' });
    expect(refusal(self).message).toBe('The plan cannot be imported: links[1]: a block cannot link to itself');
    const twice = planV2();
    twice.links.push({ a: 'b2', b: 'b1', aEnd: 'a', bEnd: 'b' });
    expect(refusal(twice).message).toBe('The plan cannot be imported: links[1]: these two block ends are already linked');
  });

  it('takes joints that share one end (turnouts, a balloon loop) as different links', () => {
    const plan = planV2();
    plan.blocks.push({ id: 'b3', name: 'Siding', lengthMm: 500 });
    // A turnout at West's b end feeds East and Siding; both then run into b3's… no: Siding's a end.
    plan.links = [
      { a: 'b1', b: 'b2', aEnd: 'b', bEnd: 'a' },
      { a: 'b1', b: 'b3', aEnd: 'b', bEnd: 'a' },
      { a: 'b2', b: 'b3', aEnd: 'b', bEnd: 'b' },
      { a: 'b1', b: 'b3', aEnd: 'a', bEnd: 'b' },
      { a: 'b2', b: 'b1', aEnd: 'a', bEnd: 'a' },
    ];
    expect(planToImport(plan, undefined).data.links).toHaveLength(5);
  });

  it('checks each thing with the form’s rules, naming the field (limits from expected-bounds)', () => {
    const cases: [string, (p: ReturnType<typeof planV2>) => void, string][] = [
      ['blocks[1].name', (p) => void (p.blocks[1]!.name = '   '), 'Enter a name.'],
      ['supplies[0].volts', (p) => void (p.supplies[0]!.volts = boundOf(SUPPLY_BOUNDS, 'volts') + 1), ''],
      ['drivers[0].channels', (p) => void (p.drivers[0]!.channels = boundOf(DRIVER_BOUNDS, 'channels') + 1), ''],
      // The engine itself refuses a cab channel the driver lacks; the form's own limit here is the name's 80 characters.
      ['cabs[0].name', (p) => void (p.cabs[0]!.name = 'c'.repeat(81)), 'Use at most 80 characters.'],
      ['locomotives[0].ratedVolts', (p) => void (p.locomotives[0]!.ratedVolts = boundOf(LOCOMOTIVE_BOUNDS, 'ratedVolts') + 1), ''],
      ['trains[0].lightingAmps', (p) => void (p.trains[0]!.lightingAmps = 21), ''],
    ];
    for (const [path, change, message] of cases) {
      const plan = planV2();
      change(plan);
      const r = refusal(plan);
      expect(r.issues.map((i) => i.path), path).toEqual([path]);
      if (message) expect(r.issues[0]!.message).toBe(message);
      expect(r.message).toBe(`The plan cannot be imported: ${path}: ${r.issues[0]!.message}`);
    }
  });

  it('needs each locomotive’s top speed, from the locomotive or from the older field beside it', () => {
    const missing = planV2();
    delete missing.locomotives[0]!.topSpeedKmh;
    expect(refusal(missing).issues).toEqual([
      { path: 'locomotives[0].topSpeedKmh', message: 'missing: Fishplate needs each locomotive’s top scale speed (km/h) to work out PWM duty' },
    ]);
    // Version 2 reads its own `locomotives` first: an old `locos` list beside it is not used.
    expect(refusal({ ...missing, locos: [{ topSpeedKmh: 70 }] }).issues.map((i) => i.path)).toEqual(['locomotives[0].topSpeedKmh']);
    const { version: _v, locomotives, trains, ...rest } = planV2();
    const v1 = {
      ...rest,
      version: 1,
      locos: [locomotives[0]!, { ...locomotives[0]!, id: 'l2', name: 'Railcar', topSpeedKmh: undefined }],
      trains: trains.map(({ locomotiveIds, ...t }) => ({ ...t, locoIds: locomotiveIds })),
    };
    // Version 1 names the list `locos`; a stray `locomotives` list beside it does not override the plan's own figure.
    const r1 = refusal({ ...v1, locomotives: [{ topSpeedKmh: 50 }] });
    expect(r1.issues).toEqual([{ path: 'locos[1].topSpeedKmh', message: 'missing: Fishplate needs each locomotive’s top scale speed (km/h) to work out PWM duty' }]);
    const ok = planToImport({ ...v1, locos: [locomotives[0]!], locomotives: [{ topSpeedKmh: 50 }] }, undefined);
    expect(ok.data.locomotives[0]!.topSpeedKmh).toBe(90);
    // A version-1 locomotive without a top speed takes it from a `locomotives` list beside it.
    const { topSpeedKmh: _top, ...noTop } = locomotives[0]!;
    expect(planToImport({ ...v1, locos: [noTop], locomotives: [{ topSpeedKmh: 50 }] }, undefined).data.locomotives[0]!.topSpeedKmh).toBe(50);
    const bad = { ...v1, locos: [{ ...locomotives[0]!, ratedVolts: boundOf(LOCOMOTIVE_BOUNDS, 'ratedVolts') + 1 }] };
    expect(refusal(bad).issues.map((i) => i.path)).toEqual(['locos[0].ratedVolts']);
  });
});

describe('exportLayoutPlan', () => {
  type Rows = Parameters<typeof exportLayoutPlan>[0];
  const rows = (): Rows =>
    ({
      layout: { id: 'L', name: 'Harbour branch', scaleName: 'H0', scaleRatio: 87, setting: 'outdoor', notes: 'Garden line' },
      blocks: [
        { id: 'b1', name: 'West', lengthMm: 1200, positionMm: 0, positiveRail: 'right', reversingSection: false, reversingPlace: false },
        { id: 'b2', name: 'East', lengthMm: 900, positionMm: 2500, positiveRail: 'left', reversingSection: true, reversingPlace: true },
      ],
      links: [{ blockAId: 'b1', blockBId: 'b2', blockAEnd: 'b', blockBEnd: 'a' }],
      supplies: [{ id: 's1', name: 'Bench supply', volts: 15, amps: 3 }],
      drivers: [
        {
          id: 'd1',
          name: 'Bridge one',
          supplyId: 's1',
          channels: 2,
          channelAmps: 2,
          channelPeakAmps: 3,
          totalAmps: null,
          dropVolts: 1.2,
          dropOhms: 0,
          dropMaxVolts: null,
          dropMaxOhms: null,
          peakPulseMs: null,
          packageWatts: null,
          presetId: DRIVER_PRESETS[0]!.id,
          partNumber: 'BR-2',
        },
        { id: 'd2', name: 'Bridge two', supplyId: 's1', channels: 1, channelAmps: 1, channelPeakAmps: 2, totalAmps: null, dropVolts: 1, dropOhms: 0, dropMaxVolts: null, dropMaxOhms: null, peakPulseMs: null, packageWatts: null, presetId: null, partNumber: null },
      ],
      cabs: [{ id: 'c1', name: 'Cab one', driverId: 'd1', channel: 1 }],
      locomotives: [{ id: 'l1', name: 'Tank engine', runningAmps: 0.3, stallAmps: 0.8, ratedVolts: 12, startVolts: 3.5, topSpeedKmh: 90 }],
      trains: [{ id: 't1', name: 'Goods', lightingAmps: 0, lengthMm: 600, accelKmhPerS: 2, brakingKmhPerS: 3 }],
      consists: [{ trainId: 't1', locomotiveId: 'l1' }],
    }) as unknown as Rows;

  it('writes the layout, block positions and driver presets beside the interchange, and imports back whole', () => {
    const plan = exportLayoutPlan(rows());
    expect(plan.version).toBe(2);
    expect(plan.layout).toEqual({ name: 'Harbour branch', setting: 'outdoor', notes: 'Garden line' });
    expect(plan.blocks.map((b) => (b as Json).positionMm)).toEqual([0, 2500]);
    expect(plan.drivers.map((d) => [(d as Json).presetId, (d as Json).partNumber])).toEqual([
      [DRIVER_PRESETS[0]!.id, 'BR-2'],
      [null, null],
    ]);
    const back = planToImport(JSON.parse(JSON.stringify(plan)), undefined).data;
    expect(back.layout).toEqual({ name: 'Harbour branch', scaleName: 'H0', scaleRatio: 87, setting: 'outdoor', notes: 'Garden line' });
    expect(back.blocks.map((b) => [b.key, b.positionMm, b.positiveRail, b.reversingSection, b.reversingPlace])).toEqual([
      ['b1', 0, 'right', false, false],
      ['b2', 2500, 'left', true, true],
    ]);
    expect(back.drivers.map((d) => [d.key, d.presetId, d.partNumber, d.dropVolts])).toEqual([
      ['d1', DRIVER_PRESETS[0]!.id, 'BR-2', 1.2],
      ['d2', null, null, 1],
    ]);
    expect(back.locomotives[0]).toMatchObject({ key: 'l1', startVolts: 3.5, topSpeedKmh: 90 });
    expect(back.trains[0]).toMatchObject({ key: 't1', locomotiveIds: ['l1'], accelKmhPerS: 2, brakingKmhPerS: 3 });
  });

  it('refuses rows without a layout', () => {
    expect(() => exportLayoutPlan({ ...rows(), layout: undefined })).toThrow(new Error('exportLayoutPlan: no layout'));
  });
});
