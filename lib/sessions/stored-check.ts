import 'server-only';
import { createHash } from 'node:crypto';
import { AppError } from '@/lib/errors';
import { CheckBudgetError, checkPlan, type Plan, type PlanCheck } from '@/lib/planning';

/**
 * How long one check may hold the server's event loop. A plan inside the plan schema's limits
 * checks in well under this (see the README's engine figures); a larger stored session is refused
 * with 413 rather than stalling every other request.
 */
export const CHECK_BUDGET_MS = 2_000;

/** checkPlan within CHECK_BUDGET_MS; past it, 413 with a message saying what to do. */
export function checkInBudget(plan: Plan): PlanCheck {
  try {
    return checkPlan(plan, { budget: { ms: CHECK_BUDGET_MS, now: () => performance.now() } });
  } catch (error) {
    if (error instanceof CheckBudgetError) {
      throw new AppError('too_large', `This plan is too large to check within ${CHECK_BUDGET_MS / 1000} s. Split it into smaller plans or remove runs.`);
    }
    throw error;
  }
}

/** How many checked plans are kept: a few sessions open at once, each with a few states in flight. */
const MAX_KEPT = 32;
const kept = new Map<string, PlanCheck>();

/**
 * A plan's identity: a hash of its interchange. Everything the engine reads is in the plan, so two
 * plans with the same hash have the same check, and any write that changes a run, the session's clock
 * or rules, or a layout row changes the hash: nothing needs invalidating by hand.
 */
export function planTag(plan: Plan): string {
  return createHash('sha256').update(JSON.stringify(plan)).digest('base64url').slice(0, 27);
}

/**
 * The engine's check of a stored plan, computed once per state and kept (least recently used first
 * out). The builder, the check route, the lists' error counts and publishing all read it from here.
 */
export function storedCheck(plan: Plan): { tag: string; check: PlanCheck } {
  const tag = planTag(plan);
  let check = kept.get(tag);
  if (check) {
    kept.delete(tag); // re-inserted below: most recently used last
  } else {
    check = checkInBudget(plan);
    if (kept.size >= MAX_KEPT) kept.delete(kept.keys().next().value!);
  }
  kept.set(tag, check);
  return { tag, check };
}
