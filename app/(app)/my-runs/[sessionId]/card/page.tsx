import type { Metadata } from 'next';
import Link from 'next/link';
import { notFound, redirect } from 'next/navigation';
import { PrintButton } from '@/components/crew/print-button';
import { currentUser } from '@/lib/current-user';
import { formatInZone } from '@/lib/time-zone';
import { formatStand } from '@/lib/invitations/assignments';
import { loadMyRuns } from '@/lib/invitations/my-runs';
import { requireSession } from '@/lib/auth/sessions';

export const metadata: Metadata = { title: 'Crew card' };
export const dynamic = 'force-dynamic';

/** A one-page crew card of my runs in one session, to print and keep beside the cab. */
export default async function CrewCardPage({ params }: { params: Promise<{ sessionId: string }> }) {
  const { sessionId } = await params;
  const user = await currentUser();
  if (!user) redirect(`/sign-in?callbackUrl=${encodeURIComponent(`/my-runs/${sessionId}/card`)}`);
  const entry = (await loadMyRuns(user.id)).find((e) => e.session.id === sessionId);
  if (!entry) {
    // A host or planner may open any session's card link: say they have no runs rather than "not found".
    const seen = await requireSession(sessionId, 'view').catch(() => null);
    if (!seen) notFound();
    return (
      <article className="mx-auto max-w-3xl space-y-4" data-testid="crew-card">
        <Link href="/my-runs" className="text-sm font-semibold text-verdigris hover:underline">← My runs</Link>
        <h1 className="font-display text-2xl font-bold">{user.name} — {seen.session.title}</h1>
        <p data-testid="no-runs">You have no runs in this session, so there is no crew card to print. The whole timetable is in the session&apos;s builder.</p>
        <Link href={`/railways/${seen.session.railwayId}/sessions/${seen.session.id}`} className="font-semibold text-verdigris hover:underline">
          Open the timetable
        </Link>
      </article>
    );
  }
  const s = entry.session;
  const handOver = (r: (typeof entry.runs)[number]) =>
    [r.before, r.after].map((n) => (n ? `${n.operatorId === user.id ? 'you' : (n.operatorName ?? '—')} (${n.fastDepart})` : '—')).join(' / ');
  return (
    <article className="mx-auto max-w-3xl space-y-4 print:max-w-none" data-testid="crew-card">
      <div className="no-print flex items-center justify-between gap-3">
        <Link href="/my-runs" className="text-sm font-semibold text-verdigris hover:underline">← My runs</Link>
        <PrintButton />
      </div>
      <header className="border-b-2 border-ink pb-2">
        <p className="text-xs font-semibold uppercase tracking-widest">{entry.railwayName} · crew card</p>
        <h1 className="font-display text-2xl font-bold">{user.name} — {s.title}</h1>
        <p className="text-sm">
          {formatInZone(s.startsAt, s.timeZone)} ({s.timeZone}){s.place ? ` · ${s.place}` : ''} · fast clock {entry.clock.ratio}:1 from {entry.clock.fastStart}
        </p>
        {entry.duties.filter((d) => d.duty !== 'driver').map((d) => (
          <p key={d.duty} className="text-sm font-semibold">
            Duty: {d.duty}
            {d.note ? ` — ${d.note}` : ''}
          </p>
        ))}
      </header>
      {entry.runs.length === 0 ? (
        <p>No runs of your own in this timetable.</p>
      ) : (
        <>
        <ol className="space-y-3 sm:hidden print:hidden" data-testid="crew-card-list">
          {entry.runs.map((r) => (
            <li key={r.runId} className="rounded-plate border border-line p-3 text-sm">
              <p className="font-bold">
                {r.fastDepart}–{r.fastArrive} fast <span className="font-normal">({r.realDepart}–{r.realArrive} real)</span>
              </p>
              <p>
                {r.trainName} on <strong>{r.cabName}</strong>
              </p>
              <p>Route: {r.route.join(' → ')}</p>
              <p>Stand: {formatStand(r.standBeforeS)} before, {formatStand(r.standAfterS)} after</p>
              <p>
                Cab before / after:{' '}
                {handOver(r)}
              </p>
            </li>
          ))}
        </ol>
        <div className="hidden overflow-x-auto sm:block print:block">
          <table className="w-full min-w-[40rem] border-collapse text-left text-sm">
            <thead>
              <tr className="border-b border-ink">
                <th className="py-1 pr-2">Fast</th>
                <th className="py-1 pr-2">Real</th>
                <th className="py-1 pr-2">Train</th>
                <th className="py-1 pr-2">Cab</th>
                <th className="py-1 pr-2">Route</th>
                <th className="py-1 pr-2">Stand before / after</th>
                <th className="py-1">Cab before / after</th>
              </tr>
            </thead>
            <tbody>
              {entry.runs.map((r) => (
                <tr key={r.runId} className="border-b border-line align-top" data-testid="crew-card-run">
                  <td className="py-1 pr-2 font-bold">{r.fastDepart}–{r.fastArrive}</td>
                  <td className="py-1 pr-2">{r.realDepart}–{r.realArrive}</td>
                  <td className="py-1 pr-2">{r.trainName}</td>
                  <td className="py-1 pr-2 font-semibold">{r.cabName}</td>
                  <td className="py-1 pr-2">{r.route.join(' → ')}</td>
                  <td className="py-1 pr-2">{formatStand(r.standBeforeS)} / {formatStand(r.standAfterS)}</td>
                  <td className="py-1">{handOver(r)}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
        </>
      )}
      <footer className="text-xs text-muted">
        Driver heat sinks can reach burn temperatures; allow airflow. Fuse or current-limit every supply output. Fishplate&apos;s figures are planning aids, not a substitute for the manufacturer&apos;s ratings, local codes or a licensed electrician.
      </footer>
    </article>
  );
}
