'use client';

import { useState, useTransition } from 'react';
import { signUp } from '@/app/(auth)/sign-up/actions';
import { Button } from '@/components/ui/button';
import { Notice } from '@/components/ui/card';
import { Field, TextInput } from '@/components/ui/field';
import type { ActionState } from '@/lib/errors';

export function SignUpForm() {
  const [state, setState] = useState<ActionState>(null);
  const [pending, startTransition] = useTransition();
  const errors = state && !state.ok ? (state.fieldErrors ?? {}) : {};

  // Submitted by hand (not a form action) so that the fields keep what was typed after an error.
  function onSubmit(event: React.FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const form = new FormData(event.currentTarget);
    startTransition(async () => setState(await signUp(null, form)));
  }

  if (state?.ok) {
    return (
      <Notice tone="good">
        <span data-testid="sign-up-sent">{state.message}</span> Follow it to finish: your password works from then
        on. The link works once, for a day.
      </Notice>
    );
  }
  return (
    <form onSubmit={onSubmit} className="space-y-4" noValidate>
      {state && !state.ok && Object.keys(errors).length === 0 ? <Notice tone="bad">{state.error}</Notice> : null}
      <Field label="Your name" name="name" error={errors.name}>
        <TextInput name="name" autoComplete="name" required maxLength={80} />
      </Field>
      <Field label="E-mail address" name="email" error={errors.email}>
        <TextInput name="email" type="email" autoComplete="email" required />
      </Field>
      <Field label="Password" name="password" error={errors.password} hint="At least 10 characters.">
        <TextInput name="password" type="password" autoComplete="new-password" required minLength={10} />
      </Field>
      <Button type="submit" disabled={pending} className="w-full">
        {pending ? 'Creating…' : 'Create account'}
      </Button>
    </form>
  );
}
