// lib/sign-in-limits.ts: failed sign-ins are limited per client, per account and per pair. Each call
// is given its own `now`, so no test waits.
import { beforeEach, describe, expect, it } from 'vitest';
import { ACCOUNT_FAILURES, CLIENT_FAILURES, FREE_FAILURES, assertSignInAllowed, recordSignInFailure, recordSignInSuccess, signInWaitS } from '@/lib/sign-in-limits';
import { resetRateLimits } from '@/lib/rate-limit';

const T0 = Date.UTC(2026, 11, 3, 18, 0);
const ADA = 'ada@fishplate.example';

beforeEach(() => {
  resetRateLimits();
});

describe('sign-in limits', () => {
  it('counts one client’s failures over every account, and only that client’s', () => {
    for (let i = 0; i < CLIENT_FAILURES - 1; i++) recordSignInFailure(`user${i}@fishplate.example`, '192.0.2.1', T0);
    expect(signInWaitS('another@fishplate.example', '192.0.2.1', T0)).toBe(0);
    recordSignInFailure('user-last@fishplate.example', '192.0.2.1', T0);
    expect(signInWaitS('another@fishplate.example', '192.0.2.1', T0 + 1)).toBe(15 * 60); // the quarter hour from the first failure, rounded up
    expect(signInWaitS('another@fishplate.example', '192.0.2.2', T0 + 1)).toBe(0);
  });

  it('counts one account’s failures over every client, and only that account’s', () => {
    for (let i = 0; i < ACCOUNT_FAILURES - 1; i++) recordSignInFailure(ADA, `198.51.100.${i}`, T0);
    expect(signInWaitS(ADA, '203.0.113.1', T0)).toBe(0);
    recordSignInFailure(ADA, '203.0.113.200', T0);
    expect(signInWaitS(ADA, '203.0.113.1', T0 + 1_000)).toBe(60 * 60 - 1);
    expect(signInWaitS('bo@fishplate.example', '203.0.113.1', T0 + 1_000)).toBe(0);
  });

  it('failures spread over many accounts and clients block no one', () => {
    for (let i = 0; i < ACCOUNT_FAILURES; i++) recordSignInFailure(`user${i}@fishplate.example`, `198.51.100.${i}`, T0);
    expect(signInWaitS('new@fishplate.example', '203.0.113.1', T0)).toBe(0);
  });

  it('makes one client wait on one account after FREE_FAILURES, 1 s doubling, and a success ends the wait', () => {
    for (let i = 0; i < FREE_FAILURES - 1; i++) recordSignInFailure(ADA, '192.0.2.1', T0);
    expect(signInWaitS(ADA, '192.0.2.1', T0)).toBe(0);
    recordSignInFailure(ADA, '192.0.2.1', T0);
    expect(signInWaitS(ADA, '192.0.2.1', T0)).toBe(1);
    expect(signInWaitS(ADA, '192.0.2.1', T0 + 1_000)).toBe(0);
    recordSignInFailure(ADA, '192.0.2.1', T0 + 1_000);
    expect(signInWaitS(ADA, '192.0.2.1', T0 + 1_000)).toBe(2);
    expect(signInWaitS(ADA, '192.0.2.9', T0 + 1_000)).toBe(0);
    expect(() => assertSignInAllowed(ADA, '192.0.2.1', T0 + 1_000)).toThrow('Too many attempts. Try again in 2 s.');
    recordSignInSuccess(ADA, '192.0.2.1');
    expect(signInWaitS(ADA, '192.0.2.1', T0 + 1_000)).toBe(0);
    expect(() => assertSignInAllowed(ADA, '192.0.2.1', T0 + 1_000)).not.toThrow();
  });
});
