'use client';

import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';

export default function RailwayError({ reset }: { error: Error & { digest?: string }; reset: () => void }) {
  return (
    <Card title="This page could not load">
      <p className="mb-4 text-muted">Nothing was changed. Try again in a moment.</p>
      <Button onClick={reset}>Try again</Button>
    </Card>
  );
}
