'use client';

import { useEffect, useId, useState } from 'react';
import { Button } from '@/components/ui/button';
import { inputClass } from '@/components/ui/field';
import { apiCall } from '@/lib/client/api';
import type { LiveRun, LiveState, RunReportHistory } from '@/lib/live/types';
import { fastAt } from './live-format';
import { postLive } from './use-live-session';

type Kind = 'departed' | 'arrived' | 'stopped';
const KIND_LABEL: Record<Kind, string> = { departed: 'Departure', arrived: 'Arrival', stopped: 'Stop' };

/**
 * Puts a wrong report right: sets the fast time a run really departed, arrived or stopped, or
 * withdraws the report; below, who reported and corrected what (the run's operator or the host).
 */
export function CorrectReports({
  state,
  accept,
  runs,
  trainName,
}: {
  state: LiveState;
  accept: (s: LiveState) => void;
  /** The runs that may be corrected here (the ones with a report). */
  runs: LiveRun[];
  trainName: (run: LiveRun) => string;
}) {
  const clock = state.clock.clock;
  const [chosen, setChosen] = useState<string>('');
  const run = runs.find((r) => r.id === chosen) ?? runs.at(-1);
  const [history, setHistory] = useState<RunReportHistory | null>(null);
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const selectId = useId();
  const sessionId = state.session.id;
  const runId = run?.id;

  useEffect(() => {
    if (!runId) return;
    let current = true;
    apiCall<RunReportHistory>('GET', `/api/sessions/${sessionId}/runs/${runId}/reports`)
      .then((body) => {
        if (current && body) setHistory(body);
      })
      .catch(() => undefined);
    return () => {
      current = false;
    };
  }, [sessionId, runId, state.seq]);

  if (!run) return <p className="text-muted">No reports yet.</p>;
  const send = async (body: Record<string, unknown>) => {
    setBusy(true);
    setError(await postLive(`/api/sessions/${sessionId}/runs/${run.id}/reports`, body, accept));
    setBusy(false);
  };
  const reported: { kind: Kind; at: number }[] = [];
  if (run.actual.departS !== null) reported.push({ kind: 'departed', at: run.actual.departS });
  if (run.actual.stop) reported.push({ kind: 'stopped', at: run.actual.stop.fromS });
  if (run.actual.arriveS !== null) reported.push({ kind: 'arrived', at: run.actual.arriveS });
  const shown = history?.runId === run.id ? history.reports : [];

  return (
    <div className="space-y-3" data-testid="correct-reports">
      <div className="flex flex-col gap-1">
        <label htmlFor={selectId} className="text-sm font-semibold">Run</label>
        <select id={selectId} value={run.id} onChange={(e) => setChosen(e.target.value)} className={inputClass}>
          {runs.map((r) => (
            <option key={r.id} value={r.id}>{trainName(r)} · planned {fastAt(r.plannedDepartS, clock)}</option>
          ))}
        </select>
      </div>
      <ul className="space-y-2">
        {reported.map((r) => (
          <CorrectionRow key={`${run.id}-${r.kind}-${r.at}`} kind={r.kind} at={fastAt(r.at, clock)} busy={busy} send={send} />
        ))}
        {reported.length === 0 ? <li className="text-sm text-muted">Nothing reported for this run now.</li> : null}
      </ul>
      {error ? <p className="text-sm text-signal" role="alert">{error}</p> : null}
      <div>
        <h3 className="text-sm font-semibold">Who reported what</h3>
        <ol className="mt-1 space-y-0.5 text-sm" data-testid="report-history">
          {shown.map((r) => (
            <li key={r.id} className={r.withdrawn ? 'text-muted' : undefined}>
              <span className="tabular-nums">{r.fast}</span> {r.kind}
              {r.reason ? ` (${r.reason})` : ''} — {r.withdrawn ? 'withdrawn' : r.correction ? 'corrected' : 'reported'} by {r.by}
              <span className="text-muted"> at {new Date(r.reportedAt).toLocaleTimeString([], { hour: '2-digit', minute: '2-digit', second: '2-digit' })}</span>
            </li>
          ))}
        </ol>
      </div>
    </div>
  );
}

function CorrectionRow({ kind, at, busy, send }: { kind: Kind; at: string; busy: boolean; send: (body: Record<string, unknown>) => Promise<void> }) {
  const [fast, setFast] = useState(at);
  const inputId = useId();
  return (
    <li className="flex flex-wrap items-center gap-2" data-testid="correction-row" data-kind={kind}>
      <span className="w-24 text-sm font-semibold">{KIND_LABEL[kind]}</span>
      <form
        className="flex items-center gap-1"
        onSubmit={(e) => {
          e.preventDefault();
          void send({ kind, fast: fast.trim() });
        }}
      >
        <label className="sr-only" htmlFor={inputId}>{`${KIND_LABEL[kind]} at (fast HH:MM)`}</label>
        <input id={inputId} value={fast} onChange={(e) => setFast(e.target.value)} maxLength={5} placeholder="HH:MM" inputMode="numeric" className="w-20 rounded-plate border border-line bg-surface px-2 py-1.5 text-sm tabular-nums" />
        <Button variant="secondary" className="px-3 py-1.5" disabled={busy || fast.trim() === at}>Set time</Button>
      </form>
      <Button variant="danger" className="px-3 py-1.5" disabled={busy} onClick={() => void send({ kind, withdraw: true })}>Withdraw</Button>
    </li>
  );
}
