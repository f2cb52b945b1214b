import type { Metadata } from 'next';
import { loadLayoutRows } from '@/db/queries/plan-data';
import { PowerBudgetView } from '@/components/layouts/power-budget-view';
import { CabsTable, DriversTable, SuppliesTable } from '@/components/layouts/power-tables';
import { SafetyCautions } from '@/components/layouts/safety-cautions';
import { Card } from '@/components/ui/card';
import { budgetInputOf, layoutForPage } from '@/lib/layouts/layout-page';
import { powerBudget } from '@/lib/layouts/power-budget';

export const metadata: Metadata = { title: 'Power' };

export default async function PowerPage({ params }: { params: Promise<{ railwayId: string; layoutId: string }> }) {
  const { railwayId, layoutId } = await params;
  const { layout, canEdit } = await layoutForPage(railwayId, layoutId, '/power');
  const rows = loadLayoutRows(layout.id);
  const budget = powerBudget(budgetInputOf(rows));
  const ids = { railwayId, layoutId: layout.id, canEdit };
  return (
    <div className="space-y-6">
      <SafetyCautions />
      <Card title={`Supplies (${rows.supplies.length})`}>
        <SuppliesTable {...ids} supplies={rows.supplies} />
      </Card>
      <Card title={`Drivers (${rows.drivers.length})`}>
        <p className="mb-3 text-sm text-muted">
          Choose a driver class to fill in its datasheet ratings, or type your own; you may note your own part number. A channel holds one cab.
        </p>
        <DriversTable {...ids} drivers={rows.drivers} supplies={rows.supplies.map((s) => ({ id: s.id, name: s.name }))} />
      </Card>
      <Card title={`Cabs (${rows.cabs.length})`}>
        <CabsTable {...ids} cabs={rows.cabs} drivers={rows.drivers.map((d) => ({ id: d.id, name: d.name, channels: d.channels }))} />
      </Card>
      <Card title="Power budget">
        <PowerBudgetView budget={budget} />
      </Card>
    </div>
  );
}
