'use client';

import * as Dialog from '@radix-ui/react-dialog';
import { useQuery } from '@tanstack/react-query';
import type { ReactNode } from 'react';
import { fastLabel, fastMinutes, realLabel, type SessionClock } from '@/lib/sessions/time-labels';
import type { RetimeSuggestion } from '@/lib/sessions/types';
import { Button } from '@/components/ui/button';
import { Notice } from '@/components/ui/card';
import type { Move } from '@/lib/runs/schema';
import { timetableApi } from './api';
import { timetableKeys } from './query-keys';
import { describeError } from './use-timetable';

type Props = {
  sessionId: string;
  clock: SessionClock;
  runLabel: (runId: string) => string;
  onApply: (moves: Move[]) => void;
  pending: boolean;
};

/**
 * suggestRetime's proposal as a diff (run, old and new departure); applying it is one transaction.
 * A Radix dialog: the focus stays inside while it is open, Escape or Cancel closes it, and the focus
 * goes back to the button that opened it (`children`, the trigger).
 */
export function RetimeDialog({ open, onOpenChange, children, ...props }: Props & { open: boolean; onOpenChange: (open: boolean) => void; children: ReactNode }) {
  return (
    <Dialog.Root open={open} onOpenChange={onOpenChange}>
      <Dialog.Trigger asChild>{children}</Dialog.Trigger>
      <Dialog.Portal>
        <Dialog.Overlay className="fixed inset-0 z-50 bg-ink/40" />
        <Dialog.Content
          className="fixed inset-x-2 bottom-2 z-50 mx-auto max-h-[90dvh] max-w-2xl overflow-y-auto rounded-plate border border-line bg-surface p-5 shadow-lg sm:bottom-auto sm:top-1/2 sm:-translate-y-1/2"
          data-testid="retime-dialog"
        >
          {/* The proposal is asked for only while the dialog is open (its content unmounts on close). */}
          <RetimeProposal {...props} />
        </Dialog.Content>
      </Dialog.Portal>
    </Dialog.Root>
  );
}

function RetimeProposal({ sessionId, clock, runLabel, onApply, pending }: Props) {
  const query = useQuery({
    queryKey: timetableKeys.retime(sessionId),
    queryFn: () => timetableApi.suggestRetime(sessionId),
    staleTime: 0,
  });
  const moves: RetimeSuggestion[] = query.data?.moves ?? [];
  const total = moves.reduce((sum, m) => sum + m.delayS, 0);
  return (
    <>
      <Dialog.Title className="mb-1 font-display text-lg font-bold">Repair timing</Dialog.Title>
      <Dialog.Description className="mb-3 text-sm text-muted">
        These delays clear every block clash and double booking, keeping each train&apos;s runs in order and delaying as little as the engine can.
        Power overloads are not changed by moving runs in time alone; fix those by changing cabs or trains.
      </Dialog.Description>
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
                    +{Math.round(m.delayS)} s <span className="text-xs text-muted">({fastMinutes(m.delayS, clock, 1)} fast min)</span>
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
        <Dialog.Close asChild>
          <Button type="button" variant="secondary">Cancel</Button>
        </Dialog.Close>
        <Button
          type="button"
          disabled={!moves.length || pending}
          onClick={() => onApply(moves.map(({ runId, version, delayS }) => ({ runId, version, delayS })))}
          data-testid="apply-retime"
        >
          {pending ? 'Applying…' : `Apply ${moves.length} delay${moves.length === 1 ? '' : 's'}`}
        </Button>
      </div>
    </>
  );
}
