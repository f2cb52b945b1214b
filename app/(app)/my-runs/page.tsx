import type { Metadata } from 'next';
import Link from 'next/link';
import { redirect } from 'next/navigation';
import { getCalendarToken } from '@/db/queries/calendar-feed';
import { FeedLinks } from '@/components/crew/feed-links';
import { MyLiveRunsSlot } from '@/components/live/my-live-runs-slot';
import { ReplyButtons } from '@/components/crew/reply-buttons';
import { RunCard } from '@/components/crew/run-card';
import { Card } from '@/components/ui/card';
import { currentUser } from '@/lib/current-user';
import { formatInZone } from '@/lib/time-zone';
import { absoluteUrl } from '@/lib/mail/account-mail';
import { loadMyRuns, type MyRunsSession } from '@/lib/invitations/my-runs';

export const metadata: Metadata = { title: 'My runs' };
export const dynamic = 'force-dynamic';

function SessionBlock({ entry, first, viewerId }: { entry: MyRunsSession; first: boolean; viewerId: string }) {
  const s = entry.session;
  const otherDuties = entry.duties.filter((d) => d.duty !== 'driver');
  return (
    <section className="space-y-3" data-testid="my-session" aria-labelledby={`session-${s.id}`}>
      <MyLiveRunsSlot session={s} userId={viewerId} />
      <Card>
        <p className="text-xs font-semibold uppercase tracking-widest text-brass">
          {first ? 'Next session' : 'Later'} · {entry.railwayName}
        </p>
        <h2 id={`session-${s.id}`} className="font-display text-2xl font-bold">{s.title}</h2>
        <p className="text-sm">
          {formatInZone(s.startsAt, s.timeZone)} – {formatInZone(s.endsAt, s.timeZone, { weekday: undefined, day: undefined, month: undefined, year: undefined })}{' '}
          <span className="text-muted">({s.timeZone})</span>
        </p>
        {s.place ? <p className="text-sm text-muted">{s.place}</p> : null}
        <p className="mt-1 text-sm text-muted">
          Fast clock {entry.clock.ratio}:1 from {entry.clock.fastStart} · {entry.runs.length} run{entry.runs.length === 1 ? '' : 's'} for you
        </p>
        {otherDuties.length ? (
          <ul className="mt-2 space-y-1 text-sm" data-testid="my-duties">
            {otherDuties.map((d) => (
              <li key={d.duty} className="rounded-plate bg-brass-soft px-3 py-2 text-brass">
                <span className="font-semibold capitalize">{d.duty}</span>
                {d.note ? `: ${d.note}` : ''}
              </li>
            ))}
          </ul>
        ) : null}
        <div className="mt-4">
          <ReplyButtons invitationId={entry.invitationId} current={entry.reply} />
        </div>
        <div className="mt-4 flex flex-wrap gap-x-4 gap-y-2 text-sm font-semibold">
          {/* Not prefetched: the builder's code is for those who open it, not for every phone that shows My runs. */}
          <Link href={`/railways/${s.railwayId}/sessions/${s.id}`} prefetch={false} className="text-verdigris hover:underline">
            Published timetable
          </Link>
          <Link href={`/my-runs/${s.id}/card`} className="text-verdigris hover:underline">
            Crew card (print)
          </Link>
          <a href={`/api/sessions/${s.id}/calendar.ics`} className="text-verdigris hover:underline">
            Add to calendar (.ics)
          </a>
        </div>
      </Card>
      {entry.runs.length ? (
        <ol className="space-y-3" aria-label={`My runs in ${s.title}`}>
          {entry.runs.map((run, i) => (
            <RunCard key={run.runId} run={run} index={i} viewerId={viewerId} />
          ))}
        </ol>
      ) : (
        <p className="rounded-plate border border-dashed border-line p-4 text-sm text-muted">
          No runs of your own in this timetable{otherDuties.length ? ' — see your duties above.' : ' yet.'}
        </p>
      )}
    </section>
  );
}

export default async function MyRunsPage() {
  const user = await currentUser();
  if (!user) redirect('/sign-in?callbackUrl=%2Fmy-runs');
  const sessions = await loadMyRuns(user.id);
  const token = getCalendarToken(user.id);
  const [next, ...later] = sessions;
  return (
    <div className="mx-auto max-w-2xl space-y-6">
      <div>
        <h1 className="font-display text-2xl font-bold sm:text-3xl">My runs</h1>
        <p className="text-sm text-muted">When, which cab, which train — for every session you are invited to.</p>
      </div>
      {next ? (
        <SessionBlock entry={next} first viewerId={user.id} />
      ) : (
        <Card>
          <p className="text-muted" data-testid="no-sessions">
            No upcoming published session has invited you yet. When a host invites you, it appears here.
          </p>
        </Card>
      )}
      {later.length ? (
        <div className="space-y-6">
          <h2 className="font-display text-lg font-bold">Later sessions</h2>
          {later.map((entry) => (
            <SessionBlock key={entry.session.id} entry={entry} first={false} viewerId={user.id} />
          ))}
        </div>
      ) : null}
      {token ? (
        <Card title="My calendar feed">
          <FeedLinks httpsUrl={absoluteUrl(`/api/calendar/${token}`)} />
        </Card>
      ) : null}
    </div>
  );
}
