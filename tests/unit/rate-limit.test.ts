// lib/rate-limit.ts: fixed windows per key, kinds kept apart, memory bounded per kind. Every call is
// given its own `now`, so the windows are exact and no test waits.
import { beforeEach, describe, expect, it } from 'vitest';
import { AppError } from '@/lib/errors';
import { MAX_KEYS_PER_KIND, clearFailures, failuresOf, limiterSize, rateLimit, recordFailure, resetRateLimits } from '@/lib/rate-limit';

const holder = globalThis as unknown as { fishplateLimits?: Map<string, Map<string, unknown>> };

beforeEach(() => {
  resetRateLimits();
});

function refusal(f: () => void): AppError {
  try {
    f();
  } catch (error) {
    expect(error).toBeInstanceOf(AppError);
    return error as AppError;
  }
  throw new Error('expected a 429');
}

describe('rateLimit: a fixed window per key', () => {
  it('allows `limit` calls in a window, then 429 with Retry-After rounded up to whole seconds (RFC 6585 §4, RFC 9110 §10.2.3)', () => {
    for (let i = 0; i < 3; i++) rateLimit('reply:a', 3, 60_000, 1_000 + i);
    const e = refusal(() => rateLimit('reply:a', 3, 60_000, 1_500));
    expect(e.status).toBe(429);
    expect(e.extra.retryAfterS).toBe(60); // window 1 000 → 61 000: 59.5 s left, rounded up
    expect(e.message).toBe('Too many attempts. Try again in 60 s.');
  });

  it('opens a new window exactly at its end (the window is [start, start + windowMs))', () => {
    rateLimit('reply:a', 1, 10_000, 0);
    expect(() => rateLimit('reply:a', 1, 10_000, 9_999)).toThrow(AppError);
    expect(() => rateLimit('reply:a', 1, 10_000, 10_000)).not.toThrow();
  });
});

describe('failures: recordFailure, failuresOf, clearFailures', () => {
  it('counts failures in the window that started at the first, and forgets them at its end', () => {
    recordFailure('sign-in-client:x', 1_000, 5_000);
    recordFailure('sign-in-client:x', 1_000, 5_400);
    expect(failuresOf('sign-in-client:x', 5_999)).toStrictEqual({ count: 2, lastAt: 5_400, resetAt: 6_000 });
    expect(failuresOf('sign-in-client:x', 6_000)).toStrictEqual({ count: 0, lastAt: 0, resetAt: 0 });
    expect(failuresOf('sign-in-client:never', 0)).toStrictEqual({ count: 0, lastAt: 0, resetAt: 0 });
  });

  it('clearFailures forgets one key and no other', () => {
    recordFailure('sign-in-pair:a', 1_000, 0);
    recordFailure('sign-in-pair:b', 1_000, 0);
    clearFailures('sign-in-pair:a');
    expect(failuresOf('sign-in-pair:a', 1).count).toBe(0);
    expect(failuresOf('sign-in-pair:b', 1).count).toBe(1);
    expect(limiterSize()).toBe(1);
  });
});

describe('memory: at most MAX_KEYS_PER_KIND keys per kind, least recently touched dropped first', () => {
  it('keeps exactly MAX_KEYS_PER_KIND keys of one kind and drops the oldest for one more', () => {
    for (let i = 0; i < MAX_KEYS_PER_KIND; i++) recordFailure(`flood:${i}`, 60_000, 0);
    expect(limiterSize()).toBe(MAX_KEYS_PER_KIND);
    expect(failuresOf('flood:0', 1).count).toBe(1);
    recordFailure('flood:0', 60_000, 1); // touched again: now the newest
    recordFailure('flood:new', 60_000, 2);
    expect(limiterSize()).toBe(MAX_KEYS_PER_KIND);
    expect(failuresOf('flood:0', 3).count).toBe(2);
    expect(failuresOf('flood:1', 3).count).toBe(0);
  });

  it('a flood of one kind does not push out another kind (the kind is the part before the first colon)', () => {
    recordFailure('sign-in-account:ada@fishplate.example', 60_000, 0);
    recordFailure('unkinded', 60_000, 0);
    for (let i = 0; i <= MAX_KEYS_PER_KIND; i++) recordFailure(`sign-in-client:${i}`, 60_000, 0);
    expect(failuresOf('sign-in-account:ada@fishplate.example', 1).count).toBe(1);
    expect(failuresOf('unkinded', 1).count).toBe(1);
    expect(limiterSize()).toBe(MAX_KEYS_PER_KIND + 2);
  });

  it('keys without a colon are each their own kind', () => {
    for (let i = 0; i <= MAX_KEYS_PER_KIND; i++) recordFailure(`k${i}`, 60_000, 0);
    expect(limiterSize()).toBe(MAX_KEYS_PER_KIND + 1);
  });

  it('limiterSize counts every kind, and is 0 before anything was limited', () => {
    delete holder.fishplateLimits;
    expect(limiterSize()).toBe(0);
    recordFailure('a:1', 1_000, 0);
    recordFailure('a:2', 1_000, 0);
    recordFailure('b:1', 1_000, 0);
    expect(limiterSize()).toBe(3);
  });
});
