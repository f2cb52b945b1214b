import type { Metadata } from 'next';
import Link from 'next/link';
import { notFound } from 'next/navigation';
import { getRailwaySession, listSessionInvitations } from '@/db/queries/invitation-records';
import { listMembers } from '@/db/queries/memberships';
import { loadSessionRows } from '@/db/queries/plan-data';
import { AutoRefresh } from '@/components/invitations/auto-refresh';
import { InviteCrewForm, NoticeActions, RemindButton, ReplyDeadlineForm, ResendButton } from '@/components/invitations/tracker-forms';
import { NotAllowed } from '@/components/railway/not-allowed';
import { Badge, Card, Notice } from '@/components/ui/card';
import { SessionStatusBadge } from '@/components/sessions/session-status';
import { formatInZone } from '@/lib/time-zone';
import { describeChange, summariseChanges } from '@/lib/invitations/changes';
import { isLate } from '@/lib/invitations/reply';
import { nextReminderAt, remindable, sessionStandings } from '@/lib/invitations/send';
import { utcToZoned } from '@/lib/time-zone';
import { countStates, DELIVERY_LABELS, deliveryOf, needsCancel, REPLY_LABELS, type Delivery } from '@/lib/invitations/tracker';
import { memberForPage } from '@/lib/auth/pages';

export const metadata: Metadata = { title: 'Invitations' };
export const dynamic = 'force-dynamic';

const DELIVERY_TONE: Record<Delivery, 'neutral' | 'info' | 'warn' | 'good' | 'bad'> = {
  'not-sent': 'neutral',
  queued: 'info',
  retrying: 'warn',
  sent: 'good',
  failed: 'bad',
};
const REPLY_TONE = { 'needs-action': 'neutral', accepted: 'good', tentative: 'warn', declined: 'bad' } as const;
export default async function InvitationTrackerPage({ params }: { params: Promise<{ railwayId: string; sessionId: string }> }) {
  const { railwayId, sessionId } = await params;
  const path = `/railways/${railwayId}/sessions/${sessionId}/invitations`;
  const { member } = await memberForPage(railwayId, 'host', path);
  if (!member) return <NotAllowed needs="host" />;
  const session = getRailwaySession(railwayId, sessionId);
  if (!session) notFound();
  const invitations = listSessionInvitations(sessionId);
  const counts = countStates(invitations);
  const invited = new Set(invitations.map((i) => i.userId));
  const runCount = new Map<string, number>();
  for (const run of loadSessionRows(sessionId)?.runs ?? []) {
    if (run.operatorId) runCount.set(run.operatorId, (runCount.get(run.operatorId) ?? 0) + 1);
  }
  const pickable = listMembers(railwayId)
    .filter((m) => !invited.has(m.userId))
    .map((m) => ({ userId: m.userId, name: m.name, email: m.email, role: m.role, runCount: runCount.get(m.userId) ?? 0 }));
  const zone = session.timeZone;
  const pending = invitations.filter((i) => i.mailCount === 0).length;
  const standings = sessionStandings(session, invitations);
  const affected = invitations
    .filter((i) => session.status === 'published' && standings.get(i.id)?.affected)
    .map((i) => {
      const changes = standings.get(i.id)!.changes;
      return { id: i.id, name: i.name, lines: changes.length ? changes.map(describeChange) : ['The session changed since their last e-mail.'] };
    });
  const toCancel = invitations.filter((i) => needsCancel(i, session)).length;
  const now = new Date();
  const ended = session.endsAt.getTime() < now.getTime();
  const open = session.status === 'published' && !ended;
  const awaiting = invitations.filter((i) => i.reply === 'needs-action' && i.mailCount > 0);
  const due = remindable(awaiting, now);
  const waiting = awaiting.filter((i) => !due.includes(i));
  const lastReminded = invitations.reduce<Date | null>((max, i) => (i.remindedAt && (!max || i.remindedAt > max) ? i.remindedAt : max), null);
  const nextReminder = waiting.map((i) => nextReminderAt(i)!).sort((a, b) => a.getTime() - b.getTime())[0] ?? null;
  const short = (d: Date) => formatInZone(d, zone, { weekday: undefined, year: undefined });
  const deadline = session.replyBy ? utcToZoned(session.replyBy, zone) : null;

  return (
    <div className="space-y-6">
      <AutoRefresh />
      <div className="flex flex-col gap-2 sm:flex-row sm:items-end sm:justify-between">
        <div>
          <p className="text-sm text-muted">
            <Link href={`/railways/${railwayId}/sessions/${sessionId}`} className="text-verdigris hover:underline">
              ← {session.title}
            </Link>
          </p>
          <h1 className="font-display text-xl font-bold">Invitations</h1>
          <p className="text-sm text-muted">
            {formatInZone(session.startsAt, zone)} – {formatInZone(session.endsAt, zone, { weekday: undefined, day: undefined, month: undefined, year: undefined })} · {zone} ·{' '}
            <SessionStatusBadge status={session.status} /> · calendar sequence {session.sequence}
          </p>
        </div>
        <a href={`/api/sessions/${sessionId}/calendar.ics`} className="text-sm font-semibold text-verdigris hover:underline">
          Download .ics (whole session)
        </a>
      </div>

      {session.status === 'draft' ? (
        <Notice tone="warn">This session is a draft. Publish it before inviting the crew; operators cannot see drafts.</Notice>
      ) : null}
      {ended ? <Notice tone="info">This session is over; invitations and replies are closed.</Notice> : null}

      <dl className="grid grid-cols-4 gap-2 lg:grid-cols-8" data-testid="invitation-counts">
        {(
          [
            ['Invited', counts.total],
            ['Not sent yet', counts.delivery['not-sent']],
            ['Queued', counts.delivery.queued + counts.delivery.retrying],
            ['Sent', counts.delivery.sent],
            ['Failed', counts.delivery.failed],
            ['Accepted', counts.replies.accepted],
            ['Maybe', counts.replies.tentative],
            ['Declined', counts.replies.declined],
          ] as const
        ).map(([label, value]) => (
          <div key={label} className="rounded-plate border border-line bg-surface p-2 sm:p-3" data-testid={`count-${label.toLowerCase().replaceAll(' ', '-')}`}>
            <dt className="text-[11px] leading-tight text-muted sm:text-xs">{label}</dt>
            <dd className="font-display text-xl font-bold sm:text-2xl">{value}</dd>
          </div>
        ))}
      </dl>

      <NoticeActions
        railwayId={railwayId}
        sessionId={sessionId}
        pending={open ? pending : 0}
        affected={open ? affected : []}
        toCancel={toCancel}
      />

      {open ? (
        <RemindButton
          railwayId={railwayId}
          sessionId={sessionId}
          due={due.length}
          waiting={waiting.length}
          last={lastReminded ? short(lastReminded) : null}
          next={nextReminder ? short(nextReminder) : null}
        />
      ) : null}

      <div className="grid gap-6 lg:grid-cols-[1fr_20rem]">
        <Card title={`Invitees (${invitations.length})`} className="min-w-0">
          {invitations.length === 0 ? (
            <p className="text-sm text-muted">No one is invited yet. Pick the crew on the right.</p>
          ) : (
            <div className="overflow-x-auto">
              <table className="w-full text-left text-sm" data-testid="invitation-table">
                <thead className="text-muted">
                  <tr>
                    <th className="py-2 pr-2 sm:pr-3">Invitee</th>
                    <th className="py-2 pr-2 sm:pr-3">Delivery</th>
                    <th className="py-2 pr-2 sm:pr-3">Reply</th>
                    <th className="hidden py-2 pr-2 sm:pr-3 sm:table-cell">Replied</th>
                    <th className="py-2"><span className="sr-only">Actions</span></th>
                  </tr>
                </thead>
                <tbody className="divide-y divide-line">
                  {invitations.map((inv) => {
                    const delivery = deliveryOf(inv);
                    return (
                      <tr key={inv.id} data-testid="invitation-row" data-email={inv.email}>
                        <td className="py-2 pr-2 sm:pr-3">
                          <span className="font-semibold">{inv.name}</span>
                          <span className="hidden text-xs text-muted sm:block">{inv.email}</span>
                        </td>
                        <td className="py-2 pr-2 sm:whitespace-nowrap sm:pr-3">
                          <Badge tone={DELIVERY_TONE[delivery]}>{DELIVERY_LABELS[delivery]}</Badge>
                          {inv.mail?.calendarMethod === 'CANCEL' ? <span className="ml-1 text-xs text-muted">cancellation</span> : null}
                          {open && standings.get(inv.id)?.affected ? (
                            <span className="block max-w-xs whitespace-normal text-xs text-amber" data-testid="changed-since">
                              Changed since their last e-mail: {summariseChanges(standings.get(inv.id)!.changes) || 'session settings'}
                            </span>
                          ) : null}
                          {inv.mail?.lastError ? <span className="block max-w-xs truncate text-xs text-signal" title={inv.mail.lastError}>{inv.mail.lastError}</span> : null}
                        </td>
                        <td className="py-2 pr-2 sm:whitespace-nowrap sm:pr-3">
                          <span data-testid="reply">
                            <Badge tone={REPLY_TONE[inv.reply]}>
                              {inv.reply === 'declined' && runCount.get(inv.userId) ? 'declined, still has runs' : REPLY_LABELS[inv.reply]}
                            </Badge>
                          </span>
                          {inv.reply === 'declined' && runCount.get(inv.userId) ? (
                            <span className="block text-xs text-signal">
                              {runCount.get(inv.userId)} run{runCount.get(inv.userId) === 1 ? '' : 's'} to hand to someone else
                            </span>
                          ) : null}
                          {isLate(session.replyBy, inv.respondedAt) ? <span className="ml-1"><Badge tone="warn">late</Badge></span> : null}
                          {inv.respondedAt ? (
                            <span className="block text-xs text-muted sm:hidden">{formatInZone(inv.respondedAt, zone, { weekday: undefined, year: undefined })}</span>
                          ) : null}
                          {inv.remindedAt ? (
                            <span className="block whitespace-normal text-xs text-muted" data-testid="reminded">
                              reminded {short(inv.remindedAt)}{inv.reminderCount > 1 ? ` (${inv.reminderCount}×)` : ''}
                            </span>
                          ) : null}
                          {inv.comment ? (
                            <span className="block max-w-xs whitespace-pre-line break-words text-xs italic" data-testid="reply-comment">
                              “{inv.comment}”
                            </span>
                          ) : null}
                        </td>
                        <td className="hidden py-2 pr-2 sm:pr-3 text-muted sm:table-cell">{inv.respondedAt ? formatInZone(inv.respondedAt, zone) : '—'}</td>
                        <td className="py-2 text-right">
                          {(open || (session.status === 'cancelled' && inv.mailCount > 0)) && delivery !== 'queued' ? (
                            <ResendButton
                              railwayId={railwayId}
                              sessionId={sessionId}
                              invitationId={inv.id}
                              label={delivery === 'failed' ? 'Retry' : delivery === 'not-sent' ? 'Send' : 'Resend'}
                            />
                          ) : null}
                        </td>
                      </tr>
                    );
                  })}
                </tbody>
              </table>
            </div>
          )}
          <p className="mt-3 text-xs text-muted">
            “Not sent yet” means the person is on the list but no e-mail was written for them. Replies and their notes appear
            here as they arrive (notes are for the host only); this page refreshes itself.
          </p>
        </Card>
        <div className="space-y-6">
          {open ? (
            <Card title="Reply deadline">
              {session.replyBy ? (
                <p className="mb-2 text-sm" data-testid="deadline-now">
                  Replies wanted by <strong>{formatInZone(session.replyBy, zone)}</strong>.
                </p>
              ) : null}
              <ReplyDeadlineForm railwayId={railwayId} sessionId={sessionId} value={deadline ? `${deadline.date}T${deadline.time}` : ''} timeZone={zone} />
            </Card>
          ) : null}
          {open ? (
            <Card title="Invite crew">
              <InviteCrewForm railwayId={railwayId} sessionId={sessionId} members={pickable} />
            </Card>
          ) : null}
        </div>
      </div>
    </div>
  );
}
