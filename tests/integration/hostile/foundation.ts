import { actionStatus } from '../authz/shared';
import { formData } from '../world';
import type { HostileTarget } from './shared';

const MEMBERS = 'app/(app)/railways/[railwayId]/members/actions.ts';

export const FOUNDATION_HOSTILE: HostileTarget[] = [
  {
    target: 'app/(app)/railways/actions.ts#createRailway',
    kind: 'action',
    fields: ['name', 'timeZone'],
    send: async (_w, f) => {
      const { createRailway } = await import('@/app/(app)/railways/actions');
      // A valid name with a hostile time zone, so that a pass would really create a railway.
      return actionStatus(() => createRailway(null, formData({ ...f, name: f.name && f.name.length > 2 ? f.name : 'ok name' })));
    },
  },
  {
    target: `${MEMBERS}#inviteMember`,
    kind: 'action',
    fields: ['email', 'role'],
    send: async (w, f) => {
      const { inviteMember } = await import('@/app/(app)/railways/[railwayId]/members/actions');
      return actionStatus(() => inviteMember(w.railway.id, null, formData(f)));
    },
  },
  {
    target: `${MEMBERS}#changeMemberRole`,
    kind: 'action',
    fields: ['userId', 'role'],
    send: async (w, f) => {
      const { changeMemberRole } = await import('@/app/(app)/railways/[railwayId]/members/actions');
      return actionStatus(() => changeMemberRole(w.railway.id, null, formData(f)));
    },
  },
  {
    target: `${MEMBERS}#removeMember`,
    kind: 'action',
    fields: ['userId'],
    send: async (w, f) => {
      const { removeMember } = await import('@/app/(app)/railways/[railwayId]/members/actions');
      return actionStatus(() => removeMember(w.railway.id, null, formData(f)));
    },
  },
  {
    target: `${MEMBERS}#withdrawMemberOffer`,
    kind: 'action',
    fields: ['email'],
    send: async (w, f) => {
      const { withdrawMemberOffer } = await import('@/app/(app)/railways/[railwayId]/members/actions');
      return actionStatus(() => withdrawMemberOffer(w.railway.id, null, formData(f)));
    },
  },
  {
    target: 'app/(app)/railways/actions.ts#replyToMemberOffer',
    kind: 'action',
    fields: ['invitationId', 'reply'],
    send: async (_w, f) => {
      const { replyToMemberOffer } = await import('@/app/(app)/railways/actions');
      return actionStatus(() => replyToMemberOffer(null, formData(f)));
    },
  },
  {
    target: 'app/(app)/railways/actions.ts#signOutEverywhere',
    kind: 'exempt',
    why: 'takes no input: any call by a signed-in person is a valid request that ends their own sessions (tests/integration/session-end.test.ts)',
  },
  {
    target: 'app/(auth)/sign-in/actions.ts#requestSignInLink',
    kind: 'action',
    fields: ['email'],
    send: async (_w, f) => {
      const { requestSignInLink } = await import('@/app/(auth)/sign-in/actions');
      return actionStatus(() => requestSignInLink(null, formData(f)));
    },
  },
  {
    target: 'app/(auth)/sign-up/actions.ts#signUp',
    kind: 'action',
    fields: ['name', 'email', 'password'],
    send: async (_w, f) => {
      const { signUp } = await import('@/app/(auth)/sign-up/actions');
      return actionStatus(() => signUp(null, formData(f)));
    },
  },
  {
    target: 'app/(auth)/reset-password/actions.ts#requestPasswordReset',
    kind: 'action',
    fields: ['email'],
    send: async (_w, f) => {
      const { requestPasswordReset } = await import('@/app/(auth)/reset-password/actions');
      return actionStatus(() => requestPasswordReset(null, formData(f)));
    },
  },
  {
    target: 'app/(auth)/reset-password/actions.ts#resetPassword',
    kind: 'action',
    fields: ['token', 'password', 'confirm'],
    send: async (_w, f) => {
      const { resetPassword } = await import('@/app/(auth)/reset-password/actions');
      return actionStatus(() => resetPassword(null, formData(f)));
    },
  },
  {
    target: 'app/api/auth/[...nextauth]/route.ts#POST',
    kind: 'exempt',
    why: 'next-auth parses its own requests; its credential providers validate with zod (lib/auth-options.ts)',
  },
];
