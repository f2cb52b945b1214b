import type { World } from '../authz/shared';

/**
 * A mutating target fed hostile input. `send` gets either a FormData-shaped record of strings
 * (server actions) or a raw request body string (JSON route handlers) and returns the status.
 * `setup` runs once per world, before the first checksum, to create what the target's bound ids
 * point at (a layout, a session…); `send` reads it back with the same per-world cache.
 */
export type HostileTarget =
  | { target: string; kind: 'action'; fields: string[]; setup?: (world: World) => unknown; send: (world: World, fields: Record<string, string>) => Promise<number> }
  | { target: string; kind: 'json'; setup?: (world: World) => unknown; send: (world: World, body: string) => Promise<number> }
  | { target: string; kind: 'exempt'; why: string };

/** `make` run once per world; later calls answer the same value. */
export function perWorld<T>(make: (world: World) => T): (world: World) => T {
  const cache = new WeakMap<World, T>();
  return (world) => {
    if (!cache.has(world)) cache.set(world, make(world));
    return cache.get(world)!;
  };
}

/**
 * Fields as generated, unless `accepted` says the target would take them as a valid request: then
 * `pin` overrides some of them with values the target refuses, so the property only ever sends
 * malformed input (a valid write would change the checksum, which is not what is under test).
 */
export function refused(fields: Record<string, string>, accepted: (fields: Record<string, string>) => boolean, pin: Record<string, string>) {
  return accepted(fields) ? { ...fields, ...pin } : fields;
}

/** Where a target is sent several requests: the first status that is not a 4xx, else the first. */
export function worst(statuses: number[]): number {
  return statuses.find((s) => s < 400 || s >= 500) ?? statuses[0]!;
}
