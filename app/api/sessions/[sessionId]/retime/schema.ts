export { retimeMovesSchema } from '@/lib/runs/schema';
export { sessionParamsSchema } from '@/lib/validations/session';
