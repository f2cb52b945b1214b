import { Wordmark } from '@/components/brand/logo';
import { ButtonLink } from '@/components/ui/button';

export default function NotFound() {
  return (
    <main className="mx-auto flex min-h-dvh max-w-lg flex-col items-start justify-center gap-4 px-5">
      <Wordmark />
      <h1 className="font-display text-3xl font-bold">This page is off the line</h1>
      <p className="text-muted">
        It does not exist, or it belongs to a railway you are not a member of.
      </p>
      <ButtonLink href="/railways">Back to my railways</ButtonLink>
    </main>
  );
}
