import { parseOrThrow } from '@/lib/errors';
import { handler } from '@/lib/http';
import { requireSession } from '@/lib/auth/sessions';
import { sessionControl } from '@/lib/sessions/control';
import { sessionParamsSchema } from './schema';

export const dynamic = 'force-dynamic';

/**
 * The session's control schedule as JSON (format "fishplate-control-schedule", version 1): per cab the
 * direction and PWM settings with ramps, per block its feeding cab and polarity, the interlock findings,
 * and per board of the wiring sheet whether its firmware fits. Planners and hosts only.
 */
const getControl = handler<{ sessionId: string }>(async (_request, { params }) => {
  const { sessionId } = parseOrThrow(sessionParamsSchema, await params);
  const { session } = await requireSession(sessionId, 'edit');
  const control = sessionControl(session);
  return Response.json(
    { ...control.schedule, boards: control.boards },
    { headers: { 'Content-Disposition': `inline; filename="session-${session.id}.control.json"`, 'Cache-Control': 'private, no-store' } },
  );
});

export { getControl as GET };
