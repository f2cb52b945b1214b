import { insertRuns, type RunValues } from '@/db/queries/runs';
import { AppError, parseOrThrow, readJson } from '@/lib/errors';
import { handler } from '@/lib/http';
import { assertRunsValid, departureFromFastTime, loadSessionPlan, planRun, snapshotOf, timeFromWaypoints } from '@/lib/sessions/builder';
import { requireSession } from '@/lib/sessions/access';
import { assertTimetableEditable, auditRunChange, changeAnswer } from '@/lib/sessions/changes';
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
  const { session, member } = await requireSession(sessionId, 'edit');
  assertTimetableEditable(session);
  const body = parseOrThrow(createRunSchema, await readJson(request));
  const { rows, plan } = loadSessionPlan(session.id);
  let values: RunValues;
  if ('steps' in body) {
    values = { ...body };
  } else {
    const departS = departureFromFastTime(body.depart, plan.clock);
    const timed = timeFromWaypoints(rows, { ...body, departS });
    values = {
      trainId: body.trainId,
      cabId: body.cabId,
      operatorId: body.operatorId,
      departS: timed.departS,
      arriveS: timed.arriveS,
      speedKmh: body.speedKmh,
      note: body.note,
      steps: timed.steps,
    };
  }
  // Database ids are UUIDs, which never hold a dot: a draft id cannot name a stored run.
  const draftId = 'draft.new-run';
  assertRunsValid({ ...plan, runs: [...plan.runs, planRun({ ...values, id: draftId })] }, new Set([draftId]), session);
  const [id] = insertRuns(session.id, [values]);
  if (!id) throw new AppError('bad_request', 'The run could not be added.');
  auditRunChange(member, 'create', id, { sessionId: session.id });
  return Response.json(changeAnswer(session.id, { runId: id }), { status: 201 });
});

export { listRuns as GET, createRun as POST };
