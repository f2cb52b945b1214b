import 'server-only';
import { eq } from 'drizzle-orm';
import { getDb, writeTransaction } from '@/db';
import { auditLog, memberships, railways } from '@/db/schema';

/** Reads one railway. Callers have checked membership with requireMember first. */
export function getRailway(railwayId: string) {
  return getDb().select().from(railways).where(eq(railways.id, railwayId)).get();
}

/** Creates a railway with its creator as host, in one transaction. */
export function insertRailway(input: { name: string; timeZone: string; hostUserId: string }) {
  return writeTransaction((tx) => {
    const railway = tx.insert(railways).values({ name: input.name, timeZone: input.timeZone }).returning().get();
    tx.insert(memberships).values({ railwayId: railway.id, userId: input.hostUserId, role: 'host' }).run();
    tx.insert(auditLog)
      .values({ railwayId: railway.id, userId: input.hostUserId, action: 'create', entity: 'railway', entityId: railway.id })
      .run();
    return railway;
  });
}

/** Writes one audit entry: who changed what. */
export function recordAudit(entry: {
  railwayId: string | null;
  userId: string | null;
  action: string;
  entity: string;
  entityId?: string | null;
  detail?: Record<string, unknown>;
}): void {
  getDb().insert(auditLog).values(entry).run();
}
