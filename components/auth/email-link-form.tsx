'use client';

import { useActionState } from 'react';
import { Button } from '@/components/ui/button';
import { Notice } from '@/components/ui/card';
import { Field, TextInput } from '@/components/ui/field';
import type { ActionState } from '@/lib/errors';

/**
 * Asks for an e-mail address and has `action` mail a link to it, then shows the action's answer
 * (which is the same whether or not the address has an account). `inputId` keeps the field's id
 * apart from another e-mail field on the same page.
 */
export function EmailLinkForm({
  action,
  label,
  inputId,
  submitLabel,
  secondary = false,
}: {
  action: (prev: ActionState, formData: FormData) => Promise<ActionState>;
  label: string;
  inputId: string;
  submitLabel: string;
  secondary?: boolean;
}) {
  const [state, formAction, pending] = useActionState(action, null);
  return (
    <form action={formAction} className={secondary ? 'space-y-3' : 'space-y-4'} noValidate>
      {state?.ok ? <Notice tone="good">{state.message}</Notice> : null}
      <Field label={label} name={inputId} error={state && !state.ok ? state.error : undefined}>
        <TextInput name="email" id={inputId} type="email" autoComplete="email" required />
      </Field>
      <Button type="submit" variant={secondary ? 'secondary' : 'primary'} disabled={pending} className="w-full">
        {pending ? 'Sending…' : submitLabel}
      </Button>
    </form>
  );
}
