export { reportQuerySchema } from '@/lib/validations/live';
export { sessionParamsSchema } from '@/lib/validations/session';
