export { retimeMovesSchema as undoRetimeSchema } from '@/lib/runs/schema';
export { sessionParamsSchema } from '@/lib/validations/session';
