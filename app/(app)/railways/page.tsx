import type { Metadata } from 'next';
import Link from 'next/link';
import { listMemberInvitationsFor } from '@/db/queries/member-invitations';
import { listRailwaysOfUser } from '@/db/queries/memberships';
import { CreateRailwayForm } from '@/components/railway/create-railway-form';
import { MemberOfferRow } from '@/components/railway/member-offer-forms';
import { SignOutEverywhereForm } from '@/components/account/sign-out-everywhere';
import { Badge, Card } from '@/components/ui/card';
import { requireUser } from '@/lib/auth';
import { ROLE_LABELS } from '@/lib/roles';

export const metadata: Metadata = { title: 'My railways' };

export default async function RailwaysPage() {
  const user = await requireUser();
  const railways = listRailwaysOfUser(user.id);
  const offers = listMemberInvitationsFor(user.email);
  return (
    <div className="grid gap-6 lg:grid-cols-[1fr_22rem]">
      <div className="space-y-4">
        <h1 className="font-display text-3xl font-bold">My railways</h1>
        {offers.length > 0 ? (
          <Card title="Invitations to join">
            <ul className="divide-y divide-line">
              {offers.map((o) => (
                <MemberOfferRow key={o.id} offer={o} />
              ))}
            </ul>
          </Card>
        ) : null}
        {railways.length === 0 ? (
          <Card>
            <p className="text-muted">
              You are not a member of any railway yet. Create one, or ask a host to add you with this e-mail address:{' '}
              <strong>{user.email}</strong>.
            </p>
          </Card>
        ) : (
          <ul className="grid gap-3 sm:grid-cols-2">
            {railways.map((r) => (
              <li key={r.id}>
                <Link
                  href={`/railways/${r.id}`}
                  className="block rounded-plate border border-line bg-surface p-4 shadow-sm transition hover:border-verdigris"
                >
                  <span className="font-display text-lg font-bold">{r.name}</span>
                  <span className="mt-2 flex items-center gap-2 text-sm text-muted">
                    <Badge tone={r.role === 'host' ? 'info' : r.role === 'planner' ? 'good' : 'neutral'}>
                      {ROLE_LABELS[r.role]}
                    </Badge>
                    {r.timeZone}
                  </span>
                </Link>
              </li>
            ))}
          </ul>
        )}
      </div>
      <div className="space-y-6">
        <Card title="Start a railway">
          <p className="mb-4 text-sm text-muted">A club or a home layout group. You will be its host.</p>
          <CreateRailwayForm timeZones={Intl.supportedValuesOf('timeZone')} />
        </Card>
        <Card title="Signed-in devices">
          <SignOutEverywhereForm />
        </Card>
      </div>
    </div>
  );
}
