// Every call the browser makes to Fishplate's route handlers goes through `apiCall`: one way to send a
// body, one error (ApiError with the handler's JSON answer, the `{ error, code, issues? }` that
// lib/errors.ts `toResponse` writes) and one message for a lost connection. Client code only: no
// server imports here.

export type ApiErrorBody = { error: string; code?: string; issues?: { path: string; message: string }[]; current?: unknown };

/** A route handler's refusal: its status and its JSON answer. */
export class ApiError extends Error {
  constructor(
    readonly status: number,
    readonly body: ApiErrorBody,
  ) {
    super(body.error);
  }
}

export type ApiBody =
  | { json: unknown }
  | { form: FormData }
  | { text: string; contentType: string };

export type CallOptions = {
  body?: ApiBody;
  /** 'no-store' unless said; 'no-cache' revalidates with the ETag. */
  cache?: RequestCache;
  headers?: Record<string, string>;
};

function requestBody(body: ApiBody | undefined): { headers: Record<string, string>; body?: BodyInit } {
  if (!body) return { headers: {} };
  if ('json' in body) return { headers: { 'content-type': 'application/json' }, body: JSON.stringify(body.json) };
  if ('form' in body) return { headers: {}, body: body.form };
  return { headers: { 'content-type': body.contentType }, body: body.text };
}

function isErrorBody(data: unknown): data is ApiErrorBody {
  return typeof data === 'object' && data !== null && typeof (data as { error?: unknown }).error === 'string';
}

/**
 * Calls a route handler and answers its JSON. A refusal throws ApiError (an answer that is not the
 * usual error JSON gets "The server answered N."); no connection at all rejects with fetch's own
 * TypeError, which `errorMessage` words.
 */
export async function apiCall<T>(method: string, path: string, options: CallOptions = {}): Promise<T> {
  const { headers, body } = requestBody(options.body);
  const response = await fetch(path, { method, headers: { ...headers, ...options.headers }, body, cache: options.cache ?? 'no-store' });
  const data: unknown = await response.json().catch(() => undefined);
  if (!response.ok) throw new ApiError(response.status, isErrorBody(data) ? data : { error: `The server answered ${response.status}.` });
  return data as T;
}

export const OFFLINE_MESSAGE = 'No connection. Try again in a moment.';

/** What to show for a failed call: the server's message, or `offline` when there was no answer. */
export function errorMessage(error: unknown, offline = OFFLINE_MESSAGE): string {
  return error instanceof ApiError ? error.body.error : offline;
}
