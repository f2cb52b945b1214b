import { AppError } from '@/lib/errors';

type Bucket = { count: number; resetAt: number; lastAt: number };

/** Keys kept per kind of limit (the part of the key before the first colon). */
export const MAX_KEYS_PER_KIND = 10_000;

const globalForLimits = globalThis as unknown as { fishplateLimits?: Map<string, Map<string, Bucket>> };

function kindOf(key: string): Map<string, Bucket> {
  const all = (globalForLimits.fishplateLimits ??= new Map());
  const kind = key.slice(0, Math.max(0, key.indexOf(':'))) || key;
  let buckets = all.get(kind);
  if (!buckets) all.set(kind, (buckets = new Map()));
  return buckets;
}

/**
 * The bucket for `key`, fresh when its window is over. Buckets of one kind live in insertion
 * order (a touched bucket moves to the end), so when a kind holds MAX_KEYS_PER_KIND keys the least
 * recently touched goes first: memory stays bounded however many addresses or accounts are tried,
 * and a flood of made-up keys of one kind cannot push out the buckets of another.
 */
function touch(key: string, windowMs: number, now: number): Bucket {
  const buckets = kindOf(key);
  let bucket = buckets.get(key);
  if (!bucket || bucket.resetAt <= now) bucket = { count: 0, resetAt: now + windowMs, lastAt: now };
  buckets.delete(key);
  buckets.set(key, bucket);
  while (buckets.size > MAX_KEYS_PER_KIND) {
    const oldest = buckets.keys().next().value;
    if (oldest === undefined) break;
    buckets.delete(oldest);
  }
  return bucket;
}

function limited(resetAt: number, now: number): AppError {
  const retryAfterS = Math.max(1, Math.ceil((resetAt - now) / 1000));
  return new AppError('rate_limited', `Too many attempts. Try again in ${retryAfterS} s.`, { retryAfterS });
}

/**
 * A fixed-window limit per key in this process (Fishplate runs as one process on one SQLite
 * file). Throws a 429 with Retry-After once `limit` calls were made within `windowMs`.
 */
export function rateLimit(key: string, limit: number, windowMs: number, now = Date.now()): void {
  const bucket = touch(key, windowMs, now);
  bucket.count += 1;
  bucket.lastAt = now;
  if (bucket.count > limit) throw limited(bucket.resetAt, now);
}

/** Counts one failure against `key` (the window starts at the first failure). */
export function recordFailure(key: string, windowMs: number, now = Date.now()): void {
  const bucket = touch(key, windowMs, now);
  bucket.count += 1;
  bucket.lastAt = now;
}

/** Failures counted against `key` in its current window, and when the last one was. */
export function failuresOf(key: string, now = Date.now()): { count: number; lastAt: number; resetAt: number } {
  const bucket = kindOf(key).get(key);
  return bucket && bucket.resetAt > now ? bucket : { count: 0, lastAt: 0, resetAt: 0 };
}

/** Forgets the failures of one key (a success). */
export function clearFailures(key: string): void {
  kindOf(key).delete(key);
}

/** How many keys the limiter holds now, over every kind (tests). */
export function limiterSize(): number {
  let n = 0;
  for (const buckets of globalForLimits.fishplateLimits?.values() ?? []) n += buckets.size;
  return n;
}

/** Forgets every limit (tests). */
export function resetRateLimits(): void {
  globalForLimits.fishplateLimits?.clear();
}
