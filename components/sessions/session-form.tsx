'use client';

import { useActionState } from 'react';
import { createSession, duplicateSession, setSessionStatus, updateSession } from '@/app/(app)/railways/[railwayId]/sessions/actions';
import { Button } from '@/components/ui/button';
import { ConfirmDialog } from '@/components/ui/confirm-dialog';
import { Notice } from '@/components/ui/card';
import { Field, Select, TextInput, inputClass } from '@/components/ui/field';
import type { SessionStatus } from '@/lib/sessions/types';
import { SESSION_DEFAULTS, STATUS_MOVES } from '@/lib/validations/session-constants';

export type SessionFormValues = {
  title: string;
  place: string;
  description: string;
  date: string;
  startTime: string;
  endTime: string;
  clockRatio: number;
  fastStart: string;
  headwayS: number;
  surgeS: number;
  deratePercent: number;
  standS: number;
  punctualFastMin: number;
};

/**
 * Title, date, real start and end in the railway's zone, the fast clock, and the checking rules
 * with the engine's defaults explained. Creates a session (with a layout) or saves one (with its version).
 */
export function SessionForm({
  railwayId,
  timeZone,
  layouts,
  values,
  session,
}: {
  railwayId: string;
  timeZone: string;
  layouts?: { id: string; name: string }[];
  values?: SessionFormValues;
  session?: { id: string; version: number };
}) {
  const action = session ? updateSession : createSession;
  const [state, formAction, pending] = useActionState(action.bind(null, railwayId), null);
  const errors = state && !state.ok ? (state.fieldErrors ?? {}) : {};
  const v = values;
  return (
    <form action={formAction} className="space-y-5" noValidate data-testid="session-form">
      {state?.ok ? <Notice tone="good">{state.message}</Notice> : null}
      {state && !state.ok && Object.keys(errors).length === 0 ? <Notice tone="bad">{state.error}</Notice> : null}
      {session ? (
        <>
          <input type="hidden" name="sessionId" value={session.id} />
          <input type="hidden" name="version" value={session.version} />
        </>
      ) : null}
      <div className="grid gap-4 sm:grid-cols-2">
        <Field label="Title" name="title" error={errors.title}>
          <TextInput name="title" defaultValue={v?.title} required placeholder="Winter running evening" />
        </Field>
        {layouts ? (
          <Field label="Layout" name="layoutId" error={errors.layoutId}>
            <Select name="layoutId" defaultValue={layouts[0]?.id}>
              {layouts.map((l) => (
                <option key={l.id} value={l.id}>{l.name}</option>
              ))}
            </Select>
          </Field>
        ) : (
          <Field label="Place" name="place" error={errors.place}>
            <TextInput name="place" defaultValue={v?.place} />
          </Field>
        )}
      </div>
      <fieldset className="grid gap-4 sm:grid-cols-3">
        <legend className="mb-2 text-sm font-semibold">When (real time, {timeZone})</legend>
        <Field label="Date" name="date" error={errors.date}>
          <TextInput name="date" type="date" defaultValue={v?.date} required />
        </Field>
        <Field label="Starts" name="startTime" error={errors.startTime}>
          <TextInput name="startTime" type="time" defaultValue={v?.startTime ?? SESSION_DEFAULTS.startTime} required />
        </Field>
        <Field label="Ends" name="endTime" error={errors.endTime} hint="Before the start means the next day.">
          <TextInput name="endTime" type="time" defaultValue={v?.endTime ?? SESSION_DEFAULTS.endTime} required />
        </Field>
      </fieldset>
      <fieldset className="grid gap-4 sm:grid-cols-2">
        <legend className="mb-2 text-sm font-semibold">Fast clock</legend>
        <Field label="Ratio (fast : real)" name="clockRatio" error={errors.clockRatio} hint="4 means a fast hour lasts 15 real minutes. 4:1 to 6:1 is typical; 3:1 to 12:1 is seen.">
          <TextInput name="clockRatio" inputMode="decimal" defaultValue={v?.clockRatio ?? SESSION_DEFAULTS.clockRatio} />
        </Field>
        <Field label="Fast clock at the start" name="fastStart" error={errors.fastStart} hint="What the fast clock reads when the session begins (HH:MM).">
          <TextInput name="fastStart" defaultValue={v?.fastStart ?? SESSION_DEFAULTS.fastStart} placeholder="06:00" />
        </Field>
      </fieldset>
      <fieldset className="grid gap-4 sm:grid-cols-3">
        <legend className="mb-2 text-sm font-semibold">Checking rules</legend>
        <Field label="Headway (real s)" name="headwayS" error={errors.headwayS} hint={`Least time between one train leaving a block and the next entering it. Default ${SESSION_DEFAULTS.headwayS} s.`}>
          <TextInput name="headwayS" inputMode="decimal" defaultValue={v?.headwayS ?? SESSION_DEFAULTS.headwayS} />
        </Field>
        <Field label="Start-up surge (s)" name="surgeS" error={errors.surgeS} hint={`How long a starting motor draws stall current. Default ${SESSION_DEFAULTS.surgeS} s.`}>
          <TextInput name="surgeS" inputMode="decimal" defaultValue={v?.surgeS ?? SESSION_DEFAULTS.surgeS} />
        </Field>
        <Field label="Supply load limit (%)" name="deratePercent" error={errors.deratePercent} hint={`Continuous load as a share of each supply's rating. Default ${SESSION_DEFAULTS.deratePercent} % (rule of thumb; NEC 210.20(A) uses the same 80 % for breakers).`}>
          <TextInput name="deratePercent" inputMode="decimal" defaultValue={v?.deratePercent ?? SESSION_DEFAULTS.deratePercent} />
        </Field>
      </fieldset>
      <fieldset className="grid gap-4 sm:grid-cols-2">
        <legend className="mb-2 text-sm font-semibold">Session day</legend>
        <Field label="Least stand between runs (real s)" name="standS" error={errors.standS} hint={`When a delay is passed on, the next run of the same train, cab or operator starts at least this long after the one before ends. Default ${SESSION_DEFAULTS.standS} s.`}>
          <TextInput name="standS" inputMode="decimal" defaultValue={v?.standS ?? SESSION_DEFAULTS.standS} />
        </Field>
        <Field label="Punctual within (fast min)" name="punctualFastMin" error={errors.punctualFastMin} hint={`In the report, a run that departs within this many fast minutes of its time counts as punctual. Default ${SESSION_DEFAULTS.punctualFastMin} min.`}>
          <TextInput name="punctualFastMin" inputMode="decimal" defaultValue={v?.punctualFastMin ?? SESSION_DEFAULTS.punctualFastMin} />
        </Field>
      </fieldset>
      {session ? (
        <Field label="Notes for the crew" name="description" error={errors.description}>
          <textarea id="description" name="description" defaultValue={v?.description} rows={3} className={inputClass} />
        </Field>
      ) : null}
      <Button type="submit" disabled={pending}>{pending ? 'Saving…' : session ? 'Save settings' : 'Create and open the builder'}</Button>
    </form>
  );
}

export type SessionCheckCounts = { errors: number; warnings: number };

const plural = (n: number, word: string) => `${n} ${word}${n === 1 ? '' : 's'}`;

/** What the checker finds, said where the status is changed. */
export function CheckSummary({ check, timetableHref }: { check: SessionCheckCounts; timetableHref?: string }) {
  const tone = check.errors ? 'bad' : check.warnings ? 'warn' : 'good';
  const text = check.errors || check.warnings ? `The checker finds ${plural(check.errors, 'error')} and ${plural(check.warnings, 'warning')}.` : 'The checker finds no errors or warnings.';
  return (
    <p className={`text-sm font-semibold ${tone === 'bad' ? 'text-signal' : tone === 'warn' ? 'text-amber' : 'text-verdigris-strong'}`} data-testid="check-summary">
      {text}
      {timetableHref && (check.errors || check.warnings) ? (
        <>
          {' '}
          <a href={timetableHref} className="font-normal text-verdigris underline">See them in the timetable</a>
        </>
      ) : null}
    </p>
  );
}

/**
 * Draft → published → cancelled; each move raises the session's SEQUENCE for calendar updates. Publishing
 * with errors and cancelling both ask first; Cancel sits apart from Publish.
 */
export function StatusForm({
  railwayId,
  session,
  check,
  compact = false,
}: {
  railwayId: string;
  session: { id: string; version: number; status: SessionStatus; title: string };
  check: SessionCheckCounts;
  /** The builder's header shows only Publish (or Reopen); the settings page shows Cancel too. */
  compact?: boolean;
}) {
  const [state, formAction, pending] = useActionState(setSessionStatus.bind(null, railwayId), null);
  const moves = STATUS_MOVES[session.status];
  const formId = (status: SessionStatus) => `status-${status}-${session.id}${compact ? '-compact' : ''}`;
  const hidden = (status: SessionStatus) => (
    <form id={formId(status)} action={formAction} className="contents">
      <input type="hidden" name="sessionId" value={session.id} />
      <input type="hidden" name="version" value={session.version} />
      <input type="hidden" name="status" value={status} />
      {status === 'published' ? <input type="hidden" name="acknowledgedErrors" value={check.errors} /> : null}
    </form>
  );
  return (
    <div className="space-y-3" data-testid={compact ? 'status-form-compact' : 'status-form'}>
      {state?.ok ? <Notice tone="good">{state.message}</Notice> : null}
      {state && !state.ok ? <Notice tone="bad">{state.error}</Notice> : null}
      <div className="flex flex-wrap items-center gap-2">
        {moves.includes('published') ? (
          <>
            {hidden('published')}
            {check.errors ? (
              <ConfirmDialog
                trigger="Publish…"
                triggerVariant="primary"
                title={`Publish with ${plural(check.errors, 'error')}?`}
                confirm={`Publish with ${plural(check.errors, 'error')}`}
                keep="Not yet"
                form={formId('published')}
                disabled={pending}
              >
                <p>
                  The checker still finds {plural(check.errors, 'error')} in this timetable (clashing blocks, double-booked cabs or overloaded
                  power). Invited operators will see the timetable as it is.
                </p>
                <p>You can fix them first in the timetable and publish afterwards.</p>
              </ConfirmDialog>
            ) : (
              <Button type="submit" form={formId('published')} disabled={pending}>Publish</Button>
            )}
          </>
        ) : null}
        {moves.includes('draft') ? (
          <>
            {hidden('draft')}
            <Button type="submit" form={formId('draft')} variant="secondary" disabled={pending}>Reopen as draft</Button>
          </>
        ) : null}
      </div>
      {!compact && moves.includes('cancelled') ? (
        <div className="border-t border-line pt-3">
          {hidden('cancelled')}
          <ConfirmDialog
            trigger="Cancel session…"
            triggerVariant="danger"
            title={`Cancel ${session.title}?`}
            confirm="Cancel the session"
            keep="Keep the session"
            form={formId('cancelled')}
            danger
            disabled={pending}
          >
            <p>Operators will see it as cancelled, and each invitee can be sent a cancellation that removes it from their calendar.</p>
            <p>A cancelled session can be reopened as a draft later.</p>
          </ConfirmDialog>
        </div>
      ) : null}
    </div>
  );
}

/** Copies a session (settings and runs) to a new date as a draft. */
export function DuplicateForm({ railwayId, sessionId, title }: { railwayId: string; sessionId: string; title: string }) {
  const [state, formAction, pending] = useActionState(duplicateSession.bind(null, railwayId), null);
  const error = state && !state.ok ? (state.fieldErrors?.date ?? state.error) : undefined;
  return (
    <form action={formAction} className="flex flex-wrap items-end gap-2" data-testid="duplicate-form">
      <input type="hidden" name="sessionId" value={sessionId} />
      <label className="space-y-1 text-xs">
        <span className="block font-semibold">New date for a copy of {title}</span>
        <input type="date" name="date" required className={`${inputClass.replace('w-full', '')} w-40`} aria-label={`New date for a copy of ${title}`} />
      </label>
      <Button type="submit" variant="secondary" disabled={pending}>{pending ? 'Copying…' : 'Duplicate'}</Button>
      {error ? <p className="w-full text-sm text-signal" role="alert">{error}</p> : null}
    </form>
  );
}
