'use server';

import bcrypt from 'bcryptjs';
import { createUser, getUserByEmail } from '@/db/queries/users';
import { AppError, type ActionState, parseOrThrow } from '@/lib/errors';
import { action } from '@/lib/http';
import { clientAddress } from '@/lib/client-key';
import { rateLimit } from '@/lib/rate-limit';
import { signUpSchema } from '@/lib/validations/account';

/** Creates an account with e-mail and password; the form then signs in with the same details. */
export const signUp = action(['state', 'form'], async (_prev, formData): Promise<ActionState> => {
  const input = parseOrThrow(signUpSchema, {
    name: formData.get('name'),
    email: formData.get('email'),
    password: formData.get('password'),
  });
  rateLimit(`sign-up:${await clientAddress()}`, 10, 60 * 60_000);
  if (getUserByEmail(input.email)) {
    throw new AppError('conflict', 'That e-mail address already has an account. Sign in instead, or reset the password.', {
      issues: [{ path: 'email', message: 'That e-mail address already has an account.' }],
    });
  }
  createUser({ email: input.email, name: input.name, passwordHash: await bcrypt.hash(input.password, 10) });
  return { ok: true, message: 'Account created.' };
});
