'use client';

import { signIn } from 'next-auth/react';
import Link from 'next/link';
import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { Button } from '@/components/ui/button';
import { Notice } from '@/components/ui/card';

export function FinishLinkSignIn({
  token,
  provider = 'link',
  label = 'Sign in to Fishplate',
}: {
  token: string;
  provider?: 'link' | 'sign-up';
  label?: string;
}) {
  const router = useRouter();
  const [state, setState] = useState<'idle' | 'pending' | 'failed'>('idle');

  async function finish() {
    setState('pending');
    const result = await signIn(provider, { token, redirect: false });
    if (result?.ok) {
      router.push('/railways');
      router.refresh();
    } else {
      setState('failed');
    }
  }

  return (
    <div className="space-y-4">
      {state === 'failed' ? (
        <Notice tone="bad">
          This link has expired or was already used. <Link className="underline" href="/sign-in">Ask for a new one</Link>.
        </Notice>
      ) : (
        <p className="text-muted">Press the button to sign in with the link from your e-mail.</p>
      )}
      <Button onClick={finish} disabled={state === 'pending'} className="w-full">
        {state === 'pending' ? 'Signing in…' : label}
      </Button>
    </div>
  );
}
