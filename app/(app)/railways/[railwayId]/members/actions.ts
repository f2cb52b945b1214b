'use server';

import { revalidatePath } from 'next/cache';
import { z } from 'zod';
import { countHosts, detachMember, getMembership, listRunsStillOperatedBy, setMemberRole } from '@/db/queries/memberships';
import { getRailway, recordAudit } from '@/db/queries/railways';
import { upsertMemberInvitation, withdrawMemberInvitation } from '@/db/queries/member-invitations';
import { getUserByEmail, getUserById } from '@/db/queries/users';
import { requireMember } from '@/lib/auth';
import { AppError, notFound, type ActionState, parseOrThrow } from '@/lib/errors';
import { action } from '@/lib/http';
import { queueMembershipOfferMail } from '@/lib/mail/account-mail';
import { formatFast } from '@/lib/planning';
import { ROLE_LABELS } from '@/lib/roles';
import { changeRoleSchema, inviteMemberSchema, removeMemberSchema, requestLinkSchema } from '@/lib/validations/account';

const railwayIdSchema = z.string().min(1).max(100);

/**
 * Host only: offers membership to an e-mail address. Nothing attaches until the owner of the
 * address accepts while signed in with it (an existing account is never added, and no sign-in link
 * is sent, on someone else's word). The e-mail says how to accept and carries no token.
 */
export const inviteMember = action(['id', 'state', 'form'], async (railwayId, _prev, formData): Promise<ActionState> => {
  const host = await requireMember(parseOrThrow(railwayIdSchema, railwayId), 'host', 'add members');
  const input = parseOrThrow(inviteMemberSchema, { email: formData.get('email'), role: formData.get('role') });
  const railway = getRailway(host.railwayId);
  if (!railway) throw notFound('That railway');
  const existing = getUserByEmail(input.email);
  if (existing && getMembership(host.railwayId, existing.id)) {
    throw new AppError('conflict', `${input.email} is already a member.`, {
      issues: [{ path: 'email', message: `${input.email} is already a member.` }],
    });
  }
  const offer = upsertMemberInvitation({ railwayId: host.railwayId, email: input.email, role: input.role, invitedById: host.user.id });
  queueMembershipOfferMail({
    railwayId: host.railwayId,
    railwayName: railway.name,
    to: input.email,
    role: ROLE_LABELS[input.role].toLowerCase(),
    invitedBy: host.user.name,
    hasAccount: Boolean(existing),
  });
  recordAudit({ railwayId: host.railwayId, userId: host.user.id, action: 'offer', entity: 'member', entityId: offer.id, detail: { role: input.role } });
  revalidatePath(`/railways/${host.railwayId}/members`);
  return {
    ok: true,
    message: `Invited ${input.email} as ${ROLE_LABELS[input.role].toLowerCase()}. They join when they accept, signed in with that address.`,
  };
});

/** Host only: withdraws an offer of membership that has not been accepted yet. */
export const withdrawMemberOffer = action(['id', 'state', 'form'], async (railwayId, _prev, formData): Promise<ActionState> => {
  const host = await requireMember(parseOrThrow(railwayIdSchema, railwayId), 'host', 'withdraw invitations');
  const { email } = parseOrThrow(requestLinkSchema, { email: formData.get('email') });
  if (!withdrawMemberInvitation(host.railwayId, email)) throw notFound('That invitation');
  recordAudit({ railwayId: host.railwayId, userId: host.user.id, action: 'withdraw-offer', entity: 'member', entityId: email });
  revalidatePath(`/railways/${host.railwayId}/members`);
  return { ok: true, message: `Withdrew the invitation to ${email}.` };
});

function assertNotLastHost(railwayId: string, userId: string) {
  const current = getMembership(railwayId, userId);
  if (!current) throw notFound('That member');
  if (current.role === 'host' && countHosts(railwayId) <= 1) {
    throw new AppError('bad_request', 'A railway needs at least one host. Make someone else host first.');
  }
}

/** Host only: changes a member's role; the last host cannot step down. */
export const changeMemberRole = action(['id', 'state', 'form'], async (railwayId, _prev, formData): Promise<ActionState> => {
  const host = await requireMember(parseOrThrow(railwayIdSchema, railwayId), 'host', 'change roles');
  const input = parseOrThrow(changeRoleSchema, { userId: formData.get('userId'), role: formData.get('role') });
  if (input.role !== 'host') assertNotLastHost(host.railwayId, input.userId);
  if (!setMemberRole(host.railwayId, input.userId, input.role)) throw notFound('That member');
  recordAudit({ railwayId: host.railwayId, userId: host.user.id, action: 'change-role', entity: 'member', entityId: input.userId, detail: { role: input.role } });
  revalidatePath(`/railways/${host.railwayId}/members`);
  return { ok: true, message: `Role changed to ${ROLE_LABELS[input.role].toLowerCase()}.` };
});

/** Names runs for a person: "Evening: Local 06:20, Freight 07:05 (fast)", the first ten of them. */
function describeRuns(list: ReturnType<typeof listRunsStillOperatedBy>): string {
  const bySession = new Map<string, string[]>();
  for (const r of list.slice(0, 10)) {
    const label = `${r.trainName} ${formatFast(r.departS, { ratio: r.clockRatio, fastStart: r.fastStart })}`;
    bySession.set(r.sessionTitle, [...(bySession.get(r.sessionTitle) ?? []), label]);
  }
  const text = [...bySession].map(([title, labels]) => `${title}: ${labels.join(', ')}`).join('; ');
  return list.length > 10 ? `${text} and ${list.length - 10} more` : text;
}

/**
 * Host only: removes a member from this railway (their account stays). Refused, with the runs
 * named, while they operate runs in sessions still to come — the host gives those runs another
 * operator first, so no published timetable silently loses its driver. Their invitations, reply
 * links and duties go with the membership; runs in sessions already over keep no operator.
 */
export const removeMember = action(['id', 'state', 'form'], async (railwayId, _prev, formData): Promise<ActionState> => {
  const host = await requireMember(parseOrThrow(railwayIdSchema, railwayId), 'host', 'remove members');
  const input = parseOrThrow(removeMemberSchema, { userId: formData.get('userId') });
  assertNotLastHost(host.railwayId, input.userId);
  const still = listRunsStillOperatedBy(host.railwayId, input.userId);
  if (still.length > 0) {
    const name = getUserById(input.userId)?.name ?? 'This member';
    throw new AppError(
      'conflict',
      `${name} operates ${still.length} run${still.length === 1 ? '' : 's'} in sessions still to come (${describeRuns(still)}, fast clock). Give ${still.length === 1 ? 'it' : 'them'} another operator, or none, in the timetable first.`,
    );
  }
  const result = detachMember(host.railwayId, input.userId);
  if (!result.removed) throw notFound('That member');
  recordAudit({ railwayId: host.railwayId, userId: host.user.id, action: 'remove', entity: 'member', entityId: input.userId, detail: { unassignedRuns: result.unassignedRuns } });
  revalidatePath(`/railways/${host.railwayId}/members`);
  return { ok: true, message: 'Member removed. Their invitations and reply links no longer work.' };
});
