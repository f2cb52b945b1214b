import { parseOrThrow, readJson } from '@/lib/errors';
import { handler } from '@/lib/http';
import { applyMoves } from '@/lib/runs/retime';
import { sessionParamsSchema, undoRetimeSchema } from './schema';

export const dynamic = 'force-dynamic';

/** Takes a retime back: the `undo` moves a retime answered with, at the versions it left. */
const undo = handler<{ sessionId: string }>(async (request, { params }) => {
  const { sessionId } = parseOrThrow(sessionParamsSchema, await params);
  const { moves } = parseOrThrow(undoRetimeSchema, await readJson(request));
  return Response.json(await applyMoves(sessionId, moves, 'undo-retime'));
});

export { undo as POST };
