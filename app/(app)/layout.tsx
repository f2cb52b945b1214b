import Link from 'next/link';
import { redirect } from 'next/navigation';
import { Wordmark } from '@/components/brand/logo';
import { SignOutButton } from '@/components/railway/sign-out-button';
import { currentUser } from '@/lib/current-user';
import { env } from '@/lib/env';

export default async function AppLayout({ children }: { children: React.ReactNode }) {
  const user = await currentUser();
  if (!user) redirect('/sign-in');
  return (
    <div className="min-h-dvh">
      <header className="no-print border-b border-line bg-surface">
        <div className="mx-auto flex max-w-6xl items-center justify-between gap-3 px-4 py-3">
          <Link href="/railways" aria-label="My railways">
            <Wordmark />
          </Link>
          <div className="flex items-center gap-3 text-sm">
            <Link href="/my-runs" className="font-semibold text-verdigris hover:underline">
              My runs
            </Link>
            {env().SMTP_URL ? null : (
              <Link href="/my-mail" className="font-semibold text-verdigris hover:underline">
                My mail
              </Link>
            )}
            <span className="hidden text-muted sm:inline" data-testid="signed-in-as">
              {user.name}
            </span>
            <SignOutButton />
          </div>
        </div>
      </header>
      <main id="main" className="mx-auto max-w-6xl px-4 py-6">
        {children}
      </main>
    </div>
  );
}
