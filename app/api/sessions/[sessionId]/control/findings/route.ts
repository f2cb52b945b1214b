import { parseOrThrow } from '@/lib/errors';
import { handler } from '@/lib/http';
import { requireSession } from '@/lib/auth/sessions';
import { sessionControlFindings } from '@/lib/sessions/control';
import { sessionParamsSchema } from '../schema';

export const dynamic = 'force-dynamic';

/**
 * The control schedule's findings (interlocks held or broken, runs left out) for the timetable's
 * findings panel; `wired: false` when the layout has no wiring sheet. Planners and hosts only.
 */
const getControlFindings = handler<{ sessionId: string }>(async (_request, { params }) => {
  const { sessionId } = parseOrThrow(sessionParamsSchema, await params);
  const { session } = await requireSession(sessionId, 'edit');
  return Response.json(sessionControlFindings(session), { headers: { 'Cache-Control': 'private, no-store' } });
});

export { getControlFindings as GET };
