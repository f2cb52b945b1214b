import 'server-only';
import { revalidatePath } from 'next/cache';
import type { VersionedResult } from '@/db/queries/layouts';
import { countBlockSteps, deleteLinkById, findLink, insertBlock, insertLink, type BlockValues } from '@/db/queries/layout-blocks';
import {
  cabOnChannel,
  cabsOfDriver,
  countCabRuns,
  driversOfSupply,
  insertCab,
  insertDriver,
  insertSupply,
  type CabValues,
  type DriverValues,
  type SupplyValues,
} from '@/db/queries/layout-power';
import { deleteVersionedRow, getLayoutRow, namesInLayout, updateVersionedRow, type VersionedLayoutTable } from '@/db/queries/layout-rows';
import {
  countTrainRuns,
  insertLocomotive,
  insertTrain,
  locomotiveIdsInLayout,
  setConsist,
  trainsOfLocomotive,
  type LocomotiveValues,
  type TrainValues,
} from '@/db/queries/layout-stock';
import { recordAudit } from '@/db/queries/railways';
import { writeTransaction } from '@/db';
import * as t from '@/db/schema';
import { requireLayout, type LayoutContext } from '@/lib/auth/layouts';
import { AppError, conflict, notFound, toActionState, type ActionState } from '@/lib/errors';

/** A versioned write's row, or the 404 / 409 it deserves. */
export function rowOrThrow<R>(result: VersionedResult<R>, what: string): R {
  if (result.ok) return result.row;
  if (result.reason === 'missing') throw notFound(what);
  throw conflict(result.current);
}

/** Runs one edit of a layout as a server action: planner or host, audited, pages revalidated. */
export async function runLayoutAction(
  railwayId: string,
  layoutId: string,
  edit: (ctx: LayoutContext) => { message: string; entity: string; entityId: string; action: string },
): Promise<ActionState> {
  try {
    const ctx = await requireLayout(railwayId, layoutId, 'planner', 'edit layouts');
    const done = edit(ctx);
    recordAudit({
      railwayId: ctx.member.railwayId,
      userId: ctx.member.user.id,
      action: done.action,
      entity: done.entity,
      entityId: done.entityId,
      detail: { layoutId: ctx.layout.id },
    });
    revalidateLayout(ctx.member.railwayId, ctx.layout.id);
    return { ok: true, message: done.message };
  } catch (error) {
    return toActionState(error);
  }
}

export function revalidateLayout(railwayId: string, layoutId?: string): void {
  revalidatePath(`/railways/${railwayId}/layouts`, 'layout');
  if (layoutId) revalidatePath(`/railways/${railwayId}/layouts/${layoutId}`, 'layout');
}

function fieldError(path: string, message: string): AppError {
  return new AppError('bad_request', message, { issues: [{ path, message }] });
}

/** Names are unique within a layout's table (ignoring case), so CSV rows and pickers are unambiguous. */
function assertNameFree(table: VersionedLayoutTable, layoutId: string, name: string, noun: string, exceptId?: string) {
  const holder = namesInLayout(table, layoutId).get(name.toLowerCase());
  if (holder !== undefined && holder !== exceptId) throw fieldError('name', `There is already a ${noun} named “${name}” in this layout.`);
}

const list = (names: string[]) => names.map((n) => `“${n}”`).join(', ');

// ---- Blocks and links -----------------------------------------------------------------------------

export function addBlock({ layout }: LayoutContext, input: BlockValues) {
  assertNameFree(t.blocks, layout.id, input.name, 'block');
  const row = insertBlock(layout.id, input);
  return { message: `Block “${row.name}” added.`, entity: 'block', entityId: row.id, action: 'create' };
}

export function editBlock({ layout }: LayoutContext, input: BlockValues & { id: string; version: number }) {
  assertNameFree(t.blocks, layout.id, input.name, 'block', input.id);
  const { id, version, ...values } = input;
  const row = rowOrThrow(updateVersionedRow(t.blocks, layout.id, id, version, values), 'That block');
  return { message: `Block “${row.name}” saved.`, entity: 'block', entityId: row.id, action: 'update' };
}

export function removeBlock({ layout }: LayoutContext, input: { id: string; version: number }) {
  if (!getLayoutRow(t.blocks, layout.id, input.id)) throw notFound('That block');
  const steps = countBlockSteps(input.id);
  if (steps > 0) throw new AppError('conflict', `This block is in ${steps} timetabled step${steps === 1 ? '' : 's'}; take it out of the timetables first.`);
  // Its links go with it (cascade).
  const row = rowOrThrow(deleteVersionedRow(t.blocks, layout.id, input.id, input.version), 'That block');
  return { message: `Block “${row.name}” deleted.`, entity: 'block', entityId: row.id, action: 'delete' };
}

export function addLink({ layout }: LayoutContext, input: { blockAId: string; blockBId: string; blockAEnd: 'a' | 'b'; blockBEnd: 'a' | 'b' }) {
  const a = getLayoutRow(t.blocks, layout.id, input.blockAId);
  const b = getLayoutRow(t.blocks, layout.id, input.blockBId);
  if (!a) throw fieldError('blockAId', 'Choose a block of this layout.');
  if (!b) throw fieldError('blockBId', 'Choose a block of this layout.');
  const ends = { aEnd: input.blockAEnd, bEnd: input.blockBEnd };
  if (findLink(layout.id, a.id, b.id, ends)) throw fieldError('blockBId', `The ${ends.aEnd} end of “${a.name}” and the ${ends.bEnd} end of “${b.name}” are already linked.`);
  const row = insertLink(layout.id, a.id, b.id, ends);
  return { message: `Linked the ${ends.aEnd} end of “${a.name}” to the ${ends.bEnd} end of “${b.name}”.`, entity: 'link', entityId: row.id, action: 'create' };
}

export function removeLink({ layout }: LayoutContext, input: { id: string }) {
  if (!deleteLinkById(layout.id, input.id)) throw notFound('That link');
  return { message: 'Link deleted.', entity: 'link', entityId: input.id, action: 'delete' };
}

// ---- Power ----------------------------------------------------------------------------------------

export function addSupply({ layout }: LayoutContext, input: SupplyValues) {
  assertNameFree(t.supplies, layout.id, input.name, 'supply');
  const row = insertSupply(layout.id, input);
  return { message: `Supply “${row.name}” added.`, entity: 'supply', entityId: row.id, action: 'create' };
}

export function editSupply({ layout }: LayoutContext, input: SupplyValues & { id: string; version: number }) {
  assertNameFree(t.supplies, layout.id, input.name, 'supply', input.id);
  const { id, version, ...values } = input;
  const row = rowOrThrow(updateVersionedRow(t.supplies, layout.id, id, version, values), 'That supply');
  return { message: `Supply “${row.name}” saved.`, entity: 'supply', entityId: row.id, action: 'update' };
}

export function removeSupply({ layout }: LayoutContext, input: { id: string; version: number }) {
  if (!getLayoutRow(t.supplies, layout.id, input.id)) throw notFound('That supply');
  const fed = driversOfSupply(layout.id, input.id);
  if (fed.length) throw new AppError('conflict', `This supply still feeds ${list(fed.map((d) => d.name))}; move or delete those drivers first.`);
  const row = rowOrThrow(deleteVersionedRow(t.supplies, layout.id, input.id, input.version), 'That supply');
  return { message: `Supply “${row.name}” deleted.`, entity: 'supply', entityId: row.id, action: 'delete' };
}

function assertSupplyOfLayout(layoutId: string, supplyId: string) {
  if (!getLayoutRow(t.supplies, layoutId, supplyId)) throw fieldError('supplyId', 'Choose a supply of this layout.');
}

export function addDriver({ layout }: LayoutContext, input: DriverValues) {
  assertNameFree(t.drivers, layout.id, input.name, 'driver');
  assertSupplyOfLayout(layout.id, input.supplyId);
  const row = insertDriver(layout.id, input);
  return { message: `Driver “${row.name}” added.`, entity: 'driver', entityId: row.id, action: 'create' };
}

export function editDriver({ layout }: LayoutContext, input: DriverValues & { id: string; version: number }) {
  assertNameFree(t.drivers, layout.id, input.name, 'driver', input.id);
  assertSupplyOfLayout(layout.id, input.supplyId);
  const beyond = cabsOfDriver(layout.id, input.id).filter((c) => c.channel > input.channels);
  if (beyond.length) {
    throw fieldError('channels', `${list(beyond.map((c) => `${c.name}`))} use${beyond.length === 1 ? 's' : ''} channel ${beyond.map((c) => c.channel).join(', ')}; move ${beyond.length === 1 ? 'it' : 'them'} first.`);
  }
  const { id, version, ...values } = input;
  const row = rowOrThrow(updateVersionedRow(t.drivers, layout.id, id, version, values), 'That driver');
  return { message: `Driver “${row.name}” saved.`, entity: 'driver', entityId: row.id, action: 'update' };
}

export function removeDriver({ layout }: LayoutContext, input: { id: string; version: number }) {
  if (!getLayoutRow(t.drivers, layout.id, input.id)) throw notFound('That driver');
  const onIt = cabsOfDriver(layout.id, input.id);
  if (onIt.length) throw new AppError('conflict', `Cabs ${list(onIt.map((c) => c.name))} are on this driver; move or delete them first.`);
  const row = rowOrThrow(deleteVersionedRow(t.drivers, layout.id, input.id, input.version), 'That driver');
  return { message: `Driver “${row.name}” deleted.`, entity: 'driver', entityId: row.id, action: 'delete' };
}

function assertChannel(layoutId: string, input: CabValues, exceptCabId?: string) {
  const driver = getLayoutRow(t.drivers, layoutId, input.driverId);
  if (!driver) throw fieldError('driverId', 'Choose a driver of this layout.');
  if (input.channel > driver.channels) {
    throw fieldError('channel', `“${driver.name}” has channel${driver.channels === 1 ? ' 1 only' : `s 1 to ${driver.channels}`}.`);
  }
  const holder = cabOnChannel(layoutId, input.driverId, input.channel, exceptCabId);
  if (holder) throw fieldError('channel', `Channel ${input.channel} of “${driver.name}” is already cab “${holder.name}”.`);
}

export function addCab({ layout }: LayoutContext, input: CabValues) {
  assertNameFree(t.cabs, layout.id, input.name, 'cab');
  assertChannel(layout.id, input);
  const row = insertCab(layout.id, input);
  return { message: `Cab “${row.name}” added.`, entity: 'cab', entityId: row.id, action: 'create' };
}

export function editCab({ layout }: LayoutContext, input: CabValues & { id: string; version: number }) {
  assertNameFree(t.cabs, layout.id, input.name, 'cab', input.id);
  assertChannel(layout.id, input, input.id);
  const { id, version, ...values } = input;
  const row = rowOrThrow(updateVersionedRow(t.cabs, layout.id, id, version, values), 'That cab');
  return { message: `Cab “${row.name}” saved.`, entity: 'cab', entityId: row.id, action: 'update' };
}

export function removeCab({ layout }: LayoutContext, input: { id: string; version: number }) {
  if (!getLayoutRow(t.cabs, layout.id, input.id)) throw notFound('That cab');
  const n = countCabRuns(input.id);
  if (n > 0) throw new AppError('conflict', `This cab is used by ${n} timetabled run${n === 1 ? '' : 's'}; move them to another cab first.`);
  const row = rowOrThrow(deleteVersionedRow(t.cabs, layout.id, input.id, input.version), 'That cab');
  return { message: `Cab “${row.name}” deleted.`, entity: 'cab', entityId: row.id, action: 'delete' };
}

// ---- Rolling stock -------------------------------------------------------------------------------

export function addLocomotive({ layout }: LayoutContext, input: LocomotiveValues) {
  assertNameFree(t.locomotives, layout.id, input.name, 'locomotive');
  const row = insertLocomotive(layout.id, input);
  return { message: `Locomotive “${row.name}” added.`, entity: 'locomotive', entityId: row.id, action: 'create' };
}

export function editLocomotive({ layout }: LayoutContext, input: LocomotiveValues & { id: string; version: number }) {
  assertNameFree(t.locomotives, layout.id, input.name, 'locomotive', input.id);
  const { id, version, ...values } = input;
  const row = rowOrThrow(updateVersionedRow(t.locomotives, layout.id, id, version, values), 'That locomotive');
  return { message: `Locomotive “${row.name}” saved.`, entity: 'locomotive', entityId: row.id, action: 'update' };
}

export function removeLocomotive({ layout }: LayoutContext, input: { id: string; version: number }) {
  if (!getLayoutRow(t.locomotives, layout.id, input.id)) throw notFound('That locomotive');
  const inTrains = trainsOfLocomotive(input.id);
  if (inTrains.length) throw new AppError('conflict', `This locomotive is in ${list(inTrains.map((tr) => tr.name))}; take it out of those consists first.`);
  const row = rowOrThrow(deleteVersionedRow(t.locomotives, layout.id, input.id, input.version), 'That locomotive');
  return { message: `Locomotive “${row.name}” deleted.`, entity: 'locomotive', entityId: row.id, action: 'delete' };
}

function assertConsist(layoutId: string, ids: readonly string[]) {
  const known = locomotiveIdsInLayout(layoutId, ids);
  if (ids.some((id) => !known.has(id))) throw fieldError('locomotiveIds', 'Choose locomotives of this layout.');
}

export function addTrain({ layout }: LayoutContext, input: TrainValues & { locomotiveIds: string[] }) {
  assertNameFree(t.trains, layout.id, input.name, 'train');
  assertConsist(layout.id, input.locomotiveIds);
  const { locomotiveIds, ...values } = input;
  const row = insertTrain(layout.id, values, locomotiveIds);
  return { message: `Train “${row.name}” added.`, entity: 'train', entityId: row.id, action: 'create' };
}

export function editTrain({ layout }: LayoutContext, input: TrainValues & { id: string; version: number; locomotiveIds: string[] }) {
  assertNameFree(t.trains, layout.id, input.name, 'train', input.id);
  assertConsist(layout.id, input.locomotiveIds);
  const { id, version, locomotiveIds, ...values } = input;
  const row = writeTransaction((tx) => {
    const saved = rowOrThrow(updateVersionedRow(t.trains, layout.id, id, version, values, tx), 'That train');
    setConsist(saved.id, locomotiveIds, tx);
    return saved;
  });
  return { message: `Train “${row.name}” saved.`, entity: 'train', entityId: row.id, action: 'update' };
}

export function removeTrain({ layout }: LayoutContext, input: { id: string; version: number }) {
  if (!getLayoutRow(t.trains, layout.id, input.id)) throw notFound('That train');
  const n = countTrainRuns(input.id);
  if (n > 0) throw new AppError('conflict', `This train has ${n} timetabled run${n === 1 ? '' : 's'}; delete those runs first.`);
  // The consist rows go with it (cascade).
  const row = rowOrThrow(deleteVersionedRow(t.trains, layout.id, input.id, input.version), 'That train');
  return { message: `Train “${row.name}” deleted.`, entity: 'train', entityId: row.id, action: 'delete' };
}

