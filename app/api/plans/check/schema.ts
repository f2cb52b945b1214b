export { planSchema as checkPlanBodySchema } from '@/lib/planning';
export { PLAN_MAX_BYTES } from '@/lib/runs/schema';

/** Outside tools may check this many plans a minute per user. */
export const CHECKS_PER_MINUTE = 30;
