'use client';

import { useMemo } from 'react';
import { createBlock, deleteBlock, updateBlock } from '@/app/(app)/railways/[railwayId]/layouts/[layoutId]/actions';
import { Badge } from '@/components/ui/card';
import { fromMm } from '@/lib/layouts/units';
import { blockEditSchema, blockSchema } from '@/lib/validations/layout';
import { EntityTable, type EntityColumn, type FormValues } from '@/components/ui/entity-table';
import { UnitPicker } from './unit-picker';
import { useLengthUnit } from './use-length-unit';

export type BlockRow = {
  id: string;
  name: string;
  lengthMm: number;
  positionMm: number;
  positiveRail: 'right' | 'left';
  reversingSection: boolean;
  reversingPlace: boolean;
  version: number;
};

const RAIL_OPTIONS = [
  { value: 'right', label: 'Right rail' },
  { value: 'left', label: 'Left rail' },
];
const YES_NO = [
  { value: 'no', label: 'No' },
  { value: 'yes', label: 'Yes' },
];

export function BlocksTable({
  railwayId,
  layoutId,
  blocks,
  neighbours,
  canEdit,
}: {
  railwayId: string;
  layoutId: string;
  blocks: BlockRow[];
  neighbours: Record<string, string[]>;
  canEdit: boolean;
}) {
  const [unit, setUnit] = useLengthUnit();
  const columns = useMemo<EntityColumn<BlockRow>[]>(
    () => [
      { id: 'name', header: 'Name', sortValue: (b) => b.name.toLowerCase(), field: { name: 'name', placeholder: 'e.g. Up main 3', toInput: (b) => b.name } },
      {
        id: 'length',
        header: 'Length',
        sortValue: (b) => b.lengthMm,
        field: { name: 'length', kind: 'number', suffix: unit, toInput: (b) => String(fromMm(b.lengthMm, unit)) },
      },
      {
        id: 'position',
        header: 'Position on the line',
        sortValue: (b) => b.positionMm,
        field: { name: 'position', kind: 'number', suffix: unit, toInput: (b) => String(fromMm(b.positionMm, unit)) },
      },
      {
        id: 'positiveRail',
        under: true,
        // NEM 631 2.3: the right-hand rail is positive in the direction of travel.
        header: 'Cab + feeds (looking to end b)',
        sortValue: (b) => b.positiveRail,
        field: { name: 'positiveRail', kind: 'select', options: RAIL_OPTIONS, toInput: (b) => b.positiveRail },
      },
      {
        id: 'reversingSection',
        under: true,
        header: 'Reversing section',
        sortValue: (b) => (b.reversingSection ? 1 : 0),
        field: { name: 'reversingSection', kind: 'select', options: YES_NO, toInput: (b) => (b.reversingSection ? 'yes' : 'no') },
      },
      {
        id: 'reversingPlace',
        under: true,
        header: 'Trains may reverse here',
        sortValue: (b) => (b.reversingPlace ? 1 : 0),
        field: { name: 'reversingPlace', kind: 'select', options: YES_NO, toInput: (b) => (b.reversingPlace ? 'yes' : 'no') },
      },
      {
        id: 'neighbours',
        header: 'Linked to',
        sortValue: (b) => (neighbours[b.id] ?? []).join(', '),
        render: (b) =>
          (neighbours[b.id] ?? []).length ? (
            <span className="text-muted">{(neighbours[b.id] ?? []).join(', ')}</span>
          ) : (
            <Badge tone="warn">not linked</Badge>
          ),
      },
    ],
    [unit, neighbours],
  );
  const nextPosition = useMemo(() => {
    const end = blocks.reduce((m, b) => Math.max(m, b.positionMm + b.lengthMm), 0);
    return String(fromMm(end, unit));
  }, [blocks, unit]);
  const newDefaults = useMemo<FormValues>(() => ({ name: '', length: '', position: nextPosition, positiveRail: 'right', reversingSection: 'no', reversingPlace: 'no' }), [nextPosition]);
  const hidden = useMemo(() => ({ unit }), [unit]);
  return (
    <div className="space-y-3">
      <UnitPicker unit={unit} onChange={setUnit} id="blocks-unit" />
      <EntityTable
        label="blocks"
        noun="block"
        testId="blocks-table"
        rows={blocks}
        columns={columns}
        createSchema={blockSchema}
        editSchema={blockEditSchema}
        hidden={hidden}
        newDefaults={newDefaults}
        nextDefaults={(added) => {
          const position = Number(String(added.position).replace(',', '.')) || 0;
          const length = Number(String(added.length).replace(',', '.')) || 0;
          return {
            name: '',
            length: String(added.length),
            position: String(Math.round((position + length) * 1e6) / 1e6),
            positiveRail: String(added.positiveRail ?? 'right'),
            reversingSection: 'no',
            reversingPlace: 'no',
          };
        }}
        create={(fd) => createBlock(railwayId, layoutId, null, fd)}
        update={(fd) => updateBlock(railwayId, layoutId, null, fd)}
        remove={(fd) => deleteBlock(railwayId, layoutId, null, fd)}
        canEdit={canEdit}
        rowName={(b) => b.name}
      />
    </div>
  );
}
