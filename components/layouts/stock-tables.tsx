'use client';

import { useMemo } from 'react';
import {
  createLocomotive,
  createTrain,
  deleteLocomotive,
  deleteTrain,
  updateLocomotive,
  updateTrain,
} from '@/app/(app)/railways/[railwayId]/layouts/[layoutId]/actions';
import { fromMm } from '@/lib/layouts/units';
import { locomotiveEditSchema, locomotiveSchema, trainEditSchema, trainSchema } from '@/lib/validations/layout';
import { EntityTable, type EntityColumn } from '@/components/ui/entity-table';
import { UnitPicker } from './unit-picker';
import { useLengthUnit } from './use-length-unit';

export type LocomotiveRow = {
  id: string;
  name: string;
  runningAmps: number;
  stallAmps: number;
  ratedVolts: number;
  topSpeedKmh: number;
  startVolts: number | null;
  version: number;
};
export type TrainRow = {
  id: string;
  name: string;
  locomotiveIds: string[];
  lightingAmps: number;
  lengthMm: number;
  accelKmhPerS: number | null;
  brakingKmhPerS: number | null;
  version: number;
  runningAmps: number;
  surgeAmps: number;
};

type Ids = { railwayId: string; layoutId: string; canEdit: boolean };
const amps = (v: number) => `${Math.round(v * 1000) / 1000} A`;

/**
 * What a new locomotive row starts with, said as such above the table: HO can-motor planning figures
 * (common practice, 0.5 A running, 0.9 A stalled) and the layout gauge's nominal track voltage (NEM 630 Table 1).
 */
export type LocomotiveDefaults = { runningAmps: number; stallAmps: number; ratedVolts: number };

export function LocomotivesTable({
  railwayId,
  layoutId,
  canEdit,
  locomotives,
  defaults,
}: Ids & { locomotives: LocomotiveRow[]; defaults: LocomotiveDefaults }) {
  const columns = useMemo<EntityColumn<LocomotiveRow>[]>(
    () => [
      { id: 'name', header: 'Name', sortValue: (r) => r.name.toLowerCase(), field: { name: 'name', placeholder: 'e.g. Tank No. 5', toInput: (r) => r.name } },
      { id: 'runningAmps', header: 'Running', sortValue: (r) => r.runningAmps, field: { name: 'runningAmps', kind: 'number', suffix: 'A', width: 'w-20', toInput: (r) => String(r.runningAmps) } },
      { id: 'stallAmps', header: 'Stall', sortValue: (r) => r.stallAmps, field: { name: 'stallAmps', kind: 'number', suffix: 'A', width: 'w-20', toInput: (r) => String(r.stallAmps) } },
      { id: 'ratedVolts', header: 'Rated', sortValue: (r) => r.ratedVolts, field: { name: 'ratedVolts', kind: 'number', suffix: 'V', width: 'w-20', toInput: (r) => String(r.ratedVolts) } },
      { id: 'topSpeedKmh', header: 'Top speed at rated', sortValue: (r) => r.topSpeedKmh, field: { name: 'topSpeedKmh', kind: 'number', suffix: 'km/h', width: 'w-20', toInput: (r) => String(r.topSpeedKmh) } },
      {
        id: 'startVolts',
        header: 'Starts moving at',
        sortValue: (r) => r.startVolts ?? -1,
        field: { name: 'startVolts', kind: 'number', suffix: 'V', width: 'w-20', placeholder: 'not measured', toInput: (r) => (r.startVolts === null ? '' : String(r.startVolts)) },
      },
    ],
    [],
  );
  return (
    <EntityTable
      label="locomotives"
      noun="locomotive"
      testId="locomotives-table"
      rows={locomotives}
      columns={columns}
      createSchema={locomotiveSchema}
      editSchema={locomotiveEditSchema}
      newDefaults={{
        name: '',
        runningAmps: String(defaults.runningAmps),
        stallAmps: String(defaults.stallAmps),
        ratedVolts: String(defaults.ratedVolts),
        topSpeedKmh: '',
        startVolts: '',
      }}
      nextDefaults={(added) => ({ ...added, name: '' })}
      create={(fd) => createLocomotive(railwayId, layoutId, null, fd)}
      update={(fd) => updateLocomotive(railwayId, layoutId, null, fd)}
      remove={(fd) => deleteLocomotive(railwayId, layoutId, null, fd)}
      canEdit={canEdit}
      rowName={(r) => r.name}
    />
  );
}

export function TrainsTable({
  railwayId,
  layoutId,
  canEdit,
  trains,
  locomotives,
  ramps,
}: Ids & { trains: TrainRow[]; locomotives: { id: string; name: string }[]; ramps: { accelKmhPerS: number; brakingKmhPerS: number } }) {
  const [unit, setUnit] = useLengthUnit();
  const options = useMemo(() => locomotives.map((l) => ({ value: l.id, label: l.name })), [locomotives]);
  const columns = useMemo<EntityColumn<TrainRow>[]>(
    () => [
      { id: 'name', header: 'Name', sortValue: (r) => r.name.toLowerCase(), field: { name: 'name', placeholder: 'e.g. Morning goods', toInput: (r) => r.name } },
      {
        id: 'consist',
        header: 'Consist',
        sortValue: (r) => r.locomotiveIds.map((id) => options.find((o) => o.value === id)?.label ?? '').join(', '),
        field: { name: 'locomotiveIds', kind: 'consist', options, toInput: (r) => r.locomotiveIds },
      },
      { id: 'lightingAmps', header: 'Lighting', sortValue: (r) => r.lightingAmps, field: { name: 'lightingAmps', kind: 'number', suffix: 'A', width: 'w-20', placeholder: '0', toInput: (r) => String(r.lightingAmps) } },
      { id: 'length', header: 'Length', sortValue: (r) => r.lengthMm, field: { name: 'length', kind: 'number', suffix: unit, width: 'w-24', toInput: (r) => String(fromMm(r.lengthMm, unit)) } },
      rampColumn('accelKmhPerS', 'Acceleration', ramps.accelKmhPerS),
      rampColumn('brakingKmhPerS', 'Braking', ramps.brakingKmhPerS),
      {
        id: 'current',
        header: 'Running / surge',
        sortValue: (r) => r.runningAmps,
        render: (r) => (
          <span className="whitespace-nowrap font-semibold text-ink" title="Σ locomotives' running current + lighting / Σ start current + lighting">
            {amps(r.runningAmps)} / {amps(r.surgeAmps)}
          </span>
        ),
      },
    ],
    [options, unit, ramps],
  );
  const hidden = useMemo(() => ({ unit }), [unit]);
  return (
    <div className="space-y-3">
      <UnitPicker unit={unit} onChange={setUnit} id="trains-unit" />
      <EntityTable
        label="trains"
        noun="train"
        testId="trains-table"
        rows={trains}
        columns={columns}
        createSchema={trainSchema}
        editSchema={trainEditSchema}
        hidden={hidden}
        newDefaults={{ name: '', locomotiveIds: [], lightingAmps: '', length: '', accelKmhPerS: '', brakingKmhPerS: '' }}
        create={(fd) => createTrain(railwayId, layoutId, null, fd)}
        update={(fd) => updateTrain(railwayId, layoutId, null, fd)}
        remove={(fd) => deleteTrain(railwayId, layoutId, null, fd)}
        canEdit={canEdit}
        rowName={(r) => r.name}
      />
    </div>
  );
}

/** A ramp in scale km/h per second; blank takes the scale's common-practice figure, shown beside it. */
function rampColumn(name: 'accelKmhPerS' | 'brakingKmhPerS', header: string, fallback: number): EntityColumn<TrainRow> {
  return {
    id: name,
    header,
    under: true,
    sortValue: (r) => r[name] ?? fallback,
    field: { name, kind: 'number', suffix: 'km/h/s', width: 'w-20', placeholder: String(fallback), toInput: (r) => (r[name] === null ? '' : String(r[name])) },
    render: (r) => (r[name] === null ? `${fallback} km/h/s, common practice` : `${r[name]} km/h/s`),
  };
}
