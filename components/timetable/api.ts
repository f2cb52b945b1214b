// The builder's calls to its route handlers. Errors come back as ApiError with the JSON answer.
import type { CompactLoad } from '@/lib/sessions/compact';
import type { BuilderChange, BuilderSnapshot, RetimeSuggestion } from '@/lib/sessions/types';
import type { CreateRunBody, Move, SeriesBody, UpdateRunBody } from '@/lib/runs/schema';

export type ApiErrorBody = { error: string; code?: string; issues?: { path: string; message: string }[]; current?: unknown };

export class ApiError extends Error {
  constructor(
    readonly status: number,
    readonly body: ApiErrorBody,
  ) {
    super(body.error);
  }
}

async function call<T>(method: string, path: string, body?: unknown, cache: RequestCache = 'no-store'): Promise<T> {
  const response = await fetch(path, {
    method,
    headers: body === undefined ? {} : { 'content-type': 'application/json' },
    body: body === undefined ? undefined : JSON.stringify(body),
    cache,
  });
  const data = await response.json().catch(() => ({ error: `The server answered ${response.status}.` }));
  if (!response.ok) throw new ApiError(response.status, data as ApiErrorBody);
  return data as T;
}

const base = (sessionId: string) => `/api/sessions/${encodeURIComponent(sessionId)}`;

export const timetableApi = {
  snapshot: (sessionId: string) => call<BuilderSnapshot>('GET', `${base(sessionId)}/runs`),
  // 'no-cache': the browser revalidates its copy with the ETag, and an unchanged profile answers 304.
  load: (sessionId: string) => call<{ load: CompactLoad }>('GET', `${base(sessionId)}/check?only=load`, undefined, 'no-cache'),
  createRun: (sessionId: string, body: CreateRunBody) => call<BuilderChange>('POST', `${base(sessionId)}/runs`, body),
  patchRun: (sessionId: string, runId: string, body: UpdateRunBody) =>
    call<BuilderChange>('PATCH', `${base(sessionId)}/runs/${encodeURIComponent(runId)}`, body),
  deleteRun: (sessionId: string, runId: string, version: number) =>
    call<BuilderChange>('DELETE', `${base(sessionId)}/runs/${encodeURIComponent(runId)}?version=${version}`),
  series: (sessionId: string, runId: string, body: SeriesBody) =>
    call<BuilderChange>('POST', `${base(sessionId)}/runs/${encodeURIComponent(runId)}/series`, body),
  suggestRetime: (sessionId: string) => call<{ moves: RetimeSuggestion[] }>('GET', `${base(sessionId)}/retime`),
  applyRetime: (sessionId: string, moves: Move[]) => call<BuilderChange>('POST', `${base(sessionId)}/retime`, { moves }),
  undoRetime: (sessionId: string, moves: Move[]) => call<BuilderChange>('POST', `${base(sessionId)}/retime/undo`, { moves }),
};
