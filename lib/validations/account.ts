import { z } from 'zod';
import { ROLES } from '@/db/schema';

export const emailSchema = z
  .string({ error: 'Enter an e-mail address.' })
  .trim()
  .toLowerCase()
  .max(254, 'That e-mail address is too long.')
  .pipe(z.email({ error: 'Enter a valid e-mail address, like name@example.org.' }));

export const passwordSchema = z
  .string({ error: 'Enter a password.' })
  .min(10, 'Use at least 10 characters.')
  .max(200, 'Use at most 200 characters.');

export const nameSchema = z
  .string({ error: 'Enter your name.' })
  .trim()
  .min(1, 'Enter your name.')
  .max(80, 'Use at most 80 characters.');

export const signInSchema = z.object({ email: emailSchema, password: z.string().min(1).max(200) });

export const signUpSchema = z.object({ name: nameSchema, email: emailSchema, password: passwordSchema });

export const requestLinkSchema = z.object({ email: emailSchema });

export const resetPasswordSchema = z
  .object({
    token: z.string().min(20, 'This reset link is not valid.').max(100, 'This reset link is not valid.'),
    password: passwordSchema,
    confirm: z.string(),
  })
  .refine((v) => v.password === v.confirm, { path: ['confirm'], message: 'The two passwords differ.' });

export const railwaySchema = z.object({
  name: z.string().trim().min(2, 'Use at least 2 characters.').max(80, 'Use at most 80 characters.'),
  timeZone: z
    .string()
    .refine((tz) => Intl.supportedValuesOf('timeZone').includes(tz) || tz === 'UTC', {
      message: 'Choose a time zone from the list.',
    }),
});

export const roleSchema = z.enum(ROLES, { error: 'Choose host, planner or operator.' });

export const inviteMemberSchema = z.object({ email: emailSchema, role: roleSchema });

export const changeRoleSchema = z.object({ userId: z.string().min(1).max(100), role: roleSchema });

export const removeMemberSchema = z.object({ userId: z.string().min(1).max(100) });
