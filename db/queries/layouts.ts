import 'server-only';
import { and, count, eq, inArray, sql } from 'drizzle-orm';
import { getDb, writeTransaction } from '@/db';
import { blocks, cabs, drivers, layouts, locomotives, sessions, trainLocomotives, trains } from '@/db/schema';

/** The railway's layouts with how much each holds. */
export function listLayoutsWithCounts(railwayId: string) {
  const db = getDb();
  const rows = db.select().from(layouts).where(eq(layouts.railwayId, railwayId)).orderBy(layouts.name).all();
  const ids = rows.map((r) => r.id);
  const tally = (table: typeof blocks | typeof cabs | typeof locomotives | typeof trains) =>
    new Map(
      ids.length
        ? db
            .select({ layoutId: table.layoutId, n: count() })
            .from(table)
            .where(inArray(table.layoutId, ids))
            .groupBy(table.layoutId)
            .all()
            .map((r) => [r.layoutId, r.n] as const)
        : [],
    );
  const [b, c, l, t] = [tally(blocks), tally(cabs), tally(locomotives), tally(trains)];
  return rows.map((r) => ({
    ...r,
    blockCount: b.get(r.id) ?? 0,
    cabCount: c.get(r.id) ?? 0,
    locomotiveCount: l.get(r.id) ?? 0,
    trainCount: t.get(r.id) ?? 0,
  }));
}

/** One layout of one railway; undefined for another railway's layout or a made-up id. */
export function getLayout(railwayId: string, layoutId: string) {
  return getDb()
    .select()
    .from(layouts)
    .where(and(eq(layouts.id, layoutId), eq(layouts.railwayId, railwayId)))
    .get();
}

/** Which railway a layout belongs to (route handlers look this up, then check membership of it). */
export function getLayoutRailwayId(layoutId: string): string | undefined {
  return getDb().select({ railwayId: layouts.railwayId }).from(layouts).where(eq(layouts.id, layoutId)).get()?.railwayId;
}

export type LayoutValues = Pick<typeof layouts.$inferInsert, 'name' | 'scaleName' | 'scaleRatio' | 'setting' | 'notes'>;

export function insertLayout(railwayId: string, values: LayoutValues) {
  return getDb().insert(layouts).values({ ...values, railwayId }).returning().get();
}

export type VersionedResult<R> = { ok: true; row: R } | { ok: false; reason: 'missing' } | { ok: false; reason: 'stale'; current: R };

/** Changes a layout's own fields if `version` is still current; raises the version. */
export function updateLayoutById(
  railwayId: string,
  layoutId: string,
  version: number,
  values: Partial<LayoutValues> & Partial<Pick<typeof layouts.$inferInsert, 'trackPlanFile' | 'trackPlanType'>>,
): VersionedResult<typeof layouts.$inferSelect> {
  const db = getDb();
  const row = db
    .update(layouts)
    .set({ ...values, version: sql`${layouts.version} + 1` })
    .where(and(eq(layouts.id, layoutId), eq(layouts.railwayId, railwayId), eq(layouts.version, version)))
    .returning()
    .get();
  if (row) return { ok: true, row };
  const current = getLayout(railwayId, layoutId);
  return current ? { ok: false, reason: 'stale', current } : { ok: false, reason: 'missing' };
}

/** Sessions that use a layout (a layout with sessions cannot be deleted). */
export function countLayoutSessions(layoutId: string): number {
  return getDb().select({ n: count() }).from(sessions).where(eq(sessions.layoutId, layoutId)).get()?.n ?? 0;
}

/** Deletes a layout and everything in it, if `version` is still current. */
export function deleteLayoutById(railwayId: string, layoutId: string, version: number): VersionedResult<typeof layouts.$inferSelect> {
  return writeTransaction((tx) => {
    const current = tx.select().from(layouts).where(and(eq(layouts.id, layoutId), eq(layouts.railwayId, railwayId))).get();
    if (!current) return { ok: false, reason: 'missing' } as const;
    if (current.version !== version) return { ok: false, reason: 'stale', current } as const;
    // Drivers and cabs restrict deletes of what they point at, so remove the power chain in order.
    const trainIds = tx.select({ id: trains.id }).from(trains).where(eq(trains.layoutId, layoutId)).all().map((r) => r.id);
    if (trainIds.length) tx.delete(trainLocomotives).where(inArray(trainLocomotives.trainId, trainIds)).run();
    tx.delete(cabs).where(eq(cabs.layoutId, layoutId)).run();
    tx.delete(drivers).where(eq(drivers.layoutId, layoutId)).run();
    tx.delete(layouts).where(eq(layouts.id, layoutId)).run();
    return { ok: true, row: current } as const;
  });
}
