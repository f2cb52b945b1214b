import Link from 'next/link';
import { Wordmark } from '@/components/brand/logo';

export default function ReplyLayout({ children }: { children: React.ReactNode }) {
  return (
    <div className="min-h-dvh">
      <header className="border-b border-line bg-surface">
        <div className="mx-auto flex max-w-xl items-center px-4 py-3">
          <Link href="/" aria-label="Fishplate">
            <Wordmark />
          </Link>
        </div>
      </header>
      <main className="mx-auto max-w-xl px-4 py-6">{children}</main>
    </div>
  );
}
