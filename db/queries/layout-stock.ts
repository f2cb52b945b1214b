import 'server-only';
import { and, asc, count, eq, inArray } from 'drizzle-orm';
import { getDb, writeTransaction } from '@/db';
import { locomotives, runs, trainLocomotives, trains } from '@/db/schema';
import type { DbOrTx } from './layout-rows';

export type LocomotiveValues = { name: string; runningAmps: number; stallAmps: number; ratedVolts: number; topSpeedKmh: number; startVolts?: number | null };
export type TrainValues = { name: string; lightingAmps: number; lengthMm: number; accelKmhPerS?: number | null; brakingKmhPerS?: number | null };

export function insertLocomotive(layoutId: string, values: LocomotiveValues, db: DbOrTx = getDb()) {
  return db.insert(locomotives).values({ ...values, layoutId }).returning().get();
}

/** Of `ids`, the ones that are locomotives of this layout. */
export function locomotiveIdsInLayout(layoutId: string, ids: readonly string[], db: DbOrTx = getDb()): Set<string> {
  if (ids.length === 0) return new Set();
  return new Set(
    db
      .select({ id: locomotives.id })
      .from(locomotives)
      .where(and(eq(locomotives.layoutId, layoutId), inArray(locomotives.id, [...ids])))
      .all()
      .map((r) => r.id),
  );
}

/** Replaces a train's consist with `locomotiveIds`, in order. */
export function setConsist(trainId: string, locomotiveIds: readonly string[], db: DbOrTx = getDb()): void {
  db.delete(trainLocomotives).where(eq(trainLocomotives.trainId, trainId)).run();
  locomotiveIds.forEach((locomotiveId, position) =>
    db.insert(trainLocomotives).values({ trainId, locomotiveId, position }).run(),
  );
}

/** Inserts a train with its consist in one transaction. */
export function insertTrain(layoutId: string, values: TrainValues, locomotiveIds: readonly string[]) {
  return writeTransaction((tx) => {
    const train = tx.insert(trains).values({ ...values, layoutId }).returning().get();
    setConsist(train.id, locomotiveIds, tx);
    return train;
  });
}

/** The trains a locomotive is part of, by name. */
export function trainsOfLocomotive(locomotiveId: string) {
  return getDb()
    .select({ id: trains.id, name: trains.name })
    .from(trainLocomotives)
    .innerJoin(trains, eq(trains.id, trainLocomotives.trainId))
    .where(eq(trainLocomotives.locomotiveId, locomotiveId))
    .orderBy(asc(trains.name))
    .all();
}

/** How many timetabled runs use a train. */
export function countTrainRuns(trainId: string): number {
  return getDb().select({ n: count() }).from(runs).where(eq(runs.trainId, trainId)).get()?.n ?? 0;
}
