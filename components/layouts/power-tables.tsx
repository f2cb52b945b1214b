'use client';

import { useMemo } from 'react';
import {
  createCab,
  createDriver,
  createSupply,
  deleteCab,
  deleteDriver,
  deleteSupply,
  updateCab,
  updateDriver,
  updateSupply,
} from '@/app/(app)/railways/[railwayId]/layouts/[layoutId]/actions';
import { presetDriverValues } from '@/lib/layouts/driver-electrics';
import { DRIVER_PRESETS, findDriverPreset } from '@/lib/planning';
import { cabEditSchema, cabSchema, driverEditSchema, driverSchema, supplyEditSchema, supplySchema } from '@/lib/validations/layout';
import type { BudgetInput } from '@/lib/layouts/power-budget';
import { EntityTable, type EntityColumn } from '@/components/ui/entity-table';

type Versioned<T> = T & { version: number };
export type SupplyRow = Versioned<BudgetInput['supplies'][number]>;
export type DriverRow = Versioned<BudgetInput['drivers'][number]>;
export type CabRow = Versioned<BudgetInput['cabs'][number]>;

type Ids = { railwayId: string; layoutId: string; canEdit: boolean };
const s = (v: number | null) => (v === null ? '' : String(v));

export function SuppliesTable({ railwayId, layoutId, canEdit, supplies }: Ids & { supplies: SupplyRow[] }) {
  const columns = useMemo<EntityColumn<SupplyRow>[]>(
    () => [
      { id: 'name', header: 'Name', sortValue: (r) => r.name.toLowerCase(), field: { name: 'name', placeholder: 'e.g. Bench supply', toInput: (r) => r.name } },
      { id: 'volts', header: 'Volts', sortValue: (r) => r.volts, field: { name: 'volts', kind: 'number', suffix: 'V', toInput: (r) => s(r.volts) } },
      { id: 'amps', header: 'Rated current', sortValue: (r) => r.amps, field: { name: 'amps', kind: 'number', suffix: 'A', toInput: (r) => s(r.amps) } },
    ],
    [],
  );
  return (
    <EntityTable
      label="supplies"
      noun="supply"
      testId="supplies-table"
      rows={supplies}
      columns={columns}
      createSchema={supplySchema}
      editSchema={supplyEditSchema}
      newDefaults={{ name: '', volts: '', amps: '' }}
      create={(fd) => createSupply(railwayId, layoutId, null, fd)}
      update={(fd) => updateSupply(railwayId, layoutId, null, fd)}
      remove={(fd) => deleteSupply(railwayId, layoutId, null, fd)}
      canEdit={canEdit}
      rowName={(r) => r.name}
    />
  );
}

const PRESET_OPTIONS = [{ value: '', label: 'Own ratings' }, ...DRIVER_PRESETS.map((p) => ({ value: p.id, label: p.label }))];

export function DriversTable({ railwayId, layoutId, canEdit, drivers, supplies }: Ids & { drivers: DriverRow[]; supplies: { id: string; name: string }[] }) {
  const supplyOptions = useMemo(() => [{ value: '', label: 'Choose…' }, ...supplies.map((x) => ({ value: x.id, label: x.name }))], [supplies]);
  const columns = useMemo<EntityColumn<DriverRow>[]>(
    () => [
      { id: 'name', header: 'Name', sortValue: (r) => r.name.toLowerCase(), field: { name: 'name', width: 'w-40', placeholder: 'e.g. Main line board', toInput: (r) => r.name } },
      { id: 'supply', header: 'Supply', sortValue: (r) => supplies.find((x) => x.id === r.supplyId)?.name ?? '', field: { name: 'supplyId', kind: 'select', options: supplyOptions, width: 'w-36', toInput: (r) => r.supplyId } },
      {
        id: 'preset',
        header: 'Class',
        sortValue: (r) => (r.presetId ? (findDriverPreset(r.presetId)?.label ?? '') : ''),
        field: { name: 'presetId', kind: 'select', options: PRESET_OPTIONS, width: 'w-64', toInput: (r) => r.presetId ?? '' },
      },
      { id: 'part', under: true, header: 'Your part no.', sortValue: (r) => r.partNumber ?? '', field: { name: 'partNumber', width: 'w-28', placeholder: 'optional', toInput: (r) => r.partNumber ?? '' } },
      { id: 'channels', header: 'Channels', sortValue: (r) => r.channels, field: { name: 'channels', kind: 'number', width: 'w-16', toInput: (r) => s(r.channels) } },
      { id: 'channelAmps', header: 'A / channel', sortValue: (r) => r.channelAmps, field: { name: 'channelAmps', kind: 'number', width: 'w-20', suffix: 'A', toInput: (r) => s(r.channelAmps) } },
      { id: 'channelPeakAmps', under: true, header: 'Peak A', sortValue: (r) => r.channelPeakAmps, field: { name: 'channelPeakAmps', kind: 'number', width: 'w-20', suffix: 'A', toInput: (r) => s(r.channelPeakAmps) } },
      { id: 'totalAmps', under: true, header: 'Total A', sortValue: (r) => r.totalAmps ?? -1, field: { name: 'totalAmps', kind: 'number', width: 'w-20', suffix: 'A', placeholder: 'none', toInput: (r) => s(r.totalAmps) } },
      { id: 'peakPulseMs', under: true, header: 'Peak holds', sortValue: (r) => r.peakPulseMs ?? -1, field: { name: 'peakPulseMs', kind: 'number', width: 'w-24', suffix: 'ms', placeholder: 'not given', toInput: (r) => s(r.peakPulseMs ?? null) } },
      // Drop against current, as the datasheet gives it: fixed part + resistance × current.
      { id: 'dropVolts', under: true, header: 'Drop, least', sortValue: (r) => r.dropVolts, field: { name: 'dropVolts', kind: 'number', width: 'w-16', suffix: 'V +', toInput: (r) => s(r.dropVolts) } },
      { id: 'dropOhms', under: true, header: '× I', sortValue: (r) => r.dropOhms ?? 0, field: { name: 'dropOhms', kind: 'number', width: 'w-16', suffix: 'Ω', toInput: (r) => s(r.dropOhms ?? 0) } },
      { id: 'dropMaxVolts', under: true, header: 'Drop, worst', sortValue: (r) => r.dropMaxVolts ?? r.dropVolts, field: { name: 'dropMaxVolts', kind: 'number', width: 'w-16', suffix: 'V +', placeholder: 'same', toInput: (r) => s(r.dropMaxVolts ?? null) } },
      { id: 'dropMaxOhms', under: true, header: '× I', sortValue: (r) => r.dropMaxOhms ?? r.dropOhms ?? 0, field: { name: 'dropMaxOhms', kind: 'number', width: 'w-16', suffix: 'Ω', placeholder: 'same', toInput: (r) => s(r.dropMaxOhms ?? null) } },
      { id: 'packageWatts', under: true, header: 'Package', sortValue: (r) => r.packageWatts ?? -1, field: { name: 'packageWatts', kind: 'number', width: 'w-20', suffix: 'W', placeholder: 'none', toInput: (r) => s(r.packageWatts ?? null) } },
    ],
    [supplies, supplyOptions],
  );
  return (
    <EntityTable
      label="drivers"
      noun="driver"
      testId="drivers-table"
      rows={drivers}
      columns={columns}
      createSchema={driverSchema}
      editSchema={driverEditSchema}
      followDefaults
      newDefaults={{ name: '', supplyId: supplies.length === 1 ? supplies[0]!.id : '', presetId: '', partNumber: '', channels: '', channelAmps: '', channelPeakAmps: '', totalAmps: '', peakPulseMs: '', dropVolts: '', dropOhms: '', dropMaxVolts: '', dropMaxOhms: '', packageWatts: '' }}
      onFieldChange={(name, value, form) => {
        // Choosing a class fills in its datasheet ratings; they can still be changed by hand.
        if (name !== 'presetId') return;
        const preset = findDriverPreset(String(value));
        if (!preset) return;
        const set = (k: string, v: string) => form.setValue(k, v, { shouldDirty: true, shouldValidate: false });
        for (const [k, v] of Object.entries(presetDriverValues(preset))) set(k, v === null ? '' : String(v));
        if (!form.getValues('name')) set('name', preset.label);
      }}
      create={(fd) => createDriver(railwayId, layoutId, null, fd)}
      update={(fd) => updateDriver(railwayId, layoutId, null, fd)}
      remove={(fd) => deleteDriver(railwayId, layoutId, null, fd)}
      canEdit={canEdit}
      rowName={(r) => r.name}
    />
  );
}

type DriverChannels = { id: string; name: string; channels: number };

/**
 * The first free channel for a new cab: on the preferred driver if it has one left, else on the first
 * driver that does; `taken` adds a cab just saved that the rows do not show yet.
 */
export function nextFreeChannel(
  drivers: readonly DriverChannels[],
  cabs: readonly { driverId: string; channel: number }[],
  preferDriverId: string,
  taken?: { driverId: string; channel: number },
): { driverId: string; channel: string } {
  const used = (driverId: string) => new Set([...cabs, ...(taken ? [taken] : [])].filter((c) => c.driverId === driverId).map((c) => c.channel));
  const free = (d: DriverChannels) => {
    const u = used(d.id);
    for (let ch = 1; ch <= Math.min(d.channels, 64); ch++) if (!u.has(ch)) return ch;
    return null;
  };
  const preferred = drivers.find((d) => d.id === preferDriverId);
  for (const d of preferred ? [preferred, ...drivers.filter((x) => x !== preferred)] : drivers) {
    const ch = free(d);
    if (ch !== null) return { driverId: d.id, channel: String(ch) };
  }
  // Every channel is taken: leave the channel empty rather than suggest one the driver does not have.
  return { driverId: preferDriverId, channel: '' };
}

export function CabsTable({ railwayId, layoutId, canEdit, cabs, drivers }: Ids & { cabs: CabRow[]; drivers: DriverChannels[] }) {
  const driverOptions = useMemo(() => [{ value: '', label: 'Choose…' }, ...drivers.map((d) => ({ value: d.id, label: `${d.name} (${d.channels} ch.)` }))], [drivers]);
  const columns = useMemo<EntityColumn<CabRow>[]>(
    () => [
      { id: 'name', header: 'Name', sortValue: (r) => r.name.toLowerCase(), field: { name: 'name', width: 'w-36', placeholder: 'e.g. Cab 1', toInput: (r) => r.name } },
      { id: 'driver', header: 'Driver', sortValue: (r) => drivers.find((d) => d.id === r.driverId)?.name ?? '', field: { name: 'driverId', kind: 'select', options: driverOptions, width: 'w-56', toInput: (r) => r.driverId } },
      { id: 'channel', header: 'Channel', sortValue: (r) => r.channel, field: { name: 'channel', kind: 'number', width: 'w-16', toInput: (r) => String(r.channel) } },
    ],
    [drivers, driverOptions],
  );
  return (
    <EntityTable
      label="cabs"
      noun="cab"
      testId="cabs-table"
      rows={cabs}
      columns={columns}
      createSchema={cabSchema}
      editSchema={cabEditSchema}
      newDefaults={{ name: '', ...(drivers.length ? nextFreeChannel(drivers, cabs, cabs.at(-1)?.driverId ?? drivers[0]!.id) : { driverId: '', channel: '' }) }}
      followDefaults
      nextDefaults={(added) => ({
        name: '',
        ...nextFreeChannel(drivers, cabs, String(added.driverId), { driverId: String(added.driverId), channel: Number(added.channel) }),
      })}
      create={(fd) => createCab(railwayId, layoutId, null, fd)}
      update={(fd) => updateCab(railwayId, layoutId, null, fd)}
      remove={(fd) => deleteCab(railwayId, layoutId, null, fd)}
      canEdit={canEdit}
      rowName={(r) => r.name}
    />
  );
}
