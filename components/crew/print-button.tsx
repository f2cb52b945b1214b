'use client';

import { Button } from '@/components/ui/button';

export function PrintButton({ label = 'Print crew card' }: { label?: string }) {
  return (
    <Button type="button" onClick={() => window.print()} className="no-print">
      {label}
    </Button>
  );
}
