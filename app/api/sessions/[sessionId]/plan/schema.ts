export { PLAN_MAX_BYTES, postedPlanSchema as postPlanSchema } from '@/lib/runs/schema';
export { sessionParamsSchema } from '@/lib/validations/session';
