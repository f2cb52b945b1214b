import { z } from 'zod';

export type ErrorCode =
  | 'bad_request'
  | 'unauthorized'
  | 'forbidden'
  | 'not_found'
  | 'conflict'
  | 'too_large'
  | 'unsupported_media_type'
  | 'rate_limited';

const STATUS: Record<ErrorCode, number> = {
  bad_request: 400,
  unauthorized: 401,
  forbidden: 403,
  not_found: 404,
  conflict: 409,
  too_large: 413,
  unsupported_media_type: 415,
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

/** The media type of a request (`application/json` for `application/json; charset=utf-8`), lower case. */
function mediaTypeOf(request: Request): string {
  return (request.headers.get('content-type') ?? '').split(';')[0]!.trim().toLowerCase();
}

/** Refuses (415) a body whose Content-Type is not one of `accepted` (a `+json` suffix counts as JSON). */
export function requireMediaType(request: Request, accepted: readonly string[], message: string): void {
  const type = mediaTypeOf(request);
  const ok = accepted.some((a) => type === a || (a === 'application/json' && type.startsWith('application/') && type.endsWith('+json')));
  if (!ok) throw new AppError('unsupported_media_type', message);
}

/**
 * Reads a request body, counting bytes as they arrive and stopping at `maxBytes`: a declared
 * Content-Length over the limit is refused before a byte is read, and a chunked body is cancelled
 * the moment it passes the limit (413), so memory stays at the limit whatever the caller sends.
 */
export async function readBytes(request: Request, maxBytes: number, tooLarge: () => AppError): Promise<Uint8Array<ArrayBuffer>> {
  const declared = Number(request.headers.get('content-length') ?? '0');
  if (declared > maxBytes) throw tooLarge();
  if (!request.body) return new Uint8Array(0);
  const reader = request.body.getReader();
  const chunks: Uint8Array[] = [];
  let total = 0;
  for (;;) {
    let chunk: ReadableStreamReadResult<Uint8Array>;
    try {
      chunk = await reader.read();
    } catch {
      throw new AppError('bad_request', 'The request body could not be read to its end.');
    }
    if (chunk.done) break;
    total += chunk.value.byteLength;
    if (total > maxBytes) {
      await reader.cancel().catch(() => undefined);
      throw tooLarge();
    }
    chunks.push(chunk.value);
  }
  const bytes = new Uint8Array(total);
  let at = 0;
  for (const c of chunks) {
    bytes.set(c, at);
    at += c.byteLength;
  }
  return bytes;
}

const bodyTooLarge = (maxBytes: number) => () => new AppError('too_large', `The request body is over ${maxBytes} bytes.`);

/**
 * Reads a JSON body: refuses any other Content-Type (415; a cross-site form can send text/plain
 * without asking first, never JSON) and bodies over `maxBytes` (413) as they stream in.
 */
export async function readJson(request: Request, maxBytes = 1_000_000): Promise<unknown> {
  requireMediaType(request, ['application/json'], 'Send the body as JSON (Content-Type: application/json).');
  const text = new TextDecoder().decode(await readBytes(request, maxBytes, bodyTooLarge(maxBytes)));
  try {
    return JSON.parse(text);
  } catch {
    throw new AppError('bad_request', 'The request body is not valid JSON.');
  }
}

/** Reads a text body of one of the `accepted` media types, up to `maxBytes` (413 as it streams in). */
export async function readText(request: Request, options: { maxBytes: number; accepted: readonly string[]; wrongType: string; tooLarge: () => AppError }): Promise<string> {
  requireMediaType(request, options.accepted, options.wrongType);
  return new TextDecoder().decode(await readBytes(request, options.maxBytes, options.tooLarge));
}

/** Reads a multipart/form-data upload of at most `maxBytes` (413 as it streams in), then parses it. */
export async function readMultipart(request: Request, options: { maxBytes: number; wrongType: string; tooLarge: () => AppError }): Promise<FormData> {
  requireMediaType(request, ['multipart/form-data'], options.wrongType);
  const bytes = await readBytes(request, options.maxBytes, options.tooLarge);
  try {
    return await new Response(bytes, { headers: { 'content-type': request.headers.get('content-type')! } }).formData();
  } catch {
    throw new AppError('bad_request', options.wrongType);
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
