'use server';

import { parseOrThrow, type ActionState } from '@/lib/errors';
import * as edits from '@/lib/layouts/layout-edits';
import { runLayoutAction } from '@/lib/layouts/layout-edits';
import {
  blockEditSchema,
  blockSchema,
  cabEditSchema,
  cabSchema,
  driverEditSchema,
  driverSchema,
  formToObject,
  linkDeleteSchema,
  linkSchema,
  locomotiveEditSchema,
  locomotiveSchema,
  rowDeleteSchema,
  supplyEditSchema,
  supplySchema,
  trainEditSchema,
  trainSchema,
} from '@/lib/validations/layout';

// Every action: planner or host of the railway (operators 403), the layout looked up within the
// railway (another railway's layout 404), the input parsed with the shared schema (400 with field
// errors), edits and deletes naming the version they saw (stale 409).

const form = (formData: FormData) => formToObject(formData, ['locomotiveIds']);

export async function createBlock(railwayId: string, layoutId: string, _prev: ActionState, formData: FormData): Promise<ActionState> {
  return runLayoutAction(railwayId, layoutId, (ctx) => edits.addBlock(ctx, parseOrThrow(blockSchema, form(formData))));
}
export async function updateBlock(railwayId: string, layoutId: string, _prev: ActionState, formData: FormData): Promise<ActionState> {
  return runLayoutAction(railwayId, layoutId, (ctx) => edits.editBlock(ctx, parseOrThrow(blockEditSchema, form(formData))));
}
export async function deleteBlock(railwayId: string, layoutId: string, _prev: ActionState, formData: FormData): Promise<ActionState> {
  return runLayoutAction(railwayId, layoutId, (ctx) => edits.removeBlock(ctx, parseOrThrow(rowDeleteSchema, form(formData))));
}

export async function createLink(railwayId: string, layoutId: string, _prev: ActionState, formData: FormData): Promise<ActionState> {
  return runLayoutAction(railwayId, layoutId, (ctx) => edits.addLink(ctx, parseOrThrow(linkSchema, form(formData))));
}
export async function deleteLink(railwayId: string, layoutId: string, _prev: ActionState, formData: FormData): Promise<ActionState> {
  return runLayoutAction(railwayId, layoutId, (ctx) => edits.removeLink(ctx, parseOrThrow(linkDeleteSchema, form(formData))));
}

export async function createSupply(railwayId: string, layoutId: string, _prev: ActionState, formData: FormData): Promise<ActionState> {
  return runLayoutAction(railwayId, layoutId, (ctx) => edits.addSupply(ctx, parseOrThrow(supplySchema, form(formData))));
}
export async function updateSupply(railwayId: string, layoutId: string, _prev: ActionState, formData: FormData): Promise<ActionState> {
  return runLayoutAction(railwayId, layoutId, (ctx) => edits.editSupply(ctx, parseOrThrow(supplyEditSchema, form(formData))));
}
export async function deleteSupply(railwayId: string, layoutId: string, _prev: ActionState, formData: FormData): Promise<ActionState> {
  return runLayoutAction(railwayId, layoutId, (ctx) => edits.removeSupply(ctx, parseOrThrow(rowDeleteSchema, form(formData))));
}

export async function createDriver(railwayId: string, layoutId: string, _prev: ActionState, formData: FormData): Promise<ActionState> {
  return runLayoutAction(railwayId, layoutId, (ctx) => edits.addDriver(ctx, parseOrThrow(driverSchema, form(formData))));
}
export async function updateDriver(railwayId: string, layoutId: string, _prev: ActionState, formData: FormData): Promise<ActionState> {
  return runLayoutAction(railwayId, layoutId, (ctx) => edits.editDriver(ctx, parseOrThrow(driverEditSchema, form(formData))));
}
export async function deleteDriver(railwayId: string, layoutId: string, _prev: ActionState, formData: FormData): Promise<ActionState> {
  return runLayoutAction(railwayId, layoutId, (ctx) => edits.removeDriver(ctx, parseOrThrow(rowDeleteSchema, form(formData))));
}

export async function createCab(railwayId: string, layoutId: string, _prev: ActionState, formData: FormData): Promise<ActionState> {
  return runLayoutAction(railwayId, layoutId, (ctx) => edits.addCab(ctx, parseOrThrow(cabSchema, form(formData))));
}
export async function updateCab(railwayId: string, layoutId: string, _prev: ActionState, formData: FormData): Promise<ActionState> {
  return runLayoutAction(railwayId, layoutId, (ctx) => edits.editCab(ctx, parseOrThrow(cabEditSchema, form(formData))));
}
export async function deleteCab(railwayId: string, layoutId: string, _prev: ActionState, formData: FormData): Promise<ActionState> {
  return runLayoutAction(railwayId, layoutId, (ctx) => edits.removeCab(ctx, parseOrThrow(rowDeleteSchema, form(formData))));
}

export async function createLocomotive(railwayId: string, layoutId: string, _prev: ActionState, formData: FormData): Promise<ActionState> {
  return runLayoutAction(railwayId, layoutId, (ctx) => edits.addLocomotive(ctx, parseOrThrow(locomotiveSchema, form(formData))));
}
export async function updateLocomotive(railwayId: string, layoutId: string, _prev: ActionState, formData: FormData): Promise<ActionState> {
  return runLayoutAction(railwayId, layoutId, (ctx) => edits.editLocomotive(ctx, parseOrThrow(locomotiveEditSchema, form(formData))));
}
export async function deleteLocomotive(railwayId: string, layoutId: string, _prev: ActionState, formData: FormData): Promise<ActionState> {
  return runLayoutAction(railwayId, layoutId, (ctx) => edits.removeLocomotive(ctx, parseOrThrow(rowDeleteSchema, form(formData))));
}

export async function createTrain(railwayId: string, layoutId: string, _prev: ActionState, formData: FormData): Promise<ActionState> {
  return runLayoutAction(railwayId, layoutId, (ctx) => edits.addTrain(ctx, parseOrThrow(trainSchema, form(formData))));
}
export async function updateTrain(railwayId: string, layoutId: string, _prev: ActionState, formData: FormData): Promise<ActionState> {
  return runLayoutAction(railwayId, layoutId, (ctx) => edits.editTrain(ctx, parseOrThrow(trainEditSchema, form(formData))));
}
export async function deleteTrain(railwayId: string, layoutId: string, _prev: ActionState, formData: FormData): Promise<ActionState> {
  return runLayoutAction(railwayId, layoutId, (ctx) => edits.removeTrain(ctx, parseOrThrow(rowDeleteSchema, form(formData))));
}
