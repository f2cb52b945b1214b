export { retimeMovesSchema, sessionParamsSchema } from '@/lib/validations/session';
