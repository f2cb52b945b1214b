import { z } from 'zod';
import { REPLY_STATES } from '@/db/enums';
import { emailSchema } from '@/lib/validations/account';

const idSchema = z.string().trim().min(1, 'Missing id.').max(100, 'That id is too long.');

export const railwayIdSchema = idSchema;
export const sessionIdSchema = idSchema;
export const invitationIdSchema = idSchema;

/** The replies a person can give; "needs-action" is only the state before any reply. */
export const REPLIES = REPLY_STATES.filter((s) => s !== 'needs-action') as ['accepted', 'tentative', 'declined'];
export type Reply = (typeof REPLIES)[number];
export const replySchema = z.enum(REPLIES, { error: 'Choose accept, maybe or decline.' });

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

/** A short note with a reply, for the host and planners only. */
export const MAX_REPLY_COMMENT = 280;
export const replyCommentSchema = z
  .string()
  .max(MAX_REPLY_COMMENT * 4, `Keep the note to ${MAX_REPLY_COMMENT} characters.`)
  // Control characters (other than line breaks) have no place in a note; they are dropped, not refused.
  // eslint-disable-next-line no-control-regex
  .transform((s) => s.replace(/\r\n?/g, '\n').replace(/[\u0000-\u0009\u000b-\u001f\u007f]/g, '').trim())
  .refine((s) => [...s].length <= MAX_REPLY_COMMENT, `Keep the note to ${MAX_REPLY_COMMENT} characters.`);

export const replyByTokenSchema = z.object({
  token: z.string().min(20, 'This reply link is not valid.').max(1000, 'This reply link is not valid.'),
  reply: replySchema,
  comment: replyCommentSchema.default(''),
});

/** The host's reply deadline, as a date and time on the session's wall clock (datetime-local), or '' to clear it. */
export const replyDeadlineSchema = z.object({
  replyBy: z
    .string()
    .trim()
    .max(20, 'Enter the date and time as YYYY-MM-DDTHH:MM.')
    .regex(/^$|^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}$/, 'Enter the date and time as YYYY-MM-DDTHH:MM.'),
});

/** Reminders to those who have not replied: at most one per invitee in this time (common practice: once a day). */
export const REMINDER_GAP_MS = 20 * 3600_000;

export const replyToInvitationSchema = z.object({ reply: replySchema });
