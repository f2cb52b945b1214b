'use client';

import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { useCallback, useRef, useState } from 'react';
import type { TimetableChange, TimetableSnapshot } from '@/lib/sessions/types';
import { ApiError } from '@/lib/client/api';
import { restoreEdit, runFieldsOf, shiftTiming } from '@/lib/runs/fields';
import type { CreateRunBody, Move, Run, UpdateRunBody } from '@/lib/runs/schema';
import { timetableApi } from './api';
import { timetableKeys } from './query-keys';

/** One change the builder can make; each knows how to take itself back. */
export type TimetableAction =
  | { type: 'create'; body: CreateRunBody; label: string }
  | { type: 'patch'; run: Run; body: UpdateRunBody; label: string }
  | { type: 'delete'; run: Run; label: string }
  | { type: 'series'; run: Run; everyFastMin: number; count: number; label: string }
  | { type: 'retime'; moves: Move[]; label: string }
  | { type: 'undo-retime'; moves: Move[]; label: string }
  | { type: 'delete-many'; runs: Run[]; label: string };

export type Undoable = { label: string; action: TimetableAction };

function snapshotPart(change: TimetableChange): TimetableSnapshot {
  return {
    session: change.session,
    runs: change.runs,
    findings: change.findings,
    counts: change.counts,
    totals: change.totals,
    truncated: change.truncated,
    checkMs: change.checkMs,
  };
}

async function perform(sessionId: string, action: TimetableAction): Promise<TimetableChange> {
  switch (action.type) {
    case 'create':
      return timetableApi.createRun(sessionId, action.body);
    case 'patch':
      return timetableApi.patchRun(sessionId, action.run.id, action.body);
    case 'delete':
      return timetableApi.deleteRun(sessionId, action.run.id, action.run.version);
    case 'series':
      return timetableApi.series(sessionId, action.run.id, { everyFastMin: action.everyFastMin, count: action.count });
    case 'retime':
      return timetableApi.applyRetime(sessionId, action.moves);
    case 'undo-retime':
      return timetableApi.undoRetime(sessionId, action.moves);
    case 'delete-many': {
      let last: TimetableChange | undefined;
      for (const run of action.runs) last = await timetableApi.deleteRun(sessionId, run.id, run.version);
      return last!;
    }
  }
}

/** The change that takes `action` back, given what the server answered. */
function undoOf(action: TimetableAction, change: TimetableChange): Undoable | undefined {
  switch (action.type) {
    case 'create':
      return change.run ? { label: `Added ${action.label}`, action: { type: 'delete', run: change.run, label: action.label } } : undefined;
    case 'patch': {
      const now = change.run;
      if (!now) return undefined;
      const before = action.run;
      return {
        label: `Changed ${action.label}`,
        action: {
          type: 'patch',
          run: now,
          label: action.label,
          body: restoreEdit(before, now.version),
        },
      };
    }
    case 'delete':
      return { label: `Deleted ${action.label}`, action: { type: 'create', body: runFieldsOf(action.run), label: action.label } };
    case 'series': {
      const made = (change.createdIds ?? []).map((id) => change.runs.find((r) => r.id === id)).filter((r): r is Run => Boolean(r));
      return { label: `Added ${made.length} copies of ${action.label}`, action: { type: 'delete-many', runs: made, label: action.label } };
    }
    case 'retime':
      return change.undo ? { label: `Repaired timing (${action.moves.length} run${action.moves.length === 1 ? '' : 's'} moved)`, action: { type: 'undo-retime', moves: change.undo, label: 'repair' } } : undefined;
    case 'undo-retime':
    case 'delete-many':
      return undefined;
  }
}

/** Shows the change at once, before the server has answered (moves and deletes). */
function optimistic(snapshot: TimetableSnapshot, action: TimetableAction): TimetableSnapshot | undefined {
  if (action.type === 'delete') return { ...snapshot, runs: snapshot.runs.filter((r) => r.id !== action.run.id) };
  if (action.type === 'patch') {
    const { run } = action;
    const { version: _version, depart: _depart, departS, timing: _timing, steps, ...attributes } = action.body;
    const edited: Run = {
      ...run,
      ...Object.fromEntries(Object.entries(attributes).filter(([, v]) => v !== undefined)),
      ...(steps ?? shiftTiming(run, departS !== undefined ? departS - run.departS : 0)),
    };
    return { ...snapshot, runs: snapshot.runs.map((r) => (r.id === run.id ? edited : r)) };
  }
  return undefined;
}

export function describeError(error: unknown): string {
  if (error instanceof ApiError) {
    if (error.status === 409) return 'Someone else changed this run meanwhile. The timetable has been reloaded; make your change again.';
    const issue = error.body.issues?.[0];
    return issue && !error.body.error.includes(issue.message) ? `${error.body.error} (${issue.path}: ${issue.message})` : error.body.error;
  }
  return 'The change could not be saved. Check your connection and try again.';
}

/**
 * The builder's data and its one mutation. Every change answers with the re-checked session, which
 * replaces the cached snapshot; moves and deletes show at once and roll back if refused.
 */
export function useTimetable(sessionId: string, initial: TimetableSnapshot) {
  const queryClient = useQueryClient();
  const key = timetableKeys.builder(sessionId);
  const query = useQuery({
    queryKey: key,
    queryFn: () => timetableApi.snapshot(sessionId),
    initialData: initial,
    staleTime: 15_000,
    // Each answer replaces the whole snapshot; deep-comparing half a megabyte of runs and findings
    // would cost more than it saves (rows compare their run's version themselves).
    structuralSharing: false,
  });
  const [undoable, setUndoable] = useState<Undoable | undefined>();
  const [error, setError] = useState<string | undefined>();
  const [lastRoundTripMs, setLastRoundTripMs] = useState<number | undefined>();
  const [revision, setRevision] = useState(0);
  const startedAt = useRef(0);

  const mutation = useMutation({
    mutationFn: (action: TimetableAction) => perform(sessionId, action),
    onMutate: async (action) => {
      startedAt.current = performance.now();
      setError(undefined);
      await queryClient.cancelQueries({ queryKey: key });
      const previous = queryClient.getQueryData<TimetableSnapshot>(key);
      const next = previous ? optimistic(previous, action) : undefined;
      if (next) queryClient.setQueryData(key, next);
      return { previous };
    },
    onError: (err, _action, context) => {
      if (context?.previous) queryClient.setQueryData(key, context.previous);
      setError(describeError(err));
      if (err instanceof ApiError && err.status === 409) void queryClient.invalidateQueries({ queryKey: key });
    },
    onSuccess: (change, action) => {
      queryClient.setQueryData(key, snapshotPart(change));
      setLastRoundTripMs(Math.round(performance.now() - startedAt.current));
      setRevision((n) => n + 1);
      const undo = undoOf(action, change);
      setUndoable(action.type === 'undo-retime' || action.label === '__undo__' ? undefined : undo);
      void queryClient.invalidateQueries({ queryKey: timetableKeys.retime(sessionId) });
    },
  });

  const change = useCallback((action: TimetableAction) => mutation.mutateAsync(action).catch(() => undefined), [mutation]);
  const undo = useCallback(() => {
    if (!undoable) return;
    setUndoable(undefined);
    void mutation.mutateAsync({ ...undoable.action, label: '__undo__' } as TimetableAction).catch(() => undefined);
  }, [mutation, undoable]);

  return {
    snapshot: query.data,
    change,
    pending: mutation.isPending,
    error,
    clearError: () => setError(undefined),
    undoable,
    undo,
    dismissUndo: () => setUndoable(undefined),
    lastRoundTripMs,
    /** Counts answered changes (browser tests wait on it). */
    revision,
  };
}
