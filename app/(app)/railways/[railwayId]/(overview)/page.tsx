import type { Metadata } from 'next';
import { listLayoutsWithCounts } from '@/db/queries/layouts';
import { listMembers } from '@/db/queries/memberships';
import { getRailwaySession } from '@/db/queries/invitation-records';
import { listOutbox } from '@/db/queries/outbox';
import { listRailwaySessions } from '@/db/queries/sessions';
import { Card } from '@/components/ui/card';
import { SessionStatusBadge, SessionSummary } from '@/components/sessions/session-status';
import { formatDateInZone } from '@/lib/time-zone';
import { crewStatus } from '@/lib/invitations/crew-status';
import { memberForPage } from '@/lib/auth/pages';
import { roleAtLeast } from '@/lib/roles';
import { errorCounts } from '@/lib/sessions/error-counts';
import Link from 'next/link';
import { notFound } from 'next/navigation';

export const metadata: Metadata = { title: 'Overview' };

export default async function RailwayDashboard({ params }: { params: Promise<{ railwayId: string }> }) {
  const { railwayId } = await params;
  const { member } = await memberForPage(railwayId, 'operator', `/railways/${railwayId}`);
  if (!member) notFound();
  // Cancelled sessions are neither upcoming nor in need of anything.
  const sessions = listRailwaySessions(railwayId, { userId: member.user.id, role: member.role }, { upcomingOnly: true }).filter((s) => s.status !== 'cancelled');
  const layouts = listLayoutsWithCounts(railwayId);
  const members = listMembers(railwayId);
  const base = `/railways/${railwayId}`;
  const failedMail = member.role === 'host' ? listOutbox(railwayId).filter((m) => m.status === 'failed' || m.lastError) : [];
  // Each item says which session it is about (title and date, since two sessions may share a title) and links to where it is fixed.
  const attention: { key: string; text: string; href: string }[] = [];
  const sessionName = (s: (typeof sessions)[number]) => `${s.title} (${formatDateInZone(s.startsAt, s.timeZone)})`;
  if (failedMail.length) attention.push({ key: 'mail', text: `${failedMail.length} e-mail${failedMail.length > 1 ? 's' : ''} could not be delivered yet.`, href: `${base}/mail` });
  if (member.role !== 'operator') {
    for (const s of sessions.filter((x) => x.status === 'draft')) {
      attention.push({ key: `draft-${s.id}`, text: `${sessionName(s)} is still a draft and invisible to operators.`, href: `${base}/sessions/${s.id}` });
    }
    const errors = errorCounts(sessions.map((s) => s.id));
    for (const s of sessions) {
      const n = errors.get(s.id) ?? 0;
      if (n) attention.push({ key: `errors-${s.id}`, text: `${sessionName(s)}: the timetable has ${n} error${n > 1 ? 's' : ''} (clashes or overloads).`, href: `${base}/sessions/${s.id}` });
    }
    // The crew's replies and changes since their invitations (published sessions; names are for hosts and planners).
    for (const s of sessions.filter((x) => x.status === 'published')) {
      const full = getRailwaySession(railwayId, s.id);
      if (!full) continue;
      const crew = crewStatus(full);
      const tracker = member.role === 'host' ? `${base}/sessions/${s.id}/invitations` : `${base}/sessions/${s.id}`;
      if (crew.declinedWithRuns.length) {
        const names = crew.declinedWithRuns.join(', ');
        attention.push({ key: `declined-${s.id}`, text: `${sessionName(s)}: declined, still has runs: ${names}.`, href: `${base}/sessions/${s.id}` });
      }
      if (member.role === 'host' && crew.affected) {
        attention.push({ key: `changed-${s.id}`, text: `${sessionName(s)}: ${crew.affected} invitee${crew.affected > 1 ? 's are' : ' is'} affected by changes since their last e-mail; send an update.`, href: tracker });
      }
      if (member.role === 'host' && crew.noReply && crew.pastDeadline) {
        attention.push({ key: `no-reply-${s.id}`, text: `${sessionName(s)}: ${crew.noReply} invitee${crew.noReply > 1 ? 's have' : ' has'} not replied and the reply deadline has passed.`, href: tracker });
      }
    }
  }
  const noPassword = members.filter((m) => !m.hasPassword).length;
  if (member.role === 'host' && noPassword) {
    attention.push({ key: 'members', text: `${noPassword} member${noPassword > 1 ? 's have' : ' has'} not signed in yet.`, href: `${base}/members` });
  }

  const totals = layouts.reduce(
    (t, l) => ({ blocks: t.blocks + l.blockCount, cabs: t.cabs + l.cabCount, locomotives: t.locomotives + l.locomotiveCount, trains: t.trains + l.trainCount }),
    { blocks: 0, cabs: 0, locomotives: 0, trains: 0 },
  );

  // A new railway's next steps, in the order the work goes; shown until each is done.
  const first = layouts[0];
  const layoutBase = first ? `${base}/layouts/${first.id}` : `${base}/layouts`;
  const steps = [
    { done: layouts.length > 0, text: 'Add a layout: its name and scale', href: `${base}/layouts`, who: 'planner' },
    { done: totals.blocks > 1, text: 'Draw the track: blocks and the links between them', href: `${layoutBase}/track`, who: 'planner' },
    { done: totals.cabs > 0, text: 'Add power: supplies, drivers and cabs', href: `${layoutBase}/power`, who: 'planner' },
    { done: totals.trains > 0, text: 'Add locomotives and make them into trains', href: `${layoutBase}/stock`, who: 'planner' },
    { done: members.length > 1, text: 'Add your crew as members', href: `${base}/members`, who: 'host' },
    { done: sessions.length > 0, text: 'Plan a session and build its timetable', href: `${base}/sessions`, who: 'planner' },
  ] as const;
  const mySteps = steps.filter((step) => roleAtLeast(member.role, step.who));
  const next = mySteps.find((step) => !step.done);

  return (
    <div className="grid gap-6 lg:grid-cols-[1fr_20rem]">
      <h1 className="sr-only">Overview</h1>
      {next ? (
        <Card title="Getting started" className="lg:col-span-2">
          <ol className="space-y-2 text-sm" data-testid="getting-started">
            {mySteps.map((step) => (
              <li key={step.text} className="flex items-center gap-2">
                <span aria-hidden className={`inline-flex h-5 w-5 items-center justify-center rounded-full text-xs font-bold ${step.done ? 'bg-verdigris text-surface' : 'border border-line'}`}>
                  {step.done ? '✓' : ''}
                </span>
                {step.done ? (
                  <span className="text-muted line-through">{step.text}<span className="sr-only"> (done)</span></span>
                ) : step === next ? (
                  <Link href={step.href} className="font-semibold text-verdigris hover:underline" data-testid="next-step">
                    Next: {step.text}
                  </Link>
                ) : (
                  <Link href={step.href} className="text-ink hover:underline">{step.text}</Link>
                )}
              </li>
            ))}
          </ol>
        </Card>
      ) : null}
      <Card title="Upcoming sessions">
        {sessions.length === 0 ? (
          <p className="text-muted">
            {member.role === 'operator' ? 'No published session has invited you yet.' : 'No upcoming sessions yet.'}
          </p>
        ) : (
          <ul className="divide-y divide-line" data-testid="upcoming-sessions">
            {sessions.map((s) => (
              <li key={s.id} className="flex flex-col items-start gap-1 py-3 sm:flex-row sm:items-center sm:justify-between">
                <SessionSummary railwayId={railwayId} session={s} />
                <SessionStatusBadge status={s.status} />
              </li>
            ))}
          </ul>
        )}
      </Card>
      <div className="space-y-6">
        <Card title="Needs attention">
          {attention.length === 0 ? (
            <p className="text-sm text-muted">Nothing right now.</p>
          ) : (
            <ul className="list-inside list-disc space-y-1 text-sm" data-testid="attention">
              {attention.map((a) => (
                <li key={a.key}>
                  <Link href={a.href} className="text-verdigris hover:underline">{a.text}</Link>
                </li>
              ))}
            </ul>
          )}
        </Card>
        <Card title="This railway">
          <dl className="grid grid-cols-2 gap-3 text-sm">
            {[
              ['Layouts', layouts.length],
              ['Members', members.length],
              ['Blocks', totals.blocks],
              ['Cabs', totals.cabs],
              ['Locomotives', totals.locomotives],
              ['Trains', totals.trains],
            ].map(([label, value]) => (
              <div key={label} className="rounded-plate bg-sunken p-3">
                <dt className="text-muted">{label}</dt>
                <dd className="font-display text-2xl font-bold">{value}</dd>
              </div>
            ))}
          </dl>
        </Card>
      </div>
    </div>
  );
}
