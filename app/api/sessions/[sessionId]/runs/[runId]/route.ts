import { deleteRun, updateRun, type RunPatch } from '@/db/queries/runs';
import { conflict, notFound, parseOrThrow, readJson } from '@/lib/errors';
import { handler } from '@/lib/http';
import { assertRunsValid, departureFromFastTime, loadSessionPlan, timeFromWaypoints } from '@/lib/sessions/builder';
import { requireSession } from '@/lib/sessions/access';
import { assertTimetableEditable, auditRunChange, changeAnswer } from '@/lib/sessions/changes';
import { deleteRunQuerySchema, runParamsSchema, updateRunSchema } from './schema';

export const dynamic = 'force-dynamic';

type Params = { sessionId: string; runId: string };

/**
 * Edits a run: train, cab, operator, note; and one of a new departure (the whole run moves), a new
 * timing from route and speed, or step times given by hand. A stale version answers 409 with the
 * run as it is now; nothing changes.
 */
const patchRun = handler<Params>(async (request, { params }) => {
  const { sessionId, runId } = parseOrThrow(runParamsSchema, await params);
  const { session, member } = await requireSession(sessionId, 'edit');
  assertTimetableEditable(session);
  const body = parseOrThrow(updateRunSchema, await readJson(request));
  const { rows, plan } = loadSessionPlan(session.id);
  const stored = rows.runs.find((r) => r.id === runId);
  const current = plan.runs.find((r) => r.id === runId);
  if (!stored || !current) throw notFound('That run');
  if (stored.version !== body.version) {
    throw conflict({ ...stored, steps: current.steps });
  }

  const patch: RunPatch = {};
  if (body.trainId !== undefined) patch.trainId = body.trainId;
  if (body.cabId !== undefined) patch.cabId = body.cabId;
  if (body.operatorId !== undefined) patch.operatorId = body.operatorId;
  if (body.note !== undefined) patch.note = body.note;
  const newDepart = body.depart !== undefined ? departureFromFastTime(body.depart, plan.clock) : body.departS;
  if (newDepart !== undefined) {
    const delta = newDepart - current.departS;
    patch.departS = current.departS + delta;
    patch.arriveS = current.arriveS + delta;
    patch.steps = current.steps.map((s) => ({ blockId: s.blockId, enterS: s.enterS + delta, exitS: s.exitS + delta }));
  } else if (body.timing) {
    const timed = timeFromWaypoints(rows, { ...body.timing, trainId: body.trainId ?? current.trainId, departS: current.departS });
    patch.departS = timed.departS;
    patch.arriveS = timed.arriveS;
    patch.steps = timed.steps;
    patch.speedKmh = body.timing.speedKmh;
  } else if (body.steps) {
    patch.departS = body.steps.departS;
    patch.arriveS = body.steps.arriveS;
    patch.steps = body.steps.steps;
  }

  const edited = {
    ...current,
    ...(patch.trainId !== undefined ? { trainId: patch.trainId } : {}),
    ...(patch.cabId !== undefined ? { cabId: patch.cabId } : {}),
    ...(patch.operatorId !== undefined ? { operatorId: patch.operatorId } : {}),
    ...(patch.departS !== undefined ? { departS: patch.departS, arriveS: patch.arriveS!, steps: patch.steps! } : {}),
  };
  assertRunsValid({ ...plan, runs: plan.runs.map((r) => (r.id === runId ? edited : r)) }, new Set([runId]), session);
  const result = updateRun(session.id, runId, body.version, patch);
  if ('missing' in result) throw notFound('That run');
  if ('stale' in result) throw conflict(result.stale);
  auditRunChange(member, 'update', runId, { sessionId: session.id, fields: Object.keys(patch) });
  return Response.json(changeAnswer(session.id, { runId }));
});

/** Deletes a run at the version the caller saw; the answer carries it, so the builder can put it back. */
const removeRun = handler<Params>(async (request, { params }) => {
  const { sessionId, runId } = parseOrThrow(runParamsSchema, await params);
  const { session, member } = await requireSession(sessionId, 'edit');
  assertTimetableEditable(session);
  const { version } = parseOrThrow(deleteRunQuerySchema, Object.fromEntries(new URL(request.url).searchParams));
  const result = deleteRun(session.id, runId, version);
  if ('missing' in result) throw notFound('That run');
  if ('stale' in result) throw conflict(result.stale);
  auditRunChange(member, 'delete', runId, { sessionId: session.id });
  return Response.json(changeAnswer(session.id, { deleted: result.deleted }));
});

export { patchRun as PATCH, removeRun as DELETE };
