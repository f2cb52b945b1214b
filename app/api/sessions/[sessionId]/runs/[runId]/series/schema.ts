export { runParamsSchema, seriesSchema } from '@/lib/validations/session';
