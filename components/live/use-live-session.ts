'use client';

import { useCallback, useEffect, useRef, useState } from 'react';
import type { ClockReading } from '@/lib/planning';
import { readSessionClock } from '@/lib/planning/session-clock';
import { apiCall, errorMessage } from '@/lib/client/api';
import type { LiveMessage, LiveState } from '@/lib/live/types';

export type LiveMode = 'connecting' | 'live' | 'polling';
export type LiveFeedItem = { seq: number; summary: string; at: number };

/** Polls this often while the stream is cut. */
const POLL_MS = 2000;
/** Refreshes this often while streaming: predictions of overdue runs move with the clock. */
const REFRESH_MS = 20_000;

/**
 * The session day as it happens: the state from the event stream (numbered events, the browser
 * resumes with Last-Event-ID), polling the same route while the stream is cut.
 */
export function useLiveSession(sessionId: string, initial: LiveState) {
  const [state, setState] = useState(initial);
  const [mode, setMode] = useState<LiveMode>('connecting');
  const [feed, setFeed] = useState<LiveFeedItem[]>([]);
  const seqRef = useRef(initial.seq);
  // Server time minus this device's time, so every screen reads the same clock.
  const [offsetMs, setOffsetMs] = useState(0);

  const accept = useCallback((next: LiveState) => {
    if (next.seq < seqRef.current) return;
    seqRef.current = next.seq;
    setOffsetMs(next.clock.serverMs - Date.now());
    setState(next);
  }, []);
  const addToFeed = useCallback((items: LiveFeedItem[]) => {
    if (!items.length) return;
    setFeed((old) => {
      const seen = new Set(old.map((i) => i.seq));
      return [...items.filter((i) => i.summary && !seen.has(i.seq)).reverse(), ...old].slice(0, 12);
    });
  }, []);

  useEffect(() => {
    setOffsetMs(initial.clock.serverMs - Date.now());
  }, [initial.clock.serverMs]);

  const poll = useCallback(async () => {
    try {
      const body = await apiCall<{ seq: number; events: LiveFeedItem[]; state: LiveState }>('GET', `/api/sessions/${sessionId}/live?after=${seqRef.current}`, {
        headers: { accept: 'application/json' },
      });
      addToFeed(body.events);
      accept(body.state);
    } catch {
      // Offline for a moment: the next poll tries again.
    }
  }, [sessionId, accept, addToFeed]);

  useEffect(() => {
    let source: EventSource | null = null;
    let pollTimer: ReturnType<typeof setInterval> | null = null;
    let reopenTimer: ReturnType<typeof setTimeout> | null = null;
    let stopped = false;
    const startPolling = () => {
      setMode('polling');
      if (pollTimer === null) {
        pollTimer = setInterval(poll, POLL_MS);
        void poll();
      }
    };
    const stopPolling = () => {
      if (pollTimer !== null) clearInterval(pollTimer);
      pollTimer = null;
    };
    const open = () => {
      if (stopped) return;
      source = new EventSource(`/api/sessions/${sessionId}/live?after=${seqRef.current}`);
      source.addEventListener('open', () => {
        setMode('live');
        stopPolling();
      });
      source.addEventListener('live', (event) => {
        const message = JSON.parse((event as MessageEvent<string>).data) as LiveMessage;
        if (message.type !== 'hello') addToFeed([{ seq: message.seq, summary: message.summary, at: message.at }]);
        if (message.state) accept(message.state);
      });
      source.addEventListener('reload', () => void poll());
      source.addEventListener('error', () => {
        startPolling();
        // The browser retries by itself unless the answer was not a stream at all.
        if (source?.readyState === EventSource.CLOSED) {
          source.close();
          reopenTimer = setTimeout(open, 5000);
        }
      });
    };
    open();
    const refresh = setInterval(() => void poll(), REFRESH_MS);
    return () => {
      stopped = true;
      source?.close();
      stopPolling();
      clearInterval(refresh);
      if (reopenTimer) clearTimeout(reopenTimer);
    };
  }, [sessionId, poll, accept, addToFeed]);

  return { state, mode, feed, offsetMs, accept };
}

/** The shared clock read each second on this device, corrected to the server's time. */
export function useClockReading(state: LiveState, offsetMs: number): ClockReading {
  const read = useCallback(
    () => readSessionClock(state.clock.records, Date.now() + offsetMs, state.clock.clock),
    [state.clock.records, state.clock.clock, offsetMs],
  );
  const [reading, setReading] = useState(() => readSessionClock(state.clock.records, state.clock.serverMs, state.clock.clock));
  useEffect(() => {
    setReading(read());
    if (state.clock.state !== 'running') return;
    const timer = setInterval(() => setReading(read()), 250);
    return () => clearInterval(timer);
  }, [read, state.clock.state]);
  return reading;
}

/** Posts JSON to a live route and takes the state from the answer; returns an error message or null. */
export async function postLive(path: string, body: unknown, accept: (state: LiveState) => void): Promise<string | null> {
  try {
    const answer = await apiCall<{ state?: LiveState }>('POST', path, { body: { json: body } });
    if (answer?.state) accept(answer.state);
    return null;
  } catch (error) {
    return errorMessage(error);
  }
}
