'use server';

import bcrypt from 'bcryptjs';
import { createUser, getUserByEmail } from '@/db/queries/users';
import { AppError, toActionState, type ActionState, parseOrThrow } from '@/lib/errors';
import { clientAddress } from '@/lib/client-key';
import { rateLimit } from '@/lib/rate-limit';
import { signUpSchema } from '@/lib/validations/account';

/** Creates an account with e-mail and password; the form then signs in with the same details. */
export async function signUp(_prev: ActionState, formData: FormData): Promise<ActionState> {
  try {
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
  } catch (error) {
    return toActionState(error);
  }
}
