'use client';

import { signIn } from 'next-auth/react';
import { useRouter } from 'next/navigation';
import { useState, useTransition } from 'react';
import { signUp } from '@/app/(auth)/sign-up/actions';
import { Button } from '@/components/ui/button';
import { Notice } from '@/components/ui/card';
import { Field, TextInput } from '@/components/ui/field';
import type { ActionState } from '@/lib/errors';

export function SignUpForm() {
  const router = useRouter();
  const [state, setState] = useState<ActionState>(null);
  const [pending, startTransition] = useTransition();
  const errors = state && !state.ok ? (state.fieldErrors ?? {}) : {};

  function onSubmit(event: React.FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const form = new FormData(event.currentTarget);
    startTransition(async () => {
      const result = await signUp(null, form);
      setState(result);
      if (!result?.ok) return;
      const signedIn = await signIn('password', {
        email: String(form.get('email') ?? ''),
        password: String(form.get('password') ?? ''),
        redirect: false,
      });
      router.push(signedIn?.ok ? '/railways' : '/sign-in');
      router.refresh();
    });
  }

  return (
    <form onSubmit={onSubmit} className="space-y-4" noValidate>
      {state && !state.ok && Object.keys(errors).length === 0 ? <Notice tone="bad">{state.error}</Notice> : null}
      {state?.ok ? <Notice tone="good">Account created — signing you in…</Notice> : null}
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
