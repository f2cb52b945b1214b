import Link from 'next/link';
import { Wordmark } from '@/components/brand/logo';

export default function AuthLayout({ children }: { children: React.ReactNode }) {
  return (
    <main className="mx-auto flex min-h-dvh max-w-md flex-col justify-center gap-6 px-5 py-10">
      <Link href="/" aria-label="Fishplate home">
        <Wordmark />
      </Link>
      <div className="rounded-plate border border-line bg-surface p-6 shadow-sm">{children}</div>
    </main>
  );
}
