'use client';

import Link from 'next/link';
import { useActionState } from 'react';
import { requestPasswordReset, resetPassword } from '@/app/(auth)/reset-password/actions';
import { EmailLinkForm } from '@/components/auth/email-link-form';
import { Button } from '@/components/ui/button';
import { Notice } from '@/components/ui/card';
import { Field, TextInput } from '@/components/ui/field';

export function ResetRequestForm() {
  return <EmailLinkForm action={requestPasswordReset} label="E-mail address" inputId="email" submitLabel="E-mail me a reset link" />;
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
