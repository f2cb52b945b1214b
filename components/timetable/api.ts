// The builder's calls to its route handlers, through the shared client (lib/client/api.ts): errors come back
// as ApiError with the JSON answer.
import { apiCall } from '@/lib/client/api';
import type { CompactLoad } from '@/lib/sessions/compact';
import type { TimetableChange, TimetableSnapshot, RetimeSuggestion } from '@/lib/sessions/types';
import type { CreateRunBody, Move, SeriesBody, UpdateRunBody } from '@/lib/runs/schema';

const base = (sessionId: string) => `/api/sessions/${encodeURIComponent(sessionId)}`;

const call = <T>(method: string, path: string, json?: unknown, cache?: RequestCache) =>
  apiCall<T>(method, path, { body: json === undefined ? undefined : { json }, cache });

export const timetableApi = {
  snapshot: (sessionId: string) => call<TimetableSnapshot>('GET', `${base(sessionId)}/runs`),
  // 'no-cache': the browser revalidates its copy with the ETag, and an unchanged profile answers 304.
  load: (sessionId: string) => call<{ load: CompactLoad }>('GET', `${base(sessionId)}/check?only=load`, undefined, 'no-cache'),
  createRun: (sessionId: string, body: CreateRunBody) => call<TimetableChange>('POST', `${base(sessionId)}/runs`, body),
  patchRun: (sessionId: string, runId: string, body: UpdateRunBody) =>
    call<TimetableChange>('PATCH', `${base(sessionId)}/runs/${encodeURIComponent(runId)}`, body),
  deleteRun: (sessionId: string, runId: string, version: number) =>
    call<TimetableChange>('DELETE', `${base(sessionId)}/runs/${encodeURIComponent(runId)}?version=${version}`),
  series: (sessionId: string, runId: string, body: SeriesBody) =>
    call<TimetableChange>('POST', `${base(sessionId)}/runs/${encodeURIComponent(runId)}/series`, body),
  suggestRetime: (sessionId: string) => call<{ moves: RetimeSuggestion[] }>('GET', `${base(sessionId)}/retime`),
  applyRetime: (sessionId: string, moves: Move[]) => call<TimetableChange>('POST', `${base(sessionId)}/retime`, { moves }),
  undoRetime: (sessionId: string, moves: Move[]) => call<TimetableChange>('POST', `${base(sessionId)}/retime/undo`, { moves }),
};
