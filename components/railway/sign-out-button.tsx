'use client';

import { useState, type FormEvent } from 'react';
import { Button } from '@/components/ui/button';

/**
 * Signs out through next-auth's own sign-out endpoint (which ends the session server-side), posted as a
 * plain form with the CSRF token fetched on click. Not next-auth/react's signOut: that module and its
 * helpers are ~31 KiB of JavaScript on every signed-in page, for this one button. Without JavaScript
 * the form posts no token and next-auth answers with its confirmation page instead.
 */
export function SignOutButton() {
  const [busy, setBusy] = useState(false);
  async function submit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const form = event.currentTarget;
    setBusy(true);
    try {
      const { csrfToken } = (await (await fetch('/api/auth/csrf', { cache: 'no-store' })).json()) as { csrfToken?: string };
      (form.elements.namedItem('csrfToken') as HTMLInputElement).value = csrfToken ?? '';
      form.submit();
    } catch {
      setBusy(false);
      form.submit();
    }
  }
  return (
    <form method="post" action="/api/auth/signout" onSubmit={submit}>
      <input type="hidden" name="csrfToken" defaultValue="" />
      <input type="hidden" name="callbackUrl" defaultValue="/" />
      <Button type="submit" variant="secondary" disabled={busy} data-testid="sign-out">
        Sign out
      </Button>
    </form>
  );
}
