import { replaceSessionRuns } from '@/db/queries/runs';
import { parseOrThrow, readJson } from '@/lib/errors';
import { handler } from '@/lib/http';
import { assertRunsValid, loadSessionPlan } from '@/lib/sessions/builder';
import { requireSession } from '@/lib/sessions/access';
import { assertTimetableEditable, auditRunChange, changeAnswer } from '@/lib/sessions/changes';
import { PLAN_MAX_BYTES, postPlanSchema, sessionParamsSchema } from './schema';

export const dynamic = 'force-dynamic';

type Params = { sessionId: string };

/** The session as the engine's plan interchange, version 1. */
const getPlan = handler<Params>(async (_request, { params }) => {
  const { sessionId } = parseOrThrow(sessionParamsSchema, await params);
  const { session } = await requireSession(sessionId, 'view');
  const { plan } = loadSessionPlan(session.id);
  return Response.json(plan, {
    headers: { 'Content-Disposition': `inline; filename="session-${session.id}.plan.json"` },
  });
});

/**
 * Replaces the session's runs with the runs of a posted plan, in one transaction. The plan must be
 * valid on its own and its runs must name this session's layout (trains, cabs, blocks) and the
 * railway's members; its clock and rules are not taken over (the session settings hold those).
 */
const postPlan = handler<Params>(async (request, { params }) => {
  const { sessionId } = parseOrThrow(sessionParamsSchema, await params);
  const { session, member } = await requireSession(sessionId, 'edit');
  assertTimetableEditable(session);
  const posted = parseOrThrow(postPlanSchema, await readJson(request, PLAN_MAX_BYTES));
  const { rows, plan } = loadSessionPlan(session.id);
  assertRunsValid({ ...plan, runs: posted.runs }, new Set(posted.runs.map((r) => r.id)), session);
  const speedOf = new Map(rows.runs.map((r) => [r.id, { speedKmh: r.speedKmh, note: r.note }]));
  replaceSessionRuns(
    session.id,
    posted.runs.map((r) => ({
      id: r.id,
      trainId: r.trainId,
      cabId: r.cabId,
      operatorId: r.operatorId,
      departS: r.departS,
      arriveS: r.arriveS,
      speedKmh: speedOf.get(r.id)?.speedKmh ?? null,
      note: speedOf.get(r.id)?.note ?? '',
      steps: r.steps,
    })),
  );
  auditRunChange(member, 'replace-runs', null, { sessionId: session.id, runs: posted.runs.length });
  return Response.json(changeAnswer(session.id));
});

export { getPlan as GET, postPlan as POST };
