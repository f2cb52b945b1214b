import 'server-only';
import { lastLiveSeq, liveEventsAfter } from '@/db/queries/live';
import { AppError } from '@/lib/errors';
import { CATCH_UP_LIMIT, catchUpFrames, eventFrame, liveSubscriberCount, subscribeLive } from '@/lib/live/hub';
import { liveStateJson } from '@/lib/live/state';

/** Open streams this process serves at most (a club evening has a few dozen screens). */
export const MAX_STREAMS = 1000;
/** A comment line this often keeps proxies from closing an idle stream. */
const HEARTBEAT_MS = 15_000;

/** The number in a Last-Event-ID header (or `?after=`), or null when there is none or it is not one. */
export function lastEventIdOf(request: Request): number | null {
  const text = request.headers.get('last-event-id') ?? new URL(request.url).searchParams.get('after');
  if (text === null || !/^\d{1,15}$/.test(text.trim())) return null;
  return Number(text.trim());
}

/**
 * The session's event stream (Server-Sent Events, WHATWG HTML "Server-sent events"): a reconnecting
 * client (Last-Event-ID) first gets every event it missed, in order; a new one gets the current
 * state as a `hello` event numbered with the last event. Then each change as it happens.
 */
export function liveStream(sessionId: string, request: Request): Response {
  if (liveSubscriberCount() >= MAX_STREAMS) throw new AppError('rate_limited', 'Too many open live screens; the page will poll instead.', { retryAfterS: 5 });
  const encoder = new TextEncoder();
  let cleanup = () => {};
  const stream = new ReadableStream<Uint8Array>({
    start(controller) {
      const write = (chunk: string) => controller.enqueue(encoder.encode(chunk));
      const stateJson = liveStateJson(sessionId);
      const current = lastLiveSeq(sessionId);
      const after = lastEventIdOf(request);
      let lastSeq = current;
      let frames = 'retry: 2000\n\n';
      if (after !== null && after < current) {
        const catchUp = catchUpFrames(sessionId, after, stateJson);
        frames += catchUp.frames;
        lastSeq = catchUp.lastSeq;
      } else {
        frames += eventFrame({ seq: current, type: 'hello', summary: '', at: new Date() }, stateJson);
      }
      write(frames);
      // Subscribed in the same tick as the catch-up was read, so no event falls between them.
      const unsubscribe = subscribeLive(sessionId, { lastSeq, write });
      const heartbeat = setInterval(() => {
        try {
          write(': ping\n\n');
        } catch {
          cleanup();
        }
      }, HEARTBEAT_MS);
      let closed = false;
      cleanup = () => {
        if (closed) return;
        closed = true;
        clearInterval(heartbeat);
        unsubscribe();
        try {
          controller.close();
        } catch {
          // already closed
        }
      };
      request.signal.addEventListener('abort', () => cleanup(), { once: true });
    },
    cancel() {
      cleanup();
    },
  });
  return new Response(stream, {
    headers: {
      'content-type': 'text/event-stream; charset=utf-8',
      'cache-control': 'no-cache, no-transform',
      connection: 'keep-alive',
      // Tells a proxy in front (nginx) not to buffer the stream.
      'x-accel-buffering': 'no',
    },
  });
}

/** The polling answer: the events after `after` (at most CATCH_UP_LIMIT) and the current state. */
export function livePoll(sessionId: string, after: number): Response {
  const stateJson = liveStateJson(sessionId);
  const events = liveEventsAfter(sessionId, after, CATCH_UP_LIMIT).map((e) => ({ seq: e.seq, type: e.type, summary: e.summary, at: e.at.getTime() }));
  const body = `{"seq":${lastLiveSeq(sessionId)},"events":${JSON.stringify(events)},"state":${stateJson}}`;
  return new Response(body, { headers: { 'content-type': 'application/json', 'cache-control': 'no-store' } });
}
