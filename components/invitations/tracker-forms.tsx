'use client';

import { useActionState, useState } from 'react';
import {
  inviteCrew,
  resendInvitation,
  sendNotices,
} from '@/app/(app)/railways/[railwayId]/sessions/[sessionId]/invitations/actions';
import { Button } from '@/components/ui/button';
import { Notice } from '@/components/ui/card';
import { Field, inputClass } from '@/components/ui/field';

export type PickableMember = { userId: string; name: string; email: string; role: string; runCount: number };

export function InviteCrewForm({
  railwayId,
  sessionId,
  members,
}: {
  railwayId: string;
  sessionId: string;
  members: PickableMember[];
}) {
  const [state, action, pending] = useActionState(inviteCrew.bind(null, railwayId, sessionId), null);
  const [picked, setPicked] = useState<Set<string>>(() => new Set(members.filter((m) => m.runCount > 0).map((m) => m.userId)));
  const errors = state && !state.ok ? (state.fieldErrors ?? {}) : {};
  const toggle = (id: string) =>
    setPicked((old) => {
      const next = new Set(old);
      if (next.has(id)) next.delete(id);
      else next.add(id);
      return next;
    });
  return (
    <form action={action} className="space-y-4" noValidate data-testid="invite-form">
      {state?.ok ? <Notice tone="good">{state.message}</Notice> : null}
      {state && !state.ok && !errors.userIds && !errors.guestEmails ? <Notice tone="bad">{state.error}</Notice> : null}
      {members.length ? (
        <fieldset className="space-y-2">
          <legend className="mb-1 flex w-full items-center justify-between text-sm font-semibold">
            <span>Members not invited yet</span>
            <button
              type="button"
              className="text-xs font-semibold text-verdigris hover:underline"
              onClick={() => setPicked(picked.size === members.length ? new Set() : new Set(members.map((m) => m.userId)))}
            >
              {picked.size === members.length ? 'Pick none' : 'Pick all'}
            </button>
          </legend>
          <ul className="max-h-72 space-y-1 overflow-y-auto rounded-plate border border-line p-2">
            {members.map((m) => (
              <li key={m.userId}>
                <label className="flex cursor-pointer items-start gap-2 rounded px-1 py-1 hover:bg-sunken">
                  <input
                    type="checkbox"
                    name="userIds"
                    value={m.userId}
                    checked={picked.has(m.userId)}
                    onChange={() => toggle(m.userId)}
                    className="mt-1 size-4 accent-[var(--verdigris)]"
                  />
                  <span className="min-w-0 text-sm">
                    <span className="font-semibold">{m.name}</span>{' '}
                    <span className="text-muted">
                      · {m.role}
                      {m.runCount ? ` · ${m.runCount} run${m.runCount === 1 ? '' : 's'}` : ''}
                    </span>
                    <span className="block truncate text-xs text-muted">{m.email}</span>
                  </span>
                </label>
              </li>
            ))}
          </ul>
          {errors.userIds ? <p className="text-sm text-signal" role="alert">{errors.userIds}</p> : null}
        </fieldset>
      ) : (
        <p className="text-sm text-muted">Every member is invited already.</p>
      )}
      <Field
        label="Guests (e-mail addresses)"
        name="guestEmails"
        error={errors.guestEmails}
        hint="One per line or separated by commas. A guest becomes an operator of this railway when they accept."
      >
        <textarea
          id="guestEmails"
          name="guestEmails"
          rows={3}
          className={inputClass}
          placeholder="guest@example.org"
          aria-invalid={errors.guestEmails ? true : undefined}
        />
      </Field>
      <Button type="submit" disabled={pending} className="w-full">
        {pending ? 'Inviting…' : `Invite and e-mail${picked.size ? ` (${picked.size} picked)` : ''}`}
      </Button>
    </form>
  );
}

export function SendNoticeButton({
  railwayId,
  sessionId,
  kind,
  label,
  variant = 'primary',
}: {
  railwayId: string;
  sessionId: string;
  kind: 'pending' | 'update' | 'cancel';
  label: string;
  variant?: 'primary' | 'secondary' | 'danger';
}) {
  const [state, action, pending] = useActionState(sendNotices.bind(null, railwayId, sessionId), null);
  return (
    <form action={action} className="space-y-2">
      <input type="hidden" name="kind" value={kind} />
      <Button type="submit" variant={variant} disabled={pending}>
        {pending ? 'Queueing…' : label}
      </Button>
      {state ? <Notice tone={state.ok ? 'good' : 'bad'}>{state.ok ? state.message : state.error}</Notice> : null}
    </form>
  );
}

export function ResendButton({ railwayId, sessionId, invitationId, label }: { railwayId: string; sessionId: string; invitationId: string; label: string }) {
  const [state, action, pending] = useActionState(resendInvitation.bind(null, railwayId, sessionId), null);
  return (
    <form action={action} className="inline-flex flex-col items-start gap-1">
      <input type="hidden" name="invitationId" value={invitationId} />
      <Button type="submit" variant="secondary" className="px-3 py-1 text-xs" disabled={pending}>
        {pending ? '…' : label}
      </Button>
      {state ? <span className={`text-xs ${state.ok ? 'text-verdigris' : 'text-signal'}`} role="status">{state.ok ? state.message : state.error}</span> : null}
    </form>
  );
}
