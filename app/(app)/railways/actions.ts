'use server';

import { revalidatePath } from 'next/cache';
import { redirect } from 'next/navigation';
import { z } from 'zod';
import { listMemberInvitationsFor, takeMemberInvitation } from '@/db/queries/member-invitations';
import { addMember } from '@/db/queries/memberships';
import { insertRailway, recordAudit } from '@/db/queries/railways';
import { endAllSessions, getUserById } from '@/db/queries/users';
import { requireUser } from '@/lib/auth';
import { AppError, notFound, type ActionState, parseOrThrow } from '@/lib/errors';
import { action } from '@/lib/http';
import { railwaySchema } from '@/lib/validations/account';

/** Creates a railway; whoever creates it becomes its host. */
export const createRailway = action(['state', 'form'], async (_prev, formData): Promise<ActionState> => {
  const user = await requireUser();
  const input = parseOrThrow(railwaySchema, { name: formData.get('name'), timeZone: formData.get('timeZone') });
  const railwayId = insertRailway({ ...input, hostUserId: user.id }).id;
  redirect(`/railways/${railwayId}`);
});

const offerSchema = z.object({ invitationId: z.string().min(1).max(100), reply: z.enum(['accept', 'decline']) });

/**
 * The signed-in owner of an address replies to a railway's offer of membership made to it. Only an
 * address the account has proved (a link sent to it was followed) may accept, so an account
 * registered in someone else's name before they arrive never collects their memberships.
 */
export const replyToMemberOffer = action(['state', 'form'], async (_prev, formData): Promise<ActionState> => {
  const caller = await requireUser();
  const input = parseOrThrow(offerSchema, { invitationId: formData.get('invitationId'), reply: formData.get('reply') });
  const user = getUserById(caller.id);
  if (!user || !listMemberInvitationsFor(user.email).some((o) => o.id === input.invitationId)) throw notFound('That invitation');
  if (input.reply === 'accept' && !user.emailVerifiedAt) {
    throw new AppError('forbidden', 'Confirm your e-mail address first: follow the link in the message we sent to it, then accept.');
  }
  const offer = takeMemberInvitation(input.invitationId, user.email);
  if (!offer) throw notFound('That invitation');
  if (input.reply === 'accept') addMember(offer.railwayId, user.id, offer.role);
  recordAudit({ railwayId: offer.railwayId, userId: user.id, action: `${input.reply}-offer`, entity: 'member', entityId: user.id, detail: { role: offer.role } });
  revalidatePath('/railways');
  return { ok: true, message: input.reply === 'accept' ? 'You joined the railway.' : 'Invitation declined.' };
});

/** Ends every session of the signed-in person (this one too) and every sign-in or reset link not used yet. */
export const signOutEverywhere = action(['state', 'form'], async (): Promise<ActionState> => {
  const user = await requireUser();
  endAllSessions(user.id);
  redirect('/sign-in');
});
