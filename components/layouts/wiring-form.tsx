'use client';

import { useActionState } from 'react';
import { Button } from '@/components/ui/button';
import type { ActionState } from '@/lib/errors';

/** The wiring sheet as JSON, checked on the server when saved (pins, PWM, serial pins, this layout's ids). */
export function WiringForm({ save, sheet, version }: { save: (prev: ActionState, form: FormData) => Promise<ActionState>; sheet: string; version: number | null }) {
  const [state, action, pending] = useActionState(save, null);
  return (
    <form action={action} className="space-y-2 no-print" data-testid="wiring-form">
      <input type="hidden" name="version" value={version ?? ''} />
      <label className="block text-sm font-semibold" htmlFor="wiring-sheet">Wiring sheet (JSON, version 1)</label>
      <textarea id="wiring-sheet" name="sheet" defaultValue={sheet} rows={16} spellCheck={false} className="w-full rounded-plate border border-line bg-surface p-2 font-mono text-xs" />
      {state && !state.ok ? (
        <div role="alert" className="text-sm text-signal">
          <p>{state.error}</p>
          {state.fieldErrors ? (
            <ul className="list-inside list-disc">
              {Object.entries(state.fieldErrors).map(([k, v]) => <li key={k}>{k}: {String(v)}</li>)}
            </ul>
          ) : null}
        </div>
      ) : null}
      {state?.ok ? <p className="text-sm text-verdigris">Saved. Reload to see the version you saved.</p> : null}
      <Button type="submit" disabled={pending}>{pending ? 'Saving…' : 'Save wiring sheet'}</Button>
    </form>
  );
}
