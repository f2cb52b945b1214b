'use server';

import bcrypt from 'bcryptjs';
import { endAllSessions, getUserByEmail, markEmailVerified, setPasswordHash } from '@/db/queries/users';
import { AppError, type ActionState, parseOrThrow } from '@/lib/errors';
import { action } from '@/lib/http';
import { queueResetMail } from '@/lib/mail/account-mail';
import { clientAddress } from '@/lib/client-key';
import { rateLimit } from '@/lib/rate-limit';
import { issueAuthToken, spendAuthToken } from '@/lib/tokens';
import { requestLinkSchema, resetPasswordSchema } from '@/lib/validations/account';

/** E-mails a reset link; answers the same whether or not the address has an account. */
export const requestPasswordReset = action(['state', 'form'], async (_prev, formData): Promise<ActionState> => {
  const { email } = parseOrThrow(requestLinkSchema, { email: formData.get('email') });
  rateLimit(`reset-ip:${await clientAddress()}`, 20, 15 * 60_000);
  rateLimit(`reset:${email}`, 5, 15 * 60_000);
  const user = getUserByEmail(email);
  if (user) queueResetMail(user.email, issueAuthToken(user.id, 'reset-password'));
  return { ok: true, message: `If ${email} has a Fishplate account, a reset link is on its way.` };
});

/** Sets a new password with a reset token; the token works once. */
export const resetPassword = action(['state', 'form'], async (_prev, formData): Promise<ActionState> => {
  const input = parseOrThrow(resetPasswordSchema, {
    token: formData.get('token'),
    password: formData.get('password'),
    confirm: formData.get('confirm'),
  });
  rateLimit(`reset-use:${await clientAddress()}`, 20, 15 * 60_000);
  const passwordHash = await bcrypt.hash(input.password, 10);
  const userId = spendAuthToken(input.token, 'reset-password');
  if (!userId) {
    throw new AppError('bad_request', 'This reset link has expired or was already used. Ask for a new one.');
  }
  setPasswordHash(userId, passwordHash);
  markEmailVerified(userId);
  // Whoever held the old password (or a link sent before) is out: every session and token ends.
  endAllSessions(userId);
  return { ok: true, message: 'Your password is changed. Sign in with it now.' };
});
