import 'server-only';
import { and, count, eq, or } from 'drizzle-orm';
import { getDb } from '@/db';
import { blocks, links, runSteps } from '@/db/schema';
import type { DbOrTx } from './layout-rows';

export type BlockValues = { name: string; lengthMm: number; positionMm: number };

export function insertBlock(layoutId: string, values: BlockValues, db: DbOrTx = getDb()) {
  return db.insert(blocks).values({ ...values, layoutId }).returning().get();
}

/** How many timetabled steps pass through a block (a block in a timetable cannot be deleted). */
export function countBlockSteps(blockId: string): number {
  return getDb().select({ n: count() }).from(runSteps).where(eq(runSteps.blockId, blockId)).get()?.n ?? 0;
}

/** The link between two blocks in either direction, if there is one. */
export function findLink(layoutId: string, a: string, b: string, db: DbOrTx = getDb()) {
  return db
    .select()
    .from(links)
    .where(
      and(
        eq(links.layoutId, layoutId),
        or(and(eq(links.blockAId, a), eq(links.blockBId, b)), and(eq(links.blockAId, b), eq(links.blockBId, a))),
      ),
    )
    .get();
}

export function insertLink(layoutId: string, blockAId: string, blockBId: string, db: DbOrTx = getDb()) {
  return db.insert(links).values({ layoutId, blockAId, blockBId }).returning().get();
}

/** Deletes a link of this layout; false when there was none. */
export function deleteLink(layoutId: string, linkId: string): boolean {
  return getDb().delete(links).where(and(eq(links.id, linkId), eq(links.layoutId, layoutId))).run().changes > 0;
}
