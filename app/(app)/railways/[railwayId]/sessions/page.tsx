import type { Metadata } from 'next';
import Link from 'next/link';
import { notFound } from 'next/navigation';
import { listLayoutsWithCounts } from '@/db/queries/layouts';
import { getRailway } from '@/db/queries/railways';
import { listRailwaySessions } from '@/db/queries/sessions';
import { DuplicateForm, SessionForm } from '@/components/sessions/session-form';
import { Badge, Card } from '@/components/ui/card';
import { SessionStatusBadge, SessionSummary } from '@/components/sessions/session-status';
import { memberForPage } from '@/lib/auth/pages';
import { roleAtLeast } from '@/lib/roles';
import { errorCounts } from '@/lib/sessions/error-counts';

export const metadata: Metadata = { title: 'Sessions' };

export default async function SessionsPage({ params }: { params: Promise<{ railwayId: string }> }) {
  const { railwayId } = await params;
  const { member } = await memberForPage(railwayId, 'operator', `/railways/${railwayId}/sessions`);
  const railway = member ? getRailway(railwayId) : undefined;
  if (!member || !railway) notFound();
  const planner = roleAtLeast(member.role, 'planner');
  const sessions = listRailwaySessions(railwayId, { userId: member.user.id, role: member.role });
  const now = Date.now();
  const upcoming = sessions.filter((s) => s.endsAt.getTime() >= now && s.status !== 'cancelled');
  const cancelled = sessions.filter((s) => s.endsAt.getTime() >= now && s.status === 'cancelled');
  const past = sessions.filter((s) => s.endsAt.getTime() < now).reverse();
  const errors = planner ? errorCounts(sessions.map((s) => s.id)) : new Map<string, number>();
  const layouts = planner ? listLayoutsWithCounts(railwayId) : [];

  const list = (items: typeof sessions, empty: string) =>
    items.length === 0 ? (
      <p className="text-sm text-muted">{empty}</p>
    ) : (
      <ul className="divide-y divide-line" data-testid="session-list">
        {items.map((s) => (
          <li key={s.id} className="space-y-2 py-3" data-testid="session-row">
            <div className="flex flex-col gap-1 sm:flex-row sm:items-center sm:justify-between">
              <SessionSummary railwayId={railwayId} session={s} />
              <div className="flex items-center gap-2">
                {errors.get(s.id) ? <Badge tone="bad">{errors.get(s.id)} errors</Badge> : planner ? <Badge tone="good">checks out</Badge> : null}
                <SessionStatusBadge status={s.status} />
              </div>
            </div>
            {planner ? (
              <details className="text-sm">
                <summary className="cursor-pointer text-muted">Duplicate as a starting point…</summary>
                <div className="pt-2">
                  <DuplicateForm railwayId={railwayId} sessionId={s.id} title={s.title} />
                </div>
              </details>
            ) : null}
          </li>
        ))}
      </ul>
    );

  return (
    <div className="grid gap-6 lg:grid-cols-[1fr_24rem]">
      <h1 className="sr-only">Sessions</h1>
      <div className="space-y-6">
        <Card title="Upcoming sessions">{list(upcoming, member.role === 'operator' ? 'No published session has invited you yet.' : 'No upcoming sessions yet.')}</Card>
        {cancelled.length ? <Card title="Cancelled">{list(cancelled, '')}</Card> : null}
        <Card title="Past sessions">{list(past, 'None yet.')}</Card>
      </div>
      {planner ? (
        <Card title="New session">
          {layouts.length ? (
            <SessionForm railwayId={railwayId} timeZone={railway.timeZone} layouts={layouts.map((l) => ({ id: l.id, name: l.name }))} />
          ) : (
            <p className="text-sm text-muted">
              Add a layout first: a session runs on one layout&apos;s blocks, cabs and trains.{' '}
              <Link href={`/railways/${railwayId}/layouts`} className="text-verdigris hover:underline">Layouts</Link>
            </p>
          )}
        </Card>
      ) : null}
    </div>
  );
}
