import { formatInZone as formatInZoneUncached, formatTimeInZone } from '@/lib/time-zone';
import { formatStand, type RunAssignment } from '@/lib/invitations/assignments';
import type { CalendarSession, Person } from '@/lib/calendar/ics';

export type NoticeMethod = 'REQUEST' | 'CANCEL';

export type InvitationContent = {
  /** REQUEST for the first invitation and for updates; CANCEL when the session is called off. */
  method: NoticeMethod;
  isUpdate: boolean;
  session: CalendarSession;
  railwayName: string;
  host: Person;
  invitee: Person;
  /** The invitee's user id, so that a hand-over to their own next run reads "you". */
  inviteeId?: string;
  runs: RunAssignment[];
  duties: { duty: string; note: string }[];
  links: { accept: string; tentative: string; decline: string; myRuns: string; timetable: string };
  /** For an update: what changed for this person since their last e-mail, one line each. */
  changes?: string[];
  /** The host's reply deadline, if set. */
  replyBy?: Date | null;
  /** A reminder to reply (plain e-mail, no calendar part). */
  isReminder?: boolean;
};

// A batch of 200 invitations formats the same few session times over and over; Intl formatters
// are slow to build, so keep the strings.
const formatted = new Map<string, string>();
function formatInZone(date: Date, timeZone: string, options: Intl.DateTimeFormatOptions = {}): string {
  // JSON.stringify drops keys whose value is undefined, so { hour: undefined } (date only) would share
  // the key of {} (date and time); name every key with its value instead.
  const key = `${date.getTime()}|${timeZone}|${Object.entries(options)
    .map(([k, v]) => `${k}=${String(v)}`)
    .join(',')}`;
  let text = formatted.get(key);
  if (text === undefined) {
    if (formatted.size > 1000) formatted.clear();
    text = formatInZoneUncached(date, timeZone, options);
    formatted.set(key, text);
  }
  return text;
}

function escapeHtml(text: string): string {
  return text.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);
}

/** "Sat 12 Dec 2026, 18:00 to 21:00 (Europe/Berlin)", or both dates when the session runs past midnight. */
export function sessionSpan(session: Pick<CalendarSession, 'startsAt' | 'endsAt' | 'timeZone'>): string {
  const { startsAt, endsAt, timeZone } = session;
  const dateOnly = { hour: undefined, minute: undefined, hourCycle: undefined } as const;
  const sameDay = formatInZone(startsAt, timeZone, dateOnly) === formatInZone(endsAt, timeZone, dateOnly);
  const end = sameDay ? formatTimeInZone(endsAt, timeZone) : formatInZone(endsAt, timeZone);
  return `${formatInZone(startsAt, timeZone)} to ${end} (${timeZone})`;
}

export function subjectOf(c: InvitationContent): string {
  const when = formatInZone(c.session.startsAt, c.session.timeZone, { hour: undefined, minute: undefined, hourCycle: undefined });
  if (c.method === 'CANCEL') return `Cancelled: ${c.session.title} (${when})`;
  if (c.isReminder) return `Reminder, please reply: ${c.session.title} (${when})`;
  if (c.isUpdate) return `Updated: ${c.session.title} (${when})`;
  return `Invitation: ${c.session.title} (${when})`;
}

function runLine(r: RunAssignment): string {
  return `${r.fastDepart}–${r.fastArrive} fast (${r.realDepart}–${r.realArrive} real): ${r.trainName} on ${r.cabName}`;
}

function runDetail(r: RunAssignment, inviteeId?: string): string[] {
  const who = (n: NonNullable<RunAssignment['before']>) => (inviteeId && n.operatorId === inviteeId ? 'you' : (n.operatorName ?? 'no one named'));
  const lines = [
    `Route: ${r.route.join(' → ')}`,
    `Stand: ${formatStand(r.standBeforeS)} before departure, ${formatStand(r.standAfterS)} after arrival`,
  ];
  if (r.before) lines.push(`Cab before you: ${who(r.before)} (${r.before.trainName}, ${r.before.fastDepart})`);
  if (r.after) lines.push(`Cab after you: ${who(r.after)} (${r.after.trainName}, ${r.after.fastDepart})`);
  return lines;
}

/** The session summary and the invitee's own duties, as lines (shared by the text part and the calendar). */
export function assignmentSummary(c: InvitationContent): string {
  const lines = [
    `${c.session.title} — ${c.railwayName}`,
    `When: ${sessionSpan(c.session)}`,
  ];
  if (c.session.place) lines.push(`Where: ${c.session.place}`);
  if (c.session.description) lines.push('', c.session.description);
  lines.push('');
  if (c.runs.length) {
    lines.push(`Your runs (${c.runs.length}):`);
    c.runs.forEach((r, i) => {
      lines.push(`${i + 1}. ${runLine(r)}`, ...runDetail(r, c.inviteeId).map((l) => `   ${l}`));
    });
  } else {
    lines.push('You have no runs of your own in this timetable yet.');
  }
  const other = c.duties.filter((d) => d.duty !== 'driver');
  if (other.length) {
    lines.push('', 'Other duties:');
    for (const d of other) lines.push(`- ${d.duty}${d.note ? `: ${d.note}` : ''}`);
  }
  return lines.join('\n');
}

/** The readable parts of an invitation, update or cancellation e-mail: plain text and HTML. */
export function buildInvitationBody(c: InvitationContent): { subject: string; text: string; html: string } {
  const subject = subjectOf(c);
  const opening =
    c.method === 'CANCEL'
      ? `${c.host.name} has cancelled this operating session. Your calendar can remove it.`
      : c.isReminder
        ? `${c.host.name} has not had your reply yet for this operating session.`
        : c.isUpdate
          ? `${c.host.name} has changed this operating session. Please check your runs and reply again if your plans changed.`
          : `${c.host.name} invites you to an operating session.`;
  const changes = c.method === 'REQUEST' && c.isUpdate && !c.isReminder ? (c.changes ?? []) : [];
  const changesText = changes.length ? ['What changed for you:', ...changes.map((l) => `- ${l}`), ''] : [];
  const deadline = c.method === 'CANCEL' || !c.replyBy ? null : `Please reply by ${formatInZone(c.replyBy, c.session.timeZone)} (${c.session.timeZone}).`;
  const replyText =
    c.method === 'CANCEL'
      ? []
      : [
          'Will you come? Reply without signing in:',
          ...(deadline ? [deadline] : []),
          `Accept: ${c.links.accept}`,
          `Maybe: ${c.links.tentative}`,
          `Decline: ${c.links.decline}`,
          '',
          `Published timetable: ${c.links.timetable}`,
          `Your runs on your phone: ${c.links.myRuns}`,
          '',
        ];
  const text = [`Hello ${c.invitee.name},`, '', opening, '', ...changesText, assignmentSummary(c), '', ...replyText, '— Fishplate, for ' + c.railwayName].join('\n');

  const e = escapeHtml;
  const runsHtml = c.runs.length
    ? `<h3>Your runs (${c.runs.length})</h3><ol>${c.runs
        .map((r) => `<li><strong>${e(runLine(r))}</strong><br>${runDetail(r, c.inviteeId).map(e).join('<br>')}</li>`)
        .join('')}</ol>`
    : '<p>You have no runs of your own in this timetable yet.</p>';
  const other = c.duties.filter((d) => d.duty !== 'driver');
  const dutiesHtml = other.length
    ? `<h3>Other duties</h3><ul>${other.map((d) => `<li>${e(d.duty)}${d.note ? `: ${e(d.note)}` : ''}</li>`).join('')}</ul>`
    : '';
  const button = (href: string, label: string) =>
    `<a href="${e(href)}" style="display:inline-block;padding:8px 14px;margin:0 6px 6px 0;border:1px solid #1d6f63;border-radius:6px;color:#1d6f63;text-decoration:none;font-weight:600">${e(label)}</a>`;
  const replyHtml =
    c.method === 'CANCEL'
      ? ''
      : `<p>Will you come? Reply without signing in:${deadline ? `<br><strong>${e(deadline)}</strong>` : ''}</p><p>${button(c.links.accept, 'Accept')}${button(c.links.tentative, 'Maybe')}${button(
          c.links.decline,
          'Decline',
        )}</p><p><a href="${e(c.links.timetable)}">Published timetable</a> · <a href="${e(c.links.myRuns)}">Your runs on your phone</a></p>`;
  const html = `<!doctype html><html><body style="font-family:sans-serif;line-height:1.45">
<p>Hello ${e(c.invitee.name)},</p><p>${e(opening)}</p>${
    changes.length ? `<h3>What changed for you</h3><ul>${changes.map((l) => `<li>${e(l)}</li>`).join('')}</ul>` : ''
  }
<h2>${e(c.session.title)}</h2>
<p>${e(c.railwayName)}<br>When: ${e(sessionSpan(c.session))}${
    c.session.place ? `<br>Where: ${e(c.session.place)}` : ''
  }</p>${c.session.description ? `<p>${e(c.session.description)}</p>` : ''}
${runsHtml}${dutiesHtml}${replyHtml}
<p>— Fishplate, for ${e(c.railwayName)}</p></body></html>`;
  return { subject, text, html };
}
