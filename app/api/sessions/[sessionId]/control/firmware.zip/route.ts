import { badRequest, parseOrThrow } from '@/lib/errors';
import { handler } from '@/lib/http';
import { requireSession } from '@/lib/auth/sessions';
import { firmwareZip, sessionControl } from '@/lib/sessions/control';
import { controlQuerySchema, sessionParamsSchema } from '../schema';

export const dynamic = 'force-dynamic';

/** C sources, the schedule header and a Makefile for one AVR board of the wiring (`?board=`). Planners and hosts only. */
const getFirmware = handler<{ sessionId: string }>(async (request, { params }) => {
  const { sessionId } = parseOrThrow(sessionParamsSchema, await params);
  const board = new URL(request.url).searchParams.get('board');
  const query = parseOrThrow(controlQuerySchema, board === null ? {} : { board });
  const { session } = await requireSession(sessionId, 'edit');
  const control = sessionControl(session);
  let zip;
  try {
    zip = firmwareZip(session, control, query.board);
  } catch (error) {
    if (error instanceof RangeError) throw badRequest(error.message);
    throw error;
  }
  return new Response(Buffer.from(zip.bytes), {
    headers: {
      'Content-Type': 'application/zip',
      'Content-Disposition': `attachment; filename="${zip.fileName}"`,
      'Cache-Control': 'private, no-store',
    },
  });
});

export { getFirmware as GET };
