import 'server-only';
import { count, eq, inArray } from 'drizzle-orm';
import { getDb } from '@/db';
import { blocks, cabs, layouts, locomotives, trains } from '@/db/schema';

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
