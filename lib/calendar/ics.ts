import ical, {
  ICalAttendeeRole,
  ICalAttendeeStatus,
  ICalCalendarMethod,
  ICalEventStatus,
  type ICalCalendar,
} from 'ical-generator';
import type { SessionStatus } from '@/db/enums';
import type { RunAssignment } from '@/lib/invitations/assignments';
import { formatStand } from '@/lib/invitations/assignments';
import { wallClockParts } from '@/lib/time-zone';

/** The fields of a session a calendar needs. */
export type CalendarSession = {
  id: string;
  title: string;
  place: string;
  description: string;
  startsAt: Date;
  endsAt: Date;
  timeZone: string;
  status: SessionStatus;
  sequence: number;
};

export type Person = { name: string; email: string };

const PRODID = { company: 'Fishplate', product: 'Fishplate sessions', language: 'EN' };

/**
 * A TEXT value as RFC 5545 3.3.11 writes it: backslash, semicolon and comma escaped with a
 * backslash, every line break as `\n`, and the other control characters (which TEXT may not hold)
 * dropped. ical-generator escapes SUMMARY, DESCRIPTION and LOCATION itself but writes UID and
 * X-WR-CALNAME as given, so those go through here; nothing a user typed can end a content line.
 */
export function escapeText(value: string): string {
  return plainText(value)
    .replace(/[\\;,]/g, (c) => `\\${c}`)
    .replace(/\r\n|\r|\n/g, '\\n');
}

/** Text without the control characters RFC 5545 3.3.11 excludes from TEXT (tab and line breaks stay). */
export function plainText(value: string): string {
  // eslint-disable-next-line no-control-regex
  return value.replace(/[\u0000-\u0008\u000b\u000c\u000e-\u001f\u007f]/g, '');
}

/** The session's UID: the same in every invitation, update, cancellation, download and feed. */
export function sessionUid(sessionId: string): string {
  return escapeText(`session-${sessionId}@fishplate`);
}

export function runUid(runId: string): string {
  return escapeText(`run-${runId}@fishplate`);
}

/**
 * When a session is in a calendar. A session that starts and ends at midnight in its own zone is
 * an all-day event of DATE values (the local dates, DTEND the day after the last day, exclusive as
 * RFC 5545 3.6.1 says); every other session is written in UTC with a trailing Z, so no VTIMEZONE
 * is needed (RFC 5545 3.3.5 form 2) and one that runs past midnight simply ends on the next date.
 */
export function sessionTimes(session: Pick<CalendarSession, 'startsAt' | 'endsAt' | 'timeZone'>) {
  const start = wallClockParts(session.startsAt.getTime(), session.timeZone);
  const end = wallClockParts(session.endsAt.getTime(), session.timeZone);
  const midnight = (p: typeof start) => p.hour === 0 && p.minute === 0 && p.second === 0;
  if (midnight(start) && midnight(end) && session.endsAt > session.startsAt) {
    return {
      allDay: true as const,
      // ical-generator writes an all-day Date from its UTC fields: give it the local dates at UTC midnight.
      start: new Date(Date.UTC(start.year, start.month - 1, start.day)),
      end: new Date(Date.UTC(end.year, end.month - 1, end.day)),
    };
  }
  return { allDay: false as const, start: session.startsAt, end: session.endsAt };
}

const STATUS: Record<SessionStatus, ICalEventStatus> = {
  draft: ICalEventStatus.TENTATIVE,
  published: ICalEventStatus.CONFIRMED,
  cancelled: ICalEventStatus.CANCELLED,
};

function finish(calendar: ICalCalendar): string {
  // ical-generator ends the last line without CRLF; RFC 5545 3.1 ends every content line with one.
  const text = calendar.toString();
  return text.endsWith('\r\n') ? text : `${text}\r\n`;
}

/**
 * The iTIP message of an invitation e-mail (RFC 5546): METHOD:REQUEST for an invitation or an
 * update, METHOD:CANCEL with STATUS:CANCELLED for a cancellation; one VEVENT with the session's
 * UID, the given SEQUENCE, DTSTAMP now in UTC, ORGANIZER the host and ATTENDEE the invitee, asked
 * to reply (PARTSTAT=NEEDS-ACTION;RSVP=TRUE) on a request.
 */
export function buildInvitationCalendar(input: {
  method: 'REQUEST' | 'CANCEL';
  session: CalendarSession;
  sequence: number;
  organizer: Person;
  attendee: Person;
  description: string;
  url?: string;
  now?: Date;
}): string {
  const calendar = ical({
    prodId: PRODID,
    method: input.method === 'CANCEL' ? ICalCalendarMethod.CANCEL : ICalCalendarMethod.REQUEST,
  });
  const times = sessionTimes(input.session);
  calendar.createEvent({
    id: sessionUid(input.session.id),
    sequence: input.sequence,
    stamp: input.now ?? new Date(),
    start: times.start,
    end: times.end,
    allDay: times.allDay,
    summary: plainText(input.session.title),
    location: plainText(input.session.place) || null,
    description: plainText(input.description),
    url: input.url ?? null,
    status: input.method === 'CANCEL' ? ICalEventStatus.CANCELLED : STATUS[input.session.status],
    organizer: { name: plainText(input.organizer.name), email: input.organizer.email },
    attendees: [
      {
        name: plainText(input.attendee.name),
        email: input.attendee.email,
        role: ICalAttendeeRole.REQ,
        ...(input.method === 'REQUEST' ? { status: ICalAttendeeStatus.NEEDSACTION, rsvp: true } : {}),
      },
    ],
  });
  return finish(calendar);
}

/** When an operator must be at the cab for a run: departure less the stand before, to arrival plus the stand after (at least a minute). */
export function runEventSpan(run: RunAssignment): { start: Date; end: Date } {
  const start = new Date(run.departAt.getTime() - run.standBeforeS * 1000);
  const end = new Date(Math.max(run.arriveAt.getTime() + run.standAfterS * 1000, start.getTime() + 60_000));
  // iCalendar DATE-TIME has whole seconds (RFC 5545 3.3.5).
  return { start: new Date(Math.floor(start.getTime() / 1000) * 1000), end: new Date(Math.ceil(end.getTime() / 1000) * 1000) };
}

/** What one run says in a calendar: where the train goes, the stand times and the cab hand-overs. */
export function describeRunForCalendar(run: RunAssignment): string {
  const lines = [
    `Train: ${run.trainName}`,
    `Cab: ${run.cabName}`,
    `Fast clock: departs ${run.fastDepart}, arrives ${run.fastArrive}`,
    `Real time: departs ${run.realDepart}, arrives ${run.realArrive}`,
    `Route: ${run.route.join(' → ')}`,
    `Stands ${formatStand(run.standBeforeS)} before departure and ${formatStand(run.standAfterS)} after arrival`,
  ];
  if (run.operatorName) lines.push(`Operator: ${run.operatorName}`);
  if (run.before) lines.push(`Cab before: ${run.before.operatorName ?? 'no one named'} with ${run.before.trainName} at ${run.before.fastDepart}`);
  if (run.after) lines.push(`Cab after: ${run.after.operatorName ?? 'no one named'} with ${run.after.trainName} at ${run.after.fastDepart}`);
  if (run.note) lines.push(run.note);
  return lines.join('\n');
}

/**
 * A calendar file to download or subscribe to (no METHOD: it is not an iTIP message, RFC 5545
 * 3.7.2): one event per session with the session's UID and SEQUENCE, and one per run given.
 */
export function buildCalendarFile(input: {
  name: string;
  entries: { session: CalendarSession; runs: RunAssignment[]; url?: string }[];
  now?: Date;
}): string {
  const calendar = ical({ prodId: PRODID, name: escapeText(input.name) });
  const stamp = input.now ?? new Date();
  for (const { session, runs, url } of input.entries) {
    const times = sessionTimes(session);
    calendar.createEvent({
      id: sessionUid(session.id),
      sequence: session.sequence,
      stamp,
      start: times.start,
      end: times.end,
      allDay: times.allDay,
      summary: plainText(session.title),
      location: plainText(session.place) || null,
      description: plainText(session.description) || null,
      url: url ?? null,
      status: STATUS[session.status],
    });
    for (const run of runs) {
      calendar.createEvent({
        id: runUid(run.runId),
        sequence: session.sequence,
        stamp,
        // The operator is at the cab from the first stand until the train has cleared its last block:
        // the event covers the stand times, not only the moving part (often under a real minute).
        ...runEventSpan(run),
        summary: plainText(`${run.trainName} on ${run.cabName} — ${session.title}`),
        location: plainText(session.place) || null,
        description: plainText(describeRunForCalendar(run)),
        url: url ?? null,
        status: STATUS[session.status],
      });
    }
  }
  return finish(calendar);
}
