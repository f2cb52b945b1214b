import { badRequest, parseOrThrow } from '@/lib/errors';
import { handler } from '@/lib/http';
import { requireSession } from '@/lib/auth/sessions';
import { controllerPy, sessionControl } from '@/lib/sessions/control';
import { controlQuerySchema, sessionParamsSchema } from '../schema';

export const dynamic = 'force-dynamic';

/** The gpiozero program for one 40-pin-header Linux board of the wiring (`?board=`). Planners and hosts only. */
const getController = handler<{ sessionId: string }>(async (request, { params }) => {
  const { sessionId } = parseOrThrow(sessionParamsSchema, await params);
  const board = new URL(request.url).searchParams.get('board');
  const query = parseOrThrow(controlQuerySchema, board === null ? {} : { board });
  const { session } = await requireSession(sessionId, 'edit');
  const control = sessionControl(session);
  let program;
  try {
    program = controllerPy(session, control, query.board);
  } catch (error) {
    if (error instanceof RangeError) throw badRequest(error.message);
    throw error;
  }
  return new Response(program.text, {
    headers: {
      'Content-Type': 'text/x-python; charset=utf-8',
      'Content-Disposition': `attachment; filename="${program.fileName}"`,
      'Cache-Control': 'private, no-store',
    },
  });
});

export { getController as GET };
