import { listRailwaysOfUser } from '@/db/queries/memberships';
import { requireUser } from '@/lib/auth';
import { forbidden, parseOrThrow, readJson } from '@/lib/errors';
import { handler } from '@/lib/http';
import { checkPlan } from '@/lib/planning';
import { rateLimit } from '@/lib/rate-limit';
import { roleAtLeast } from '@/lib/roles';
import { CHECK_MAX_BYTES, CHECKS_PER_MINUTE, checkPlanBodySchema } from './schema';

export const dynamic = 'force-dynamic';

/** checkPlan on a posted plan interchange (version 1), for planners' outside tools. Stores nothing. */
const check = handler(async (request) => {
  const user = await requireUser();
  if (!listRailwaysOfUser(user.id).some((r) => roleAtLeast(r.role, 'planner'))) throw forbidden('check plans (planners and hosts only)');
  rateLimit(`plans-check:${user.id}`, CHECKS_PER_MINUTE, 60_000);
  const plan = parseOrThrow(checkPlanBodySchema, await readJson(request, CHECK_MAX_BYTES));
  const started = performance.now();
  const { findings, load } = checkPlan(plan);
  const errors = findings.filter((f) => f.severity === 'error').length;
  return Response.json({ errors, warnings: findings.length - errors, findings, load, checkMs: Math.round((performance.now() - started) * 10) / 10 });
});

export { check as POST };
