'use client';

import { signIn } from 'next-auth/react';
import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { requestSignInLink } from '@/app/(auth)/sign-in/actions';
import { EmailLinkForm } from '@/components/auth/email-link-form';
import { Button } from '@/components/ui/button';
import { Notice } from '@/components/ui/card';
import { Field, TextInput } from '@/components/ui/field';

export function SignInForm({ callbackUrl, initialError }: { callbackUrl: string; initialError?: string }) {
  const router = useRouter();
  const [error, setError] = useState(initialError);
  const [pending, setPending] = useState(false);

  async function onSubmit(event: React.FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const form = new FormData(event.currentTarget);
    setPending(true);
    setError(undefined);
    const result = await signIn('password', {
      email: String(form.get('email') ?? ''),
      password: String(form.get('password') ?? ''),
      redirect: false,
    });
    setPending(false);
    if (result?.ok) {
      router.push(callbackUrl);
      router.refresh();
    } else if (result?.error?.startsWith('Too many attempts')) {
      setError(result.error);
    } else {
      setError('That e-mail address and password do not match an account.');
    }
  }

  return (
    <form onSubmit={onSubmit} className="space-y-4" noValidate>
      {error ? <Notice tone="bad">{error}</Notice> : null}
      <Field label="E-mail address" name="email">
        <TextInput name="email" type="email" autoComplete="email" required />
      </Field>
      <Field label="Password" name="password">
        <TextInput name="password" type="password" autoComplete="current-password" required />
      </Field>
      <Button type="submit" disabled={pending} className="w-full">
        {pending ? 'Signing in…' : 'Sign in'}
      </Button>
    </form>
  );
}

export function LinkRequestForm() {
  return (
    <EmailLinkForm action={requestSignInLink} label="E-mail address for the link" inputId="link-email" submitLabel="E-mail me a sign-in link" secondary />
  );
}
