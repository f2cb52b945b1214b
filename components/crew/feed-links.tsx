'use client';

import { useActionState, useState } from 'react';
import { resetCalendarFeed } from '@/app/(app)/my-runs/actions';
import { Button } from '@/components/ui/button';
import { Notice } from '@/components/ui/card';
import { inputClass } from '@/components/ui/field';

/** My personal calendar feed: the https and webcal:// addresses, copy, and reset. */
export function FeedLinks({ httpsUrl }: { httpsUrl: string }) {
  const [state, action, pending] = useActionState(resetCalendarFeed, null);
  const [copied, setCopied] = useState(false);
  const webcal = httpsUrl.replace(/^https?:/, 'webcal:');
  return (
    <div className="space-y-3">
      <p className="text-sm text-muted">
        Subscribe once and your sessions and runs stay up to date in your calendar app. Keep the address to yourself:
        anyone with it can read your schedule.
      </p>
      <label className="sr-only" htmlFor="feed-url">Feed address</label>
      <input id="feed-url" readOnly value={httpsUrl} className={`${inputClass} font-mono text-xs`} onFocus={(e) => e.currentTarget.select()} data-testid="feed-url" />
      <div className="flex flex-wrap gap-2">
        <a href={webcal} className="inline-flex items-center rounded-plate border border-transparent bg-verdigris px-4 py-2 text-sm font-semibold text-surface hover:bg-verdigris-strong">
          Subscribe (webcal)
        </a>
        <Button
          type="button"
          variant="secondary"
          onClick={async () => {
            await navigator.clipboard?.writeText(httpsUrl).catch(() => undefined);
            setCopied(true);
          }}
        >
          {copied ? 'Copied' : 'Copy address'}
        </Button>
        <form action={action}>
          <Button type="submit" variant="danger" disabled={pending}>
            {pending ? 'Resetting…' : 'Reset address'}
          </Button>
        </form>
      </div>
      {state ? <Notice tone={state.ok ? 'good' : 'bad'}>{state.ok ? state.message : state.error}</Notice> : null}
    </div>
  );
}
