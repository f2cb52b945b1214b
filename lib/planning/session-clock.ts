import { realToFast } from './clock';
import type { FastClock } from './schema';

export type ClockActionName = 'start' | 'pause' | 'resume' | 'set';

/** One stored clock action: when it happened (server wall time) and, for start and set, the session time it reads from. */
export interface ClockRecord {
  action: ClockActionName;
  atMs: number;
  /** Session real seconds (plan time) the clock reads from after a start or set; null for pause and resume. */
  sessionS: number | null;
}

export type ClockState = 'not-started' | 'running' | 'paused';

export interface ClockReading {
  state: ClockState;
  /** Session real seconds now: the plan's time axis (run departS, step enterS…). */
  sessionS: number;
  /** Fast seconds after fast midnight (unwrapped), realToFast of sessionS. */
  fastS: number;
}

interface Anchor {
  state: ClockState;
  /** Session seconds at anchorMs. */
  sessionS: number;
  anchorMs: number;
}

function fold(records: readonly ClockRecord[], nowMs: number): Anchor {
  let anchor: Anchor = { state: 'not-started', sessionS: 0, anchorMs: 0 };
  for (const record of records) {
    // Reading the clock at an earlier moment reads it as it was then.
    if (record.atMs > nowMs) break;
    const now = readAnchor(anchor, record.atMs);
    switch (record.action) {
      case 'start':
        anchor = { state: 'running', sessionS: record.sessionS ?? 0, anchorMs: record.atMs };
        break;
      case 'pause':
        if (anchor.state === 'running') anchor = { state: 'paused', sessionS: now, anchorMs: record.atMs };
        break;
      case 'resume':
        if (anchor.state === 'paused') anchor = { state: 'running', sessionS: anchor.sessionS, anchorMs: record.atMs };
        break;
      case 'set':
        // A set keeps a running clock running; a clock not yet started waits, paused, at the new time.
        anchor = { state: anchor.state === 'running' ? 'running' : 'paused', sessionS: record.sessionS ?? now, anchorMs: record.atMs };
        break;
    }
  }
  return anchor;
}

function readAnchor(anchor: Anchor, nowMs: number): number {
  return anchor.state === 'running' ? anchor.sessionS + (nowMs - anchor.anchorMs) / 1000 : anchor.sessionS;
}

/**
 * The shared fast clock at `nowMs`, folded from its stored actions in order: a start runs from its
 * session time (0 = the fast start), a pause freezes it, a resume runs on from where it stood, a
 * set moves it (running or not). Actions after `nowMs` are not yet in force. Session seconds advance one per real second; fast time is
 * `fastStart + sessionS × ratio` (realToFast). Before any start it stands at the fast start.
 */
export function readSessionClock(records: readonly ClockRecord[], nowMs: number, clock: FastClock): ClockReading {
  const anchor = fold(records, nowMs);
  const sessionS = readAnchor(anchor, nowMs);
  return { state: anchor.state, sessionS, fastS: realToFast(sessionS, clock) };
}

/** Why an action does not apply to a clock in `state`, or null when it does. */
export function clockActionRefusal(state: ClockState, action: ClockActionName): string | null {
  if (action === 'start' && state !== 'not-started') return 'The clock has already been started: resume it or set it to a time.';
  if (action === 'pause' && state !== 'running') return 'The clock is not running.';
  if (action === 'resume' && state !== 'paused') return state === 'running' ? 'The clock is already running.' : 'Start the clock first.';
  return null;
}
