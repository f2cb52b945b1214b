'use client';

import { useState } from 'react';
import { Button } from '@/components/ui/button';
import { apiCall } from '@/lib/client/api';
import type { LiveState } from '@/lib/live/types';
import { postLive } from './use-live-session';

/** Start, pause, resume and set the shared fast clock (host or planner). */
export function ClockControls({ state, accept }: { state: LiveState; accept: (s: LiveState) => void }) {
  const [fast, setFast] = useState('');
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const path = `/api/sessions/${state.session.id}/clock`;
  const act = async (body: Record<string, unknown>) => {
    setBusy(true);
    // The stream brings the new state (the clock's answer carries none to take); poll once in case it is cut.
    const failed = await postLive(path, body, accept);
    setError(failed);
    if (!failed) await refreshState(state.session.id, state.seq, accept);
    setBusy(false);
  };
  const s = state.clock.state;
  return (
    <div className="flex flex-wrap items-center gap-2" aria-label="Clock controls">
      {s === 'not-started' ? <Button disabled={busy} onClick={() => act({ action: 'start' })}>Start clock</Button> : null}
      {s === 'running' ? <Button variant="secondary" disabled={busy} onClick={() => act({ action: 'pause' })}>Pause</Button> : null}
      {s === 'paused' ? <Button disabled={busy} onClick={() => act({ action: 'resume' })}>Resume</Button> : null}
      <form
        className="flex items-center gap-1"
        onSubmit={(e) => {
          e.preventDefault();
          void act({ action: 'set', fast });
        }}
      >
        <label className="sr-only" htmlFor="clock-set">Set the clock to (HH:MM)</label>
        <input id="clock-set" value={fast} onChange={(e) => setFast(e.target.value)} placeholder="HH:MM" inputMode="numeric" className="w-20 rounded-plate border border-line bg-surface px-2 py-1.5 text-sm" />
        <Button variant="secondary" disabled={busy || !fast}>Set</Button>
      </form>
      {error ? <p className="w-full text-sm text-signal" role="alert">{error}</p> : null}
    </div>
  );
}

async function refreshState(sessionId: string, seq: number, accept: (s: LiveState) => void) {
  const answer = await apiCall<{ state: LiveState }>('GET', `/api/sessions/${sessionId}/live?after=${seq}`).catch(() => null);
  if (answer) accept(answer.state);
}
