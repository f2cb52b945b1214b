'use server';

import { getUserByEmail } from '@/db/queries/users';
import { type ActionState, parseOrThrow } from '@/lib/errors';
import { action } from '@/lib/http';
import { queueSignInLinkMail } from '@/lib/mail/account-mail';
import { clientAddress } from '@/lib/client-key';
import { rateLimit } from '@/lib/rate-limit';
import { issueAuthToken } from '@/lib/tokens';
import { requestLinkSchema } from '@/lib/validations/account';

/**
 * E-mails a one-time sign-in link. The answer is the same whether or not the address has an
 * account, so the form cannot be used to find out who is registered.
 */
export const requestSignInLink = action(['state', 'form'], async (_prev, formData): Promise<ActionState> => {
  const { email } = parseOrThrow(requestLinkSchema, { email: formData.get('email') });
  rateLimit(`link-ip:${await clientAddress()}`, 20, 15 * 60_000);
  rateLimit(`link:${email}`, 5, 15 * 60_000);
  const user = getUserByEmail(email);
  if (user) queueSignInLinkMail(user.email, issueAuthToken(user.id, 'sign-in'));
  return { ok: true, message: `If ${email} has a Fishplate account, a sign-in link is on its way.` };
});
