import type { Metadata } from 'next';
import { loadLayoutRows } from '@/db/queries/plan-data';
import { CsvPanel } from '@/components/layouts/csv-panel';
import { DutyTablesView } from '@/components/layouts/duty-tables-view';
import { LocomotivesTable, TrainsTable } from '@/components/layouts/stock-tables';
import { Card } from '@/components/ui/card';
import { budgetInputOf, layoutForPage } from '@/lib/layouts/layout-page';
import { dutyTables, trainLoads } from '@/lib/layouts/power-budget';
import { defaultRamps, gaugeForScale, nominalTrackVolts } from '@/lib/planning';

// Common practice for a modern HO can motor (no formal source): plan on 0.5 A running, about 0.9 A stalled.
const LOCOMOTIVE_DEFAULTS = { runningAmps: 0.5, stallAmps: 0.9 } as const;

export const metadata: Metadata = { title: 'Rolling stock' };

export default async function StockPage({ params }: { params: Promise<{ railwayId: string; layoutId: string }> }) {
  const { railwayId, layoutId } = await params;
  const { layout, canEdit } = await layoutForPage(railwayId, layoutId, '/stock');
  const rows = loadLayoutRows(layout.id);
  const input = budgetInputOf(rows);
  const loads = new Map(trainLoads(input).map((l) => [l.id, l]));
  const ids = { railwayId, layoutId: layout.id, canEdit };
  const gauge = gaugeForScale({ name: layout.scaleName, ratio: layout.scaleRatio });
  const ratedVolts = nominalTrackVolts(gauge ?? 16.5);
  const ramps = defaultRamps(layout.scaleRatio);
  return (
    <div className="space-y-6">
      <Card title={`Locomotives (${rows.locomotives.length})`}>
        <p className="mb-3 text-sm text-muted">
          Running and stall current from your own measurement or the maker&apos;s figures. Common practice when unknown: plan on 0.5 A running for a modern HO
          locomotive; an HO can motor stalls near 0.9 A, older open-frame motors up to about 3 A.
        </p>
        {canEdit ? (
          <p className="mb-3 text-sm" data-testid="locomotive-defaults">
            A new locomotive starts with planning figures, not measurements: {LOCOMOTIVE_DEFAULTS.runningAmps} A running and {LOCOMOTIVE_DEFAULTS.stallAmps} A
            stalled (common practice for a modern HO can motor), rated {ratedVolts} V ({gauge === null ? 'the usual figure for 16.5 mm gauge' : `NEM 630 for ${gauge} mm gauge`}).
            Replace them with your own.
          </p>
        ) : null}
        <LocomotivesTable {...ids} locomotives={rows.locomotives} defaults={{ ...LOCOMOTIVE_DEFAULTS, ratedVolts }} />
        <div className="mt-4">
          <CsvPanel layoutId={layout.id} table="locomotives" canEdit={canEdit} />
        </div>
      </Card>
      <Card title={`Trains (${rows.trains.length})`}>
        <p className="mb-3 text-sm text-muted">
          Running = every locomotive&apos;s running current + lighting; surge = every locomotive&apos;s start current + lighting (its stall current × start volts / rated volts under a PWM ramp, the full stall current if no start voltage is entered). Lighting, common practice: about 50 mA per
          grain-of-wheat bulb, 30 mA grain-of-rice, 20 mA LED.
        </p>
        <p className="mb-3 text-sm text-muted" data-testid="ramp-defaults">
          Acceleration and braking in scale km/h per second set how a timed run starts and stops. Blank takes common practice for 1:{layout.scaleRatio}:{' '}
          {ramps.accelKmhPerS} up and {ramps.brakingKmhPerS} down, several times the prototype&apos;s 1.8–3.6 km/h per second, since a layout compresses the line too.
        </p>
        <TrainsTable
          {...ids}
          locomotives={rows.locomotives.map((l) => ({ id: l.id, name: l.name }))}
          ramps={ramps}
          trains={input.trains.map((t) => ({
            id: t.id,
            name: t.name,
            locomotiveIds: t.locomotiveIds,
            lightingAmps: t.lightingAmps,
            lengthMm: t.lengthMm,
            accelKmhPerS: rows.trains.find((r) => r.id === t.id)!.accelKmhPerS,
            brakingKmhPerS: rows.trains.find((r) => r.id === t.id)!.brakingKmhPerS,
            version: rows.trains.find((r) => r.id === t.id)!.version,
            runningAmps: loads.get(t.id)?.runningAmps ?? 0,
            surgeAmps: loads.get(t.id)?.surgeAmps ?? 0,
          }))}
        />
        <div className="mt-4">
          <CsvPanel layoutId={layout.id} table="trains" canEdit={canEdit} />
        </div>
      </Card>
      <Card title="PWM duty per train and cab">
        <DutyTablesView tables={dutyTables(input)} />
      </Card>
    </div>
  );
}
