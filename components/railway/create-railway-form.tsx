'use client';

import { useActionState } from 'react';
import { createRailway } from '@/app/(app)/railways/actions';
import { Button } from '@/components/ui/button';
import { Notice } from '@/components/ui/card';
import { Field, Select, TextInput } from '@/components/ui/field';

export function CreateRailwayForm({ timeZones }: { timeZones: string[] }) {
  const [state, action, pending] = useActionState(createRailway, null);
  const errors = state && !state.ok ? (state.fieldErrors ?? {}) : {};
  const guess = typeof Intl !== 'undefined' ? Intl.DateTimeFormat().resolvedOptions().timeZone : 'UTC';
  return (
    <form action={action} className="space-y-4" noValidate>
      {state && !state.ok && Object.keys(errors).length === 0 ? <Notice tone="bad">{state.error}</Notice> : null}
      <Field label="Railway name" name="name" error={errors.name}>
        <TextInput name="name" required maxLength={80} placeholder="e.g. Thursday Night Operators" />
      </Field>
      <Field label="Time zone" name="timeZone" error={errors.timeZone} hint="Sessions are timed in this zone.">
        <Select name="timeZone" defaultValue={timeZones.includes(guess) ? guess : 'UTC'}>
          {['UTC', ...timeZones].map((tz) => (
            <option key={tz} value={tz}>
              {tz}
            </option>
          ))}
        </Select>
      </Field>
      <Button type="submit" disabled={pending}>
        {pending ? 'Creating…' : 'Create railway'}
      </Button>
    </form>
  );
}
