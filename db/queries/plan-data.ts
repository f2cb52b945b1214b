import 'server-only';
import { asc, eq, inArray } from 'drizzle-orm';
import { getDb } from '@/db';
import * as t from '@/db/schema';

/** Everything a layout holds: track, power and rolling stock. */
export function loadLayoutRows(layoutId: string) {
  const db = getDb();
  const trains = db.select().from(t.trains).where(eq(t.trains.layoutId, layoutId)).orderBy(asc(t.trains.name)).all();
  const trainIds = trains.map((r) => r.id);
  return {
    layout: db.select().from(t.layouts).where(eq(t.layouts.id, layoutId)).get(),
    blocks: db.select().from(t.blocks).where(eq(t.blocks.layoutId, layoutId)).orderBy(asc(t.blocks.positionMm), asc(t.blocks.name)).all(),
    links: db.select().from(t.links).where(eq(t.links.layoutId, layoutId)).all(),
    supplies: db.select().from(t.supplies).where(eq(t.supplies.layoutId, layoutId)).orderBy(asc(t.supplies.name)).all(),
    drivers: db.select().from(t.drivers).where(eq(t.drivers.layoutId, layoutId)).orderBy(asc(t.drivers.name)).all(),
    cabs: db.select().from(t.cabs).where(eq(t.cabs.layoutId, layoutId)).orderBy(asc(t.cabs.name)).all(),
    locomotives: db.select().from(t.locomotives).where(eq(t.locomotives.layoutId, layoutId)).orderBy(asc(t.locomotives.name)).all(),
    trains,
    consists: trainIds.length
      ? db.select().from(t.trainLocomotives).where(inArray(t.trainLocomotives.trainId, trainIds)).orderBy(asc(t.trainLocomotives.position)).all()
      : [],
  };
}

/** A session with its layout rows, its runs and steps, and the railway's members as operators. */
export function loadSessionRows(sessionId: string) {
  const db = getDb();
  const session = db.select().from(t.sessions).where(eq(t.sessions.id, sessionId)).get();
  if (!session) return undefined;
  const runs = db.select().from(t.runs).where(eq(t.runs.sessionId, sessionId)).orderBy(asc(t.runs.departS), asc(t.runs.id)).all();
  const runIds = runs.map((r) => r.id);
  const steps = runIds.length
    ? db.select().from(t.runSteps).where(inArray(t.runSteps.runId, runIds)).orderBy(asc(t.runSteps.runId), asc(t.runSteps.position)).all()
    : [];
  const operators = db
    .select({ id: t.users.id, name: t.users.name })
    .from(t.memberships)
    .innerJoin(t.users, eq(t.users.id, t.memberships.userId))
    .where(eq(t.memberships.railwayId, session.railwayId))
    .orderBy(asc(t.users.name))
    .all();
  return { session, ...loadLayoutRows(session.layoutId), runs, steps, operators };
}
