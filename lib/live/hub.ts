import 'server-only';
import { lastLiveSeq, liveEventsAfter } from '@/db/queries/live';
import type { LiveEvent } from '@/db/schema';
import { liveStateJson } from '@/lib/live/state';

/** One open stream: where it has read up to, and how to write to it. */
export type LiveSubscriber = { lastSeq: number; write: (chunk: string) => void };

/** Missed events sent to one client at once; beyond this it is told to reload. */
export const CATCH_UP_LIMIT = 500;

type Hub = { subscribers: Map<string, Set<LiveSubscriber>>; pending: Set<string> };
// One process serves every stream, so the subscribers live in memory (kept on globalThis so a
// development reload keeps one hub).
const globalForHub = globalThis as unknown as { fishplateLiveHub?: Hub };
const hub: Hub = (globalForHub.fishplateLiveHub ??= { subscribers: new Map(), pending: new Set() });

export function subscribeLive(sessionId: string, subscriber: LiveSubscriber): () => void {
  let set = hub.subscribers.get(sessionId);
  if (!set) hub.subscribers.set(sessionId, (set = new Set()));
  set.add(subscriber);
  return () => {
    set.delete(subscriber);
    if (set.size === 0 && hub.subscribers.get(sessionId) === set) hub.subscribers.delete(sessionId);
  };
}

export function liveSubscriberCount(): number {
  let n = 0;
  for (const set of hub.subscribers.values()) n += set.size;
  return n;
}

/** The Server-Sent Events frame of one event (RFC-less but WHATWG HTML §9.2 "server-sent events": id, event, data lines). */
export function eventFrame(event: Pick<LiveEvent, 'seq' | 'type' | 'summary' | 'at'>, stateJson: string | null): string {
  const head = JSON.stringify({ seq: event.seq, type: event.type, summary: event.summary, at: event.at.getTime() });
  const data = stateJson === null ? head : `${head.slice(0, -1)},"state":${stateJson}}`;
  return `id: ${event.seq}\nevent: live\ndata: ${data}\n\n`;
}

/**
 * Everything a client that has read up to `afterSeq` has missed, as frames: each missed event in
 * order, the last one carrying the current state. When it has missed more than CATCH_UP_LIMIT, the
 * frames start with a `reload` event (the state it then gets is complete anyway).
 */
export function catchUpFrames(sessionId: string, afterSeq: number, stateJson: string): { frames: string; lastSeq: number } {
  const events = liveEventsAfter(sessionId, afterSeq, CATCH_UP_LIMIT + 1);
  const tooMany = events.length > CATCH_UP_LIMIT;
  const shown = tooMany ? events.slice(-CATCH_UP_LIMIT) : events;
  let frames = tooMany ? 'event: reload\ndata: {}\n\n' : '';
  shown.forEach((event, i) => {
    frames += eventFrame(event, i === shown.length - 1 ? stateJson : null);
  });
  return { frames, lastSeq: shown.at(-1)?.seq ?? afterSeq };
}

/**
 * Tells every open stream of the session what changed. Several changes in the same tick are sent
 * together; the state is built and written to JSON once for all of them.
 */
export function publishLive(sessionId: string): void {
  if (!hub.subscribers.has(sessionId) || hub.pending.has(sessionId)) return;
  hub.pending.add(sessionId);
  setImmediate(() => {
    hub.pending.delete(sessionId);
    const set = hub.subscribers.get(sessionId);
    if (!set || set.size === 0) return;
    try {
      deliver(sessionId, set);
    } catch (error) {
      console.error('live: could not publish', error);
    }
  });
}

function deliver(sessionId: string, set: Set<LiveSubscriber>): void {
  const last = lastLiveSeq(sessionId);
  const stateJson = liveStateJson(sessionId);
  // Most clients have read the same events: build each catch-up once.
  const byLastSeq = new Map<number, string>();
  for (const subscriber of set) {
    if (subscriber.lastSeq >= last) continue;
    let frames = byLastSeq.get(subscriber.lastSeq);
    if (frames === undefined) {
      frames = catchUpFrames(sessionId, subscriber.lastSeq, stateJson).frames;
      byLastSeq.set(subscriber.lastSeq, frames);
    }
    subscriber.lastSeq = last;
    try {
      subscriber.write(frames);
    } catch {
      // A closed stream is removed by its own cancel handler.
    }
  }
}
