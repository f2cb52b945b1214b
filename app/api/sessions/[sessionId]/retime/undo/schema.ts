export { retimeMovesSchema as undoRetimeSchema, sessionParamsSchema } from '@/lib/validations/session';
