import { eq, sql } from 'drizzle-orm';
import { beforeEach, describe, expect, it, vi } from 'vitest';
import * as actions from '@/app/(app)/railways/[railwayId]/layouts/[layoutId]/actions';
import { getDb } from '@/db';
import { insertCab, insertDriver } from '@/db/queries/layout-power';
import { loadLayoutRows } from '@/db/queries/plan-data';
import { insertRuns } from '@/db/queries/runs';
import * as t from '@/db/schema';
import { revalidateLayout, rowOrThrow } from '@/lib/layouts/layout-edits';
import { signInAs } from './caller';
import { seedLayout } from './authz/layouts';
import { makeSessionWorld, timedSteps } from './authz/sessions';
import { formFields as form, makeWorld } from './world';

// Every layout edit through its server action, pinned by value: the message each success and each
// refusal says in full, the audit row it leaves, the pages it revalidates and what is stored after.

const revalidated = vi.hoisted(() => [] as unknown[][]);
vi.mock('next/cache', () => ({ revalidatePath: (...args: unknown[]) => void revalidated.push(args), revalidateTag: () => undefined }));

beforeEach(() => {
  revalidated.length = 0;
});

function setup(role: 'planner' | 'host' = 'planner') {
  const w = makeWorld();
  const seed = seedLayout(w.railway.id);
  signInAs(w[role]);
  const audits = () =>
    getDb().select().from(t.auditLog).where(eq(t.auditLog.railwayId, w.railway.id)).orderBy(sql`rowid`).all();
  const lastAudit = () => audits().at(-1);
  return { w, seed, r: w.railway.id, l: seed.layout.id, audits, lastAudit };
}

/** The audit row and revalidated pages one successful edit leaves. */
function expectRecorded(s: ReturnType<typeof setup>, entry: { action: string; entity: string; entityId: string }) {
  expect(s.lastAudit()).toMatchObject({ ...entry, railwayId: s.r, userId: s.w.planner.id, detail: { layoutId: s.l } });
  expect(revalidated).toEqual([
    [`/railways/${s.r}/layouts`, 'layout'],
    [`/railways/${s.r}/layouts/${s.l}`, 'layout'],
  ]);
  revalidated.length = 0;
}

const notFound = (what: string) => ({ ok: false, status: 404, error: `${what} was not found.`, fieldErrors: {} });
const fieldRefusal = (path: string, message: string) => ({ ok: false, status: 400, error: message, fieldErrors: { [path]: message } });

const blockFields = { length: '1', unit: 'm', position: '0' };
const supplyFields = { volts: '12', amps: '2' };
const driverFields = { presetId: '', partNumber: '', channels: '2', channelAmps: '1', channelPeakAmps: '2', totalAmps: '', dropVolts: '1' };
const locoFields = { runningAmps: '0.3', stallAmps: '0.8', ratedVolts: '12', topSpeedKmh: '80' };
const trainFields = { lightingAmps: '0', length: '1', unit: 'm' };

describe('revalidateLayout and rowOrThrow', () => {
  it('revalidates the layout list alone when no layout is named, and the layout page too when one is', () => {
    revalidateLayout('rw1');
    expect(revalidated).toEqual([['/railways/rw1/layouts', 'layout']]);
    revalidated.length = 0;
    revalidateLayout('rw1', 'ly2');
    expect(revalidated).toEqual([
      ['/railways/rw1/layouts', 'layout'],
      ['/railways/rw1/layouts/ly2', 'layout'],
    ]);
  });

  it('turns a missing row into 404 naming it and a stale one into 409 carrying the current row', () => {
    expect(rowOrThrow({ ok: true, row: 7 }, 'That thing')).toBe(7);
    expect(() => rowOrThrow({ ok: false, reason: 'missing' } as never, 'That thing')).toThrow(expect.objectContaining({ status: 404, message: 'That thing was not found.' }));
    expect(() => rowOrThrow({ ok: false, reason: 'stale', current: { v: 2 } } as never, 'That thing')).toThrow(
      expect.objectContaining({ status: 409, extra: { current: { v: 2 } } }),
    );
  });
});

describe('who may edit a layout', () => {
  it('an operator is refused with 403 naming the edit, and nothing is written or revalidated', async () => {
    const s = setup();
    signInAs(s.w.operator);
    const before = s.audits().length;
    expect(await actions.createBlock(s.r, s.l, null, form({ name: 'Op block', ...blockFields }))).toEqual({
      ok: false, status: 403, error: 'Your role on this railway does not allow you to edit layouts.', fieldErrors: {},
    });
    expect(loadLayoutRows(s.l).blocks.map((b) => b.name)).not.toContain('Op block');
    expect(s.audits()).toHaveLength(before);
    expect(revalidated).toEqual([]);
  });

  it('a host edits like a planner', async () => {
    const s = setup('host');
    expect(await actions.createSupply(s.r, s.l, null, form({ name: 'Host supply', ...supplyFields }))).toEqual({ ok: true, message: 'Supply “Host supply” added.' });
    expect(s.lastAudit()).toMatchObject({ userId: s.w.host.id, entity: 'supply', action: 'create' });
  });
});

describe('blocks and links', () => {
  it('adds, saves and deletes a block with its messages, audit rows and revalidations', async () => {
    const s = setup();
    expect(await actions.createBlock(s.r, s.l, null, form({ name: 'New block', ...blockFields }))).toEqual({ ok: true, message: 'Block “New block” added.' });
    const id = loadLayoutRows(s.l).blocks.find((b) => b.name === 'New block')!.id;
    expectRecorded(s, { action: 'create', entity: 'block', entityId: id });
    // Renaming a block to its own name in another case is not a clash with itself.
    expect(await actions.updateBlock(s.r, s.l, null, form({ id, version: '1', name: 'NEW BLOCK', ...blockFields }))).toEqual({ ok: true, message: 'Block “NEW BLOCK” saved.' });
    expectRecorded(s, { action: 'update', entity: 'block', entityId: id });
    expect(await actions.updateBlock(s.r, s.l, null, form({ id, version: '2', name: 'Seed west', ...blockFields }))).toEqual(
      fieldRefusal('name', 'There is already a block named “Seed west” in this layout.'),
    );
    expect(await actions.deleteBlock(s.r, s.l, null, form({ id, version: '2' }))).toEqual({ ok: true, message: 'Block “NEW BLOCK” deleted.' });
    expectRecorded(s, { action: 'delete', entity: 'block', entityId: id });
  });

  it('a missing block is 404 on edit and delete', async () => {
    const s = setup();
    expect(await actions.updateBlock(s.r, s.l, null, form({ id: 'no-such-block', version: '1', name: 'Ghost', ...blockFields }))).toEqual(notFound('That block'));
    expect(await actions.deleteBlock(s.r, s.l, null, form({ id: 'no-such-block', version: '1' }))).toEqual(notFound('That block'));
  });

  it('a block in timetabled steps is not deleted (409 counting them); another layout’s block is 404 here', async () => {
    const w = makeWorld();
    const { layout } = makeSessionWorld(w);
    signInAs(w.planner);
    const r = w.railway.id;
    // Route A–B–C and D–C–B: A is in one step, B in two.
    expect(await actions.deleteBlock(r, layout.layoutId, null, form({ id: layout.blocks.A!, version: '1' }))).toEqual({
      ok: false, status: 409, error: 'This block is in 1 timetabled step; take it out of the timetables first.', fieldErrors: {},
    });
    expect(await actions.deleteBlock(r, layout.layoutId, null, form({ id: layout.blocks.B!, version: '1' }))).toEqual({
      ok: false, status: 409, error: 'This block is in 2 timetabled steps; take it out of the timetables first.', fieldErrors: {},
    });
    expect(loadLayoutRows(layout.layoutId).blocks).toHaveLength(4);
    const seed = seedLayout(r);
    expect(await actions.deleteBlock(r, seed.layout.id, null, form({ id: layout.blocks.B!, version: '1' }))).toEqual(notFound('That block'));
  });

  it('links two ends with a message naming them; a repeat, and a block of another layout on either side, are refused by field', async () => {
    const s = setup();
    const other = seedLayout(s.r);
    const link = { blockAId: s.seed.blockB.id, blockAEnd: 'b', blockBId: s.seed.blockC.id, blockBEnd: 'a' };
    expect(await actions.createLink(s.r, s.l, null, form(link))).toEqual({ ok: true, message: 'Linked the b end of “Seed west” to the a end of “Seed siding”.' });
    const made = loadLayoutRows(s.l).links.find((k) => k.blockBId === s.seed.blockC.id)!;
    expectRecorded(s, { action: 'create', entity: 'link', entityId: made.id });
    expect(await actions.createLink(s.r, s.l, null, form(link))).toEqual(
      fieldRefusal('blockBId', 'The b end of “Seed west” and the a end of “Seed siding” are already linked.'),
    );
    expect(await actions.createLink(s.r, s.l, null, form({ ...link, blockAId: other.blockA.id }))).toEqual(fieldRefusal('blockAId', 'Choose a block of this layout.'));
    expect(await actions.createLink(s.r, s.l, null, form({ ...link, blockBId: other.blockA.id }))).toEqual(fieldRefusal('blockBId', 'Choose a block of this layout.'));
    expect(loadLayoutRows(s.l).links).toHaveLength(2);
    expect(await actions.deleteLink(s.r, s.l, null, form({ id: made.id }))).toEqual({ ok: true, message: 'Link deleted.' });
    expectRecorded(s, { action: 'delete', entity: 'link', entityId: made.id });
    expect(await actions.deleteLink(s.r, s.l, null, form({ id: made.id }))).toEqual(notFound('That link'));
  });
});

describe('power', () => {
  it('adds, saves and deletes a supply; one feeding drivers names them (by name) and stays', async () => {
    const s = setup();
    expect(await actions.createSupply(s.r, s.l, null, form({ name: 'Bench', ...supplyFields }))).toEqual({ ok: true, message: 'Supply “Bench” added.' });
    const id = loadLayoutRows(s.l).supplies.find((x) => x.name === 'Bench')!.id;
    expectRecorded(s, { action: 'create', entity: 'supply', entityId: id });
    expect(await actions.createSupply(s.r, s.l, null, form({ name: 'bench', ...supplyFields }))).toEqual(fieldRefusal('name', 'There is already a supply named “bench” in this layout.'));
    expect(await actions.updateSupply(s.r, s.l, null, form({ id, version: '1', name: 'Spare supply', ...supplyFields }))).toEqual(
      fieldRefusal('name', 'There is already a supply named “Spare supply” in this layout.'),
    );
    expect(await actions.updateSupply(s.r, s.l, null, form({ id, version: '1', name: 'Bench two', ...supplyFields }))).toEqual({ ok: true, message: 'Supply “Bench two” saved.' });
    expectRecorded(s, { action: 'update', entity: 'supply', entityId: id });
    expect(await actions.updateSupply(s.r, s.l, null, form({ id: 'no-such-supply', version: '1', name: 'Ghost', ...supplyFields }))).toEqual(notFound('That supply'));
    expect(await actions.deleteSupply(s.r, s.l, null, form({ id: 'no-such-supply', version: '1' }))).toEqual(notFound('That supply'));
    expect(await actions.deleteSupply(s.r, s.l, null, form({ id: s.seed.supply.id, version: '1' }))).toEqual({
      ok: false, status: 409, error: 'This supply still feeds “Idle driver”, “Seed driver”; move or delete those drivers first.', fieldErrors: {},
    });
    expect(await actions.deleteSupply(s.r, s.l, null, form({ id, version: '2' }))).toEqual({ ok: true, message: 'Supply “Bench two” deleted.' });
    expectRecorded(s, { action: 'delete', entity: 'supply', entityId: id });
    expect(loadLayoutRows(s.l).supplies.map((x) => x.name).sort()).toEqual(['Seed supply', 'Spare supply']);
  });

  it('adds, saves and deletes a driver; its supply must be of this layout; one with cabs names them', async () => {
    const s = setup();
    const other = seedLayout(s.r);
    expect(await actions.createDriver(s.r, s.l, null, form({ name: 'Foreign fed', supplyId: other.supply.id, ...driverFields }))).toEqual(
      fieldRefusal('supplyId', 'Choose a supply of this layout.'),
    );
    expect(await actions.createDriver(s.r, s.l, null, form({ name: 'idle DRIVER', supplyId: s.seed.supply.id, ...driverFields }))).toEqual(
      fieldRefusal('name', 'There is already a driver named “idle DRIVER” in this layout.'),
    );
    expect(loadLayoutRows(s.l).drivers).toHaveLength(2);
    expect(await actions.createDriver(s.r, s.l, null, form({ name: 'Board X', supplyId: s.seed.supply.id, ...driverFields }))).toEqual({ ok: true, message: 'Driver “Board X” added.' });
    const id = loadLayoutRows(s.l).drivers.find((d) => d.name === 'Board X')!.id;
    expectRecorded(s, { action: 'create', entity: 'driver', entityId: id });
    const edit = { id, version: '1', supplyId: s.seed.spare.id, ...driverFields };
    expect(await actions.updateDriver(s.r, s.l, null, form({ ...edit, name: 'Idle driver' }))).toEqual(fieldRefusal('name', 'There is already a driver named “Idle driver” in this layout.'));
    expect(await actions.updateDriver(s.r, s.l, null, form({ ...edit, name: 'Board X', supplyId: other.supply.id }))).toEqual(fieldRefusal('supplyId', 'Choose a supply of this layout.'));
    expect(await actions.updateDriver(s.r, s.l, null, form({ ...edit, name: 'Board Y' }))).toEqual({ ok: true, message: 'Driver “Board Y” saved.' });
    expectRecorded(s, { action: 'update', entity: 'driver', entityId: id });
    expect(loadLayoutRows(s.l).drivers.find((d) => d.id === id)).toMatchObject({ supplyId: s.seed.spare.id, version: 2 });
    expect(await actions.updateDriver(s.r, s.l, null, form({ ...edit, id: 'no-such-driver', name: 'Ghost' }))).toEqual(notFound('That driver'));
    expect(await actions.deleteDriver(s.r, s.l, null, form({ id: 'no-such-driver', version: '1' }))).toEqual(notFound('That driver'));
    insertCab(s.l, { name: 'Cab two', driverId: s.seed.driver.id, channel: 2 });
    expect(await actions.deleteDriver(s.r, s.l, null, form({ id: s.seed.driver.id, version: '1' }))).toEqual({
      ok: false, status: 409, error: 'Cabs “Seed cab”, “Cab two” are on this driver; move or delete them first.', fieldErrors: {},
    });
    expect(await actions.deleteDriver(s.r, s.l, null, form({ id, version: '2' }))).toEqual({ ok: true, message: 'Driver “Board Y” deleted.' });
    expectRecorded(s, { action: 'delete', entity: 'driver', entityId: id });
    expect(loadLayoutRows(s.l).drivers.map((d) => d.name).sort()).toEqual(['Idle driver', 'Seed driver']);
  });

  it('a driver keeps at least the channels its cabs use: equal is fine, fewer names the cabs and their channels', async () => {
    const s = setup();
    const edit = { id: s.seed.driver.id, name: 'Seed driver', supplyId: s.seed.supply.id, ...driverFields };
    // The seed cab is on channel 1: a one-channel driver still has it.
    expect(await actions.updateDriver(s.r, s.l, null, form({ ...edit, version: '1', channels: '1' }))).toMatchObject({ ok: true });
    expect(await actions.updateDriver(s.r, s.l, null, form({ ...edit, version: '2', channels: '4' }))).toMatchObject({ ok: true });
    insertCab(s.l, { name: 'Cab three', driverId: s.seed.driver.id, channel: 3 });
    expect(await actions.updateDriver(s.r, s.l, null, form({ ...edit, version: '3', channels: '2' }))).toEqual(
      fieldRefusal('channels', '“Cab three” uses channel 3; move it first.'),
    );
    insertCab(s.l, { name: 'Cab four', driverId: s.seed.driver.id, channel: 4 });
    expect(await actions.updateDriver(s.r, s.l, null, form({ ...edit, version: '3', channels: '2' }))).toEqual(
      fieldRefusal('channels', '“Cab three”, “Cab four” use channel 3, 4; move them first.'),
    );
    expect(loadLayoutRows(s.l).drivers.find((d) => d.id === s.seed.driver.id)).toMatchObject({ channels: 4, version: 3 });
  });

  it('adds, saves and deletes a cab; its driver and channel must exist and be free', async () => {
    const s = setup();
    const other = seedLayout(s.r);
    const single = insertDriver(s.l, { ...{ presetId: null, partNumber: null, totalAmps: null, dropVolts: 1 }, name: 'Single', supplyId: s.seed.supply.id, channels: 1, channelAmps: 1, channelPeakAmps: 2 });
    expect(await actions.createCab(s.r, s.l, null, form({ name: 'Stray', driverId: other.driver.id, channel: '1' }))).toEqual(fieldRefusal('driverId', 'Choose a driver of this layout.'));
    expect(await actions.createCab(s.r, s.l, null, form({ name: 'Stray', driverId: single.id, channel: '2' }))).toEqual(fieldRefusal('channel', '“Single” has channel 1 only.'));
    expect(await actions.createCab(s.r, s.l, null, form({ name: 'seed cab', driverId: single.id, channel: '1' }))).toEqual(fieldRefusal('name', 'There is already a cab named “seed cab” in this layout.'));
    expect(await actions.createCab(s.r, s.l, null, form({ name: 'Cab S', driverId: single.id, channel: '1' }))).toEqual({ ok: true, message: 'Cab “Cab S” added.' });
    const id = loadLayoutRows(s.l).cabs.find((c) => c.name === 'Cab S')!.id;
    expectRecorded(s, { action: 'create', entity: 'cab', entityId: id });
    // Saving a cab on its own channel is no clash with itself; another cab's name is.
    expect(await actions.updateCab(s.r, s.l, null, form({ id, version: '1', name: 'Cab S1', driverId: single.id, channel: '1' }))).toEqual({ ok: true, message: 'Cab “Cab S1” saved.' });
    expectRecorded(s, { action: 'update', entity: 'cab', entityId: id });
    expect(await actions.updateCab(s.r, s.l, null, form({ id, version: '2', name: 'Seed cab', driverId: single.id, channel: '1' }))).toEqual(
      fieldRefusal('name', 'There is already a cab named “Seed cab” in this layout.'),
    );
    expect(await actions.updateCab(s.r, s.l, null, form({ id, version: '2', name: 'Cab S1', driverId: s.seed.driver.id, channel: '1' }))).toEqual(
      fieldRefusal('channel', 'Channel 1 of “Seed driver” is already cab “Seed cab”.'),
    );
    expect(await actions.updateCab(s.r, s.l, null, form({ id: 'no-such-cab', version: '1', name: 'Ghost', driverId: single.id, channel: '1' }))).toEqual(
      fieldRefusal('channel', 'Channel 1 of “Single” is already cab “Cab S1”.'),
    );
    expect(await actions.updateCab(s.r, s.l, null, form({ id: 'no-such-cab', version: '1', name: 'Ghost', driverId: s.seed.driver.id, channel: '2' }))).toEqual(notFound('That cab'));
    expect(await actions.deleteCab(s.r, s.l, null, form({ id: 'no-such-cab', version: '1' }))).toEqual(notFound('That cab'));
    expect(await actions.deleteCab(s.r, s.l, null, form({ id, version: '2' }))).toEqual({ ok: true, message: 'Cab “Cab S1” deleted.' });
    expectRecorded(s, { action: 'delete', entity: 'cab', entityId: id });
    expect(loadLayoutRows(s.l).cabs.map((c) => c.name)).toEqual(['Seed cab']);
  });

  it('a cab used by timetabled runs is not deleted (409 counting them); another layout’s cab is 404 here', async () => {
    const w = makeWorld();
    const { layout, session } = makeSessionWorld(w);
    signInAs(w.planner);
    const r = w.railway.id;
    expect(await actions.deleteCab(r, layout.layoutId, null, form({ id: layout.cabs.c1, version: '1' }))).toEqual({
      ok: false, status: 409, error: 'This cab is used by 1 timetabled run; move them to another cab first.', fieldErrors: {},
    });
    expect(await actions.deleteTrain(r, layout.layoutId, null, form({ id: layout.trains.t1, version: '1' }))).toEqual({
      ok: false, status: 409, error: 'This train has 1 timetabled run; delete those runs first.', fieldErrors: {},
    });
    insertRuns(session.id, [{ trainId: layout.trains.t1, cabId: layout.cabs.c1, operatorId: null, speedKmh: 60, note: '', ...timedSteps(layout, ['A', 'B'], 400) }]);
    expect(await actions.deleteCab(r, layout.layoutId, null, form({ id: layout.cabs.c1, version: '1' }))).toEqual({
      ok: false, status: 409, error: 'This cab is used by 2 timetabled runs; move them to another cab first.', fieldErrors: {},
    });
    expect(await actions.deleteTrain(r, layout.layoutId, null, form({ id: layout.trains.t1, version: '1' }))).toEqual({
      ok: false, status: 409, error: 'This train has 2 timetabled runs; delete those runs first.', fieldErrors: {},
    });
    const rows = loadLayoutRows(layout.layoutId);
    expect([rows.cabs.length, rows.trains.length]).toEqual([2, 2]);
    const seed = seedLayout(r);
    expect(await actions.deleteCab(r, seed.layout.id, null, form({ id: layout.cabs.c1, version: '1' }))).toEqual(notFound('That cab'));
    expect(await actions.deleteTrain(r, seed.layout.id, null, form({ id: layout.trains.t1, version: '1' }))).toEqual(notFound('That train'));
  });
});

describe('rolling stock', () => {
  it('adds, saves and deletes a locomotive; one in trains names them and stays', async () => {
    const s = setup();
    expect(await actions.createLocomotive(s.r, s.l, null, form({ name: 'SEED LOCO', ...locoFields }))).toEqual(
      fieldRefusal('name', 'There is already a locomotive named “SEED LOCO” in this layout.'),
    );
    expect(await actions.createLocomotive(s.r, s.l, null, form({ name: 'Shunter', ...locoFields }))).toEqual({ ok: true, message: 'Locomotive “Shunter” added.' });
    const id = loadLayoutRows(s.l).locomotives.find((x) => x.name === 'Shunter')!.id;
    expectRecorded(s, { action: 'create', entity: 'locomotive', entityId: id });
    expect(await actions.updateLocomotive(s.r, s.l, null, form({ id, version: '1', name: 'Spare loco', ...locoFields }))).toEqual(
      fieldRefusal('name', 'There is already a locomotive named “Spare loco” in this layout.'),
    );
    expect(await actions.updateLocomotive(s.r, s.l, null, form({ id, version: '1', name: 'Shunter two', ...locoFields }))).toEqual({ ok: true, message: 'Locomotive “Shunter two” saved.' });
    expectRecorded(s, { action: 'update', entity: 'locomotive', entityId: id });
    expect(await actions.updateLocomotive(s.r, s.l, null, form({ id: 'no-such-loco', version: '1', name: 'Ghost', ...locoFields }))).toEqual(notFound('That locomotive'));
    expect(await actions.deleteLocomotive(s.r, s.l, null, form({ id: 'no-such-loco', version: '1' }))).toEqual(notFound('That locomotive'));
    expect(await actions.createTrain(s.r, s.l, null, form({ name: 'Second', locomotiveIds: [s.seed.locomotive.id], ...trainFields }))).toMatchObject({ ok: true });
    revalidated.length = 0;
    expect(await actions.deleteLocomotive(s.r, s.l, null, form({ id: s.seed.locomotive.id, version: '1' }))).toEqual({
      ok: false, status: 409, error: 'This locomotive is in “Second”, “Seed train”; take it out of those consists first.', fieldErrors: {},
    });
    expect(await actions.deleteLocomotive(s.r, s.l, null, form({ id, version: '2' }))).toEqual({ ok: true, message: 'Locomotive “Shunter two” deleted.' });
    expectRecorded(s, { action: 'delete', entity: 'locomotive', entityId: id });
    expect(loadLayoutRows(s.l).locomotives.map((x) => x.name).sort()).toEqual(['Seed loco', 'Spare loco']);
    // Another layout's locomotive in a train there is not found here (not "in a train").
    const other = seedLayout(s.r);
    expect(await actions.deleteLocomotive(s.r, s.l, null, form({ id: other.locomotive.id, version: '1' }))).toEqual(notFound('That locomotive'));
  });

  it('adds, saves and deletes a train; every locomotive of its consist must be of this layout', async () => {
    const s = setup();
    const other = seedLayout(s.r);
    expect(await actions.createTrain(s.r, s.l, null, form({ name: 'Mixed', locomotiveIds: [s.seed.locomotive.id, other.locomotive.id], ...trainFields }))).toEqual(
      fieldRefusal('locomotiveIds', 'Choose locomotives of this layout.'),
    );
    expect(await actions.createTrain(s.r, s.l, null, form({ name: 'seed train', locomotiveIds: [s.seed.locomotive.id], ...trainFields }))).toEqual(
      fieldRefusal('name', 'There is already a train named “seed train” in this layout.'),
    );
    expect(loadLayoutRows(s.l).trains).toHaveLength(1);
    expect(await actions.createTrain(s.r, s.l, null, form({ name: 'Pick-up goods', locomotiveIds: [s.seed.spareLocomotive.id], ...trainFields }))).toEqual({
      ok: true, message: 'Train “Pick-up goods” added.',
    });
    const id = loadLayoutRows(s.l).trains.find((x) => x.name === 'Pick-up goods')!.id;
    expectRecorded(s, { action: 'create', entity: 'train', entityId: id });
    const edit = { id, version: '1', locomotiveIds: [s.seed.locomotive.id], ...trainFields };
    expect(await actions.updateTrain(s.r, s.l, null, form({ ...edit, name: 'Seed train' }))).toEqual(fieldRefusal('name', 'There is already a train named “Seed train” in this layout.'));
    expect(await actions.updateTrain(s.r, s.l, null, form({ ...edit, name: 'Goods', locomotiveIds: [other.locomotive.id, s.seed.locomotive.id] }))).toEqual(
      fieldRefusal('locomotiveIds', 'Choose locomotives of this layout.'),
    );
    expect(await actions.updateTrain(s.r, s.l, null, form({ ...edit, name: 'Goods' }))).toEqual({ ok: true, message: 'Train “Goods” saved.' });
    expectRecorded(s, { action: 'update', entity: 'train', entityId: id });
    expect(await actions.updateTrain(s.r, s.l, null, form({ ...edit, id: 'no-such-train', name: 'Ghost' }))).toEqual(notFound('That train'));
    expect(await actions.deleteTrain(s.r, s.l, null, form({ id: 'no-such-train', version: '1' }))).toEqual(notFound('That train'));
    expect(await actions.deleteTrain(s.r, s.l, null, form({ id, version: '2' }))).toEqual({ ok: true, message: 'Train “Goods” deleted.' });
    expectRecorded(s, { action: 'delete', entity: 'train', entityId: id });
    const rows = loadLayoutRows(s.l);
    expect(rows.trains.map((x) => x.name)).toEqual(['Seed train']);
    expect(rows.consists.filter((c) => c.trainId === id)).toEqual([]);
  });
});

describe('refusals that list names', () => {
  it('quote each name and join them with commas, from a freshly imported module', async () => {
    // The list helper is built when layout-edits is evaluated: imported again here (vi.resetModules) so a
    // mutation test run, which switches a change on in a beforeAll, sees it.
    const s = setup();
    vi.resetModules();
    const fresh = await import('@/app/(app)/railways/[railwayId]/layouts/[layoutId]/actions');
    expect(await fresh.deleteSupply(s.r, s.l, null, form({ id: s.seed.supply.id, version: '1' }))).toEqual({
      ok: false, status: 409, error: 'This supply still feeds “Idle driver”, “Seed driver”; move or delete those drivers first.', fieldErrors: {},
    });
  });
});
