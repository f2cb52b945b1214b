import { describe, expect, it } from 'vitest';
import { sampleRun } from '../shared/run-assignment';
import { assignmentSummary, buildInvitationBody, sessionSpan, subjectOf, type InvitationContent } from '@/lib/invitations/message';

// The e-mail an invitee reads. Times: Europe/Berlin is UTC+1 in December (CET), so 17:00Z is 18:00
// on the wall clock (IANA tz database, europe file).
const session = {
  id: 's1',
  title: 'Winter running <evening>',
  place: 'Club room',
  description: 'Bring "your" cab & a torch',
  startsAt: new Date('2026-12-12T17:00:00Z'),
  endsAt: new Date('2026-12-12T20:00:00Z'),
  timeZone: 'Europe/Berlin',
  status: 'published' as const,
  sequence: 0,
};

const run = sampleRun;

// CLDR 42 and later write "Sat, 12 Dec 2026" in en-GB, earlier ICU data "Sat 12 Dec 2026"; either is right.
const norm = (text: string) => text.replace(/\b(Mon|Tue|Wed|Thu|Fri|Sat|Sun), /g, '$1 ');

const content = (over: Partial<InvitationContent> = {}): InvitationContent => ({
  method: 'REQUEST',
  isUpdate: false,
  session,
  railwayName: 'Valley & Hill',
  host: { name: 'Hal', email: 'hal@example.org' },
  invitee: { name: 'Ann', email: 'ann@example.org' },
  inviteeId: 'u-ann',
  runs: [run],
  duties: [
    { duty: 'driver', note: '' },
    { duty: 'dispatcher', note: 'from 18:00' },
    { duty: 'yard master', note: '' },
  ],
  links: { accept: 'https://x.example/a?t=1&v=2', tentative: 'https://x.example/t', decline: 'https://x.example/d', myRuns: 'https://x.example/m', timetable: 'https://x.example/tt' },
  ...over,
});

describe('invitation e-mail', () => {
  it('gives the span in the session zone, with both dates when it runs past midnight', () => {
    expect(norm(sessionSpan(session))).toBe('Sat 12 Dec 2026, 18:00 to 21:00 (Europe/Berlin)');
    expect(norm(sessionSpan({ ...session, endsAt: new Date('2026-12-12T23:30:00Z') }))).toBe('Sat 12 Dec 2026, 18:00 to Sun 13 Dec 2026, 00:30 (Europe/Berlin)');
    // The same instants, read in another zone on the same day: the cached strings are per zone.
    expect(norm(sessionSpan({ ...session, timeZone: 'UTC' }))).toBe('Sat 12 Dec 2026, 17:00 to 20:00 (UTC)');
  });

  it('says in the subject whether it is an invitation, an update or a cancellation', () => {
    expect(norm(subjectOf(content()))).toBe('Invitation: Winter running <evening> (Sat 12 Dec 2026)');
    expect(norm(subjectOf(content({ isUpdate: true })))).toBe('Updated: Winter running <evening> (Sat 12 Dec 2026)');
    expect(norm(subjectOf(content({ method: 'CANCEL', isUpdate: true })))).toBe('Cancelled: Winter running <evening> (Sat 12 Dec 2026)');
  });

  it('lists the runs with route, stands and the cab hand-overs ("you" for the invitee), and other duties than driving', () => {
    expect(norm(assignmentSummary(content()))).toBe(
      [
        'Winter running <evening> — Valley & Hill',
        'When: Sat 12 Dec 2026, 18:00 to 21:00 (Europe/Berlin)',
        'Where: Club room',
        '',
        'Bring "your" cab & a torch',
        '',
        'Your runs (1):',
        '1. 06:40–06:48 fast (18:10–18:12 real): Goods on Cab 1',
        '   Route: Yard → Main → Halt',
        '   Stand: 1 min real before departure, 1 min 30 s real after arrival',
        '   Cab before you: Bob (Local, 06:10)',
        '   Cab after you: you (Express, 07:20)',
        '',
        'Other duties:',
        '- dispatcher: from 18:00',
        '- yard master',
      ].join('\n'),
    );
  });

  it('says so when there are no runs, no place, no description; an unnamed neighbour is "no one named"', () => {
    const bare = content({
      session: { ...session, place: '', description: '' },
      runs: [{ ...run, before: { ...run.before!, operatorId: null, operatorName: null }, after: null }],
      duties: [],
      inviteeId: undefined,
    });
    expect(norm(assignmentSummary(bare))).toBe(
      [
        'Winter running <evening> — Valley & Hill',
        'When: Sat 12 Dec 2026, 18:00 to 21:00 (Europe/Berlin)',
        '',
        'Your runs (1):',
        '1. 06:40–06:48 fast (18:10–18:12 real): Goods on Cab 1',
        '   Route: Yard → Main → Halt',
        '   Stand: 1 min real before departure, 1 min 30 s real after arrival',
        '   Cab before you: no one named (Local, 06:10)',
      ].join('\n'),
    );
    expect(norm(assignmentSummary(content({ runs: [], duties: [] }))).split('\n').at(-1)).toBe('You have no runs of your own in this timetable yet.');
    // Without the invitee's id, their own next run is named, not "you".
    expect(norm(assignmentSummary(content({ inviteeId: undefined })))).toContain('Cab after you: Ann (Express, 07:20)');
  });

  it('the text part opens for the occasion and carries the reply links only on a request', () => {
    const invite = norm(buildInvitationBody(content()).text);
    expect(invite.startsWith('Hello Ann,\n\nHal invites you to an operating session.\n\nWinter running <evening> — Valley & Hill\n')).toBe(true);
    expect(invite.endsWith(
      [
        '',
        'Will you come? Reply without signing in:',
        'Accept: https://x.example/a?t=1&v=2',
        'Maybe: https://x.example/t',
        'Decline: https://x.example/d',
        '',
        'Published timetable: https://x.example/tt',
        'Your runs on your phone: https://x.example/m',
        '',
        '— Fishplate, for Valley & Hill',
      ].join('\n'),
    )).toBe(true);
    expect(buildInvitationBody(content({ isUpdate: true })).text).toContain(
      '\nHal has changed this operating session. Please check your runs and reply again if your plans changed.\n',
    );
    const cancel = buildInvitationBody(content({ method: 'CANCEL' }));
    expect(cancel.text).toContain('\nHal has cancelled this operating session. Your calendar can remove it.\n');
    expect(cancel.text).not.toContain('Accept:');
    expect(cancel.text.endsWith('- yard master\n\n— Fishplate, for Valley & Hill')).toBe(true);
    expect(cancel.html).not.toContain('Will you come?');
  });

  // OWASP Cross Site Scripting Prevention Cheat Sheet, rule 1: & < > " ' as entities in HTML text
  // and quoted attributes.
  it('the HTML part escapes everything typed by people, in text and in link attributes', () => {
    const { html: raw, subject: rawSubject } = buildInvitationBody(content());
    const [html, subject] = [norm(raw), norm(rawSubject)];
    expect(subject).toBe('Invitation: Winter running <evening> (Sat 12 Dec 2026)');
    expect(html).toContain('<h2>Winter running &#60;evening&#62;</h2>');
    expect(html).toContain('<p>Valley &#38; Hill<br>When: Sat 12 Dec 2026, 18:00 to 21:00 (Europe/Berlin)<br>Where: Club room</p>');
    expect(html).toContain('<p>Bring &#34;your&#34; cab &#38; a torch</p>');
    expect(html).toContain('href="https://x.example/a?t=1&#38;v=2"');
    expect(html).toContain('<h3>Your runs (1)</h3><ol><li><strong>06:40–06:48 fast (18:10–18:12 real): Goods on Cab 1</strong><br>Route: Yard → Main → Halt<br>');
    expect(html).toContain('<h3>Other duties</h3><ul><li>dispatcher: from 18:00</li><li>yard master</li></ul>');
    expect(html).toContain('<p><a href="https://x.example/tt">Published timetable</a> · <a href="https://x.example/m">Your runs on your phone</a></p>');
    for (const label of ['Accept', 'Maybe', 'Decline']) expect(html).toMatch(new RegExp(`<a href="[^"]+" style="[^"]+">${label}</a>`));
    expect(html).toContain('<p>Hello Ann,</p><p>Hal invites you to an operating session.</p>');
    expect(html).toContain('<p>— Fishplate, for Valley &#38; Hill</p></body></html>');
    const bare = norm(buildInvitationBody(content({ session: { ...session, place: '', description: '' }, runs: [], duties: [] })).html);
    expect(bare).toContain('<p>You have no runs of your own in this timetable yet.</p>');
    expect(bare).not.toContain('Where:');
    expect(bare).not.toContain('Other duties');
    expect(bare).toContain('(Europe/Berlin)</p>\n<p>You have no runs');
    // A cancellation with two runs and no other duties: the runs one after another, then only the footer.
    const second = { ...run, runId: 'r2', trainName: 'Express' };
    const cancelled = buildInvitationBody(content({ method: 'CANCEL', runs: [run, second], duties: [{ duty: 'driver', note: '' }] })).html;
    expect(cancelled).toMatch(/Goods on Cab 1<\/strong><br>[^]*?<\/li><li><strong>06:40–06:48 fast \(18:10–18:12 real\): Express on Cab 1/);
    expect(cancelled).toContain('</li></ol>\n<p>— Fishplate, for Valley &#38; Hill</p></body></html>');
    const quote = buildInvitationBody(content({ invitee: { name: "O'Neil", email: 'o@example.org' } })).html;
    expect(quote).toContain('<p>Hello O&#39;Neil,</p>');
  });

  it('an update lists what changed for this person; a reminder asks for an answer and lists no changes', () => {
    const changes = ['Goods now departs 06:50 fast', 'Cab <2> instead of Cab 1'];
    const update = buildInvitationBody(content({ isUpdate: true, changes }));
    expect(update.text).toContain('\n\nWhat changed for you:\n- Goods now departs 06:50 fast\n- Cab <2> instead of Cab 1\n\nWinter running');
    expect(update.html).toContain('<h3>What changed for you</h3><ul><li>Goods now departs 06:50 fast</li><li>Cab &#60;2&#62; instead of Cab 1</li></ul>');
    const reminder = buildInvitationBody(content({ isUpdate: true, isReminder: true, changes }));
    expect(norm(reminder.subject)).toBe('Reminder, please reply: Winter running <evening> (Sat 12 Dec 2026)');
    expect(reminder.text).toContain('\nHal has not had your reply yet for this operating session.\n');
    for (const part of [reminder.text, reminder.html, buildInvitationBody(content({ changes })).text]) expect(part).not.toContain('What changed');
    expect(buildInvitationBody(content({ method: 'CANCEL', isUpdate: true, changes })).text).not.toContain('What changed');
    // An update with no list of changes says none.
    const unlisted = buildInvitationBody(content({ isUpdate: true }));
    for (const part of [unlisted.text, unlisted.html]) expect(part).not.toContain('What changed');
  });

  it('a reply-by time is given in the session zone, in text and HTML, and never on a cancellation', () => {
    // 2026-12-10T18:00Z is 19:00 in Berlin (CET, UTC+1).
    const replyBy = new Date('2026-12-10T18:00:00Z');
    const body = buildInvitationBody(content({ replyBy }));
    expect(norm(body.text)).toContain('Will you come? Reply without signing in:\nPlease reply by Thu 10 Dec 2026, 19:00 (Europe/Berlin).\nAccept:');
    expect(norm(body.html)).toContain('Reply without signing in:<br><strong>Please reply by Thu 10 Dec 2026, 19:00 (Europe/Berlin).</strong></p>');
    expect(buildInvitationBody(content({ replyBy: null })).text).not.toContain('Please reply by');
    expect(buildInvitationBody(content({ method: 'CANCEL', replyBy })).text).not.toContain('Please reply by');
  });

  it('the HTML has no empty sections when nothing changed and no deadline was set', () => {
    const { html } = buildInvitationBody(content());
    expect(html).toContain('<p>Hal invites you to an operating session.</p>\n<h2>');
    expect(html).toContain('Reply without signing in:</p><p><a href');
  });
});
