import { parseOrThrow } from '@/lib/errors';
import { handler } from '@/lib/http';
import { livePoll, liveStream } from '@/lib/live/stream';
import { requireSession } from '@/lib/auth/sessions';
import { livePollSchema, sessionParamsSchema } from './schema';

export const dynamic = 'force-dynamic';

/**
 * The session day as it happens, for every member who may read the session: an event stream when
 * asked for `text/event-stream` (catch-up with Last-Event-ID), else the events after `?after=N`
 * and the current state as JSON (the polling fallback).
 */
const live = handler<{ sessionId: string }>(async (request, { params }) => {
  const { sessionId } = parseOrThrow(sessionParamsSchema, await params);
  const { session } = await requireSession(sessionId, 'view');
  if ((request.headers.get('accept') ?? '').includes('text/event-stream')) return liveStream(session.id, request);
  const { after } = parseOrThrow(livePollSchema, Object.fromEntries(new URL(request.url).searchParams));
  return livePoll(session.id, after);
});

export { live as GET };
