import { formData } from '../world';
import { actionStatus, type AuthzCase, type AuthzExemption } from './shared';

const MEMBERS = 'app/(app)/railways/[railwayId]/members/actions.ts';
import { everyone, hostOnly, signedIn } from './shared';

export const FOUNDATION_CASES: AuthzCase[] = [
  {
    target: 'app/api/health/route.ts#GET',
    call: async () => (await (await import('@/app/api/health/route')).GET()).status,
    expect: everyone,
  },
  {
    target: 'app/(app)/railways/actions.ts#createRailway',
    call: async () => {
      const { createRailway } = await import('@/app/(app)/railways/actions');
      return actionStatus(() => createRailway(null, formData({ name: 'New railway', timeZone: 'UTC' })));
    },
    expect: signedIn,
  },
  {
    target: `${MEMBERS}#inviteMember`,
    call: async (w) => {
      const { inviteMember } = await import('@/app/(app)/railways/[railwayId]/members/actions');
      return actionStatus(() => inviteMember(w.railway.id, null, formData({ email: 'new-member@test.example', role: 'operator' })));
    },
    expect: hostOnly,
  },
  {
    target: `${MEMBERS}#changeMemberRole`,
    call: async (w) => {
      const { changeMemberRole } = await import('@/app/(app)/railways/[railwayId]/members/actions');
      return actionStatus(() => changeMemberRole(w.railway.id, null, formData({ userId: w.operator.id, role: 'planner' })));
    },
    expect: hostOnly,
  },
  {
    target: `${MEMBERS}#removeMember`,
    call: async (w) => {
      const { removeMember } = await import('@/app/(app)/railways/[railwayId]/members/actions');
      return actionStatus(() => removeMember(w.railway.id, null, formData({ userId: w.operator.id })));
    },
    expect: hostOnly,
  },
  {
    target: `${MEMBERS}#withdrawMemberOffer`,
    call: async (w) => {
      const { withdrawMemberOffer } = await import('@/app/(app)/railways/[railwayId]/members/actions');
      const { upsertMemberInvitation } = await import('@/db/queries/member-invitations');
      upsertMemberInvitation({ railwayId: w.railway.id, email: 'offered@test.example', role: 'operator', invitedById: w.host.id });
      return actionStatus(() => withdrawMemberOffer(w.railway.id, null, formData({ email: 'offered@test.example' })));
    },
    expect: hostOnly,
  },
  {
    // An offer of membership made to the operator's address by the other railway: only the owner
    // of that address may reply to it; anyone else finds nothing.
    target: 'app/(app)/railways/actions.ts#replyToMemberOffer',
    call: async (w) => {
      const { replyToMemberOffer } = await import('@/app/(app)/railways/actions');
      const { upsertMemberInvitation } = await import('@/db/queries/member-invitations');
      const { markEmailVerified } = await import('@/db/queries/users');
      for (const u of [w.operator, w.planner, w.host, w.outsider]) markEmailVerified(u.id);
      const offer = upsertMemberInvitation({ railwayId: w.otherRailway.id, email: w.operator.email, role: 'operator', invitedById: w.outsider.id });
      return actionStatus(() => replyToMemberOffer(null, formData({ invitationId: offer.id, reply: 'accept' })));
    },
    expect: { anon: 401, outsider: 404, operator: 200, planner: 404, host: 404 },
  },
  {
    target: 'app/(app)/railways/actions.ts#signOutEverywhere',
    call: async () => {
      const { signOutEverywhere } = await import('@/app/(app)/railways/actions');
      return actionStatus(() => signOutEverywhere(null, formData({})));
    },
    expect: signedIn,
  },
  // Account actions are for people who are not signed in yet: every caller gets the same answer.
  {
    target: 'app/(auth)/sign-in/actions.ts#requestSignInLink',
    call: async (w) => {
      const { requestSignInLink } = await import('@/app/(auth)/sign-in/actions');
      return actionStatus(() => requestSignInLink(null, formData({ email: w.operator.email })));
    },
    expect: everyone,
  },
  {
    target: 'app/(auth)/sign-up/actions.ts#signUp',
    call: async () => {
      const { signUp } = await import('@/app/(auth)/sign-up/actions');
      return actionStatus(() =>
        signUp(null, formData({ name: 'Fresh', email: `fresh-${crypto.randomUUID()}@test.example`, password: 'long-enough-pass' })),
      );
    },
    expect: everyone,
  },
  {
    target: 'app/(auth)/reset-password/actions.ts#requestPasswordReset',
    call: async (w) => {
      const { requestPasswordReset } = await import('@/app/(auth)/reset-password/actions');
      return actionStatus(() => requestPasswordReset(null, formData({ email: w.host.email })));
    },
    expect: everyone,
  },
  {
    target: 'app/(auth)/reset-password/actions.ts#resetPassword',
    call: async (w) => {
      const { resetPassword } = await import('@/app/(auth)/reset-password/actions');
      const { issueAuthToken } = await import('@/lib/tokens');
      const token = issueAuthToken(w.operator.id, 'reset-password');
      return actionStatus(() => resetPassword(null, formData({ token, password: 'another-long-pass', confirm: 'another-long-pass' })));
    },
    expect: everyone,
  },
];

export const FOUNDATION_EXEMPTIONS: AuthzExemption[] = [
  {
    target: 'app/api/auth/[...nextauth]/route.ts#GET',
    why: 'next-auth’s own endpoints (sign-in, session, CSRF); covered by the browser sign-in tests',
  },
  {
    target: 'app/api/auth/[...nextauth]/route.ts#POST',
    why: 'next-auth’s own endpoints (sign-in, session, CSRF); covered by the browser sign-in tests',
  },
];

