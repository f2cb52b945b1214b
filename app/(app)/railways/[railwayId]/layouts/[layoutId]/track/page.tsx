import type { Metadata } from 'next';
import { loadLayoutRows } from '@/db/queries/plan-data';
import { BlocksTable } from '@/components/layouts/blocks-table';
import { CsvPanel } from '@/components/layouts/csv-panel';
import { LinksPanel } from '@/components/layouts/links-panel';
import { Card, Notice } from '@/components/ui/card';
import { layoutForPage } from '@/lib/layouts/layout-page';

export const metadata: Metadata = { title: 'Blocks & links' };

export default async function TrackPage({ params }: { params: Promise<{ railwayId: string; layoutId: string }> }) {
  const { railwayId, layoutId } = await params;
  const { layout, canEdit } = await layoutForPage(railwayId, layoutId, '/track');
  const rows = loadLayoutRows(layout.id);
  const name = new Map(rows.blocks.map((b) => [b.id, b.name]));
  const neighbours: Record<string, string[]> = {};
  for (const l of rows.links) {
    (neighbours[l.blockAId] ??= []).push(name.get(l.blockBId) ?? '?');
    (neighbours[l.blockBId] ??= []).push(name.get(l.blockAId) ?? '?');
  }
  const unlinked = rows.blocks.length > 1 ? rows.blocks.filter((b) => !neighbours[b.id]) : [];
  return (
    <div className="space-y-6">
      <Card title={`Blocks (${rows.blocks.length})`}>
        {unlinked.length ? (
          <div className="mb-3" data-testid="unlinked-warning">
            <Notice tone="warn">
              Nothing links to {unlinked.length === 1 ? 'block' : `${unlinked.length} blocks`}: {unlinked.map((b) => `“${b.name}”`).join(', ')}. A train cannot
              reach {unlinked.length === 1 ? 'it' : 'them'} from another block.
            </Notice>
          </div>
        ) : null}
        <BlocksTable
          railwayId={railwayId}
          layoutId={layout.id}
          canEdit={canEdit}
          neighbours={neighbours}
          blocks={rows.blocks.map((b) => ({
            id: b.id,
            name: b.name,
            lengthMm: b.lengthMm,
            positionMm: b.positionMm,
            positiveRail: b.positiveRail,
            reversingSection: b.reversingSection,
            reversingPlace: b.reversingPlace,
            version: b.version,
          }))}
        />
        <div className="mt-4">
          <CsvPanel layoutId={layout.id} table="blocks" canEdit={canEdit} />
        </div>
      </Card>
      <Card title={`Links (${rows.links.length})`}>
        <LinksPanel
          railwayId={railwayId}
          layoutId={layout.id}
          canEdit={canEdit}
          blocks={rows.blocks.map((b) => ({ id: b.id, name: b.name }))}
          links={rows.links.map((l) => ({ id: l.id, a: name.get(l.blockAId) ?? '?', b: name.get(l.blockBId) ?? '?', aEnd: l.blockAEnd, bEnd: l.blockBEnd }))}
        />
        <div className="mt-4">
          <CsvPanel layoutId={layout.id} table="links" canEdit={canEdit} />
        </div>
      </Card>
    </div>
  );
}
