import 'server-only';
import type { ReplyState } from '@/db/enums';
import { getInvitationWithSession, runInTransaction, updateInvitationReply } from '@/db/queries/invitation-records';
import { addMember, getMembership } from '@/db/queries/memberships';
import { recordAudit } from '@/db/queries/railways';
import { AppError, notFound } from '@/lib/errors';
import { replyExpiry, signReplyToken, verifyReplyToken } from '@/lib/invitations/reply-token';
import { REPLY_LABELS } from '@/lib/invitations/tracker';
import type { Reply } from '@/lib/validations/invitation';

/** The reply states as the reply page writes them: the tracker's words, capitalised. */
export const REPLY_PAGE_LABELS = Object.fromEntries(
  Object.entries(REPLY_LABELS).map(([state, label]) => [state, label.charAt(0).toUpperCase() + label.slice(1)]),
) as Record<ReplyState, string>;

const REFUSED = {
  malformed: 'This reply link is not valid. Use the buttons in the latest invitation e-mail.',
  forged: 'This reply link is not valid. Use the buttons in the latest invitation e-mail.',
  expired: 'This reply link has expired.',
  used: 'This reply link was already used. Your reply is recorded; sign in to change it, or use the buttons shown after your last reply.',
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
 * Records a reply given through a reply link, without signing in. Refused: a token that is
 * malformed or not signed by us (400), expired (400), used since the reply last changed (409),
 * or whose invitation is not on the railway it names (400). An accepted guest becomes an operator
 * of the railway. Returns the reply and a fresh token for changing it again.
 */
export function recordReply(token: string, reply: Reply, now = new Date(), comment = '') {
  const check = verifyReplyToken(token, now.getTime());
  if (!check.ok) throw new AppError('bad_request', REFUSED[check.reason]);
  return runInTransaction(() => {
    const found = getInvitationWithSession(check.claim.invitationId);
    if (!found || found.session.railwayId !== check.claim.railwayId) throw new AppError('bad_request', REFUSED.forged);
    if (found.session.status !== 'published') throw new AppError('bad_request', 'This session is not open for replies (it was cancelled or withdrawn).');
    const updated = updateInvitationReply(found.invitation.id, check.claim.nonce, reply, now, comment);
    if (!updated) throw new AppError('conflict', REFUSED.used);
    let joined = false;
    if (reply === 'accepted' && !getMembership(found.session.railwayId, updated.userId)) {
      joined = addMember(found.session.railwayId, updated.userId, 'operator');
    }
    recordAudit({
      railwayId: found.session.railwayId,
      userId: updated.userId,
      action: 'reply',
      entity: 'invitation',
      entityId: updated.id,
      detail: { reply, via: 'link', joined, late: isLate(found.session.replyBy, now), comment: comment.length > 0 },
    });
    const nextToken = signReplyToken({
      railwayId: found.session.railwayId,
      invitationId: updated.id,
      nonce: updated.replyNonce,
      expiresAt: replyExpiry(found.session.endsAt, now.getTime()),
    });
    return { reply: updated.reply, sessionTitle: found.session.title, railwayName: found.railwayName, joined, nextToken, late: isLate(found.session.replyBy, now) };
  });
}

/** A signed-in member replies to their own invitation (railway membership checked by the caller). */
export function recordOwnReply(input: { userId: string; invitationId: string; reply: Reply; now?: Date }) {
  return runInTransaction(() => {
    const found = getInvitationWithSession(input.invitationId);
    if (!found || found.invitation.userId !== input.userId) throw notFound('That invitation');
    if (found.session.status !== 'published') throw new AppError('bad_request', 'This session is not open for replies.');
    const updated = updateInvitationReply(found.invitation.id, null, input.reply, input.now);
    if (!updated) throw notFound('That invitation');
    recordAudit({ railwayId: found.session.railwayId, userId: input.userId, action: 'reply', entity: 'invitation', entityId: updated.id, detail: { reply: input.reply, via: 'my-runs' } });
    return { reply: updated.reply };
  });
}
