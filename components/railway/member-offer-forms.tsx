'use client';

import { useActionState } from 'react';
import { replyToMemberOffer } from '@/app/(app)/railways/actions';
import { Button } from '@/components/ui/button';
import { Notice } from '@/components/ui/card';
import { ROLE_LABELS, type Role } from '@/lib/roles';

export function MemberOfferRow({
  offer,
}: {
  offer: { id: string; railwayName: string; role: Role; invitedBy: string | null };
}) {
  const [state, action, pending] = useActionState(replyToMemberOffer, null);
  return (
    <li className="flex flex-col gap-3 py-3 sm:flex-row sm:items-center sm:justify-between" data-testid="member-offer">
      <div>
        <p className="font-semibold">{offer.railwayName}</p>
        <p className="text-sm text-muted">
          {offer.invitedBy ?? 'A host'} invited you to join as {ROLE_LABELS[offer.role].toLowerCase()}.
        </p>
        {state && !state.ok ? <Notice tone="bad">{state.error}</Notice> : null}
      </div>
      <form action={action} className="flex gap-2">
        <input type="hidden" name="invitationId" value={offer.id} />
        <Button type="submit" name="reply" value="accept" disabled={pending}>
          Join {offer.railwayName}
        </Button>
        <Button type="submit" name="reply" value="decline" variant="secondary" disabled={pending}>
          Decline
        </Button>
      </form>
    </li>
  );
}
