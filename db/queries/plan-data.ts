import 'server-only';
import { asc, eq, inArray, sql } from 'drizzle-orm';
import { preparedStatements } from '@/db';
import * as t from '@/db/schema';

// Every builder request and every check reads these rows, so each query is built and compiled once.
const statements = preparedStatements((db) => {
  const layoutId = sql.placeholder('layoutId');
  const sessionId = sql.placeholder('sessionId');
  const railwayId = sql.placeholder('railwayId');
  return {
    layout: db.select().from(t.layouts).where(eq(t.layouts.id, layoutId)).prepare(),
    blocks: db.select().from(t.blocks).where(eq(t.blocks.layoutId, layoutId)).orderBy(asc(t.blocks.positionMm), asc(t.blocks.name)).prepare(),
    links: db.select().from(t.links).where(eq(t.links.layoutId, layoutId)).prepare(),
    supplies: db.select().from(t.supplies).where(eq(t.supplies.layoutId, layoutId)).orderBy(asc(t.supplies.name)).prepare(),
    drivers: db.select().from(t.drivers).where(eq(t.drivers.layoutId, layoutId)).orderBy(asc(t.drivers.name)).prepare(),
    cabs: db.select().from(t.cabs).where(eq(t.cabs.layoutId, layoutId)).orderBy(asc(t.cabs.name)).prepare(),
    locomotives: db.select().from(t.locomotives).where(eq(t.locomotives.layoutId, layoutId)).orderBy(asc(t.locomotives.name)).prepare(),
    trains: db.select().from(t.trains).where(eq(t.trains.layoutId, layoutId)).orderBy(asc(t.trains.name)).prepare(),
    consists: db
      .select()
      .from(t.trainLocomotives)
      .where(inArray(t.trainLocomotives.trainId, db.select({ id: t.trains.id }).from(t.trains).where(eq(t.trains.layoutId, layoutId))))
      .orderBy(asc(t.trainLocomotives.position))
      .prepare(),
    session: db.select().from(t.sessions).where(eq(t.sessions.id, sessionId)).prepare(),
    runs: db.select().from(t.runs).where(eq(t.runs.sessionId, sessionId)).orderBy(asc(t.runs.departS), asc(t.runs.id)).prepare(),
    steps: db
      .select()
      .from(t.runSteps)
      .where(inArray(t.runSteps.runId, db.select({ id: t.runs.id }).from(t.runs).where(eq(t.runs.sessionId, sessionId))))
      .orderBy(asc(t.runSteps.runId), asc(t.runSteps.position))
      .prepare(),
    operators: db
      .select({ id: t.users.id, name: t.users.name })
      .from(t.memberships)
      .innerJoin(t.users, eq(t.users.id, t.memberships.userId))
      .where(eq(t.memberships.railwayId, railwayId))
      .orderBy(asc(t.users.name))
      .prepare(),
  };
});

/** Everything a layout holds: track, power and rolling stock. */
export function loadLayoutRows(layoutId: string) {
  const q = statements();
  const values = { layoutId };
  return {
    layout: q.layout.get(values),
    blocks: q.blocks.all(values),
    links: q.links.all(values),
    supplies: q.supplies.all(values),
    drivers: q.drivers.all(values),
    cabs: q.cabs.all(values),
    locomotives: q.locomotives.all(values),
    trains: q.trains.all(values),
    consists: q.consists.all(values),
  };
}

/** A session with its layout rows, its runs and steps, and the railway's members as operators. */
export function loadSessionRows(sessionId: string) {
  const q = statements();
  const session = q.session.get({ sessionId });
  if (!session) return undefined;
  return {
    session,
    ...loadLayoutRows(session.layoutId),
    runs: q.runs.all({ sessionId }),
    steps: q.steps.all({ sessionId }),
    operators: q.operators.all({ railwayId: session.railwayId }),
  };
}
