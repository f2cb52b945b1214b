import { parseOrThrow, readJson } from '@/lib/errors';
import { handler } from '@/lib/http';
import { requireSession } from '@/lib/sessions/access';
import { assertTimetableEditable } from '@/lib/sessions/changes';
import { applyMoves } from '@/lib/sessions/retime';
import { sessionParamsSchema, undoRetimeSchema } from './schema';

export const dynamic = 'force-dynamic';

/** Takes a retime back: the `undo` moves a retime answered with, at the versions it left. */
const undo = handler<{ sessionId: string }>(async (request, { params }) => {
  const { sessionId } = parseOrThrow(sessionParamsSchema, await params);
  const { session, member } = await requireSession(sessionId, 'edit');
  assertTimetableEditable(session);
  const { moves } = parseOrThrow(undoRetimeSchema, await readJson(request));
  return Response.json(applyMoves(session, member, moves, 'undo-retime'));
});

export { undo as POST };
