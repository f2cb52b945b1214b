import { getRailway } from '@/db/queries/railways';
import { RailwayNav } from '@/components/railway/railway-nav';
import { ROLE_LABELS } from '@/lib/roles';
import { memberForPage } from '@/lib/auth/pages';
import { notFound } from 'next/navigation';

export default async function RailwayLayout({
  children,
  params,
}: {
  children: React.ReactNode;
  params: Promise<{ railwayId: string }>;
}) {
  const { railwayId } = await params;
  const { member } = await memberForPage(railwayId, 'operator', `/railways/${railwayId}`);
  const railway = member ? getRailway(railwayId) : undefined;
  if (!member || !railway) notFound();
  return (
    <div className="space-y-6">
      <div className="no-print flex flex-col gap-3 sm:flex-row sm:items-end sm:justify-between">
        <div>
          <p className="text-xs font-semibold uppercase tracking-widest text-brass">
            {ROLE_LABELS[member.role]} · {railway.timeZone}
          </p>
          {/* The railway's name heads every railway page visually; each page has its own h1. */}
          <p className="font-display text-2xl font-bold sm:text-3xl" data-testid="railway-name">
            {railway.name}
          </p>
        </div>
      </div>
      <RailwayNav railwayId={railwayId} role={member.role} />
      {children}
    </div>
  );
}
