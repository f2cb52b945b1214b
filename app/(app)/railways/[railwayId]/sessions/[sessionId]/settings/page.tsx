import type { Metadata } from 'next';
import Link from 'next/link';
import { notFound } from 'next/navigation';
import { NotAllowed } from '@/components/railway/not-allowed';
import { CheckSummary, SessionForm, StatusForm } from '@/components/sessions/session-form';
import { Badge, Card } from '@/components/ui/card';
import { memberForPage } from '@/lib/auth/pages';
import { checkCounts } from '@/lib/sessions/error-counts';
import { sessionForPage } from '@/lib/auth/pages';
import { utcToZoned } from '@/lib/time-zone';

export const metadata: Metadata = { title: 'Session settings' };

export default async function SessionSettingsPage({ params }: { params: Promise<{ railwayId: string; sessionId: string }> }) {
  const { railwayId, sessionId } = await params;
  const access = await memberForPage(railwayId, 'planner', `/railways/${railwayId}/sessions/${sessionId}/settings`);
  if (access.denied) return <NotAllowed needs="planner" />;
  if (!access.member) notFound();
  const session = sessionForPage(access.member, sessionId);
  const start = utcToZoned(session.startsAt, session.timeZone);
  const end = utcToZoned(session.endsAt, session.timeZone);
  const check = checkCounts(session.id);
  return (
    <div className="grid gap-6 lg:grid-cols-[1fr_20rem]">
      <h1 className="sr-only">Settings of {session.title}</h1>
      <Card title="Settings">
        <p className="mb-4 text-sm">
          <Link href={`/railways/${railwayId}/sessions/${session.id}`} className="text-verdigris hover:underline">← Back to the timetable</Link>
        </p>
        {/* No key from the version: a new key after saving would mount a fresh form and drop its "Saved." notice. */}
        <SessionForm
          railwayId={railwayId}
          timeZone={session.timeZone}
          session={{ id: session.id, version: session.version }}
          values={{
            title: session.title,
            place: session.place,
            description: session.description,
            date: start.date,
            startTime: start.time,
            endTime: end.time,
            clockRatio: session.clockRatio,
            fastStart: session.fastStart,
            headwayS: session.headwayS,
            surgeS: session.surgeS,
            deratePercent: Math.round(session.derate * 100),
            standS: session.standS,
            punctualFastMin: session.punctualFastMin,
          }}
        />
      </Card>
      <Card title="Status">
        <p className="mb-3 text-sm">
          Now <Badge tone={session.status === 'published' ? 'good' : session.status === 'cancelled' ? 'bad' : 'neutral'}>{session.status}</Badge>
        </p>
        <p className="mb-3 text-sm text-muted">
          Only published sessions are visible to the operators invited to them. Publishing, cancelling or moving the date or times raises the calendar
          sequence (now {session.sequence}), so invitees can be sent an update.
        </p>
        <div className="mb-3">
          <CheckSummary check={check} timetableHref={`/railways/${railwayId}/sessions/${session.id}`} />
        </div>
        <StatusForm key={session.version} railwayId={railwayId} session={{ id: session.id, version: session.version, status: session.status, title: session.title }} check={check} />
      </Card>
    </div>
  );
}
