'use client';

import { useActionState } from 'react';
import { replyToInvitation } from '@/app/(app)/my-runs/actions';
import { Button } from '@/components/ui/button';

type ReplyState = 'needs-action' | 'accepted' | 'tentative' | 'declined';
const OPTIONS = [
  ['accepted', 'Accept'],
  ['tentative', 'Maybe'],
  ['declined', 'Decline'],
] as const;

/** My reply to one invitation, as three buttons with the current one pressed. */
export function ReplyButtons({ invitationId, current }: { invitationId: string; current: ReplyState }) {
  const [state, action, pending] = useActionState(replyToInvitation.bind(null, invitationId), null);
  return (
    <form action={action} className="space-y-2" data-testid="my-reply">
      <div className="grid grid-cols-3 gap-2" role="group" aria-label="My reply">
        {OPTIONS.map(([value, label]) => (
          <Button
            key={value}
            type="submit"
            name="reply"
            value={value}
            disabled={pending}
            aria-pressed={current === value}
            variant={current === value ? 'primary' : 'secondary'}
            className="py-3"
          >
            {label}
          </Button>
        ))}
      </div>
      {current === 'needs-action' ? <p className="text-xs text-muted">You have not replied yet.</p> : null}
      {state && !state.ok ? <p className="text-sm text-signal" role="alert">{state.error}</p> : null}
    </form>
  );
}
