import 'server-only';
import { and, eq, sql } from 'drizzle-orm';
import { getDb } from '@/db';
import * as t from '@/db/schema';
import type { VersionedResult } from './layouts';

/** The tables whose rows belong to one layout and carry a version. */
export type VersionedLayoutTable =
  | typeof t.blocks
  | typeof t.supplies
  | typeof t.drivers
  | typeof t.cabs
  | typeof t.locomotives
  | typeof t.trains;

type Tx = Parameters<Parameters<ReturnType<typeof getDb>['transaction']>[0]>[0];
export type DbOrTx = ReturnType<typeof getDb> | Tx;

/** One row of a layout's table, or undefined when it is not in this layout. */
export function getLayoutRow<T extends VersionedLayoutTable>(table: T, layoutId: string, id: string, db: DbOrTx = getDb()): T['$inferSelect'] | undefined {
  const tbl = table as typeof t.blocks;
  return db.select().from(tbl).where(and(eq(tbl.id, id), eq(tbl.layoutId, layoutId))).get() as T['$inferSelect'] | undefined;
}

/**
 * Changes one row if `version` is the one the caller saw, raising it by one; otherwise says whether
 * the row is gone or was changed by someone else (with its current values).
 */
export function updateVersionedRow<T extends VersionedLayoutTable>(
  table: T,
  layoutId: string,
  id: string,
  version: number,
  values: Partial<T['$inferInsert']>,
  db: DbOrTx = getDb(),
): VersionedResult<T['$inferSelect']> {
  const tbl = table as typeof t.blocks;
  const row = db
    .update(tbl)
    .set({ ...(values as object), version: sql`${tbl.version} + 1` })
    .where(and(eq(tbl.id, id), eq(tbl.layoutId, layoutId), eq(tbl.version, version)))
    .returning()
    .get() as T['$inferSelect'] | undefined;
  if (row) return { ok: true, row };
  const current = getLayoutRow(table, layoutId, id, db);
  return current ? { ok: false, reason: 'stale', current } : { ok: false, reason: 'missing' };
}

/** Deletes one row if `version` is the one the caller saw. */
export function deleteVersionedRow<T extends VersionedLayoutTable>(
  table: T,
  layoutId: string,
  id: string,
  version: number,
  db: DbOrTx = getDb(),
): VersionedResult<T['$inferSelect']> {
  const tbl = table as typeof t.blocks;
  const row = db
    .delete(tbl)
    .where(and(eq(tbl.id, id), eq(tbl.layoutId, layoutId), eq(tbl.version, version)))
    .returning()
    .get() as T['$inferSelect'] | undefined;
  if (row) return { ok: true, row };
  const current = getLayoutRow(table, layoutId, id, db);
  return current ? { ok: false, reason: 'stale', current } : { ok: false, reason: 'missing' };
}

/** Names already used in one of a layout's tables, lower-cased, with the row id holding each. */
export function namesInLayout(table: VersionedLayoutTable, layoutId: string, db: DbOrTx = getDb()): Map<string, string> {
  const tbl = table as typeof t.blocks;
  return new Map(
    db
      .select({ id: tbl.id, name: tbl.name })
      .from(tbl)
      .where(eq(tbl.layoutId, layoutId))
      .all()
      .map((r) => [r.name.toLowerCase(), r.id] as const),
  );
}
