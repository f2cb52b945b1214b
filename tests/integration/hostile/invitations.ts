import { guestEmailsSchema, replyDeadlineSchema, replySchema, replyToInvitationSchema, sendNoticesSchema } from '@/lib/validations/invitation';
import { inviteEveryone, makeSessionWorld } from '../authz/invitations';
import { actionStatus, type World } from '../authz/shared';
import { formData } from '../world';
import { perWorld, refused, worst, type HostileTarget } from './shared';

// The session and invitations are real (authz/invitations.ts's published session, every member
// invited); the hostile input is the form. Where the generated fields could by chance make a
// valid request, `refused` checks the action's own schema and pins one field it refuses.

const TRACKER = 'app/(app)/railways/[railwayId]/sessions/[sessionId]/invitations/actions.ts';
const MY_RUNS = 'app/(app)/my-runs/actions.ts';

const world = perWorld((w: World) => {
  const s = makeSessionWorld(w);
  const invitations = inviteEveryone(w, s.session.id);
  return { ...s, own: invitations.find((i) => i.userId === w.host.id)! };
});

export const INVITATION_HOSTILE: HostileTarget[] = [
  {
    // `userIds` are random strings, never members' ids; a guest list that holds a valid address
    // ('a@b' is one) would invite that guest, so it is pinned to one that holds none.
    target: `${TRACKER}#inviteCrew`,
    kind: 'action',
    fields: ['userIds', 'guestEmails'],
    setup: world,
    send: async (w, f) => {
      const { inviteCrew } = await import('@/app/(app)/railways/[railwayId]/sessions/[sessionId]/invitations/actions');
      const fields = refused(f, (v) => (guestEmailsSchema.safeParse(v.guestEmails).data?.length ?? 0) > 0, { guestEmails: '@@' });
      return actionStatus(() => inviteCrew(w.railway.id, world(w).session.id, null, formData(fields)));
    },
  },
  {
    target: `${TRACKER}#sendNotices`,
    kind: 'action',
    fields: ['kind'],
    setup: world,
    send: async (w, f) => {
      const { sendNotices } = await import('@/app/(app)/railways/[railwayId]/sessions/[sessionId]/invitations/actions');
      const fields = refused(f, (v) => sendNoticesSchema.safeParse(v).success, { kind: '' });
      return actionStatus(() => sendNotices(w.railway.id, world(w).session.id, null, formData(fields)));
    },
  },
  {
    // A random string is never an invitation's id.
    target: `${TRACKER}#resendInvitation`,
    kind: 'action',
    fields: ['invitationId'],
    setup: world,
    send: async (w, f) => {
      const { resendInvitation } = await import('@/app/(app)/railways/[railwayId]/sessions/[sessionId]/invitations/actions');
      return actionStatus(() => resendInvitation(w.railway.id, world(w).session.id, null, formData(f)));
    },
  },
  {
    target: `${TRACKER}#remindCrew`,
    kind: 'exempt',
    why: 'takes no form input: the railway and session ids are bound on the server and checked (authz covers who may)',
  },
  {
    // A date and time that parses would set a deadline: pinned to one the schema refuses.
    target: `${TRACKER}#setReplyDeadline`,
    kind: 'action',
    fields: ['replyBy'],
    setup: world,
    send: async (w, f) => {
      const { setReplyDeadline } = await import('@/app/(app)/railways/[railwayId]/sessions/[sessionId]/invitations/actions');
      const fields = refused(f, (v) => replyDeadlineSchema.safeParse(v).success, { replyBy: 'soon' });
      return actionStatus(() => setReplyDeadline(w.railway.id, world(w).session.id, null, formData(fields)));
    },
  },
  {
    // The host's own invitation (a real id); the reply is hostile.
    target: `${MY_RUNS}#replyToInvitation`,
    kind: 'action',
    fields: ['reply'],
    setup: world,
    send: async (w, f) => {
      const { replyToInvitation } = await import('@/app/(app)/my-runs/actions');
      const fields = refused(f, (v) => replyToInvitationSchema.safeParse(v).success, { reply: '' });
      return actionStatus(() => replyToInvitation(world(w).own.id, null, formData(fields)));
    },
  },
  {
    target: `${MY_RUNS}#resetCalendarFeed`,
    kind: 'exempt',
    why: 'takes no input at all: every call by a signed-in user is a valid request that makes a new feed address (authz covers who may)',
  },
  {
    // A hostile token is never signed by us; and a real reply link with a hostile answer.
    target: 'app/(public)/reply/actions.ts#replyByToken',
    kind: 'action',
    fields: ['token', 'reply', 'comment'],
    setup: world,
    send: async (w, f) => {
      const { replyByToken } = await import('@/app/(public)/reply/actions');
      const { signReplyToken } = await import('@/lib/invitations/reply-token');
      const { session, invitation } = world(w);
      const token = signReplyToken({ railwayId: w.railway.id, invitationId: invitation.id, nonce: 0, expiresAt: session.endsAt.getTime() });
      const { reply: choice } = refused(f, (v) => replySchema.safeParse(v.reply).success, { reply: '' });
      const reply = (fields: Record<string, string>) =>
        actionStatus(async () => {
          const state = await replyByToken(null, formData(fields));
          return state?.ok ? { ok: true } : state;
        });
      return worst([await reply(f), await reply({ token, reply: choice!, comment: f.comment ?? '' })]);
    },
  },
];
