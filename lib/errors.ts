import { z } from 'zod';

export type ErrorCode =
  | 'bad_request'
  | 'unauthorized'
  | 'forbidden'
  | 'not_found'
  | 'conflict'
  | 'too_large'
  | 'rate_limited';

const STATUS: Record<ErrorCode, number> = {
  bad_request: 400,
  unauthorized: 401,
  forbidden: 403,
  not_found: 404,
  conflict: 409,
  too_large: 413,
  rate_limited: 429,
};

export type Issue = { path: string; message: string };

/** An error a caller caused, answered with its status and a message meant for people. */
export class AppError extends Error {
  readonly status: number;
  constructor(
    readonly code: ErrorCode,
    message: string,
    readonly extra: { issues?: Issue[]; current?: unknown; retryAfterS?: number } = {},
  ) {
    super(message);
    this.status = STATUS[code];
  }
}

export const unauthorized = () => new AppError('unauthorized', 'Sign in to continue.');
export const forbidden = (what = 'do that') =>
  new AppError('forbidden', `Your role on this railway does not allow you to ${what}.`);
export const notFound = (what = 'That') => new AppError('not_found', `${what} was not found.`);
export const conflict = (current: unknown) =>
  new AppError(
    'conflict',
    'Someone else changed this since you opened it. Reload to see their version, then edit again.',
    { current },
  );

/** Turns zod issues into `path: message` pairs with paths written like `runs[3].cabId`. */
export function issuesOf(error: z.ZodError): Issue[] {
  return error.issues.map((issue) => ({
    path: issue.path
      .map((part, i) => (typeof part === 'number' ? `[${part}]` : i === 0 ? String(part) : `.${String(part)}`))
      .join(''),
    message: issue.message,
  }));
}

export function badRequest(error: z.ZodError | string): AppError {
  if (typeof error === 'string') return new AppError('bad_request', error);
  const issues = issuesOf(error);
  const first = issues[0];
  const message = first ? (first.path ? `${first.path}: ${first.message}` : first.message) : 'Invalid input.';
  return new AppError('bad_request', message, { issues });
}

/** Parses with a zod schema or throws a 400 naming every field that is wrong. */
export function parseOrThrow<S extends z.ZodType>(schema: S, input: unknown): z.infer<S> {
  const result = schema.safeParse(input);
  if (!result.success) throw badRequest(result.error);
  return result.data;
}

/** The JSON answer for an error: `{ error, issues? }` with the right status. */
export function toResponse(error: unknown): Response {
  if (error instanceof AppError) {
    const headers: Record<string, string> = {};
    if (error.extra.retryAfterS !== undefined) headers['Retry-After'] = String(error.extra.retryAfterS);
    return Response.json(
      {
        error: error.message,
        code: error.code,
        ...(error.extra.issues ? { issues: error.extra.issues } : {}),
        ...(error.extra.current !== undefined ? { current: error.extra.current } : {}),
      },
      { status: error.status, headers },
    );
  }
  console.error(error);
  return Response.json({ error: 'Something went wrong on our side. Please try again.' }, { status: 500 });
}

/** Reads a JSON body, refusing non-JSON and bodies over `maxBytes` with a clear message. */
export async function readJson(request: Request, maxBytes = 1_000_000): Promise<unknown> {
  const length = Number(request.headers.get('content-length') ?? '0');
  if (length > maxBytes) throw new AppError('too_large', `The request body is over ${maxBytes} bytes.`);
  const text = await request.text();
  if (Buffer.byteLength(text) > maxBytes) {
    throw new AppError('too_large', `The request body is over ${maxBytes} bytes.`);
  }
  try {
    return JSON.parse(text);
  } catch {
    throw new AppError('bad_request', 'The request body is not valid JSON.');
  }
}

/** The state every server action returns: ok, or a message with field errors and the status. */
export type ActionState<T = undefined> =
  | { ok: true; message?: string; data?: T }
  | { ok: false; status: number; error: string; fieldErrors?: Record<string, string> }
  | null;

/** Converts a thrown error into an action's failure state (unknown errors are logged). */
export function toActionState(error: unknown): Exclude<ActionState, null | { ok: true }> {
  if (error instanceof AppError) {
    const fieldErrors: Record<string, string> = {};
    for (const issue of error.extra.issues ?? []) fieldErrors[issue.path] ??= issue.message;
    return { ok: false, status: error.status, error: error.message, fieldErrors };
  }
  console.error(error);
  return { ok: false, status: 500, error: 'Something went wrong on our side. Please try again.' };
}
