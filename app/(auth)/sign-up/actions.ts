'use server';

import bcrypt from 'bcryptjs';
import { insertUser, getUserByEmail } from '@/db/queries/users';
import { type ActionState, parseOrThrow } from '@/lib/errors';
import { action } from '@/lib/http';
import { clientAddress } from '@/lib/client-key';
import { queueAccountExistsMail, queueConfirmSignUpMail } from '@/lib/mail/account-mail';
import { rateLimit } from '@/lib/rate-limit';
import { issueSignUpToken } from '@/lib/tokens';
import { signUpSchema } from '@/lib/validations/account';

/**
 * Starts an account: e-mails a link that finishes it, so the address is proved before any
 * password works or any membership or invitation can attach (a sign-up in someone else's name gets
 * nowhere). The answer is the same whether or not the address has an account; its owner is told.
 */
export const signUp = action(['state', 'form'], async (_prev, formData): Promise<ActionState> => {
  const input = parseOrThrow(signUpSchema, {
    name: formData.get('name'),
    email: formData.get('email'),
    password: formData.get('password'),
  });
  rateLimit(`sign-up:${await clientAddress()}`, 10, 60 * 60_000);
  rateLimit(`sign-up-address:${input.email}`, 3, 60 * 60_000);
  const passwordHash = await bcrypt.hash(input.password, 10);
  const existing = getUserByEmail(input.email);
  if (existing?.passwordHash) {
    queueAccountExistsMail(existing.email);
  } else {
    // A host may have invited this address already (an account with no password yet).
    const user = existing ?? insertUser({ email: input.email, name: input.name, passwordHash: null });
    queueConfirmSignUpMail(user.email, issueSignUpToken(user.id, passwordHash, input.name));
  }
  return { ok: true, message: `Check ${input.email}: we sent a link there to finish creating your account.` };
});
