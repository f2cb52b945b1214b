'use client';

import { useActionState } from 'react';
import { changeMemberRole, inviteMember, removeMember, withdrawMemberOffer } from '@/app/(app)/railways/[railwayId]/members/actions';
import { Button } from '@/components/ui/button';
import { Badge, Notice } from '@/components/ui/card';
import { Field, Select, TextInput, inputClass } from '@/components/ui/field';
import { ROLE_LABELS, ROLES, type Role } from '@/lib/roles';

export function InviteMemberForm({ railwayId }: { railwayId: string }) {
  const [state, action, pending] = useActionState(inviteMember.bind(null, railwayId), null);
  const errors = state && !state.ok ? (state.fieldErrors ?? {}) : {};
  return (
    <form action={action} className="space-y-4" noValidate>
      {state?.ok ? <Notice tone="good">{state.message}</Notice> : null}
      {state && !state.ok && Object.keys(errors).length === 0 ? <Notice tone="bad">{state.error}</Notice> : null}
      <Field label="E-mail address" name="email" error={errors.email}>
        <TextInput name="email" type="email" required />
      </Field>
      <Field label="Role" name="role" error={errors.role}>
        <Select name="role" defaultValue="operator">
          {ROLES.map((r) => (
            <option key={r} value={r}>
              {ROLE_LABELS[r]}
            </option>
          ))}
        </Select>
      </Field>
      <p className="text-sm text-muted">
        They join when they accept, signed in with this address. The e-mail carries no sign-in link.
      </p>
      <Button type="submit" disabled={pending}>
        {pending ? 'Inviting…' : 'Invite by e-mail'}
      </Button>
    </form>
  );
}

export function MemberRow({
  railwayId,
  member,
  editable,
  isSelf,
}: {
  railwayId: string;
  member: { userId: string; name: string; email: string | null; role: Role; pending: boolean };
  editable: boolean;
  isSelf: boolean;
}) {
  const [roleState, roleAction, rolePending] = useActionState(changeMemberRole.bind(null, railwayId), null);
  const [removeState, removeAction, removePending] = useActionState(removeMember.bind(null, railwayId), null);
  const error = (roleState && !roleState.ok && roleState.error) || (removeState && !removeState.ok && removeState.error);
  return (
    <li className="flex flex-col gap-2 py-3 sm:flex-row sm:items-center sm:justify-between" data-testid="member-row">
      <div>
        <p className="font-semibold">
          {member.name} {isSelf ? <span className="text-sm font-normal text-muted">(you)</span> : null}
        </p>
        {member.email ? <p className="text-sm text-muted">{member.email}</p> : null}
        {error ? <p className="text-sm text-signal" role="alert">{error}</p> : null}
      </div>
      <div className="flex items-center gap-2">
        {member.pending ? <Badge tone="warn">not signed in yet</Badge> : null}
        {editable ? (
          <>
            <form action={roleAction} className="flex items-center gap-2">
              <input type="hidden" name="userId" value={member.userId} />
              <label className="sr-only" htmlFor={`role-${member.userId}`}>Role of {member.name}</label>
              <select id={`role-${member.userId}`} name="role" defaultValue={member.role} className={`${inputClass} w-32`} disabled={rolePending}>
                {ROLES.map((r) => (
                  <option key={r} value={r}>{ROLE_LABELS[r]}</option>
                ))}
              </select>
              <Button type="submit" variant="secondary" disabled={rolePending}>Save</Button>
            </form>
            <form action={removeAction}>
              <input type="hidden" name="userId" value={member.userId} />
              <Button type="submit" variant="danger" disabled={removePending} aria-label={`Remove ${member.name}`}>Remove</Button>
            </form>
          </>
        ) : (
          <Badge tone={member.role === 'host' ? 'info' : member.role === 'planner' ? 'good' : 'neutral'}>{ROLE_LABELS[member.role]}</Badge>
        )}
      </div>
    </li>
  );
}

export function PendingOfferRow({ railwayId, offer }: { railwayId: string; offer: { email: string; role: Role } }) {
  const [state, action, pending] = useActionState(withdrawMemberOffer.bind(null, railwayId), null);
  return (
    <li className="flex flex-col gap-2 py-3 sm:flex-row sm:items-center sm:justify-between" data-testid="offer-row">
      <div>
        <p className="font-semibold break-all">{offer.email}</p>
        <p className="text-sm text-muted">Invited as {ROLE_LABELS[offer.role].toLowerCase()}, not accepted yet</p>
        {state && !state.ok ? <p className="text-sm text-signal" role="alert">{state.error}</p> : null}
      </div>
      <form action={action}>
        <input type="hidden" name="email" value={offer.email} />
        <Button type="submit" variant="secondary" disabled={pending} aria-label={`Withdraw the invitation to ${offer.email}`}>
          Withdraw
        </Button>
      </form>
    </li>
  );
}
