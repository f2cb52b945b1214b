'use server';

import { clientAddress } from '@/lib/client-key';
import { parseOrThrow, type ActionState } from '@/lib/errors';
import { action } from '@/lib/http';
import { recordReply } from '@/lib/invitations/reply';
import { claimedInvitationId } from '@/lib/invitations/reply-token';
import { rateLimit } from '@/lib/rate-limit';
import { replyByTokenSchema } from '@/lib/validations/invitation';

export type ReplyResult = { reply: string; sessionTitle: string; railwayName: string; joined: boolean; nextToken: string; late: boolean };

/**
 * Anyone holding a reply link: records accept, maybe or decline without signing in. The link's
 * signature, expiry, railway and once-per-reply nonce are checked in lib/invitations/reply.ts.
 */
export const replyByToken = action(['state', 'form'], async (_prev, formData): Promise<ActionState<ReplyResult>> => {
  const token = String(formData.get('token') ?? '');
  rateLimit(`reply-ip:${await clientAddress()}`, 60, 60_000);
  rateLimit(`reply:${claimedInvitationId(token)}`, 10, 60_000);
  const input = parseOrThrow(replyByTokenSchema, { token, reply: formData.get('reply'), comment: formData.get('comment') ?? '' });
  // No revalidatePath: re-rendering this page would re-read the now spent link and hide the reply;
  // the host's tracker is rendered fresh on every request and refreshes itself.
  const result = recordReply(input.token, input.reply, new Date(), input.comment);
  return { ok: true, message: 'Thank you — your reply is recorded.', data: result };
});
