'use server';

import { parseOrThrow } from '@/lib/errors';
import { action } from '@/lib/http';
import * as edits from '@/lib/layouts/layout-edits';
import { runLayoutAction } from '@/lib/layouts/layout-edits';
import { saveWiringSheet, wiringFormSchema } from '@/lib/layouts/wiring-sheet';
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

const ROW_ACTION = ['id', 'id', 'state', 'form'] as const;
const form = (formData: FormData) => formToObject(formData, ['locomotiveIds']);

export const createBlock = action(ROW_ACTION, async (railwayId, layoutId, _prev, formData) =>
  runLayoutAction(railwayId, layoutId, (ctx) => edits.addBlock(ctx, parseOrThrow(blockSchema, form(formData)))),
);
export const updateBlock = action(ROW_ACTION, async (railwayId, layoutId, _prev, formData) =>
  runLayoutAction(railwayId, layoutId, (ctx) => edits.editBlock(ctx, parseOrThrow(blockEditSchema, form(formData)))),
);
export const deleteBlock = action(ROW_ACTION, async (railwayId, layoutId, _prev, formData) =>
  runLayoutAction(railwayId, layoutId, (ctx) => edits.removeBlock(ctx, parseOrThrow(rowDeleteSchema, form(formData)))),
);

export const createLink = action(ROW_ACTION, async (railwayId, layoutId, _prev, formData) =>
  runLayoutAction(railwayId, layoutId, (ctx) => edits.addLink(ctx, parseOrThrow(linkSchema, form(formData)))),
);
export const deleteLink = action(ROW_ACTION, async (railwayId, layoutId, _prev, formData) =>
  runLayoutAction(railwayId, layoutId, (ctx) => edits.removeLink(ctx, parseOrThrow(linkDeleteSchema, form(formData)))),
);

export const createSupply = action(ROW_ACTION, async (railwayId, layoutId, _prev, formData) =>
  runLayoutAction(railwayId, layoutId, (ctx) => edits.addSupply(ctx, parseOrThrow(supplySchema, form(formData)))),
);
export const updateSupply = action(ROW_ACTION, async (railwayId, layoutId, _prev, formData) =>
  runLayoutAction(railwayId, layoutId, (ctx) => edits.editSupply(ctx, parseOrThrow(supplyEditSchema, form(formData)))),
);
export const deleteSupply = action(ROW_ACTION, async (railwayId, layoutId, _prev, formData) =>
  runLayoutAction(railwayId, layoutId, (ctx) => edits.removeSupply(ctx, parseOrThrow(rowDeleteSchema, form(formData)))),
);

export const createDriver = action(ROW_ACTION, async (railwayId, layoutId, _prev, formData) =>
  runLayoutAction(railwayId, layoutId, (ctx) => edits.addDriver(ctx, parseOrThrow(driverSchema, form(formData)))),
);
export const updateDriver = action(ROW_ACTION, async (railwayId, layoutId, _prev, formData) =>
  runLayoutAction(railwayId, layoutId, (ctx) => edits.editDriver(ctx, parseOrThrow(driverEditSchema, form(formData)))),
);
export const deleteDriver = action(ROW_ACTION, async (railwayId, layoutId, _prev, formData) =>
  runLayoutAction(railwayId, layoutId, (ctx) => edits.removeDriver(ctx, parseOrThrow(rowDeleteSchema, form(formData)))),
);

export const createCab = action(ROW_ACTION, async (railwayId, layoutId, _prev, formData) =>
  runLayoutAction(railwayId, layoutId, (ctx) => edits.addCab(ctx, parseOrThrow(cabSchema, form(formData)))),
);
export const updateCab = action(ROW_ACTION, async (railwayId, layoutId, _prev, formData) =>
  runLayoutAction(railwayId, layoutId, (ctx) => edits.editCab(ctx, parseOrThrow(cabEditSchema, form(formData)))),
);
export const deleteCab = action(ROW_ACTION, async (railwayId, layoutId, _prev, formData) =>
  runLayoutAction(railwayId, layoutId, (ctx) => edits.removeCab(ctx, parseOrThrow(rowDeleteSchema, form(formData)))),
);

export const createLocomotive = action(ROW_ACTION, async (railwayId, layoutId, _prev, formData) =>
  runLayoutAction(railwayId, layoutId, (ctx) => edits.addLocomotive(ctx, parseOrThrow(locomotiveSchema, form(formData)))),
);
export const updateLocomotive = action(ROW_ACTION, async (railwayId, layoutId, _prev, formData) =>
  runLayoutAction(railwayId, layoutId, (ctx) => edits.editLocomotive(ctx, parseOrThrow(locomotiveEditSchema, form(formData)))),
);
export const deleteLocomotive = action(ROW_ACTION, async (railwayId, layoutId, _prev, formData) =>
  runLayoutAction(railwayId, layoutId, (ctx) => edits.removeLocomotive(ctx, parseOrThrow(rowDeleteSchema, form(formData)))),
);

export const createTrain = action(ROW_ACTION, async (railwayId, layoutId, _prev, formData) =>
  runLayoutAction(railwayId, layoutId, (ctx) => edits.addTrain(ctx, parseOrThrow(trainSchema, form(formData)))),
);
export const updateTrain = action(ROW_ACTION, async (railwayId, layoutId, _prev, formData) =>
  runLayoutAction(railwayId, layoutId, (ctx) => edits.editTrain(ctx, parseOrThrow(trainEditSchema, form(formData)))),
);
export const deleteTrain = action(ROW_ACTION, async (railwayId, layoutId, _prev, formData) =>
  runLayoutAction(railwayId, layoutId, (ctx) => edits.removeTrain(ctx, parseOrThrow(rowDeleteSchema, form(formData)))),
);

export const saveWiring = action(ROW_ACTION, async (railwayId, layoutId, _prev, formData) =>
  runLayoutAction(railwayId, layoutId, (ctx) =>
    saveWiringSheet(ctx, parseOrThrow(wiringFormSchema, { sheet: formData.get('sheet'), version: formData.get('version') ?? '' })),
  ),
);
