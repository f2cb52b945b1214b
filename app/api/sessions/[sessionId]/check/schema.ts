export { sessionParamsSchema } from '@/lib/validations/session';
