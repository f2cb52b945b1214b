import 'server-only';
import { and, count, eq, or } from 'drizzle-orm';
import { getDb } from '@/db';
import { blocks, links, runSteps } from '@/db/schema';
import type { DbOrTx } from './layout-rows';

export type BlockValues = {
  name: string;
  lengthMm: number;
  positionMm: number;
  positiveRail?: 'right' | 'left';
  reversingSection?: boolean;
  reversingPlace?: boolean;
};

export function insertBlock(layoutId: string, values: BlockValues, db: DbOrTx = getDb()) {
  return db.insert(blocks).values({ ...values, layoutId }).returning().get();
}

/** How many timetabled steps pass through a block (a block in a timetable cannot be deleted). */
export function countBlockSteps(blockId: string): number {
  return getDb().select({ n: count() }).from(runSteps).where(eq(runSteps.blockId, blockId)).get()?.n ?? 0;
}

type End = 'a' | 'b';

/** The link joining end aEnd of block a to end bEnd of block b, written either way round, if there is one. */
export function findLink(layoutId: string, a: string, b: string, ends: { aEnd: End; bEnd: End } = { aEnd: 'b', bEnd: 'a' }, db: DbOrTx = getDb()) {
  return db
    .select()
    .from(links)
    .where(
      and(
        eq(links.layoutId, layoutId),
        or(
          and(eq(links.blockAId, a), eq(links.blockAEnd, ends.aEnd), eq(links.blockBId, b), eq(links.blockBEnd, ends.bEnd)),
          and(eq(links.blockAId, b), eq(links.blockAEnd, ends.bEnd), eq(links.blockBId, a), eq(links.blockBEnd, ends.aEnd)),
        ),
      ),
    )
    .get();
}

export function insertLink(layoutId: string, blockAId: string, blockBId: string, ends: { aEnd: End; bEnd: End } = { aEnd: 'b', bEnd: 'a' }, db: DbOrTx = getDb()) {
  return db.insert(links).values({ layoutId, blockAId, blockBId, blockAEnd: ends.aEnd, blockBEnd: ends.bEnd }).returning().get();
}

/** Deletes a link of this layout; false when there was none. */
export function deleteLinkById(layoutId: string, linkId: string): boolean {
  return getDb().delete(links).where(and(eq(links.id, linkId), eq(links.layoutId, layoutId))).run().changes > 0;
}
