'use client';

import Link from 'next/link';
import { useActionState } from 'react';
import { requestPasswordReset, resetPassword } from '@/app/(auth)/reset-password/actions';
import { Button } from '@/components/ui/button';
import { Notice } from '@/components/ui/card';
import { Field, TextInput } from '@/components/ui/field';

export function ResetRequestForm() {
  const [state, action, pending] = useActionState(requestPasswordReset, null);
  return (
    <form action={action} className="space-y-4" noValidate>
      {state?.ok ? <Notice tone="good">{state.message}</Notice> : null}
      <Field label="E-mail address" name="email" error={state && !state.ok ? state.error : undefined}>
        <TextInput name="email" type="email" autoComplete="email" required />
      </Field>
      <Button type="submit" disabled={pending} className="w-full">
        {pending ? 'Sending…' : 'E-mail me a reset link'}
      </Button>
    </form>
  );
}

export function NewPasswordForm({ token }: { token: string }) {
  const [state, action, pending] = useActionState(resetPassword, null);
  const errors = state && !state.ok ? (state.fieldErrors ?? {}) : {};
  if (state?.ok) {
    return (
      <Notice tone="good">
        {state.message} <Link className="underline" href="/sign-in">Sign in</Link>
      </Notice>
    );
  }
  return (
    <form action={action} className="space-y-4" noValidate>
      {state && !state.ok && !errors.password && !errors.confirm ? <Notice tone="bad">{state.error}</Notice> : null}
      <input type="hidden" name="token" value={token} />
      <Field label="New password" name="password" error={errors.password} hint="At least 10 characters.">
        <TextInput name="password" type="password" autoComplete="new-password" required />
      </Field>
      <Field label="The same password again" name="confirm" error={errors.confirm}>
        <TextInput name="confirm" type="password" autoComplete="new-password" required />
      </Field>
      <Button type="submit" disabled={pending} className="w-full">
        {pending ? 'Saving…' : 'Save new password'}
      </Button>
    </form>
  );
}
