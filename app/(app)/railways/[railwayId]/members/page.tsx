import type { Metadata } from 'next';
import { notFound } from 'next/navigation';
import { listMemberInvitations } from '@/db/queries/member-invitations';
import { listMembers } from '@/db/queries/memberships';
import { InviteMemberForm, MemberRow, PendingOfferRow } from '@/components/members/member-forms';
import { Card } from '@/components/ui/card';
import { memberForPage } from '@/lib/auth/pages';
import { ROLE_LABELS, ROLE_SUMMARIES, ROLES } from '@/lib/roles';

export const metadata: Metadata = { title: 'Members' };

export default async function MembersPage({ params }: { params: Promise<{ railwayId: string }> }) {
  const { railwayId } = await params;
  const { member } = await memberForPage(railwayId, 'operator', `/railways/${railwayId}/members`);
  if (!member) notFound();
  const isHost = member.role === 'host';
  const members = listMembers(railwayId);
  const offers = isHost ? listMemberInvitations(railwayId) : [];
  return (
    <div className="grid gap-6 lg:grid-cols-[1fr_22rem]">
      <h1 className="sr-only">Members</h1>
      <div className="space-y-6">
      <Card title={`Members (${members.length})`}>
        <ul className="divide-y divide-line" data-testid="member-list">
          {members.map((m) => (
            <MemberRow
              key={m.userId}
              railwayId={railwayId}
              member={{ userId: m.userId, name: m.name, email: isHost || member.role === 'planner' ? m.email : null, role: m.role, pending: !m.hasPassword }}
              editable={isHost}
              isSelf={m.userId === member.user.id}
            />
          ))}
        </ul>
      </Card>
      {offers.length > 0 ? (
        <Card title={`Invited, not joined yet (${offers.length})`}>
          <ul className="divide-y divide-line" data-testid="offer-list">
            {offers.map((o) => (
              <PendingOfferRow key={o.id} railwayId={railwayId} offer={o} />
            ))}
          </ul>
        </Card>
      ) : null}
      </div>
      <div className="space-y-6">
        {isHost ? (
          <Card title="Add a member">
            <InviteMemberForm railwayId={railwayId} />
          </Card>
        ) : null}
        <Card title="Roles">
          <dl className="space-y-2 text-sm">
            {[...ROLES].reverse().map((r) => (
              <div key={r}>
                <dt className="font-semibold">{ROLE_LABELS[r]}</dt>
                <dd className="text-muted">{ROLE_SUMMARIES[r]}</dd>
              </div>
            ))}
          </dl>
        </Card>
      </div>
    </div>
  );
}
