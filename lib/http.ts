import 'server-only';
import { unstable_rethrow } from 'next/navigation';
import { env } from '@/lib/env';
import { AppError, toActionState, toResponse, type ActionState } from '@/lib/errors';

type Context<P> = { params: Promise<P> };

const SAFE_METHODS = new Set(['GET', 'HEAD', 'OPTIONS']);

/** Whether `origin` (an Origin header) is this site: the configured NEXTAUTH_URL, or the host the request was sent to. */
function isOwnOrigin(origin: string, request: Request): boolean {
  let url: URL;
  try {
    url = new URL(origin);
  } catch {
    return false; // "null" (sandboxed frames, file:) and anything unparseable
  }
  if (url.origin === new URL(env().NEXTAUTH_URL).origin) return true;
  const host = request.headers.get('host') ?? new URL(request.url).host;
  return url.host === host;
}

/**
 * Refuses (403) a write that a browser says comes from another site. Browsers send `Origin` with
 * every POST, PATCH and DELETE (Fetch standard, "append a request `Origin` header") and
 * `Sec-Fetch-Site` (Fetch Metadata); SameSite=Lax cookies do not separate other ports or sibling
 * subdomains, so these headers do. A request with neither is not from a browser (curl, an outside
 * tool with its own cookie) and cannot be forged by a web page.
 */
export function assertSameOrigin(request: Request): void {
  if (SAFE_METHODS.has(request.method.toUpperCase())) return;
  const site = request.headers.get('sec-fetch-site');
  const origin = request.headers.get('origin');
  const crossSite = (site !== null && site !== 'same-origin' && site !== 'none') || (origin !== null && !isOwnOrigin(origin, request));
  if (crossSite) throw new AppError('forbidden', 'This change was sent from another site. Make it from Fishplate itself.');
}

/**
 * Wraps a route handler so that every thrown AppError becomes its JSON answer
 * (`{ error, code, issues? }` with the right status) and anything else a logged 500. Writes from
 * another site are refused (403) before the handler runs.
 */
export function handler<P = Record<string, never>>(
  fn: (request: Request, context: Context<P>) => Promise<Response> | Response,
): (request: Request, context: Context<P>) => Promise<Response> {
  return async (request, context) => {
    try {
      assertSameOrigin(request);
      return await fn(request, context);
    } catch (error) {
      return toResponse(error);
    }
  };
}

/**
 * What a server action is called with, in order: `id` a bound id (the railway's, the layout's…),
 * `state` the previous action state (ignored), `form` the submitted FormData.
 */
export type ActionArg = 'id' | 'state' | 'form';
type ArgOf<K extends ActionArg> = K extends 'id' ? string : K extends 'form' ? FormData : unknown;
type ArgsOf<K extends readonly ActionArg[]> = { -readonly [I in keyof K]: ArgOf<K[I]> };
type Failure = Exclude<ActionState, null | { ok: true }>;

const MAX_ID_LENGTH = 200;

function shapeError(message: string): AppError {
  return new AppError('bad_request', message);
}

/**
 * Wraps a server action: anyone can post any arguments to it (the client's bind is not a
 * boundary), so the arguments' number and kinds are checked before the action runs, a thrown
 * AppError becomes its failure state (`{ ok: false, status, error, fieldErrors }`), and Next's
 * redirect and not-found signals pass through. Anything else is a logged 500.
 */
export function action<const K extends readonly ActionArg[], R extends ActionState<unknown>>(
  shape: K,
  fn: (...args: ArgsOf<K>) => Promise<R>,
): (...args: ArgsOf<K>) => Promise<R | Failure> {
  return async (...args) => {
    try {
      const received: unknown[] = args;
      if (received.length !== shape.length) throw shapeError(`This form was sent with ${received.length} values instead of ${shape.length}. Reload the page and try again.`);
      shape.forEach((kind, i) => {
        const value = received[i];
        if (kind === 'id' && (typeof value !== 'string' || value.length === 0 || value.length > MAX_ID_LENGTH)) {
          throw shapeError('This form names something that does not exist. Reload the page and try again.');
        }
        if (kind === 'form' && !(value instanceof FormData)) throw shapeError('This form was sent without its fields. Reload the page and try again.');
      });
      return await fn(...args);
    } catch (error) {
      unstable_rethrow(error);
      return toActionState(error);
    }
  };
}
