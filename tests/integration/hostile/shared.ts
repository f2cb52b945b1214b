import type { World } from '../authz/shared';

/**
 * A mutating target fed hostile input. `send` gets either a FormData-shaped record of strings
 * (server actions) or a raw request body string (JSON route handlers) and returns the status.
 */
export type HostileTarget =
  | { target: string; kind: 'action'; fields: string[]; send: (world: World, fields: Record<string, string>) => Promise<number> }
  | { target: string; kind: 'json'; send: (world: World, body: string) => Promise<number> }
  | { target: string; kind: 'exempt'; why: string };
