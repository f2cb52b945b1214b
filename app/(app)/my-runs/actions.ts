'use server';

import { revalidatePath } from 'next/cache';
import { getInvitationWithSession } from '@/db/queries/invitation-records';
import { resetCalendarToken } from '@/db/queries/calendar-feed';
import { requireMember, requireUser } from '@/lib/auth';
import { notFound, parseOrThrow, type ActionState } from '@/lib/errors';
import { action } from '@/lib/http';
import { recordOwnReply } from '@/lib/invitations/reply';
import { invitationIdSchema, replyToInvitationSchema } from '@/lib/validations/invitation';

/** A member replies to their own invitation from My runs (the e-mail's reply links stop working). */
export const replyToInvitation = action(['id', 'state', 'form'], async (invitationId, _prev, formData): Promise<ActionState> => {
  const user = await requireUser();
  const id = parseOrThrow(invitationIdSchema, invitationId);
  const found = getInvitationWithSession(id);
  if (!found || found.invitation.userId !== user.id) throw notFound('That invitation');
  await requireMember(found.session.railwayId, 'operator', 'reply to invitations');
  const { reply } = parseOrThrow(replyToInvitationSchema, { reply: formData.get('reply') });
  recordOwnReply({ userId: user.id, invitationId: id, reply });
  revalidatePath('/my-runs');
  return { ok: true, message: 'Reply saved.' };
});

/** Gives the signed-in user a new calendar feed address; the old one stops working at once. */
export const resetCalendarFeed = action(['state', 'form'], async (_prev, _formData): Promise<ActionState> => {
  const user = await requireUser();
  resetCalendarToken(user.id);
  revalidatePath('/my-runs');
  return { ok: true, message: 'New feed address made. The old one no longer works: subscribe again with the new one.' };
});
