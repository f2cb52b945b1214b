import 'server-only';
import { getInvitationWithSession, recordAnswer, runInTransaction } from '@/db/queries/invitation-records';
import { addMember, getMembership } from '@/db/queries/memberships';
import { recordAudit } from '@/db/queries/railways';
import { AppError, notFound } from '@/lib/errors';
import { replyExpiry, signReplyToken, verifyReplyToken } from '@/lib/invitations/reply-token';
import type { Answer } from '@/lib/validations/invitation';

export const ANSWER_LABELS: Record<Answer | 'needs-action', string> = {
  accepted: 'Accepted',
  tentative: 'Maybe',
  declined: 'Declined',
  'needs-action': 'No reply yet',
};

const REFUSED = {
  malformed: 'This reply link is not valid. Use the buttons in the latest invitation e-mail.',
  forged: 'This reply link is not valid. Use the buttons in the latest invitation e-mail.',
  expired: 'This reply link has expired.',
  used: 'This reply link was already used. Your answer is recorded; sign in to change it, or use the buttons shown after your last answer.',
} as const;

/** A reply after the host's deadline still counts; it is marked late. */
export function isLate(replyBy: Date | null, respondedAt: Date | null): boolean {
  return replyBy !== null && respondedAt !== null && respondedAt.getTime() > replyBy.getTime();
}

/** What a reply link points at, for the page that asks "accept this?" (nothing is changed). */
export function inspectReplyToken(token: string, now = Date.now()) {
  const check = verifyReplyToken(token, now);
  if (!check.ok) return { ok: false as const, error: REFUSED[check.reason] };
  const found = getInvitationWithSession(check.claim.invitationId);
  if (!found || found.session.railwayId !== check.claim.railwayId) return { ok: false as const, error: REFUSED.forged };
  if (found.invitation.replyNonce !== check.claim.nonce) return { ok: false as const, error: REFUSED.used, current: found.invitation.reply };
  return { ok: true as const, found };
}

/**
 * Records an answer given through a reply link, without signing in. Refused: a token that is
 * malformed or not signed by us (400), expired (400), used since the answer last changed (409),
 * or whose invitation is not on the railway it names (400). An accepted guest becomes an operator
 * of the railway. Returns the answer and a fresh token for changing it again.
 */
export function recordReply(token: string, answer: Answer, now = new Date(), comment = '') {
  const check = verifyReplyToken(token, now.getTime());
  if (!check.ok) throw new AppError('bad_request', REFUSED[check.reason]);
  return runInTransaction(() => {
    const found = getInvitationWithSession(check.claim.invitationId);
    if (!found || found.session.railwayId !== check.claim.railwayId) throw new AppError('bad_request', REFUSED.forged);
    if (found.session.status !== 'published') throw new AppError('bad_request', 'This session is not open for replies (it was cancelled or withdrawn).');
    const updated = recordAnswer(found.invitation.id, check.claim.nonce, answer, now, comment);
    if (!updated) throw new AppError('conflict', REFUSED.used);
    let joined = false;
    if (answer === 'accepted' && !getMembership(found.session.railwayId, updated.userId)) {
      joined = addMember(found.session.railwayId, updated.userId, 'operator');
    }
    recordAudit({
      railwayId: found.session.railwayId,
      userId: updated.userId,
      action: 'reply',
      entity: 'invitation',
      entityId: updated.id,
      detail: { answer, via: 'link', joined, late: isLate(found.session.replyBy, now), comment: comment.length > 0 },
    });
    const nextToken = signReplyToken({
      railwayId: found.session.railwayId,
      invitationId: updated.id,
      nonce: updated.replyNonce,
      expiresAt: replyExpiry(found.session.endsAt, now.getTime()),
    });
    return { answer: updated.reply, sessionTitle: found.session.title, railwayName: found.railwayName, joined, nextToken, late: isLate(found.session.replyBy, now) };
  });
}

/** A signed-in member answers their own invitation (railway membership checked by the caller). */
export function answerOwnInvitation(input: { userId: string; invitationId: string; answer: Answer; now?: Date }) {
  return runInTransaction(() => {
    const found = getInvitationWithSession(input.invitationId);
    if (!found || found.invitation.userId !== input.userId) throw notFound('That invitation');
    if (found.session.status !== 'published') throw new AppError('bad_request', 'This session is not open for replies.');
    const updated = recordAnswer(found.invitation.id, null, input.answer, input.now);
    if (!updated) throw notFound('That invitation');
    recordAudit({ railwayId: found.session.railwayId, userId: input.userId, action: 'reply', entity: 'invitation', entityId: updated.id, detail: { answer: input.answer, via: 'my-runs' } });
    return { answer: updated.reply };
  });
}
