import { parseOrThrow, readJson } from '@/lib/errors';
import { handler } from '@/lib/http';
import { requireSession } from '@/lib/auth/sessions';
import { applyMoves, retimeSuggestions } from '@/lib/runs/retime';
import { retimeMovesSchema, sessionParamsSchema } from './schema';

export const dynamic = 'force-dynamic';

type Params = { sessionId: string };

/** The engine's proposed delays (suggestRetime) as old and new departures; changes nothing. */
const suggest = handler<Params>(async (_request, { params }) => {
  const { sessionId } = parseOrThrow(sessionParamsSchema, await params);
  const { session } = await requireSession(sessionId, 'edit');
  return Response.json({ moves: retimeSuggestions(session.id) });
});

/** Applies delays (usually the suggested ones) in one transaction; answers with the moves that undo them. */
const apply = handler<Params>(async (request, { params }) => {
  const { sessionId } = parseOrThrow(sessionParamsSchema, await params);
  const { moves } = parseOrThrow(retimeMovesSchema, await readJson(request));
  return Response.json(await applyMoves(sessionId, moves, 'retime'));
});

export { suggest as GET, apply as POST };
