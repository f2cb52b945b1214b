import type { Metadata } from 'next';
import { FinishLinkSignIn } from '@/components/auth/finish-link-sign-in';

export const metadata: Metadata = { title: 'Finish creating your account' };

// As with sign-in links, the token is spent only when the person presses the button.
export default async function ConfirmSignUpPage({ searchParams }: { searchParams: Promise<{ token?: string }> }) {
  const { token } = await searchParams;
  return (
    <div className="space-y-4">
      <h1 className="font-display text-2xl font-bold">Finish creating your account</h1>
      {typeof token === 'string' && token ? (
        <FinishLinkSignIn token={token} provider="sign-up" label="Finish creating my account" />
      ) : (
        <p className="text-muted">This link has no token. Create your account again from the sign-up page.</p>
      )}
    </div>
  );
}
