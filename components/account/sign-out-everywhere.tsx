'use client';

import { useActionState } from 'react';
import { signOutEverywhere } from '@/app/(app)/railways/actions';
import { Button } from '@/components/ui/button';
import { Notice } from '@/components/ui/card';

/** Ends every session of this account, on every device (after a lost phone, say). */
export function SignOutEverywhereForm() {
  const [state, action, pending] = useActionState(signOutEverywhere, null);
  return (
    <form action={action} className="space-y-2">
      {state && !state.ok ? <Notice tone="bad">{state.error}</Notice> : null}
      <p className="text-sm text-muted">
        Lost a phone, or signed in somewhere you should not stay? This signs you out on every device and voids any
        sign-in or reset link not used yet.
      </p>
      <Button type="submit" variant="secondary" disabled={pending}>
        Sign out everywhere
      </Button>
    </form>
  );
}
