import { sql } from 'drizzle-orm';
import { getDb } from '@/db';

export const dynamic = 'force-dynamic';

/** Liveness and database check; public, reveals nothing about any railway. */
export function GET() {
  try {
    getDb().get(sql`select 1`);
    return Response.json({ status: 'ok', database: 'ok', time: new Date().toISOString() });
  } catch {
    return Response.json({ status: 'error', database: 'unavailable' }, { status: 503 });
  }
}
