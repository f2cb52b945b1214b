'use server';

import { z } from 'zod';
import { countLayoutSessions, deleteLayoutById, insertLayout, updateLayoutById } from '@/db/queries/layouts';
import { recordAudit } from '@/db/queries/railways';
import { requireMember } from '@/lib/auth';
import { AppError, parseOrThrow, type ActionState } from '@/lib/errors';
import { action } from '@/lib/http';
import { requireLayout } from '@/lib/auth/layouts';
import { revalidateLayout, rowOrThrow } from '@/lib/layouts/layout-edits';
import { formToObject, layoutEditSchema, layoutSchema, rowDeleteSchema } from '@/lib/validations/layout';

const railwayIdSchema = z.string().min(1).max(100);

/** Planner or host: a new, empty layout. Answers the new layout's id. */
export const createLayout = action(['id', 'state', 'form'], async (railwayId, _prev, formData): Promise<ActionState<{ id: string }>> => {
  const member = await requireMember(parseOrThrow(railwayIdSchema, railwayId), 'planner', 'create layouts');
  const input = parseOrThrow(layoutSchema, formToObject(formData));
  const layout = insertLayout(member.railwayId, input);
  recordAudit({ railwayId: member.railwayId, userId: member.user.id, action: 'create', entity: 'layout', entityId: layout.id });
  revalidateLayout(member.railwayId);
  return { ok: true, message: `Layout “${layout.name}” created.`, data: { id: layout.id } };
});

/** Planner or host: the layout's name, scale, setting and notes, refused when stale. */
export const updateLayout = action(['id', 'id', 'state', 'form'], async (railwayId, layoutId, _prev, formData): Promise<ActionState> => {
  const { member, layout } = await requireLayout(railwayId, layoutId, 'planner', 'edit layouts');
  const { version, ...values } = parseOrThrow(layoutEditSchema, formToObject(formData));
  const saved = rowOrThrow(updateLayoutById(member.railwayId, layout.id, version, values), 'That layout');
  recordAudit({ railwayId: member.railwayId, userId: member.user.id, action: 'update', entity: 'layout', entityId: layout.id });
  revalidateLayout(member.railwayId, layout.id);
  return { ok: true, message: `Layout “${saved.name}” saved.` };
});

/** Planner or host: deletes a layout with everything in it, unless a session uses it. */
export const deleteLayout = action(['id', 'id', 'state', 'form'], async (railwayId, layoutId, _prev, formData): Promise<ActionState> => {
  const { member, layout } = await requireLayout(railwayId, layoutId, 'planner', 'delete layouts');
  const { version } = parseOrThrow(rowDeleteSchema.pick({ version: true }), formToObject(formData));
  const n = countLayoutSessions(layout.id);
  if (n > 0) throw new AppError('conflict', `${n} session${n === 1 ? ' uses' : 's use'} this layout; delete ${n === 1 ? 'it' : 'them'} first.`);
  rowOrThrow(deleteLayoutById(member.railwayId, layout.id, version), 'That layout');
  recordAudit({ railwayId: member.railwayId, userId: member.user.id, action: 'delete', entity: 'layout', entityId: layout.id, detail: { name: layout.name } });
  revalidateLayout(member.railwayId);
  return { ok: true, message: `Layout “${layout.name}” deleted.` };
});
