'use server';

import { revalidatePath } from 'next/cache';
import { z } from 'zod';
import { addMember, countHosts, getMembership, removeMember as deleteMembership, setMemberRole } from '@/db/queries/memberships';
import { getRailway, recordAudit } from '@/db/queries/railways';
import { createUser, getUserByEmail } from '@/db/queries/users';
import { requireMember } from '@/lib/auth';
import { AppError, notFound, type ActionState, parseOrThrow } from '@/lib/errors';
import { action } from '@/lib/http';
import { queueMemberWelcomeMail } from '@/lib/mail/account-mail';
import { ROLE_LABELS } from '@/lib/roles';
import { issueAuthToken } from '@/lib/tokens';
import { changeRoleSchema, inviteMemberSchema, removeMemberSchema } from '@/lib/validations/account';

const railwayIdSchema = z.string().min(1).max(100);

/** Host only: adds someone by e-mail (creating their account if needed) and e-mails them a sign-in link. */
export const inviteMember = action(['id', 'state', 'form'], async (railwayId, _prev, formData): Promise<ActionState> => {
  const host = await requireMember(parseOrThrow(railwayIdSchema, railwayId), 'host', 'add members');
  const input = parseOrThrow(inviteMemberSchema, { email: formData.get('email'), role: formData.get('role') });
  const railway = getRailway(host.railwayId);
  if (!railway) throw notFound('That railway');
  const user = getUserByEmail(input.email) ?? createUser({ email: input.email, name: input.email.split('@')[0] ?? input.email, passwordHash: null });
  if (!addMember(host.railwayId, user.id, input.role)) {
    throw new AppError('conflict', `${input.email} is already a member.`, {
      issues: [{ path: 'email', message: `${input.email} is already a member.` }],
    });
  }
  queueMemberWelcomeMail({
    railwayId: host.railwayId,
    railwayName: railway.name,
    to: user.email,
    role: ROLE_LABELS[input.role].toLowerCase(),
    invitedBy: host.user.name,
    token: issueAuthToken(user.id, 'sign-in'),
  });
  recordAudit({ railwayId: host.railwayId, userId: host.user.id, action: 'add', entity: 'member', entityId: user.id, detail: { role: input.role } });
  revalidatePath(`/railways/${host.railwayId}/members`);
  return { ok: true, message: `Added ${input.email} as ${ROLE_LABELS[input.role].toLowerCase()} and e-mailed a sign-in link.` };
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

/** Host only: removes a member from this railway (their account stays). */
export const removeMember = action(['id', 'state', 'form'], async (railwayId, _prev, formData): Promise<ActionState> => {
  const host = await requireMember(parseOrThrow(railwayIdSchema, railwayId), 'host', 'remove members');
  const input = parseOrThrow(removeMemberSchema, { userId: formData.get('userId') });
  assertNotLastHost(host.railwayId, input.userId);
  if (!deleteMembership(host.railwayId, input.userId)) throw notFound('That member');
  recordAudit({ railwayId: host.railwayId, userId: host.user.id, action: 'remove', entity: 'member', entityId: input.userId });
  revalidatePath(`/railways/${host.railwayId}/members`);
  return { ok: true, message: 'Member removed.' };
});
