import type { Metadata } from 'next';
import { loadLayoutRows } from '@/db/queries/plan-data';
import { DeleteLayoutButton, LayoutForm } from '@/components/layouts/layout-forms';
import { TrackDiagram } from '@/components/layouts/track-diagram';
import { TrackPlanPanel } from '@/components/layouts/track-plan-panel';
import { buttonClass } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { layoutForPage } from '@/lib/layouts/layout-page';
import { scaleIdOf } from '@/lib/validations/layout';

export const metadata: Metadata = { title: 'Layout' };

export default async function LayoutOverview({ params }: { params: Promise<{ railwayId: string; layoutId: string }> }) {
  const { railwayId, layoutId } = await params;
  const { layout, canEdit } = await layoutForPage(railwayId, layoutId);
  const rows = loadLayoutRows(layout.id);
  const scaleId = scaleIdOf(layout);
  const counts = [
    ['Blocks', rows.blocks.length],
    ['Links', rows.links.length],
    ['Supplies', rows.supplies.length],
    ['Drivers', rows.drivers.length],
    ['Cabs', rows.cabs.length],
    ['Locomotives', rows.locomotives.length],
    ['Trains', rows.trains.length],
  ] as const;
  return (
    <div className="space-y-6">
      <Card title="Track diagram">
        <p className="mb-3 text-sm text-muted">
          Drawn from the blocks and links (Blocks & links tab), in position order from the left; a turnout’s other road goes below. Every block is listed there as a
          table too.
        </p>
        <TrackDiagram
          title={`Track diagram of ${layout.name}`}
          blocks={rows.blocks.map((b) => ({ id: b.id, name: b.name, positionMm: b.positionMm, reversingSection: b.reversingSection, reversingPlace: b.reversingPlace }))}
          links={rows.links.map((l) => ({ a: l.blockAId, b: l.blockBId, aEnd: l.blockAEnd, bEnd: l.blockBEnd }))}
        />
      </Card>
      <div className="grid gap-6 lg:grid-cols-[1fr_22rem]">
        <div className="space-y-6">
          <Card title="Track plan">
            <TrackPlanPanel layoutId={layout.id} version={layout.version} hasImage={!!layout.trackPlanFile} canEdit={canEdit} name={layout.name} />
          </Card>
          {layout.notes ? (
            <Card title="Notes">
              <p className="whitespace-pre-line text-sm">{layout.notes}</p>
            </Card>
          ) : null}
          <Card title="In this layout">
            <dl className="grid grid-cols-2 gap-3 text-sm sm:grid-cols-4">
              {counts.map(([label, n]) => (
                <div key={label} className="rounded-plate bg-sunken p-3">
                  <dt className="text-muted">{label}</dt>
                  <dd className="font-display text-2xl font-bold">{n}</dd>
                </div>
              ))}
            </dl>
          </Card>
        </div>
        <div className="space-y-6">
          <Card title="Files">
            <p className="mb-3 text-sm text-muted">
              The whole layout as a plan interchange file (JSON, version 1, without runs); it imports back as a new layout. CSV files for each table are on the
              Blocks & links and Rolling stock tabs.
            </p>
            <a href={`/api/layouts/${layout.id}/plan`} className={buttonClass('secondary')} download>
              Export plan (JSON)
            </a>
          </Card>
          {canEdit ? (
            <Card title="Layout details">
              <LayoutForm
                railwayId={railwayId}
                layout={{
                  id: layout.id,
                  version: layout.version,
                  values: {
                    name: layout.name,
                    scaleId,
                    customScaleName: scaleId === 'custom' ? layout.scaleName : '',
                    customRatio: scaleId === 'custom' ? String(layout.scaleRatio) : '',
                    setting: layout.setting,
                    notes: layout.notes,
                  },
                }}
              />
              <div className="mt-6 border-t border-line pt-4">
                <DeleteLayoutButton railwayId={railwayId} layoutId={layout.id} version={layout.version} name={layout.name} />
              </div>
            </Card>
          ) : null}
        </div>
      </div>
    </div>
  );
}
