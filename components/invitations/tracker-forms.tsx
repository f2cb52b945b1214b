'use client';

import { useActionState, useState } from 'react';
import {
  inviteCrew,
  remindCrew,
  resendInvitation,
  sendNotices,
  setReplyDeadline,
} from '@/app/(app)/railways/[railwayId]/sessions/[sessionId]/invitations/actions';
import { Button } from '@/components/ui/button';
import { Notice } from '@/components/ui/card';
import { ConfirmDialog } from '@/components/ui/confirm-dialog';
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
  // Members invited a moment ago leave the list; only count the ones still shown.
  const pickedCount = members.filter((m) => picked.has(m.userId)).length;
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
              onClick={() => setPicked(pickedCount === members.length ? new Set() : new Set(members.map((m) => m.userId)))}
            >
              {pickedCount === members.length ? 'Pick none' : 'Pick all'}
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
        {pending ? 'Inviting…' : `Invite and e-mail${pickedCount ? ` (${pickedCount} picked)` : ''}`}
      </Button>
    </form>
  );
}

export type AffectedInvitee = { id: string; name: string; lines: string[] };

/**
 * What the session's state calls for: invitations not sent yet, an update to the people whose
 * session or runs changed since their last e-mail (previewed in a dialog: who, and what changed for
 * each), or the cancellation. Stays mounted when the counts drop to zero so that the result stays in view.
 */
export function NoticeActions({
  railwayId,
  sessionId,
  pending,
  affected,
  toCancel,
}: {
  railwayId: string;
  sessionId: string;
  pending: number;
  affected: AffectedInvitee[];
  toCancel: number;
}) {
  const [state, action, busy] = useActionState(sendNotices.bind(null, railwayId, sessionId), null);
  const formId = `update-${sessionId}`;
  if (!state && !pending && !affected.length && !toCancel) return null;
  return (
    <div className="space-y-2" data-testid="notice-actions">
      {affected.length ? (
        <Notice tone="warn">
          <span data-testid="affected-count">
            {affected.length === 1 ? '1 invitee is' : `${affected.length} invitees are`} affected by changes since their last e-mail:{' '}
            {affected.map((a) => a.name).join(', ')}.
          </span>
        </Notice>
      ) : null}
      {/* The update is sent from the dialog; its form holds only the kind. */}
      <form id={formId} action={action} hidden>
        <input type="hidden" name="kind" value="update" />
      </form>
      <form action={action} className="flex flex-wrap gap-3">
        {pending ? (
          <Button type="submit" name="kind" value="pending" disabled={busy}>
            Send {pending} invitation{pending === 1 ? '' : 's'} not sent yet
          </Button>
        ) : null}
        {toCancel ? (
          <Button type="submit" name="kind" value="cancel" variant="danger" disabled={busy}>
            Send cancellation to {toCancel}
          </Button>
        ) : null}
      </form>
      {affected.length ? (
        <ConfirmDialog
          trigger={`Review and send update to ${affected.length}`}
          title={`Send an update to ${affected.length === 1 ? '1 person' : `${affected.length} people`}`}
          confirm={`Send update to ${affected.length}`}
          keep="Not now"
          form={formId}
          disabled={busy}
        >
          <p>Each gets an e-mail with their runs as they are now, what changed for them, and a calendar update that replaces the event they have.</p>
          <ul className="max-h-[55vh] space-y-3 overflow-y-auto rounded-plate border border-line p-3" data-testid="update-preview">
            {affected.map((a) => (
              <li key={a.id}>
                <p className="font-semibold">{a.name}</p>
                <ul className="list-disc space-y-1 pl-5 text-muted">
                  {a.lines.map((line, i) => (
                    <li key={i}>{line}</li>
                  ))}
                </ul>
              </li>
            ))}
          </ul>
        </ConfirmDialog>
      ) : null}
      {state ? <Notice tone={state.ok ? 'good' : 'bad'}>{state.ok ? state.message : state.error}</Notice> : null}
    </div>
  );
}

/** Reminders to those who have not replied: one click for everyone due; says when the last went and when the next may. */
export function RemindButton({
  railwayId,
  sessionId,
  due,
  waiting,
  last,
  next,
}: {
  railwayId: string;
  sessionId: string;
  /** Invitees awaiting a reply who may be reminded now. */
  due: number;
  /** Invitees awaiting a reply who were reminded within the last day. */
  waiting: number;
  last: string | null;
  next: string | null;
}) {
  const [state, action, busy] = useActionState(remindCrew.bind(null, railwayId, sessionId), null);
  if (!state && !due && !waiting) return null;
  return (
    <form action={action} className="space-y-1" data-testid="remind">
      <div className="flex flex-wrap items-center gap-3">
        <Button type="submit" variant="secondary" disabled={busy || due === 0}>
          {due ? `Remind ${due} who ${due === 1 ? 'has' : 'have'} not replied` : 'Reminders sent'}
        </Button>
        <span className="text-xs text-muted">
          {last ? `Last reminder ${last}.` : 'No reminder sent yet.'}
          {waiting && next ? ` ${waiting} reminded in the last day; the next reminder to them is possible from ${next}.` : ''}
        </span>
      </div>
      {state ? <Notice tone={state.ok ? 'good' : 'bad'}>{state.ok ? state.message : state.error}</Notice> : null}
    </form>
  );
}

/** The host's reply deadline, on the session's wall clock. */
export function ReplyDeadlineForm({ railwayId, sessionId, value, timeZone }: { railwayId: string; sessionId: string; value: string; timeZone: string }) {
  const [state, action, busy] = useActionState(setReplyDeadline.bind(null, railwayId, sessionId), null);
  const error = state && !state.ok ? (state.fieldErrors?.replyBy ?? state.error) : null;
  return (
    <form action={action} className="space-y-2" data-testid="reply-deadline-form">
      <Field label="Reply by" name="replyBy" error={error ?? undefined} hint={`In ${timeZone}. E-mails and the reply page say it; a later reply still counts and is marked late. Leave empty for none.`}>
        <input id="replyBy" name="replyBy" type="datetime-local" defaultValue={value} className={inputClass} aria-invalid={error ? true : undefined} />
      </Field>
      <Button type="submit" variant="secondary" disabled={busy} className="w-full">
        {busy ? 'Saving…' : 'Save deadline'}
      </Button>
      {state?.ok ? <Notice tone="good">{state.message}</Notice> : null}
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
