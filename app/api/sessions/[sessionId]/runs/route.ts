import { parseOrThrow, readJson } from '@/lib/errors';
import { handler } from '@/lib/http';
import { addRun } from '@/lib/runs/service';
import { requireSession } from '@/lib/auth/sessions';
import { snapshotOf } from '@/lib/sessions/timetable';
import { createRunSchema, sessionParamsSchema } from './schema';

export const dynamic = 'force-dynamic';

type Params = { sessionId: string };

/** The session's runs with the engine's findings and load profile. */
const listRuns = handler<Params>(async (_request, { params }) => {
  const { sessionId } = parseOrThrow(sessionParamsSchema, await params);
  const { session } = await requireSession(sessionId, 'view');
  return Response.json(snapshotOf(session.id));
});

/**
 * Adds a run: from a departure on the fast clock, blocks picked in order (joined by the shortest
 * route) and a scale speed, timed by timeRun; or given step by step. Answers 201 with the
 * re-checked session.
 */
const createRun = handler<Params>(async (request, { params }) => {
  const { sessionId } = parseOrThrow(sessionParamsSchema, await params);
  const body = parseOrThrow(createRunSchema, await readJson(request));
  return Response.json(await addRun(sessionId, body), { status: 201 });
});

export { listRuns as GET, createRun as POST };
