import type { Metadata } from 'next';
import Link from 'next/link';
import { notFound } from 'next/navigation';
import { NotAllowed } from '@/components/railway/not-allowed';
import { ControlList, ControlTimeline } from '@/components/control/control-timeline';
import { SafetyCautions } from '@/components/layouts/safety-cautions';
import { Card } from '@/components/ui/card';
import { AppError } from '@/lib/errors';
import { z } from 'zod';
import { fastTimeToReal, formatFast, realToFast, timeOfDaySchema } from '@/lib/planning';
import { memberForPage } from '@/lib/auth/pages';
import { sessionControl } from '@/lib/sessions/control';
import { sessionForPage } from '@/lib/auth/pages';

export const metadata: Metadata = { title: 'Control' };
export const dynamic = 'force-dynamic';

/** Which stretch of the schedule the timeline shows: from a fast time, for a number of fast minutes (or all of it). */
const windowSchema = z.object({
  from: timeOfDaySchema({ invalid: 'not a fast time' }).optional().catch(undefined),
  span: z.enum(['15', '30', '60', '120', 'all']).default('60').catch('60'),
});
const SPANS = ['15', '30', '60', '120', 'all'] as const;

export default async function SessionControlPage({
  params,
  searchParams,
}: {
  params: Promise<{ railwayId: string; sessionId: string }>;
  searchParams: Promise<Record<string, string | string[] | undefined>>;
}) {
  const { railwayId, sessionId } = await params;
  const query = windowSchema.parse(await searchParams);
  const page = await memberForPage(railwayId, 'planner', `/railways/${railwayId}/sessions/${sessionId}/control`);
  if (page.denied) return <NotAllowed needs="planner" />;
  const session = sessionForPage(page.member, sessionId);
  const base = `/railways/${railwayId}/sessions/${session.id}`;
  let control;
  try {
    control = sessionControl(session);
  } catch (error) {
    if (error instanceof AppError && error.status === 409) {
      return (
        <Card title="Control">
          <p data-testid="control-missing">{error.message}</p>
          <p className="mt-2 text-sm">
            <Link href={`/railways/${railwayId}/layouts/${session.layoutId}/wiring`} className="text-verdigris hover:underline">Open the wiring sheet</Link>
          </p>
        </Card>
      );
    }
    throw error;
  }
  if (!control) notFound();
  const { schedule, boards } = control;
  const api = `/api/sessions/${session.id}/control`;
  // The window: from the asked fast time, or from the first setting rounded down to 10 fast minutes.
  const fastMinOf = (ms: number) => realToFast(ms / 1000 + schedule.originS, schedule.clock) / 60;
  const firstMs = schedule.entries[0]?.atMs ?? 0;
  const askedS = query.from ? fastTimeToReal(query.from, schedule.clock) : null;
  const fromMs = askedS !== null ? (askedS - schedule.originS) * 1000 : firstMs - ((fastMinOf(firstMs) % 10) * 60_000) / schedule.clock.ratio;
  const spanMs = query.span === 'all' ? null : (Number(query.span) * 60_000) / schedule.clock.ratio;
  const window = spanMs === null ? undefined : { fromMs, toMs: fromMs + spanMs };
  const at = (ms: number) => formatFast(ms / 1000 + schedule.originS, schedule.clock);
  const href = (fromAtMs: number, span: string) => `?from=${encodeURIComponent(at(fromAtMs))}&span=${span}`;
  const windowNav = (
    <nav aria-label="Timeline window" className="mb-3 flex flex-wrap items-center gap-x-4 gap-y-2 text-sm" data-testid="control-window">
      {window ? (
        <>
          <a href={href(window.fromMs - spanMs!, query.span)} className="font-semibold text-verdigris hover:underline">← Earlier</a>
          <span className="font-semibold tabular-nums" data-testid="control-window-range">{at(window.fromMs)}–{at(window.toMs)}</span>
          <a href={href(window.toMs, query.span)} className="font-semibold text-verdigris hover:underline">Later →</a>
        </>
      ) : (
        <span className="font-semibold">The whole session</span>
      )}
      <span className="text-muted">Show</span>
      {SPANS.map((span) =>
        span === query.span ? (
          <span key={span} className="font-semibold" aria-current="true">{span === 'all' ? 'all' : `${span} fast min`}</span>
        ) : (
          <a key={span} href={href(fromMs, span)} className="text-verdigris hover:underline">{span === 'all' ? 'all' : `${span} fast min`}</a>
        ),
      )}
    </nav>
  );
  return (
    <div className="space-y-4" data-testid="control-view">
      <nav aria-label="Session" className="flex flex-wrap gap-4 text-sm font-semibold">
        <Link href={base} className="text-verdigris hover:underline">Timetable and train graph</Link>
        <Link href={`/railways/${railwayId}/layouts/${session.layoutId}/wiring`} className="text-verdigris hover:underline">Wiring sheet</Link>
        <a href={api} className="text-verdigris hover:underline" download>Schedule (JSON)</a>
      </nav>
      <h2 className="font-display text-2xl font-bold">Control: {session.title}</h2>
      <p className="text-sm text-muted">
        {schedule.runs.length} of {schedule.runs.length + schedule.findings.filter((f) => f.kind === 'control-left-out').length} runs scheduled,{' '}
        {schedule.entries.length} timed settings. Times are on the fast clock ({schedule.clock.ratio}:1 from {schedule.clock.fastStart}).
      </p>
      <Card title="Downloads">
        <ul className="space-y-2 text-sm" data-testid="control-downloads">
          {boards.map((b) => (
            <li key={b.id} className="flex flex-col gap-1 sm:flex-row sm:items-baseline sm:gap-3">
              <span className="font-semibold">{b.name}</span>
              <span className="text-muted">{b.title}, {b.entries} settings</span>
              {b.kind === 'header40' ? (
                <a href={`${api}/controller.py?board=${encodeURIComponent(b.id)}`} className="text-verdigris hover:underline" download>Python program (gpiozero)</a>
              ) : (
                <>
                  <a href={`${api}/firmware.zip?board=${encodeURIComponent(b.id)}`} className="text-verdigris hover:underline" download>Firmware (C, Makefile)</a>
                  <span className={b.size?.fits ? 'text-muted' : 'font-semibold text-signal'} data-testid="firmware-fit">{b.size?.advice}</span>
                </>
              )}
            </li>
          ))}
        </ul>
      </Card>
      <Card title="Interlock findings">
        <ul className="space-y-1 text-sm" data-testid="control-findings">
          {schedule.findings.map((f, i) => (
            <li key={i} className={f.severity === 'error' ? 'text-signal' : 'text-amber'}>
              <span className="tabular-nums">{formatFast(f.fromS, schedule.clock)}</span> {f.message}
            </li>
          ))}
          {schedule.findings.length === 0 ? <li className="text-muted">Every run is scheduled and every interlock holds.</li> : null}
        </ul>
      </Card>
      <Card title="Timeline" className="hidden sm:block">
        {windowNav}
        <ControlTimeline schedule={schedule} window={window} />
      </Card>
      <Card title="Settings in order" className="sm:hidden">
        {windowNav}
        <ControlList schedule={schedule} window={window} />
      </Card>
      <SafetyCautions />
    </div>
  );
}
