import type { Metadata } from 'next';
import Link from 'next/link';
import { notFound } from 'next/navigation';
import { LiveBoard } from '@/components/live/live-board';
import { buildLiveState } from '@/lib/live/state';
import { memberForPage } from '@/lib/auth/pages';
import { roleAtLeast } from '@/lib/roles';
import { sessionForPage } from '@/lib/auth/pages';

export const metadata: Metadata = { title: 'Live board' };
export const dynamic = 'force-dynamic';

export default async function LiveBoardPage({ params }: { params: Promise<{ railwayId: string; sessionId: string }> }) {
  const { railwayId, sessionId } = await params;
  const { member } = await memberForPage(railwayId, 'operator', `/railways/${railwayId}/sessions/${sessionId}/live`);
  if (!member) notFound();
  const session = sessionForPage(member, sessionId);
  const base = `/railways/${railwayId}/sessions/${session.id}`;
  return (
    <div className="space-y-3">
      <nav aria-label="Session" className="flex flex-wrap gap-4 text-sm font-semibold">
        <Link href={base} className="text-verdigris hover:underline">Timetable</Link>
        <Link href={`${base}/report`} className="text-verdigris hover:underline">Report</Link>
        <Link href="/my-runs" className="text-verdigris hover:underline">My runs</Link>
      </nav>
      <LiveBoard sessionId={session.id} initial={buildLiveState(session.id)} canControl={roleAtLeast(member.role, 'planner')} isHost={member.role === 'host'} />
    </div>
  );
}
