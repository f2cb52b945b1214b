import Link from 'next/link';
import { Badge } from '@/components/ui/card';
import type { SessionStatus } from '@/lib/sessions/types';
import { formatInZone } from '@/lib/time-zone';

const STATUS_TONE = { draft: 'neutral', published: 'good', cancelled: 'bad' } as const satisfies Record<SessionStatus, string>;

export function SessionStatusBadge({ status }: { status: SessionStatus }) {
  return <Badge tone={STATUS_TONE[status]}>{status}</Badge>;
}

/** A session in a list: its title linking to it, then when, on which layout and how many runs. */
export function SessionSummary({
  railwayId,
  session,
}: {
  railwayId: string;
  session: { id: string; title: string; startsAt: Date; timeZone: string; layoutName: string; runCount: number };
}) {
  return (
    <div>
      <Link href={`/railways/${railwayId}/sessions/${session.id}`} className="font-semibold text-verdigris hover:underline">
        {session.title}
      </Link>
      <p className="text-sm text-muted">
        {formatInZone(session.startsAt, session.timeZone)} · {session.layoutName} · {session.runCount} runs
      </p>
    </div>
  );
}
