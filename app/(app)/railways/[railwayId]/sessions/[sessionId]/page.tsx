import type { Metadata } from 'next';
import Link from 'next/link';
import { notFound } from 'next/navigation';
import { TimetableBuilder } from '@/components/timetable/timetable-builder';
import { SessionStatusBadge } from '@/components/sessions/session-status';
import { formatInZone, formatTimeInZone } from '@/lib/time-zone';
import { memberForPage } from '@/lib/auth/pages';
import { roleAtLeast } from '@/lib/roles';
import { timetablePageProps, loadSessionPlan } from '@/lib/sessions/timetable';
import { sessionForPage } from '@/lib/auth/pages';

export const metadata: Metadata = { title: 'Timetable' };

export default async function SessionTimetablePage({ params }: { params: Promise<{ railwayId: string; sessionId: string }> }) {
  const { railwayId, sessionId } = await params;
  const { member } = await memberForPage(railwayId, 'operator', `/railways/${railwayId}/sessions/${sessionId}`);
  if (!member) notFound();
  const session = sessionForPage(member, sessionId);
  const canEdit = roleAtLeast(member.role, 'planner');
  const loaded = loadSessionPlan(session.id);
  const { rows } = loaded;
  const { initial, layout } = timetablePageProps(session.id, loaded);
  const dateLabel = `${formatInZone(session.startsAt, session.timeZone)}–${formatTimeInZone(session.endsAt, session.timeZone)} (${session.timeZone})`;
  const base = `/railways/${railwayId}/sessions/${session.id}`;
  return (
    <div className="space-y-4">
      <div className="no-print flex flex-col gap-3 sm:flex-row sm:items-end sm:justify-between">
        <div>
          <p className="text-sm">
            <Link href={`/railways/${railwayId}/sessions`} className="text-verdigris hover:underline">Sessions</Link>
          </p>
          <h1 className="flex flex-wrap items-center gap-2 font-display text-xl font-bold sm:text-2xl" data-testid="session-title">
            {session.title} <SessionStatusBadge status={session.status} />
          </h1>
          <p className="text-sm text-muted">
            {dateLabel} · {rows.layout?.name} · fast clock {session.clockRatio}:1 from {session.fastStart}
          </p>
        </div>
        <nav aria-label="Session" className="flex flex-wrap gap-3 text-sm font-semibold">
          <Link href={`${base}/live`} className="text-verdigris hover:underline">Live board</Link>
          {canEdit ? (
            <>
              <Link href={`${base}/settings`} className="text-verdigris hover:underline">Settings and status</Link>
              <Link href={`${base}/invitations`} className="text-verdigris hover:underline">Invitations</Link>
              <Link href={`${base}/control`} className="text-verdigris hover:underline">Control</Link>
              <a href={`/api/sessions/${session.id}/plan`} className="text-verdigris hover:underline" download>Plan (JSON)</a>
            </>
          ) : null}
        </nav>
      </div>
      <TimetableBuilder
        sessionId={session.id}
        initial={initial}
        layout={layout}
        canEdit={canEdit}
        dateLabel={dateLabel}
        status={{ railwayId, version: session.version, status: session.status, title: session.title }}
      />
    </div>
  );
}
