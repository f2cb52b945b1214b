import { parseOrThrow, readJson } from '@/lib/errors';
import { handler } from '@/lib/http';
import { editRun, removeRun } from '@/lib/runs/service';
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
  const body = parseOrThrow(updateRunSchema, await readJson(request));
  return Response.json(await editRun(sessionId, runId, body));
});

/** Deletes a run at the version the caller saw; the answer carries it, so the builder can put it back. */
const deleteRunAtVersion = handler<Params>(async (request, { params }) => {
  const { sessionId, runId } = parseOrThrow(runParamsSchema, await params);
  const { version } = parseOrThrow(deleteRunQuerySchema, Object.fromEntries(new URL(request.url).searchParams));
  return Response.json(await removeRun(sessionId, runId, version));
});

export { patchRun as PATCH, deleteRunAtVersion as DELETE };
