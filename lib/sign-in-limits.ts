import 'server-only';
import { AppError } from '@/lib/errors';
import { clearFailures, failuresOf, recordFailure } from '@/lib/rate-limit';

/** Failed sign-ins from one client, over any accounts, per quarter hour (stops spraying one password). */
export const CLIENT_FAILURES = 20;
const CLIENT_WINDOW_MS = 15 * 60_000;
/** Failed sign-ins to one account from all clients per hour (distributed guessing). */
export const ACCOUNT_FAILURES = 100;
const ACCOUNT_WINDOW_MS = 60 * 60_000;
/** Failures one client may make on one account before each further try waits, 1 s doubling to 15 min. */
export const FREE_FAILURES = 5;
const PAIR_WINDOW_MS = 24 * 60 * 60_000;
const MAX_WAIT_S = 15 * 60;

const keys = (email: string, client: string) => ({
  client: `sign-in-client:${client}`,
  account: `sign-in-account:${email}`,
  pair: `sign-in-pair:${client}|${email}`,
});

const secondsUntil = (at: number, now: number) => Math.max(1, Math.ceil((at - now) / 1000));

/**
 * Seconds this client must wait before trying this account again, or 0. Only failures count; the
 * wait for one account from one client doubles with each failure past FREE_FAILURES, so someone
 * guessing from elsewhere slows themselves down, not the owner on their own device.
 */
export function signInWaitS(email: string, client: string, now = Date.now()): number {
  const k = keys(email, client);
  const byClient = failuresOf(k.client, now);
  if (byClient.count >= CLIENT_FAILURES) return secondsUntil(byClient.resetAt, now);
  const byAccount = failuresOf(k.account, now);
  if (byAccount.count >= ACCOUNT_FAILURES) return secondsUntil(byAccount.resetAt, now);
  const pair = failuresOf(k.pair, now);
  if (pair.count >= FREE_FAILURES) {
    const until = pair.lastAt + Math.min(2 ** (pair.count - FREE_FAILURES), MAX_WAIT_S) * 1000;
    if (until > now) return secondsUntil(until, now);
  }
  return 0;
}

/** Throws the 429 (with Retry-After) when this client must wait before trying this account. */
export function assertSignInAllowed(email: string, client: string, now = Date.now()): void {
  const waitS = signInWaitS(email, client, now);
  if (waitS > 0) throw new AppError('rate_limited', `Too many attempts. Try again in ${waitS} s.`, { retryAfterS: waitS });
}

export function recordSignInFailure(email: string, client: string, now = Date.now()): void {
  const k = keys(email, client);
  recordFailure(k.client, CLIENT_WINDOW_MS, now);
  recordFailure(k.account, ACCOUNT_WINDOW_MS, now);
  recordFailure(k.pair, PAIR_WINDOW_MS, now);
}

/** A success ends this client's wait on this account (not the client's or the account's totals). */
export function recordSignInSuccess(email: string, client: string): void {
  clearFailures(keys(email, client).pair);
}
