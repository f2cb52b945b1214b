import type { Metadata } from 'next';
import Link from 'next/link';
import { LinkRequestForm, SignInForm } from '@/components/auth/sign-in-form';
import { env } from '@/lib/env';
import { sameOriginPath } from '@/lib/safe-callback';

export const metadata: Metadata = { title: 'Sign in' };

export default async function SignInPage({ searchParams }: { searchParams: Promise<{ callbackUrl?: string; error?: string }> }) {
  const { callbackUrl, error } = await searchParams;
  const safeCallback = sameOriginPath(callbackUrl, env().NEXTAUTH_URL);
  return (
    <div className="space-y-6">
      <div>
        <h1 className="font-display text-2xl font-bold">Sign in</h1>
        <p className="text-sm text-muted">
          New here? <Link className="font-semibold text-verdigris underline" href="/sign-up">Create an account</Link>
        </p>
      </div>
      <SignInForm callbackUrl={safeCallback} initialError={error ? 'That sign-in did not work. Check the address and password.' : undefined} />
      <div className="border-t border-line pt-5">
        <h2 className="mb-2 text-sm font-semibold">No password? Get a link by e-mail</h2>
        <LinkRequestForm />
      </div>
      <p className="text-sm text-muted">
        <Link className="underline" href="/reset-password">Forgot your password?</Link>
      </p>
      {env().FISHPLATE_DEMO === '1' ? (
        <div className="rounded-plate bg-brass-soft p-3 text-sm text-ink">
          <p className="font-semibold">Demo railway sign-ins (password <code>demo-railway</code>)</p>
          <ul className="mt-1 list-inside list-disc">
            <li>host@fishplate.example</li>
            <li>planner@fishplate.example</li>
            <li>operator@fishplate.example</li>
          </ul>
        </div>
      ) : null}
    </div>
  );
}
