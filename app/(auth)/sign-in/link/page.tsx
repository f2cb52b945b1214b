import type { Metadata } from 'next';
import { FinishLinkSignIn } from '@/components/auth/finish-link-sign-in';

export const metadata: Metadata = { title: 'Finish signing in' };

// The token is spent only when the person presses the button, so a mail scanner that opens
// links ahead of the reader cannot use it up.
export default async function LinkSignInPage({ searchParams }: { searchParams: Promise<{ token?: string }> }) {
  const { token } = await searchParams;
  return (
    <div className="space-y-4">
      <h1 className="font-display text-2xl font-bold">Finish signing in</h1>
      {token ? (
        <FinishLinkSignIn token={token} />
      ) : (
        <p className="text-muted">This link has no token. Ask for a new sign-in link on the sign-in page.</p>
      )}
    </div>
  );
}
