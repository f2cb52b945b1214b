'use client';

import { useActionState, useEffect, useRef } from 'react';
import { createRailway } from '@/app/(app)/railways/actions';
import { Button } from '@/components/ui/button';
import { Notice } from '@/components/ui/card';
import { Field, Select, TextInput } from '@/components/ui/field';

export function CreateRailwayForm({ timeZones }: { timeZones: string[] }) {
  const [state, action, pending] = useActionState(createRailway, null);
  const errors = state && !state.ok ? (state.fieldErrors ?? {}) : {};
  // The page is rendered on the server, whose zone is not the visitor's: pick the browser's zone once it runs.
  const zone = useRef<HTMLSelectElement>(null);
  useEffect(() => {
    const browserZone = Intl.DateTimeFormat().resolvedOptions().timeZone;
    if (zone.current && timeZones.includes(browserZone)) zone.current.value = browserZone;
  }, [timeZones]);
  return (
    <form action={action} className="space-y-4" noValidate>
      {state && !state.ok && Object.keys(errors).length === 0 ? <Notice tone="bad">{state.error}</Notice> : null}
      <Field label="Railway name" name="name" error={errors.name}>
        <TextInput name="name" required maxLength={80} placeholder="e.g. Thursday Night Operators" />
      </Field>
      <Field label="Time zone" name="timeZone" error={errors.timeZone} hint="Sessions are timed in this zone. Your browser's zone is chosen for you.">
        <Select name="timeZone" defaultValue="UTC" ref={zone}>
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
