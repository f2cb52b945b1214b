import 'server-only';
import { and, eq } from 'drizzle-orm';
import { getDb, writeTransaction } from '@/db';
import { wiringSheets } from '@/db/schema';

/** The layout's stored wiring sheet (JSON text and version), or undefined when it has none. */
export function getWiringSheetRow(layoutId: string) {
  return getDb().select().from(wiringSheets).where(eq(wiringSheets.layoutId, layoutId)).get();
}

export type SaveWiringResult = { ok: true; version: number } | { ok: false; current: { version: number } | null };

/**
 * Writes the sheet. `seenVersion` null creates it (refused when one exists); a number replaces the
 * stored sheet only when it is still at that version (optimistic concurrency).
 */
export function saveWiringSheetRow(layoutId: string, sheet: string, seenVersion: number | null): SaveWiringResult {
  return writeTransaction((tx) => {
    const current = tx.select({ version: wiringSheets.version }).from(wiringSheets).where(eq(wiringSheets.layoutId, layoutId)).get();
    if (seenVersion === null) {
      if (current) return { ok: false, current };
      tx.insert(wiringSheets).values({ layoutId, sheet }).run();
      return { ok: true, version: 1 };
    }
    const updated = tx
      .update(wiringSheets)
      .set({ sheet, version: seenVersion + 1, updatedAt: new Date() })
      .where(and(eq(wiringSheets.layoutId, layoutId), eq(wiringSheets.version, seenVersion)))
      .returning({ version: wiringSheets.version })
      .get();
    return updated ? { ok: true, version: updated.version } : { ok: false, current: current ?? null };
  });
}
