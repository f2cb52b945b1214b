import { z } from 'zod';
import { RSVP_STATES } from '@/db/enums';
import { emailSchema } from '@/lib/validations/account';

const idSchema = z.string().trim().min(1, 'Missing id.').max(100, 'That id is too long.');

export const railwayIdSchema = idSchema;
export const sessionIdSchema = idSchema;
export const invitationIdSchema = idSchema;

/** The answers a person can give; "needs-action" is only the state before any answer. */
export const ANSWERS = RSVP_STATES.filter((s) => s !== 'needs-action') as ['accepted', 'tentative', 'declined'];
export type Answer = (typeof ANSWERS)[number];
export const answerSchema = z.enum(ANSWERS, { error: 'Choose accept, maybe or decline.' });

export const MAX_GUESTS = 200;

/** Guest addresses typed into one box, separated by commas, semicolons, spaces or new lines. */
export const guestEmailsSchema = z
  .string()
  .max(20_000, 'That is too much text for a list of addresses.')
  .transform((text) => [...new Set(text.split(/[\s,;]+/).map((s) => s.toLowerCase()).filter(Boolean))])
  .pipe(
    z
      .array(emailSchema, { error: 'Enter e-mail addresses.' })
      .max(MAX_GUESTS, `Invite at most ${MAX_GUESTS} guests at once.`),
  );

export const inviteCrewSchema = z
  .object({
    userIds: z.array(idSchema).max(500, 'Pick at most 500 members at once.'),
    guestEmails: guestEmailsSchema,
  })
  .refine((v) => v.userIds.length + v.guestEmails.length > 0, {
    path: ['userIds'],
    message: 'Pick at least one member or type a guest’s e-mail address.',
  });

export const NOTICE_KINDS = ['pending', 'update', 'cancel'] as const;
export type NoticeKind = (typeof NOTICE_KINDS)[number];
export const sendNoticesSchema = z.object({
  kind: z.enum(NOTICE_KINDS, { error: 'Choose what to send: invitations not sent yet, an update, or a cancellation.' }),
});

export const resendSchema = z.object({ invitationId: invitationIdSchema });

export const replyByTokenSchema = z.object({
  token: z.string().min(20, 'This reply link is not valid.').max(1000, 'This reply link is not valid.'),
  answer: answerSchema,
});

export const answerInvitationSchema = z.object({ answer: answerSchema });
