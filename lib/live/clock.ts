import 'server-only';
import { addClockEvent, listClockEvents } from '@/db/queries/live';
import type { ClockEvent, Session } from '@/db/schema';
import type { Member } from '@/lib/auth';
import { AppError } from '@/lib/errors';
import { clockActionRefusal, formatFast, formatTimeOfDay, readSessionClock, type ClockReading, type ClockRecord, type FastClock } from '@/lib/planning';
import { departureFromFastTime } from '@/lib/sessions/timetable';
import type { ClockActionInput } from '@/lib/validations/live';

/** A session gets at most this many clock actions (a long evening has a few dozen). */
export const MAX_CLOCK_ACTIONS = 500;

export function fastClockOf(session: Session): FastClock {
  return { ratio: session.clockRatio, fastStart: session.fastStart };
}

export function clockRecords(events: readonly ClockEvent[]): ClockRecord[] {
  return events.map((e) => ({ action: e.action, atMs: e.at.getTime(), sessionS: e.sessionS }));
}

/** What a screen needs to show the shared clock: the stored actions, read with readSessionClock against the server's time. */
export type ClockView = {
  records: ClockRecord[];
  clock: FastClock;
  serverMs: number;
  state: ClockReading['state'];
  sessionS: number;
  fast: string;
};

export function clockView(session: Session, events: readonly ClockEvent[], nowMs = Date.now()): ClockView {
  const records = clockRecords(events);
  const clock = fastClockOf(session);
  const reading = readSessionClock(records, nowMs, clock);
  return { records, clock, serverMs: nowMs, state: reading.state, sessionS: reading.sessionS, fast: formatTimeOfDay(reading.fastS) };
}

/** The shared clock of a session now. */
export function readClockNow(session: Session, nowMs = Date.now()): ClockReading {
  return readSessionClock(clockRecords(listClockEvents(session.id)), nowMs, fastClockOf(session));
}

/**
 * Applies a clock action for a host or planner: refused (400) when it does not fit the clock's
 * state (start twice, pause a paused clock…), stored with its numbered live event otherwise.
 */
export function applyClockAction(session: Session, member: Member, input: ClockActionInput, nowMs = Date.now()) {
  const clock = fastClockOf(session);
  return addClockEvent(session.id, new Date(nowMs), (stored) => {
    if (stored.length >= MAX_CLOCK_ACTIONS) throw new AppError('bad_request', `This session's clock has had ${MAX_CLOCK_ACTIONS} actions; no more can be stored.`);
    const reading = readSessionClock(clockRecords(stored), nowMs, clock);
    const refusal = clockActionRefusal(reading.state, input.action);
    if (refusal) throw new AppError('bad_request', refusal, { issues: [{ path: 'action', message: refusal }] });
    const sessionS = input.fast !== undefined ? departureFromFastTime(input.fast, clock) : input.action === 'start' ? 0 : null;
    const time = formatFast(sessionS ?? reading.sessionS, clock);
    const words = { start: `Clock started at ${time}`, pause: `Clock paused at ${time}`, resume: `Clock resumed at ${time}`, set: `Clock set to ${time}` };
    return { values: { action: input.action, sessionS, byUserId: member.user.id }, summary: `${words[input.action]} by ${member.user.name}` };
  });
}
