'use client';

import { useQuery } from '@tanstack/react-query';
import { fastLabel, fastMinutes, realLabel, type SessionClock } from '@/lib/sessions/time-labels';
import type { RetimeSuggestion } from '@/lib/sessions/types';
import { Button } from '@/components/ui/button';
import { Notice } from '@/components/ui/card';
import { timetableApi, type Move } from './api';
import { timetableKeys } from './query-keys';
import { describeError } from './use-timetable';

/** suggestRetime's proposal as a diff (run, old and new departure); applying it is one transaction. */
export function RetimeDialog({
  sessionId,
  clock,
  runLabel,
  onApply,
  onClose,
  pending,
}: {
  sessionId: string;
  clock: SessionClock;
  runLabel: (runId: string) => string;
  onApply: (moves: Move[]) => void;
  onClose: () => void;
  pending: boolean;
}) {
  const query = useQuery({
    queryKey: timetableKeys.retime(sessionId),
    queryFn: () => timetableApi.suggestRetime(sessionId),
    staleTime: 0,
  });
  const moves: RetimeSuggestion[] = query.data?.moves ?? [];
  const total = moves.reduce((sum, m) => sum + m.delayS, 0);
  return (
    <div className="fixed inset-0 z-50 flex items-end justify-center bg-ink/40 p-2 sm:items-center" role="presentation" onClick={onClose}>
      <div
        role="dialog"
        aria-modal="true"
        aria-labelledby="retime-title"
        className="max-h-[90dvh] w-full max-w-2xl overflow-y-auto rounded-plate border border-line bg-surface p-5 shadow-lg"
        onClick={(e) => e.stopPropagation()}
        data-testid="retime-dialog"
      >
        <h2 id="retime-title" className="mb-1 font-display text-lg font-bold">Repair timing</h2>
        <p className="mb-3 text-sm text-muted">
          These delays clear every block clash and double booking, keeping each train&apos;s runs in order and delaying as little as the engine can.
          Power overloads are not changed by moving runs in time alone; fix those by changing cabs or trains.
        </p>
        {query.isPending ? <p className="text-sm">Working out the delays…</p> : null}
        {query.isError ? <Notice tone="bad">{describeError(query.error)}</Notice> : null}
        {query.isSuccess && moves.length === 0 ? <Notice tone="good">Nothing to move: there are no timing clashes.</Notice> : null}
        {moves.length ? (
          <div className="overflow-x-auto">
            <table className="w-full text-sm" data-testid="retime-diff">
              <thead>
                <tr className="border-b border-line text-left text-xs text-muted">
                  <th className="py-1 pr-2">Run</th>
                  <th className="py-1 pr-2">Departs now</th>
                  <th className="py-1 pr-2">Would depart</th>
                  <th className="py-1">Delay</th>
                </tr>
              </thead>
              <tbody>
                {moves.map((m) => (
                  <tr key={m.runId} className="border-b border-line" data-testid="retime-move">
                    <td className="py-1 pr-2">{runLabel(m.runId)}</td>
                    <td className="py-1 pr-2 tabular-nums">
                      <del className="text-muted">{fastLabel(m.oldDepartS, clock)}</del> <span className="text-xs text-muted">({realLabel(m.oldDepartS, clock)})</span>
                    </td>
                    <td className="py-1 pr-2 font-semibold tabular-nums">
                      {fastLabel(m.newDepartS, clock)} <span className="text-xs font-normal text-muted">({realLabel(m.newDepartS, clock)})</span>
                    </td>
                    <td className="py-1 tabular-nums">
                      +{Math.round(m.delayS)} s <span className="text-xs text-muted">({fastMinutes(m.delayS, clock.ratio)} fast min)</span>
                    </td>
                  </tr>
                ))}
              </tbody>
            </table>
            <p className="mt-2 text-xs text-muted">
              {moves.length} run{moves.length === 1 ? '' : 's'} delayed by {Math.round(total)} real seconds in all. You can undo this afterwards.
            </p>
          </div>
        ) : null}
        <div className="mt-4 flex flex-wrap justify-end gap-2">
          <Button type="button" variant="secondary" onClick={onClose}>Cancel</Button>
          <Button
            type="button"
            disabled={!moves.length || pending}
            onClick={() => onApply(moves.map(({ runId, version, delayS }) => ({ runId, version, delayS })))}
            data-testid="apply-retime"
          >
            {pending ? 'Applying…' : `Apply ${moves.length} delay${moves.length === 1 ? '' : 's'}`}
          </Button>
        </div>
      </div>
    </div>
  );
}
