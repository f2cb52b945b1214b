import type { Metadata } from 'next';
import Link from 'next/link';
import { notFound } from 'next/navigation';
import { ReportGraph } from '@/components/live/report-graph';
import { Card } from '@/components/ui/card';
import { buildSessionReport } from '@/lib/live/report';
import { memberForPage } from '@/lib/auth/pages';
import { sessionForPage } from '@/lib/auth/pages';

export const metadata: Metadata = { title: 'Session report' };
export const dynamic = 'force-dynamic';

function Tallies({ title, rows, testId }: { title: string; rows: { name: string; delayFastMin: number; runs: number }[]; testId: string }) {
  return (
    <Card title={title}>
      <ul className="space-y-1 text-sm" data-testid={testId}>
        {rows.map((r) => (
          <li key={r.name} className="flex justify-between gap-2">
            <span>{r.name}</span>
            <span className="tabular-nums">{r.delayFastMin} fast min</span>
          </li>
        ))}
        {rows.length === 0 ? <li className="text-muted">No delay.</li> : null}
      </ul>
    </Card>
  );
}

export default async function SessionReportPage({ params }: { params: Promise<{ railwayId: string; sessionId: string }> }) {
  const { railwayId, sessionId } = await params;
  const { member } = await memberForPage(railwayId, 'operator', `/railways/${railwayId}/sessions/${sessionId}/report`);
  if (!member) notFound();
  const session = sessionForPage(member, sessionId);
  const report = buildSessionReport(session.id);
  const clock = { ratio: session.clockRatio, fastStart: session.fastStart };
  const base = `/railways/${railwayId}/sessions/${session.id}`;
  const p = report.punctuality;
  return (
    <div className="space-y-4" data-testid="session-report">
      <nav aria-label="Session" className="flex flex-wrap gap-4 text-sm font-semibold">
        <Link href={base} className="text-verdigris hover:underline">Timetable</Link>
        <Link href={`${base}/live`} className="text-verdigris hover:underline">Live board</Link>
        <a href={`/api/sessions/${session.id}/report?format=csv`} className="text-verdigris hover:underline" download>Download CSV</a>
      </nav>
      <h2 className="font-display text-2xl font-bold">Report: {session.title}</h2>
      <Card title="Punctuality">
        <p className="text-lg" data-testid="punctuality">
          {p.share === null
            ? 'No run has departed yet.'
            : `${Math.round(p.share * 100)} % of ${p.departed} departed runs left within ${report.punctualWithinFastMin} fast minutes of plan (${p.punctual} punctual).`}
          {p.notRun ? ` ${p.notRun} not run.` : ''}
        </p>
      </Card>
      <Card title="Planned (dashed) and actual (solid)">
        <ReportGraph report={report} clock={clock} />
      </Card>
      <div className="grid gap-4 md:grid-cols-2 xl:grid-cols-4">
        <Tallies title="Delay by train" rows={report.delayByTrain} testId="delay-by-train" />
        <Tallies title="Delay by operator" rows={report.delayByOperator} testId="delay-by-operator" />
        <Tallies title="Delay by block" rows={report.delayByBlock} testId="delay-by-block" />
        <Tallies title="Where delays began" rows={report.delaysBeganIn} testId="delays-began" />
      </div>
      <Card title="Suggested stand times for the next session">
        <ul className="space-y-1 text-sm" data-testid="suggested-stands">
          {report.suggestedStands.map((s) => (
            <li key={s.train}>
              {s.train}: late on {s.lateRuns} of {s.runs} runs — stand {s.suggestedStandS} s before its runs instead of {s.standS} s.
            </li>
          ))}
          {report.suggestedStands.length === 0 ? <li className="text-muted">No train was regularly late.</li> : null}
        </ul>
      </Card>
      <Card title="Runs">
        <div className="overflow-x-auto">
          <table className="w-full text-sm" data-testid="report-runs">
            <thead>
              <tr className="text-left text-muted">
                <th className="py-1 pr-3">Train</th><th className="pr-3">Cab</th><th className="pr-3">Operator</th><th className="pr-3">Planned</th><th className="pr-3">Actual</th><th className="pr-3">Delay</th><th>Arrived</th>
              </tr>
            </thead>
            <tbody className="divide-y divide-line">
              {report.runs.map((r) => (
                <tr key={r.runId}>
                  <td className="py-1 pr-3">{r.train}</td><td className="pr-3">{r.cab}</td><td className="pr-3">{r.operator ?? '—'}</td>
                  <td className="pr-3 tabular-nums">{r.plannedDepart}</td><td className="pr-3 tabular-nums">{r.actualDepart ?? '—'}</td>
                  <td className="pr-3 tabular-nums">{r.departDelayFastMin === null ? '—' : `${r.departDelayFastMin} min`}</td>
                  <td className="tabular-nums">{r.actualArrive ?? '—'}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      </Card>
    </div>
  );
}
