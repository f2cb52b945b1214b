import { parseOrThrow, readJson } from '@/lib/errors';
import { handler } from '@/lib/http';
import { copyRunAsSeries } from '@/lib/runs/service';
import { runParamsSchema, seriesSchema } from './schema';

export const dynamic = 'force-dynamic';

/** Copies a run `count` times, each `everyFastMin` fast minutes after the one before, in one transaction. */
const createSeries = handler<{ sessionId: string; runId: string }>(async (request, { params }) => {
  const { sessionId, runId } = parseOrThrow(runParamsSchema, await params);
  const body = parseOrThrow(seriesSchema, await readJson(request));
  return Response.json(await copyRunAsSeries(sessionId, runId, body), { status: 201 });
});

export { createSeries as POST };
