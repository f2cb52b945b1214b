import type { Metadata } from 'next';
import Link from 'next/link';
import { listLayoutsWithCounts } from '@/db/queries/layouts';
import { LayoutForm, PlanImportForm } from '@/components/layouts/layout-forms';
import { Card } from '@/components/ui/card';
import { memberForPage } from '@/lib/auth/pages';
import { roleAtLeast } from '@/lib/roles';
import { notFound } from 'next/navigation';

export const metadata: Metadata = { title: 'Layouts' };

export default async function LayoutsPage({ params }: { params: Promise<{ railwayId: string }> }) {
  const { railwayId } = await params;
  const { member } = await memberForPage(railwayId, 'operator', `/railways/${railwayId}/layouts`);
  if (!member) notFound();
  const canEdit = roleAtLeast(member.role, 'planner');
  const layouts = listLayoutsWithCounts(railwayId);
  return (
    <div className="grid gap-6 lg:grid-cols-[1fr_22rem]">
      <h1 className="sr-only">Layouts</h1>
      <Card title={`Layouts (${layouts.length})`}>
        {layouts.length === 0 ? (
          <p className="text-muted">{canEdit ? 'No layouts yet. Create the first one.' : 'No layouts yet.'}</p>
        ) : (
          <ul className="divide-y divide-line" data-testid="layout-list">
            {layouts.map((l) => (
              <li key={l.id} className="py-3">
                <Link href={`/railways/${railwayId}/layouts/${l.id}`} className="font-semibold text-verdigris hover:underline">
                  {l.name}
                </Link>
                <p className="text-sm text-muted">
                  {l.scaleName} (1:{l.scaleRatio}) · {l.setting} · {l.blockCount} blocks · {l.cabCount} cabs · {l.locomotiveCount} locomotives · {l.trainCount} trains
                </p>
              </li>
            ))}
          </ul>
        )}
      </Card>
      {canEdit ? (
        <div className="space-y-6">
          <Card title="New layout">
            <LayoutForm railwayId={railwayId} />
          </Card>
          <Card title="Import a plan file">
            <p className="mb-3 text-sm text-muted">A plan interchange file (JSON, version 1) becomes a new layout; any runs in it are left out.</p>
            <PlanImportForm railwayId={railwayId} />
          </Card>
        </div>
      ) : null}
    </div>
  );
}
