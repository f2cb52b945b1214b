import { parseOrThrow, readJson } from '@/lib/errors';
import { handler } from '@/lib/http';
import { publishLive } from '@/lib/live/hub';
import { applyRepair, assertHost } from '@/lib/live/repair';
import { buildLiveState } from '@/lib/live/state';
import { requireSession } from '@/lib/auth/sessions';
import { assertTimetableEditable } from '@/lib/sessions/changes';
import { repairSchema, sessionParamsSchema } from './schema';

export const dynamic = 'force-dynamic';

type Params = { sessionId: string };

/** The repair the engine proposes now for the runs not yet departed (host); changes nothing. */
const propose = handler<Params>(async (_request, { params }) => {
  const { sessionId } = parseOrThrow(sessionParamsSchema, await params);
  const { session, member } = await requireSession(sessionId, 'edit');
  assertHost(member);
  return Response.json({ moves: buildLiveState(session.id).repair });
});

/** Applies the proposed repair (host, one confirmation): `{ moves }` as proposed; 409 when it has changed since. */
const apply = handler<Params>(async (request, { params }) => {
  const { sessionId } = parseOrThrow(sessionParamsSchema, await params);
  const { session, member } = await requireSession(sessionId, 'edit');
  assertHost(member);
  assertTimetableEditable(session);
  const input = parseOrThrow(repairSchema, await readJson(request, 200_000));
  const live = applyRepair(session, member, input);
  publishLive(session.id);
  return Response.json({ seq: live.seq, state: buildLiveState(session.id) });
});

export { propose as GET, apply as POST };
