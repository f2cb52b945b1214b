import { AppError } from '@/lib/errors';

type Bucket = { count: number; resetAt: number };
const globalForLimits = globalThis as unknown as { fishplateLimits?: Map<string, Bucket> };

/**
 * A fixed-window limit per key in this process (Fishplate runs as one process on one SQLite
 * file). Throws a 429 with Retry-After once `limit` calls were made within `windowMs`.
 */
export function rateLimit(key: string, limit: number, windowMs: number, now = Date.now()): void {
  const buckets = (globalForLimits.fishplateLimits ??= new Map());
  if (buckets.size > 50_000) {
    for (const [k, b] of buckets) if (b.resetAt <= now) buckets.delete(k);
  }
  const bucket = buckets.get(key);
  if (!bucket || bucket.resetAt <= now) {
    buckets.set(key, { count: 1, resetAt: now + windowMs });
    return;
  }
  bucket.count += 1;
  if (bucket.count > limit) {
    const retryAfterS = Math.max(1, Math.ceil((bucket.resetAt - now) / 1000));
    throw new AppError('rate_limited', `Too many attempts. Try again in ${retryAfterS} s.`, { retryAfterS });
  }
}

/** Forgets every limit (tests). */
export function resetRateLimits(): void {
  globalForLimits.fishplateLimits?.clear();
}
