export { postedPlanSchema as postPlanSchema } from '@/lib/runs/schema';
export { sessionParamsSchema } from '@/lib/validations/session';

/** A plan of a few thousand runs fits well inside this. */
export const PLAN_MAX_BYTES = 5_000_000;
