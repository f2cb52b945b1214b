import { describe, expect, it } from 'vitest';
import { createLayout, deleteLayout, updateLayout } from '@/app/(app)/railways/[railwayId]/layouts/actions';
import * as actions from '@/app/(app)/railways/[railwayId]/layouts/[layoutId]/actions';
import { getLayout } from '@/db/queries/layouts';
import { loadLayoutRows } from '@/db/queries/plan-data';
import { checkPlan, defaultRules } from '@/lib/planning';
import { layoutToPlan } from '@/lib/sessions/to-plan';
import { signInAs } from './caller';
import { seedLayout } from './authz/layouts';
import { makeSessionWorld } from './authz/sessions';
import { formData, formFields as form, makeWorld } from './world';

function setup(role: 'planner' | 'host' = 'planner') {
  const w = makeWorld();
  const seed = seedLayout(w.railway.id);
  signInAs(w[role]);
  return { w, seed, r: w.railway.id, l: seed.layout.id };
}

describe('layouts', () => {
  it('a planner creates a layout from the scale table and edits it; a stale edit is refused with 409', async () => {
    const w = makeWorld();
    signInAs(w.planner);
    const state = await createLayout(w.railway.id, null, formData({ name: 'Loft line', scaleId: 'oo-nem', customScaleName: '', customRatio: '', setting: 'indoor', notes: 'first' }));
    expect(state).toMatchObject({ ok: true });
    const id = state && state.ok ? state.data!.id : '';
    // NEM 010 §3.4 / common practice: OO is 1:76.2 (4 mm to the foot).
    expect(getLayout(w.railway.id, id)).toMatchObject({ name: 'Loft line', scaleName: 'OO (4 mm scale)', scaleRatio: 76.2, version: 1 });
    const edit = { name: 'Loft line', scaleId: 'custom', customScaleName: 'Sn3', customRatio: '64', setting: 'outdoor', notes: '' };
    expect(await updateLayout(w.railway.id, id, null, formData({ ...edit, version: '1' }))).toMatchObject({ ok: true });
    expect(getLayout(w.railway.id, id)).toMatchObject({ scaleName: 'Sn3', scaleRatio: 64, setting: 'outdoor', version: 2 });
    expect(await updateLayout(w.railway.id, id, null, formData({ ...edit, name: 'Overwritten', version: '1' }))).toMatchObject({ ok: false, status: 409 });
    expect(getLayout(w.railway.id, id)?.name).toBe('Loft line');
  });

  it('bad layout input names each field and writes nothing', async () => {
    const w = makeWorld();
    signInAs(w.host);
    const state = await createLayout(w.railway.id, null, formData({ name: '', scaleId: 'custom', customScaleName: '', customRatio: 'abc', setting: 'attic', notes: '' }));
    expect(state).toMatchObject({ ok: false, status: 400 });
    if (state && !state.ok) {
      expect(state.fieldErrors).toMatchObject({ name: 'Enter a name.', setting: 'Choose indoor or outdoor.', customRatio: 'Enter a number, like 12 or 0.5.' });
    }
  });

  it('operators may not edit (403) and another railway’s layout is a 404', async () => {
    const { w, seed } = setup();
    signInAs(w.operator);
    expect(await actions.createBlock(w.railway.id, seed.layout.id, null, form({ name: 'X', length: '1', unit: 'm', position: '0' }))).toMatchObject({ ok: false, status: 403 });
    signInAs(w.outsider);
    // The outsider hosts the other railway; our layout id under their railway is still not found.
    expect(await actions.createBlock(w.otherRailway.id, seed.layout.id, null, form({ name: 'X', length: '1', unit: 'm', position: '0' }))).toMatchObject({ ok: false, status: 404 });
    expect(loadLayoutRows(seed.layout.id).blocks.map((b) => b.name)).not.toContain('X');
  });

  it('a layout used by a session cannot be deleted; an unused one goes with everything in it', async () => {
    const w = makeWorld();
    const { session } = makeSessionWorld(w);
    signInAs(w.planner);
    const used = await deleteLayout(w.railway.id, session.layoutId, null, formData({ version: '1' }));
    expect(used).toMatchObject({ ok: false, status: 409, error: '1 session uses this layout; delete it first.' });
    expect(loadLayoutRows(session.layoutId).layout).toBeDefined();
    expect(loadLayoutRows(session.layoutId).blocks).toHaveLength(4);

    const { r, l } = setup();
    expect(await deleteLayout(r, l, null, formData({ version: '1' }))).toMatchObject({ ok: true });
    expect(loadLayoutRows(l).blocks).toHaveLength(0);
    expect(loadLayoutRows(l).layout).toBeUndefined();
  });
});

describe('blocks and links', () => {
  it('stores lengths in mm whatever unit is typed', async () => {
    const { r, l } = setup();
    // 1 ft = 304.8 mm exactly (international foot, 1959); 1 in = 25.4 mm.
    expect(await actions.createBlock(r, l, null, form({ name: 'Foot block', length: '2.5', unit: 'ft', position: '10', }))).toMatchObject({ ok: true });
    const block = loadLayoutRows(l).blocks.find((b) => b.name === 'Foot block')!;
    expect(block.lengthMm).toBe(762);
    expect(block.positionMm).toBe(3048);
  });

  it('refuses a duplicate name, a zero length and an unknown unit with field messages', async () => {
    const { r, l } = setup();
    const state = await actions.createBlock(r, l, null, form({ name: 'seed EAST', length: '0', unit: 'yd', position: '' }));
    expect(state).toMatchObject({ ok: false, status: 400 });
    if (state && !state.ok) expect(state.fieldErrors).toMatchObject({ length: 'Must be more than 0.', unit: 'Choose a unit: mm, cm, m, in, ft.' });
    const dup = await actions.createBlock(r, l, null, form({ name: 'seed EAST', length: '1', unit: 'm', position: '' }));
    expect(dup).toMatchObject({ ok: false, status: 400, fieldErrors: { name: 'There is already a block named “seed EAST” in this layout.' } });
  });

  it('edits a block with its version; a second edit on the same version is 409 and changes nothing', async () => {
    const { r, l, seed } = setup();
    const edit = { id: seed.blockA.id, name: 'Seed east', length: '1600', unit: 'mm', position: '0' };
    expect(await actions.updateBlock(r, l, null, form({ ...edit, version: '1' }))).toMatchObject({ ok: true });
    expect(await actions.updateBlock(r, l, null, form({ ...edit, length: '999', version: '1' }))).toMatchObject({ ok: false, status: 409 });
    expect(loadLayoutRows(l).blocks.find((b) => b.id === seed.blockA.id)).toMatchObject({ lengthMm: 1600, version: 2 });
    expect(await actions.deleteBlock(r, l, null, form({ id: seed.blockA.id, version: '1' }))).toMatchObject({ ok: false, status: 409 });
  });

  it('links two block ends once; self links and blocks of another layout are refused; deleting a block drops its links', async () => {
    const { w, r, l, seed } = setup();
    const other = seedLayout(w.railway.id);
    // The seeded joint (A's b end to B's a end), written the other way round, is the same joint.
    expect(await actions.createLink(r, l, null, form({ blockAId: seed.blockB.id, blockAEnd: 'a', blockBId: seed.blockA.id, blockBEnd: 'b' }))).toMatchObject({ ok: false, status: 400 });
    expect(await actions.createLink(r, l, null, form({ blockAId: seed.blockB.id, blockAEnd: 'c', blockBId: seed.blockA.id }))).toMatchObject({ ok: false, status: 400 });
    expect(await actions.createLink(r, l, null, form({ blockAId: seed.blockB.id, blockBId: seed.blockB.id }))).toMatchObject({ ok: false, fieldErrors: { blockBId: 'A block cannot link to itself.' } });
    expect(await actions.createLink(r, l, null, form({ blockAId: seed.blockB.id, blockBId: other.blockC.id }))).toMatchObject({ ok: false, status: 400 });
    expect(await actions.createLink(r, l, null, form({ blockAId: seed.blockB.id, blockBId: seed.blockC.id }))).toMatchObject({ ok: true });
    expect(loadLayoutRows(l).links).toHaveLength(2);
    expect(await actions.deleteBlock(r, l, null, form({ id: seed.blockB.id, version: '1' }))).toMatchObject({ ok: true });
    expect(loadLayoutRows(l).links).toHaveLength(0);
    expect(await actions.deleteLink(r, l, null, form({ id: other.link.id }))).toMatchObject({ ok: false, status: 404 });
  });
});

describe('track ends, wiring and reversing sections', () => {
  it('a balloon loop: one block end linked to both ends of a loop block wired as a reversing section; the checker sees no reversing loop', async () => {
    const { r, l, seed } = setup();
    expect(
      await actions.createBlock(r, l, null, form({ name: 'Balloon', length: '5', unit: 'm', position: '9', positiveRail: 'right', reversingSection: 'yes', reversingPlace: 'no' })),
    ).toMatchObject({ ok: true });
    expect(await actions.createBlock(r, l, null, form({ name: 'Bad wiring', length: '1', unit: 'm', position: '0', positiveRail: 'up' }))).toMatchObject({ ok: false, status: 400 });
    const balloon = loadLayoutRows(l).blocks.find((b) => b.name === 'Balloon')!;
    expect(balloon).toMatchObject({ positiveRail: 'right', reversingSection: true, reversingPlace: false });
    for (const end of ['a', 'b']) {
      expect(await actions.createLink(r, l, null, form({ blockAId: seed.blockB.id, blockAEnd: 'b', blockBId: balloon.id, blockBEnd: end }))).toMatchObject({ ok: true });
    }
    const rows = loadLayoutRows(l);
    expect(rows.links.filter((k) => k.blockBId === balloon.id).map((k) => k.blockBEnd).sort()).toEqual(['a', 'b']);
    const plan = layoutToPlan(rows, { clock: { ratio: 1, fastStart: '00:00' }, rules: { headwayS: 0, surgeS: 0, derate: 1 } });
    expect(checkPlan(plan).findings.filter((f) => f.kind === 'reversing-loop')).toEqual([]);
    // An edit that only renames keeps the wiring (the form always sends it; CSV edits do not).
    expect(await actions.updateBlock(r, l, null, form({ id: balloon.id, version: '1', name: 'Balloon loop', length: '5', unit: 'm', position: '9', reversingSection: 'no' }))).toMatchObject({ ok: true });
    const unswitched = layoutToPlan(loadLayoutRows(l), { clock: { ratio: 1, fastStart: '00:00' }, rules: { headwayS: 0, surgeS: 0, derate: 1 } });
    expect(checkPlan(unswitched).findings.filter((f) => f.kind === 'reversing-loop')).toHaveLength(1);
  });
});

describe('power', () => {
  it('a driver from a preset, cabs on its channels: a channel holds one cab and must exist', async () => {
    const { r, l, seed } = setup('host');
    const driver = {
      name: 'Board B', supplyId: seed.supply.id, presetId: 'mosfet-dual-low-voltage-1-2a', partNumber: 'my board rev 2', channels: '2',
      channelAmps: '1.2', channelPeakAmps: '3.2', totalAmps: '', dropVolts: '0.6',
    };
    expect(await actions.createDriver(r, l, null, form(driver))).toMatchObject({ ok: true });
    const board = loadLayoutRows(l).drivers.find((d) => d.name === 'Board B')!;
    expect(board).toMatchObject({ presetId: 'mosfet-dual-low-voltage-1-2a', partNumber: 'my board rev 2', totalAmps: null });
    expect(await actions.createCab(r, l, null, form({ name: 'Cab B1', driverId: board.id, channel: '1' }))).toMatchObject({ ok: true });
    expect(await actions.createCab(r, l, null, form({ name: 'Cab B1b', driverId: board.id, channel: '1' }))).toMatchObject({
      ok: false, fieldErrors: { channel: 'Channel 1 of “Board B” is already cab “Cab B1”.' },
    });
    expect(await actions.createCab(r, l, null, form({ name: 'Cab B3', driverId: board.id, channel: '3' }))).toMatchObject({
      ok: false, fieldErrors: { channel: '“Board B” has channels 1 to 2.' },
    });
    // Fewer channels than a cab uses is refused; so is deleting a driver with cabs or a supply with drivers.
    expect(await actions.updateDriver(r, l, null, form({ ...driver, id: seed.driver.id, name: 'Seed driver', channels: '0', version: '1' }))).toMatchObject({ ok: false, status: 400 });
    expect(await actions.deleteDriver(r, l, null, form({ id: board.id, version: '1' }))).toMatchObject({ ok: false, status: 409 });
    expect(await actions.deleteSupply(r, l, null, form({ id: seed.supply.id, version: '1' }))).toMatchObject({ ok: false, status: 409 });
    expect(loadLayoutRows(l).supplies).toHaveLength(2);
  });

  it('refuses a peak rating below the continuous one and a supply without volts', async () => {
    const { r, l, seed } = setup();
    const state = await actions.createDriver(r, l, null, form({ name: 'Odd', supplyId: seed.supply.id, presetId: '', partNumber: '', channels: '2', channelAmps: '2', channelPeakAmps: '1', totalAmps: '', dropVolts: '1' }));
    expect(state).toMatchObject({ ok: false, fieldErrors: { channelPeakAmps: 'The peak rating cannot be below the continuous rating.' } });
    expect(await actions.createSupply(r, l, null, form({ name: 'No volts', volts: '', amps: '2' }))).toMatchObject({ ok: false, fieldErrors: { volts: 'Enter a number.' } });
  });

  it('stores a driver’s drop lines, pulse width and package rating, and the plan carries them (SLRS007B figures)', async () => {
    const { r, l, seed } = setup();
    // SLRS007B: least drop 1.6 V + 1.0 Ω × I (through 2.1 V at 0.5 A, 2.6 V at 1 A), worst 3.6 V at 1 A,
    // 2 A peak for 5 ms, 2075 mW package.
    const quad = {
      name: 'Quad board', supplyId: seed.supply.id, presetId: 'bipolar-quad-half-h-1a', partNumber: '', channels: '2', channelAmps: '1',
      channelPeakAmps: '2', totalAmps: '', dropVolts: '1.6', dropOhms: '1', dropMaxVolts: '2.6', dropMaxOhms: '1', peakPulseMs: '5', packageWatts: '2.075',
    };
    expect(await actions.createDriver(r, l, null, form(quad))).toMatchObject({ ok: true });
    const rows = loadLayoutRows(l);
    const board = rows.drivers.find((d) => d.name === 'Quad board')!;
    expect(board).toMatchObject({ dropVolts: 1.6, dropOhms: 1, dropMaxVolts: 2.6, dropMaxOhms: 1, peakPulseMs: 5, packageWatts: 2.075 });
    const planned = layoutToPlan(rows, { clock: { ratio: 1, fastStart: '00:00' }, rules: defaultRules }).drivers.find((d) => d.id === board.id)!;
    expect(planned).toMatchObject({ drop: { min: { fixedVolts: 1.6, ohms: 1 }, max: { fixedVolts: 2.6, ohms: 1 } }, peakPulseS: 0.005, packageWatts: 2.075 });
    // Blank worst case means "the same as the least"; a worst case below the least is refused.
    const flat = { ...quad, name: 'Flat board', dropMaxVolts: '', dropMaxOhms: '', peakPulseMs: '', packageWatts: '' };
    expect(await actions.createDriver(r, l, null, form(flat))).toMatchObject({ ok: true });
    expect(loadLayoutRows(l).drivers.find((d) => d.name === 'Flat board')).toMatchObject({ dropMaxVolts: null, peakPulseMs: null, packageWatts: null });
    expect(await actions.createDriver(r, l, null, form({ ...quad, name: 'Odd board', dropMaxVolts: '1' }))).toMatchObject({
      ok: false, fieldErrors: { dropMaxVolts: 'The worst-case drop cannot be below the least drop.' },
    });
  });

  it('a stale supply edit is 409 and keeps the other edit', async () => {
    const { r, l, seed } = setup();
    expect(await actions.updateSupply(r, l, null, form({ id: seed.supply.id, version: '1', name: 'Seed supply', volts: '16', amps: '4' }))).toMatchObject({ ok: true });
    expect(await actions.updateSupply(r, l, null, form({ id: seed.supply.id, version: '1', name: 'Seed supply', volts: '12', amps: '1' }))).toMatchObject({ ok: false, status: 409 });
    expect(loadLayoutRows(l).supplies.find((s) => s.id === seed.supply.id)).toMatchObject({ volts: 16, amps: 4, version: 2 });
  });
});

describe('rolling stock', () => {
  it('trains keep their consist in order; a loco in a train cannot be deleted; a train needs a loco', async () => {
    const { r, l, seed } = setup();
    expect(await actions.createTrain(r, l, null, form({ name: 'Double', locomotiveIds: [seed.spareLocomotive.id, seed.locomotive.id], lightingAmps: '', length: '120', unit: 'cm' }))).toMatchObject({ ok: true });
    const rows = loadLayoutRows(l);
    const double = rows.trains.find((t) => t.name === 'Double')!;
    expect(double).toMatchObject({ lengthMm: 1200, lightingAmps: 0 });
    expect(rows.consists.filter((c) => c.trainId === double.id).map((c) => c.locomotiveId)).toEqual([seed.spareLocomotive.id, seed.locomotive.id]);
    expect(await actions.createTrain(r, l, null, form({ name: 'Empty', lightingAmps: '0', length: '1', unit: 'm' }))).toMatchObject({
      ok: false, fieldErrors: { locomotiveIds: 'A train needs at least one locomotive.' },
    });
    expect(await actions.deleteLocomotive(r, l, null, form({ id: seed.locomotive.id, version: '1' }))).toMatchObject({ ok: false, status: 409 });
    expect(await actions.updateTrain(r, l, null, form({ id: double.id, version: '1', name: 'Double', locomotiveIds: [seed.locomotive.id], lightingAmps: '0.1', length: '1.2', unit: 'm' }))).toMatchObject({ ok: true });
    expect(await actions.updateTrain(r, l, null, form({ id: double.id, version: '1', name: 'Double', locomotiveIds: [seed.spareLocomotive.id], lightingAmps: '0', length: '1', unit: 'm' }))).toMatchObject({ ok: false, status: 409 });
    const after = loadLayoutRows(l);
    expect(after.consists.filter((c) => c.trainId === double.id).map((c) => c.locomotiveId)).toEqual([seed.locomotive.id]);
  });

  it('a locomotive of another layout cannot join a consist; stall below running is refused', async () => {
    const { w, r, l } = setup();
    const other = seedLayout(w.railway.id);
    expect(await actions.createTrain(r, l, null, form({ name: 'Borrowed', locomotiveIds: [other.locomotive.id], lightingAmps: '0', length: '1', unit: 'm' }))).toMatchObject({ ok: false, status: 400 });
    expect(await actions.createLocomotive(r, l, null, form({ name: 'Odd', runningAmps: '0.5', stallAmps: '0.2', ratedVolts: '12', topSpeedKmh: '80' }))).toMatchObject({
      ok: false, fieldErrors: { stallAmps: 'Stall current cannot be below the running current.' },
    });
  });

  it('a locomotive keeps its calibration: start voltage (blank: not measured) below its rated voltage', async () => {
    const { r, l } = setup();
    // Common practice: small can motors start at about 1.5–3 V.
    expect(await actions.createLocomotive(r, l, null, form({ name: 'Calibrated', runningAmps: '0.3', stallAmps: '0.8', ratedVolts: '12', topSpeedKmh: '90', startVolts: '2.2' }))).toMatchObject({ ok: true });
    expect(await actions.createLocomotive(r, l, null, form({ name: 'Unmeasured', runningAmps: '0.3', stallAmps: '0.8', ratedVolts: '12', topSpeedKmh: '90', startVolts: '' }))).toMatchObject({ ok: true });
    const rows = loadLayoutRows(l);
    expect(rows.locomotives.find((x) => x.name === 'Calibrated')).toMatchObject({ startVolts: 2.2, topSpeedKmh: 90 });
    expect(rows.locomotives.find((x) => x.name === 'Unmeasured')).toMatchObject({ startVolts: null });
    const planned = layoutToPlan(rows, { clock: { ratio: 1, fastStart: '00:00' }, rules: defaultRules }).locomotives.find((x) => x.name === 'Calibrated');
    expect(planned).toMatchObject({ startVolts: 2.2, topSpeedKmh: 90 });
    expect(await actions.createLocomotive(r, l, null, form({ name: 'Odd start', runningAmps: '0.3', stallAmps: '0.8', ratedVolts: '12', topSpeedKmh: '90', startVolts: '12' }))).toMatchObject({
      ok: false, fieldErrors: { startVolts: 'The start voltage must be below the rated voltage.' },
    });
  });
});
