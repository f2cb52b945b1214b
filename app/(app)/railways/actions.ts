'use server';

import { redirect } from 'next/navigation';
import { createRailway as insertRailway } from '@/db/queries/railways';
import { requireUser } from '@/lib/auth';
import { type ActionState, parseOrThrow } from '@/lib/errors';
import { action } from '@/lib/http';
import { railwaySchema } from '@/lib/validations/account';

/** Creates a railway; whoever creates it becomes its host. */
export const createRailway = action(['state', 'form'], async (_prev, formData): Promise<ActionState> => {
  const user = await requireUser();
  const input = parseOrThrow(railwaySchema, { name: formData.get('name'), timeZone: formData.get('timeZone') });
  const railwayId = insertRailway({ ...input, hostUserId: user.id }).id;
  redirect(`/railways/${railwayId}`);
});
