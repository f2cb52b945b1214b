'use client';

import { useState } from 'react';
import { Button } from '@/components/ui/button';
import type { LiveRun, LiveState } from '@/lib/live/types';
import { postLive } from './use-live-session';

const REASONS = ['stalled', 'derailed', 'blocked'] as const;

/** Departed / Arrived / Stopped — needs help, for one run; `large` for a phone. */
export function ReportButtons({ sessionId, run, trainName, accept, large = false }: { sessionId: string; run: LiveRun; trainName: string; accept: (state: LiveState) => void; large?: boolean }) {
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);
  const [asking, setAsking] = useState(false);
  const send = async (body: Record<string, unknown>) => {
    setBusy(true);
    setError(null);
    setError(await postLive(`/api/sessions/${sessionId}/runs/${run.id}/reports`, body, accept));
    setBusy(false);
    setAsking(false);
  };
  const size = large ? 'min-h-14 flex-1 text-lg' : 'px-3 py-1.5';
  const standing = run.status === 'stopped';
  return (
    <div className="space-y-2">
      <div className="flex flex-wrap gap-2" role="group" aria-label={`Report ${trainName}`}>
        {run.status === 'waiting' || run.status === 'due' ? (
          <Button className={size} disabled={busy} onClick={() => send({ kind: 'departed' })}>Departed</Button>
        ) : null}
        {standing ? (
          <Button className={size} disabled={busy} onClick={() => send({ kind: 'departed' })}>Moving again</Button>
        ) : null}
        {run.status === 'running' || standing ? (
          <Button className={size} disabled={busy} onClick={() => send({ kind: 'arrived' })}>Arrived</Button>
        ) : null}
        {run.status === 'running' ? (
          <Button variant="danger" className={size} disabled={busy} aria-expanded={asking} onClick={() => setAsking((v) => !v)}>
            Stopped — needs help
          </Button>
        ) : null}
      </div>
      {asking ? (
        <div className="flex flex-wrap gap-2" role="group" aria-label="Why did it stop?">
          {REASONS.map((reason) => (
            <Button key={reason} variant="danger" className={`${size} capitalize`} disabled={busy} onClick={() => send({ kind: 'stopped', reason })}>
              {reason}
            </Button>
          ))}
        </div>
      ) : null}
      {error ? <p className="text-sm text-signal" role="alert">{error}</p> : null}
    </div>
  );
}
