import 'server-only';
import { toResponse } from '@/lib/errors';

type Context<P> = { params: Promise<P> };

/**
 * Wraps a route handler so that every thrown AppError becomes its JSON answer
 * (`{ error, code, issues? }` with the right status) and anything else a logged 500.
 */
export function handler<P = Record<string, never>>(
  fn: (request: Request, context: Context<P>) => Promise<Response> | Response,
): (request: Request, context: Context<P>) => Promise<Response> {
  return async (request, context) => {
    try {
      return await fn(request, context);
    } catch (error) {
      return toResponse(error);
    }
  };
}
