import 'server-only';
import {
  getRailwaySession,
  insertInvitations,
  listSessionInvitations,
  markInvitationsQueued,
  markInvitationsReminded,
  requeueFailedInvitationMail,
  runInTransaction,
  setSessionReplyBy,
} from '@/db/queries/invitation-records';
import { listCrewDuties } from '@/db/queries/crew';
import { listMembers } from '@/db/queries/memberships';
import { loadSessionRows } from '@/db/queries/plan-data';
import { getRailway, recordAudit } from '@/db/queries/railways';
import { insertUser, getUserByEmail } from '@/db/queries/users';
import type { Session } from '@/db/schema';
import { buildInvitationCalendar, type Person } from '@/lib/calendar/ics';
import { AppError, notFound } from '@/lib/errors';
import { describeRuns, type RunAssignment } from '@/lib/invitations/assignments';
import { changesBetween, describeChange, parseTold, toldOf, type Change, type Told } from '@/lib/invitations/changes';
import { assignmentSummary, buildInvitationBody, type InvitationContent } from '@/lib/invitations/message';
import { replyExpiry, signReplyToken } from '@/lib/invitations/reply-token';
import { absoluteUrl } from '@/lib/mail/account-mail';
import { enqueueMail } from '@/lib/mail/outbox';
import { zonedToUtc } from '@/lib/time-zone';
import { REMINDER_GAP_MS, type NoticeKind } from '@/lib/validations/invitation';

export type Host = { id: string; name: string; email: string };
type InvitationRow = ReturnType<typeof listSessionInvitations>[number];

/** What changed for one invitee since their last e-mail, and whether they should be sent an update. */
export type Standing = { told: Told; changes: Change[]; affected: boolean };

/**
 * Compares what the person was told last (the snapshot stored when their e-mail was queued) with
 * what they would be told now. An invitation from before snapshots were kept counts as affected
 * when it carried an older SEQUENCE than the session has.
 */
export function standingOf(session: Session, inv: InvitationRow, runs: RunAssignment[]): Standing {
  const told = toldOf(session, runs.filter((r) => r.operatorId === inv.userId));
  if (inv.mailCount === 0 || inv.sentSequence === null) return { told, changes: [], affected: false };
  const before = parseTold(inv.sentSnapshot);
  const changes = before ? changesBetween(before, told) : [];
  return { told, changes, affected: changes.length > 0 || inv.sentSequence < session.sequence };
}

/**
 * The SEQUENCE a REQUEST to this person carries: the session's for a first invitation; for an
 * update, one above the last they were sent (and at least the session's), since the event they
 * hold changed (RFC 5545 3.8.7.4, RFC 5546 2.1.4); otherwise what they already hold, never less.
 */
export function requestSequence(session: Session, inv: InvitationRow, standing: Standing): number {
  if (inv.sentSequence === null) return session.sequence;
  return standing.affected ? Math.max(session.sequence, inv.sentSequence + 1) : Math.max(session.sequence, inv.sentSequence);
}

/** Every invitation of a session with its standing (for the tracker and the update). */
export function sessionStandings(session: Session, invitations: InvitationRow[], described?: RunAssignment[]): Map<string, Standing> {
  let runs = described;
  if (!runs) {
    const rows = loadSessionRows(session.id);
    if (!rows) throw notFound('That session');
    runs = describeRuns(rows);
  }
  return new Map(invitations.map((inv) => [inv.id, standingOf(session, inv, runs)]));
}

/** The e-mail kind of an invitation message in the outbox. */
export const INVITATION_MAIL_KIND = 'session-invitation';
/** The e-mail kind of a reminder to reply (plain mail: no calendar part, so no SEQUENCE of its own). */
export const REMINDER_MAIL_KIND = 'session-reminder';

/** One key per (invitation, SEQUENCE, METHOD): queueing the same notice twice sends it once. */
export function invitationDedupeKey(invitationId: string, sequence: number, method: string, resend?: number): string {
  return `invitation:${invitationId}:${sequence}:${method}${resend ? `:resend-${resend}` : ''}`;
}

export function replyUrl(token: string, reply: 'accepted' | 'tentative' | 'declined'): string {
  return absoluteUrl(`/reply?token=${encodeURIComponent(token)}&reply=${reply}`);
}

function loadSession(railwayId: string, sessionId: string): Session {
  const session = getRailwaySession(railwayId, sessionId);
  if (!session) throw notFound('That session');
  return session;
}

function requirePublished(session: Session, now: Date) {
  if (session.status === 'draft') throw new AppError('bad_request', 'Publish the session before inviting the crew.');
  if (session.status === 'cancelled') {
    throw new AppError('bad_request', 'This session is cancelled: send the cancellation notice instead of invitations.');
  }
  if (session.endsAt.getTime() <= now.getTime()) throw new AppError('bad_request', 'This session is over; there is nothing to invite to.');
}

/**
 * Writes one message per invitation into the outbox (nothing is sent here; the worker does that),
 * REQUEST with the session's SEQUENCE, or CANCEL with STATUS:CANCELLED and a SEQUENCE above the
 * last one sent (RFC 5546 3.2.5). Returns how many were queued and how many were already there.
 */
function queueNotices(input: {
  session: Session;
  host: Host;
  invitations: InvitationRow[];
  method: 'REQUEST' | 'CANCEL';
  resend?: boolean;
  /** A reminder to reply: the invitation's text with the reply buttons, no calendar part, not counted as an invitation. */
  reminder?: boolean;
  now: Date;
}): { queued: number; skipped: number } {
  const { session, host, now } = input;
  const railway = getRailway(session.railwayId);
  const rows = loadSessionRows(session.id);
  if (!railway || !rows) throw notFound('That session');
  const duties = listCrewDuties(session.id);
  // Described once for the whole batch: each message takes its invitee's runs from this list.
  const allRuns = describeRuns(rows);
  const timetable = absoluteUrl(`/railways/${session.railwayId}/sessions/${session.id}`);
  const myRuns = absoluteUrl('/my-runs');
  let queued = 0;
  let skipped = 0;
  const marks: { id: string; sequence: number; told: string | null }[] = [];
  for (const inv of input.invitations) {
    const standing = standingOf(session, inv, allRuns);
    const sequence =
      input.method === 'CANCEL' ? Math.max(session.sequence, (inv.sentSequence ?? -1) + 1) : requestSequence(session, inv, standing);
    const token = signReplyToken({
      railwayId: session.railwayId,
      invitationId: inv.id,
      nonce: inv.replyNonce,
      expiresAt: replyExpiry(session.endsAt, now.getTime()),
    });
    const invitee: Person = { name: inv.name, email: inv.email };
    const isUpdate = input.method === 'REQUEST' && inv.mailCount > 0 && standing.affected && !input.reminder;
    const content: InvitationContent = {
      method: input.method,
      isUpdate,
      session,
      railwayName: railway.name,
      host: { name: host.name, email: host.email },
      invitee,
      inviteeId: inv.userId,
      runs: allRuns.filter((r) => r.operatorId === inv.userId),
      duties: duties.filter((d) => d.userId === inv.userId),
      links: {
        accept: replyUrl(token, 'accepted'),
        tentative: replyUrl(token, 'tentative'),
        decline: replyUrl(token, 'declined'),
        myRuns,
        timetable,
      },
      changes: isUpdate ? standing.changes.map(describeChange) : undefined,
      replyBy: session.replyBy,
      isReminder: input.reminder,
    };
    const body = buildInvitationBody(content);
    if (input.reminder) {
      const added = enqueueMail({
        railwayId: session.railwayId,
        invitationId: null,
        dedupeKey: `reminder:${inv.id}:${inv.reminderCount + 1}`,
        kind: REMINDER_MAIL_KIND,
        toAddress: inv.email,
        subject: body.subject,
        text: body.text,
        html: body.html,
      });
      if (added) {
        queued += 1;
        marks.push({ id: inv.id, sequence: inv.sentSequence ?? session.sequence, told: null });
      } else {
        skipped += 1;
      }
      continue;
    }
    const calendar = buildInvitationCalendar({
      method: input.method,
      session,
      sequence,
      organizer: { name: host.name, email: host.email },
      attendee: invitee,
      description: assignmentSummary(content),
      url: timetable,
      now,
    });
    // For a cancellation the key names the session's sequence, so pressing "send" twice finds it.
    const keySequence = input.method === 'CANCEL' ? session.sequence : sequence;
    const added = enqueueMail({
      railwayId: session.railwayId,
      invitationId: inv.id,
      dedupeKey: invitationDedupeKey(inv.id, keySequence, input.method, input.resend ? inv.mailCount : undefined),
      kind: INVITATION_MAIL_KIND,
      toAddress: inv.email,
      subject: body.subject,
      text: body.text,
      html: body.html,
      calendarMethod: input.method,
      calendar,
    });
    if (added) {
      queued += 1;
      marks.push({ id: inv.id, sequence, told: input.method === 'REQUEST' ? JSON.stringify(standing.told) : null });
    } else {
      skipped += 1;
    }
  }
  if (input.reminder) markInvitationsReminded(marks.map((m) => m.id), now);
  else markInvitationsQueued(marks);
  return { queued, skipped };
}

/**
 * Host: invites members and guests (by e-mail) to a published session and queues their
 * invitations, in one transaction. A guest without an account gets one with no password; they
 * become an operator of the railway when they accept.
 */
export function inviteToSession(input: {
  railwayId: string;
  sessionId: string;
  host: Host;
  userIds: string[];
  guestEmails: string[];
  now?: Date;
}) {
  const now = input.now ?? new Date();
  return runInTransaction(() => {
    const session = loadSession(input.railwayId, input.sessionId);
    requirePublished(session, now);
    const members = new Map(listMembers(input.railwayId).map((m) => [m.userId, m]));
    const byEmail = new Map([...members.values()].map((m) => [m.email, m]));
    const unknown = input.userIds.filter((id) => !members.has(id));
    if (unknown.length) {
      throw new AppError('bad_request', 'Some of the people picked are not members of this railway.', {
        issues: [{ path: 'userIds', message: 'Pick members of this railway only.' }],
      });
    }
    const invitees = new Map<string, { userId: string; email: string }>();
    for (const id of input.userIds) invitees.set(id, { userId: id, email: members.get(id)!.email });
    let newAccounts = 0;
    for (const email of input.guestEmails) {
      const member = byEmail.get(email);
      const user =
        member ? { id: member.userId, email: member.email } : (getUserByEmail(email) ?? (newAccounts++, insertUser({ email, name: email.split('@')[0] ?? email, passwordHash: null })));
      invitees.set(user.id, { userId: user.id, email: user.email });
    }
    const already = new Set(listSessionInvitations(session.id).map((i) => i.userId));
    const fresh = insertInvitations(session.id, [...invitees.values()].filter((i) => !already.has(i.userId)));
    const freshIds = new Set(fresh.map((f) => f.id));
    const toSend = listSessionInvitations(session.id).filter((i) => freshIds.has(i.id));
    const result = queueNotices({ session, host: input.host, invitations: toSend, method: 'REQUEST', now });
    recordAudit({
      railwayId: input.railwayId,
      userId: input.host.id,
      action: 'invite',
      entity: 'session',
      entityId: session.id,
      detail: { invited: fresh.length, alreadyInvited: invitees.size - fresh.length, newAccounts },
    });
    return { invited: fresh.length, alreadyInvited: invitees.size - fresh.length, queued: result.queued };
  });
}

/**
 * Host: sends what the session's state calls for. "pending": the invitation to everyone invited
 * who has had no e-mail yet; "update": to everyone whose session or runs changed since their last
 * e-mail, with a higher SEQUENCE and what changed for them (RFC 5546 2.1.4); "cancel": METHOD:CANCEL to everyone who was sent anything (RFC 5546 3.2.5).
 */
export function queueSessionNotices(input: { railwayId: string; sessionId: string; host: Host; kind: NoticeKind; now?: Date }) {
  const now = input.now ?? new Date();
  return runInTransaction(() => {
    const session = loadSession(input.railwayId, input.sessionId);
    const all = listSessionInvitations(session.id);
    let result: { queued: number; skipped: number };
    if (input.kind === 'cancel') {
      if (session.status !== 'cancelled') throw new AppError('bad_request', 'Only a cancelled session sends a cancellation notice.');
      result = queueNotices({ session, host: input.host, invitations: all.filter((i) => i.mailCount > 0), method: 'CANCEL', now });
    } else {
      requirePublished(session, now);
      const standings = input.kind === 'update' ? sessionStandings(session, all) : null;
      const chosen =
        input.kind === 'pending' ? all.filter((i) => i.mailCount === 0) : all.filter((i) => standings?.get(i.id)?.affected === true);
      result = queueNotices({ session, host: input.host, invitations: chosen, method: 'REQUEST', now });
    }
    recordAudit({ railwayId: input.railwayId, userId: input.host.id, action: `send-${input.kind}`, entity: 'session', entityId: session.id, detail: result });
    return result;
  });
}

/**
 * Host: sends one invitation again. A failed e-mail goes back in the queue as it was; otherwise a
 * fresh copy (current SEQUENCE, current reply links) is queued.
 */
export function queueInvitationAgain(input: { railwayId: string; sessionId: string; host: Host; invitationId: string; now?: Date }) {
  const now = input.now ?? new Date();
  return runInTransaction(() => {
    const session = loadSession(input.railwayId, input.sessionId);
    const invitation = listSessionInvitations(session.id).find((i) => i.id === input.invitationId);
    if (!invitation) throw notFound('That invitation');
    if (invitation.mail?.status === 'failed' && requeueFailedInvitationMail(invitation.mail.outboxId, invitation.id)) {
      return { requeued: true, queued: 1 };
    }
    const method = session.status === 'cancelled' ? 'CANCEL' : 'REQUEST';
    if (method === 'REQUEST') requirePublished(session, now);
    else if (invitation.mailCount === 0) throw new AppError('bad_request', 'Nothing was sent to this person, so there is nothing to cancel.');
    const result = queueNotices({ session, host: input.host, invitations: [invitation], method, resend: invitation.mailCount > 0, now });
    return { requeued: false, queued: result.queued };
  });
}

/** When this invitee may be reminded again (null: now), by the one-a-day gap. */
export function nextReminderAt(inv: { remindedAt: Date | null }): Date | null {
  return inv.remindedAt ? new Date(inv.remindedAt.getTime() + REMINDER_GAP_MS) : null;
}

/** Invitees a reminder may go to now: sent an invitation, no reply yet, not reminded within the gap. */
export function remindable<T extends { reply: string; mailCount: number; remindedAt: Date | null }>(invitations: T[], now: Date): T[] {
  return invitations.filter((i) => i.reply === 'needs-action' && i.mailCount > 0 && (nextReminderAt(i)?.getTime() ?? 0) <= now.getTime());
}

/**
 * Host: reminds everyone who was sent an invitation and has not replied, at most once per
 * REMINDER_GAP_MS each (the rest are counted, not sent). A plain e-mail with their runs, the
 * deadline if set and the reply buttons; the calendar event they hold is unchanged.
 */
export function remindAwaitingReply(input: { railwayId: string; sessionId: string; host: Host; now?: Date }) {
  const now = input.now ?? new Date();
  return runInTransaction(() => {
    const session = loadSession(input.railwayId, input.sessionId);
    requirePublished(session, now);
    const all = listSessionInvitations(session.id);
    const awaiting = all.filter((i) => i.reply === 'needs-action' && i.mailCount > 0);
    const due = remindable(awaiting, now);
    const result = queueNotices({ session, host: input.host, invitations: due, method: 'REQUEST', reminder: true, now });
    const tooSoon = awaiting.length - due.length;
    recordAudit({ railwayId: input.railwayId, userId: input.host.id, action: 'remind', entity: 'session', entityId: session.id, detail: { ...result, tooSoon } });
    return { queued: result.queued, tooSoon };
  });
}

/**
 * Host: sets the reply deadline (a wall-clock date and time in the session's zone) or clears it
 * (''). It must lie ahead and no later than the session's start. Replies after it are still taken,
 * and marked late.
 */
export function saveReplyDeadline(input: { railwayId: string; sessionId: string; host: Host; replyBy: string; now?: Date }) {
  const now = input.now ?? new Date();
  return runInTransaction(() => {
    const session = loadSession(input.railwayId, input.sessionId);
    requirePublished(session, now);
    let replyBy: Date | null = null;
    if (input.replyBy) {
      const [date, time] = input.replyBy.split('T') as [string, string];
      replyBy = zonedToUtc(date, time, session.timeZone);
      const field = (message: string) => new AppError('bad_request', message, { issues: [{ path: 'replyBy', message }] });
      if (!replyBy) throw field(`That time does not exist in ${session.timeZone} (the clocks skip it).`);
      if (replyBy.getTime() <= now.getTime()) throw field('Choose a time that is still ahead.');
      if (replyBy.getTime() > session.startsAt.getTime()) throw field('Choose a time no later than the session’s start.');
    }
    setSessionReplyBy(input.railwayId, session.id, replyBy);
    recordAudit({ railwayId: input.railwayId, userId: input.host.id, action: 'reply-deadline', entity: 'session', entityId: session.id, detail: { replyBy: replyBy?.toISOString() ?? null } });
    return { replyBy };
  });
}
