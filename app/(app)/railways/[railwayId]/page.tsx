import type { Metadata } from 'next';
import { listLayoutsWithCounts } from '@/db/queries/layouts';
import { listMembers } from '@/db/queries/memberships';
import { listOutbox } from '@/db/queries/outbox';
import { listRailwaySessions } from '@/db/queries/sessions';
import { Badge, Card } from '@/components/ui/card';
import { formatInZone } from '@/lib/format';
import { memberForPage } from '@/lib/page-access';
import { errorCounts } from '@/lib/sessions/error-counts';
import Link from 'next/link';
import { notFound } from 'next/navigation';

export const metadata: Metadata = { title: 'Overview' };

const STATUS_TONE = { draft: 'neutral', published: 'good', cancelled: 'bad' } as const;

export default async function RailwayDashboard({ params }: { params: Promise<{ railwayId: string }> }) {
  const { railwayId } = await params;
  const { member } = await memberForPage(railwayId, 'operator', `/railways/${railwayId}`);
  if (!member) notFound();
  const sessions = listRailwaySessions(railwayId, { userId: member.user.id, role: member.role }, { upcomingOnly: true });
  const layouts = listLayoutsWithCounts(railwayId);
  const members = listMembers(railwayId);
  const failedMail = member.role === 'host' ? listOutbox(railwayId).filter((m) => m.status === 'failed' || m.lastError) : [];
  const attention: string[] = [];
  if (failedMail.length) attention.push(`${failedMail.length} e-mail${failedMail.length > 1 ? 's' : ''} could not be delivered yet.`);
  const drafts = sessions.filter((s) => s.status === 'draft');
  if (member.role !== 'operator' && drafts.length) {
    attention.push(`${drafts.length} upcoming session${drafts.length > 1 ? 's are' : ' is'} still a draft and invisible to operators.`);
  }
  if (member.role !== 'operator') {
    const errors = errorCounts(sessions.map((s) => s.id));
    for (const s of sessions) {
      const n = errors.get(s.id) ?? 0;
      if (n) attention.push(`${s.title}: the timetable has ${n} error${n > 1 ? 's' : ''} (clashes or overloads).`);
    }
  }
  const noPassword = members.filter((m) => !m.hasPassword).length;
  if (member.role === 'host' && noPassword) {
    attention.push(`${noPassword} member${noPassword > 1 ? 's have' : ' has'} not signed in yet.`);
  }

  const totals = layouts.reduce(
    (t, l) => ({ blocks: t.blocks + l.blockCount, cabs: t.cabs + l.cabCount, locos: t.locos + l.locomotiveCount, trains: t.trains + l.trainCount }),
    { blocks: 0, cabs: 0, locos: 0, trains: 0 },
  );

  return (
    <div className="grid gap-6 lg:grid-cols-[1fr_20rem]">
      <Card title="Upcoming sessions">
        {sessions.length === 0 ? (
          <p className="text-muted">
            {member.role === 'operator' ? 'No published session has invited you yet.' : 'No upcoming sessions yet.'}
          </p>
        ) : (
          <ul className="divide-y divide-line" data-testid="upcoming-sessions">
            {sessions.map((s) => (
              <li key={s.id} className="flex flex-col items-start gap-1 py-3 sm:flex-row sm:items-center sm:justify-between">
                <div>
                  <Link href={`/railways/${railwayId}/sessions/${s.id}`} className="font-semibold text-verdigris hover:underline">
                    {s.title}
                  </Link>
                  <p className="text-sm text-muted">
                    {formatInZone(s.startsAt, s.timeZone)} · {s.layoutName} · {s.runCount} runs
                  </p>
                </div>
                <Badge tone={STATUS_TONE[s.status]}>{s.status}</Badge>
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
                <li key={a}>{a}</li>
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
              ['Locomotives', totals.locos],
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
