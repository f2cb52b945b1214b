export { planSchema as checkPlanBodySchema } from '@/lib/planning';

export const CHECK_MAX_BYTES = 5_000_000;
/** Outside tools may check this many plans a minute per user. */
export const CHECKS_PER_MINUTE = 30;
