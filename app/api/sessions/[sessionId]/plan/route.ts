import { parseOrThrow, readJson } from '@/lib/errors';
import { handler } from '@/lib/http';
import { exportSessionPlan, replaceRunsFromPlan } from '@/lib/runs/service';
import { PLAN_MAX_BYTES, postPlanSchema, sessionParamsSchema } from './schema';

export const dynamic = 'force-dynamic';

type Params = { sessionId: string };

/** The session as the engine's plan interchange, version 2 (each run with its speed and note beside it). */
const getPlan = handler<Params>(async (_request, { params }) => {
  const { sessionId } = parseOrThrow(sessionParamsSchema, await params);
  const { session, plan } = await exportSessionPlan(sessionId);
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
  const posted = parseOrThrow(postPlanSchema, await readJson(request, PLAN_MAX_BYTES));
  return Response.json(await replaceRunsFromPlan(sessionId, posted));
});

export { getPlan as GET, postPlan as POST };
