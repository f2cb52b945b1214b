import { parseOrThrow, readJson } from '@/lib/errors';
import { handler } from '@/lib/http';
import { publishLive } from '@/lib/live/hub';
import { makeReport, runReportHistory } from '@/lib/live/reports';
import { liveStateJson } from '@/lib/live/state';
import { requireSession } from '@/lib/auth/sessions';
import { assertTimetableEditable } from '@/lib/sessions/changes';
import { reportSchema, runParamsSchema } from './schema';

export const dynamic = 'force-dynamic';

/** A run departed, arrived or stopped (the run's operator, a planner or the host); answers with the live state. */
const report = handler<{ sessionId: string; runId: string }>(async (request, { params }) => {
  const { sessionId, runId } = parseOrThrow(runParamsSchema, await params);
  const { session, member } = await requireSession(sessionId, 'view');
  assertTimetableEditable(session);
  const input = parseOrThrow(reportSchema, await readJson(request, 10_000));
  const { report: stored, live } = makeReport(session, member, runId, input);
  publishLive(session.id);
  // The state built here is the one the streams get (liveStateJson keeps it for the same event).
  const head = JSON.stringify({ report: { id: stored.id, kind: stored.kind, reason: stored.reason, sessionS: stored.sessionS, reportedAt: stored.reportedAt.getTime() }, seq: live.seq });
  return new Response(`${head.slice(0, -1)},"state":${liveStateJson(session.id)}}`, { status: 201, headers: { 'content-type': 'application/json' } });
});

/** Who reported what for the run, corrections included (the run's operator, a planner or the host). */
const history = handler<{ sessionId: string; runId: string }>(async (_request, { params }) => {
  const { sessionId, runId } = parseOrThrow(runParamsSchema, await params);
  const { session, member } = await requireSession(sessionId, 'view');
  return Response.json(runReportHistory(session, member, runId), { headers: { 'cache-control': 'no-store' } });
});

export { report as POST, history as GET };
