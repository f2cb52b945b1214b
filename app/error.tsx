'use client';

import { Button } from '@/components/ui/button';

export default function RootError({ reset }: { error: Error & { digest?: string }; reset: () => void }) {
  return (
    <main className="mx-auto flex min-h-dvh max-w-lg flex-col items-start justify-center gap-4 px-5">
      <h1 className="font-display text-3xl font-bold">Something went wrong</h1>
      <p className="text-muted">Nothing you entered was lost. Try again; if it keeps happening, tell your host.</p>
      <Button onClick={reset}>Try again</Button>
    </main>
  );
}
