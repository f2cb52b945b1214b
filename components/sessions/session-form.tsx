'use client';

import { useActionState } from 'react';
import { createSession, duplicateSession, setSessionStatus, updateSession } from '@/app/(app)/railways/[railwayId]/sessions/actions';
import { Button } from '@/components/ui/button';
import { Notice } from '@/components/ui/card';
import { Field, Select, TextInput, inputClass } from '@/components/ui/field';
import type { SessionStatus } from '@/lib/sessions/types';
import { SESSION_DEFAULTS, STATUS_MOVES } from '@/lib/validations/session';

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
      {session ? (
        <Field label="Notes for the crew" name="description" error={errors.description}>
          <textarea id="description" name="description" defaultValue={v?.description} rows={3} className={inputClass} />
        </Field>
      ) : null}
      <Button type="submit" disabled={pending}>{pending ? 'Saving…' : session ? 'Save settings' : 'Create and open the builder'}</Button>
    </form>
  );
}

const STATUS_VERBS: Record<SessionStatus, string> = { draft: 'Reopen as draft', published: 'Publish', cancelled: 'Cancel session' };

/** Draft → published → cancelled; each move raises the session's SEQUENCE for calendar updates. */
export function StatusForm({ railwayId, session }: { railwayId: string; session: { id: string; version: number; status: SessionStatus } }) {
  const [state, formAction, pending] = useActionState(setSessionStatus.bind(null, railwayId), null);
  return (
    <div className="space-y-3" data-testid="status-form">
      {state?.ok ? <Notice tone="good">{state.message}</Notice> : null}
      {state && !state.ok ? <Notice tone="bad">{state.error}</Notice> : null}
      <div className="flex flex-wrap gap-2">
        {STATUS_MOVES[session.status].map((status) => (
          <form key={status} action={formAction}>
            <input type="hidden" name="sessionId" value={session.id} />
            <input type="hidden" name="version" value={session.version} />
            <input type="hidden" name="status" value={status} />
            <Button type="submit" variant={status === 'cancelled' ? 'danger' : 'primary'} disabled={pending}>
              {STATUS_VERBS[status]}
            </Button>
          </form>
        ))}
      </div>
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
