import { listRailwaysOfUser } from '@/db/queries/memberships';
import { requireUser } from '@/lib/auth';
import { forbidden, parseOrThrow, readJson } from '@/lib/errors';
import { handler } from '@/lib/http';
import { checkInBudget } from '@/lib/sessions/stored-check';
import { rateLimit } from '@/lib/rate-limit';
import { roleAtLeast } from '@/lib/roles';
import { PLAN_MAX_BYTES, CHECKS_PER_MINUTE, checkPlanBodySchema } from './schema';

export const dynamic = 'force-dynamic';

/**
 * checkPlan on a posted plan interchange (version 2, or version 1 upgraded as lib/planning/README.md says), for planners' outside tools. Stores nothing.
 * The findings are capped (`counts` has them all, `truncated` says when some are not listed) and
 * the check runs within a time budget (413 past it), so one request cannot stall the server.
 */
const check = handler(async (request) => {
  const user = await requireUser();
  if (!listRailwaysOfUser(user.id).some((r) => roleAtLeast(r.role, 'planner'))) throw forbidden('check plans (planners and hosts only)');
  rateLimit(`plans-check:${user.id}`, CHECKS_PER_MINUTE, 60_000);
  const plan = parseOrThrow(checkPlanBodySchema, await readJson(request, PLAN_MAX_BYTES));
  const started = performance.now();
  const { findings, counts, totals, truncated, load } = checkInBudget(plan);
  const { errors, warnings } = totals;
  return Response.json({ errors, warnings, counts, truncated, findings, load, checkMs: Math.round((performance.now() - started) * 10) / 10 });
});

export { check as POST };
