'use server';

import { redirect } from 'next/navigation';
import { createRailway as insertRailway } from '@/db/queries/railways';
import { requireUser } from '@/lib/auth';
import { toActionState, type ActionState, parseOrThrow } from '@/lib/errors';
import { railwaySchema } from '@/lib/validations/account';

/** Creates a railway; whoever creates it becomes its host. */
export async function createRailway(_prev: ActionState, formData: FormData): Promise<ActionState> {
  let railwayId: string;
  try {
    const user = await requireUser();
    const input = parseOrThrow(railwaySchema, { name: formData.get('name'), timeZone: formData.get('timeZone') });
    railwayId = insertRailway({ ...input, hostUserId: user.id }).id;
  } catch (error) {
    return toActionState(error);
  }
  redirect(`/railways/${railwayId}`);
}
