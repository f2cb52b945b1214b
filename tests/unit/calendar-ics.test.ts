import ICAL from 'ical.js';
import { describe, expect, it } from 'vitest';
import { buildCalendarFile, buildInvitationCalendar, describeRunForCalendar, escapeText, plainText, runEventSpan, sessionTimes, sessionUid, type CalendarSession } from '@/lib/calendar/ics';
import type { RunAssignment } from '@/lib/invitations/assignments';

const host = { name: 'Hazel Brightwater', email: 'host@fishplate.example' };
const guest = { name: 'Zoë Ångström-Øvergaard', email: 'zoe@fishplate.example' };
const NOW = new Date('2026-12-01T20:00:00Z');

function session(over: Partial<CalendarSession> = {}): CalendarSession {
  return {
    id: 'b3c1f0f2-5a2e-4c44-9d55-3d8c3a7f0a11',
    title: 'Wintertime running evening on the Kestrel Vale branch — großer Fahrtag ✓ with a title that needs folding',
    place: 'Clubroom 2, Ærøvej',
    description: 'Stopper, express, goods and railcar. Tea at half time.',
    startsAt: new Date('2026-12-05T18:30:00Z'),
    endsAt: new Date('2026-12-05T21:30:00Z'),
    timeZone: 'Europe/London',
    status: 'published',
    sequence: 0,
    ...over,
  };
}

function parse(text: string) {
  const root = new ICAL.Component(ICAL.parse(text));
  const events = root.getAllSubcomponents('vevent');
  return { root, events, event: events[0]! };
}

function request(sequence: number, over: Partial<CalendarSession> = {}) {
  return buildInvitationCalendar({ method: 'REQUEST', session: session({ sequence, ...over }), sequence, organizer: host, attendee: guest, description: 'Your runs: 1. 06:20 Stopper on Cab 1', now: NOW });
}

/** Checks that hold for every iCalendar object we write. */
function expectWellFormed(text: string) {
  // RFC 5545 3.1: content lines end with CRLF; no bare LF.
  expect(text.endsWith('\r\n')).toBe(true);
  expect(text.replaceAll('\r\n', '')).not.toMatch(/[\r\n]/);
  // RFC 5545 3.1: lines are folded so that none is longer than 75 octets (UTF-8).
  for (const line of text.split('\r\n')) expect(Buffer.byteLength(line, 'utf8')).toBeLessThanOrEqual(75);
  // RFC 5545 3.1: a fold never splits a UTF-8 character (each line decodes on its own).
  for (const line of text.split('\r\n')) expect(Buffer.from(line, 'utf8').toString('utf8')).toBe(line);
  const { root, events } = parse(text);
  // RFC 5545 3.6: VCALENDAR needs VERSION:2.0 and PRODID.
  expect(root.getFirstPropertyValue('version')).toBe('2.0');
  expect(root.getFirstPropertyValue('prodid')).toMatch(/Fishplate/);
  for (const event of events) {
    // RFC 5545 3.6.1: UID and DTSTAMP required; DTSTAMP in UTC.
    expect(event.getFirstPropertyValue('uid')).toBeTruthy();
    const stamp = event.getFirstPropertyValue('dtstamp') as ICAL.Time;
    expect(stamp.zone?.tzid).toBe('UTC');
    // RFC 5545 3.6.1: DTEND and DURATION never both; DTEND after DTSTART (exclusive end).
    expect(event.hasProperty('dtend') && event.hasProperty('duration')).toBe(false);
    const start = event.getFirstPropertyValue('dtstart') as ICAL.Time;
    const end = event.getFirstPropertyValue('dtend') as ICAL.Time;
    expect(end.compare(start)).toBe(1);
    // RFC 5545 3.2.19 / 3.6.5: no TZID without a VTIMEZONE — we write UTC (3.3.5 form 2) or DATE values.
    for (const name of ['dtstart', 'dtend']) expect(event.getFirstProperty(name)!.getParameter('tzid')).toBeUndefined();
  }
  return parse(text);
}

describe('invitation calendars (iTIP over iCalendar), parsed with ical.js', () => {
  it('METHOD:REQUEST has what RFC 5546 3.2.2 requires', () => {
    const text = request(0);
    const { root, event } = expectWellFormed(text);
    expect(root.getFirstPropertyValue('method')).toBe('REQUEST'); // RFC 5546 3.2.2
    expect(event.getFirstPropertyValue('uid')).toBe(sessionUid(session().id)); // RFC 5546 3.2.2: UID
    expect(event.getFirstPropertyValue('summary')).toBe(session().title); // RFC 5546 3.2.2: SUMMARY; UTF-8 survives folding (RFC 5545 3.1)
    expect(event.getFirstPropertyValue('location')).toBe('Clubroom 2, Ærøvej');
    expect((event.getFirstPropertyValue('dtstart') as ICAL.Time).toJSDate().toISOString()).toBe('2026-12-05T18:30:00.000Z'); // RFC 5546 3.2.2: DTSTART
    expect((event.getFirstPropertyValue('dtstamp') as ICAL.Time).toJSDate().toISOString()).toBe(NOW.toISOString()); // RFC 5546 3.2.2: DTSTAMP
    const organizer = event.getFirstProperty('organizer')!;
    expect(String(organizer.getFirstValue()).toLowerCase()).toBe('mailto:host@fishplate.example'); // RFC 5546 3.2.2 ORGANIZER; RFC 6047 2.4 mailto: URI
    expect(organizer.getParameter('cn')).toBe(host.name);
    const attendees = event.getAllProperties('attendee');
    expect(attendees).toHaveLength(1); // RFC 5546 3.2.2: one or more ATTENDEE
    expect(String(attendees[0]!.getFirstValue()).toLowerCase()).toBe('mailto:zoe@fishplate.example'); // RFC 6047 2.4
    expect(attendees[0]!.getParameter('cn')).toBe(guest.name);
    expect(attendees[0]!.getParameter('partstat')).toBe('NEEDS-ACTION'); // RFC 5546 3.2.2: attendee asked to reply
    expect(attendees[0]!.getParameter('rsvp')).toBe('TRUE'); // RFC 5545 3.2.17: RSVP is TRUE or FALSE only
    expect(event.getFirstPropertyValue('status')).toBe('CONFIRMED');
    expect(text).not.toMatch(/RSVP=YES/); // RFC 5545 3.2.17 (the RSVP=YES of RFC 6047's examples is invalid)
  });

  it('an update keeps the UID and raises SEQUENCE (RFC 5546 2.1.4)', () => {
    const first = parse(request(0)).event;
    const update = expectWellFormed(request(1, { startsAt: new Date('2026-12-05T19:00:00Z'), endsAt: new Date('2026-12-05T22:00:00Z') }));
    expect(update.root.getFirstPropertyValue('method')).toBe('REQUEST');
    expect(update.event.getFirstPropertyValue('uid')).toBe(first.getFirstPropertyValue('uid')); // RFC 5546 2.1.4: same UID
    expect(Number(update.event.getFirstPropertyValue('sequence'))).toBeGreaterThan(Number(first.getFirstPropertyValue('sequence') ?? 0)); // RFC 5546 2.1.4
    expect(update.event.getFirstPropertyValue('sequence')).toBe(1); // RFC 5546 3.2.2: SEQUENCE present once above 0
    expect((update.event.getFirstPropertyValue('dtstart') as ICAL.Time).toJSDate().toISOString()).toBe('2026-12-05T19:00:00.000Z');
  });

  it('METHOD:CANCEL reuses the UID, raises SEQUENCE and says STATUS:CANCELLED (RFC 5546 3.2.5)', () => {
    const before = parse(request(1)).event;
    const text = buildInvitationCalendar({ method: 'CANCEL', session: session({ status: 'cancelled', sequence: 2 }), sequence: 2, organizer: host, attendee: guest, description: 'Cancelled.', now: NOW });
    const { root, event } = expectWellFormed(text);
    expect(root.getFirstPropertyValue('method')).toBe('CANCEL'); // RFC 5546 3.2.5
    expect(event.getFirstPropertyValue('uid')).toBe(before.getFirstPropertyValue('uid')); // RFC 5546 3.2.5: same UID
    expect(Number(event.getFirstPropertyValue('sequence'))).toBeGreaterThan(Number(before.getFirstPropertyValue('sequence'))); // RFC 5546 3.2.5
    expect(event.getFirstPropertyValue('status')).toBe('CANCELLED'); // RFC 5546 3.2.5
    expect(event.hasProperty('organizer')).toBe(true); // RFC 5546 3.2.5: ORGANIZER required
    expect(event.getAllProperties('attendee')).toHaveLength(1); // RFC 5546 3.2.5: the attendees cancelled
    expect(event.getFirstProperty('attendee')!.getParameter('rsvp')).toBeUndefined(); // no reply is asked for a cancellation
  });

  it('an overnight session ends on the next date, written in UTC (RFC 5545 3.3.5 form 2)', () => {
    const text = request(0, { startsAt: new Date('2026-12-05T22:00:00Z'), endsAt: new Date('2026-12-06T02:30:00Z') });
    const { event } = expectWellFormed(text);
    expect(text).toContain('DTSTART:20261205T220000Z');
    expect(text).toContain('DTEND:20261206T023000Z');
    const span = (event.getFirstPropertyValue('dtend') as ICAL.Time).subtractDate(event.getFirstPropertyValue('dtstart') as ICAL.Time);
    expect(span.toSeconds()).toBe(4.5 * 3600);
  });

  it('a summer-time session is the same instant in UTC (Europe/London is UTC+1 in July)', () => {
    // 18:30 British Summer Time = 17:30 UTC (UK summer time is UTC+1; common practice / IANA tz database).
    const text = request(0, { startsAt: new Date('2026-07-04T17:30:00Z'), endsAt: new Date('2026-07-04T20:30:00Z') });
    expectWellFormed(text);
    expect(text).toContain('DTSTART:20260704T173000Z');
  });

  it('a session from local midnight to midnight is an all-day event on the local dates, DTEND exclusive (RFC 5545 3.6.1, 3.3.4)', () => {
    // Berlin is UTC+1 in December: local midnight of 5 Dec is 23:00 UTC on 4 Dec.
    const s = { startsAt: new Date('2026-12-04T23:00:00Z'), endsAt: new Date('2026-12-06T23:00:00Z'), timeZone: 'Europe/Berlin' };
    expect(sessionTimes(s).allDay).toBe(true);
    const text = request(0, s);
    const { event } = expectWellFormed(text);
    const start = event.getFirstPropertyValue('dtstart') as ICAL.Time;
    const end = event.getFirstPropertyValue('dtend') as ICAL.Time;
    expect(start.isDate).toBe(true); // RFC 5545 3.3.4: VALUE=DATE
    expect(start.toString()).toBe('2026-12-05');
    expect(end.toString()).toBe('2026-12-07'); // two days, 5 and 6 December; DTEND is the day after (exclusive)
  });

  it('hands ical-generator the local dates at UTC midnight, whatever zone the server runs in', () => {
    // ical-generator writes an all-day DATE from the Date's UTC fields; a Date built from local
    // time would shift the day on a server east of UTC (npm test runs this suite in Pacific/Auckland too).
    const s = { startsAt: new Date('2026-12-04T23:00:00Z'), endsAt: new Date('2026-12-06T23:00:00Z'), timeZone: 'Europe/Berlin' };
    const times = sessionTimes(s);
    expect(times.start.toISOString()).toBe('2026-12-05T00:00:00.000Z');
    expect(times.end.toISOString()).toBe('2026-12-07T00:00:00.000Z');
    expect(request(0, s)).toContain('DTSTART;VALUE=DATE:20261205'); // RFC 5545 3.3.4 / 3.8.2.4
  });

  it('writes the SEQUENCE it is given, not the session\'s (a cancellation outranks what the invitee last got, RFC 5546 2.1.4, 3.2.5)', () => {
    // The sender raises SEQUENCE above the one last sent to this attendee even when the session's is lower.
    const text = buildInvitationCalendar({ method: 'CANCEL', session: session({ status: 'cancelled', sequence: 2 }), sequence: 5, organizer: host, attendee: guest, description: 'Cancelled.', now: NOW });
    expect(expectWellFormed(text).event.getFirstPropertyValue('sequence')).toBe(5);
  });

  it('an evening session is not mistaken for an all-day one', () => {
    expect(sessionTimes(session()).allDay).toBe(false);
  });
});

function run(id: string, departMin: number): RunAssignment {
  return {
    runId: id,
    operatorId: 'u1',
    operatorName: 'Zoë',
    trainName: 'Stopper',
    cabName: 'Cab 1',
    route: ['T1', 'M2', 'Y1'],
    departS: departMin * 60,
    arriveS: departMin * 60 + 300,
    departAt: new Date(Date.UTC(2026, 11, 5, 18, 30 + departMin)),
    arriveAt: new Date(Date.UTC(2026, 11, 5, 18, 35 + departMin)),
    realDepart: '18:35',
    realArrive: '18:40',
    fastDepart: '06:20',
    fastArrive: '06:40',
    standBeforeS: 120,
    standAfterS: 180,
    before: null,
    after: { runId: 'x', operatorId: 'u2', operatorName: 'Priya', trainName: 'Express', fastDepart: '06:52', realDepart: '18:43' },
    note: '',
  };
}

describe('calendar files to download or subscribe to', () => {
  it('has no METHOD (not an iTIP message, RFC 5545 3.7.2), the session UID and one event per run', () => {
    const text = buildCalendarFile({ name: 'Zoë — Fishplate', entries: [{ session: session({ sequence: 3 }), runs: [run('r1', 5), run('r2', 22)] }], now: NOW });
    const { root, events } = expectWellFormed(text);
    expect(root.hasProperty('method')).toBe(false); // RFC 5545 3.7.2
    expect(events).toHaveLength(3);
    expect(events.map((e) => e.getFirstPropertyValue('uid'))).toEqual([sessionUid(session().id), 'run-r1@fishplate', 'run-r2@fishplate']); // RFC 5545 3.8.4.7: unique UIDs
    expect(events[0]!.getFirstPropertyValue('sequence')).toBe(3);
    expect(String(events[1]!.getFirstPropertyValue('description'))).toContain('Route: T1 → M2 → Y1');
    expect(String(events[1]!.getFirstPropertyValue('description'))).toContain('Cab after: Priya with Express at 06:52');
  });

  it('a cancelled session stays in the feed as STATUS:CANCELLED (RFC 5545 3.8.1.11) so calendars drop it', () => {
    const { events } = expectWellFormed(buildCalendarFile({ name: 'Feed', entries: [{ session: session({ status: 'cancelled', sequence: 1 }), runs: [] }], now: NOW }));
    expect(events[0]!.getFirstPropertyValue('status')).toBe('CANCELLED');
  });
});

describe('issue 10 finding 6: calendar injection through ids', () => {
  const INJECTION = '\r\nBEGIN:VALARM\r\nACTION:DISPLAY\r\nDESCRIPTION:pay here\r\nTRIGGER:-PT5M\r\nEND:VALARM\r\nX-INJECTED:1';

  /** Every property name in the parsed calendar, at any depth, and every component name. */
  function namesIn(component: ICAL.Component): string[] {
    return [
      component.name,
      ...component.getAllProperties().map((p) => p.name),
      ...component.getAllSubcomponents().flatMap((c) => namesIn(c)),
    ];
  }

  it('a run id with CRLF and properties stays one UID value (RFC 5545 3.3.11 escaping, read back by ical.js)', () => {
    const hostileRun = { ...run('r1', 5), runId: `r1${INJECTION};x,y\\z` };
    const text = buildCalendarFile({ name: 'Feed', entries: [{ session: session(), runs: [hostileRun] }], now: NOW });
    const { root, events } = expectWellFormed(text);
    const names = namesIn(root);
    expect(names).not.toContain('valarm');
    expect(names).not.toContain('x-injected');
    // UID is TEXT (RFC 5545 3.8.4.7): ical.js reads the escaped line back as the id, a line break as \n.
    expect(events[1]!.getFirstPropertyValue('uid')).toBe(`run-${hostileRun.runId}@fishplate`.replaceAll('\r\n', '\n'));
  });

  it('a session title, place and member name with CRLF and properties stay text (X-WR-CALNAME included)', () => {
    const text = buildCalendarFile({
      name: `Evening${INJECTION}`,
      entries: [{ session: session({ title: `Evening${INJECTION}`, place: `Hall${INJECTION}`, description: `Bring tea\u0000${INJECTION}` }), runs: [run('r1', 5)] }],
      now: NOW,
    });
    const { root, events } = expectWellFormed(text);
    const names = namesIn(root);
    expect(names).not.toContain('valarm');
    expect(names).not.toContain('x-injected');
    // ical.js keeps an X- property's value as written: the escaped text, on one line.
    expect(root.getFirstPropertyValue('x-wr-calname')).toBe(escapeText(`Evening${INJECTION}`));
    expect(events[0]!.getFirstPropertyValue('summary')).toBe(`Evening${INJECTION.replaceAll('\r\n', '\n')}`);
    const invitation = buildInvitationCalendar({
      method: 'REQUEST',
      session: session({ title: `Evening${INJECTION}` }),
      sequence: 0,
      organizer: { name: `Host${INJECTION}`, email: host.email },
      attendee: { name: `Guest"${INJECTION}`, email: guest.email },
      description: `Runs${INJECTION}`,
      now: NOW,
    });
    const parsed = expectWellFormed(invitation);
    expect(namesIn(parsed.root)).not.toContain('valarm');
    expect(namesIn(parsed.root)).not.toContain('x-injected');
    expect(parsed.event.getAllProperties('attendee')).toHaveLength(1);
  });
});

describe('run events and their text', () => {
  it('escapes TEXT as RFC 5545 3.3.11 says: backslash, semicolon, comma; every line break as \\n; control characters dropped, tab kept', () => {
    expect(escapeText('a\\b;c,d')).toBe('a\\\\b\\;c\\,d');
    expect(escapeText('one\r\ntwo\nthree\rfour')).toBe('one\\ntwo\\nthree\\nfour');
    expect(escapeText('bell\u0007 tab\t del\u007f esc\u001b')).toBe('bell tab\t del esc');
    expect(plainText('x\u0000\u0008\u000b\u000c\u000e\u001fy\t\n\r')).toBe('xy\t\n\r');
  });

  it('covers the stands: from the stand before departure to the stand after arrival, in whole seconds (RFC 5545 3.3.5)', () => {
    const r = { ...run('r1', 5), departAt: new Date('2026-12-05T18:35:00.400Z'), arriveAt: new Date('2026-12-05T18:40:00.200Z') };
    expect(runEventSpan(r)).toEqual({ start: new Date('2026-12-05T18:33:00Z'), end: new Date('2026-12-05T18:43:01Z') });
  });

  it('lasts at least a minute, so a calendar shows it', () => {
    const r = { ...run('r1', 5), arriveAt: new Date(run('r1', 5).departAt.getTime() + 10_000), standBeforeS: 0, standAfterS: 0 };
    const span = runEventSpan(r);
    expect(span.end.getTime() - span.start.getTime()).toBe(60_000);
  });

  it('describes the train, cab, times, route, stands, operator and the cab hand-overs', () => {
    const r = {
      ...run('r1', 5),
      before: { runId: 'y', operatorId: null, operatorName: null, trainName: 'Goods', fastDepart: '06:05', realDepart: '18:31' },
      note: 'Shunt at Y1',
    };
    expect(describeRunForCalendar(r)).toBe(
      [
        'Train: Stopper',
        'Cab: Cab 1',
        'Fast clock: departs 06:20, arrives 06:40',
        'Real time: departs 18:35, arrives 18:40',
        'Route: T1 → M2 → Y1',
        'Stands 2 min real before departure and 3 min real after arrival',
        'Operator: Zoë',
        'Cab before: no one named with Goods at 06:05',
        'Cab after: Priya with Express at 06:52',
        'Shunt at Y1',
      ].join('\n'),
    );
    expect(describeRunForCalendar({ ...run('r1', 5), operatorName: null, after: { ...run('r1', 5).after!, operatorName: null } }).split('\n').slice(5)).toEqual([
      'Stands 2 min real before departure and 3 min real after arrival',
      'Cab after: no one named with Express at 06:52',
    ]);
  });

  it('a run event names train, cab and session, with the session’s place, link and status', () => {
    const text = buildCalendarFile({
      name: 'Feed',
      entries: [{ session: session({ title: 'Evening', place: 'Hall', status: 'draft' }), runs: [run('r1', 5)], url: 'https://x.example/s/1' }],
      now: NOW,
    });
    const { events } = expectWellFormed(text);
    const runEvent = events[1]!;
    expect(runEvent.getFirstPropertyValue('summary')).toBe('Stopper on Cab 1 — Evening');
    expect(runEvent.getFirstPropertyValue('location')).toBe('Hall');
    expect(runEvent.getFirstPropertyValue('url')).toBe('https://x.example/s/1');
    expect(runEvent.getFirstPropertyValue('status')).toBe('TENTATIVE'); // RFC 5545 3.8.1.11: a draft is not confirmed
    expect(events[0]!.getFirstPropertyValue('url')).toBe('https://x.example/s/1');
    expect(events[0]!.getFirstPropertyValue('location')).toBe('Hall');
    expect((events[0]!.getFirstPropertyValue('dtstamp') as ICAL.Time).toJSDate()).toEqual(NOW);
    expect(parse(text).root.getFirstPropertyValue('prodid')).toBe('-//Fishplate//Fishplate sessions//EN'); // RFC 5545 3.7.3
    expect(events[0]!.getFirstPropertyValue('description')).toBe(session().description);
    const bare = parse(buildCalendarFile({ name: 'Feed', entries: [{ session: session({ place: '', description: '' }), runs: [run('r1', 5)] }], now: NOW })).events;
    for (const e of bare) for (const p of ['location', 'url']) expect(e.hasProperty(p), p).toBe(false);
    expect(bare[0]!.hasProperty('description')).toBe(false);
    expect(bare[1]!.getFirstPropertyValue('sequence')).toBe(0);
  });

  it('an invitation carries the timetable link; a cancellation is CANCELLED whatever the session says (RFC 5546 3.2.5)', () => {
    const invite = parse(buildInvitationCalendar({ method: 'REQUEST', session: session(), sequence: 1, organizer: host, attendee: guest, description: 'x', url: 'https://x.example/s/1', now: NOW }));
    expect(invite.event.getFirstPropertyValue('url')).toBe('https://x.example/s/1');
    const cancel = parse(buildInvitationCalendar({ method: 'CANCEL', session: session({ status: 'published' }), sequence: 2, organizer: host, attendee: guest, description: 'x', now: NOW }));
    expect(cancel.event.getFirstPropertyValue('status')).toBe('CANCELLED');
    expect(cancel.event.hasProperty('url')).toBe(false);
  });

  it('a session that starts and ends at local midnight on the same instant is not an all-day event', () => {
    // Midnight to midnight is all-day only to the second (Europe/London is UTC+0 in December).
    for (const start of ['2026-12-05T00:30:00Z', '2026-12-05T00:00:30Z']) {
      expect(sessionTimes({ startsAt: new Date(start), endsAt: new Date('2026-12-06T00:00:00Z'), timeZone: 'Europe/London' }).allDay, start).toBe(false);
    }
    expect(sessionTimes({ startsAt: new Date('2026-12-05T00:00:00Z'), endsAt: new Date('2026-12-06T00:00:00Z'), timeZone: 'Europe/London' }).allDay).toBe(true);
    const midnight = new Date('2026-12-05T00:00:00Z');
    expect(sessionTimes({ startsAt: midnight, endsAt: midnight, timeZone: 'Europe/London' }).allDay).toBe(false);
    // Starts at midnight, ends in the evening: timed.
    expect(sessionTimes({ startsAt: midnight, endsAt: new Date('2026-12-05T21:00:00Z'), timeZone: 'Europe/London' }).allDay).toBe(false);
    expect(sessionTimes({ startsAt: new Date('2026-12-05T09:00:00Z'), endsAt: new Date('2026-12-06T00:00:00Z'), timeZone: 'Europe/London' }).allDay).toBe(false);
  });
});
