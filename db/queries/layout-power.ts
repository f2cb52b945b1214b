import 'server-only';
import { and, asc, count, eq, ne } from 'drizzle-orm';
import { getDb } from '@/db';
import { cabs, drivers, runs, supplies } from '@/db/schema';
import type { DbOrTx } from './layout-rows';

export type SupplyValues = { name: string; volts: number; amps: number };
export type DriverValues = {
  name: string;
  supplyId: string;
  presetId: string | null;
  partNumber: string | null;
  channels: number;
  channelAmps: number;
  channelPeakAmps: number;
  totalAmps: number | null;
  /** See DriverElectrics in lib/layouts/driver-electrics.ts. */
  dropVolts: number;
  /** Absent when inserting: the column defaults (0 Ω, nulls). */
  dropOhms?: number;
  dropMaxVolts?: number | null;
  dropMaxOhms?: number | null;
  peakPulseMs?: number | null;
  packageWatts?: number | null;
};
export type CabValues = { name: string; driverId: string; channel: number };

export function insertSupply(layoutId: string, values: SupplyValues, db: DbOrTx = getDb()) {
  return db.insert(supplies).values({ ...values, layoutId }).returning().get();
}

export function insertDriver(layoutId: string, values: DriverValues, db: DbOrTx = getDb()) {
  return db.insert(drivers).values({ ...values, layoutId }).returning().get();
}

export function insertCab(layoutId: string, values: CabValues, db: DbOrTx = getDb()) {
  return db.insert(cabs).values({ ...values, layoutId }).returning().get();
}

/** Drivers fed by a supply, by name. */
export function driversOfSupply(layoutId: string, supplyId: string) {
  return getDb()
    .select({ id: drivers.id, name: drivers.name })
    .from(drivers)
    .where(and(eq(drivers.layoutId, layoutId), eq(drivers.supplyId, supplyId)))
    .orderBy(asc(drivers.name))
    .all();
}

/** Cabs on a driver, by channel. */
export function cabsOfDriver(layoutId: string, driverId: string) {
  return getDb()
    .select({ id: cabs.id, name: cabs.name, channel: cabs.channel })
    .from(cabs)
    .where(and(eq(cabs.layoutId, layoutId), eq(cabs.driverId, driverId)))
    .orderBy(asc(cabs.channel))
    .all();
}

/** The cab holding a driver's channel, other than `exceptCabId`. */
export function cabOnChannel(layoutId: string, driverId: string, channel: number, exceptCabId?: string) {
  return getDb()
    .select({ id: cabs.id, name: cabs.name })
    .from(cabs)
    .where(
      and(
        eq(cabs.layoutId, layoutId),
        eq(cabs.driverId, driverId),
        eq(cabs.channel, channel),
        exceptCabId ? ne(cabs.id, exceptCabId) : undefined,
      ),
    )
    .get();
}

/** How many timetabled runs use a cab. */
export function countCabRuns(cabId: string): number {
  return getDb().select({ n: count() }).from(runs).where(eq(runs.cabId, cabId)).get()?.n ?? 0;
}
