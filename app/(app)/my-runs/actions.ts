'use server';

import { revalidatePath } from 'next/cache';
import { getInvitationWithSession } from '@/db/queries/invitation-records';
import { resetCalendarToken } from '@/db/queries/calendar-feed';
import { requireMember, requireUser } from '@/lib/auth';
import { notFound, parseOrThrow, type ActionState } from '@/lib/errors';
import { action } from '@/lib/http';
import { answerOwnInvitation } from '@/lib/invitations/reply';
import { answerInvitationSchema, invitationIdSchema } from '@/lib/validations/invitation';

/** A member answers their own invitation from My runs (the e-mail's reply links stop working). */
export const answerInvitation = action(['id', 'state', 'form'], async (invitationId, _prev, formData): Promise<ActionState> => {
  const user = await requireUser();
  const id = parseOrThrow(invitationIdSchema, invitationId);
  const found = getInvitationWithSession(id);
  if (!found || found.invitation.userId !== user.id) throw notFound('That invitation');
  await requireMember(found.session.railwayId, 'operator', 'answer invitations');
  const { answer } = parseOrThrow(answerInvitationSchema, { answer: formData.get('answer') });
  answerOwnInvitation({ userId: user.id, invitationId: id, answer });
  revalidatePath('/my-runs');
  return { ok: true, message: 'Answer saved.' };
});

/** Gives the signed-in user a new calendar feed address; the old one stops working at once. */
export const resetCalendarFeed = action(['state', 'form'], async (_prev, _formData): Promise<ActionState> => {
  const user = await requireUser();
  resetCalendarToken(user.id);
  revalidatePath('/my-runs');
  return { ok: true, message: 'New feed address made. The old one no longer works: subscribe again with the new one.' };
});
