import type { Metadata } from 'next';
import Link from 'next/link';
import { NewPasswordForm, ResetRequestForm } from '@/components/auth/reset-password-forms';

export const metadata: Metadata = { title: 'Reset password' };

export default async function ResetPasswordPage({ searchParams }: { searchParams: Promise<{ token?: string }> }) {
  const { token } = await searchParams;
  return (
    <div className="space-y-5">
      <h1 className="font-display text-2xl font-bold">{token ? 'Choose a new password' : 'Reset your password'}</h1>
      {token ? <NewPasswordForm token={token} /> : <ResetRequestForm />}
      <p className="text-sm text-muted">
        <Link className="underline" href="/sign-in">Back to sign in</Link>
      </p>
    </div>
  );
}
