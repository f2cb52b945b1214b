import type { Metadata } from 'next';
import Link from 'next/link';
import { SignUpForm } from '@/components/auth/sign-up-form';

export const metadata: Metadata = { title: 'Create an account' };

export default function SignUpPage() {
  return (
    <div className="space-y-6">
      <div>
        <h1 className="font-display text-2xl font-bold">Create your Fishplate account</h1>
        <p className="text-sm text-muted">
          Already have one? <Link className="font-semibold text-verdigris underline" href="/sign-in">Sign in</Link>
        </p>
      </div>
      <SignUpForm />
    </div>
  );
}
