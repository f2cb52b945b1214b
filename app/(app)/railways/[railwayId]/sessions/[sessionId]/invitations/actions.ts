'use server';

import { revalidatePath } from 'next/cache';
import { requireMember } from '@/lib/auth';
import { parseOrThrow, type ActionState } from '@/lib/errors';
import { action } from '@/lib/http';
import {
  inviteToSession,
  remindAwaitingReply,
  queueInvitationAgain,
  queueSessionNotices,
  saveReplyDeadline,
} from '@/lib/invitations/send';
import {
  inviteCrewSchema,
  railwayIdSchema,
  replyDeadlineSchema,
  resendSchema,
  sendNoticesSchema,
  sessionIdSchema,
} from '@/lib/validations/invitation';

function trackerPath(railwayId: string, sessionId: string) {
  return `/railways/${railwayId}/sessions/${sessionId}/invitations`;
}

const plural = (n: number, word: string) => `${n} ${word}${n === 1 ? '' : 's'}`;

/** Host only: invites picked members and typed guest addresses, and queues their e-mails. */
export const inviteCrew = action(['id', 'id', 'state', 'form'], async (railwayId, sessionId, _prev, formData): Promise<ActionState> => {
  const host = await requireMember(parseOrThrow(railwayIdSchema, railwayId), 'host', 'send invitations');
  const id = parseOrThrow(sessionIdSchema, sessionId);
  const input = parseOrThrow(inviteCrewSchema, {
    userIds: formData.getAll('userIds').map(String),
    guestEmails: String(formData.get('guestEmails') ?? ''),
  });
  const result = inviteToSession({ railwayId: host.railwayId, sessionId: id, host: host.user, ...input });
  revalidatePath(trackerPath(host.railwayId, id));
  const people = (n: number) => (n === 1 ? '1 person' : `${n} people`);
  const already = result.alreadyInvited ? ` ${people(result.alreadyInvited)} already invited left as they were.` : '';
  return { ok: true, message: `Invited ${people(result.invited)}; ${plural(result.queued, 'e-mail')} queued.${already}` };
});

/** Host only: sends invitations not sent yet, an update after a change, or the cancellation. */
export const sendNotices = action(['id', 'id', 'state', 'form'], async (railwayId, sessionId, _prev, formData): Promise<ActionState> => {
  const host = await requireMember(parseOrThrow(railwayIdSchema, railwayId), 'host', 'send invitations');
  const id = parseOrThrow(sessionIdSchema, sessionId);
  const { kind } = parseOrThrow(sendNoticesSchema, { kind: formData.get('kind') });
  const result = queueSessionNotices({ railwayId: host.railwayId, sessionId: id, host: host.user, kind });
  revalidatePath(trackerPath(host.railwayId, id));
  const what = kind === 'cancel' ? 'cancellation' : kind === 'update' ? 'update' : 'invitation';
  return {
    ok: true,
    message:
      result.queued === 0
        ? `Nothing to send: every ${what} was already queued.`
        : `${plural(result.queued, what)} queued${result.skipped ? ` (${result.skipped} already sent before)` : ''}.`,
  };
});

/** Host only: sends one invitation again (a failed one is retried as it was). */
export const resendInvitation = action(['id', 'id', 'state', 'form'], async (railwayId, sessionId, _prev, formData): Promise<ActionState> => {
  const host = await requireMember(parseOrThrow(railwayIdSchema, railwayId), 'host', 'send invitations');
  const id = parseOrThrow(sessionIdSchema, sessionId);
  const { invitationId } = parseOrThrow(resendSchema, { invitationId: formData.get('invitationId') });
  const result = queueInvitationAgain({ railwayId: host.railwayId, sessionId: id, host: host.user, invitationId });
  revalidatePath(trackerPath(host.railwayId, id));
  return { ok: true, message: result.requeued ? 'Retrying the failed e-mail now.' : result.queued ? 'Sent again.' : 'Already queued.' };
});

/** Host only: reminds those who were invited and have not replied (each at most once a day). */
export const remindCrew = action(['id', 'id', 'state', 'form'], async (railwayId, sessionId): Promise<ActionState> => {
  const host = await requireMember(parseOrThrow(railwayIdSchema, railwayId), 'host', 'send reminders');
  const id = parseOrThrow(sessionIdSchema, sessionId);
  const result = remindAwaitingReply({ railwayId: host.railwayId, sessionId: id, host: host.user });
  revalidatePath(trackerPath(host.railwayId, id));
  const later = result.tooSoon ? ` ${result.tooSoon === 1 ? '1 person' : `${result.tooSoon} people`} reminded in the last day left out.` : '';
  return { ok: true, message: result.queued ? `${plural(result.queued, 'reminder')} queued.${later}` : `No reminder sent.${later}` };
});

/** Host only: sets or clears the reply deadline. */
export const setReplyDeadline = action(['id', 'id', 'state', 'form'], async (railwayId, sessionId, _prev, formData): Promise<ActionState> => {
  const host = await requireMember(parseOrThrow(railwayIdSchema, railwayId), 'host', 'set the reply deadline');
  const id = parseOrThrow(sessionIdSchema, sessionId);
  const { replyBy } = parseOrThrow(replyDeadlineSchema, { replyBy: formData.get('replyBy') ?? '' });
  const result = saveReplyDeadline({ railwayId: host.railwayId, sessionId: id, host: host.user, replyBy });
  revalidatePath(trackerPath(host.railwayId, id));
  return { ok: true, message: result.replyBy ? 'Reply deadline saved. E-mails from now on say it.' : 'Reply deadline removed.' };
});
