'use client';

import { useQuery } from '@tanstack/react-query';
import dynamic from 'next/dynamic';
import { useMemo } from 'react';
import type { Finding } from '@/lib/planning';
import { expandLoad, type CompactLoad } from '@/lib/sessions/compact';
import type { Highlight } from '@/lib/sessions/highlight';
import type { SessionClock } from '@/lib/sessions/time-labels';
import type { TimetableLayout } from '@/lib/sessions/types';
import { Notice } from '@/components/ui/card';
import { errorMessage } from '@/lib/client/api';
import { timetableApi } from './api';
import { timetableKeys } from './query-keys';

// The chart library is loaded when the Load view is first opened, not with the builder.
const LoadCharts = dynamic(() => import('./load-charts').then((m) => m.LoadCharts), {
  loading: () => <p className="p-4 text-sm text-muted">Loading the charts…</p>,
});

/**
 * The Load view: asks the server for the load profile when opened and again after each answered
 * change (`revision`); the answer carries the plan's state as its ETag, so an unchanged profile
 * comes back as 304 from the browser's cache.
 */
export function LoadView({
  sessionId,
  revision,
  layout,
  ...charts
}: {
  sessionId: string;
  revision: number;
  layout: TimetableLayout;
  findings: Finding[];
  clock: SessionClock;
  lengthS: number;
  highlight?: Highlight;
  derate: number;
}) {
  const query = useQuery({
    queryKey: [...timetableKeys.load(sessionId), revision],
    queryFn: () => timetableApi.load(sessionId),
    placeholderData: (previous: { load: CompactLoad } | undefined) => previous,
  });
  const load = useMemo(() => (query.data ? expandLoad(query.data.load, layout) : undefined), [query.data, layout]);
  if (query.error) {
    const message = errorMessage(query.error, 'Check your connection and try again.');
    return <Notice tone="bad">The load profile could not be loaded. {message}</Notice>;
  }
  if (!load) return <p className="p-4 text-sm text-muted">Loading the load profile…</p>;
  return <LoadCharts load={load} {...charts} />;
}
