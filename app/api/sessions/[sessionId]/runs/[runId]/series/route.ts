import { insertRuns, type RunValues } from '@/db/queries/runs';
import { notFound, parseOrThrow, readJson } from '@/lib/errors';
import { handler } from '@/lib/http';
import { assertRunsValid, loadSessionPlan, planRun } from '@/lib/sessions/builder';
import { requireSession } from '@/lib/sessions/access';
import { assertTimetableEditable, auditRunChange, changeAnswer } from '@/lib/sessions/changes';
import { runParamsSchema, seriesSchema } from './schema';

export const dynamic = 'force-dynamic';

/** Copies a run `count` times, each `everyFastMin` fast minutes after the one before, in one transaction. */
const createSeries = handler<{ sessionId: string; runId: string }>(async (request, { params }) => {
  const { sessionId, runId } = parseOrThrow(runParamsSchema, await params);
  const { session, member } = await requireSession(sessionId, 'edit');
  assertTimetableEditable(session);
  const body = parseOrThrow(seriesSchema, await readJson(request));
  const { rows, plan } = loadSessionPlan(session.id);
  const source = rows.runs.find((r) => r.id === runId);
  const sourcePlan = plan.runs.find((r) => r.id === runId);
  if (!source || !sourcePlan) throw notFound('That run');
  // A fast minute lasts 60 / ratio real seconds.
  const everyS = (body.everyFastMin * 60) / plan.clock.ratio;
  const copies: RunValues[] = Array.from({ length: body.count }, (_, i) => {
    const shift = everyS * (i + 1);
    return {
      trainId: source.trainId,
      cabId: source.cabId,
      operatorId: source.operatorId,
      departS: source.departS + shift,
      arriveS: source.arriveS + shift,
      speedKmh: source.speedKmh,
      note: source.note,
      steps: sourcePlan.steps.map((s) => ({ blockId: s.blockId, enterS: s.enterS + shift, exitS: s.exitS + shift })),
    };
  });
  const draftIds = copies.map((_, i) => `draft.copy-${i}`);
  assertRunsValid({ ...plan, runs: [...plan.runs, ...copies.map((c, i) => planRun({ ...c, id: draftIds[i]! }))] }, new Set(draftIds), session);
  const createdIds = insertRuns(session.id, copies);
  auditRunChange(member, 'create-series', runId, { sessionId: session.id, copies: createdIds.length, everyFastMin: body.everyFastMin });
  return Response.json(changeAnswer(session.id, { createdIds }), { status: 201 });
});

export { createSeries as POST };
