import { listClockEvents } from '@/db/queries/live';
import { parseOrThrow, readJson } from '@/lib/errors';
import { handler } from '@/lib/http';
import { applyClockAction, clockView } from '@/lib/live/clock';
import { publishLive } from '@/lib/live/hub';
import { requireSession } from '@/lib/auth/sessions';
import { assertTimetableEditable } from '@/lib/sessions/changes';
import { clockActionSchema, sessionParamsSchema } from './schema';

export const dynamic = 'force-dynamic';

/** Start, pause, resume or set the session's shared fast clock (host or planner). */
const act = handler<{ sessionId: string }>(async (request, { params }) => {
  const { sessionId } = parseOrThrow(sessionParamsSchema, await params);
  const { session, member } = await requireSession(sessionId, 'edit');
  assertTimetableEditable(session);
  const input = parseOrThrow(clockActionSchema, await readJson(request, 10_000));
  const { live } = applyClockAction(session, member, input);
  publishLive(session.id);
  return Response.json({ seq: live.seq, clock: clockView(session, listClockEvents(session.id)) });
});

export { act as POST };
