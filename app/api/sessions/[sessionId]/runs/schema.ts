export { createRunSchema, sessionParamsSchema } from '@/lib/validations/session';
